// Read-only queries. Each runs in one readonly transaction, so what it returns is one consistent moment.
import type { SeamFile } from '../domain/index.js';
import type { OutboxEntry, ReadingRecord, RoundRecord, SeamRecord } from './api.js';
import type { StoreContext } from './context.js';
import { seamKeyRange, toSeamFile } from './records.js';

/** All seams, live and demo, in id order (creation order for UUIDv7 ids). */
export const listSeams = (ctx: StoreContext): Promise<SeamRecord[]> =>
  ctx.conn.run(['seams'], 'readonly', (tx) => tx.store.getAll());

export const getSeam = (ctx: StoreContext, id: string): Promise<SeamRecord | undefined> =>
  ctx.conn.run(['seams'], 'readonly', (tx) => tx.store.get(id));

/** One seam's rounds by number. */
export const listRounds = (ctx: StoreContext, seamId: string): Promise<RoundRecord[]> =>
  ctx.conn.run(['rounds'], 'readonly', (tx) => tx.store.getAll(seamKeyRange(seamId)));

/** One seam's readings in order of entry on this device; with `afterLocalSeq`, those entered after it. */
export const listReadings = (
  ctx: StoreContext,
  seamId: string,
  afterLocalSeq?: number,
): Promise<ReadingRecord[]> =>
  ctx.conn.run(['readings'], 'readonly', (tx) =>
    tx.store.index('bySeamSeq').getAll(seamKeyRange(seamId, afterLocalSeq)),
  );

export async function seamFile(ctx: StoreContext, seamId: string): Promise<SeamFile | undefined> {
  const parts = await ctx.conn.run(['seams', 'rounds', 'readings'], 'readonly', async (tx) => ({
    seam: await tx.objectStore('seams').get(seamId),
    rounds: await tx.objectStore('rounds').getAll(seamKeyRange(seamId)),
    readings: await tx.objectStore('readings').index('bySeamSeq').getAll(seamKeyRange(seamId)),
  }));
  return parts.seam ? toSeamFile(parts.seam, parts.rounds, parts.readings) : undefined;
}

export const outboxCount = (ctx: StoreContext): Promise<number> =>
  ctx.conn.run(['outbox'], 'readonly', (tx) => tx.store.count());

/** The oldest entries first: the order they were made on this device. */
export const outboxEntries = (ctx: StoreContext, limit?: number): Promise<OutboxEntry[]> =>
  ctx.conn.run(['outbox'], 'readonly', (tx) => tx.store.getAll(null, limit));
