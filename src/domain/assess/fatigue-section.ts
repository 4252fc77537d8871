import { INDICATIVE_CAUTION } from '../caution.js';
import { DETAILS } from '../fatigue/catalogue.js';
import { DETAIL_IDS, type DetailId } from '../fatigue/detail-ids.js';
import { notchReference } from '../fatigue/effective-notch.js';
import { earnedDetails, type EarnedClass, type MeasuredForClass } from '../fatigue/select.js';
import { cyclesToFailure, SN_EDITION } from '../fatigue/sn-curve.js';
import { thicknessFactor } from '../fatigue/thickness.js';
import { KM_COVERED_LOCAL } from '../misalignment/covered.js';
import type { Reading } from '../model/seam-file.js';
import { readingSide } from '../model/joint.js';
import type { BendingState } from './bending.js';
import { positionOf } from './readings.js';
import type { Setup } from './setup.js';
import { toeLabel, type ToePick } from './toes.js';
import { effectiveNumbers, notchNumbers, rangeOf, toeNotchFactors } from '../notch/toe-factors.js';
import type {
  DetailUse,
  EffectiveNotchCheck,
  EffectiveValue,
  FatFlag,
  FatigueAssessment,
  LifeEstimate,
  MisalignmentAssessment,
  NotchToe,
} from './types.js';

/** What the measured seam shows about the geometry the classes ask for (all readings of the round). */
export function measuredForClass(readings: readonly Reading[]): MeasuredForClass {
  let minToe: Reading | undefined;
  let maxRatio: { r: Reading; v: number } | undefined;
  for (const r of readings) {
    const a = r.values.toeAngle;
    if (a !== undefined && (!minToe || a < (minToe.values.toeAngle as number))) minToe = r;
    const h = r.values.reinforcementHeight;
    const b = r.values.reinforcementWidth;
    if (h !== undefined && b !== undefined && b > 0 && (!maxRatio || h / b > maxRatio.v))
      maxRatio = { r, v: h / b };
  }
  const where = (r: Reading): string =>
    `${positionOf(r)} mm (${r.id}${readingSide(r) ? `, ${readingSide(r)}` : ''})`;
  const out: { -readonly [K in keyof MeasuredForClass]: MeasuredForClass[K] } = {};
  if (minToe) out.minToeAngle = { value: minToe.values.toeAngle as number, where: where(minToe) };
  if (maxRatio) out.maxReinforcementRatio = { value: maxRatio.v, where: where(maxRatio.r) };
  return out;
}

/** The detail ids a free-text detail class names, e.g. "212", "IIW 212" or "iiw-216-noNDT". */
export function detailIdOf(text: string): DetailId | null {
  const s = text.trim().replace(/^iiw[\s-]*/i, '');
  return DETAIL_IDS.find((id) => id.toLowerCase() === s.toLowerCase()) ?? null;
}

/** The plate thickness the class's thickness correction reads, and the toe-to-toe distance of an attachment. */
function thicknessBasis(setup: Setup): { t: number; L?: number } {
  if (setup.family === 'butt') return { t: Math.min(setup.t1, setup.t2) };
  const legs = setup.seam.nominalLegs;
  const leg = legs
    ? Math.max(legs.leg1, legs.leg2)
    : setup.seam.nominalThroat !== undefined
      ? setup.seam.nominalThroat * Math.SQRT2
      : undefined;
  return leg === undefined ? { t: setup.t1 } : { t: setup.t1, L: setup.t2 + 2 * leg };
}

export function detailUse(
  setup: Setup,
  id: DetailId,
  fatOverride: number | undefined,
  kmEff: number | null,
): DetailUse {
  const d = DETAILS[id];
  const fat = fatOverride ?? d.fat[setup.material];
  const { t, L } = thicknessBasis(setup);
  const tf = thicknessFactor(t, d.thicknessExponent, L);
  return {
    id,
    title: d.title,
    fat,
    fatSource:
      fatOverride !== undefined
        ? 'fatigue.fatOverride'
        : `IIW detail ${id}, ${setup.material} (${d.confidence})`,
    crackAt: d.crackAt,
    thicknessFactor: tf,
    thicknessExponent: d.thicknessExponent,
    fatEquivalent: kmEff === null ? null : (fat * tf) / kmEff,
  };
}

export function lifeAt(
  stressRange: number,
  fatEq: number,
  requiredCycles: number | null,
  curve: string,
): LifeEstimate {
  const cycles = cyclesToFailure(stressRange, fatEq);
  return {
    stressRange,
    fatEquivalent: fatEq,
    cycles,
    requiredCycles,
    usage: requiredCycles === null ? null : requiredCycles / cycles,
    meets: requiredCycles === null ? null : cycles >= requiredCycles,
    curve,
  };
}

const CURVE = `${SN_EDITION}: slope 3 to the knee at 10⁷ cycles, slope 22 after it (normal stress)`;

