// The scans over the weld between the two plate departures, fused so the points are read once: the crown (highest
// point above the chord between the departures) and, on each side of it, the steepest point of the face in that
// plate's frame. The height above the toe chord then looks only at points the crown scan kept as candidates.
import type { Line } from './fits.js';

export interface WeldScan {
  readonly crown: number;
  /** Height of the crown above the chord between the departures, mm. */
  readonly top: number;
  /** Steepest point between plate 1's departure and the crown, and its slope in plate 1's frame. */
  readonly steep1: number;
  readonly slope1: number;
  /** Steepest point between the crown and plate 2's departure, and its slope (rising towards the crown). */
  readonly steep2: number;
  readonly slope2: number;
}

// Scratch rows reused from slice to slice (extraction is synchronous, so one set serves every call): the height
// above the departure chord and each plate's residual, indexed by point.
let chordHeight = new Float64Array(0);
let residual1 = new Float64Array(0);
let residual2 = new Float64Array(0);

function scratch(n: number): void {
  if (chordHeight.length >= n) return;
  chordHeight = new Float64Array(n);
  residual1 = new Float64Array(n);
  residual2 = new Float64Array(n);
}

/**
 * One pass over [from, to]: the crown is the first highest point above the chord (xa, za)–(xb, zb); slopes are
 * taken over ±k points. Plate 1's steepest point is the first steepest before the crown, plate 2's the steepest
 * after it nearest plate 2 (the order in which a walk from each plate would meet them). Points outside the profile
 * give no slope.
 */
export function scanWeld(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  n: number,
  from: number,
  to: number,
  line1: Line,
  line2: Line,
  k: number,
): WeldScan {
  scratch(n);
  const h = chordHeight;
  const r1 = residual1;
  const r2 = residual2;
  const xa = x[from] as number;
  const za = line1.a + line1.b * xa;
  const xb = x[to] as number;
  const zb = line2.a + line2.b * xb;
  const slope = (zb - za) / (xb - xa);
  const { a: a1, b: b1 } = line1;
  const { a: a2, b: b2 } = line2;
  // Residuals are filled k points ahead of the scan; the k before `from` first.
  for (let j = Math.max(0, from - k); j < Math.min(n, from + k); j++) {
    const xj = x[j] as number;
    const zj = z[j] as number;
    r1[j] = zj - (a1 + b1 * xj);
    r2[j] = zj - (a2 + b2 * xj);
  }
  let crown = from;
  let top = -Infinity;
  let best1 = -Infinity;
  let steep1 = from;
  let crownBest1 = -Infinity;
  let crownSteep1 = from;
  let best2 = -Infinity;
  let steep2 = to;
  for (let i = from; i <= to; i++) {
    const q = i + k;
    if (q < n) {
      const xq = x[q] as number;
      const zq = z[q] as number;
      r1[q] = zq - (a1 + b1 * xq);
      r2[q] = zq - (a2 + b2 * xq);
    }
    const xi = x[i] as number;
    const hi = (z[i] as number) - za - slope * (xi - xa);
    h[i] = hi;
    const p = i - k;
    const inside = p >= 0 && q < n;
    const dx = inside ? (x[q] as number) - (x[p] as number) : NaN;
    if (hi > top) {
      top = hi;
      crown = i;
      // Plate 1's steepest point lies before the crown: what the scan has seen so far.
      crownBest1 = best1;
      crownSteep1 = steep1;
      best2 = -Infinity;
      steep2 = to;
    } else if (inside) {
      // Plate 2's frame runs the other way: its slope rises towards the crown. On a tie the later point wins.
      const s2 = ((r2[p] as number) - (r2[q] as number)) / dx;
      if (s2 > best2 || (s2 === best2 && s2 > -Infinity)) {
        best2 = s2;
        steep2 = i;
      }
    }
    if (inside) {
      const s1 = ((r1[q] as number) - (r1[p] as number)) / dx;
      if (s1 > best1) {
        best1 = s1;
        steep1 = i;
      }
    }
  }
  return { crown, top, steep1: crownSteep1, slope1: crownBest1, steep2, slope2: best2 };
}

/**
 * The largest distance above the chord (x1, z1)–(x2, z2) of the points [from, to] scanned last by scanWeld (0 when
 * none lies above). The toe chord differs from the departure chord by a linear term Δ(x), so a point whose height
 * above the departure chord is more than 2·max|Δ| below the crown's cannot be the highest: only the others are
 * measured.
 */
export function heightAboveChord(
  x: ArrayLike<number>,
  z: ArrayLike<number>,
  from: number,
  to: number,
  scan: WeldScan,
  x1: number,
  z1: number,
  x2: number,
  z2: number,
): number {
  const cdx = x2 - x1;
  const cdz = z2 - z1;
  const len = Math.hypot(cdx, cdz);
  const h = chordHeight;
  const xa = x[from] as number;
  const xb = x[to] as number;
  // Δ at the ends, from the departure chord's heights there (h[from], h[to] hold z minus that chord).
  const chordA = (z[from] as number) - (h[from] as number);
  const chordB = (z[to] as number) - (h[to] as number);
  const deltaA = z1 + (cdz / cdx) * (xa - x1) - chordA;
  const deltaB = z1 + (cdz / cdx) * (xb - x1) - chordB;
  const spread = Math.max(Math.abs(deltaA), Math.abs(deltaB));
  // Crossed or coincident toes: no bound, every point is measured.
  const floor = cdx > 0 && Number.isFinite(spread) ? scan.top - 2 * spread - 1e-9 : -Infinity;
  let best = 0;
  for (let i = from; i <= to; i++) {
    if (!((h[i] as number) >= floor)) continue;
    const d = (((x[i] as number) - x1) * -cdz + ((z[i] as number) - z1) * cdx) / len;
    if (d > best) best = d;
  }
  return best;
}
