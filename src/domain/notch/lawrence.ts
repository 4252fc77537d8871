import { outsideOf, type Bound } from './range.js';

const RAD = Math.PI / 180;

/** α_L by joint (axial load), recalled: butt 0.27, T or transverse fillet 0.35. Not verified against the paper. */
export const LAWRENCE_ALPHA = { butt: 0.27, fillet: 0.35 } as const;

// Yung & Lawrence, Fatigue Fract. Eng. Mater. Struct. 8 (1985) 223–241: Kt = 1 + α_L·(tan θ)^¼·(t/ρ)^½, tension (recalled).
export function lawrenceTension(alphaL: number, flankDeg: number, t: number, rho: number): number {
  return 1 + alphaL * Math.tan(flankDeg * RAD) ** 0.25 * Math.sqrt(t / rho);
}

/** The formula states no validity range; θ must lie in 0° ≤ θ < 90° for tan θ to mean a flank. */
const bounds = (flankDeg: number, t: number, rho: number): Bound[] => [
  { name: 'flank angle θ (°)', value: flankDeg, min: 0, max: 89.999 },
  { name: 't/ρ', value: t / rho, min: 0, max: Number.MAX_VALUE, minExclusive: true },
];

// Inlined comparisons of bounds (no allocation on the hot path); a test holds them equal to the messages.
export const lawrenceInside = (flankDeg: number, t: number, rho: number): boolean =>
  flankDeg >= 0 && flankDeg <= 89.999 && t / rho > 0 && Number.isFinite(t / rho);

export const lawrenceOutside = (flankDeg: number, t: number, rho: number): string[] =>
  outsideOf(bounds(flankDeg, t, rho));
