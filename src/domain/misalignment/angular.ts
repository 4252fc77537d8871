/** Angular misalignment: a kink α between the plate mid-planes, with the straightening of the kink in tension. */

/** tanh(x)/x, with its series near 0 where the quotient loses precision. */
export function tanhOverX(x: number): number {
  const a = Math.abs(x);
  return a < 1e-4 ? 1 - (a * a) / 3 : Math.tanh(a) / a;
}

/** tan(x)/x for 0 ≤ x < π/2; Infinity at and past π/2, where the arm buckles. */
export function tanOverX(x: number): number {
  const a = Math.abs(x);
  if (a >= Math.PI / 2) return Infinity;
  return a < 1e-4 ? 1 + (a * a) / 3 : Math.tan(a) / a;
}

// BS 7910 Annex D and IIW Recommendations 2016, App. 6.3: β = (2l/t)·√(3σm/E), |σm| taken.
export function straighteningBeta(l: number, t: number, sigmaM: number, E: number): number {
  return ((2 * l) / t) * Math.sqrt((3 * Math.abs(sigmaM)) / E);
}

export type Ends = 'clamped' | 'pinned';

// BS 7910 Annex D / IIW App. 6.3: tanh(β/2)/(β/2) clamped, tanh(β)/β pinned; compression tan forms (derived, beam-column).
export function straighteningFactor(beta: number, ends: Ends, compression: boolean): number {
  const x = ends === 'clamped' ? beta / 2 : beta;
  return compression ? tanOverX(x) : tanhOverX(x);
}

// BS 7910 Annex D / IIW App. 6.3: km = 1 + λ·α·l1·l2/(t·(l1 + l2))·factor, λ = 3 clamped, 6 pinned (y = α·l/2 for equal arms).
export function kmAngular(
  alphaRad: number,
  t: number,
  l1: number,
  l2: number,
  ends: Ends,
  factor = 1,
): number {
  const lambda = ends === 'clamped' ? 3 : 6;
  return 1 + ((lambda * Math.abs(alphaRad) * l1 * l2) / (t * (l1 + l2))) * factor;
}

// Derived from the tanh forms: as l → ∞ both end conditions tend to km = 1 + 1.5·α/√(3σm/E), an upper bound over l.
export function kmAngularLongArms(alphaRad: number, sigmaM: number, E: number): number {
  return 1 + (1.5 * Math.abs(alphaRad)) / Math.sqrt((3 * sigmaM) / E);
}
