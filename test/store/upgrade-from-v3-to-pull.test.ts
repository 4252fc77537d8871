// A database at version 3 (the sender's bookkeeping, before pull) is upgraded in place to the current version: the outbox and
// the sealed batches stay as they were, and the stores for pulled decisions and assignments are added, empty.
import { openDB } from 'idb';
import { describe, expect, it } from 'vitest';
import { DB_VERSION, MIGRATIONS, type BeadbookDB } from '../../src/store/schema.js';
import { freshName, freshStore } from './support.js';
import { makeVersion1 } from './version-1-database.js';

async function makeVersion3(name: string): Promise<void> {
  (await makeVersion1(name)).close();
  const db = await openDB<BeadbookDB>(name, 3, {
    upgrade: async (database, oldVersion, _new, tx) => {
      for (const step of MIGRATIONS.slice(oldVersion, 3)) await step(database, tx);
    },
  });
  expect([...db.objectStoreNames].sort()).toEqual([
    'batches',
    'meta',
    'outbox',
    'readings',
    'rounds',
    'seams',
    'sendLog',
  ]);
  await db.put('batches', {
    batchId: 'b-1',
    deviceSeq: 1,
    kid: 'k',
    recordIds: ['r-z'],
    body: '{"sealed":1}',
    sealedAt: '2026-11-30T08:00:00.000Z',
    attempts: 2,
  });
  await db.put('sendLog', { recordId: 'r-z', batchId: 'b-1', attempts: 2 });
  db.close();
}

describe('upgrade from version 3', () => {
  it('adds the decision and assignment stores and keeps the outbox and sealed batches', async () => {
    expect(DB_VERSION).toBe(6);
    const name = freshName();
    await makeVersion3(name);
    const store = await freshStore({ name });
    expect((await store.outboxEntries()).map((e) => e.recordId)).toEqual([
      'setup-1',
      'round-1',
      'r-z',
      'r-a',
    ]);
    expect((await store.pendingBatches()).map((b) => [b.batchId, b.body, b.attempts])).toEqual([
      ['b-1', '{"sealed":1}', 2],
    ]);
    expect(await store.pullCursor()).toBeNull();
    expect(await store.listDecisions('s-1')).toEqual([]);
    expect((await store.unseenDecisions()).size).toBe(0);
    const signed = { protected: 'p', payload: 'q', signature: 's' };
    const applied = await store.receivePulled(
      [
        {
          type: 'decision',
          id: 'd-1',
          seamId: 's-1',
          round: 1,
          outcome: 'rework',
          decidedBy: 'sup',
          decidedAt: '2026-12-01T09:00:00.000Z',
          signed,
        },
      ],
      'c7',
    );
    expect(applied).toEqual({ decisions: 1, assignments: 0, seamsAdded: 0, roundsOpened: 1 });
    expect((await store.listRounds('s-1')).map((r) => r.number)).toEqual([1, 2]);
    expect(await store.pullCursor()).toBe('c7');
    const raw = await openDB(name);
    expect(raw.version).toBe(6);
    expect([...raw.objectStoreNames].sort()).toEqual([
      'assignments',
      'batches',
      'decisions',
      'meta',
      'outbox',
      'readings',
      'rounds',
      'seams',
      'sendLog',
      'tagLinks',
    ]);
    raw.close();
  });
});
