// Properties the km, Kt, FAT, life and sampling figures must keep for every input, checked on generated inputs.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  adequacyOf,
  anthesButtInside,
  anthesButtOutside,
  anthesCruciformInside,
  anthesCruciformOutside,
  effectiveFactors,
  effectiveMax,
  effectiveMaxOf,
  kiyakInside,
  kiyakOutside,
  lawrenceInside,
  lawrenceOutside,
  notchNumbers,
  rangeOf,
  assessSeam,
  confidenceHalfWidth,
  cyclesToFailure,
  gradeSeam,
  KM_COVERED,
  kmAngular,
  kmAxialFlat,
  kmAxialThicknessStep,
  kmEffective,
  straighteningBeta,
  straighteningFactor,
  toeNotchFactors,
  type NotchFormulaId,
  type Reading,
  type Seam,
} from '../../src/domain/index.js';
import { bendingOf } from '../../src/domain/assess/bending.js';
import { detailUse } from '../../src/domain/assess/fatigue-section.js';
import { setupOf } from '../../src/domain/assess/setup.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

const RUNS = { numRuns: 300 };
const RAD = Math.PI / 180;
const E = 210_000;

const pair = (arb: fc.Arbitrary<number>) =>
  fc.tuple(arb, arb).map(([a, b]) => (a <= b ? ([a, b] as const) : ([b, a] as const)));
const num = (min: number, max: number) => fc.double({ min, max, noNaN: true, noDefaultInfinity: true });

const seamArb: fc.Arbitrary<Seam> = fc
  .record({
    t1: num(3, 40),
    t2: num(3, 40),
    equal: fc.boolean(),
    l1: num(20, 2000),
    l2: num(20, 2000),
    arms: fc.boolean(),
    restraint: fc.constantFrom('clamped' as const, 'pinned' as const),
    sigma: num(1, 400),
    joint: fc.constantFrom('butt' as const, 'cruciform' as const, 'filletT' as const),
  })
  .map((s) =>
    buttSeam({
      joint: { type: s.joint, sides: 'two', setting: 'shopFlat' },
      plate1: { thickness: s.t1 },
      plate2: { thickness: s.equal ? s.t1 : s.t2 },
      fatigue: {
        loaded: true,
        restraint: s.restraint,
        membraneStress: s.sigma,
        ...(s.arms ? { freeLength1: s.l1, freeLength2: s.l2 } : {}),
      },
    }),
  );

const kmCalc = (seam: Seam, e: number, alpha: number): number => {
  const m = (v: number) => ({ readingId: 'r', position: 0, value: v, resolution: 0.1, resolutionBasis: '' });
  const b = bendingOf(setupOf(seam), { eHi: m(e), eLo: m(e), aHi: m(alpha), aLo: m(alpha) }).b;
  return 1 + Math.max(0, ...b);
};

