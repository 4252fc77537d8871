import { describe, expect, it } from 'vitest';
import { uuidv7, uuidv7Time } from '../../src/store/ids.js';

// RFC 9562 §5.7: 48-bit big-endian Unix milliseconds, version 7, variant 10, the rest random.
const UUID_V7 = /^[0-9a-f]{8}-[0-9a-f]{4}-7[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/;

describe('uuidv7', () => {
  it('has the RFC 9562 layout: version 7 and variant 10', () => {
    for (let i = 0; i < 200; i++) expect(uuidv7()).toMatch(UUID_V7);
  });

  it('carries the millisecond timestamp in its first 48 bits', () => {
    const ms = Date.UTC(2026, 10, 19, 8, 22, 0, 123);
    const id = uuidv7(ms);
    expect(uuidv7Time(id)).toBe(ms);
    expect(id.slice(0, 13)).toBe(
      `${ms.toString(16).padStart(12, '0').slice(0, 8)}-${ms.toString(16).padStart(12, '0').slice(8)}`,
    );
  });

  it('sorts by time across milliseconds, and ids made in the same millisecond differ', () => {
    const ms = Date.UTC(2026, 0, 1);
    const ids = [uuidv7(ms + 2), uuidv7(ms), uuidv7(ms + 1)];
    expect([...ids].sort()).toEqual([ids[1], ids[2], ids[0]]);
    const same = new Set(Array.from({ length: 1000 }, () => uuidv7(ms)));
    expect(same.size).toBe(1000);
  });
});
