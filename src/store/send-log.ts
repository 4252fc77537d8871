// The sender's bookkeeping. The outbox is the source of truth: an entry leaves it only when the server has
// acknowledged its record by id. Beside it the store keeps the sealed batches (resent byte for byte until every
// record is answered) and, per waiting record, its batch, attempts, last error and any refusal.
import type { OutboxEntry, OutboxItem, RecordAnswer, SealedBatchRecord, SendState } from './api.js';
import type { IDBPObjectStore, StoreNames } from 'idb';
import type { StoreContext } from './context.js';
import type { BeadbookDB } from './schema.js';
import type { DeviceGrade } from '../protocol/batch.js';

/** Waiting records with how sending went for each, oldest first. */
export async function outboxItems(ctx: StoreContext): Promise<OutboxItem[]> {
  const { entries, log } = await ctx.conn.run(['outbox', 'sendLog'], 'readonly', async (tx) => ({
    entries: await tx.objectStore('outbox').getAll(),
    log: await tx.objectStore('sendLog').getAll(),
  }));
  const byId = new Map(log.map((s) => [s.recordId, s]));
  return entries.map((entry) => ({ entry, send: byId.get(entry.recordId) ?? null }));
}

const isHeld = (send: SendState | undefined): boolean =>
  send !== undefined && (send.batchId !== undefined || send.rejected !== undefined);

export async function unsealedEntries(ctx: StoreContext, limit: number): Promise<OutboxEntry[]> {
  const items = await outboxItems(ctx);
  const free: OutboxEntry[] = [];
  for (const item of items) {
    if (free.length >= limit) break;
    if (!isHeld(item.send ?? undefined)) free.push(item.entry);
  }
  return free;
}

export const nextBatchSeq = (ctx: StoreContext): Promise<number> =>
  ctx.conn.run(['meta'], 'readwrite', async (tx) => {
    const stored = await tx.store.get('batchSeq');
    const next = (stored?.key === 'batchSeq' ? stored.value : 0) + 1;
    await tx.store.put({ key: 'batchSeq', value: next });
    return next;
  });

export async function keepSealedBatch(
  ctx: StoreContext,
  batch: Omit<SealedBatchRecord, 'attempts' | 'sealedAt'>,
): Promise<boolean> {
  const sealedAt = ctx.now();
  return ctx.conn.run(['outbox', 'sendLog', 'batches'], 'readwrite', async (tx) => {
    const outbox = tx.objectStore('outbox').index('byRecord');
    const log = tx.objectStore('sendLog');
    const states: SendState[] = [];
    for (const recordId of batch.recordIds) {
      const state = await log.get(recordId);
      // Gone (acknowledged meanwhile) or taken by another sender: this batch was never sent; drop it.
      if ((await outbox.getKey(recordId)) === undefined || isHeld(state)) return false;
      states.push(state ?? { recordId, attempts: 0 });
    }
    await tx.objectStore('batches').add({ ...batch, sealedAt, attempts: 0 });
    for (const state of states) await log.put({ ...state, batchId: batch.batchId });
    return true;
  });
}

export const pendingBatches = (ctx: StoreContext): Promise<SealedBatchRecord[]> =>
  ctx.conn.run(['batches'], 'readonly', (tx) => tx.store.index('byDeviceSeq').getAll());

function attempted<T extends { readonly attempts: number; readonly lastError?: string }>(
  value: T,
  at: string,
  error: string | null,
): T {
  const rest: { lastError?: string } = { ...value };
  delete rest.lastError;
  return {
    ...rest,
    attempts: value.attempts + 1,
    lastAttemptAt: at,
    ...(error === null ? {} : { lastError: error }),
  } as unknown as T;
}

export async function noteAttempt(ctx: StoreContext, batchId: string, error: string | null): Promise<void> {
  const at = ctx.now();
  await ctx.conn.run(['batches', 'sendLog'], 'readwrite', async (tx) => {
    const batch = await tx.objectStore('batches').get(batchId);
    if (!batch) return;
    await tx.objectStore('batches').put(attempted(batch, at, error));
    const log = tx.objectStore('sendLog');
    for (const recordId of batch.recordIds) {
      const state = await log.get(recordId);
      if (state?.batchId === batchId) await log.put(attempted(state, at, error));
    }
  });
}

