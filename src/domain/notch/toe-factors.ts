import {
  anthesButtBending,
  anthesButtInside,
  anthesButtRises,
  anthesButtOutside,
  anthesCruciformBending,
  anthesCruciformInside,
  anthesCruciformOutside,
  anthesCruciformRises,
} from './anthes.js';
import { envelope } from './envelope.js';
import { kiyakButtBending, kiyakInside, kiyakNotes, kiyakOutside, kiyakPeakFlank } from './kiyak.js';
import { LAWRENCE_ALPHA, lawrenceInside, lawrenceOutside, lawrenceTension } from './lawrence.js';
import type { FormulaValue, NotchFormulaId, ToeGeometry } from './types.js';

export type NotchJoint = 'butt' | 'fillet';

export interface Unavailable {
  readonly formula: NotchFormulaId;
  readonly reason: string;
}

/** The notch factors of one toe: every applicable formula's value, per load case. */
export interface ToeNotch {
  readonly bending: readonly FormulaValue[];
  readonly tension: readonly FormulaValue[];
  readonly unavailable: readonly Unavailable[];
}

export const NOTCH_SOURCES: Readonly<Record<NotchFormulaId, string>> = {
  anthesButtBending: 'Anthes, Köttgen & Seeger 1993, butt joint, bending',
  kiyakButtBending: 'Kiyak, Madia & Zerbst 2016, butt weld, bending',
  anthesCruciformBending: 'Anthes, Köttgen & Seeger 1993, cruciform joint, bending (s = 0)',
  lawrenceTension: 'Yung & Lawrence 1985 / Lawrence et al. 1981, tension (α_L recalled)',
};

/** One formula's numbers for one toe, without any text: what ranking and sensitivity need, cheaply. */
export interface FormulaNumber {
  readonly formula: NotchFormulaId;
  /** The value used (the monotone envelope where the fit turns over). */
  readonly value: number;
  readonly raw: number;
  readonly inRange: boolean;
  /** Where the envelope's value was taken, when it differs from the measured point. */
  readonly peakFlank: number | null;
  readonly peakRatio: number | null;
}

export interface NotchNumbers {
  readonly bending: readonly FormulaNumber[];
  readonly tension: FormulaNumber;
}

/** With s = 0 the a/t term vanishes: the throat only decides whether the case lies in the fitted range. */
const aOverTOf = (g: ToeGeometry): number => (g.a === undefined ? 0.5 : g.a / g.t);

function numeric(
  formula: NotchFormulaId,
  raw: number,
  inRange: boolean,
  env: { value: number; flankAt: number; ratioAt: number } | null,
): FormulaNumber {
  if (env && env.value > raw) {
    return { formula, value: env.value, raw, inRange, peakFlank: env.flankAt, peakRatio: env.ratioAt };
  }
  return { formula, value: raw, raw, inRange, peakFlank: null, peakRatio: null };
}

function anthesButt(g: ToeGeometry): FormulaNumber {
  const ratio = g.t / g.rho;
  const raw = anthesButtBending(ratio, g.flankDeg);
  const inRange = anthesButtInside(ratio, g.flankDeg);
  const search = inRange && !anthesButtRises(ratio, g.flankDeg);
  return numeric(
    'anthesButtBending',
    raw,
    inRange,
    search ? envelope(anthesButtBending, 1e-3, ratio, 0, g.flankDeg) : null,
  );
}

function kiyak(g: ToeGeometry, h: number): FormulaNumber {
  const raw = kiyakButtBending(g.flankDeg, h, g.t, g.rho);
  const inRange = kiyakInside(g.flankDeg, h, g.t, g.rho);
  if (!inRange) return numeric('kiyakButtBending', raw, false, null);
  // The fit falls with ρ everywhere, and past one flank angle, known in closed form.
  const peak = Math.max(10, kiyakPeakFlank(h, g.t, g.rho));
  if (g.flankDeg <= peak) return numeric('kiyakButtBending', raw, true, null);
  return numeric('kiyakButtBending', raw, true, {
    value: kiyakButtBending(peak, h, g.t, g.rho),
    flankAt: peak,
    ratioAt: g.t / g.rho,
  });
}

function anthesCruciform(g: ToeGeometry): FormulaNumber {
  const ratio = g.t / g.rho;
  const aOverT = aOverTOf(g);
  const f = (r: number, th: number): number => anthesCruciformBending(r, th, aOverT, 0);
  const raw = f(ratio, g.flankDeg);
  const inRange = anthesCruciformInside(ratio, g.flankDeg, aOverT, 0);
  const search = inRange && !anthesCruciformRises(ratio, g.flankDeg);
  return numeric(
    'anthesCruciformBending',
    raw,
    inRange,
    search ? envelope(f, 15, ratio, 30, g.flankDeg) : null,
  );
}

