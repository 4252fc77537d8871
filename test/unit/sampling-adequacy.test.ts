// Sampling statistics: Student t quantiles against the published table, the interval of the mean, the positions
// needed, the predictive risk for unmeasured positions, and which readings feed them.
import { describe, expect, it } from 'vitest';
import {
  adequacyOf,
  assessSeam,
  atLeastOne,
  confidenceHalfWidth,
  gradeSeam,
  LARGE_NU,
  meanAndSd,
  normalCdf,
  normalQuantile,
  pitchOf,
  positionsForHalfWidth,
  predictiveBelow,
  runningMeans,
  settling,
  studentTCdf,
  studentTQuantile,
  studentTQuantileLargeNu,
  type SamplePoint,
} from '../../src/domain/index.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

describe('Student t (two-sided 95 % values of the published t table, common practice)', () => {
  it.each([
    [1, 12.706],
    [2, 4.303],
    [5, 2.571],
    [9, 2.262],
    [10, 2.228],
    [16, 2.12],
    [17, 2.11],
    [30, 2.042],
    [120, 1.98],
  ])('t(0.975, ν = %i) = %f', (nu, t) => {
    expect(studentTQuantile(0.975, nu)).toBeCloseTo(t, 3);
  });
  it('tends to the normal 1.960 for many degrees of freedom (common practice)', () => {
    expect(studentTQuantile(0.975, 100_000)).toBeCloseTo(1.96, 3);
  });
  it('the distribution function inverts the quantile and is symmetric', () => {
    expect(studentTCdf(studentTQuantile(0.975, 7), 7)).toBeCloseTo(0.975, 12);
    expect(studentTCdf(0, 4)).toBe(0.5);
    expect(studentTCdf(-1.3, 6)).toBeCloseTo(1 - studentTCdf(1.3, 6), 14);
    expect(studentTQuantile(0.025, 9)).toBeCloseTo(-studentTQuantile(0.975, 9), 12);
  });
  it('the normal quantile: z(0.975) = 1.959964 (common practice); the large-ν expansion inverts the exact t distribution', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
    expect(normalCdf(1.959964)).toBeCloseTo(0.975, 6);
    for (const nu of [LARGE_NU, 250, 5000]) {
      expect(studentTCdf(studentTQuantileLargeNu(0.975, nu), nu)).toBeCloseTo(0.975, 10);
    }
  });
  it('ν = 1 is the Cauchy distribution: P(T ≤ 1) = 3/4 (derived)', () => {
    expect(studentTCdf(1, 1)).toBeCloseTo(0.75, 12);
  });
});

describe('sample statistics (derived by hand)', () => {
  it('mean 5 and sample sd √(32/7) of 2, 4, 4, 4, 5, 5, 7, 9', () => {
    const s = meanAndSd([2, 4, 4, 4, 5, 5, 7, 9]);
    expect(s.mean).toBeCloseTo(5, 12);
    expect(s.sd).toBeCloseTo(Math.sqrt(32 / 7), 12);
  });
  it('95 % half-width with n = 10, s = 1: 2.262/√10 = 0.7153 (t table)', () => {
    expect(confidenceHalfWidth(1, 10)).toBeCloseTo(2.262 / Math.sqrt(10), 3);
  });
  it('positions for ±0.5 with s = 1: 18 (t17·1/√18 = 0.497 ≤ 0.5 < t16/√17 = 0.514, t table)', () => {
    expect(positionsForHalfWidth(1, 0.5)).toBe(18);
    expect(2.11 / Math.sqrt(18) <= 0.5 && 2.12 / Math.sqrt(17) > 0.5).toBe(true);
  });
  it('no scatter needs only the minimum 2 positions; an impossible target says so (null)', () => {
    expect(positionsForHalfWidth(0, 0.1)).toBe(2);
    expect(positionsForHalfWidth(1000, 0.001)).toBeNull();
  });
  it('running means and settling: the mean stays within ±band of the final mean from position k on', () => {
    expect(runningMeans([1, 3, 2])).toEqual([1, 2, 2]);
    const m = runningMeans([10, 0, 5, 5, 5, 5, 5, 5]);
    expect(m).toEqual([10, 5, 5, 5, 5, 5, 5, 5]);
    expect(settling(m, 0.5)).toEqual({ after: 2, settled: true });
    expect(settling(runningMeans([0, 10, 0, 10]), 0.5).settled).toBe(false);
  });
  it('at least one of m independent positions: 1 − (1 − p)^m; p = 0.1, m = 10 → 0.6513 (derived)', () => {
    expect(atLeastOne(0.1, 10)).toBeCloseTo(1 - 0.9 ** 10, 12);
    expect(atLeastOne(0.3, 0)).toBe(0);
  });
  it('pitch = median gap of the distinct positions', () => {
    expect(pitchOf([0, 100, 200, 200, 300, 600])).toBe(100);
    expect(pitchOf([50])).toBeNull();
  });
  it('predictive probability approaches the normal tail for a large sample: P(X < mean − 1.96·s) → 0.025', () => {
    expect(predictiveBelow(-1.96, 0, 1, 1e6)).toBeCloseTo(0.025, 3);
    // A small sample widens the tail: more than 2.5 % below the same point.
    expect(predictiveBelow(-1.96, 0, 1, 5)).toBeGreaterThan(0.05);
  });
});

