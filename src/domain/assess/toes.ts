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
import { positionOf, sideBasis, SideValues, type SideValue } from './readings.js';
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
export const toeScore = (setup: Setup, g: ToeGeometry, b: number): number =>
  effectiveMaxOf(setup.family, g, b);

const REFERENCE_BASIS_THICK = `not measured at this toe: the reference radius ${referenceRadius(5)} mm`;
const REFERENCE_BASIS_THIN = `not measured at this toe: the reference radius ${referenceRadius(1)} mm`;

type MutableGeometry = { -readonly [K in keyof ToeGeometry]: ToeGeometry[K] };

/** Fills `g` with a toe reading's geometry (completing it from side readings) and returns the side value used. */
function fillGeometry(
  g: MutableGeometry,
  setup: Setup,
  toe: ToeRef,
  r: Reading,
  smallestRadius: number | undefined,
  sides: SideValues,
): SideValue | undefined {
  const t = setup.family === 'butt' ? (toe.plate === 1 ? setup.t1 : setup.t2) : setup.t1;
  g.t = t;
  g.flankDeg = 180 - (r.values.toeAngle as number);
  g.rho = r.values.toeRadius ?? smallestRadius ?? referenceRadius(t);
  if (setup.family === 'butt') {
    const h = sides.get(r, toe.side, 'reinforcementHeight');
    g.h = h?.value;
    return h;
  }
  g.a = sides.get(r, toe.side, 'throat')?.value ?? setup.seam.nominalThroat;
  g.convexity = sides.get(r, toe.side, 'convexity')?.value;
  return undefined;
}

function radiusBasisOf(r: Reading, smallestRadius: number | undefined, t: number): string {
  if (r.values.toeRadius !== undefined) return 'measured';
  if (smallestRadius !== undefined) return 'not measured here: the smallest radius measured at this toe';
  return t >= 5 ? REFERENCE_BASIS_THICK : REFERENCE_BASIS_THIN;
}

/** Per toe: the reading that gives it the highest effective factor, with that factor. */
export function pickToes(
  setup: Setup,
  readings: readonly Reading[],
  bending: BendingState,
): { picks: ToePick[]; notRanked: ToeRanking['notRanked'] } {
  const picks: ToePick[] = [];
  const notRanked: { toe: ToeRef | null; reason: string }[] = [];
  if (setup.joint === 'lap') {
    if (readings.some((r) => r.values.toeAngle !== undefined)) {
      notRanked.push({ toe: null, reason: 'lap joints: no toe formula in the notch reference applies' });
    }
    return { picks, notRanked };
  }
  // The toe readings, by toe (index into TOES), in one pass.
  const byToe: Reading[][] = [[], [], [], []];
  for (const r of readings) {
    if (!r.toe || r.values.toeAngle === undefined) continue;
    (byToe[r.toe.plate - 1 + (r.toe.side === 'root' ? 2 : 0)] as Reading[]).push(r);
  }
  const sides = new SideValues(readings);
  TOES.forEach((toe, k) => {
    const list = byToe[k] as Reading[];
    if (!list.length) return;
    const surface = toeSurface(setup.joint, toe);
    if (!surface) {
      notRanked.push({
        toe,
        reason: 'a toe on the attachment: the fatigue loads are taken on the main plate (plate 1)',
      });
      return;
    }
    const si = surfaceIndex(setup.joint, surface);
    const b = bending.b[si] ?? 0;
    let smallest: number | undefined;
    for (const r of list) {
      if (r.values.toeRadius !== undefined) smallest = Math.min(smallest ?? Infinity, r.values.toeRadius);
    }
    // One scratch geometry for scoring every reading; the winner's is rebuilt as its own object.
    const scratch: MutableGeometry = {
      t: 0,
      flankDeg: 0,
      rho: 1,
      h: undefined,
      a: undefined,
      convexity: undefined,
    };
    let best: Reading | undefined;
    let bestScore = -Infinity;
    for (const r of list) {
      fillGeometry(scratch, setup, toe, r, smallest, sides);
      const score = toeScore(setup, scratch, b);
      if (!best || score > bestScore || (score === bestScore && positionOf(r) < positionOf(best))) {
        best = r;
        bestScore = score;
      }
    }
    if (!best) return;
    const g: MutableGeometry = {
      t: 0,
      flankDeg: 0,
      rho: 1,
      h: undefined,
      a: undefined,
      convexity: undefined,
    };
    const h = fillGeometry(g, setup, toe, best, smallest, sides);
    picks.push({
      toe,
      surface: si,
      reading: best,
      geometry: g,
      radiusBasis: radiusBasisOf(best, smallest, g.t),
      hBasis: h ? sideBasis(h) : null,
      count: list.length,
    });
  });
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
