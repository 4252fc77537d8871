// The plate walk against a plain walk over every point: where the weld begins (the first run of `run` points off
// the line by more than τ) must be the same whether or not the walk steps over points, on plates with scatter,
// spikes and short runs off the line, from either end; and the sums it keeps must be those of points on the line.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { walkLine, walkPlate, walkSums } from '../../../src/domain/profile/plate-walk.js';

/** The first index of a run of `run` points off the line, seen from the `dir` end; −1 when there is none. */
function plainDeparture(off: readonly boolean[], dir: 1 | -1, run: number): number {
  const n = off.length;
  let start = -1;
  let count = 0;
  for (let s = 0; s < n; s++) {
    const i = dir === 1 ? s : n - 1 - s;
    if (!off[i]) {
      count = 0;
      continue;
    }
    if (count === 0) start = i;
    if (++count === run) return start;
  }
  return -1;
}

const profileArb = fc.record({
  n: fc.integer({ min: 24, max: 900 }),
  run: fc.integer({ min: 2, max: 7 }),
  // Points off the line: isolated spikes and short bursts anywhere, then the weld somewhere (or nowhere).
  bursts: fc.array(fc.tuple(fc.nat(), fc.integer({ min: 1, max: 8 })), { maxLength: 12 }),
  weldAt: fc.option(fc.double({ min: 0, max: 1, noNaN: true }), { nil: null }),
  dir: fc.constantFrom<1 | -1>(1, -1),
});

describe('the plate walk', () => {
  it('finds the weld where a walk over every point does, and sums only points on the line', () => {
    fc.assert(
      fc.property(profileArb, ({ n, run, bursts, weldAt, dir }) => {
        const a = 0.3;
        const b = 0.01;
        const tau = 0.005;
        const x = new Float64Array(n);
        const z = new Float64Array(n);
        const off: boolean[] = Array.from({ length: n }, () => false);
        for (const [at, len] of bursts)
          for (let i = at % n; i < Math.min(n, (at % n) + len); i++) off[i] = true;
        if (weldAt !== null) {
          const w = Math.floor(weldAt * n);
          for (let i = Math.max(0, w - 40); i < Math.min(n, w + 40); i++) off[i] = true;
        }
        for (let i = 0; i < n; i++) {
          x[i] = -30 + (60 * i) / (n - 1);
          // On the line within τ/2 (a deterministic ripple), off it by 2τ or more.
          const ripple = (tau / 2) * Math.sin(i * 1.7);
          z[i] = a + b * (x[i] as number) + (off[i] ? (3 + (i % 3)) * tau : ripple);
        }
        walkLine.set([a, b, tau, x[0] as number, z[0] as number]);
        const departure = walkPlate(x, z, n, dir, run);
        expect(departure).toBe(plainDeparture(off, dir, run));
        // Every summed point was on the line: Σz (about z0) stays within the ripple of the line's own Σ.
        const cnt = walkSums[0] as number;
        const sx = walkSums[1] as number;
        const sz = walkSums[2] as number;
        const onLine = sz - (a + b * (x[0] as number) - (z[0] as number)) * cnt - b * sx;
        expect(Math.abs(onLine)).toBeLessThanOrEqual((tau / 2) * cnt + 1e-9);
        // Long profiles sum every other point at least, short ones every point before the weld.
        const reached = departure < 0 ? n : dir === 1 ? departure : n - 1 - departure;
        let onBefore = 0;
        for (let s = 0; s < reached; s++) if (!off[dir === 1 ? s : n - 1 - s]) onBefore++;
        if (n < 400) expect(cnt).toBe(onBefore);
        else expect(cnt).toBeGreaterThanOrEqual(Math.floor(onBefore / 2) - 20);
      }),
      { numRuns: 400 },
    );
  });
});
