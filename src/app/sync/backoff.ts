// How long the sender waits before it tries again after a failed pass: exponential backoff with "equal jitter"
// (half the capped exponential delay fixed, half random), so many tablets coming back in range at once do not
// retry in step, and a long outage settles at the cap instead of growing without end.

export interface BackoffPolicy {
  /** The wait after the first failure, before jitter. */
  readonly baseMs: number;
  /** The longest wait, before jitter. */
  readonly maxMs: number;
}

export const DEFAULT_BACKOFF: BackoffPolicy = { baseMs: 2_000, maxMs: 5 * 60_000 };

/** The wait after `failures` failed passes in a row (1 for the first), with random() in [0, 1). */
export function backoffDelay(failures: number, random: () => number, policy = DEFAULT_BACKOFF): number {
  const exponent = Math.min(Math.max(failures - 1, 0), 30);
  const capped = Math.min(policy.maxMs, policy.baseMs * 2 ** exponent);
  return Math.round(capped / 2 + (random() * capped) / 2);
}
