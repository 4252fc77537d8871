import { outsideOf, type Bound } from './range.js';

const RAD = Math.PI / 180;

// Kiyak, Madia & Zerbst, Welding in the World 60 (2016) 1247–1259: butt weld, bending; α in radians (base and exponent).
export function kiyakButtBending(flankDeg: number, h: number, T: number, rho: number): number {
  const a = flankDeg * RAD;
  return (
    1 +
    1.1399 *
      (h / T) ** (0.2062 * a) *
      a ** 1.067 *
      Math.exp(-1.6775 * a) *
      (rho / T) ** (-0.295 * a) *
      (0.021 + rho / T) ** -0.4711
  );
}

/** Validity as coded with the published coefficients: 10° ≤ α ≤ 60°, 0.01 ≤ ρ/T ≤ 0.4. */
export const KIYAK_RANGE = {
  flankDeg: [10, 60],
  rhoOverT: [0.01, 0.4],
  checkedHOverT: [0.016, 0.37],
} as const;

const bounds = (flankDeg: number, h: number, T: number, rho: number): Bound[] => [
  { name: 'flank angle α (°)', value: flankDeg, min: 10, max: 60 },
  { name: 'ρ/T', value: rho / T, min: 0.01, max: 0.4 },
  { name: 'h/T', value: h / T, min: 0, max: Number.MAX_VALUE, minExclusive: true },
];

// Inlined comparisons of bounds (no allocation on the hot path); a test holds them equal to the messages.
export const kiyakInside = (flankDeg: number, h: number, T: number, rho: number): boolean =>
  flankDeg >= 10 &&
  flankDeg <= 60 &&
  rho / T >= 0.01 &&
  rho / T <= 0.4 &&
  h / T > 0 &&
  Number.isFinite(h / T);

export const kiyakOutside = (flankDeg: number, h: number, T: number, rho: number): string[] =>
  outsideOf(bounds(flankDeg, h, T, rho));

// Derived from the Kiyak form: d ln(Kt − 1)/dα = 0 at α* = 1.067/(1.6775 − 0.2062·ln(h/T) + 0.295·ln(ρ/T)), in degrees.
export function kiyakPeakFlank(h: number, T: number, rho: number): number {
  const d = 1.6775 - 0.2062 * Math.log(h / T) + 0.295 * Math.log(rho / T);
  return d > 0 ? 1.067 / d / RAD : Infinity;
}

/** The h/T range the formula was checked over is narrower than the inputs it accepts: say so, but do not refuse. */
export function kiyakNotes(h: number, T: number): string[] {
  const r = h / T;
  const [lo, hi] = KIYAK_RANGE.checkedHOverT;
  return r < lo || r > hi
    ? [
        `h/T = ${Number(r.toPrecision(3))} lies outside the ${lo}–${hi} the formula was checked over (no stated range)`,
      ]
    : [];
}
