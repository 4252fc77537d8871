// The angular and axial km formulas against an independent finite-difference beam-column solved here
// (test/support/beam-column.ts), for both end conditions. Agreement to 4 significant figures is asked of the
// secondary-bending part km − 1 (stricter than of km itself).
import { describe, expect, it } from 'vitest';
import {
  kmAngular,
  kmAngularLongArms,
  kmAxialFlat,
  straighteningBeta,
  straighteningFactor,
  type Seam,
} from '../../src/domain/index.js';
import { deltaAxial } from '../../src/domain/assess/bending.js';
import { setupOf } from '../../src/domain/assess/setup.js';
import { buttSeam } from '../support/seam-builder.js';
import { jointBendingRatio, kink, step } from '../support/beam-column.js';

const RAD = Math.PI / 180;
const E = 210_000;
const t = 10;

const butt = (fatigue: Partial<NonNullable<Seam['fatigue']>>): Seam =>
  buttSeam({ fatigue: { loaded: true, ...fatigue } });

/** Relative difference of two secondary-bending ratios. */
const rel = (a: number, b: number): number => Math.abs(a - b) / Math.abs(b);
const SIG4 = 5e-5;

describe('angular misalignment: tanh closed forms against the finite-difference beam-column (derived, §8.1 of the misalignment reference)', () => {
  const l = 100;
  const alpha = 1 * RAD;
  for (const ends of ['clamped', 'pinned'] as const) {
    for (const sigma of [10, 100, 300]) {
      it(`${ends} ends, σm = ${sigma} MPa, α = 1°, l = ${l} mm, t = ${t} mm: km − 1 agrees to 4 significant figures`, () => {
        const closed =
          kmAngular(
            alpha,
            t,
            l,
            l,
            ends,
            straighteningFactor(straighteningBeta(l, t, sigma, E), ends, false),
          ) - 1;
        const fd = jointBendingRatio({ t, E, sigma, l1: l, l2: l, ends, w0: kink(alpha, l, l) });
        expect(fd.plate1).toBeCloseTo(fd.plate2, 12);
        expect(rel(closed, fd.plate1)).toBeLessThan(SIG4);
        expect(closed.toPrecision(4)).toBe(fd.plate1.toPrecision(4));
      });
    }
    it(`${ends} ends, α = 2°, l = 400 mm, t = 12 mm, σm = 150 MPa (a long arm, β ≈ ${straighteningBeta(400, 12, 150, E).toFixed(2)})`, () => {
      const closed =
        kmAngular(
          2 * RAD,
          12,
          400,
          400,
          ends,
          straighteningFactor(straighteningBeta(400, 12, 150, E), ends, false),
        ) - 1;
      const fd = jointBendingRatio({
        t: 12,
        E,
        sigma: 150,
        l1: 400,
        l2: 400,
        ends,
        w0: kink(2 * RAD, 400, 400),
      });
      expect(rel(closed, fd.plate1)).toBeLessThan(SIG4);
    });
    for (const sigma of [-10, -40]) {
      it(`${ends} ends in compression, σm = ${sigma} MPa: the tan(x)/x amplification agrees (derived, §2.4)`, () => {
        const closed =
          kmAngular(
            alpha,
            t,
            l,
            l,
            ends,
            straighteningFactor(straighteningBeta(l, t, sigma, E), ends, true),
          ) - 1;
        const fd = jointBendingRatio({ t, E, sigma, l1: l, l2: l, ends, w0: kink(alpha, l, l) });
        expect(rel(closed, fd.plate1)).toBeLessThan(SIG4);
        // Amplified: more than the kink's km without any axial-force effect.
        expect(closed).toBeGreaterThan(kmAngular(alpha, t, l, l, ends) - 1);
      });
    }
  }

  it('without straightening (σm → 0) the FD solution gives 1 + 1.5·α·l/t clamped and 1 + 3·α·l/t pinned (§2.4)', () => {
    for (const ends of ['clamped', 'pinned'] as const) {
      const fd = jointBendingRatio({ t, E, sigma: 1e-6, l1: l, l2: l, ends, w0: kink(alpha, l, l) });
      const expected = (ends === 'clamped' ? 1.5 : 3) * ((alpha * l) / t);
      expect(rel(expected, fd.plate1)).toBeLessThan(SIG4);
    }
  });

  it('with very long arms both end conditions tend to the long-arm limit 1.5·α/√(3σm/E) (derived)', () => {
    const limit = kmAngularLongArms(alpha, 100, E) - 1;
    for (const ends of ['clamped', 'pinned'] as const) {
      const fd = jointBendingRatio(
        { t, E, sigma: 100, l1: 4000, l2: 4000, ends, w0: kink(alpha, 4000, 4000) },
        16000,
      );
      expect(fd.plate1).toBeLessThan(limit);
      expect(rel(limit, fd.plate1)).toBeLessThan(0.02);
    }
  });

  it('unequal arms: the engine’s form (exact y, straightening from the shorter arm) is never below the FD solution (derived)', () => {
    for (const ends of ['clamped', 'pinned'] as const) {
      for (const [l1, l2] of [
        [100, 300],
        [50, 400],
      ] as const) {
        for (const sigma of [20, 200]) {
          const engine =
            kmAngular(
              alpha,
              t,
              l1,
              l2,
              ends,
              straighteningFactor(straighteningBeta(Math.min(l1, l2), t, sigma, E), ends, false),
            ) - 1;
          const fd = jointBendingRatio({ t, E, sigma, l1, l2, ends, w0: kink(alpha, l1, l2) }, 9000);
          expect(engine).toBeGreaterThanOrEqual(Math.max(fd.plate1, fd.plate2) * (1 - 1e-6));
        }
      }
    }
  });
});

