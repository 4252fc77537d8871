// Seam set-up, rounds and checklist answers. Each live change writes its outbox entry in the same transaction as
// the record, so a change is either saved and queued for the server, or neither.
import type { ChecklistItem, Round, Seam } from '../domain/index.js';
import type { ChecklistAnswer, Namespace, RoundRecord, SeamRecord, SeamSummary } from './api.js';
import { checkChecklistAnswer, checkExaminer, checkSeam } from './check-input.js';
import type { StoreContext } from './context.js';
import { StoreError } from './errors.js';
import { entryForAdd, outboxEntry, roundBody, seamKeyRange, type NewOutboxEntry } from './records.js';
import { sameContent } from './same-content.js';

const MAX_ROUND = 999;

export const seamNotFound = (seamId: string) =>
  new StoreError('notFound', `No seam with id "${seamId}" is stored on this device.`);

/** `namespace` applies to a new seam ('live' when not given); an existing seam keeps its own. */
export async function saveSeam(ctx: StoreContext, input: Seam, namespace?: Namespace): Promise<SeamRecord> {
  const seam = checkSeam(input);
  const now = ctx.now();
  const setupId = ctx.newId();
  const roundId = ctx.newId();
  return ctx.conn.run(['seams', 'rounds', 'outbox'], 'readwrite', async (tx) => {
    const seams = tx.objectStore('seams');
    const outbox = tx.objectStore('outbox');
    const existing = await seams.get(seam.id);
    if (existing) {
      if (namespace !== undefined && existing.namespace !== namespace) {
        throw new StoreError(
          'invalid',
          `Seam not saved: "${seam.id}" is a ${existing.namespace} seam here; a seam cannot move between live and demo records.`,
        );
      }
      // Saving an unchanged set-up is not a change: no new revision, nothing queued for the server.
      if (sameContent(existing.seam, seam)) return existing;
      const record: SeamRecord = { ...existing, seam, revision: existing.revision + 1, updatedAt: now };
      await seams.put(record);
      if (record.namespace === 'live') {
        await outbox.add(
          entryForAdd(
            outboxEntry(
              'seamSetup',
              setupId,
              { seamId: seam.id, revision: record.revision, seam, savedAt: now },
              now,
            ),
          ),
        );
      }
      return record;
    }
    const record: SeamRecord = {
      id: seam.id,
      namespace: namespace ?? 'live',
      seam,
      revision: 1,
      createdAt: now,
      updatedAt: now,
    };
    // Every seam starts with its first round, so it always forms a seam file the grader accepts.
    const first: RoundRecord = { seamId: seam.id, number: 1, kind: 'first', startedAt: now, checklist: {} };
    await seams.add(record);
    await tx.objectStore('rounds').add(first);
    if (record.namespace === 'live') {
      await outbox.add(
        entryForAdd(
          outboxEntry('seamSetup', setupId, { seamId: seam.id, revision: 1, seam, savedAt: now }, now),
        ),
      );
      await outbox.add(entryForAdd(outboxEntry('round', roundId, roundBody(first), now)));
    }
    return record;
  });
}

/** Caches the last grade shown; a cache, not a record of work, so it is never queued for the server. */
export async function setSummary(ctx: StoreContext, seamId: string, summary: SeamSummary): Promise<void> {
  await ctx.conn.run(['seams'], 'readwrite', async (tx) => {
    const existing = await tx.store.get(seamId);
    if (!existing) throw seamNotFound(seamId);
    await tx.store.put({ ...existing, summary });
  });
}

export async function startRound(
  ctx: StoreContext,
  seamId: string,
  kind: Round['kind'],
  examinerInput?: RoundRecord['examiner'],
): Promise<RoundRecord> {
  const examiner = checkExaminer(examinerInput);
  const now = ctx.now();
  const roundId = ctx.newId();
  return ctx.conn.run(['seams', 'rounds', 'outbox'], 'readwrite', async (tx) => {
    const seam = await tx.objectStore('seams').get(seamId);
    if (!seam) throw seamNotFound(seamId);
    const rounds = tx.objectStore('rounds');
    const last = await rounds.openCursor(seamKeyRange(seamId), 'prev');
    const number = (last?.value.number ?? 0) + 1;
    if (number > MAX_ROUND) {
      throw new StoreError(
        'invalid',
        `Round not started: seam "${seamId}" has ${MAX_ROUND} rounds, the most allowed.`,
      );
    }
    if (kind === 'first' && number > 1) {
      throw new StoreError(
        'invalid',
        `Round not started: seam "${seamId}" has had its first inspection; a later round is "afterRepair" or "additional".`,
      );
    }
    const round: RoundRecord = {
      seamId,
      number,
      kind,
      startedAt: now,
      ...(examiner ? { examiner } : {}),
      checklist: {},
    };
    await rounds.add(round);
    if (seam.namespace === 'live') {
      await tx.objectStore('outbox').add(entryForAdd(outboxEntry('round', roundId, roundBody(round), now)));
    }
    return round;
  });
}

export async function answerChecklist(
  ctx: StoreContext,
  seamId: string,
  roundNumber: number,
  item: ChecklistItem,
  answerInput: ChecklistAnswer,
): Promise<RoundRecord> {
  const answer = checkChecklistAnswer(item, answerInput);
  const now = ctx.now();
  const entry = outboxEntry(
    'checklistAnswer',
    ctx.newId(),
    { seamId, round: roundNumber, item, answer, answeredAt: now },
    now,
  );
  return changeRound(ctx, seamId, roundNumber, entry, (round, seam) => {
    if (answer.position !== undefined && answer.position > seam.seam.length) {
      throw new StoreError(
        'invalid',
        `Checklist answer not saved:\nanswer.position: lies beyond the seam's length of ${seam.seam.length} mm; got ${answer.position}`,
      );
    }
    if (sameContent(round.checklist[item], answer)) return undefined;
    return { ...round, checklist: { ...round.checklist, [item]: answer } };
  });
}

/**
 * Writes what `change` makes of one round and, for a live seam, queues `entry` in the same transaction. A change
 * that returns undefined (the same content again) writes and queues nothing, so repeats do not reach the server.
 */
export function changeRound(
  ctx: StoreContext,
  seamId: string,
  roundNumber: number,
  entry: NewOutboxEntry,
  change: (round: RoundRecord, seam: SeamRecord) => RoundRecord | undefined,
): Promise<RoundRecord> {
  return ctx.conn.run(['seams', 'rounds', 'outbox'], 'readwrite', async (tx) => {
    const seam = await tx.objectStore('seams').get(seamId);
    if (!seam) throw seamNotFound(seamId);
    const rounds = tx.objectStore('rounds');
    const round = await rounds.get([seamId, roundNumber]);
    if (!round) {
      throw new StoreError(
        'notFound',
        `Seam "${seamId}" has no round ${roundNumber}; start the round first.`,
      );
    }
    const updated = change(round, seam);
    if (!updated) return round;
    await rounds.put(updated);
    if (seam.namespace === 'live') await tx.objectStore('outbox').add(entryForAdd(entry));
    return updated;
  });
}
