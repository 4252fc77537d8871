// A database at version 2 (the shape before the sender's bookkeeping) is upgraded in place: every waiting record
// stays in the outbox, unsealed, and batches are numbered from 1.
import { openDB } from 'idb';
import { describe, expect, it } from 'vitest';
import { MIGRATIONS, type BeadbookDB } from '../../src/store/schema.js';
import { freshName, freshStore } from './support.js';
import { makeVersion1 } from './version-1-database.js';

async function makeVersion2(name: string): Promise<void> {
  (await makeVersion1(name)).close();
  const step = MIGRATIONS[1];
  if (!step) throw new Error('no version 2 step');
  const db = await openDB<BeadbookDB>(name, 2, {
    upgrade: (database, _old, _new, tx) => {
      void step(database, tx);
    },
  });
  expect([...db.objectStoreNames].sort()).toEqual(['meta', 'outbox', 'readings', 'rounds', 'seams']);
  db.close();
}

describe('upgrade from version 2', () => {
  it('adds the batch and send-log stores and keeps the outbox as it was', async () => {
    const name = freshName();
    await makeVersion2(name);
    const store = await freshStore({ name });
    expect((await store.outboxEntries()).map((e) => e.recordId)).toEqual([
      'setup-1',
      'round-1',
      'r-z',
      'r-a',
    ]);
    expect(await store.pendingBatches()).toEqual([]);
    expect((await store.unsealedEntries(10)).map((e) => e.recordId)).toEqual([
      'setup-1',
      'round-1',
      'r-z',
      'r-a',
    ]);
    expect((await store.outboxItems()).every((i) => i.send === null)).toBe(true);
    expect(await store.nextBatchSeq()).toBe(1);
    expect(
      await store.keepSealedBatch({
        batchId: 'b-1',
        deviceSeq: 1,
        kid: 'k',
        recordIds: ['r-z'],
        body: 'x',
      }),
    ).toBe(true);
    expect(await store.listReadings('s-1')).toHaveLength(3);
  });
});
