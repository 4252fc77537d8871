// Readings are append-only events: a stored reading is never changed or deleted. A correction is a new reading
// that supersedes the old one; a withdrawal (undo) is a new reading with `withdrawn: true` and no values.
import type { Reading } from '../domain/index.js';
import type { ReadingRecord } from './api.js';
import { checkReadingInContext, checkReadingShape } from './check-input.js';
import type { StoreContext } from './context.js';
import { StoreError } from './errors.js';
import { takeLocalSeqs } from './local-seq.js';
import { entryForAdd, outboxEntry, seamKeyRange } from './records.js';
import { sameContent } from './same-content.js';
import { seamNotFound } from './seam-writes.js';

function alreadyStored(existing: ReadingRecord, seamId: string, reading: Reading): StoreError {
  const same = existing.seamId === seamId && sameContent(existing.reading, reading);
  return new StoreError(
    'exists',
    same
      ? `Reading "${reading.id}" is already stored (with the same content); it was not added twice.`
      : `Reading not saved: id "${reading.id}" belongs to a stored reading with other content. Readings are never overwritten: record a correction with a new id that supersedes it.`,
  );
}

export async function appendReading(
  ctx: StoreContext,
  seamId: string,
  input: Reading,
): Promise<ReadingRecord> {
  const reading = checkReadingShape(input);
  // Read what the checks need in a transaction of its own, check with the grader's rules, then write in a
  // second transaction that re-checks whatever another write could have changed in between.
  const context = await ctx.conn.run(['seams', 'rounds', 'readings'], 'readonly', async (tx) => {
    const readings = tx.objectStore('readings');
    return {
      seam: await tx.objectStore('seams').get(seamId),
      rounds: await tx.objectStore('rounds').getAll(seamKeyRange(seamId)),
      existing: await readings.get(reading.id),
      superseded: reading.supersedes === undefined ? undefined : await readings.get(reading.supersedes),
    };
  });
  if (!context.seam) throw seamNotFound(seamId);
  if (context.existing) throw alreadyStored(context.existing, seamId, reading);
  if (reading.supersedes !== undefined && context.superseded?.seamId !== seamId) {
    throw new StoreError(
      'invalid',
      `Reading not saved:\nreading.supersedes: names reading "${reading.supersedes}", which is not stored for this seam`,
    );
  }
  checkReadingInContext(context.seam.seam, context.rounds, reading, context.superseded?.reading);
  const now = ctx.now();

  return ctx.conn.run(['meta', 'seams', 'readings', 'outbox'], 'readwrite', async (tx) => {
    const seam = await tx.objectStore('seams').get(seamId);
    if (!seam) throw seamNotFound(seamId);
    const readings = tx.objectStore('readings');
    const existing = await readings.get(reading.id);
    if (existing) throw alreadyStored(existing, seamId, reading);
    if (reading.supersedes !== undefined) {
      const laterId = await readings.index('bySupersedes').getKey(reading.supersedes);
      if (laterId !== undefined) {
        throw new StoreError(
          'invalid',
          `Reading not saved: "${reading.supersedes}" is already superseded by "${laterId}"; correct the latest reading instead.`,
        );
      }
    }
    const localSeq = await takeLocalSeqs(tx.objectStore('meta'), 1);
    const record: ReadingRecord = { seamId, namespace: seam.namespace, reading, localSeq };
    await readings.add(record);
    // Demo readings stay on the device: they are not a record of work.
    if (seam.namespace === 'live') {
      await tx
        .objectStore('outbox')
        .add(entryForAdd(outboxEntry('reading', reading.id, { seamId, reading }, now)));
    }
    return record;
  });
}
