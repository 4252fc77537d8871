/** The formulas the toe-factor estimate draws on; each has its own source, load case and validity range. */
export type NotchFormulaId =
  'anthesButtBending' | 'kiyakButtBending' | 'anthesCruciformBending' | 'lawrenceTension';

export type NotchLoad = 'bending' | 'tension';

/** One formula's value for one toe, with the reasons it may not be trusted there. */
export interface FormulaValue {
  readonly formula: NotchFormulaId;
  readonly load: NotchLoad;
  readonly source: string;
  /** How the coefficients were obtained: confirmed against public data, or recalled and unverified. */
  readonly confidence: 'checked against public FE data' | 'recalled, unverified';
  /** The value used: the formula's own value, or its monotone envelope where the fit turns over (see notes). */
  readonly value: number;
  /** The formula as published, at exactly these inputs. */
  readonly formulaValue: number;
  readonly inRange: boolean;
  /** One message per input outside the formula's validity range. */
  readonly outside: readonly string[];
  readonly notes: readonly string[];
}

/** Inputs of one toe's notch estimate, in the units the seam file uses (mm, degrees). */
export interface ToeGeometry {
  /** Thickness of the plate the toe lies on. */
  readonly t: number;
  /** Flank angle θ = 180° − ISO toe angle. */
  readonly flankDeg: number;
  readonly rho: number;
  /** Reinforcement height on the toe's side (butt joints); Kiyak needs it. */
  readonly h?: number | undefined;
  /** Fillet throat a (cruciform and T joints). */
  readonly a?: number | undefined;
  /** Excess convexity of the fillet face; flat or concave faces are flagged for the cruciform formula. */
  readonly convexity?: number | undefined;
}
