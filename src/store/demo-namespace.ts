// The demo yard in its own namespace: loaded in one step, removed in one step, never in the outbox.
import { kestrelPointYard } from '../demo/kestrel-point-yard.js';
import type { ReadingRecord, RoundRecord, SeamRecord } from './api.js';
import type { StoreContext } from './context.js';
import { takeLocalSeqs } from './local-seq.js';
import { cleanExaminer, seamKeyRange } from './records.js';

/** Adds the demo seams that are not stored yet; loading twice adds nothing. */
export async function loadDemo(ctx: StoreContext): Promise<number> {
  const now = ctx.now();
  const files = kestrelPointYard();
  return ctx.conn.run(['meta', 'seams', 'rounds', 'readings'], 'readwrite', async (tx) => {
    const seams = tx.objectStore('seams');
    const missing = [];
    for (const file of files) {
      // A seam already here (the demo loaded before) is left exactly as it is.
      if ((await seams.getKey(file.seam.id)) === undefined) missing.push(file);
    }
    const readingCount = missing.reduce((n, f) => n + f.readings.length, 0);
    let localSeq = await takeLocalSeqs(tx.objectStore('meta'), readingCount);
    for (const file of missing) {
      const seam: SeamRecord = {
        id: file.seam.id,
        namespace: 'demo',
        seam: file.seam,
        revision: 1,
        createdAt: now,
        updatedAt: now,
      };
      await seams.add(seam);
      for (const round of file.rounds) {
        const record: RoundRecord = {
          seamId: seam.id,
          number: round.number,
          kind: round.kind,
          startedAt: round.startedAt ?? now,
          ...(round.examiner ? { examiner: cleanExaminer(round.examiner) } : {}),
          checklist: round.checklist,
        };
        await tx.objectStore('rounds').add(record);
      }
      for (const reading of file.readings) {
        const record: ReadingRecord = { seamId: seam.id, namespace: 'demo', reading, localSeq: localSeq++ };
        await tx.objectStore('readings').add(record);
      }
    }
    return missing.length;
  });
}

/**
 * Removes every demo record and nothing else. This is the one place the store deletes records: demo data is not
 * a record of work, so removing it loses nothing; live seams, rounds and readings are never deleted.
 */
export async function removeDemo(ctx: StoreContext): Promise<number> {
  return ctx.conn.run(['seams', 'rounds', 'readings', 'tagLinks'], 'readwrite', async (tx) => {
    const seams = tx.objectStore('seams');
    const links = tx.objectStore('tagLinks');
    for (const key of await links.index('byNamespace').getAllKeys('demo')) await links.delete(key);
    const demoSeams = await seams.index('byNamespace').getAllKeys('demo');
    for (const id of demoSeams) {
      await seams.delete(id);
      await tx.objectStore('rounds').delete(seamKeyRange(id));
    }
    const readings = tx.objectStore('readings');
    for (const id of await readings.index('byNamespace').getAllKeys('demo')) await readings.delete(id);
    return demoSeams.length;
  });
}
