// Fixed-window rate limits per client address, in memory (one server process). Enough to slow password guessing
// and a runaway device; not a defence against a distributed attack.
import type { MiddlewareHandler } from 'hono';
import type { RateLimit } from '../config.js';
import { clientAddress } from './client.js';
import { HttpError } from './errors.js';

export class RateLimiter {
  readonly #windows = new Map<string, { start: number; count: number }>();

  constructor(
    private readonly rule: RateLimit,
    private readonly now: () => number,
  ) {}

  /** Counts a request; returns the seconds to wait when over the limit, else 0. */
  take(key: string): number {
    const t = this.now();
    if (this.#windows.size > 10_000) this.#sweep(t);
    const w = this.#windows.get(key);
    if (!w || t - w.start >= this.rule.windowMs) {
      this.#windows.set(key, { start: t, count: 1 });
      return 0;
    }
    w.count += 1;
    return w.count > this.rule.limit ? Math.max(1, Math.ceil((w.start + this.rule.windowMs - t) / 1000)) : 0;
  }

  #sweep(t: number): void {
    for (const [key, w] of this.#windows) if (t - w.start >= this.rule.windowMs) this.#windows.delete(key);
  }
}

export function rateLimit(limiter: RateLimiter, what: string, trustProxy: boolean): MiddlewareHandler {
  return async (c, next) => {
    const wait = limiter.take(clientAddress(c, trustProxy));
    if (wait > 0) {
      throw new HttpError(429, 'rateLimited', `too many ${what} requests; try again in ${wait} s`, {
        'Retry-After': String(wait),
      });
    }
    await next();
  };
}
