// A scanner import is written in one transaction: all of its readings (each also an outbox record when live) and
// its import record, or nothing. The record is kept in `meta` under "import:<id>" — small, device-local, and no
// schema change: it holds the file's SHA-256 so every imported reading can be traced to the file it came from.
import { parseSeamFile, type Reading } from '../domain/index.js';
import type { ImportRecord, ReadingRecord } from './api.js';
import { checkReadingShape } from './check-input.js';
import type { StoreContext } from './context.js';
import { StoreError } from './errors.js';
import { takeLocalSeqs } from './local-seq.js';
import { entryForAdd, outboxEntry, seamKeyRange, toRound } from './records.js';
import type { MetaRecord } from './schema.js';
import { seamNotFound } from './seam-writes.js';

const MAX_SHOWN = 20;

export async function appendImport(
  ctx: StoreContext,
  seamId: string,
  record: ImportRecord,
  input: readonly Reading[],
): Promise<ImportRecord> {
  if (!/^[0-9a-f]{64}$/.test(record.sha256))
    throw new StoreError('invalid', 'Import not saved: sha256 must be 64 hex digits');
  const readings = input.map((r) => checkReadingShape(r));
  for (const r of readings) {
    if (r.source.kind !== 'import' || r.source.importId !== record.importId) {
      throw new StoreError(
        'invalid',
        `Import not saved: reading "${r.id}" does not name import "${record.importId}" as its source`,
      );
    }
    if (r.supersedes !== undefined)
      throw new StoreError('invalid', `Import not saved: imported reading "${r.id}" cannot supersede`);
  }
  const context = await ctx.conn.run(['seams', 'rounds', 'meta'], 'readonly', async (tx) => ({
    seam: await tx.objectStore('seams').get(seamId),
    rounds: await tx.objectStore('rounds').getAll(seamKeyRange(seamId)),
    existing: await tx.objectStore('meta').get(`import:${record.importId}`),
  }));
  if (!context.seam) throw seamNotFound(seamId);
  if (context.existing)
    throw new StoreError('exists', `Import "${record.importId}" is already stored; it was not added twice.`);
  // The grader's own rules over all the readings at once (they reference nothing stored, so they stand alone).
  const parsed = parseSeamFile(
    {
      format: 'beadbook.seam/1',
      units: { length: 'mm', angle: 'deg' },
      seam: context.seam.seam,
      rounds: context.rounds.map(toRound),
      readings,
    },
    { allowNoReadings: true },
  );
  if (!parsed.ok) {
    throw new StoreError(
      'invalid',
      `Import not saved (nothing was stored):\n${parsed.problems
        .slice(0, MAX_SHOWN)
        .map((p) => `${p.path}: ${p.message}`)
        .join('\n')}`,
    );
  }
  const now = ctx.now();
  const stored: ImportRecord = { ...record, seamId, readingCount: readings.length, importedAt: now };
  await ctx.conn.run(['meta', 'seams', 'readings', 'outbox'], 'readwrite', async (tx) => {
    const seam = await tx.objectStore('seams').get(seamId);
    if (!seam) throw seamNotFound(seamId);
    const store = tx.objectStore('readings');
    let seq = await takeLocalSeqs(tx.objectStore('meta'), readings.length);
    const writes: Promise<unknown>[] = [];
    for (const reading of readings) {
      const rec: ReadingRecord = { seamId, namespace: seam.namespace, reading, localSeq: seq++ };
      writes.push(store.add(rec));
      if (seam.namespace === 'live') {
        writes.push(
          tx
            .objectStore('outbox')
            .add(entryForAdd(outboxEntry('reading', reading.id, { seamId, reading }, now))),
        );
      }
    }
    writes.push(tx.objectStore('meta').add({ key: `import:${record.importId}`, record: stored }));
    try {
      await Promise.all(writes);
    } catch (e) {
      // A reading id already stored aborts the whole transaction: nothing of the import is kept.
      if (e instanceof Error && e.name === 'ConstraintError') {
        throw new StoreError(
          'exists',
          'Import not saved (nothing was stored): a reading of this import is already stored.',
        );
      }
      throw e;
    }
  });
  return stored;
}

export async function listImports(ctx: StoreContext, seamId: string): Promise<ImportRecord[]> {
  const all = await ctx.conn.run(['meta'], 'readonly', (tx) =>
    tx.objectStore('meta').getAll(IDBKeyRange.bound('import:', 'import:\uffff')),
  );
  return all
    .flatMap((m: MetaRecord) => ('record' in m ? [m.record] : []))
    .filter((r) => r.seamId === seamId)
    .sort((a, b) => a.importedAt.localeCompare(b.importedAt));
}
