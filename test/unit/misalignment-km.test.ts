// km formulas against the check values of the misalignment reference (../shared/reference/misalignment-and-fatigue.md),
// which computed them from the recalled IIW / BS 7910 / DNV forms; each check names where its number comes from.
import { describe, expect, it } from 'vitest';
import {
  armShare,
  combineKm,
  dnvButtScf,
  dnvThicknessTransitionScf,
  KM_COVERED,
  KM_COVERED_LOCAL,
  kmAngular,
  kmAngularLongArms,
  kmAxialCruciform,
  kmAxialFlat,
  kmAxialThicknessStep,
  kmEffective,
  midPlaneOffset,
  straighteningBeta,
  straighteningFactor,
  tanhOverX,
  tanOverX,
} from '../../src/domain/index.js';

const RAD = Math.PI / 180;

describe('linear misalignment', () => {
  it('A1: equal t, remote (λ = 6, equal arms), e = 1, t = 10 → km = 1.3000 (reference §8.3 A1)', () => {
    expect(kmAxialFlat(1, 10, 100, 100, 100)).toBeCloseTo(1.3, 10);
  });

  it('B2: the thickness-ratio form with t1 = t2 reduces to A1 → 1.3000 (reference §8.3 B2)', () => {
    expect(kmAxialThicknessStep(1, 10, 10)).toBeCloseTo(1.3, 10);
  });

  it('pinned unequal arms l1 = 100, l2 = 300, e/t = 0.1: 1.15 and 1.45 (reference §8.2)', () => {
    expect(kmAxialFlat(1, 10, 100, 100, 300)).toBeCloseTo(1.15, 10);
    expect(kmAxialFlat(1, 10, 300, 100, 300)).toBeCloseTo(1.45, 10);
  });

  it('clamped ends never take a side below the equal-arm share ½ (reference §2.1 caveat, beam-column check)', () => {
    expect(armShare(100, 100, 300, 'clamped')).toBe(0.5);
    expect(armShare(300, 100, 300, 'clamped')).toBe(0.75);
    expect(armShare(100, 100, 300, 'pinned')).toBe(0.25);
  });

  it('different thickness, n = 1.5: t1 = 10, t2 = 20, e = 1 → 1 + 0.6·10^1.5/(10^1.5 + 20^1.5) = 1.1567 (derived from §2.2)', () => {
    expect(kmAxialThicknessStep(1, 10, 20)).toBeCloseTo(1 + 0.6 * (31.6228 / (31.6228 + 89.4427)), 4);
    expect(kmAxialThicknessStep(1, 10, 20)).toBeCloseTo(1.1567, 4);
    // The thicker plate takes the larger moment share but a smaller stress: 1 + 0.3·20^1.5/(…) = 1.2216 (derived).
    expect(kmAxialThicknessStep(1, 20, 10)).toBeCloseTo(1.2216, 4);
  });

  it('a gauge reading the face-surface step of plates 10 and 12 mm: 2.0 mm read is a 1.0 mm mid-plane offset (§2.2 note, derived)', () => {
    expect(midPlaneOffset(2, 'faceSurface', 10, 12)).toBeCloseTo(1, 12);
    expect(midPlaneOffset(0, 'rootSurface', 10, 12)).toBeCloseTo(1, 12);
  });

  it('cruciform toe crack, λ = 6 (reference §2.3, recalled, low confidence): e = 1, t = 10, equal arms → 1.3000; l1 = 100, l2 = 300 → 1.15 / 1.45', () => {
    expect(kmAxialCruciform(1, 10, 100, 100, 100)).toBeCloseTo(1.3, 10);
    expect(kmAxialCruciform(1, 10, 100, 100, 300)).toBeCloseTo(1.15, 10);
    expect(kmAxialCruciform(-1, 10, 300, 100, 300)).toBeCloseTo(1.45, 10);
  });

  it('the sign of e does not change km (|e| enters)', () => {
    expect(kmAxialFlat(-1, 10, 1, 1, 1)).toBe(kmAxialFlat(1, 10, 1, 1, 1));
  });
});