export async function settleBatch(
  ctx: StoreContext,
  batchId: string,
  answers: readonly RecordAnswer[],
): Promise<number> {
  const at = ctx.now();
  return ctx.conn.run(['outbox', 'sendLog', 'batches'], 'readwrite', async (tx) => {
    const batches = tx.objectStore('batches');
    const batch = await batches.get(batchId);
    // Settled already (another tab, or a repeated answer): nothing left to apply.
    if (!batch) return 0;
    const inBatch = new Set(batch.recordIds);
    const answered = new Set<string>();
    const log = tx.objectStore('sendLog');
    const acknowledged: string[] = [];
    for (const answer of answers) {
      if (!inBatch.has(answer.id) || answered.has(answer.id)) continue;
      answered.add(answer.id);
      if (answer.acknowledged) {
        acknowledged.push(answer.id);
        continue;
      }
      const reason = answer.reason ?? 'refused by the server (no reason given)';
      const state = (await log.get(answer.id)) ?? { recordId: answer.id, attempts: 0 };
      const rest: { -readonly [K in keyof SendState]: SendState[K] } = { ...state };
      delete rest.batchId;
      await log.put({ ...rest, lastError: reason, rejected: { reason, at } });
    }
    const removed = await removeAcknowledged(tx.objectStore('outbox'), log, acknowledged);
    // Answered in full once no record still waits in this batch (answers may come over several replies).
    let waiting = false;
    for (const id of batch.recordIds) if ((await log.get(id))?.batchId === batchId) waiting = true;
    if (!waiting) await batches.delete(batchId);
    return removed;
  });
}

export async function releaseBatch(ctx: StoreContext, batchId: string): Promise<void> {
  await ctx.conn.run(['sendLog', 'batches'], 'readwrite', async (tx) => {
    const batch = await tx.objectStore('batches').get(batchId);
    if (!batch) return;
    const log = tx.objectStore('sendLog');
    for (const recordId of batch.recordIds) {
      const state = await log.get(recordId);
      if (state?.batchId !== batchId) continue;
      const rest: { -readonly [K in keyof SendState]: SendState[K] } = { ...state };
      delete rest.batchId;
      await log.put(rest);
    }
    await tx.objectStore('batches').delete(batchId);
  });
}

type Writable<N extends StoreNames<BeadbookDB>> = IDBPObjectStore<
  BeadbookDB,
  ArrayLike<StoreNames<BeadbookDB>>,
  N,
  'readwrite'
>;

async function removeAcknowledged(
  outbox: Writable<'outbox'>,
  log: Writable<'sendLog'>,
  recordIds: readonly string[],
): Promise<number> {
  let removed = 0;
  for (const recordId of recordIds) {
    const key = await outbox.index('byRecord').getKey(recordId);
    if (key !== undefined) {
      await outbox.delete(key);
      removed++;
    }
    await log.delete(recordId);
  }
  return removed;
}

export const acknowledge = (ctx: StoreContext, recordIds: readonly string[]): Promise<number> =>
  ctx.conn.run(['outbox', 'sendLog'], 'readwrite', (tx) =>
    removeAcknowledged(tx.objectStore('outbox'), tx.objectStore('sendLog'), recordIds),
  );

/**
 * The grade this tablet last showed for each of the seams (live ones it has graded), to travel with a batch so the
 * server can keep it beside its own. A cache of what was shown, not a record: it is sent, never acknowledged.
 */
export const shownGrades = (ctx: StoreContext, seamIds: readonly string[]): Promise<DeviceGrade[]> =>
  ctx.conn.run(['seams'], 'readonly', async (tx) => {
    const grades: DeviceGrade[] = [];
    for (const seamId of [...new Set(seamIds)].sort()) {
      const seam = await tx.store.get(seamId);
      const g = seam?.namespace === 'live' ? seam.summary : undefined;
      // Field by field: the batch schema is closed, so nothing else the cache may hold one day can spoil a batch.
      if (g)
        grades.push({
          seamId,
          state: g.state,
          levelMet: g.levelMet,
          meetsRequired: g.meetsRequired,
          readingCount: g.readingCount,
          gradedAt: g.gradedAt,
        });
    }
    return grades;
  });