describe('km (misalignment reference §2)', () => {
  it('km ≥ 1 under tension for every formula, and non-decreasing in |e| and |α|', () => {
    fc.assert(
      fc.property(
        pair(num(0, 10)),
        num(2, 40),
        num(2, 40),
        num(10, 1000),
        num(10, 1000),
        num(0.1, 400),
        (e, t, T, l1, l2, sigma) => {
          const [e1, e2] = e;
          const flat = (x: number) => kmAxialFlat(x, t, l1, l1, l2);
          const stepKm = (x: number) => kmAxialThicknessStep(x, t, T);
          expect(flat(e1)).toBeGreaterThanOrEqual(1);
          expect(flat(e1)).toBeLessThanOrEqual(flat(e2));
          expect(stepKm(e1)).toBeLessThanOrEqual(stepKm(e2));
          for (const ends of ['clamped', 'pinned'] as const) {
            const f = straighteningFactor(straighteningBeta(Math.min(l1, l2), t, sigma, E), ends, false);
            const ang = (a: number) => kmAngular(a * RAD, t, l1, l2, ends, f);
            expect(ang(e1)).toBeGreaterThanOrEqual(1);
            expect(ang(e1)).toBeLessThanOrEqual(ang(e2));
          }
        },
      ),
      RUNS,
    );
  });

  it('the seam’s km,calc is ≥ 1 and non-decreasing in |e| and |α| whatever the joint, thicknesses, arms and restraint', () => {
    fc.assert(
      fc.property(
        seamArb,
        pair(num(0, 6)),
        pair(num(0, 5)),
        fc.boolean(),
        fc.boolean(),
        (seam, e, a, eNeg, aNeg) => {
          const se = eNeg ? -1 : 1;
          const sa = aNeg ? -1 : 1;
          const k11 = kmCalc(seam, se * e[0], sa * a[0]);
          expect(k11).toBeGreaterThanOrEqual(1);
          // Relative rounding allowance: a step from 0 to 3e-12° in α was seen to lower km by 1e-12 at km ≈ 7.
          expect(k11).toBeLessThanOrEqual(kmCalc(seam, se * e[1], sa * a[0]) * (1 + 1e-9));
          expect(k11).toBeLessThanOrEqual(kmCalc(seam, se * e[0], sa * a[1]) * (1 + 1e-9));
        },
      ),
      RUNS,
    );
  });

  it('straightening never raises km in tension', () => {
    fc.assert(
      fc.property(
        num(0, 10),
        num(2, 40),
        num(10, 3000),
        num(10, 3000),
        num(1e-3, 600),
        (a, t, l1, l2, sigma) => {
          for (const ends of ['clamped', 'pinned'] as const) {
            const f = straighteningFactor(straighteningBeta(Math.min(l1, l2), t, sigma, E), ends, false);
            expect(f).toBeLessThanOrEqual(1);
            expect(kmAngular(a * RAD, t, l1, l2, ends, f)).toBeLessThanOrEqual(
              kmAngular(a * RAD, t, l1, l2, ends),
            );
          }
        },
      ),
      RUNS,
    );
  });
});

/** Each formula's own validity (notch reference §1–3), to generate inputs inside it. */
const inside: Record<
  NotchFormulaId,
  (g: { t: number; flank: number; rho: number; h: number; a: number }) => boolean
> = {
  anthesButtBending: (g) => g.t / g.rho <= 200 && g.flank >= 0 && g.flank <= 90,
  kiyakButtBending: (g) => g.flank >= 10 && g.flank <= 60 && g.rho / g.t >= 0.01 && g.rho / g.t <= 0.4,
  anthesCruciformBending: (g) =>
    g.flank >= 30 &&
    g.flank <= 60 &&
    g.t / g.rho >= 15 &&
    g.t / g.rho <= 100 &&
    g.a / g.t >= 0.3 &&
    g.a / g.t <= 1,
  lawrenceTension: (g) => g.flank >= 0 && g.flank < 89.999,
};

