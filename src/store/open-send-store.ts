// The outbox's sending side alone, for the service worker's Background Sync pass. It opens the same database
// with the same upgrade steps, but brings none of the screens' lazily loaded parts (tag links, pulled items,
// backups): a classic service worker script cannot load modules on demand.
import type { SenderStore } from '../app/sync/sender.js';
import { Connection } from './connection.js';
import type { StoreContext } from './context.js';
import { uuidv7 } from './ids.js';
import { DEFAULT_DB_NAME } from './schema.js';
import * as sendLog from './send-log.js';

export interface SendStore extends SenderStore {
  close(): void;
}

export async function openSendStore(
  options: { readonly name?: string; readonly onBlocking?: () => void } = {},
): Promise<SendStore> {
  const now = () => new Date().toISOString();
  const conn = new Connection({
    name: options.name ?? DEFAULT_DB_NAME,
    now,
    ...(options.onBlocking ? { onBlocking: options.onBlocking } : {}),
  });
  const ctx: StoreContext = { conn, now, newId: () => uuidv7() };
  await conn.open();
  return { ...sendingSide(ctx), close: () => conn.close() };
}

/** The store calls the outbox sender makes; the full store (open-store.ts) serves the same ones. */
export function sendingSide(ctx: StoreContext): SenderStore {
  return {
    unsealedEntries: (limit) => sendLog.unsealedEntries(ctx, limit),
    nextBatchSeq: () => sendLog.nextBatchSeq(ctx),
    keepSealedBatch: (batch) => sendLog.keepSealedBatch(ctx, batch),
    pendingBatches: () => sendLog.pendingBatches(ctx),
    noteAttempt: (batchId, error) => sendLog.noteAttempt(ctx, batchId, error),
    settleBatch: (batchId, answers) => sendLog.settleBatch(ctx, batchId, answers),
    releaseBatch: (batchId) => sendLog.releaseBatch(ctx, batchId),
    shownGrades: (seamIds) => sendLog.shownGrades(ctx, seamIds),
  };
}
