// Least-squares fits over typed arrays, without allocation: straight lines (plain and trimmed) and circles.

export interface Line {
  /** z = a + b·x */
  readonly a: number;
  readonly b: number;
}

/** Ordinary least-squares line z = a + b·x over points [from, to). Returns null for fewer than 2 distinct x. */
export function fitLine(x: ArrayLike<number>, z: ArrayLike<number>, from: number, to: number): Line | null {
  let sx = 0,
    sz = 0,
    sxx = 0,
    sxz = 0;
  const n = to - from;
  const x0 = x[from] ?? 0;
  for (let i = from; i < to; i++) {
    const xi = (x[i] as number) - x0;
    const zi = z[i] as number;
    sx += xi;
    sz += zi;
    sxx += xi * xi;
    sxz += xi * zi;
  }
  return lineFromSums(n, sx, sz, sxx, sxz, x0);
}

export function lineFromSums(
  n: number,
  sx: number,
  sz: number,
  sxx: number,
  sxz: number,
  x0: number,
): Line | null {
  const det = n * sxx - sx * sx;
  if (n < 2 || !(Math.abs(det) > 1e-18)) return null;
  const b = (n * sxz - sx * sz) / det;
  const a0 = (sz - b * sx) / n;
  return { a: a0 - b * x0, b };
}

/** Root-mean-square vertical residual of points [from, to) about a line. */
export function lineRms(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  from: number,
  to: number,
  l: Line,
): number {
  let s = 0;
  for (let i = from; i < to; i++) {
    const r = (z[i] as number) - l.a - l.b * (x[i] as number);
    s += r * r;
  }
  return to > from ? Math.sqrt(s / (to - from)) : 0;
}

/** Residual sum of squares of points with the given sums (x and z taken from x0, z0) about z = a + b·x, in closed form. */
export function sseFromSums(
  n: number,
  sx: number,
  sz: number,
  sxx: number,
  sxz: number,
  szz: number,
  x0: number,
  z0: number,
  l: Line,
): number {
  // The line in the shifted frame: z − z0 = a' + b·(x − x0).
  const a = l.a + l.b * x0 - z0;
  const b = l.b;
  const sse = szz - 2 * a * sz - 2 * b * sxz + n * a * a + 2 * a * b * sx + b * b * sxx;
  return sse > 0 ? sse : 0;
}

/**
 * Trimmed least squares: fit, then refit over the points within max(3·rms, floor) of the line, twice. Robust to
 * spatter, dropouts and the odd spike, which a scanner's plate segment may hold. The scatter comes from the sums
 * in closed form, so each round is one pass over the points. With `stride` > 1 only every stride-th point is
 * used: a first estimate that the caller refines over all the points.
 */