describe('Kt inside each formula’s validity (notch reference)', () => {
  const geometry = fc.record({
    joint: fc.constantFrom('butt' as const, 'fillet' as const),
    t: num(3, 40),
    flank: pair(num(0, 90)),
    rho: pair(num(0.02, 8)),
    hOverT: num(0.016, 0.37),
    aOverT: num(0.3, 1),
  });
  const values = (joint: 'butt' | 'fillet', t: number, flank: number, rho: number, h: number, a: number) => {
    const n = toeNotchFactors(
      joint,
      joint === 'butt' ? { t, flankDeg: flank, rho, h } : { t, flankDeg: flank, rho, a },
    );
    return new Map([...n.bending, ...n.tension].map((f) => [f.formula, f.value] as const));
  };

  it('non-increasing in the toe radius ρ', () => {
    fc.assert(
      fc.property(geometry, (g) => {
        const h = g.hOverT * g.t;
        const a = g.aOverT * g.t;
        const flank = g.flank[1];
        const sharp = values(g.joint, g.t, flank, g.rho[0], h, a);
        const blunt = values(g.joint, g.t, flank, g.rho[1], h, a);
        for (const [id, k] of sharp) {
          const ok = (rho: number) => inside[id]({ t: g.t, flank, rho, h, a });
          if (!ok(g.rho[0]) || !ok(g.rho[1])) continue;
          expect(k).toBeGreaterThanOrEqual((blunt.get(id) as number) * (1 - 1e-9));
        }
      }),
      RUNS,
    );
  });

  it('non-decreasing in the flank angle θ', () => {
    fc.assert(
      fc.property(geometry, (g) => {
        const h = g.hOverT * g.t;
        const a = g.aOverT * g.t;
        const rho = g.rho[0];
        const flat = values(g.joint, g.t, g.flank[0], rho, h, a);
        const steep = values(g.joint, g.t, g.flank[1], rho, h, a);
        for (const [id, k] of flat) {
          const ok = (flank: number) => inside[id]({ t: g.t, flank, rho, h, a });
          if (!ok(g.flank[0]) || !ok(g.flank[1])) continue;
          expect(k).toBeLessThanOrEqual((steep.get(id) as number) * (1 + 1e-9));
        }
      }),
      RUNS,
    );
  });
});

describe('FAT equivalent and life', () => {
  it('FAT equivalent is non-increasing in km', () => {
    const setup = setupOf(buttSeam({ fatigue: { loaded: true } }));
    fc.assert(
      fc.property(
        pair(num(1, 4)),
        fc.constantFrom('212' as const, '216' as const, '414' as const),
        (km, id) => {
          const covered = KM_COVERED.buttShopFlat.value;
          const lo = detailUse(setup, id, undefined, kmEffective(km[0], covered)).fatEquivalent as number;
          const hi = detailUse(setup, id, undefined, kmEffective(km[1], covered)).fatEquivalent as number;
          expect(hi).toBeLessThanOrEqual(lo);
        },
      ),
      RUNS,
    );
  });

  it('life is non-increasing in the stress range, across the knee too', () => {
    fc.assert(
      fc.property(pair(num(0.5, 500)), num(20, 250), (s, fat) => {
        expect(cyclesToFailure(s[1], fat)).toBeLessThanOrEqual(cyclesToFailure(s[0], fat));
      }),
      RUNS,
    );
  });
});

describe('sampling', () => {
  it('the 95 % interval narrows as positions are added with the same scatter', () => {
    fc.assert(
      fc.property(
        num(1e-3, 50),
        fc.integer({ min: 2, max: 500 }),
        fc.integer({ min: 1, max: 500 }),
        (sd, n, k) => {
          expect(confidenceHalfWidth(sd, n + k)).toBeLessThan(confidenceHalfWidth(sd, n));
        },
      ),
      RUNS,
    );
  });

  it('measuring the same pattern of values again narrows the interval of a parameter', () => {
    fc.assert(
      fc.property(fc.array(num(100, 180), { minLength: 2, maxLength: 30 }), (xs) => {
        fc.pre(Math.max(...xs) - Math.min(...xs) > 1e-6);
        const points = (vs: number[]) =>
          vs.map((value, i) => ({
            readingId: `r${i}`,
            position: 10 * i,
            value,
            margin: null,
            resolution: 1,
          }));
        const args = {
          label: 'x',
          unit: 'deg' as const,
          seamLength: 1e5,
          circumferential: false,
          defaultResolution: 1,
          requiredLevel: null,
        };
        const once = adequacyOf({ ...args, points: points(xs) });
        const twice = adequacyOf({ ...args, points: points([...xs, ...xs]) });
        expect(twice.ci95?.halfWidth).toBeLessThan(once.ci95?.halfWidth as number);
      }),
      { numRuns: 150 },
    );
  });
});

