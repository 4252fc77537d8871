// The sender's bookkeeping in the store: sealed batches kept byte for byte, attempts and errors noted per batch and
// record, and only acknowledged records leaving the outbox (readings stay). Rules from ../shared/reliability.md
// ("the outbox is the source of truth"; F2, F9, F10) and the design notes §4.
import { describe, expect, it } from 'vitest';
import type { Store } from '../../src/store/api.js';
import { butt, freshStore, undercut } from './support.js';

/** A live seam with three readings: five outbox records (set-up, round, three readings). */
async function storeWithReadings(): Promise<Store> {
  let n = 0;
  const store = await freshStore({ newId: () => `id-${++n}` });
  await store.saveSeam(butt('s-1'));
  for (const id of ['r-1', 'r-2', 'r-3']) await store.appendReading('s-1', undercut(id, 0.2));
  return store;
}

async function seal(store: Store, ids: readonly string[], body = `body-${ids.join(',')}`) {
  const deviceSeq = await store.nextBatchSeq();
  const batchId = `b-${deviceSeq}`;
  const kept = await store.keepSealedBatch({ batchId, deviceSeq, kid: 'kid-1', recordIds: ids, body });
  return { batchId, deviceSeq, kept };
}

describe('send log', () => {
  it('keeps a sealed batch as sealed and takes its records out of the next batch', async () => {
    const store = await storeWithReadings();
    const all = (await store.unsealedEntries(100)).map((e) => e.recordId);
    expect(all).toEqual(['id-1', 'id-2', 'r-1', 'r-2', 'r-3']);
    expect((await store.unsealedEntries(2)).map((e) => e.recordId)).toEqual(['id-1', 'id-2']);

    const first = await seal(store, ['id-1', 'id-2', 'r-1'], '{"exact":"bytes"}');
    expect(first).toMatchObject({ deviceSeq: 1, kept: true });
    expect((await store.unsealedEntries(100)).map((e) => e.recordId)).toEqual(['r-2', 'r-3']);
    // A second sealing of a record already in a batch is refused: a record travels in one batch at a time.
    expect((await seal(store, ['r-1', 'r-2'])).kept).toBe(false);
    expect((await store.unsealedEntries(100)).map((e) => e.recordId)).toEqual(['r-2', 'r-3']);

    const pending = await store.pendingBatches();
    expect(pending.map((b) => [b.batchId, b.deviceSeq, b.body, b.attempts])).toEqual([
      ['b-1', 1, '{"exact":"bytes"}', 0],
    ]);
  });

  it('notes attempts and the last error per batch and per record; a later success clears the error', async () => {
    const store = await storeWithReadings();
    const { batchId } = await seal(store, ['r-1', 'r-2']);
    await store.noteAttempt(batchId, 'the server answered 503');
    await store.noteAttempt(batchId, 'no answer (network error)');
    let [batch] = await store.pendingBatches();
    expect(batch).toMatchObject({ attempts: 2, lastError: 'no answer (network error)' });
    expect(batch?.lastAttemptAt).toBeDefined();
    const items = await store.outboxItems();
    const r1 = items.find((i) => i.entry.recordId === 'r-1');
    expect(r1?.send).toMatchObject({ batchId, attempts: 2, lastError: 'no answer (network error)' });
    expect(items.find((i) => i.entry.recordId === 'r-3')?.send).toBeNull();

    await store.noteAttempt(batchId, null);
    [batch] = await store.pendingBatches();
    expect(batch?.attempts).toBe(3);
    expect(batch?.lastError).toBeUndefined();
    // F10: attempts alone never remove anything.
    expect(await store.outboxCount()).toBe(5);
  });

  it('removes only acknowledged records; refused ones stay with their reason and leave the batch', async () => {
    const store = await storeWithReadings();
    const { batchId } = await seal(store, ['id-1', 'r-1', 'r-2']);
    const removed = await store.settleBatch(batchId, [
      { id: 'id-1', acknowledged: true },
      { id: 'r-1', acknowledged: false, reason: 'body.reading.values: holds no measured value' },
      { id: 'r-2', acknowledged: true },
      // An answer for a record not in this batch is not applied.
      { id: 'r-3', acknowledged: true },
    ]);
    expect(removed).toBe(2);
    expect(await store.pendingBatches()).toEqual([]);
    const items = await store.outboxItems();
    expect(items.map((i) => i.entry.recordId)).toEqual(['id-2', 'r-1', 'r-3']);
    const refused = items.find((i) => i.entry.recordId === 'r-1')?.send;
    expect(refused?.rejected?.reason).toBe('body.reading.values: holds no measured value');
    expect(refused?.batchId).toBeUndefined();
    // A refused record is not sealed again by itself (it would be refused again); it stays in the outbox.
    expect((await store.unsealedEntries(100)).map((e) => e.recordId)).toEqual(['id-2', 'r-3']);
    // Readings are never deleted: acknowledged ones are still on the device.
    expect((await store.listReadings('s-1')).map((r) => r.reading.id)).toEqual(['r-1', 'r-2', 'r-3']);
  });

  it('keeps a batch until every record in it is answered, and settling twice changes nothing', async () => {
    const store = await storeWithReadings();
    const { batchId } = await seal(store, ['r-1', 'r-2'], 'same bytes');
    expect(await store.settleBatch(batchId, [{ id: 'r-1', acknowledged: true }])).toBe(1);
    const [kept] = await store.pendingBatches();
    expect(kept?.body).toBe('same bytes');
    expect(kept?.recordIds).toEqual(['r-1', 'r-2']);
    expect(await store.settleBatch(batchId, [{ id: 'r-2', acknowledged: true }])).toBe(1);
    expect(await store.pendingBatches()).toEqual([]);
    expect(await store.settleBatch(batchId, [{ id: 'r-3', acknowledged: true }])).toBe(0);
    expect((await store.outboxEntries()).map((e) => e.recordId)).toEqual(['id-1', 'id-2', 'r-3']);
  });

  it('acknowledge(recordIds) removes exactly those outbox entries', async () => {
    const store = await storeWithReadings();
    expect(await store.acknowledge(['r-2', 'unknown-id'])).toBe(1);
    expect((await store.outboxEntries()).map((e) => e.recordId)).toEqual(['id-1', 'id-2', 'r-1', 'r-3']);
    expect(await store.listReadings('s-1')).toHaveLength(3);
  });

  it('drops a sealed batch whose records were acknowledged meanwhile', async () => {
    const store = await storeWithReadings();
    await store.acknowledge(['r-1']);
    expect((await seal(store, ['r-1', 'r-2'])).kept).toBe(false);
    expect(await store.pendingBatches()).toEqual([]);
    expect((await store.unsealedEntries(100)).map((e) => e.recordId)).toContain('r-2');
  });

  it('numbers batches 1, 2, 3 in the order they are sealed', async () => {
    const store = await storeWithReadings();
    expect([await store.nextBatchSeq(), await store.nextBatchSeq(), await store.nextBatchSeq()]).toEqual([
      1, 2, 3,
    ]);
  });
});
