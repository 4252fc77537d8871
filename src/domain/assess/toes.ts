import { INDICATIVE_CAUTION } from '../caution.js';
import type { Reading } from '../model/seam-file.js';
import {
  effectiveFactors,
  effectiveMaxOf,
  rangeOf,
  toeNotchFactors,
  type FactorRange,
  type ToeNotch,
} from '../notch/toe-factors.js';
import type { ToeGeometry } from '../notch/types.js';
import { surfaceIndex, toeSurface, type BendingState } from './bending.js';
import { positionOf, SideValues } from './readings.js';
import type { Setup } from './setup.js';
import type { EffectiveValue, ToeAssessment, ToeRanking, ToeRef } from './types.js';

const TOES: readonly ToeRef[] = [
  { plate: 1, side: 'face' },
  { plate: 2, side: 'face' },
  { plate: 1, side: 'root' },
  { plate: 2, side: 'root' },
];

export function toeLabel(setup: Setup, toe: ToeRef): string {
  if (setup.family === 'butt') return `plate ${toe.plate} ${toe.side}-side toe`;
  const where = toe.plate === 1 ? 'main-plate toe' : 'attachment toe';
  return `${where} of the ${toe.side}-side fillet`;
}

/** The radius a toe is assessed at when none was measured: the effective-notch reference radius. */
export const referenceRadius = (t: number): number => (t >= 5 ? 1 : 0.05);

/** The toe geometry a governing reading gives, with what was assumed to complete it. */
export interface ToePick {
  readonly toe: ToeRef;
  readonly surface: number;
  readonly reading: Reading;
  readonly geometry: ToeGeometry;
  readonly radiusBasis: string;
  readonly hBasis: string | null;
  readonly count: number;
}

export interface ToeFactor {
  readonly notch: ToeNotch;
  readonly effective: EffectiveValue[];
  readonly range: FactorRange | null;
}

export function toeFactor(setup: Setup, g: ToeGeometry, b: number): ToeFactor {
  const notch = toeNotchFactors(setup.family, g);
  const eff = effectiveFactors(notch, b);
  const effective: EffectiveValue[] = notch.bending.length
    ? notch.bending.map((x, i) => ({
        formula: x.formula,
        value: eff.values[i] as number,
        inRange: eff.inRange[i] as boolean,
      }))
    : eff.values.map((v, i) => ({
        formula: 'lawrenceTension',
        value: v,
        inRange: eff.inRange[i] as boolean,
      }));
  return { notch, effective, range: rangeOf(eff.values, eff.inRange) };
}

/** The upper end of a toe's effective-factor range, computed without text or objects (ranking, sensitivity). */
export const toeScore = (setup: Setup, g: ToeGeometry, b: number): number => effectiveMaxOf(setup.family, g, b);

const REFERENCE_BASIS_THICK = `not measured at this toe: the reference radius ${referenceRadius(5)} mm`;
const REFERENCE_BASIS_THIN = `not measured at this toe: the reference radius ${referenceRadius(1)} mm`;

function geometryOf(
  setup: Setup,
  toe: ToeRef,
  r: Reading,
  smallestRadius: number | undefined,
  sides: SideValues,
): { g: ToeGeometry; radiusBasis: string; hBasis: string | null } {
  const t = setup.family === 'butt' ? (toe.plate === 1 ? setup.t1 : setup.t2) : setup.t1;
  const own = r.values.toeRadius;
  const rho = own ?? smallestRadius ?? referenceRadius(t);
  const radiusBasis =
    own !== undefined
      ? 'measured'
      : smallestRadius !== undefined
        ? 'not measured here: the smallest radius measured at this toe'
        : t >= 5
          ? REFERENCE_BASIS_THICK
          : REFERENCE_BASIS_THIN;
  const g: { -readonly [K in keyof ToeGeometry]: ToeGeometry[K] } = {
    t,
    flankDeg: 180 - (r.values.toeAngle as number),
    rho,
  };
  let hBasis: string | null = null;
  if (setup.family === 'butt') {
    const h = sides.get(r, toe.side, 'reinforcementHeight');
    if (h) {
      g.h = h.value;
      hBasis = h.basis;
    }
  } else {
    const a = sides.get(r, toe.side, 'throat');
    const a0 = a?.value ?? setup.seam.nominalThroat;
    if (a0 !== undefined) g.a = a0;
    const c = sides.get(r, toe.side, 'convexity');
    if (c) g.convexity = c.value;
  }
  return { g, radiusBasis, hBasis };
}

