// Pure conversions between stored records, outbox entries and the seam file the grader takes. Nothing here
// touches IndexedDB, so every operation can prepare its records before it opens a transaction.
import { SEAM_FILE_FORMAT, type Reading, type Round, type SeamFile } from '../domain/index.js';
import type {
  ChecklistAnswer,
  OutboxBodies,
  OutboxEntry,
  OutboxKind,
  ReadingRecord,
  RoundRecord,
  SeamRecord,
} from './api.js';

/** An outbox entry before IndexedDB gives it its sequence number. */
export type NewOutboxEntry = Omit<OutboxEntry, 'seq'>;

export function outboxEntry<K extends OutboxKind>(
  kind: K,
  recordId: string,
  body: OutboxBodies[K],
  createdAt: string,
): NewOutboxEntry {
  return { recordId, kind, seamId: body.seamId, body, createdAt };
}

/** The outbox store assigns `seq` itself (auto-increment key path); the cast only hides its absence here. */
export const entryForAdd = (entry: NewOutboxEntry): OutboxEntry => entry as OutboxEntry;

export function roundBody(round: RoundRecord): OutboxBodies['round'] {
  return {
    seamId: round.seamId,
    number: round.number,
    kind: round.kind,
    startedAt: round.startedAt,
    ...(round.examiner ? { examiner: round.examiner } : {}),
  };
}

/** A checklist answer without keys set to undefined, so equal answers compare equal. */
export function cleanAnswer(answer: ChecklistAnswer): ChecklistAnswer {
  return {
    answer: answer.answer,
    ...(answer.position !== undefined ? { position: answer.position } : {}),
    ...(answer.note !== undefined ? { note: answer.note } : {}),
  };
}

/** A round's examiner without keys set to undefined. */
export function cleanExaminer(examiner: {
  readonly name: string;
  readonly qualification?: string | undefined;
}): NonNullable<RoundRecord['examiner']> {
  return {
    name: examiner.name,
    ...(examiner.qualification !== undefined ? { qualification: examiner.qualification } : {}),
  };
}

export function toRound(record: RoundRecord): Round {
  return {
    number: record.number,
    kind: record.kind,
    startedAt: record.startedAt,
    ...(record.examiner ? { examiner: record.examiner } : {}),
    checklist: record.checklist,
  };
}

/** The seam as the grader takes it: rounds by number, readings in order of entry. */
export function toSeamFile(
  seam: SeamRecord,
  rounds: readonly RoundRecord[],
  readings: readonly ReadingRecord[],
): SeamFile {
  return {
    format: SEAM_FILE_FORMAT,
    units: { length: 'mm', angle: 'deg' },
    seam: seam.seam,
    rounds: [...rounds].sort((a, b) => a.number - b.number).map(toRound),
    readings: [...readings].sort((a, b) => a.localSeq - b.localSeq).map((r): Reading => r.reading),
  };
}

/**
 * Key ranges covering one seam's rounds ([seamId, number]) or its readings in order ([seamId, localSeq]); with
 * `after`, only the keys whose second part is greater.
 */
export const seamKeyRange = (seamId: string, after?: number): IDBKeyRange =>
  after === undefined
    ? IDBKeyRange.bound([seamId, -Infinity], [seamId, Infinity])
    : IDBKeyRange.bound([seamId, after], [seamId, Infinity], true, false);
