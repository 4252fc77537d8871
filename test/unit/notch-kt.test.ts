// Toe stress concentration formulas against the check values of the notch reference
// (../shared/reference/notch-factors.md, §2 and §5: pure-formula values to 1e-4, and the unit traps).
import { describe, expect, it } from 'vitest';
import type { FormulaValue } from '../../src/domain/index.js';
import {
  anthesButtBending,
  anthesButtOutside,
  anthesCruciformBending,
  anthesCruciformOutside,
  effectiveFactors,
  envelope,
  kiyakButtBending,
  kiyakOutside,
  LAWRENCE_ALPHA,
  lawrenceTension,
  maxUpTo,
  rangeOf,
  toeNotchFactors,
} from '../../src/domain/index.js';

const RAD = Math.PI / 180;

/** The value of a formula the test expects to be there. */
function present(x: FormulaValue | undefined): FormulaValue {
  if (!x) throw new Error('expected formula value is missing');
  return x;
}

describe('check values (notch reference §5)', () => {
  it('Anthes butt bending, t/ρ = 10, φ = 45° → 1.8431', () => {
    expect(anthesButtBending(10, 45)).toBeCloseTo(1.8431, 4);
  });
  it('Anthes cruciform bending, s = 0, t/ρ = 10, φ = 45° → 1.9964', () => {
    expect(anthesCruciformBending(10, 45, 0.5, 0)).toBeCloseTo(1.9964, 4);
    // With s = 0 the throat has no effect (§1b).
    expect(anthesCruciformBending(10, 45, 0.9, 0)).toBe(anthesCruciformBending(10, 45, 0.5, 0));
  });
  it('Kiyak butt bending, α = 45°, h = 2, T = 10, ρ = 1 → 1.8382', () => {
    expect(kiyakButtBending(45, 2, 10, 1)).toBeCloseTo(1.8382, 4);
  });
  it('Lawrence, α_L = 0.27, θ = 45°, t = 10, ρ = 1 → 1.8538, and the rest of the §2 table', () => {
    expect(lawrenceTension(0.27, 45, 10, 1)).toBeCloseTo(1.8538, 4);
    expect(lawrenceTension(0.27, 30, 10, 1)).toBeCloseTo(1.7443, 4);
    expect(lawrenceTension(0.27, 45, 20, 0.5)).toBeCloseTo(2.7076, 4);
    expect(lawrenceTension(0.35, 45, 10, 1)).toBeCloseTo(2.1068, 4);
    expect(lawrenceTension(0.35, 60, 10, 0.25)).toBeCloseTo(3.5394, 4);
  });
  it('α_L by joint: butt 0.27, T or transverse fillet 0.35 (notch reference §2, recalled)', () => {
    expect(LAWRENCE_ALPHA).toEqual({ butt: 0.27, fillet: 0.35 });
  });
  it('effective notch read-out: Anthes butt at ρ = 1 mm, φ = 45°: 1.8431 at t = 10 and 2.3845 at t = 25 (§6)', () => {
    expect(anthesButtBending(10 / 1, 45)).toBeCloseTo(1.8431, 4);
    expect(anthesButtBending(25 / 1, 45)).toBeCloseTo(2.3845, 4);
  });
});

describe('unit traps (notch reference §5): the wrong units give plausible but wrong values', () => {
  it('Anthes: l3 in radians would give 1.0645 at t/ρ = 10, φ = 45°; the engine gives 1.8431', () => {
    const s = Math.sin(45 * RAD);
    const poly = 0.181 + 1.207 * s - 1.737 * s * s + 0.689 * s ** 3;
    const wrong =
      (1 - 0.156 * 10 ** 0.207) * (1 + poly * 10 ** (0.2919 + 0.3491 * Math.sin(45 * RAD + 3.283)));
    expect(wrong).toBeCloseTo(1.0645, 4);
    expect(anthesButtBending(10, 45)).not.toBeCloseTo(wrong, 2);
  });
  it('Kiyak: α in degrees would give about 1.0; the engine (radians) gives 1.8382', () => {
    const a = 45;
    const wrong =
      1 +
      1.1399 *
        0.2 ** (0.2062 * a) *
        a ** 1.067 *
        Math.exp(-1.6775 * a) *
        0.1 ** (-0.295 * a) *
        0.121 ** -0.4711;
    expect(wrong).toBeCloseTo(1, 1);
    expect(kiyakButtBending(45, 2, 10, 1)).toBeCloseTo(1.8382, 4);
  });
});

describe('validity ranges (notch reference §1–3)', () => {
  it('Anthes butt: 0 < t/ρ ≤ 200, 0° ≤ φ ≤ 90°', () => {
    expect(anthesButtOutside(200, 90)).toEqual([]);
    expect(anthesButtOutside(201, 45)).toHaveLength(1);
    expect(anthesButtOutside(10, 91)[0]).toContain('flank angle');
  });
  it('Anthes cruciform: 15 ≤ t/ρ ≤ 100, 30° ≤ φ ≤ 60°, 0.3 ≤ a/t ≤ 1', () => {
    expect(anthesCruciformOutside(15, 30, 0.3, 0)).toEqual([]);
    expect(anthesCruciformOutside(10, 45, 0.5, 0)[0]).toContain('t/ρ = 10');
    expect(anthesCruciformOutside(50, 65, 0.2, 0)).toHaveLength(2);
    // s/t ≠ 0 needs 2ρ/t ≤ s/t ≤ 1.
    expect(anthesCruciformOutside(20, 45, 0.5, 0.05)).toHaveLength(1);
    expect(anthesCruciformOutside(20, 45, 0.5, 0.2)).toEqual([]);
  });
  it('Kiyak: 10° ≤ α ≤ 60°, 0.01 ≤ ρ/T ≤ 0.4', () => {
    expect(kiyakOutside(10, 1, 10, 0.1)).toEqual([]);
    expect(kiyakOutside(5, 1, 10, 1)[0]).toContain('flank angle');
    expect(kiyakOutside(45, 1, 10, 5)[0]).toContain('ρ/T');
  });
});