export function fitLineTrimmed(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  from: number,
  to: number,
  floor: number,
  stride = 1,
): { line: Line; rms: number; inliers: number } | null {
  const x0 = x[from] as number;
  const z0 = z[from] as number;
  const total = Math.ceil((to - from) / stride);
  let a = 0;
  let b = 0;
  let rms = 0;
  let inliers = 0;
  // Bound on the rounding error of the last round's residual sum of squares (see below).
  let slack = 0;
  let sse = 0;
  for (let pass = 0; pass < 3; pass++) {
    const tol = Math.max(3 * rms, floor);
    // A clean plate drops no point in the first trimming round, which would refit the same set. No residual exceeds
    // the root of the residual sum of squares, so when that root (with its rounding error) is well within the
    // tolerance no point can be dropped; otherwise a pass that only looks for a point beyond the tolerance (and
    // stops at the first) decides it at the cost of the test alone.
    if (pass === 1 && (sse + slack <= tol * tol * (1 - 1e-6) || !beyond(x, z, from, to, stride, a, b, tol)))
      break;
    let sx = 0,
      sz = 0,
      sxx = 0,
      sxz = 0,
      szz = 0,
      n = 0;
    // The first round takes every point, later ones those near the last line.
    if (pass === 0) {
      for (let i = from; i < to; i += stride) {
        const xi = (x[i] as number) - x0;
        const zi = (z[i] as number) - z0;
        sx += xi;
        sz += zi;
        sxx += xi * xi;
        sxz += xi * zi;
        szz += zi * zi;
      }
      n = total;
    } else {
      for (let i = from; i < to; i += stride) {
        const xa = x[i] as number;
        const za = z[i] as number;
        if (Math.abs(za - a - b * xa) > tol) continue;
        const xi = xa - x0;
        const zi = za - z0;
        sx += xi;
        sz += zi;
        sxx += xi * xi;
        sxz += xi * zi;
        szz += zi * zi;
        n++;
      }
    }
    // lineFromSums and sseFromSums, written out: the rounds make no objects.
    const det = n * sxx - sx * sx;
    if (n < 2 || !(Math.abs(det) > 1e-18)) break;
    const slope = (n * sxz - sx * sz) / det;
    const a0 = (sz - slope * sx) / n;
    b = slope;
    a = a0 - slope * x0 + z0;
    inliers = n;
    // Residual sum of squares about z − z0 = a0 + b·(x − x0), from the sums.
    const t3 = n * a0 * a0;
    const t5 = slope * slope * sxx;
    const raw = szz - 2 * a0 * sz - 2 * slope * sxz + t3 + 2 * a0 * slope * sx + t5;
    sse = raw > 0 ? raw : 0;
    // Its rounding error: each sum carries up to about n roundings of its terms' magnitudes (Higham, "Accuracy and
    // Stability of Numerical Algorithms", 2002, §4.2), bounded by Cauchy–Schwarz (Σ|z| ≤ √(n·Σz²), Σ|xz| ≤
    // √(Σx²·Σz²)), taken twice over.
    slack =
      2 *
      (n + 8) *
      Number.EPSILON *
      (szz +
        2 * Math.abs(a0) * Math.sqrt(n * szz) +
        2 * Math.abs(slope) * Math.sqrt(sxx * szz) +
        t3 +
        2 * Math.abs(a0 * slope) * Math.sqrt(n * sxx) +
        t5);
    rms = Math.sqrt(sse / n);
  }
  return inliers > 0 ? { line: { a, b }, rms, inliers } : null;
}

/** Whether any of the points [from, to) taken every `stride` lies more than `tol` from z = a + b·x. */
function beyond(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  from: number,
  to: number,
  stride: number,
  a: number,
  b: number,
  tol: number,
): boolean {
  for (let i = from; i < to; i += stride) {
    if (Math.abs((z[i] as number) - a - b * (x[i] as number)) > tol) return true;
  }
  return false;
}

export interface Circle {
  readonly cx: number;
  readonly cz: number;
  readonly r: number;
  /** RMS of the points' distances to the circle. */
  readonly rms: number;
  readonly n: number;
}

/** Mean of x (or z) over the points from..to (exclusive): both circle fits work about the centroid. */
function mean(v: ArrayLike<number>, from: number, to: number): number {
  let m = 0;
  for (let i = from; i < to; i++) m += v[i] as number;
  return m / (to - from);
}

/** Root-mean-square radial distance of the points from a circle: the fit's residual. */
function circleRms(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  from: number,
  to: number,
  cx: number,
  cz: number,
  r: number,
): number {
  let s = 0;
  for (let i = from; i < to; i++) {
    const dx = (x[i] as number) - cx;
    const dz = (z[i] as number) - cz;
    // sqrt, not Math.hypot: millimetre distances cannot overflow, and hypot is several times slower.
    const d = Math.sqrt(dx * dx + dz * dz) - r;
    s += d * d;
  }
  return Math.sqrt(s / (to - from));
}

/**
 * Pratt's algebraic circle fit (Pratt 1987, "Direct least-squares fitting of algebraic surfaces"), solved by
 * Newton's method on its characteristic polynomial as in Chernov's "Circular and linear regression" (2010), §5.
 * Unlike Kåsa's fit it is not biased towards small radii on short arcs.
 */