const alphaOf = (joint: NotchJoint): number =>
  joint === 'butt' ? LAWRENCE_ALPHA.butt : LAWRENCE_ALPHA.fillet;

/** Every applicable formula's number for one toe (no text). Angles in degrees (flank θ), lengths in mm. */
export function notchNumbers(joint: NotchJoint, g: ToeGeometry): NotchNumbers {
  const bending =
    joint === 'butt'
      ? g.h === undefined
        ? [anthesButt(g)]
        : [anthesButt(g), kiyak(g, g.h)]
      : [anthesCruciform(g)];
  // Lawrence rises with θ (tan) and with t/ρ (square root) everywhere: no envelope needed.
  const law = lawrenceTension(alphaOf(joint), g.flankDeg, g.t, g.rho);
  return { bending, tension: numeric('lawrenceTension', law, lawrenceInside(g.flankDeg, g.t, g.rho), null) };
}

/**
 * The toe's effective factor against the nominal membrane stress, Kt,m + Kt,b·b, per bending formula, where b
 * is the signed secondary-bending ratio at the toe's surface (b = s·(km − 1)).
 */
export function effectiveNumbers(n: NotchNumbers, b: number): { values: number[]; inRange: boolean[] } {
  const values: number[] = [];
  const inRange: boolean[] = [];
  for (const bend of n.bending) {
    values.push(n.tension.value + bend.value * b);
    inRange.push(n.tension.inRange && bend.inRange);
  }
  return { values, inRange };
}

/** The value a bending formula contributes, or NaN when it does not apply; sets `inside` for its validity. */
function bendingValue(joint: NotchJoint, g: ToeGeometry, which: 0 | 1, out: { inside: boolean }): number {
  const ratio = g.t / g.rho;
  if (joint === 'fillet') {
    if (which === 1) return NaN;
    const aOverT = aOverTOf(g);
    const raw = anthesCruciformBending(ratio, g.flankDeg, aOverT, 0);
    out.inside = anthesCruciformInside(ratio, g.flankDeg, aOverT, 0);
    if (!out.inside || anthesCruciformRises(ratio, g.flankDeg)) return raw;
    return Math.max(
      raw,
      envelope((r, th) => anthesCruciformBending(r, th, aOverT, 0), 15, ratio, 30, g.flankDeg).value,
    );
  }
  if (which === 0) {
    const raw = anthesButtBending(ratio, g.flankDeg);
    out.inside = anthesButtInside(ratio, g.flankDeg);
    if (!out.inside || anthesButtRises(ratio, g.flankDeg)) return raw;
    return Math.max(raw, envelope(anthesButtBending, 1e-3, ratio, 0, g.flankDeg).value);
  }
  if (g.h === undefined) return NaN;
  const raw = kiyakButtBending(g.flankDeg, g.h, g.t, g.rho);
  out.inside = kiyakInside(g.flankDeg, g.h, g.t, g.rho);
  if (!out.inside) return raw;
  const peak = Math.max(10, kiyakPeakFlank(g.h, g.t, g.rho));
  return g.flankDeg <= peak ? raw : Math.max(raw, kiyakButtBending(peak, g.h, g.t, g.rho));
}

/** Reused by effectiveMaxOf (single-threaded, not re-entrant): saves an object per call. */
const SCRATCH_FLAG = { inside: false };

/**
 * The upper end of a toe's effective-factor range (as rangeOf over effectiveNumbers gives it), computed with no
 * objects at all: ranking every reading and the sensitivity study call it many times per seam.
 */
export function effectiveMaxOf(joint: NotchJoint, g: ToeGeometry, b: number): number {
  const kt = lawrenceTension(alphaOf(joint), g.flankDeg, g.t, g.rho);
  const ktInside = lawrenceInside(g.flankDeg, g.t, g.rho);
  const flag = SCRATCH_FLAG;
  let inside = -Infinity;
  let all = -Infinity;
  for (let which = 0; which < 2; which++) {
    const kb = bendingValue(joint, g, which === 0 ? 0 : 1, flag);
    if (Number.isNaN(kb)) continue;
    const v = kt + kb * b;
    all = Math.max(all, v);
    if (ktInside && flag.inside) inside = Math.max(inside, v);
  }
  return inside > -Infinity ? inside : all;
}