function lifeOf(setup: Setup, fatEq: number | null): LifeEstimate | { notAssessed: string } {
  const f = setup.seam.fatigue;
  const missing: string[] = [];
  if (f?.designStressRange === undefined) missing.push('fatigue.designStressRange');
  if (fatEq === null) missing.push('a FAT equivalent');
  if (missing.length || fatEq === null || f?.designStressRange === undefined)
    return { notAssessed: `needs ${missing.join(' and ')}` };
  if (!(f.designStressRange > 0))
    return { notAssessed: 'the design stress range is zero: no fatigue damage to count' };
  return lifeAt(f.designStressRange, fatEq, f.cycles ?? null, CURVE);
}

export interface ClassChoice {
  readonly earned: EarnedClass;
  readonly ids: readonly DetailId[];
  readonly designId: DetailId | null;
}

export function classChoice(setup: Setup, readings: readonly Reading[]): ClassChoice {
  const earned = earnedDetails(setup.seam, measuredForClass(readings));
  const f = setup.seam.fatigue;
  const designId = f?.detailClass === undefined ? null : detailIdOf(f.detailClass);
  const ids = f?.detailOverride ? [f.detailOverride] : earned.details;
  return { earned, ids, designId };
}

function flagOf(fatEq: number | null, required: number | null): FatFlag {
  if (fatEq === null || required === null) return 'notAssessable';
  return fatEq >= required ? 'meets' : 'below';
}

/** The nominal-stress fatigue class flag and the indicative life. */
export function fatigueSection(
  setup: Setup,
  choice: ClassChoice,
  mis: MisalignmentAssessment,
): FatigueAssessment {
  const f = setup.seam.fatigue;
  const kmEff = mis.kmEff;
  const details = choice.ids.map((id) => detailUse(setup, id, f?.fatOverride, kmEff));
  const governing = details.reduce<DetailUse | null>(
    (g, d) =>
      !g || (d.fatEquivalent ?? d.fat * d.thicknessFactor) < (g.fatEquivalent ?? g.fat * g.thicknessFactor)
        ? d
        : g,
    null,
  );
  const assumptions = [
    ...choice.earned.assumptions,
    'FAT equivalent = FAT · f(t) / km,eff with f(R) = 1 (IIW case III, residual stresses high)',
  ];
  if (f?.detailOverride) assumptions.push(`detail ${f.detailOverride} chosen by fatigue.detailOverride`);
  if (f?.fatOverride !== undefined)
    assumptions.push(`FAT ${f.fatOverride} MPa chosen by fatigue.fatOverride`);
  if (details.some((d) => d.crackAt !== 'toe'))
    assumptions.push('km,eff also applied to the root or throat detail');
  let designDetail: FatigueAssessment['designDetail'] = null;
  if (f?.detailClass !== undefined) {
    const id = choice.designId;
    let note: string | null = id === null ? 'not a catalogue id: kept as the designer’s label' : null;
    const earnedFat = Math.min(...choice.earned.details.map((e) => DETAILS[e].fat[setup.material]));
    if (id !== null && choice.earned.details.length && DETAILS[id].fat[setup.material] > earnedFat) {
      note = `the drawing assumes ${id} (FAT ${DETAILS[id].fat[setup.material]}); the measured seam earns ${choice.earned.details.join(' and ')} (FAT ${earnedFat}): ${choice.earned.why.join('; ')}`;
    }
    designDetail = { text: f.detailClass, id, note };
  }
  const requiredFat =
    f?.requiredFat !== undefined
      ? { value: f.requiredFat, basis: 'the required class in the seam set-up' }
      : choice.designId !== null
        ? {
            value: DETAILS[choice.designId].fat[setup.material],
            basis: `the drawing's detail class ${choice.designId}`,
          }
        : null;
  const missing: string[] = [];
  const loaded = f?.loaded ?? null;
  if (!f) missing.push('seam.fatigue (is the seam fatigue-loaded?)');
  else if (!f.loaded) missing.push('the seam is marked not fatigue-loaded');
  if (!details.length)
    missing.push(
      `a fatigue class: ${choice.earned.why.join('; ')}; give fatigue.detailOverride or fatigue.fatOverride`,
    );
  if (kmEff === null)
    missing.push(`km,eff: ${mis.missing.join('; ') || 'misalignment not assessable for this joint'}`);
  if (!requiredFat) missing.push('fatigue.requiredFat (or a catalogue id in fatigue.detailClass)');
  const fatEq = governing?.fatEquivalent ?? null;
  const flag = loaded ? flagOf(fatEq, requiredFat?.value ?? null) : 'notAssessable';
  const dnvFat = governing && mis.dnv ? (governing.fat * governing.thicknessFactor) / mis.dnv.scf : null;
  return {
    caution: INDICATIVE_CAUTION,
    assumptions,
    loaded,
    material: setup.material,
    earned: { details: choice.earned.details, why: choice.earned.why },
    designDetail,
    override:
      f?.detailOverride !== undefined || f?.fatOverride !== undefined
        ? { detail: f.detailOverride ?? null, fat: f.fatOverride ?? null }
        : null,
    details,
    governing,
    requiredFat,
    fatEquivalent: fatEq,
    flag,
    missing,
    dnvFatEquivalent: dnvFat,
    life: lifeOf(setup, fatEq),
    edition: SN_EDITION,
  };
}