describe('linear misalignment against the FD beam-column (derived, §8.2 of the misalignment reference)', () => {
  const e = 1;
  it('pinned ends, σm → 0: 1 + 6·(e/t)·l_i/(l1 + l2) exactly, for equal and unequal arms', () => {
    for (const [l1, l2] of [
      [200, 200],
      [100, 300],
    ] as const) {
      const fd = jointBendingRatio({ t, E, sigma: 1e-6, l1, l2, ends: 'pinned', w0: step(e, l1, l2) });
      // Plate 1's face (top) side is in tension for e > 0: a negative ratio in the solver's root-positive sign.
      expect(rel(kmAxialFlat(e, t, l1, l1, l2) - 1, -fd.plate1)).toBeLessThan(SIG4);
      expect(rel(kmAxialFlat(e, t, l2, l1, l2) - 1, fd.plate2)).toBeLessThan(SIG4);
    }
  });

  it('clamped ends, equal arms: still 1 + 3e/t; clamping does not lower it', () => {
    const fd = jointBendingRatio({
      t,
      E,
      sigma: 1e-6,
      l1: 200,
      l2: 200,
      ends: 'clamped',
      w0: step(e, 200, 200),
    });
    expect(rel(0.3, -fd.plate1)).toBeLessThan(SIG4);
  });

  it('clamped ends, l1 = 100, l2 = 300, e/t = 0.1: 1.28 and 1.32 as the reference reports (§8.2), and the engine is not below either', () => {
    const fd = jointBendingRatio({
      t,
      E,
      sigma: 1e-6,
      l1: 100,
      l2: 300,
      ends: 'clamped',
      w0: step(e, 100, 300),
    });
    expect((1 - fd.plate1).toFixed(2)).toBe('1.28');
    expect((1 + fd.plate2).toFixed(2)).toBe('1.32');
    const engine = (li: number): number =>
      deltaAxial(
        setupOf(butt({ restraint: 'clamped', freeLength1: 100, freeLength2: 300 })),
        li === 100 ? 1 : 2,
        e,
      );
    expect(engine(100)).toBeGreaterThanOrEqual(-fd.plate1);
    expect(engine(300)).toBeGreaterThanOrEqual(fd.plate2);
  });

  it('pinned ends, equal arms, under tension: the joint does not move (antisymmetry), so 1 + 3e/t holds at any σm', () => {
    for (const sigma of [50, 200]) {
      const fd = jointBendingRatio({ t, E, sigma, l1: 200, l2: 200, ends: 'pinned', w0: step(e, 200, 200) });
      expect(rel(0.3, -fd.plate1)).toBeLessThan(SIG4);
      expect(rel(0.3, fd.plate2)).toBeLessThan(SIG4);
    }
  });
});
