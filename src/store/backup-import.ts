// Restoring a backup adds what is missing and nothing else: identical records are skipped, conflicting ones are
// refused with a reason, nothing here is deleted or overwritten with other content, and a second import of the
// same file adds nothing. The whole import is one transaction: it lands completely or not at all.
import type { Reading } from '../domain/index.js';
import type { ImportReport, ReadingRecord, RoundRecord, SeamRecord } from './api.js';
import { checkAll, readEnvelope } from './backup-file.js';
import { decideSeam, mergeRound, seamProblems, withoutSeq } from './backup-merge.js';
import {
  checkOutboxEntry,
  checkReadingRecord,
  checkRoundRecord,
  checkSeamRecord,
  checkTagLinkRecord,
} from './backup-schema.js';
import { checkReadingInContext } from './check-input.js';
import type { StoreContext } from './context.js';
import { lastLocalSeq } from './local-seq.js';
import { entryForAdd, seamKeyRange } from './records.js';
import { sameContent } from './same-content.js';

export async function importBackup(ctx: StoreContext, data: unknown): Promise<ImportReport> {
  const lists = readEnvelope(data);
  const refused: { path: string; reason: string }[] = [];
  const seams = checkAll('seams', lists.seams, checkSeamRecord, refused).filter((s) => {
    const reason =
      s.value.id !== s.value.seam.id
        ? `id "${s.value.id}" differs from seam.id "${s.value.seam.id}"`
        : seamProblems(s.value.seam);
    if (reason) refused.push({ path: s.path, reason });
    return !reason;
  });
  const rounds = checkAll('rounds', lists.rounds, checkRoundRecord, refused);
  // Readings in their order of entry, and outbox entries in theirs, so both orders survive the restore.
  const readings = checkAll('readings', lists.readings, checkReadingRecord, refused).sort(
    (a, b) => a.value.localSeq - b.value.localSeq,
  );
  const outbox = checkAll('outbox', lists.outbox, checkOutboxEntry, refused).sort(
    (a, b) => a.value.seq - b.value.seq,
  );
  const tagLinks = checkAll('tagLinks', lists.tagLinks, checkTagLinkRecord, refused);

  const counts = {
    seamsAdded: 0,
    seamsUpdated: 0,
    roundsAdded: 0,
    roundsUpdated: 0,
    readingsAdded: 0,
    outboxAdded: 0,
    tagLinksAdded: 0,
    duplicatesSkipped: 0,
  };
  await ctx.conn.run(
    ['meta', 'seams', 'rounds', 'readings', 'outbox', 'tagLinks'],
    'readwrite',
    async (tx) => {
      const seamStore = tx.objectStore('seams');
      const roundStore = tx.objectStore('rounds');
      const readingStore = tx.objectStore('readings');
      const outboxStore = tx.objectStore('outbox');
      const refuse = (path: string, reason: string) => refused.push({ path, reason });
      const seamCache = new Map<string, SeamRecord | undefined>();
      const seamHere = async (id: string) => {
        if (!seamCache.has(id)) seamCache.set(id, await seamStore.get(id));
        return seamCache.get(id);
      };

      for (const { path, value } of seams) {
        const existing = await seamStore.get(value.id);
        const decision = decideSeam(existing, value);
        if (decision.refuse) refuse(path, decision.refuse);
        else if (decision.write === 'none') counts.duplicatesSkipped++;
        else {
          await seamStore.put(value);
          counts[decision.write === 'add' ? 'seamsAdded' : 'seamsUpdated']++;
        }
        seamCache.delete(value.id);
      }

      for (const { path, value } of rounds) {
        if (!(await seamHere(value.seamId))) {
          refuse(path, `belongs to seam "${value.seamId}", which is neither on this device nor in the file`);
          continue;
        }
        const existing = await roundStore.get([value.seamId, value.number]);
        if (!existing) {
          await roundStore.add(value);
          counts.roundsAdded++;
          continue;
        }
        const merged = mergeRound(existing, value);
        if (typeof merged === 'string') refuse(path, merged);
        else if (sameContent(merged, existing)) counts.duplicatesSkipped++;
        else {
          await roundStore.put(merged);
          counts.roundsUpdated++;
        }
      }

      const meta = tx.objectStore('meta');
      const startSeq = await lastLocalSeq(meta);
      let lastSeq = startSeq;
      const roundCache = new Map<string, RoundRecord[]>();
      for (const { path, value } of readings) {
        const seam = await seamHere(value.seamId);
        const reading = value.reading;
        if (!seam) {
          refuse(path, `belongs to seam "${value.seamId}", which is neither on this device nor in the file`);
          continue;
        }
        const existing = await readingStore.get(reading.id);
        if (existing) {
          if (existing.seamId === value.seamId && sameContent(existing.reading, reading))
            counts.duplicatesSkipped++;
          else {
            refuse(
              path,
              `conflict: reading "${reading.id}" is stored here with other content; readings are never overwritten, so the one here was kept`,
            );
          }
          continue;
        }
        if (value.namespace !== seam.namespace) {
          refuse(path, `is marked ${value.namespace} but its seam "${seam.id}" is ${seam.namespace}`);
          continue;
        }
        let superseded: Reading | undefined;
        if (reading.supersedes !== undefined) {
          const target = await readingStore.get(reading.supersedes);
          const laterId = await readingStore.index('bySupersedes').getKey(reading.supersedes);
          if (target?.seamId !== value.seamId) {
            refuse(
              path,
              `supersedes reading "${reading.supersedes}", which is not stored for seam "${seam.id}"`,
            );
            continue;
          }
          if (laterId !== undefined) {
            refuse(
              path,
              `conflict: reading "${reading.supersedes}" is already superseded here by "${laterId}"`,
            );
            continue;
          }
          superseded = target.reading;
        }
        if (!roundCache.has(seam.id)) roundCache.set(seam.id, await roundStore.getAll(seamKeyRange(seam.id)));
        try {
          checkReadingInContext(seam.seam, roundCache.get(seam.id) ?? [], reading, superseded);
        } catch (error) {
          refuse(
            path,
            error instanceof Error ? error.message.replace(/^Reading not saved:\n/, '') : String(error),
          );
          continue;
        }
        // Keep the file's order numbers where they still come after everything here; otherwise renumber after.
        lastSeq = Math.max(lastSeq + 1, value.localSeq);
        const record: ReadingRecord = {
          seamId: value.seamId,
          namespace: seam.namespace,
          reading,
          localSeq: lastSeq,
        };
        await readingStore.add(record);
        counts.readingsAdded++;
      }
      if (lastSeq !== startSeq) await meta.put({ key: 'localSeq', value: lastSeq });

      for (const { path, value } of outbox) {
        const seam = await seamHere(value.seamId);
        if (seam?.namespace !== 'live') {
          refuse(
            path,
            seam
              ? `belongs to demo seam "${seam.id}"; demo records never go to the server`
              : `belongs to seam "${value.seamId}", which is neither on this device nor in the file`,
          );
          continue;
        }
        const existing = await outboxStore.index('byRecord').get(value.recordId);
        if (existing) {
          if (sameContent(withoutSeq(existing), withoutSeq(value))) counts.duplicatesSkipped++;
          else
            refuse(path, `conflict: record "${value.recordId}" waits in the outbox here with other content`);
          continue;
        }
        // Keep the file's sequence number when it is free here, so a restore onto an empty device is exact.
        const taken = (await outboxStore.getKey(value.seq)) !== undefined;
        await outboxStore.add(taken ? entryForAdd(withoutSeq(value)) : value);
        counts.outboxAdded++;
      }

      const linkStore = tx.objectStore('tagLinks');
      for (const { path, value } of tagLinks) {
        const seam = await seamHere(value.seamId);
        if (!seam || seam.namespace !== value.namespace) {
          refuse(
            path,
            seam
              ? `namespace "${value.namespace}" differs from seam "${seam.id}" here`
              : `links seam "${value.seamId}", which is neither on this device nor in the file`,
          );
          continue;
        }
        const held = await linkStore.get(value.key);
        if (held?.seamId === value.seamId) counts.duplicatesSkipped++;
        else if (held)
          refuse(path, `conflict: this tag is linked to seam "${held.seamId}" here; it was not moved`);
        else {
          await linkStore.add(value);
          counts.tagLinksAdded++;
        }
      }
    },
  );
  return { ...counts, refused };
}