describe('angular misalignment', () => {
  it('C1: clamped, no straightening, α = 1°, l = 100, t = 10 → y = 0.8727 mm, km = 1.2618 (reference §8.3 C1)', () => {
    const alpha = 1 * RAD;
    expect((alpha * 100) / 2).toBeCloseTo(0.8727, 4);
    expect(kmAngular(alpha, 10, 100, 100, 'clamped')).toBeCloseTo(1.2618, 4);
  });

  it('pinned, no straightening, the same case: 1 + 3·α·l/t = 1.5236 (reference §2.4, derived)', () => {
    expect(kmAngular(1 * RAD, 10, 100, 100, 'pinned')).toBeCloseTo(1.5236, 4);
  });

  it('β = (2l/t)·√(3σm/E): l = 100, t = 10, σm = 100, E = 210 000 → 0.7559 (reference §0, derived)', () => {
    expect(straighteningBeta(100, 10, 100, 210_000)).toBeCloseTo(20 * Math.sqrt(300 / 210_000), 12);
    expect(straighteningBeta(100, 10, 100, 210_000)).toBeCloseTo(0.7559, 4);
  });

  it('straightening factors: tanh(β/2)/(β/2) clamped and tanh(β)/β pinned; tan forms in compression (§2.4)', () => {
    expect(straighteningFactor(2, 'clamped', false)).toBeCloseTo(Math.tanh(1), 12);
    expect(straighteningFactor(2, 'pinned', false)).toBeCloseTo(Math.tanh(2) / 2, 12);
    expect(straighteningFactor(1, 'clamped', true)).toBeCloseTo(Math.tan(0.5) / 0.5, 12);
    expect(straighteningFactor(1, 'pinned', true)).toBeCloseTo(Math.tan(1), 12);
  });

  it('near β = 0 the series is used: tanh(x)/x ≈ 1 − x²/3 (reference §8.3 numerical notes)', () => {
    expect(tanhOverX(5e-5)).toBeCloseTo(1 - 5e-5 ** 2 / 3, 15);
    expect(tanhOverX(0)).toBe(1);
    expect(tanOverX(0)).toBe(1);
  });

  it('the compression amplification is unbounded at the arm’s buckling load (tan(x) at x = π/2)', () => {
    expect(tanOverX(Math.PI / 2)).toBe(Infinity);
  });

  it('unequal arms without straightening: km = 1 + λ·α·l1·l2/(t(l1 + l2)) reduces to the equal-arm form (§2.4)', () => {
    expect(kmAngular(RAD, 10, 150, 150, 'pinned')).toBeCloseTo(1 + (3 * RAD * 150) / 10, 12);
    expect(kmAngular(RAD, 10, 100, 300, 'clamped')).toBeCloseTo(1 + (3 * RAD * 100 * 300) / (10 * 400), 12);
  });

  it('long-arm limit: 1 + 1.5·α/√(3σm/E), α = 1°, σm = 100 MPa → 1.6930 (derived from the tanh forms)', () => {
    expect(kmAngularLongArms(RAD, 100, 210_000)).toBeCloseTo(1 + (1.5 * RAD) / Math.sqrt(300 / 210_000), 12);
    expect(kmAngularLongArms(RAD, 100, 210_000)).toBeCloseTo(1.693, 3);
  });
});

describe('combination, km already covered, DNV', () => {
  it('several misalignments at one toe: km = 1 + Σ(km,i − 1) (reference §2.6)', () => {
    expect(combineKm([1.3, 1.2618])).toBeCloseTo(1.5618, 10);
  });

  it('km covered by nominal FAT classes: 1.15 / 1.30 / 1.45 / 1.25, and 1.05 for local methods (reference §1.1 table, recalled)', () => {
    expect(KM_COVERED.buttShopFlat.value).toBe(1.15);
    expect(KM_COVERED.buttOther.value).toBe(1.3);
    expect(KM_COVERED.cruciform.value).toBe(1.45);
    expect(KM_COVERED.filletOneSurface.value).toBe(1.25);
    expect(KM_COVERED_LOCAL).toBe(1.05);
  });

  it('the table is consistent with e ≈ 0.05t, 0.10t and 0.15t in 1 + 3e/t (reference §7, derived)', () => {
    expect(kmAxialFlat(0.05, 1, 1, 1, 1)).toBeCloseTo(KM_COVERED.buttShopFlat.value, 12);
    expect(kmAxialFlat(0.1, 1, 1, 1, 1)).toBeCloseTo(KM_COVERED.buttOther.value, 12);
    expect(kmAxialFlat(0.15, 1, 1, 1, 1)).toBeCloseTo(KM_COVERED.cruciform.value, 12);
  });

  it('km,eff = km,calc / km,covered, never below 1 (reference §1.1)', () => {
    expect(kmEffective(1.5, 1.3)).toBeCloseTo(1.5 / 1.3, 12);
    expect(kmEffective(1.1, 1.3)).toBe(1);
  });

  it('DNV butt weld: 1 + 3(δm − 0.1t)/t gives 1.15 at δm = 0.15t (reference §4, derived)', () => {
    expect(dnvButtScf(1.5, 10)).toBeCloseTo(1.15, 12);
    expect(dnvButtScf(0.5, 10)).toBeLessThan(1); // the engine floors it at 1 where it shows it
  });

  it('DNV thickness transition reduces to the equal-t form when T = t (derived)', () => {
    expect(dnvThicknessTransitionScf(2, 10, 10)).toBeCloseTo(dnvButtScf(2, 10), 12);
  });
});
