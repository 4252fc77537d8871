/** Special functions for the sampling statistics: log-gamma, incomplete beta and gamma, Student t. */

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059,
  12.507343278686905, -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

// Lanczos approximation, g = 7, n = 9 (Numerical Recipes 3rd ed. §6.1 family): ln Γ(x) for x > 0.
export function logGamma(x: number): number {
  if (x < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * x)) - logGamma(1 - x);
  const z = x - 1;
  let a = LANCZOS[0] as number;
  const t = z + 7.5;
  for (let i = 1; i < 9; i++) a += (LANCZOS[i] as number) / (z + i);
  return 0.5 * Math.log(2 * Math.PI) + (z + 0.5) * Math.log(t) - t + Math.log(a);
}

const EPS = 1e-15;
const TINY = 1e-300;

/** Continued fraction of the incomplete beta function, by the modified Lentz method. */
function betaFraction(a: number, b: number, x: number): number {
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < TINY) d = TINY;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 10_000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < TINY) d = TINY;
    c = 1 + aa / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < EPS) break;
  }
  return h;
}

// Regularised incomplete beta I_x(a, b) by its continued fraction (Abramowitz & Stegun 26.5.8).
export function incompleteBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(logGamma(a + b) - logGamma(a) - logGamma(b) + a * Math.log(x) + b * Math.log(1 - x));
  return x < (a + 1) / (a + b + 2)
    ? (front * betaFraction(a, b, x)) / a
    : 1 - (front * betaFraction(b, a, 1 - x)) / b;
}

// Student t distribution function, P(T ≤ t) = 1 − ½·I_{ν/(ν+t²)}(ν/2, ½) for t ≥ 0 (Abramowitz & Stegun 26.7.1).
export function studentTCdf(t: number, nu: number): number {
  if (!Number.isFinite(t)) return t > 0 ? 1 : 0;
  const tail = 0.5 * incompleteBeta(nu / (nu + t * t), nu / 2, 0.5);
  return t >= 0 ? 1 - tail : tail;
}

/** Regularised lower incomplete gamma P(a, x): series for x < a + 1, else 1 − the continued fraction of Q. */
function gammaP(a: number, x: number): number {
  if (x <= 0) return 0;
  const lnFront = -x + a * Math.log(x) - logGamma(a);
  if (x < a + 1) {
    let sum = 1 / a;
    let term = sum;
    for (let n = 1; n < 1000; n++) {
      term *= x / (a + n);
      sum += term;
      if (Math.abs(term) < Math.abs(sum) * EPS) break;
    }
    return sum * Math.exp(lnFront);
  }
  let b = x + 1 - a;
  let c = 1 / TINY;
  let d = 1 / b;
  let h = d;
  for (let i = 1; i < 1000; i++) {
    const an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (Math.abs(d) < TINY) d = TINY;
    c = b + an / c;
    if (Math.abs(c) < TINY) c = TINY;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < EPS) break;
  }
  return 1 - Math.exp(lnFront) * h;
}

// Standard normal distribution function via the incomplete gamma function, Φ(x) = ½·(1 + sign(x)·P(½, x²/2)) (A&S 26.2.30).
export function normalCdf(x: number): number {
  const p = gammaP(0.5, (x * x) / 2);
  return x >= 0 ? 0.5 * (1 + p) : 0.5 * (1 - p);
}

const normalQuantiles = new Map<number, number>();

/** The standard normal p-quantile by Newton steps on normalCdf (0 < p < 1); memoised. */
export function normalQuantile(p: number): number {
  const known = normalQuantiles.get(p);
  if (known !== undefined) return known;
  let x = 0;
  for (let i = 0; i < 100; i++) {
    const step = (normalCdf(x) - p) / (Math.exp((-x * x) / 2) / Math.sqrt(2 * Math.PI));
    x -= Math.max(-2, Math.min(2, step));
    if (Math.abs(step) < 1e-14 * Math.max(1, Math.abs(x))) break;
  }
  if (normalQuantiles.size < 1000) normalQuantiles.set(p, x);
  return x;
}

// Cornish–Fisher expansion of the t quantile in powers of 1/ν (Abramowitz & Stegun 26.7.5), for large ν.
export function studentTQuantileLargeNu(p: number, nu: number): number {
  const z = normalQuantile(p);
  const z2 = z * z;
  const g1 = (z * (z2 + 1)) / 4;
  const g2 = (z * ((5 * z2 + 16) * z2 + 3)) / 96;
  const g3 = (z * (((3 * z2 + 19) * z2 + 17) * z2 - 15)) / 384;
  const g4 = (z * ((((79 * z2 + 776) * z2 + 1482) * z2 - 1920) * z2 - 945)) / 92160;
  return z + g1 / nu + g2 / nu ** 2 + g3 / nu ** 3 + g4 / nu ** 4;
}

/** Student t density (Abramowitz & Stegun 26.7.1). */
export function studentTPdf(t: number, nu: number): number {
  const logC = logGamma((nu + 1) / 2) - logGamma(nu / 2) - 0.5 * Math.log(nu * Math.PI);
  return Math.exp(logC - ((nu + 1) / 2) * Math.log1p((t * t) / nu));
}

/** Memo of t quantiles: p → (ν → quantile). */
const quantiles = new Map<number, Map<number, number>>();
const MEMO_LIMIT = 20_000;
let memoSize = 0;

function remember(p: number, nu: number, value: number): number {
  let byNu = quantiles.get(p);
  if (!byNu) {
    byNu = new Map();
    quantiles.set(p, byNu);
  }
  if (memoSize < MEMO_LIMIT) {
    byNu.set(nu, value);
    memoSize++;
  }
  return value;
}

/** From here on the Cornish–Fisher expansion agrees with the inversion to better than 1e-9. */
export const LARGE_NU = 100;

/**
 * The p-quantile of Student's t with ν degrees of freedom: Newton steps on the distribution function kept inside
 * a bisection bracket below ν = 100, the Cornish–Fisher expansion from there on; memoised.
 */
export function studentTQuantile(p: number, nu: number): number {
  const known = quantiles.get(p)?.get(nu);
  if (known !== undefined) return known;
  if (p === 0.5) return 0;
  if (nu >= LARGE_NU) return remember(p, nu, studentTQuantileLargeNu(p, nu));
  const upper = p > 0.5;
  const q = upper ? p : 1 - p;
  let lo = 0;
  let hi = 1;
  while (studentTCdf(hi, nu) < q) {
    lo = hi;
    hi *= 2;
  }
  let x = (lo + hi) / 2;
  for (let i = 0; i < 200; i++) {
    const f = studentTCdf(x, nu) - q;
    if (f < 0) lo = x;
    else hi = x;
    const step = f / studentTPdf(x, nu);
    let next = x - step;
    if (!(next > lo && next < hi)) next = (lo + hi) / 2;
    if (Math.abs(next - x) <= 1e-14 * Math.max(1, Math.abs(x)) || hi - lo <= 1e-14 * hi) {
      x = next;
      break;
    }
    x = next;
  }
  return remember(p, nu, upper ? x : -x);
}
