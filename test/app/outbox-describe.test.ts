// The Outbox screen's words: every state has text and a shape, never colour alone (design notes §5).
import { describe, expect, it } from 'vitest';
import { describeItem, describeSender } from '../../src/app/screens/outbox/describe.js';
import type { SenderStatus } from '../../src/app/sync/sender.js';
import type { OutboxEntry } from '../../src/store/api.js';

const status = (over: Partial<SenderStatus>): SenderStatus => ({
  state: 'idle',
  failures: 0,
  lastError: null,
  lastPassAt: null,
  lastSuccessAt: null,
  nextAttemptAt: null,
  ...over,
});

const entry: OutboxEntry = {
  seq: 1,
  recordId: 'r-1',
  kind: 'reading',
  seamId: 's-1',
  body: {},
  createdAt: '2026-12-01T08:00:00.000Z',
};

describe('outbox words', () => {
  it('names each sender state with its own shape', () => {
    const lines = [
      describeSender(status({}), 0),
      describeSender(status({}), 3),
      describeSender(status({ state: 'sending' }), 3),
      describeSender(status({ state: 'waiting', lastError: 'the server answered 503' }), 3),
      describeSender(status({ state: 'notEnrolled' }), 3),
      describeSender(status({ state: 'keyRefused', lastError: 'the server answered 403.' }), 3),
    ];
    expect(lines.map((l) => l.mark)).toEqual(['✓', '○', '↻', '⏸', '○', '✗']);
    expect(lines[1]?.text).toBe('3 waiting to be sent.');
    expect(lines[3]?.text).toContain('the server answered 503');
    expect(lines[3]?.text).toContain('records stay here');
    expect(lines[4]?.text).toContain('Not enrolled');
    const allRefused = describeSender(status({}), 2, 2);
    expect(allRefused.mark).toBe('✗');
    expect(allRefused.text).toContain('2 records were refused');
  });

  it('shows a refused record with the reason, and a failed try with its error', () => {
    const refused = describeItem({
      entry,
      send: { recordId: 'r-1', attempts: 1, rejected: { reason: 'body.x: bad', at: '2026-12-01T09:00:00Z' } },
    });
    expect(refused).toEqual({ mark: '✗', text: 'Refused by the server: body.x: bad' });
    const failed = describeItem({
      entry,
      send: {
        recordId: 'r-1',
        batchId: 'b',
        attempts: 2,
        lastAttemptAt: '2026-12-01T09:00:00Z',
        lastError: 'no answer from the server (Failed to fetch)',
      },
    });
    expect(failed.mark).toBe('⏸');
    expect(failed.text).toMatch(/^2 tries; last at .+: no answer from the server \(Failed to fetch\)$/);
    expect(describeItem({ entry, send: null })).toEqual({ mark: '○', text: 'Not sent yet.' });
  });
});
