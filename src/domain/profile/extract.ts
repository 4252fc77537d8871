// Weld geometry from one surface profile across a butt weld (x across the seam, z up out of the face, plate 1 on
// the left). Our method, step by step:
//  1. each plate surface by a trimmed least-squares line over about 64 points of the outer fifth of the profile on
//     its side (σ, the plate scatter, is its RMS), then walked inwards while points stay within the departure
//     tolerance τ = max(4σ, 0.005 mm) and refitted over the points the walk accepted (every other one on a profile
//     of 400 points or more; the weld's start is found point by point all the same);
//  2. the weld begins where three points in a row (a smoothing window's worth when smoothed) leave the plate line
//     by more than τ; a dip below the line first is an undercut (on either plate), its depth the deepest point;
//  3. the steepest point of the face between toe and crown (slope over ±k points) splits the toe transition from
//     the cap; the toe transition is fitted with Pratt's circle (toe radius, with its RMS residual), the cap next
//     to it with another; the flank angle θ is the angle of their common tangent (perpendicular to the line of
//     centres), falling back to the steepest slope when the cap fit fails; ISO toe angle α = 180° − θ;
//  4. the toe is the foot of the toe circle on the plate line; width b is the distance between the toes, height
//     h the largest distance of the cap above the chord joining them;
//  5. linear misalignment e is plate 2's line minus plate 1's at the weld centre (a step on the face surface);
//     angular misalignment β = atan(slope₁) − atan(slope₂), positive when the joint peaks towards the face.
// Fit quality q = 1 − (RMS residual of all fitted points about their plate lines and toe circles) / 0.05 mm,
// clipped to [0, 1], and 0 when a plate or toe could not be fitted. Slices with q < 0.6 are flagged.
import { fitCirclePratt, fitLineTrimmed, lineFromSums, sseFromSums, type Circle, type Line } from './fits.js';
import { walkLine, walkPlate, walkSums } from './plate-walk.js';
import { heightAboveChord, scanWeld } from './weld-scan.js';

export const QUALITY_TOLERANCE_MM = 0.05;
export const QUALITY_THRESHOLD = 0.6;
/**
 * A toe radius comes from a short arc, and noise of a few hundredths of a millimetre moves it by tens of per cent
 * (see docs/import.md): it is imported only from slices at or above this quality (plate scatter up to about 5 µm).
 */
export const RADIUS_QUALITY = 0.9;
const TAU_MIN = 0.005;
const OUTER_SHARE = 0.2;
const MIN_PLATE_POINTS = 8;
const MIN_TOE_POINTS = 4;
const PLATE_SAMPLE = 64;
const RAD = 180 / Math.PI;

export interface ToeGeometry {
  /** Where the weld leaves the plate line (x, z). */
  readonly x: number;
  readonly z: number;
  /** θ, degrees from the plate line. */
  readonly flankAngle: number | null;
  /** ISO 5817 toe angle α = 180° − θ. */
  readonly toeAngle: number | null;
  readonly toeRadius: number | null;
  /** RMS distance of the toe-transition points to the fitted circle, mm. */
  readonly radiusResidual: number | null;
  readonly radiusPoints: number;
  readonly undercutDepth: number;
}

export interface SliceGeometry {
  readonly points: number;
  readonly toes: readonly [ToeGeometry, ToeGeometry] | null;
  readonly reinforcementHeight: number | null;
  readonly reinforcementWidth: number | null;
  readonly linearMisalignment: number | null;
  readonly angularMisalignment: number | null;
  /** Plate scatter σ, mm. */
  readonly noise: number;
  readonly plateLines: readonly [Line, Line] | null;
  /** 0–1, see the definition above. */
  readonly quality: number;
  readonly flagged: boolean;
  readonly problems: readonly string[];
}

interface PlateSide {
  readonly line: Line;
  readonly sigma: number;
  readonly sse: number;
  readonly n: number;
  /** First index of the weld (or undercut) seen from this side. */
  readonly departure: number;
  readonly undercut: number;
}

