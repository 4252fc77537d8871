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

function lifeFrom(b: readonly number[], fixed: Fixed): number | null {
  if (
    !fixed.kmMeasured ||
    fixed.covered === null ||
    fixed.fatTimesThickness === null ||
    fixed.stressRange === null
  ) {
    return null;
  }
  const kmCalc = 1 + Math.max(0, ...b);
  const kmEff = Math.max(1, kmCalc / fixed.covered);
  return cyclesToFailure(fixed.stressRange, fixed.fatTimesThickness / kmEff);
}

interface Row {
  readonly input: string;
  readonly where: string;
  readonly readingId: string;
  readonly value: number;
  readonly unit: 'mm' | 'deg';
  readonly uncertainty: number;
  readonly basis: string;
}

const finite = (x: number): number => (Number.isFinite(x) ? Math.abs(x) : 0);

/** One-at-a-time sensitivity of the life and of each toe's factor to every measured input over its uncertainty. */
export function sensitivitySection(
  setup: Setup,
  mis: MisalignmentInputs,
  picks: readonly ToePick[],
  fixed: Fixed,
): Sensitivity {
  const notches = picks.map((p) => notchNumbers(setup.family, p.geometry));
  const base = bendingOf(setup, mis).b;
  const baseLife = lifeFrom(base, fixed);
  const baseToes = picks.map((p, i) => effectiveMax(notches[i] as NotchNumbers, base[p.surface] ?? 0));
  const byLife = baseLife !== null && Number.isFinite(baseLife);
  const rel = (x: number | null): number => (x === null || baseLife === null ? 0 : x / baseLife - 1);
  const labels = picks.map((p) => toeLabel(setup, p.toe));
  const rows: SensitivityRow[] = [];
  const push = (
    r: Row,
    life: { minus: number; plus: number } | null,
    toeFactors: SensitivityRow['toeFactors'],
  ): void => {
    let toeMagnitude = 0;
    for (const t of toeFactors) toeMagnitude = Math.max(toeMagnitude, finite(t.minus), finite(t.plus));
    rows.push({
      input: r.input,
      where: r.where,
      readingId: r.readingId,
      value: r.value,
      unit: r.unit,
      uncertainty: r.uncertainty,
      uncertaintyBasis: r.basis,
      life,
      toeFactors,
      magnitude: life ? Math.max(finite(life.minus), finite(life.plus)) : toeMagnitude,
      toeMagnitude,
    });
  };

  // A misalignment moves km, so life and every toe; the toes keep their notch factors.
  const seen = new Set<string>();
  const misalignment = (kind: 'e' | 'a', m: Measured | null, where: string): void => {
    const input = kind === 'e' ? 'linear misalignment e' : 'angular misalignment';
    if (!m || seen.has(`${kind}|${m.readingId}`)) return;
    seen.add(`${kind}|${m.readingId}`);
    const at = (d: number): readonly number[] => {
      // The same reading may be both the highest and the lowest of its kind: move it in both places.
      const move = (x: Measured | null): Measured | null =>
        x && x.readingId === m.readingId ? { ...x, value: x.value + d } : x;
      const next =
        kind === 'e'
          ? { ...mis, eHi: move(mis.eHi), eLo: move(mis.eLo) }
          : { ...mis, aHi: move(mis.aHi), aLo: move(mis.aLo) };
      return bendingOf(setup, next).b;
    };
    const lo = at(-m.resolution);
    const hi = at(m.resolution);
    const toeFactors = picks.map((p, i) => {
      const n = notches[i] as NotchNumbers;
      const b0 = baseToes[i] as number;
      return {
        label: labels[i] as string,
        minus: effectiveMax(n, lo[p.surface] ?? 0) - b0,
        plus: effectiveMax(n, hi[p.surface] ?? 0) - b0,
      };
    });
    push(
      {
        input,
        where: `${where} at ${m.position} mm`,
        readingId: m.readingId,
        value: m.value,
        unit: kind === 'e' ? 'mm' : 'deg',
        uncertainty: m.resolution,
        basis: m.resolutionBasis,
      },
      byLife ? { minus: rel(lifeFrom(lo, fixed)), plus: rel(lifeFrom(hi, fixed)) } : null,
      toeFactors,
    );
  };
  misalignment('e', mis.eHi, 'most positive');
  misalignment('e', mis.eLo, 'most negative');
  misalignment('a', mis.aHi, 'most positive');
  misalignment('a', mis.aLo, 'most negative');

  // A toe's geometry moves only that toe: km and life stay, the other toes stay (left out of its row).
  picks.forEach((p, i) => {
    const g = p.geometry;
    const b = base[p.surface] ?? 0;
    const b0 = baseToes[i] as number;
    const where = `${labels[i] as string} at ${positionOf(p.reading)} mm`;
    const life = byLife ? { minus: 0, plus: 0 } : null;
    const one = (
      input: string,
      value: number,
      unit: 'mm' | 'deg',
      res: { value: number; basis: string },
      to: (x: number) => ToeGeometry,
      at = where,
    ): void => {
      const minus = toeScore(setup, to(value - res.value), b) - b0;
      const plus = toeScore(setup, to(value + res.value), b) - b0;
      push(
        { input, where: at, readingId: p.reading.id, value, unit, uncertainty: res.value, basis: res.basis },
        life,
        [{ label: labels[i] as string, minus, plus }],
      );
    };
    const deg = resolutionOf(p.reading, 'deg');
    const mm = resolutionOf(p.reading, 'mm');
    one('toe angle', 180 - g.flankDeg, 'deg', deg, (x) => ({
      ...g,
      flankDeg: 180 - Math.min(180, Math.max(90, x)),
    }));
    if (p.radiusBasis === 'measured')
      one('toe radius', g.rho, 'mm', mm, (x) => ({ ...g, rho: Math.max(1e-3, x) }));
    if (g.h !== undefined) {
      one(
        'reinforcement height',
        g.h,
        'mm',
        mm,
        (x) => ({ ...g, h: Math.max(1e-6, x) }),
        `${where} (${p.hBasis ?? ''})`,
      );
    }
  });

  // By life first; inputs that leave life alone (a toe under a root-crack class) by their effect on the toes.
  rows.sort(
    (x, y) => y.magnitude - x.magnitude || y.toeMagnitude - x.toeMagnitude || x.input.localeCompare(y.input),
  );
  const assumptions = [
    'one input at a time, lowered and raised by its instrument resolution; everything else as measured',
    'the fatigue class, km,covered and the design stress range are held fixed',
    'a toe-geometry input lists only its own toe: the other toes do not change',
  ];
  if (!byLife) assumptions.push('life not assessable: inputs ranked by their effect on the toe factors');
  return { caution: INDICATIVE_CAUTION, assumptions, rankedBy: byLife ? 'life' : 'toe factor', rows };
}