/** Per toe: the reading that gives it the highest effective factor, with that factor. */
export function pickToes(
  setup: Setup,
  readings: readonly Reading[],
  bending: BendingState,
): { picks: ToePick[]; notRanked: ToeRanking['notRanked'] } {
  const sides = new SideValues(readings);
  const picks: ToePick[] = [];
  const notRanked: { toe: ToeRef | null; reason: string }[] = [];
  if (setup.joint === 'lap') {
    if (readings.some((r) => r.values.toeAngle !== undefined)) {
      notRanked.push({ toe: null, reason: 'lap joints: no toe formula in the notch reference applies' });
    }
    return { picks, notRanked };
  }
  for (const toe of TOES) {
    const list = readings.filter(
      (r) => r.toe?.plate === toe.plate && r.toe.side === toe.side && r.values.toeAngle !== undefined,
    );
    if (!list.length) continue;
    const surface = toeSurface(setup.joint, toe);
    if (!surface) {
      notRanked.push({
        toe,
        reason: 'a toe on the attachment: the fatigue loads are taken on the main plate (plate 1)',
      });
      continue;
    }
    const si = surfaceIndex(setup.joint, surface);
    const b = bending.b[si] ?? 0;
    let smallest: number | undefined;
    for (const r of list)
      if (r.values.toeRadius !== undefined) smallest = Math.min(smallest ?? Infinity, r.values.toeRadius);
    let best: { pick: ToePick; score: number } | null = null;
    for (const r of list) {
      const { g, radiusBasis, hBasis } = geometryOf(setup, toe, r, smallest, sides);
      const score = toeScore(setup, g, b);
      if (
        !best ||
        score > best.score ||
        (score === best.score && positionOf(r) < positionOf(best.pick.reading))
      ) {
        best = {
          pick: { toe, surface: si, reading: r, geometry: g, radiusBasis, hBasis, count: list.length },
          score,
        };
      }
    }
    if (best) picks.push(best.pick);
  }
  return { picks, notRanked };
}

export function toeAssessment(setup: Setup, pick: ToePick, b: number, rank: number): ToeAssessment {
  const f = toeFactor(setup, pick.geometry, b);
  const r = pick.reading;
  return {
    toe: pick.toe,
    label: toeLabel(setup, pick.toe),
    thicknessMm: pick.geometry.t,
    readings: pick.count,
    governing: {
      readingId: r.id,
      position: positionOf(r),
      toeAngle: r.values.toeAngle as number,
      flankDeg: pick.geometry.flankDeg,
      toeRadius: pick.geometry.rho,
      radiusBasis: pick.radiusBasis,
      reinforcementHeight: pick.geometry.h ?? null,
      throat: pick.geometry.a ?? null,
    },
    bendingRatio: b,
    secondaryBending: b > 0 ? 'tension' : b < 0 ? 'compression' : 'none',
    bending: f.notch.bending,
    tension: f.notch.tension,
    unavailable: f.notch.unavailable,
    effective: f.effective,
    range: f.range,
    rank,
  };
}

const fmt = (x: number): string => String(Number(x.toPrecision(3)));

/** The toes ranked by their effective factor, highest (most likely crack site) first. */
export function rankToes(
  setup: Setup,
  picks: readonly ToePick[],
  bending: BendingState,
  notRanked: ToeRanking['notRanked'],
  misalignmentMeasured: boolean,
): ToeRanking {
  const scored = picks
    .map((p) => ({ p, a: toeAssessment(setup, p, bending.b[p.surface] ?? 0, 0) }))
    .sort(
      (x, y) =>
        (y.a.range?.max ?? -Infinity) - (x.a.range?.max ?? -Infinity) || x.p.toe.plate - y.p.toe.plate,
    );
  const toes = scored.map((s, i) => ({ ...s.a, rank: i + 1 }));
  const assumptions = [
    'Kt,eff = Kt,m + Kt,b·b against the nominal membrane stress; b is the signed secondary-bending ratio of the toe’s surface',
    'each toe at its worst reading, combined with the worst misalignment for that surface, which may lie at another position (conservative)',
    'Kt,m from the Lawrence form with recalled α_L; Kt,b from the bending formulas inside their validity (the range spans them)',
  ];
  if (!misalignmentMeasured)
    assumptions.push('no misalignment measured: b = 0 (no secondary bending) at every toe');
  const bases = new Set(
    picks.map((p) => p.radiusBasis === 'measured' || p.radiusBasis.startsWith('not measured here')),
  );
  const top = toes[0];
  return {
    caution: INDICATIVE_CAUTION,
    assumptions,
    toes,
    notRanked,
    crackSite: top?.range
      ? {
          toe: top.toe,
          label: top.label,
          position: top.governing.position,
          readingId: top.governing.readingId,
          factor: top.range.max,
          why: `highest effective factor ${fmt(top.range.max)} (${top.secondaryBending === 'tension' ? `secondary bending in tension, b = ${fmt(top.bendingRatio)}` : top.secondaryBending === 'compression' ? `despite secondary bending in compression, b = ${fmt(top.bendingRatio)}` : 'no secondary bending'})`,
        }
      : null,
    note:
      bases.size > 1 ? 'the ranking mixes toes with measured radii and toes at the reference radius' : null,
  };
}