/** Grows the plate from its outer fifth inwards; `dir` +1 walks left to right (plate 1), −1 right to left. */
function plateSide(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  n: number,
  dir: 1 | -1,
  run: number,
): PlateSide | string {
  const outer = Math.max(MIN_PLATE_POINTS, Math.floor(n * OUTER_SHARE));
  if (outer * 2 >= n) return 'too few points for two plates and a weld';
  const from = dir === 1 ? 0 : n - outer;
  const to = dir === 1 ? outer : n;
  // A first estimate from about 64 points of the outer part; the walk below refits over the accepted points.
  const fit = fitLineTrimmed(x, z, from, to, TAU_MIN / 4, Math.max(1, Math.floor(outer / PLATE_SAMPLE)));
  if (!fit) return 'plate line could not be fitted';
  const sigma = fit.rms;
  const tau = Math.max(4 * sigma, TAU_MIN);
  // Sums over the accepted points, growing as the walk goes on; refitted at the end, its scatter in closed form.
  const x0 = x[from] as number;
  const z0 = z[from] as number;
  walkLine[0] = fit.line.a;
  walkLine[1] = fit.line.b;
  walkLine[2] = tau;
  walkLine[3] = x0;
  walkLine[4] = z0;
  const departure = walkPlate(x, z, n, dir, run);
  const cnt = walkSums[0] as number;
  const sx = walkSums[1] as number;
  const sz = walkSums[2] as number;
  const sxx = walkSums[3] as number;
  const sxz = walkSums[4] as number;
  const szz = walkSums[5] as number;
  if (departure < 0) return 'no weld found: the profile never leaves the plate line';
  const line = lineFromSums(cnt, sx, sz + cnt * z0, sxx, sxz + sx * z0, x0);
  if (!line || cnt < MIN_PLATE_POINTS) return `only ${cnt} points on the plate`;
  const { a, b } = line;
  const sse = sseFromSums(cnt, sx, sz, sxx, sxz, szz, x0, z0, line);
  // A dip below the line before the weld rises is an undercut.
  let undercut = 0;
  const end = dir === 1 ? n : -1;
  let i = departure;
  while (i !== end) {
    // Depth below the line, taken before the test that ends the dip: code that only a rare slice reaches made the
    // optimised walk fall back to the interpreter over and over.
    const below = a + b * (x[i] as number) - (z[i] as number);
    if (below > undercut) undercut = below;
    if (below < -tau) break;
    i += dir;
  }
  if (undercut <= tau) undercut = 0;
  return { line, sigma, sse, n: cnt, departure: undercut > 0 ? i : departure, undercut };
}

const at = (l: Line, x: number) => l.a + l.b * x;

interface ToeFit {
  readonly geometry: ToeGeometry;
  readonly sse: number;
  readonly n: number;
  readonly ok: boolean;
}

/**
 * The toe on one side: toe circle, cap circle, flank angle, from the steepest point (and its slope) that scanWeld
 * found between the departure and the crown. `dir` +1 for plate 1's toe.
 */