describe('adequacy of one parameter', () => {
  const pts = (values: number[], margins?: number[]): SamplePoint[] =>
    values.map((value, i) => ({
      readingId: `r${i}`,
      position: 100 * (i + 1),
      value,
      margin: margins?.[i] ?? null,
      resolution: 1,
    }));
  it('gives count, mean, sd, the interval, the target from the resolution and the positions still needed', () => {
    const a = adequacyOf({
      label: 'toe angle',
      unit: 'deg',
      points: pts([140, 150, 145, 155, 160]),
      seamLength: 1000,
      circumferential: false,
      defaultResolution: 1,
      requiredLevel: 'C',
    });
    const s = meanAndSd([140, 150, 145, 155, 160]);
    expect(a.count).toBe(5);
    expect(a.mean).toBeCloseTo(150, 12);
    expect(a.sd).toBeCloseTo(s.sd, 12);
    expect(a.ci95?.halfWidth).toBeCloseTo(confidenceHalfWidth(s.sd, 5), 12);
    expect(a.target).toEqual({ value: 1, basis: 'instrument resolution' });
    expect(a.positionsNeeded).toBe(positionsForHalfWidth(s.sd, 1));
    expect(a.morePositions).toBe((a.positionsNeeded as number) - 5);
    expect(a.advice).toContain(`measure about ${a.morePositions} more positions`);
  });
  it('estimates the risk from the margins to the limit and counts the unmeasured positions at the pitch', () => {
    const margins = [5, 8, 3, 6, 7];
    const a = adequacyOf({
      label: 'toe angle',
      unit: 'deg',
      points: pts([140, 150, 145, 155, 160], margins),
      seamLength: 1000,
      circumferential: false,
      defaultResolution: 1,
      requiredLevel: 'C',
    });
    if (!('onePosition' in a.risk)) throw new Error(a.risk.notAssessed);
    const m = meanAndSd(margins);
    expect(a.risk.onePosition).toBeCloseTo(predictiveBelow(0, m.mean, m.sd, 5), 12);
    // Pitch 100 mm on 1000 mm: 11 positions (0 … 1000), 5 measured.
    expect(a.risk.pitchMm).toBe(100);
    expect(a.risk.unmeasuredPositions).toBe(6);
    expect(a.risk.anyUnmeasured).toBeCloseTo(atLeastOne(a.risk.onePosition, 6), 12);
    expect(a.advice).toContain('positions assumed independent');
  });
});

describe('only at-pitch readings feed the statistics (design §3)', () => {
  it('a targeted reading changes km (worst case) but not the sampling statistics', () => {
    const seam = buttSeam({ fatigue: { loaded: true } });
    const atPitch = [100, 200, 300, 400].map((p, i) =>
      reading({ toeAngle: 150 + i }, { position: p, toe: { plate: 1, side: 'face' } }),
    );
    const targeted = reading(
      { toeAngle: 120 },
      { position: 250, toe: { plate: 1, side: 'face' }, sampling: 'targeted' },
    );
    const file = seamFile(seam, [...atPitch, targeted]);
    const a = assessSeam(file, gradeSeam(file));
    const toe = a.sampling.parameters.find((p) => p.label === 'toe angle, plate 1 face-side toe');
    expect(toe?.count).toBe(4);
    expect(toe?.mean).toBeCloseTo(151.5, 12);
    // The ranking does use the targeted spot: it is the worst toe angle.
    expect(a.toes.toes[0]?.governing.readingId).toBe(targeted.id);
  });
});
