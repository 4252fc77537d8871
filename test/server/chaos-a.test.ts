// Chaos, runs 0 to 499 of 1,000 (the other half is in the sibling file, so the halves run in
// parallel): see chaos-harness.ts for the faults and what each run checks.
import { describe, expect, it } from 'vitest';
import { chaos } from './chaos-harness.js';

describe('chaos', () => {
  it("keeps the server's record set equal to the device's over 500 seeded runs of faults", async () => {
    const tally = await chaos(0, 500);
    expect(tally.runs).toBe(500);
    // The faults really happened, in numbers.
    for (const fault of ['drop', '503', '502', 'lost', 'duplicate'] as const)
      expect(tally.faults[fault]).toBeGreaterThan(300);
    expect(tally.restarts).toBeGreaterThan(50);
    console.log(JSON.stringify({ chaos: { first: 0, ...tally } }));
  }, 240_000);
});