describe('per-toe factors', () => {
  it('a butt toe with h gets Anthes and Kiyak in bending and Lawrence (0.27) in tension', () => {
    const n = toeNotchFactors('butt', { t: 10, flankDeg: 30, rho: 1, h: 2 });
    expect(n.bending.map((b) => b.formula)).toEqual(['anthesButtBending', 'kiyakButtBending']);
    expect(n.bending[0]?.formulaValue).toBe(anthesButtBending(10, 30));
    expect(n.bending[1]?.formulaValue).toBe(kiyakButtBending(30, 2, 10, 1));
    expect(n.tension[0]?.value).toBe(lawrenceTension(0.27, 30, 10, 1));
    expect(n.tension[0]?.confidence).toBe('recalled, unverified');
  });

  it('without the reinforcement height Kiyak is listed as unavailable, not guessed', () => {
    const n = toeNotchFactors('butt', { t: 10, flankDeg: 30, rho: 1 });
    expect(n.bending.map((b) => b.formula)).toEqual(['anthesButtBending']);
    expect(n.unavailable[0]?.formula).toBe('kiyakButtBending');
  });

  it('a fillet toe gets the cruciform formula with s = 0 and Lawrence with α_L = 0.35, and flags a concave face', () => {
    const n = toeNotchFactors('fillet', { t: 20, flankDeg: 45, rho: 1, a: 8, convexity: -0.2 });
    expect(n.bending[0]?.formula).toBe('anthesCruciformBending');
    expect(n.bending[0]?.formulaValue).toBe(anthesCruciformBending(20, 45, 0.4, 0));
    expect(n.bending[0]?.notes.join(' ')).toContain('concave');
    expect(n.tension[0]?.value).toBe(lawrenceTension(0.35, 45, 20, 1));
  });

  it('an input outside a formula’s range is flagged, and the range leaves that formula out (no silent extrapolation)', () => {
    const n = toeNotchFactors('butt', { t: 10, flankDeg: 5, rho: 1, h: 2 });
    const kiyak = n.bending.find((b) => b.formula === 'kiyakButtBending');
    expect(kiyak?.inRange).toBe(false);
    expect(kiyak?.outside[0]).toContain('flank angle α (°) = 5');
    const eff = effectiveFactors(n, 0.3);
    const r = rangeOf(eff.values, eff.inRange);
    const anthes = present(n.tension[0]).value + present(n.bending[0]).value * 0.3;
    expect(r).toEqual({ min: anthes, max: anthes, extrapolated: false });
  });

  it('when no formula is in range the range uses them all and says it is extrapolated', () => {
    const n = toeNotchFactors('fillet', { t: 10, flankDeg: 70, rho: 1, a: 5 });
    const eff = effectiveFactors(n, 0);
    expect(rangeOf(eff.values, eff.inRange)?.extrapolated).toBe(true);
  });

  it('Kt,eff = Kt,m + Kt,b·b: secondary bending in tension raises it, in compression lowers it (notch reference §0)', () => {
    const n = toeNotchFactors('butt', { t: 10, flankDeg: 40, rho: 1, h: 2 });
    const km = present(n.tension[0]).value;
    const kb = n.bending.map((b) => b.value);
    expect(effectiveFactors(n, 0.2).values).toEqual(kb.map((k) => km + 0.2 * k));
    expect(effectiveFactors(n, -0.2).values).toEqual(kb.map((k) => km - 0.2 * k));
  });
});

describe('monotone envelope of a fit that turns over (derived)', () => {
  it('Kiyak at h/T = 0.1, ρ/T = 0.1 falls past θ ≈ 41.5°; the value used is the peak, never below the formula', () => {
    const peak = maxUpTo((th) => kiyakButtBending(th, 1, 10, 1), 10, 55);
    expect(kiyakButtBending(55, 1, 10, 1)).toBeLessThan(peak.value);
    expect(peak.at).toBeGreaterThan(40);
    expect(peak.at).toBeLessThan(43);
    const n = toeNotchFactors('butt', { t: 10, flankDeg: 55, rho: 1, h: 1 });
    const k = present(n.bending.find((b) => b.formula === 'kiyakButtBending'));
    expect(k.formulaValue).toBe(kiyakButtBending(55, 1, 10, 1));
    expect(k.value).toBeCloseTo(peak.value, 10);
    expect(k.notes.join(' ')).toContain('falls again');
  });

  it('the envelope equals a brute-force maximum over a fine grid of the rectangle', () => {
    const f = (r: number, th: number): number => anthesButtBending(r, th);
    for (const [ratio, flank] of [
      [0.8, 70],
      [3, 60],
      [150, 1.5],
      [8, 40],
    ] as const) {
      let brute = -Infinity;
      for (let i = 0; i <= 400; i++) {
        for (let j = 0; j <= 400; j++)
          brute = Math.max(brute, f(1e-3 + ((ratio - 1e-3) * i) / 400, (flank * j) / 400));
      }
      const env = envelope(f, 1e-3, ratio, 0, flank).value;
      expect(env).toBeGreaterThanOrEqual(brute - 1e-9);
      expect(env).toBeLessThan(brute + 1e-4);
    }
  });
});