/** The upper end of the toe's effective-factor range (see rangeOf), from numbers already computed. */
export function effectiveMax(n: NotchNumbers, b: number): number {
  let inside = -Infinity;
  let all = -Infinity;
  for (const bend of n.bending) {
    const v = n.tension.value + bend.value * b;
    all = Math.max(all, v);
    if (n.tension.inRange && bend.inRange) inside = Math.max(inside, v);
  }
  return inside > -Infinity ? inside : all;
}

const fmt = (x: number): string => String(Number(x.toPrecision(5)));

function described(x: FormulaNumber, outside: readonly string[], notes: string[]): FormulaValue {
  // Differences far below any measurement's effect are used but not worth a line of text.
  if (x.peakFlank !== null && x.value > x.raw * (1 + 1e-5)) {
    notes.push(
      `the fitted formula falls again here (${fmt(x.raw)}); its largest value for a flank up to the measured one and t/ρ up to the measured one, ${fmt(x.value)} at θ = ${fmt(x.peakFlank)}° and t/ρ = ${fmt(x.peakRatio ?? NaN)}, is used`,
    );
  }
  return {
    formula: x.formula,
    load: x.formula === 'lawrenceTension' ? 'tension' : 'bending',
    source: NOTCH_SOURCES[x.formula],
    confidence: x.formula === 'lawrenceTension' ? 'recalled, unverified' : 'checked against public FE data',
    value: x.value,
    formulaValue: x.raw,
    inRange: x.inRange,
    outside,
    notes,
  };
}

const LAWRENCE_NOTES: Readonly<Record<NotchJoint, readonly string[]>> = {
  butt: [`α_L = ${LAWRENCE_ALPHA.butt} (butt weld, axial; recalled)`],
  fillet: [
    `α_L = ${LAWRENCE_ALPHA.fillet} (T or transverse fillet, axial; recalled)`,
    'α_L of the non-load-carrying T joint used',
  ],
};

/** Every applicable notch formula for one toe, with its validity messages and notes. */
export function toeNotchFactors(joint: NotchJoint, g: ToeGeometry): ToeNotch {
  const n = notchNumbers(joint, g);
  const ratio = g.t / g.rho;
  const unavailable: Unavailable[] = [];
  const bending = n.bending.map((x) => {
    if (x.formula === 'anthesButtBending') return described(x, anthesButtOutside(ratio, g.flankDeg), []);
    if (x.formula === 'kiyakButtBending') {
      const h = g.h as number;
      return described(x, kiyakOutside(g.flankDeg, h, g.t, g.rho), kiyakNotes(h, g.t));
    }
    const notes: string[] = [];
    if (g.a === undefined)
      notes.push('throat a unknown: the a/t range (0.3–1) was not checked; a has no effect with s = 0');
    if (g.convexity !== undefined && g.convexity < 0.05) {
      notes.push(
        'flat or concave face (convexity < 0.05 mm): this formula reads about 10 % high against FE there',
      );
    }
    return described(x, anthesCruciformOutside(ratio, g.flankDeg, aOverTOf(g), 0), notes);
  });
  if (joint === 'butt' && g.h === undefined) {
    unavailable.push({
      formula: 'kiyakButtBending',
      reason: 'needs the reinforcement height h on the toe’s side',
    });
  }
  const tension = [described(n.tension, lawrenceOutside(g.flankDeg, g.t, g.rho), [...LAWRENCE_NOTES[joint]])];
  return { bending, tension, unavailable };
}

export interface FactorRange {
  readonly min: number;
  readonly max: number;
  /** True when no formula was inside its validity range, so the range rests on flagged values. */
  readonly extrapolated: boolean;
}

/** Range over the formulas inside their validity; over all of them, flagged, when none is. */
export function rangeOf(values: readonly number[], inRange: readonly boolean[]): FactorRange | null {
  const inside = values.filter((_, i) => inRange[i]);
  const used = inside.length ? inside : values;
  if (!used.length) return null;
  return { min: Math.min(...used), max: Math.max(...used), extrapolated: inside.length === 0 };
}

/** Kt,m + Kt,b·b per bending formula of a described toe (the same numbers as effectiveNumbers). */
export function effectiveFactors(n: ToeNotch, b: number): { values: number[]; inRange: boolean[] } {
  const tension = n.tension[0];
  const values: number[] = [];
  const inRange: boolean[] = [];
  if (!tension) return { values, inRange };
  for (const bend of n.bending) {
    values.push(tension.value + bend.value * b);
    inRange.push(tension.inRange && bend.inRange);
  }
  return { values, inRange };
}