describe('toe ranking', () => {
  it('a seam with a large angular misalignment ranks the toes on its tension side first', () => {
    const toeArb = fc.record({ angle: num(130, 170), radius: num(0.5, 3) });
    fc.assert(
      fc.property(
        num(8, 20),
        num(150, 400),
        num(3, 8),
        fc.boolean(),
        num(-0.02, 0.02),
        fc.tuple(toeArb, toeArb, toeArb, toeArb),
        (t, l, alpha, negative, eOverT, geo) => {
          const seam = buttSeam({
            plate1: { thickness: t },
            plate2: { thickness: t },
            fatigue: { loaded: true, freeLength1: l, freeLength2: l },
          });
          const toes: Reading[] = (
            [
              [1, 'face'],
              [2, 'face'],
              [1, 'root'],
              [2, 'root'],
            ] as const
          ).map(([plate, side], i) => {
            const g = geo[i] as { angle: number; radius: number };
            return reading({ toeAngle: g.angle, toeRadius: g.radius }, { toe: { plate, side } });
          });
          const a = negative ? -alpha : alpha;
          const file = seamFile(seam, [
            ...toes,
            reading({ angularMisalignment: a, linearMisalignment: eOverT * t }),
          ]);
          const ranked = assessSeam(file, gradeSeam(file), { sensitivity: false }).toes.toes;
          const tensionSide = a > 0 ? 'root' : 'face';
          expect(ranked.slice(0, 2).map((x) => x.toe.side)).toEqual([tensionSide, tensionSide]);
        },
      ),
      { numRuns: 100 },
    );
  });
});

describe('fast paths agree with the described results', () => {
  const g = fc.record({
    joint: fc.constantFrom('butt' as const, 'fillet' as const),
    t: num(0.5, 60),
    flank: num(-5, 95),
    rho: num(0.005, 20),
    h: fc.option(num(0, 15), { nil: undefined }),
    a: fc.option(num(0.5, 40), { nil: undefined }),
    b: num(-2, 3),
  });

  it('each formula’s validity check without messages says the same as its list of messages', () => {
    fc.assert(
      fc.property(g, num(0, 2), (x, s) => {
        const ratio = x.t / x.rho;
        expect(anthesButtInside(ratio, x.flank)).toBe(anthesButtOutside(ratio, x.flank).length === 0);
        const aOverT = (x.a ?? 5) / x.t;
        for (const sOverT of [0, s]) {
          expect(anthesCruciformInside(ratio, x.flank, aOverT, sOverT)).toBe(
            anthesCruciformOutside(ratio, x.flank, aOverT, sOverT).length === 0,
          );
        }
        const h = x.h ?? 1;
        expect(kiyakInside(x.flank, h, x.t, x.rho)).toBe(kiyakOutside(x.flank, h, x.t, x.rho).length === 0);
        expect(lawrenceInside(x.flank, x.t, x.rho)).toBe(lawrenceOutside(x.flank, x.t, x.rho).length === 0);
      }),
      RUNS,
    );
  });

  it('the allocation-free toe score equals the top of the described effective-factor range', () => {
    fc.assert(
      fc.property(g, (x) => {
        fc.pre(x.flank >= 0 && x.flank < 90);
        const geometry = {
          t: x.t,
          flankDeg: x.flank,
          rho: x.rho,
          ...(x.h === undefined ? {} : { h: x.h }),
          ...(x.a === undefined ? {} : { a: x.a }),
        };
        const described = toeNotchFactors(x.joint, geometry);
        const eff = effectiveFactors(described, x.b);
        const top = rangeOf(eff.values, eff.inRange)?.max;
        expect(effectiveMaxOf(x.joint, geometry, x.b)).toBe(top);
        expect(effectiveMax(notchNumbers(x.joint, geometry), x.b)).toBe(top);
      }),
      RUNS,
    );
  });
});
