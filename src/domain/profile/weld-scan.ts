// The scans over the weld between the two plate departures: the crown (highest point above the chord between the
// departures), then, on each side of it, the steepest point of the face in that plate's frame. The height above the
// toe chord then looks only at points the crown scan kept as candidates.
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

// Scratch reused from slice to slice (extraction is synchronous, so one set serves every call): the height above
// the departure chord per point, and its maximum per block of BLOCK points, for heightAboveChord.
const BLOCK = 16;
let chordHeight = new Float64Array(0);
let blockTop = new Float64Array(0);

/**
 * The crown is the first highest point of [from, to] above the chord between the departures on the plate lines;
 * slopes are taken over ±k points. Plate 1's steepest point is the first steepest before the crown, plate 2's the
 * steepest after it nearest plate 2 (the order in which a walk from each plate would meet them). Points whose
 * neighbours lie outside the profile, or do not advance in x, give no slope.
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
  if (chordHeight.length < n) {
    chordHeight = new Float64Array(n);
    blockTop = new Float64Array(Math.ceil(n / BLOCK) + 1);
  }
  const h = chordHeight;
  const tops = blockTop;
  const xa = x[from] as number;
  const za = line1.a + line1.b * xa;
  const xb = x[to] as number;
  const zb = line2.a + line2.b * xb;
  const slope = (zb - za) / (xb - xa);
  // Heights block by block, each block's maximum kept in a local: the crown is then looked for only in the first
  // block holding the highest point.
  let top = -Infinity;
  let topBlock = 0;
  for (let start = from, blk = 0; start <= to; start += BLOCK, blk++) {
    const end = Math.min(to, start + BLOCK - 1);
    let m = -Infinity;
    for (let i = start; i <= end; i++) {
      const hi = (z[i] as number) - za - slope * ((x[i] as number) - xa);
      h[i] = hi;
      if (hi > m) m = hi;
    }
    tops[blk] = m;
    if (m > top) {
      top = m;
      topBlock = blk;
    }
  }
  let crown = from;
  if (top > -Infinity) {
    crown = from + topBlock * BLOCK;
    while ((h[crown] as number) !== top) crown++;
  }
  // A plate's frame shifts every slope by the plate's own slope, so the steepest point in plate 1's frame is the
  // one of largest raw slope and in plate 2's (which runs the other way) the one of smallest; the plate slopes are
  // applied at the end. Slopes are kept as rise over run and compared cross-multiplied (runs are positive): no
  // division per point. Each side is its own small loop: fused with the heights, the scan's many live values
  // spilled to the stack.
  const first = Math.max(from, k);
  const last = Math.min(to, n - 1 - k);
  const end1 = Math.min(crown - 1, last);
  const start2 = Math.max(first, crown + 1);
  let maxRise = -Infinity;
  let maxRun = 1;
  let maxAt = from;
  let minRise = Infinity;
  let minRun = 1;
  let minAt = to;
  if (k === 1) {
    // One point either side (a profile with little scatter): the neighbours slide along, two loads a point.
    if (first <= end1) {
      let zl = z[first - 1] as number;
      let xl = x[first - 1] as number;
      let zc = z[first] as number;
      let xc = x[first] as number;
      for (let i = first; i <= end1; i++) {
        const zr = z[i + 1] as number;
        const xr = x[i + 1] as number;
        const rise = zr - zl;
        const run = xr - xl;
        if (run > 0 && rise * maxRun > maxRise * run) {
          maxRise = rise;
          maxRun = run;
          maxAt = i;
        }
        zl = zc;
        xl = xc;
        zc = zr;
        xc = xr;
      }
    }
    if (start2 <= last) {
      let zl = z[start2 - 1] as number;
      let xl = x[start2 - 1] as number;
      let zc = z[start2] as number;
      let xc = x[start2] as number;
      for (let i = start2; i <= last; i++) {
        const zr = z[i + 1] as number;
        const xr = x[i + 1] as number;
        const rise = zr - zl;
        const run = xr - xl;
        // On a tie the later point wins: the first a walk from plate 2 would meet.
        if (run > 0 && rise * minRun <= minRise * run) {
          minRise = rise;
          minRun = run;
          minAt = i;
        }
        zl = zc;
        xl = xc;
        zc = zr;
        xc = xr;
      }
    }
  } else {
    for (let i = first; i <= end1; i++) {
      const rise = (z[i + k] as number) - (z[i - k] as number);
      const run = (x[i + k] as number) - (x[i - k] as number);
      if (run > 0 && rise * maxRun > maxRise * run) {
        maxRise = rise;
        maxRun = run;
        maxAt = i;
      }
    }
    for (let i = start2; i <= last; i++) {
      const rise = (z[i + k] as number) - (z[i - k] as number);
      const run = (x[i + k] as number) - (x[i - k] as number);
      if (run > 0 && rise * minRun <= minRise * run) {
        minRise = rise;
        minRun = run;
        minAt = i;
      }
    }
  }
  return {
    crown,
    top,
    steep1: maxAt,
    slope1: maxRise / maxRun - line1.b,
    steep2: minAt,
    slope2: line2.b - minRise / minRun,
  };
}

/**
 * The largest distance above the chord (x1, z1)–(x2, z2) of the points [from, to] scanned last by scanWeld (0 when
 * none lies above). The toe chord differs from the departure chord by a linear term Δ(x), so a point whose height
 * above the departure chord is more than 2·max|Δ| below the crown's cannot be the highest: only the others, found
 * by their block's maximum, are measured.
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
  const len = Math.sqrt(cdx * cdx + cdz * cdz);
  const h = chordHeight;
  const xa = x[from] as number;
  const xb = x[to] as number;
  // Δ at the ends, from the departure chord's heights there (h holds z minus that chord).
  const deltaA = z1 + (cdz / cdx) * (xa - x1) - ((z[from] as number) - (h[from] as number));
  const deltaB = z1 + (cdz / cdx) * (xb - x1) - ((z[to] as number) - (h[to] as number));
  const spread = Math.max(Math.abs(deltaA), Math.abs(deltaB));
  // Crossed or coincident toes: no bound, every point is measured.
  const floor = cdx > 0 && Number.isFinite(spread) ? scan.top - 2 * spread - 1e-9 : -Infinity;
  let best = 0;
  for (let start = from; start <= to; start += BLOCK) {
    if (floor > -Infinity && !((blockTop[(start - from) >> 4] as number) >= floor)) continue;
    const end = Math.min(to, start + BLOCK - 1);
    for (let i = start; i <= end; i++) {
      if (!((h[i] as number) >= floor) && floor > -Infinity) continue;
      const d = (((x[i] as number) - x1) * -cdz + ((z[i] as number) - z1) * cdx) / len;
      if (d > best) best = d;
    }
  }
  return best;
}
