// The readings list: newest first by the device's order of entry; corrected and withdrawn ones stay, marked.
import { describe, expect, it } from 'vitest';
import { newestFirst, readingStatuses } from '../../src/app/components/ReadingList.js';
import type { ReadingRecord } from '../../src/store/api.js';
import { reading } from '../support/seam-builder.js';

const rec = (r: ReturnType<typeof reading>, localSeq: number): ReadingRecord => ({
  seamId: 's',
  namespace: 'live',
  reading: r,
  localSeq,
});

describe('readings list', () => {
  const first = reading({ undercutDepth: 0.3 }, { id: 'r1', toe: { plate: 1, side: 'face' } });
  const correction = reading(
    { undercutDepth: 0.4 },
    { id: 'r2', supersedes: 'r1', toe: { plate: 1, side: 'face' } },
  );
  const other = reading({ undercutDepth: 0.1 }, { id: 'r3', toe: { plate: 1, side: 'face' } });
  const withdrawal = { ...reading({}, { id: 'r4', supersedes: 'r3' }), withdrawn: true as const };
  // The clock says r4 is oldest: the order must come from localSeq, never from recordedAt.
  const records = [
    rec(first, 1),
    rec(correction, 2),
    rec(other, 3),
    rec({ ...withdrawal, recordedAt: '2000-01-01T00:00:00Z' }, 4),
  ];

  it('orders by local sequence, newest first', () => {
    expect(newestFirst(records).map((r) => r.reading.id)).toEqual(['r4', 'r3', 'r2', 'r1']);
  });

  it('marks the corrected and the withdrawn reading with the one that replaced or withdrew it', () => {
    const s = readingStatuses(records);
    expect(s.get('r1')).toEqual({ correctedBy: 'r2' });
    expect(s.get('r3')).toEqual({ withdrawnBy: 'r4' });
    expect(s.get('r2')).toBeUndefined();
    expect(s.size).toBe(2);
  });
});
