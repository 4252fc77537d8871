import type { Level } from '../model/levels.js';
import type { JointFamily, ParameterName } from '../model/parameters.js';
import type { Side } from '../model/seam-file.js';
import type { Unit } from '../units.js';

/**
 * How a limit value was obtained. P: read in a reproduction of the standard's table; S: read in a secondary
 * summary; M-*: recalled, not seen in any public text (unverified); verified: loaded from an organisation's
 * checked table.
 */
export type Confidence = 'P' | 'S' | 'M-hi' | 'M-med' | 'M-lo' | 'verified';

export type LimitStatus = 'verified' | 'transcribed' | 'unverified';

export const limitStatus = (c: Confidence): LimitStatus =>
  c === 'verified' ? 'verified' : c === 'P' || c === 'S' ? 'transcribed' : 'unverified';

/**
 * A limit as data. `max`: h ≤ c + kt·t + ka·a + kb·b + ks·s, capped at `cap` (the lower value governs);
 * `shortOnly` permits short imperfections only. `minAngle`: the measured angle must be at least `deg`.
 */
export type LimitExpr =
  | {
      readonly kind: 'max';
      readonly c?: number;
      readonly t?: number;
      readonly a?: number;
      readonly b?: number;
      readonly s?: number;
      readonly cap?: number;
      readonly shortOnly?: boolean;
    }
  | { readonly kind: 'minAngle'; readonly deg: number }
  | { readonly kind: 'notPermitted' }
  | { readonly kind: 'unlimited' };

export interface LevelLimit {
  readonly limit: LimitExpr;
  readonly confidence: Confidence;
  /** Where the value was read (short key of the limits reference) or why it is recalled. */
  readonly source: string;
}

export interface Band {
  /** Inclusive upper bound of t for this band; the last band has none. */
  readonly tMax?: number;
  readonly levels: Readonly<Record<Level, LevelLimit>>;
}

/** What is compared with the limit: the value itself or a quantity derived from the reading and the seam. */
export type Quantity = 'value' | 'throatDeficit' | 'throatExcess' | 'legDifference' | 'misalignment';

/**
 * Which thickness t selects the band and enters the formula. smallerPlate: min(t1, t2).
 * toePlateElseSmaller: the plate the reading's toe lies on, otherwise min(t1, t2).
 */
export type ThicknessBasis = 'smallerPlate' | 'toePlateElseSmaller';

/** Which throat a-based formulas use: the nominal a on the seam (2014) or the measured actual aA (2023). */
export type ThroatBasis = 'nominal' | 'actual';

export interface CriterionRow {
  /** Unique id within an edition, e.g. "1.12-butt". */
  readonly id: string;
  /** Row number in the standard's Table 1. */
  readonly row: string;
  /** ISO 6520-1 reference numbers. */
  readonly refs: readonly string[];
  readonly title: string;
  readonly parameter: ParameterName;
  readonly quantity: Quantity;
  readonly unit: Unit;
  readonly applies: {
    readonly family: JointFamily | 'any';
    readonly side?: Side;
    readonly singleSidedOnly?: boolean;
    readonly circumferential?: boolean;
  };
  readonly thickness: ThicknessBasis;
  readonly throat?: ThroatBasis;
  readonly bands: readonly Band[];
  readonly note?: string;
}

export interface CriteriaSet {
  readonly edition: string;
  readonly rows: readonly CriterionRow[];
  /** Set when an organisation's verified table replaced built-in rows. */
  readonly verifiedTable?: {
    readonly name: string;
    readonly verifiedBy: string;
    readonly verifiedOn: string;
  };
}
