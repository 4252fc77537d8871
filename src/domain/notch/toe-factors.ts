import { anthesButtBending, anthesButtOutside, anthesCruciformBending, anthesCruciformOutside } from './anthes.js';
import { envelope } from './envelope.js';
import { kiyakButtBending, kiyakNotes, kiyakOutside } from './kiyak.js';
import { LAWRENCE_ALPHA, lawrenceOutside, lawrenceTension } from './lawrence.js';
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

const fmt = (x: number): string => String(Number(x.toPrecision(5)));

function enveloped(
  formula: NotchFormulaId,
  raw: number,
  outside: readonly string[],
  notes: string[],
  f: ((ratio: number, flank: number) => number) | null,
  ratioLo: number,
  ratio: number,
  flankLo: number,
  flank: number,
): FormulaValue {
  let value = raw;
  if (f && !outside.length) {
    const env = envelope(f, ratioLo, ratio, flankLo, flank);
    if (env.value > raw) {
      value = env.value;
      // Differences far below any measurement's effect are used but not worth a line of text.
      if (env.value > raw * (1 + 1e-5)) notes.push(
        `the fitted formula falls again here (${fmt(raw)}); its largest value for a flank up to the measured one and t/ρ up to the measured one, ${fmt(env.value)} at θ = ${fmt(env.flankAt)}° and t/ρ = ${fmt(env.ratioAt)}, is used`,
      );
    }
  }
  return {
    formula,
    load: formula === 'lawrenceTension' ? 'tension' : 'bending',
    source: NOTCH_SOURCES[formula],
    confidence: formula === 'lawrenceTension' ? 'recalled, unverified' : 'checked against public FE data',
    value,
    formulaValue: raw,
    inRange: outside.length === 0,
    outside,
    notes,
  };
}

function butt(g: ToeGeometry, unavailable: Unavailable[]): FormulaValue[] {
  const ratio = g.t / g.rho;
  const out: FormulaValue[] = [
    enveloped(
      'anthesButtBending',
      anthesButtBending(ratio, g.flankDeg),
      anthesButtOutside(ratio, g.flankDeg),
      [],
      anthesButtBending,
      1e-3,
      ratio,
      0,
      g.flankDeg,
    ),
  ];
  if (g.h === undefined) {
    unavailable.push({ formula: 'kiyakButtBending', reason: 'needs the reinforcement height h on the toe’s side' });
  } else {
    const h = g.h;
    const kiyak = (r: number, th: number): number => kiyakButtBending(th, h, g.t, g.t / r);
    out.push(
      enveloped(
        'kiyakButtBending',
        kiyakButtBending(g.flankDeg, h, g.t, g.rho),
        kiyakOutside(g.flankDeg, h, g.t, g.rho),
        kiyakNotes(h, g.t),
        kiyak,
        2.5,
        ratio,
        10,
        g.flankDeg,
      ),
    );
  }
  return out;
}

function fillet(g: ToeGeometry): FormulaValue[] {
  const ratio = g.t / g.rho;
  const notes: string[] = [];
  // With s = 0 the a/t term vanishes, so the throat only decides whether the case lies in the fitted range.
  const aOverT = g.a === undefined ? 0.5 : g.a / g.t;
  const outside = anthesCruciformOutside(ratio, g.flankDeg, aOverT, 0);
  if (g.a === undefined) notes.push('throat a unknown: the a/t range (0.3–1) was not checked; a has no effect with s = 0');
  if (g.convexity !== undefined && g.convexity < 0.05) {
    notes.push('flat or concave face (convexity < 0.05 mm): this formula reads about 10 % high against FE there');
  }
  const f = (r: number, th: number): number => anthesCruciformBending(r, th, aOverT, 0);
  return [enveloped('anthesCruciformBending', f(ratio, g.flankDeg), outside, notes, f, 15, ratio, 30, g.flankDeg)];
}

/** Every applicable notch formula for one toe. Angles in degrees (flank θ), lengths in mm. */
export function toeNotchFactors(joint: NotchJoint, g: ToeGeometry): ToeNotch {
  const unavailable: Unavailable[] = [];
  const bending = joint === 'butt' ? butt(g, unavailable) : fillet(g);
  const alphaL = joint === 'butt' ? LAWRENCE_ALPHA.butt : LAWRENCE_ALPHA.fillet;
  const lawNotes = [`α_L = ${alphaL} (${joint === 'butt' ? 'butt weld' : 'T or transverse fillet'}, axial; recalled)`];
  if (joint === 'fillet') lawNotes.push('α_L of the non-load-carrying T joint used');
  const tension = [
    enveloped(
      'lawrenceTension',
      lawrenceTension(alphaL, g.flankDeg, g.t, g.rho),
      lawrenceOutside(g.flankDeg, g.t, g.rho),
      lawNotes,
      // Rises with θ (tan) and with t/ρ (square root) everywhere: no envelope needed.
      null,
      1e-3,
      g.t / g.rho,
      0,
      g.flankDeg,
    ),
  ];
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

/**
 * The toe's effective factor against the nominal membrane stress, Kt,m + Kt,b·b, where b is the signed
 * secondary-bending ratio at the toe's surface (b = s·(km − 1)); one value per bending formula.
 */
export function effectiveFactors(n: ToeNotch, b: number): { values: number[]; inRange: boolean[] } {
  const tension = n.tension[0];
  const values: number[] = [];
  const inRange: boolean[] = [];
  if (!tension) return { values, inRange };
  for (const bend of n.bending) {
    values.push(tension.value + bend.value * b);
    inRange.push(tension.inRange && bend.inRange);
  }
  if (!n.bending.length && b === 0) {
    values.push(tension.value);
    inRange.push(tension.inRange);
  }
  return { values, inRange };
}
