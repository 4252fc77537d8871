import type { DetailId } from '../fatigue/detail-ids.js';
import type { CoveredRow } from '../misalignment/covered.js';
import type { FactorRange, Unavailable } from '../notch/toe-factors.js';
import type { FormulaValue, NotchFormulaId } from '../notch/types.js';
import type { Adequacy } from '../sampling/adequacy.js';

/** A toe of the joint as readings name it. */
export interface ToeRef {
  readonly plate: 1 | 2;
  readonly side: 'face' | 'root';
}

/** A measured value that decided a result, and where it was read. */
export interface Governing {
  readonly readingId: string;
  readonly position: number;
  readonly value: number;
  readonly unit: 'mm' | 'deg';
}

export interface LinearKm {
  /** The most positive and most negative mid-plane offsets e measured (signed, mm); equal with one reading. */
  readonly highest: Governing;
  readonly lowest: Governing;
  readonly formula: string;
  readonly source: string;
  /** km from the largest |e| on each plate (plate 1, plate 2), before combination. */
  readonly kmByPlate: readonly [number, number];
}

export interface AngularKm {
  readonly highest: Governing;
  readonly lowest: Governing;
  readonly formula: string;
  readonly source: string;
  readonly kmByPlate: readonly [number, number];
  /** The straightening factor applied (1: none; below 1: relief in tension; above 1: amplification in compression). */
  readonly straighteningFactor: number | null;
}

export interface SurfaceBending {
  readonly plate: 1 | 2;
  readonly surface: 'face' | 'root';
  /** Signed secondary-bending ratio b = σ_b/σ_m on this surface at the weld; km there is 1 + b. */
  readonly bendingRatio: number;
  readonly km: number;
  readonly state: 'tension' | 'compression' | 'none';
}

export interface MisalignmentAssessment {
  readonly caution: string;
  readonly state: 'assessed' | 'partial' | 'notMeasured' | 'notApplicable' | 'notAssessable';
  readonly missing: readonly string[];
  readonly assumptions: readonly string[];
  readonly linear: LinearKm | { readonly notAssessed: string } | null;
  readonly angular: AngularKm | { readonly notAssessed: string } | null;
  readonly surfaces: readonly SurfaceBending[];
  /** The largest km on any surface of the loaded plates, linear and angular combined at the same surface. */
  readonly kmCalc: number | null;
  readonly governingSurface: { readonly plate: 1 | 2; readonly surface: 'face' | 'root' } | null;
  readonly kmCovered: {
    readonly value: number;
    readonly row: CoveredRow;
    readonly label: string;
    readonly source: string;
  } | null;
  /** km,calc / km,covered, never below 1. */
  readonly kmEff: number | null;
  /** The conventional DNV form as a second estimate (linear misalignment only). */
  readonly dnv: {
    readonly scf: number;
    readonly formula: string;
    readonly source: string;
    readonly note: string;
  } | null;
}

export interface EffectiveValue {
  readonly formula: NotchFormulaId;
  readonly value: number;
  readonly inRange: boolean;
}

export interface ToeAssessment {
  readonly toe: ToeRef;
  readonly label: string;
  readonly thicknessMm: number;
  readonly readings: number;
  readonly governing: {
    readonly readingId: string;
    readonly position: number;
    readonly toeAngle: number;
    readonly flankDeg: number;
    readonly toeRadius: number;
    readonly radiusBasis: string;
    readonly reinforcementHeight: number | null;
    readonly throat: number | null;
  };
  readonly bendingRatio: number;
  readonly secondaryBending: 'tension' | 'compression' | 'none';
  readonly bending: readonly FormulaValue[];
  readonly tension: readonly FormulaValue[];
  readonly unavailable: readonly Unavailable[];
  /** Kt,m + Kt,b·b per bending formula, and their range. */
  readonly effective: readonly EffectiveValue[];
  readonly range: FactorRange | null;
  readonly rank: number;
}

export interface ToeRanking {
  readonly caution: string;
  readonly assumptions: readonly string[];
  readonly toes: readonly ToeAssessment[];
  readonly notRanked: readonly { readonly toe: ToeRef | null; readonly reason: string }[];
  readonly crackSite: {
    readonly toe: ToeRef;
    readonly label: string;
    readonly position: number;
    readonly readingId: string;
    readonly factor: number;
    readonly why: string;
  } | null;
  readonly note: string | null;
}