export function fitCirclePratt(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  from: number,
  to: number,
  withResidual = true,
): Circle | null {
  const n = to - from;
  if (n < 3) return null;
  // The centroid in one pass over both coordinates.
  let mx = 0;
  let mz = 0;
  for (let i = from; i < to; i++) {
    mx += x[i] as number;
    mz += z[i] as number;
  }
  mx /= n;
  mz /= n;
  let Mxx = 0,
    Myy = 0,
    Mxy = 0,
    Mxz = 0,
    Myz = 0,
    Mzz = 0;
  for (let i = from; i < to; i++) {
    const xi = (x[i] as number) - mx;
    const yi = (z[i] as number) - mz;
    const zi = xi * xi + yi * yi;
    Mxy += xi * yi;
    Mxx += xi * xi;
    Myy += yi * yi;
    Mxz += xi * zi;
    Myz += yi * zi;
    Mzz += zi * zi;
  }
  Mxx /= n;
  Myy /= n;
  Mxy /= n;
  Mxz /= n;
  Myz /= n;
  Mzz /= n;
  const Mz = Mxx + Myy;
  const covXY = Mxx * Myy - Mxy * Mxy;
  const Mxz2 = Mxz * Mxz;
  const Myz2 = Myz * Myz;
  const A2 = 4 * covXY - 3 * Mz * Mz - Mzz;
  const A1 = Mzz * Mz + 4 * covXY * Mz - Mxz2 - Myz2 - Mz * Mz * Mz;
  const A0 = Mxz2 * Myy + Myz2 * Mxx - Mzz * covXY - 2 * Mxz * Myz * Mxy + Mz * Mz * covXY;
  const A22 = A2 + A2;
  let xnew = 0;
  let ynew = 1e20;
  for (let iter = 0; iter < 20; iter++) {
    const yold = ynew;
    ynew = A0 + xnew * (A1 + xnew * (A2 + 4 * xnew * xnew));
    if (Math.abs(ynew) > Math.abs(yold)) {
      xnew = 0;
      break;
    }
    const Dy = A1 + xnew * (A22 + 16 * xnew * xnew);
    const xold = xnew;
    xnew = xold - ynew / Dy;
    if (!Number.isFinite(xnew)) {
      xnew = 0;
      break;
    }
    if (Math.abs((xnew - xold) / xnew) < 1e-12) break;
    if (xnew < 0) {
      xnew = 0;
      break;
    }
  }
  const det = xnew * xnew - xnew * Mz + covXY;
  if (!(Math.abs(det) > 1e-30)) return null;
  const cx0 = (Mxz * (Myy - xnew) - Myz * Mxy) / det / 2;
  const cz0 = (Myz * (Mxx - xnew) - Mxz * Mxy) / det / 2;
  const r = Math.sqrt(cx0 * cx0 + cz0 * cz0 + Mz + 2 * xnew);
  if (!Number.isFinite(r)) return null;
  const cx = cx0 + mx;
  const cz = cz0 + mz;
  return { cx, cz, r, rms: withResidual ? circleRms(x, z, from, to, cx, cz, r) : NaN, n };
}

/** Kåsa's algebraic circle fit (Kåsa 1976), kept for comparison in tests: a 3×3 linear least-squares problem. */
export function fitCircleKasa(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  from: number,
  to: number,
): Circle | null {
  const n = to - from;
  if (n < 3) return null;
  const mx = mean(x, from, to);
  const mz = mean(z, from, to);
  let suu = 0,
    svv = 0,
    suv = 0,
    suuu = 0,
    svvv = 0,
    suvv = 0,
    svuu = 0;
  for (let i = from; i < to; i++) {
    const u = (x[i] as number) - mx;
    const v = (z[i] as number) - mz;
    suu += u * u;
    svv += v * v;
    suv += u * v;
    suuu += u * u * u;
    svvv += v * v * v;
    suvv += u * v * v;
    svuu += v * u * u;
  }
  const b1 = (suuu + suvv) / 2;
  const b2 = (svvv + svuu) / 2;
  const det = suu * svv - suv * suv;
  if (!(Math.abs(det) > 1e-30)) return null;
  const uc = (b1 * svv - b2 * suv) / det;
  const vc = (suu * b2 - suv * b1) / det;
  const r = Math.sqrt(uc * uc + vc * vc + (suu + svv) / n);
  const cx = uc + mx;
  const cz = vc + mz;
  return { cx, cz, r, rms: circleRms(x, z, from, to, cx, cz, r), n };
}
