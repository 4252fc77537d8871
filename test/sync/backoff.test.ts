// Exponential backoff with equal jitter ("Exponential Backoff And Jitter", AWS Architecture Blog, 2015): half the
// capped delay is fixed, half random; the delay doubles per failure and stops growing at the cap.
import { describe, expect, it } from 'vitest';
import { backoffDelay } from '../../src/app/sync/backoff.js';

const policy = { baseMs: 1000, maxMs: 8000 };

describe('backoff', () => {
  it('doubles per failure up to the cap', () => {
    const top = (n: number) => backoffDelay(n, () => 0.999999, policy);
    expect([1, 2, 3, 4, 5, 40].map(top)).toEqual([1000, 2000, 4000, 8000, 8000, 8000]);
  });

  it('keeps at least half of the capped delay and spreads the other half', () => {
    expect(backoffDelay(3, () => 0, policy)).toBe(2000);
    expect(backoffDelay(3, () => 0.5, policy)).toBe(3000);
    expect(backoffDelay(0, () => 0, policy)).toBe(500);
  });
});