/** The secondary bending left for a local (notch) assessment once the 1.05 its S-N curve holds is taken off. */
export function localBending(b: number): number {
  return b > 0 ? Math.max(0, (1 + b) / KM_COVERED_LOCAL - 1) : b;
}

function notchToe(setup: Setup, pick: ToePick, b: number): NotchToe {
  const ref = notchReference(pick.geometry.t, setup.material);
  const g = { ...pick.geometry, rho: ref.radiusMm };
  const bl = localBending(b);
  const n = notchNumbers(setup.family, g);
  const eff = effectiveNumbers(n, bl);
  const values: EffectiveValue[] = n.bending.map((x, i) => ({
    formula: x.formula,
    value: eff.values[i] as number,
    inRange: eff.inRange[i] as boolean,
  }));
  const tensionOut = !n.tension.inRange;
  const bendingOut = bl !== 0 && !n.bending.some((x) => x.inRange);
  const outside: string[] = [];
  if (tensionOut || bendingOut) {
    // Only here are the messages needed: describe the toe to get them.
    const d = toeNotchFactors(setup.family, g);
    const tension = d.tension[0];
    if (tensionOut && tension) outside.push(...tension.outside.map((m) => `${tension.source}: ${m}`));
    if (bendingOut) {
      for (const x of d.bending) outside.push(...x.outside.map((m) => `${x.source}: ${m}`));
      for (const u of d.unavailable) outside.push(`${u.formula}: ${u.reason}`);
    }
  }
  let kw = -Infinity;
  for (const v of values) if (v.inRange || bl === 0) kw = Math.max(kw, v.value);
  return {
    toe: pick.toe,
    label: toeLabel(setup, pick.toe),
    referenceRadiusMm: ref.radiusMm,
    values,
    range: rangeOf(eff.values, eff.inRange),
    outside,
    fatEquivalent: outside.length || !Number.isFinite(kw) || kw <= 0 ? null : ref.fat / kw,
  };
}

/** The effective-notch cross-check: each toe's factor at the reference radius against the notch FAT. */
export function effectiveNotchSection(
  setup: Setup,
  picks: readonly ToePick[],
  bending: BendingState,
  nominal: FatigueAssessment,
  misalignmentMeasured: boolean,
): EffectiveNotchCheck {
  const toes = picks.map((p) => notchToe(setup, p, bending.b[p.surface] ?? 0));
  const rated = toes.filter((t) => t.fatEquivalent !== null);
  const governing = rated.reduce<NotchToe | null>(
    (g, t) => (!g || (t.fatEquivalent as number) < (g.fatEquivalent as number) ? t : g),
    null,
  );
  const tRef = picks[0]?.geometry.t ?? Math.min(setup.t1, setup.t2);
  const ref = notchReference(tRef, setup.material);
  const missing: string[] = [];
  if (!picks.length) missing.push('toe angles at a toe of the loaded plate');
  else if (!rated.length)
    missing.push('a toe inside the formulas’ validity at the reference radius (see each toe)');
  if (!nominal.requiredFat) missing.push('fatigue.requiredFat');
  if (!nominal.loaded) missing.push('a fatigue-loaded seam');
  const assumptions = [
    'σ_notch = Δσ_nom·(Kt,m + Kt,b·b′) at the reference radius, b′ the secondary bending beyond the km = 1.05 the notch S-N curve holds',
    'the worst reading of each toe, as in the ranking',
  ];
  if (!misalignmentMeasured) assumptions.push('no misalignment measured: b′ = 0');
  const fatEq = governing?.fatEquivalent ?? null;
  const f = setup.seam.fatigue;
  return {
    caution: INDICATIVE_CAUTION,
    assumptions,
    basis: ref.basis,
    fat: ref.fat,
    toes,
    governing,
    fatEquivalent: fatEq,
    flag: nominal.loaded ? flagOf(fatEq, nominal.requiredFat?.value ?? null) : 'notAssessable',
    missing,
    life:
      fatEq === null || f?.designStressRange === undefined
        ? { notAssessed: `needs ${fatEq === null ? 'a notch FAT equivalent' : 'fatigue.designStressRange'}` }
        : !(f.designStressRange > 0)
          ? { notAssessed: 'the design stress range is zero: no fatigue damage to count' }
          : lifeAt(f.designStressRange, fatEq, f.cycles ?? null, `${CURVE}, notch curve FAT ${ref.fat}`),
  };
}
