import { INDICATIVE_CAUTION } from '../caution.js';
import { cyclesToFailure } from '../fatigue/sn-curve.js';
import { effectiveMax, notchNumbers, type NotchNumbers } from '../notch/toe-factors.js';
import type { ToeGeometry } from '../notch/types.js';
import { bendingOf, type Measured, type MisalignmentInputs } from './bending.js';
import { positionOf, resolutionOf } from './readings.js';
import type { Setup } from './setup.js';
import { toeLabel, toeScore, type ToePick } from './toes.js';
import type { Sensitivity, SensitivityRow } from './types.js';

/** What stays fixed while one input moves: the class, km,covered and the design stress range. */
export interface Fixed {
  readonly kmMeasured: boolean;
  readonly covered: number | null;
  /** The governing detail's FAT · f(t), before km,eff. */
  readonly fatTimesThickness: number | null;
  readonly stressRange: number | null;
}

interface Outcome {
  readonly life: number | null;
  readonly toes: readonly number[];
  readonly b: readonly number[];
}

function lifeFrom(b: readonly number[], fixed: Fixed): number | null {
  if (!fixed.kmMeasured || fixed.covered === null || fixed.fatTimesThickness === null || fixed.stressRange === null) {
    return null;
  }
  const kmCalc = 1 + Math.max(0, ...b);
  const kmEff = Math.max(1, kmCalc / fixed.covered);
  return cyclesToFailure(fixed.stressRange, fixed.fatTimesThickness / kmEff);
}

/**
 * Life and toe factors after a change. A change of one toe's geometry leaves km, life and the other toes alone;
 * a change of misalignment leaves every toe's notch factors alone and only moves the secondary bending.
 */
function evaluate(
  setup: Setup,
  base: Outcome | null,
  notches: readonly NotchNumbers[],
  mis: MisalignmentInputs,
  picks: readonly ToePick[],
  changedToe: number | null,
  fixed: Fixed,
): Outcome {
  if (base && changedToe !== null) {
    const p = picks[changedToe] as ToePick;
    const toes = [...base.toes];
    toes[changedToe] = toeScore(setup, p.geometry, base.b[p.surface] ?? 0);
    return { life: base.life, toes, b: base.b };
  }
  const { b } = bendingOf(setup, mis);
  return {
    life: lifeFrom(b, fixed),
    toes: picks.map((p, i) => effectiveMax(notches[i] as NotchNumbers, b[p.surface] ?? 0)),
    b,
  };
}

interface Input {
  readonly input: string;
  readonly where: string;
  readonly readingId: string;
  readonly value: number;
  readonly unit: 'mm' | 'deg';
  readonly uncertainty: number;
  readonly basis: string;
  readonly apply: (d: number) => { mis: MisalignmentInputs; picks: readonly ToePick[] };
  /** The toe whose geometry the input is, or null for a misalignment. */
  readonly toe: number | null;
}

function misalignmentInputsToVary(mis: MisalignmentInputs, picks: readonly ToePick[]): Input[] {
  const out: Input[] = [];
  const add = (
    key: keyof MisalignmentInputs,
    m: Measured | null,
    name: string,
    unit: 'mm' | 'deg',
    where: string,
  ): void => {
    if (!m || out.some((x) => x.readingId === m.readingId && x.input === name)) return;
    out.push({
      input: name,
      where: `${where} at ${m.position} mm`,
      readingId: m.readingId,
      value: m.value,
      unit,
      uncertainty: m.resolution,
      basis: m.resolutionBasis,
      toe: null,
      apply: (d) => {
        const next: { -readonly [K in keyof MisalignmentInputs]: MisalignmentInputs[K] } = { ...mis };
        // The same reading may be both the highest and the lowest of its kind (e… or a…): move it in both places.
        for (const k of ['eHi', 'eLo', 'aHi', 'aLo'] as const) {
          const x = mis[k];
          if (x && x.readingId === m.readingId && k[0] === key[0]) next[k] = { ...x, value: x.value + d };
        }
        return { mis: next, picks };
      },
    });
  };
  add('eHi', mis.eHi, 'linear misalignment e', 'mm', 'most positive');
  add('eLo', mis.eLo, 'linear misalignment e', 'mm', 'most negative');
  add('aHi', mis.aHi, 'angular misalignment', 'deg', 'most positive');
  add('aLo', mis.aLo, 'angular misalignment', 'deg', 'most negative');
  return out;
}

