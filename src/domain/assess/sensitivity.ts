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

/** A measured input to move: a misalignment (moves km, life and every toe) or one toe's geometry (moves that toe). */
interface Input {
  readonly input: string;
  readonly where: string;
  readonly readingId: string;
  readonly value: number;
  readonly unit: 'mm' | 'deg';
  readonly uncertainty: number;
  readonly basis: string;
  readonly moveMisalignment?: (d: number) => MisalignmentInputs;
  readonly moveToe?: { readonly index: number; readonly to: (d: number) => ToeGeometry };
}

function misalignmentInputs(mis: MisalignmentInputs): Input[] {
  const out: Input[] = [];
  const add = (kind: 'e' | 'a', m: Measured | null, where: string): void => {
    const name = kind === 'e' ? 'linear misalignment e' : 'angular misalignment';
    if (!m || out.some((x) => x.readingId === m.readingId && x.input === name)) return;
    out.push({
      input: name,
      where: `${where} at ${m.position} mm`,
      readingId: m.readingId,
      value: m.value,
      unit: kind === 'e' ? 'mm' : 'deg',
      uncertainty: m.resolution,
      basis: m.resolutionBasis,
      moveMisalignment: (d) => {
        // The same reading may be both the highest and the lowest of its kind: move it in both places.
        const move = (x: Measured | null): Measured | null =>
          x && x.readingId === m.readingId ? { ...x, value: x.value + d } : x;
        return kind === 'e'
          ? { ...mis, eHi: move(mis.eHi), eLo: move(mis.eLo) }
          : { ...mis, aHi: move(mis.aHi), aLo: move(mis.aLo) };
      },
    });
  };
  add('e', mis.eHi, 'most positive');
  add('e', mis.eLo, 'most negative');
  add('a', mis.aHi, 'most positive');
  add('a', mis.aLo, 'most negative');
  return out;
}

function toeInputs(setup: Setup, picks: readonly ToePick[]): Input[] {
  const out: Input[] = [];
  picks.forEach((p, index) => {
    const where = `${toeLabel(setup, p.toe)} at ${positionOf(p.reading)} mm`;
    const deg = resolutionOf(p.reading, 'deg');
    const mm = resolutionOf(p.reading, 'mm');
    const g = p.geometry;
    const angle = 180 - g.flankDeg;
    const common = { readingId: p.reading.id, where };
    out.push({
      ...common,
      input: 'toe angle',
      value: angle,
      unit: 'deg',
      uncertainty: deg.value,
      basis: deg.basis,
      moveToe: { index, to: (d) => ({ ...g, flankDeg: 180 - Math.min(180, Math.max(90, angle + d)) }) },
    });
    if (p.radiusBasis === 'measured') {
      out.push({
        ...common,
        input: 'toe radius',
        value: g.rho,
        unit: 'mm',
        uncertainty: mm.value,
        basis: mm.basis,
        moveToe: { index, to: (d) => ({ ...g, rho: Math.max(1e-3, g.rho + d) }) },
      });
    }
    const h = g.h;
    if (h !== undefined) {
      out.push({
        ...common,
        where: `${where} (${p.hBasis ?? ''})`,
        input: 'reinforcement height',
        value: h,
        unit: 'mm',
        uncertainty: mm.value,
        basis: mm.basis,
        moveToe: { index, to: (d) => ({ ...g, h: Math.max(1e-6, h + d) }) },
      });
    }
  });
  return out;
}

/** Life and toe factors with one input moved by d. */
function moved(
  setup: Setup,
  inp: Input,
  d: number,
  base: Outcome,
  notches: readonly NotchNumbers[],
  picks: readonly ToePick[],
  fixed: Fixed,
): Outcome {
  if (inp.moveToe) {
    // One toe's geometry: km, life and the other toes stay as they were.
    const { index, to } = inp.moveToe;
    const p = picks[index] as ToePick;
    const toes = [...base.toes];
    toes[index] = toeScore(setup, to(d), base.b[p.surface] ?? 0);
    return { life: base.life, toes, b: base.b };
  }
  // A misalignment: every toe keeps its notch factors; only the secondary bending moves.
  const { b } = bendingOf(setup, (inp.moveMisalignment as (d: number) => MisalignmentInputs)(d));
  return { life: lifeFrom(b, fixed), toes: picks.map((p, i) => effectiveMax(notches[i] as NotchNumbers, b[p.surface] ?? 0)), b };
}

/** One-at-a-time sensitivity of the life and of each toe's factor to every measured input over its uncertainty. */
export function sensitivitySection(
  setup: Setup,
  mis: MisalignmentInputs,
  picks: readonly ToePick[],
  fixed: Fixed,
): Sensitivity {
  const notches = picks.map((p) => notchNumbers(setup.family, p.geometry));
  const { b } = bendingOf(setup, mis);
  const base: Outcome = {
    life: lifeFrom(b, fixed),
    toes: picks.map((p, i) => effectiveMax(notches[i] as NotchNumbers, b[p.surface] ?? 0)),
    b,
  };
  const byLife = base.life !== null && Number.isFinite(base.life);
  const labels = picks.map((p) => toeLabel(setup, p.toe));
  const finite = (x: number): number => (Number.isFinite(x) ? Math.abs(x) : 0);
  const rel = (x: number | null): number => (x === null || base.life === null ? 0 : x / base.life - 1);
  const rows: SensitivityRow[] = [...misalignmentInputs(mis), ...toeInputs(setup, picks)].map((inp) => {
    const lo = moved(setup, inp, -inp.uncertainty, base, notches, picks, fixed);
    const hi = moved(setup, inp, inp.uncertainty, base, notches, picks, fixed);
    const life = byLife ? { minus: rel(lo.life), plus: rel(hi.life) } : null;
    let toeMagnitude = 0;
    const toeFactors = labels.map((label, i) => {
      const minus = (lo.toes[i] as number) - (base.toes[i] as number);
      const plus = (hi.toes[i] as number) - (base.toes[i] as number);
      toeMagnitude = Math.max(toeMagnitude, finite(minus), finite(plus));
      return { label, minus, plus };
    });
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
      magnitude: life ? Math.max(finite(life.minus), finite(life.plus)) : toeMagnitude,
      toeMagnitude,
    };
  });
  // By life first; inputs that leave life alone (a toe under a root-crack class) by their effect on the toes.
  rows.sort((x, y) => y.magnitude - x.magnitude || y.toeMagnitude - x.toeMagnitude || x.input.localeCompare(y.input));
  const assumptions = [
    'one input at a time, lowered and raised by its instrument resolution; everything else as measured',
    'the fatigue class, km,covered and the design stress range are held fixed',
  ];
  if (!byLife) assumptions.push('life not assessable: inputs ranked by their effect on the toe factors');
  return { caution: INDICATIVE_CAUTION, assumptions, rankedBy: byLife ? 'life' : 'toe factor', rows };
}
