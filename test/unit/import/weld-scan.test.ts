// The fused weld scan and the pruned height search against the plain loops they replace, on noisy generated welds
// (noise keeps slopes and heights free of exact ties, where the order of comparison could differ).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { Line } from '../../../src/domain/profile/fits.js';
import { heightAboveChord, scanWeld } from '../../../src/domain/profile/weld-scan.js';
import { weldProfile } from '../../support/weld-profile.js';

function plainScan(
  x: Float64Array,
  z: Float64Array,
  from: number,
  to: number,
  l1: Line,
  l2: Line,
  k: number,
) {
  const za = l1.a + l1.b * (x[from] as number);
  const zb = l2.a + l2.b * (x[to] as number);
  const slope = (zb - za) / ((x[to] as number) - (x[from] as number));
  let crown = from;
  let top = -Infinity;
  for (let i = from; i <= to; i++) {
    const h = (z[i] as number) - za - slope * ((x[i] as number) - (x[from] as number));
    if (h > top) {
      top = h;
      crown = i;
    }
  }
  const r = (l: Line, i: number) => (z[i] as number) - (l.a + l.b * (x[i] as number));
  const steepest = (l: Line, start: number, dir: 1 | -1) => {
    let at = start;
    let best = -Infinity;
    for (let i = start; i * dir < crown * dir; i += dir) {
      const p = i - k * dir;
      const q = i + k * dir;
      if (p < 0 || q < 0 || p >= x.length || q >= x.length) continue;
      const s = (r(l, q) - r(l, p)) / (((x[q] as number) - (x[p] as number)) * dir);
      if (s > best) {
        best = s;
        at = i;
      }
    }
    return { at, best };
  };
  return { crown, top, one: steepest(l1, from, 1), two: steepest(l2, to, -1) };
}

describe('scanWeld', () => {
  it('finds the crown and both steepest points the plain loops find, with their slopes', () => {
    fc.assert(
      fc.property(
        fc.record({
          height: fc.double({ min: 0.5, max: 3, noNaN: true }),
          flank: fc.double({ min: 10, max: 60, noNaN: true }),
          toeRadius: fc.double({ min: 0.2, max: 3, noNaN: true }),
          offset: fc.double({ min: -0.5, max: 0.5, noNaN: true }),
          kink: fc.double({ min: -2, max: 2, noNaN: true }),
          noise: fc.double({ min: 0.0005, max: 0.02, noNaN: true }),
          seed: fc.nat(),
        }),
        fc.integer({ min: 1, max: 4 }),
        (shape, k) => {
          const { x, z } = weldProfile({ ...shape, spacing: 0.05, halfSpan: 20 });
          const n = x.length;
          const from = Math.floor(n * 0.3);
          const to = Math.floor(n * 0.7);
          const half = (shape.kink * Math.PI) / 360;
          const l1: Line = { a: 0, b: Math.tan(half) };
          const l2: Line = { a: shape.offset, b: -Math.tan(half) };
          const got = scanWeld(x, z, n, from, to, l1, l2, k);
          const want = plainScan(x, z, from, to, l1, l2, k);
          expect(got.crown).toBe(want.crown);
          expect(got.top).toBe(want.top);
          expect(got.steep1).toBe(want.one.at);
          expect(got.steep2).toBe(want.two.at);
          expect(got.slope1).toBeCloseTo(want.one.best, 9);
          expect(got.slope2).toBeCloseTo(want.two.best, 9);
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('heightAboveChord', () => {
  it('gives the largest distance above any chord near the departures, as a scan of every point does', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 3, noNaN: true }),
        fc.double({ min: 0.001, max: 0.03, noNaN: true }),
        fc.nat(),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -3, max: 3, noNaN: true }),
        fc.double({ min: -0.3, max: 0.3, noNaN: true }),
        fc.double({ min: -0.3, max: 0.3, noNaN: true }),
        (height, noise, seed, dx1, dx2, dz1, dz2) => {
          const { x, z } = weldProfile({ height, flank: 30, toeRadius: 1, noise, seed, spacing: 0.05 });
          const n = x.length;
          const from = Math.floor(n * 0.3);
          const to = Math.floor(n * 0.7);
          const flat: Line = { a: 0, b: 0 };
          const scan = scanWeld(x, z, n, from, to, flat, flat, 1);
          const x1 = (x[from] as number) + dx1;
          const x2 = (x[to] as number) + dx2;
          let want = 0;
          const len = Math.sqrt((x2 - x1) ** 2 + (dz2 - dz1) ** 2);
          for (let i = from; i <= to; i++) {
            const d = (((x[i] as number) - x1) * -(dz2 - dz1) + ((z[i] as number) - dz1) * (x2 - x1)) / len;
            if (d > want) want = d;
          }
          expect(heightAboveChord(x, z, from, to, scan, x1, dz1, x2, dz2)).toBe(want);
        },
      ),
      { numRuns: 300 },
    );
  });
});
