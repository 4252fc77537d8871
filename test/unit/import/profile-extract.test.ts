// Profile extraction against synthetic welds of known geometry (test/support/weld-profile.ts): each figure is
// checked against the value the generator was built with.
import { describe, expect, it } from 'vitest';
import {
  extractSlice,
  fitCircleKasa,
  fitCirclePratt,
  fitLine,
  QUALITY_THRESHOLD,
  sliceReadings,
} from '../../../src/domain/profile/index.js';
import { toeHalfWidth, weldProfile, type WeldShape } from '../../support/weld-profile.js';

const BASE: WeldShape = { height: 2, flank: 30, toeRadius: 1, spacing: 0.025 };

describe('circle fits', () => {
  it('Pratt and Kåsa recover a circle from exact points on a 40° arc', () => {
    const x = new Float64Array(20);
    const z = new Float64Array(20);
    for (let i = 0; i < 20; i++) {
      const a = -Math.PI / 2 + ((i / 19) * (40 * Math.PI)) / 180;
      x[i] = 3 + 1.5 * Math.cos(a);
      z[i] = 2 + 1.5 * Math.sin(a);
    }
    for (const fit of [fitCirclePratt, fitCircleKasa]) {
      const c = fit(x, z, 0, 20);
      expect(c?.r).toBeCloseTo(1.5, 9);
      expect(c?.cx).toBeCloseTo(3, 9);
      expect(c?.cz).toBeCloseTo(2, 9);
      expect(c?.rms).toBeLessThan(1e-9);
    }
  });

  it('a straight line through points is fitted exactly', () => {
    const x = Float64Array.from({ length: 50 }, (_, i) => i * 0.1);
    const z = x.map((v) => 0.3 + 0.02 * v);
    const l = fitLine(x, z, 0, 50);
    expect(l?.a).toBeCloseTo(0.3, 12);
    expect(l?.b).toBeCloseTo(0.02, 12);
  });
});