function toeInputsToVary(setup: Setup, mis: MisalignmentInputs, picks: readonly ToePick[]): Input[] {
  const out: Input[] = [];
  picks.forEach((p, i) => {
    const with_ = (g: ToeGeometry) => ({
      mis,
      picks: picks.map((q, j) => (j === i ? { ...q, geometry: g } : q)),
    });
    const where = `${toeLabel(setup, p.toe)} at ${positionOf(p.reading)} mm`;
    const deg = resolutionOf(p.reading, 'deg');
    const mm = resolutionOf(p.reading, 'mm');
    const angle = 180 - p.geometry.flankDeg;
    out.push({
      input: 'toe angle',
      where,
      readingId: p.reading.id,
      value: angle,
      unit: 'deg',
      uncertainty: deg.value,
      basis: deg.basis,
      toe: i,
      apply: (d) => with_({ ...p.geometry, flankDeg: 180 - Math.min(180, Math.max(90, angle + d)) }),
    });
    if (p.radiusBasis === 'measured') {
      out.push({
        input: 'toe radius',
        where,
        readingId: p.reading.id,
        value: p.geometry.rho,
        unit: 'mm',
        uncertainty: mm.value,
        basis: mm.basis,
        toe: i,
        apply: (d) => with_({ ...p.geometry, rho: Math.max(1e-3, p.geometry.rho + d) }),
      });
    }
    const h = p.geometry.h;
    if (h !== undefined) {
      out.push({
        input: 'reinforcement height',
        where: `${where} (${p.hBasis ?? ''})`,
        readingId: p.reading.id,
        value: h,
        unit: 'mm',
        uncertainty: mm.value,
        basis: mm.basis,
        toe: i,
        apply: (d) => with_({ ...p.geometry, h: Math.max(1e-6, h + d) }),
      });
    }
  });
  return out;
}

/** One-at-a-time sensitivity of the life and of each toe's factor to every measured input over its uncertainty. */
export function sensitivitySection(
  setup: Setup,
  mis: MisalignmentInputs,
  picks: readonly ToePick[],
  fixed: Fixed,
): Sensitivity {
  const notches = picks.map((p) => notchNumbers(setup.family, p.geometry));
  const base = evaluate(setup, null, notches, mis, picks, null, fixed);
  const labels = picks.map((p) => toeLabel(setup, p.toe));
  const byLife = base.life !== null && Number.isFinite(base.life);
  const inputs = [...misalignmentInputsToVary(mis, picks), ...toeInputsToVary(setup, mis, picks)];
  const rows: SensitivityRow[] = inputs.map((inp) => {
    const lo = inp.apply(-inp.uncertainty);
    const hi = inp.apply(inp.uncertainty);
    const a = evaluate(setup, base, notches, lo.mis, lo.picks, inp.toe, fixed);
    const b = evaluate(setup, base, notches, hi.mis, hi.picks, inp.toe, fixed);
    const rel = (x: number | null): number => (x === null || base.life === null ? 0 : x / base.life - 1);
    const life = byLife ? { minus: rel(a.life), plus: rel(b.life) } : null;
    const toeFactors = picks.map((_, i) => ({
      label: labels[i] as string,
      minus: (a.toes[i] as number) - (base.toes[i] as number),
      plus: (b.toes[i] as number) - (base.toes[i] as number),
    }));
    const finite = (x: number): number => (Number.isFinite(x) ? Math.abs(x) : 0);
    const magnitude = life
      ? Math.max(finite(life.minus), finite(life.plus))
      : Math.max(0, ...toeFactors.map((t) => Math.max(finite(t.minus), finite(t.plus))));
    return {
      input: inp.input,
      where: inp.where,
      readingId: inp.readingId,
      value: inp.value,
      unit: inp.unit,
      uncertainty: inp.uncertainty,
      uncertaintyBasis: inp.basis,
      life,
      toeFactors,
      magnitude,
    };
  });
  rows.sort((x, y) => y.magnitude - x.magnitude || x.input.localeCompare(y.input));
  const assumptions = [
    'one input at a time, lowered and raised by its instrument resolution; everything else as measured',
    'the fatigue class, km,covered and the design stress range are held fixed',
  ];
  if (!byLife) assumptions.push('life not assessable: inputs ranked by their effect on the toe factors');
  return { caution: INDICATIVE_CAUTION, assumptions, rankedBy: byLife ? 'life' : 'toe factor', rows };
}
