import { outsideOf, type Bound } from './range.js';

const RAD = Math.PI / 180;

// Anthes, Köttgen & Seeger, Schweißen und Schneiden 45 (1993) 685–688: butt joint, bending; φ in degrees, l3 in degrees.
export function anthesButtBending(tOverRho: number, flankDeg: number): number {
  const s = Math.sin(flankDeg * RAD);
  const poly = 0.181 + 1.207 * s - 1.737 * s * s + 0.689 * s * s * s;
  const exponent = 0.2919 + 0.3491 * Math.sin((flankDeg + 3.283) * RAD);
  return (1 - 0.156 * tOverRho ** 0.207) * (1 + poly * tOverRho ** exponent);
}

/** Validity of the butt formula as coded with its published coefficients: 0 < t/ρ ≤ 200, 0° ≤ φ ≤ 90°. */
export const ANTHES_BUTT_RANGE = { tOverRho: [0, 200], flankDeg: [0, 90] } as const;

const buttBounds = (tOverRho: number, flankDeg: number): Bound[] => [
  { name: 't/ρ', value: tOverRho, min: 0, max: 200, minExclusive: true },
  { name: 'flank angle φ (°)', value: flankDeg, min: 0, max: 90 },
];

// Inlined comparisons of buttBounds (no allocation on the hot path); a test holds them equal to the messages.
export const anthesButtInside = (tOverRho: number, flankDeg: number): boolean =>
  tOverRho > 0 && tOverRho <= 200 && flankDeg >= 0 && flankDeg <= 90;

export const anthesButtOutside = (tOverRho: number, flankDeg: number): string[] =>
  outsideOf(buttBounds(tOverRho, flankDeg));

// Anthes, Köttgen & Seeger, Schweißen und Schneiden 45 (1993) 685–688: cruciform ("Doppel-T-Stoß"), bending; sin of φ.
export function anthesCruciformBending(
  tOverRho: number,
  flankDeg: number,
  aOverT: number,
  sOverT: number,
): number {
  const s = Math.sin(flankDeg * RAD);
  const bracket =
    1 + 0.023 * aOverT ** -3.09 * sOverT ** 2.412 + 2.153 * tOverRho ** 0.154 - 3.738 * s ** 0.481;
  return 1.256 + bracket * s ** 1.723 * tOverRho ** 0.172;
}

/** Validity of the cruciform formula: 30° ≤ φ ≤ 60°, 15 ≤ t/ρ ≤ 100, 0.3 ≤ a/t ≤ 1, s/t = 0 or 2ρ/t ≤ s/t ≤ 1. */
export const ANTHES_CRUCIFORM_RANGE = { tOverRho: [15, 100], flankDeg: [30, 60], aOverT: [0.3, 1] } as const;

const cruciformBounds = (tOverRho: number, flankDeg: number, aOverT: number): Bound[] => [
  { name: 't/ρ', value: tOverRho, min: 15, max: 100 },
  { name: 'flank angle φ (°)', value: flankDeg, min: 30, max: 60 },
  { name: 'a/t', value: aOverT, min: 0.3, max: 1 },
];

const rootGapBounds = (tOverRho: number, sOverT: number): Bound[] =>
  sOverT === 0 ? [] : [{ name: 's/t', value: sOverT, min: 2 / tOverRho, max: 1 }];

// Inlined comparisons of cruciformBounds and rootGapBounds (no allocation); a test holds them equal to the messages.
export const anthesCruciformInside = (
  tOverRho: number,
  flankDeg: number,
  aOverT: number,
  sOverT: number,
): boolean =>
  tOverRho >= 15 &&
  tOverRho <= 100 &&
  flankDeg >= 30 &&
  flankDeg <= 60 &&
  aOverT >= 0.3 &&
  aOverT <= 1 &&
  (sOverT === 0 || (sOverT >= 2 / tOverRho && sOverT <= 1));

export function anthesCruciformOutside(
  tOverRho: number,
  flankDeg: number,
  aOverT: number,
  sOverT: number,
): string[] {
  return [
    ...outsideOf(cruciformBounds(tOverRho, flankDeg, aOverT)),
    ...outsideOf(rootGapBounds(tOverRho, sOverT)).map((m) => `${m} (or s/t = 0)`),
  ];
}

/**
 * Signs of ∂Kt/∂φ and ∂Kt/∂(t/ρ) of the butt formula (derived by differentiating it): where both are ≥ 0 the
 * measured point is the largest value for smaller angles and larger radii, and no search is needed.
 */
export function anthesButtRises(tOverRho: number, flankDeg: number): boolean {
  const s = Math.sin(flankDeg * RAD);
  const poly = 0.181 + 1.207 * s - 1.737 * s * s + 0.689 * s * s * s;
  const dPoly = 1.207 - 3.474 * s + 2.067 * s * s;
  const exponent = 0.2919 + 0.3491 * Math.sin((flankDeg + 3.283) * RAD);
  const lnX = Math.log(tOverRho);
  const dTheta = dPoly * Math.cos(flankDeg * RAD) + poly * lnX * 0.3491 * Math.cos((flankDeg + 3.283) * RAD);
  const x207 = tOverRho ** 0.207;
  const xE = tOverRho ** exponent;
  const a = 1 - 0.156 * x207;
  const dX = -0.156 * 0.207 * x207 * (1 + poly * xE) + a * poly * exponent * xE;
  return dTheta >= 0 && dX >= 0;
}

/** The same for the cruciform formula with s = 0 (derived): both signs reduce to simple sums. */
export function anthesCruciformRises(tOverRho: number, flankDeg: number): boolean {
  const s = Math.sin(flankDeg * RAD);
  const c = 1 + 2.153 * tOverRho ** 0.154 - 3.738 * s ** 0.481;
  const dTheta = -3.738 * 0.481 * s ** 0.481 + 1.723 * c;
  const dX = 2.153 * 0.154 * tOverRho ** 0.154 + 0.172 * c;
  return dTheta >= 0 && dX >= 0;
}