function toeOf(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  side: PlateSide,
  crown: number,
  steep: number,
  best: number,
  dir: 1 | -1,
  problems: string[],
  label: string,
): ToeFit {
  const { line } = side;
  const norm = Math.sqrt(1 + line.b * line.b);
  const nx = -line.b / norm;
  const nz = 1 / norm;
  const ux = 1 / norm;
  const uz = line.b / norm;
  const slopeAngle = Math.atan(best) * RAD;
  // Toe transition: from where the points first rise off the line to the steepest point.
  const tauLow = Math.max(2 * side.sigma, TAU_MIN / 5);
  let first = side.departure;
  while (
    first - dir >= 0 &&
    (z[first - dir] as number) - at(line, x[first - dir] as number) > tauLow &&
    Math.abs(first - dir - side.departure) < 50
  )
    first -= dir;
  let lo = Math.min(first, steep);
  let hi = Math.max(first, steep) + 1;
  if (hi - lo < MIN_TOE_POINTS) {
    lo = Math.max(0, lo - 1);
    hi = hi + 1;
  }
  let circle: Circle | null = hi - lo >= MIN_TOE_POINTS ? fitCirclePratt(x, z, lo, hi) : null;
  // The toe circle sits on the weld side of the surface (concave up) and touches down near the departure.
  if (circle && (circle.cx * nx + circle.cz * nz - at(line, 0) * nz <= 0 || circle.r > 100)) circle = null;
  let toeX = x[side.departure] as number;
  let toeZ = at(line, toeX);
  let flank: number | null = null;
  if (circle) {
    const footX = (circle.cx + line.b * (circle.cz - line.a)) / (1 + line.b * line.b);
    if (Math.abs(footX - toeX) < Math.min(3 * circle.r + 0.2, 2)) {
      toeX = footX;
      toeZ = at(line, footX);
    }
    // Cap next to the steepest point: its circle's centre line with the toe circle's gives the common tangent.
    // A band of the cap next to the steepest point (at most 80 points): the face near the toe, not the crown.
    const span = Math.min(80, Math.max(6, Math.floor(Math.abs(crown - steep) / 2)));
    const cLo = dir === 1 ? steep + 1 : steep - span;
    const cHi = dir === 1 ? steep + 1 + span : steep;
    const cap = cLo >= 0 && cHi > cLo ? fitCirclePratt(x, z, cLo, cHi, false) : null;
    if (cap) {
      const dx = cap.cx - circle.cx;
      const dz = cap.cz - circle.cz;
      const along = (dx * ux + dz * uz) * dir;
      const down = -(dx * nx + dz * nz);
      const theta = Math.atan2(along, down) * RAD;
      if (theta > 0 && theta < 90 && Math.abs(theta - slopeAngle) < 15) flank = theta;
    }
  } else problems.push(`${label}: the toe transition could not be fitted with a circle`);
  if (flank === null && Number.isFinite(slopeAngle) && slopeAngle > 0) flank = slopeAngle;
  let sse = 0;
  if (circle) sse = circle.rms * circle.rms * circle.n;
  return {
    geometry: {
      x: toeX,
      z: toeZ,
      flankAngle: flank,
      toeAngle: flank === null ? null : 180 - flank,
      toeRadius: circle ? circle.r : null,
      radiusResidual: circle ? circle.rms : null,
      radiusPoints: circle ? circle.n : 0,
      undercutDepth: side.undercut,
    },
    sse,
    n: circle ? circle.n : 0,
    ok: circle !== null,
  };
}

/** Plate scatter above which the weld region is read from a moving average (σ in mm). */
const SMOOTH_ABOVE = 0.003;
const SMOOTH_SPAN_MM = 0.3;

// The smoothed profile, reused from slice to slice: extraction is synchronous and keeps no reference to it.
let smoothed = new Float64Array(0);

/** Centred moving average over `w` (odd) points; the ends keep shorter windows. Valid until the next call. */
function movingAverage(z: ArrayLike<number>, n: number, w: number): Float64Array {
  if (smoothed.length < n) smoothed = new Float64Array(n);
  const out = smoothed;
  const h = (w - 1) >> 1;
  let sum = 0;
  let lo = 0;
  let hi = -1;
  for (let i = 0; i < n; i++) {
    const a = Math.max(0, i - h);
    const b = Math.min(n - 1, i + h);
    while (hi < b) sum += z[++hi] as number;
    while (lo < a) sum -= z[lo++] as number;
    out[i] = sum / (hi - lo + 1);
  }
  return out;
}

/**
 * Extracts one slice. `x` ascending; points [0, n). A noisy profile (plate scatter σ above 3 µm) is read from its
 * moving average over about 0.3 mm; its quality then combines the raw scatter with the smoothed model's residual.
 */