export interface DetailUse {
  readonly id: DetailId;
  readonly title: string;
  readonly fat: number;
  readonly fatSource: string;
  readonly crackAt: string;
  readonly thicknessFactor: number;
  readonly thicknessExponent: number;
  readonly fatEquivalent: number | null;
}

export interface LifeEstimate {
  readonly stressRange: number;
  readonly fatEquivalent: number;
  readonly cycles: number;
  readonly requiredCycles: number | null;
  /** requiredCycles / cycles (a Miner sum for constant amplitude). */
  readonly usage: number | null;
  readonly meets: boolean | null;
  readonly curve: string;
}

export type FatFlag = 'meets' | 'below' | 'notAssessable';

export interface FatigueAssessment {
  readonly caution: string;
  readonly assumptions: readonly string[];
  readonly loaded: boolean | null;
  readonly material: 'steel' | 'aluminium';
  readonly earned: { readonly details: readonly DetailId[]; readonly why: readonly string[] };
  readonly designDetail: {
    readonly text: string;
    readonly id: DetailId | null;
    readonly note: string | null;
  } | null;
  readonly override: { readonly detail: DetailId | null; readonly fat: number | null } | null;
  readonly details: readonly DetailUse[];
  readonly governing: DetailUse | null;
  readonly requiredFat: { readonly value: number; readonly basis: string } | null;
  readonly fatEquivalent: number | null;
  readonly flag: FatFlag;
  readonly missing: readonly string[];
  readonly dnvFatEquivalent: number | null;
  readonly life: LifeEstimate | { readonly notAssessed: string };
  readonly edition: string;
}

export interface NotchToe {
  readonly toe: ToeRef;
  readonly label: string;
  readonly referenceRadiusMm: number;
  readonly values: readonly EffectiveValue[];
  readonly range: FactorRange | null;
  readonly outside: readonly string[];
  readonly fatEquivalent: number | null;
}

export interface EffectiveNotchCheck {
  readonly caution: string;
  readonly assumptions: readonly string[];
  readonly basis: string;
  readonly fat: number | null;
  readonly toes: readonly NotchToe[];
  readonly governing: NotchToe | null;
  readonly fatEquivalent: number | null;
  readonly flag: FatFlag;
  readonly missing: readonly string[];
  readonly life: LifeEstimate | { readonly notAssessed: string };
}

export interface SensitivityRow {
  readonly input: string;
  readonly where: string;
  readonly readingId: string;
  readonly value: number;
  readonly unit: 'mm' | 'deg';
  readonly uncertainty: number;
  readonly uncertaintyBasis: string;
  /** Relative change of life (−0.2 = 20 % shorter) with the input lowered and raised by its uncertainty. */
  readonly life: { readonly minus: number; readonly plus: number } | null;
  readonly toeFactors: readonly { readonly label: string; readonly minus: number; readonly plus: number }[];
  /** The bar length the chart ranks by: the largest relative life change, or largest toe-factor change. */
  readonly magnitude: number;
  /** The largest change of any toe's factor (ranks inputs that leave life alone). */
  readonly toeMagnitude: number;
}

export interface Sensitivity {
  readonly caution: string;
  readonly assumptions: readonly string[];
  readonly rankedBy: 'life' | 'toe factor';
  readonly rows: readonly SensitivityRow[];
}

export interface SamplingAssessment {
  readonly caveat: string;
  readonly round: number | null;
  readonly parameters: readonly Adequacy[];
}

export interface SeamAssessment {
  readonly format: 'beadbook.assessment/1';
  readonly seamId: string;
  readonly round: number | null;
  readonly caution: string;
  readonly assumptions: readonly string[];
  readonly misalignment: MisalignmentAssessment;
  readonly toes: ToeRanking;
  readonly fatigue: FatigueAssessment;
  readonly effectiveNotch: EffectiveNotchCheck;
  readonly sensitivity: Sensitivity;
  readonly sampling: SamplingAssessment;
}
