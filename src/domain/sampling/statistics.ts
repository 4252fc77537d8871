import { normalQuantile, studentTCdf, studentTQuantile } from './special.js';

export interface MeanSd {
  readonly n: number;
  readonly mean: number;
  /** Sample standard deviation (n − 1 in the denominator); NaN when n < 2. */
  readonly sd: number;
}

// Welford's running algorithm (Technometrics 4, 1962): mean and sample standard deviation in one pass; nulls skipped.
export function meanAndSd(xs: readonly (number | null)[]): MeanSd {
  let mean = 0;
  let m2 = 0;
  let n = 0;
  for (let i = 0; i < xs.length; i++) {
    const x = xs[i];
    if (x === null || x === undefined || !Number.isFinite(x)) continue;
    n++;
    const d = x - mean;
    mean += d / n;
    m2 += d * (x - mean);
  }
  return { n, mean: n ? mean : NaN, sd: n > 1 ? Math.sqrt(Math.max(0, m2 / (n - 1))) : NaN };
}

// Student (1908): half-width of the two-sided confidence interval of a mean, t_{(1+c)/2, n−1}·s/√n.
export function confidenceHalfWidth(sd: number, n: number, confidence = 0.95): number {
  if (n < 2) return Infinity;
  return (studentTQuantile((1 + confidence) / 2, n - 1) * sd) / Math.sqrt(n);
}

export const MAX_POSITIONS = 100_000;

/**
 * The fewest positions whose 95 % interval of the mean is within ±target for the same scatter: the smallest n
 * with t_{n−1}·s/√n ≤ target (the half-width falls as n grows). null when more than MAX_POSITIONS would be needed.
 */
export function positionsForHalfWidth(sd: number, target: number, confidence = 0.95): number | null {
  if (!(target > 0) || !Number.isFinite(sd)) return null;
  if (sd === 0) return 2;
  const ok = (n: number): boolean => confidenceHalfWidth(sd, n, confidence) <= target;
  // The half-width falls as n grows, so the smallest n meeting the target is bracketed and bisected. Below it:
  // (z·s/target)², since t > z. Above it: n1 = (t_{lo−1}·s/target)², since t_{n1−1} ≤ t_{lo−1} once n1 ≥ lo.
  const q = (1 + confidence) / 2;
  const z = normalQuantile(q);
  let lo = Math.max(2, Math.floor(((z * sd) / target) ** 2) - 1);
  if (lo >= MAX_POSITIONS) return null;
  if (ok(lo)) {
    while (lo > 2 && ok(lo - 1)) lo--;
    return lo;
  }
  let hi = Math.max(lo + 1, Math.ceil(((studentTQuantile(q, lo - 1) * sd) / target) ** 2));
  if (hi > 2 * MAX_POSITIONS) return null;
  while (!ok(hi)) hi++;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (ok(mid)) hi = mid;
    else lo = mid;
  }
  return hi <= MAX_POSITIONS ? hi : null;
}

/** The mean after each position is added, in the order given. */
export function runningMeans(xs: readonly number[]): number[] {
  const out: number[] = [];
  let sum = 0;
  xs.forEach((x, i) => {
    sum += x;
    out.push(sum / (i + 1));
  });
  return out;
}

/**
 * The number of positions after which the running mean stayed within ±band of the final mean for good; the
 * mean has settled when that happened at least max(3, ⌈n/4⌉) positions before the end.
 */
export function settling(
  means: readonly number[],
  band: number,
): { readonly after: number; readonly settled: boolean } {
  const n = means.length;
  const final = means[n - 1] ?? NaN;
  let after = n;
  for (let i = n - 1; i >= 0; i--) {
    if (Math.abs((means[i] as number) - final) <= band) after = i + 1;
    else break;
  }
  return { after, settled: n >= 4 && n - after >= Math.max(3, Math.ceil(n / 4)) };
}

// Predictive distribution of one new value from a normal sample (Student t, ν = n − 1, scale s·√(1 + 1/n)): P(X_new < x).
export function predictiveBelow(x: number, mean: number, sd: number, n: number): number {
  if (n < 2 || !Number.isFinite(sd)) return NaN;
  if (sd === 0) return x > mean ? 1 : 0;
  return studentTCdf((x - mean) / (sd * Math.sqrt(1 + 1 / n)), n - 1);
}

// Independent positions (stated assumption): P(at least one of m fails) = 1 − (1 − p)^m.
export function atLeastOne(p: number, m: number): number {
  if (m <= 0) return 0;
  return -Math.expm1(m * Math.log1p(-Math.min(p, 1)));
}

/** The regular spacing of the positions: the median gap between distinct sorted positions. */
export function pitchOf(positions: readonly number[]): number | null {
  let sorted = true;
  for (let i = 1; i < positions.length && sorted; i++)
    sorted = (positions[i] as number) >= (positions[i - 1] as number);
  const s = sorted ? positions : Float64Array.from(positions).sort();
  // Readings are usually taken at one pitch: when every distinct gap is the same, it is the median, and the
  // gap array and its sort are skipped.
  let first = 0;
  let even = true;
  for (let i = 1; i < s.length && even; i++) {
    const gap = (s[i] as number) - (s[i - 1] as number);
    if (gap > 0) {
      if (first === 0) first = gap;
      else even = gap === first;
    }
  }
  if (even) return first > 0 ? first : null;
  const gaps = new Float64Array(Math.max(0, s.length - 1));
  let n = 0;
  for (let i = 1; i < s.length; i++) {
    const gap = (s[i] as number) - (s[i - 1] as number);
    if (gap > 0) gaps[n++] = gap;
  }
  if (!n) return null;
  const g = gaps.subarray(0, n).sort();
  const mid = n >> 1;
  return n % 2 ? (g[mid] as number) : ((g[mid - 1] as number) + (g[mid] as number)) / 2;
}