describe('extractSlice on generated welds', () => {
  it('recovers flank angle, toe radius, height and width of a symmetric cap', () => {
    const { x, z } = weldProfile(BASE);
    const g = extractSlice(x, z);
    expect(g.flagged).toBe(false);
    expect(g.quality).toBeGreaterThan(0.95);
    for (const t of g.toes ?? []) {
      expect(t.flankAngle).toBeCloseTo(30, 0);
      expect(t.toeAngle).toBeCloseTo(150, 0);
      expect(Math.abs((t.toeRadius ?? 0) - 1)).toBeLessThan(0.05);
      expect(t.undercutDepth).toBe(0);
    }
    expect(g.reinforcementHeight).toBeCloseTo(2, 3);
    expect(Math.abs((g.reinforcementWidth ?? 0) - 2 * toeHalfWidth(2, 30))).toBeLessThan(0.05);
    expect(Math.abs(g.linearMisalignment ?? 1)).toBeLessThan(1e-3);
    expect(Math.abs(g.angularMisalignment ?? 1)).toBeLessThan(0.01);
  });

  it.each([
    [20, 0.6, 1.2],
    [45, 2.5, 3],
    [12, 3, 0.8],
  ])('flank %s°, radius %s mm, height %s mm', (flank, toeRadius, height) => {
    const { x, z } = weldProfile({ ...BASE, flank, toeRadius, height });
    const g = extractSlice(x, z);
    const [t1, t2] = g.toes ?? [];
    for (const t of [t1, t2]) {
      expect(Math.abs((t?.flankAngle ?? 0) - flank)).toBeLessThan(1);
      expect(Math.abs((t?.toeRadius ?? 0) - toeRadius) / toeRadius).toBeLessThan(0.1);
    }
    expect(Math.abs((g.reinforcementHeight ?? 0) - height)).toBeLessThan(0.01);
    expect(Math.abs((g.reinforcementWidth ?? 0) - 2 * toeHalfWidth(height, flank))).toBeLessThan(0.1);
  });

  it('reads a kink between the plates as angular misalignment, peaking towards the face', () => {
    for (const kink of [2, -1.5]) {
      const g = extractSlice(...xz(weldProfile({ ...BASE, kink })));
      expect(g.angularMisalignment).toBeCloseTo(kink, 2);
      // The generator seats the cap on the chord between the toes, level here: each plate's line is tilted by
      // half the kink from it, so the flank measured from the plate is θ − β/2.
      expect(g.toes?.[0].flankAngle).toBeCloseTo(30 - kink / 2, 1);
      expect(g.toes?.[1].flankAngle).toBeCloseTo(30 - kink / 2, 1);
    }
  });

  it('reads an offset of plate 2 as linear misalignment on the face surface, signed', () => {
    for (const offset of [0.8, -1.2]) {
      const g = extractSlice(...xz(weldProfile({ ...BASE, offset })));
      expect(g.linearMisalignment).toBeCloseTo(offset, 3);
      expect(Math.abs(g.angularMisalignment ?? 1)).toBeLessThan(0.01);
      // Measured from the chord joining the toes, the cap keeps its height.
      expect(Math.abs((g.reinforcementHeight ?? 0) - 2)).toBeLessThan(0.05);
    }
  });

  it('reads offset and kink together', () => {
    const g = extractSlice(...xz(weldProfile({ ...BASE, offset: 0.5, kink: 1 })));
    expect(g.linearMisalignment).toBeCloseTo(0.5, 2);
    expect(g.angularMisalignment).toBeCloseTo(1, 2);
  });

  it('finds an undercut beside the toe on plate 1 and none on plate 2', () => {
    const g = extractSlice(...xz(weldProfile({ ...BASE, undercut: { depth: 0.3, width: 0.8 } })));
    expect(g.toes?.[0].undercutDepth).toBeCloseTo(0.3, 2);
    expect(g.toes?.[1].undercutDepth).toBe(0);
  });

  it('finds the same undercut beside the toe on plate 2 when the profile is mirrored', () => {
    const { x, z } = weldProfile({ ...BASE, undercut: { depth: 0.3, width: 0.8 } });
    const n = x.length;
    const mx = Float64Array.from({ length: n }, (_, i) => -(x[n - 1 - i] as number));
    const mz = Float64Array.from({ length: n }, (_, i) => z[n - 1 - i] as number);
    const g = extractSlice(mx, mz);
    expect(g.toes?.[1].undercutDepth).toBeCloseTo(0.3, 2);
    expect(g.toes?.[0].undercutDepth).toBe(0);
  });

  it('passes a profile with 0.01 mm noise and flags one with 0.05 mm (quality below the threshold)', () => {
    const quiet = extractSlice(...xz(weldProfile({ ...BASE, noise: 0.01, seed: 3 })));
    expect(quiet.quality).toBeGreaterThanOrEqual(QUALITY_THRESHOLD);
    expect(quiet.flagged).toBe(false);
    expect(Math.abs((quiet.toes?.[0].flankAngle ?? 0) - 30)).toBeLessThan(3);
    const loud = extractSlice(...xz(weldProfile({ ...BASE, noise: 0.05, seed: 3 })));
    expect(loud.flagged).toBe(true);
    expect(loud.quality).toBeLessThan(QUALITY_THRESHOLD);
    expect(loud.problems.join(' ')).toMatch(/quality|fitted/);
  });

  it('flags a flat plate with no weld, and a profile too short to hold plates and a weld', () => {
    const x = Float64Array.from({ length: 400 }, (_, i) => i * 0.05);
    const flat = extractSlice(x, new Float64Array(400));
    expect(flat.flagged).toBe(true);
    expect(flat.problems[0]).toMatch(/no weld found/);
    const short = extractSlice(x.subarray(0, 10), new Float64Array(10));
    expect(short.problems[0]).toBe('only 10 points');
  });
});

describe('readings from a slice', () => {
  const ctx = { importId: 'p1', recordedAt: '2026-11-20T08:00:00Z' };

  it('a clean slice gives both toes with angle and radius, and the section values on plate 1 toe', () => {
    const r = sliceReadings(extractSlice(...xz(weldProfile(BASE))), 120, 7, ctx);
    expect(r.map((x) => [x.id, x.toe, Object.keys(x.values).sort()])).toEqual([
      [
        'p1-7a',
        { plate: 1, side: 'face' },
        [
          'angularMisalignment',
          'linearMisalignment',
          'reinforcementHeight',
          'reinforcementWidth',
          'toeAngle',
          'toeRadius',
          'undercutDepth',
        ],
      ],
      ['p1-7b', { plate: 2, side: 'face' }, ['toeAngle', 'toeRadius', 'undercutDepth']],
    ]);
    expect(r[0]?.misalignmentBasis).toBe('faceSurface');
  });

  it('a slice with 0.01 mm noise gives no toe radius (quality below 0.9), and a flagged slice no reading', () => {
    const noisy = extractSlice(...xz(weldProfile({ ...BASE, noise: 0.01, seed: 3 })));
    expect(noisy.flagged).toBe(false);
    const r = sliceReadings(noisy, 120, 7, ctx);
    expect(r).toHaveLength(2);
    expect(r.every((x) => x.values.toeRadius === undefined && x.values.toeAngle !== undefined)).toBe(true);
    expect(
      sliceReadings(extractSlice(...xz(weldProfile({ ...BASE, noise: 0.05, seed: 3 }))), 120, 7, ctx),
    ).toEqual([]);
  });
});

function xz(p: { x: Float64Array; z: Float64Array }): [Float64Array, Float64Array] {
  return [p.x, p.z];
}