export function extractSlice(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  n: number = x.length,
): SliceGeometry {
  const raw = extractCore(x, z, n, 3);
  if (!(raw.noise > SMOOTH_ABOVE)) return raw;
  const dx = ((x[n - 1] as number) - (x[0] as number)) / (n - 1);
  const w = Math.max(3, 2 * Math.round(SMOOTH_SPAN_MM / dx / 2) + 1);
  // Averaged points are correlated over the window: the weld must stay off the line for a whole window.
  const smooth = extractCore(x, movingAverage(z, n, w), n, w + 2);
  const rms = Math.hypot(raw.noise, (1 - smooth.quality) * QUALITY_TOLERANCE_MM);
  const quality = smooth.toes ? Math.min(1, Math.max(0, 1 - rms / QUALITY_TOLERANCE_MM)) : 0;
  const problems = [...smooth.problems];
  if (quality < QUALITY_THRESHOLD && !problems.length) {
    problems.push(
      `plate scatter ${raw.noise.toFixed(3)} mm: quality ${quality.toFixed(2)} is below ${QUALITY_THRESHOLD}`,
    );
  }
  return { ...smooth, noise: raw.noise, quality, flagged: quality < QUALITY_THRESHOLD, problems };
}

function failed(n: number, why: string, noise: number): SliceGeometry {
  return {
    points: n,
    toes: null,
    reinforcementHeight: null,
    reinforcementWidth: null,
    linearMisalignment: null,
    angularMisalignment: null,
    noise,
    plateLines: null,
    quality: 0,
    flagged: true,
    problems: [why],
  };
}

function extractCore(x: ArrayLike<number>, z: ArrayLike<number>, n: number, run: number): SliceGeometry {
  const problems: string[] = [];
  if (n < 3 * MIN_PLATE_POINTS) return failed(n, `only ${n} points`, 0);
  const left = plateSide(x, z, n, 1, run);
  if (typeof left === 'string') return failed(n, `plate 1: ${left}`, 0);
  const right = plateSide(x, z, n, -1, run);
  if (typeof right === 'string') return failed(n, `plate 2: ${right}`, left.sigma);
  if (left.departure >= right.departure) return failed(n, 'no weld found between the plates', left.sigma);
  const sigma = Math.max(left.sigma, right.sigma);
  const dx = ((x[n - 1] as number) - (x[0] as number)) / (n - 1);
  const k = sigma > 0.003 ? Math.max(1, Math.round(0.1 / dx)) : 1;
  const scan = scanWeld(x, z, n, left.departure, right.departure, left.line, right.line, k);
  const crown = scan.crown;
  if (crown - left.departure <= k || right.departure - crown <= k)
    return failed(n, 'the weld is too narrow to find its toes', sigma);
  const t1 = toeOf(x, z, left, crown, scan.steep1, scan.slope1, 1, problems, 'toe on plate 1');
  const t2 = toeOf(x, z, right, crown, scan.steep2, scan.slope2, -1, problems, 'toe on plate 2');
  // Height above the chord joining the toes, width between them.
  const { x: x1, z: z1 } = t1.geometry;
  const { x: x2, z: z2 } = t2.geometry;
  const len = Math.sqrt((x2 - x1) ** 2 + (z2 - z1) ** 2);
  const h = heightAboveChord(x, z, left.departure, right.departure, scan, x1, z1, x2, z2);
  const xm = (t1.geometry.x + t2.geometry.x) / 2;
  const e = at(right.line, xm) - at(left.line, xm);
  const beta = (Math.atan(left.line.b) - Math.atan(right.line.b)) * RAD;
  const used = left.n + right.n + t1.n + t2.n;
  const rms = Math.sqrt((left.sse + right.sse + t1.sse + t2.sse) / used);
  let quality = Math.min(1, Math.max(0, 1 - rms / QUALITY_TOLERANCE_MM));
  if (!t1.ok || !t2.ok) quality = 0;
  if (quality < QUALITY_THRESHOLD && problems.length === 0) {
    problems.push(
      `fit residual ${rms.toFixed(3)} mm: quality ${quality.toFixed(2)} is below ${QUALITY_THRESHOLD}`,
    );
  }
  return {
    points: n,
    toes: [t1.geometry, t2.geometry],
    reinforcementHeight: h,
    reinforcementWidth: len,
    linearMisalignment: e,
    angularMisalignment: beta,
    noise: sigma,
    plateLines: [left.line, right.line],
    quality,
    flagged: quality < QUALITY_THRESHOLD,
    problems,
  };
}
