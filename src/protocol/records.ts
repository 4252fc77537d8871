// The records that travel: the device store's immutable events, each in an envelope that names its id, kind and
// schema version. Bodies are checked with the grading core's own schemas. A record is judged on its own, never
// against other records (its seam may arrive in a later batch), so the verdict does not depend on arrival order;
// whether a reading fits its seam is the server's re-grade's business.
import * as v from 'valibot';
import {
  CHECKLIST_ITEMS,
  PARAMETER_NAMES,
  readingSchema,
  roundSchema,
  seamSchema,
  MAX_TAG_LENGTH,
  readTagText,
  type Problem,
} from '../domain/index.js';
import { count, isoTimestamp, obj, text, toProblems, choice } from '../domain/model/schema-kit.js';
import { viewingConditionsSchema } from '../domain/model/viewing.js';
import { compilePredicate, NOT_SHOWN, VALID_IN_ORDER, type Predicate } from './schema-predicate.js';
import { RECORD_SCHEMA_VERSION } from './version.js';

export const RECORD_KINDS = [
  'seamSetup',
  'round',
  'checklistAnswer',
  'reading',
  'tagLink',
  'viewing',
] as const;
export type RecordKind = (typeof RECORD_KINDS)[number];

/** The schema version each kind first appeared in: a record travels with it (see RECORD_SCHEMA_VERSION). */
export const RECORD_KIND_VERSIONS: Readonly<Record<RecordKind, number>> = {
  seamSetup: 1,
  round: 1,
  checklistAnswer: 1,
  reading: 1,
  tagLink: 1,
  viewing: 2,
};

/** The version a record of this kind is sent with (1 for a kind this code does not know). */
export const recordSchemaVersionOf = (kind: string): number =>
  (RECORD_KIND_VERSIONS as Readonly<Record<string, number>>)[kind] ?? 1;

const id = text(64, 'an id');
export const TAG_ACTIONS = ['link', 'unlink'] as const;
/**
 * How the tag was read: camera, a photo, typed by hand, or made for a printed label; `confirmedMove` for the unlink
 * half of a move.
 */
export const TAG_VIA = ['camera', 'photo', 'typed', 'printed', 'confirmedMove'] as const;
const checklistAnswer = roundSchema.entries.checklist.entries.crack.wrapped;

/** What each kind of record carries (the device store's outbox bodies). Device times are informative only. */
export const recordBodySchemas = {
  seamSetup: obj('a seam set-up record body', {
    seamId: id,
    revision: count(1, 1_000_000),
    seam: seamSchema,
    savedAt: isoTimestamp(),
  }),
  round: obj('a round record body', {
    seamId: id,
    number: roundSchema.entries.number,
    kind: roundSchema.entries.kind,
    startedAt: isoTimestamp(),
    examiner: roundSchema.entries.examiner,
  }),
  checklistAnswer: obj('a checklist answer record body', {
    seamId: id,
    round: count(1, 999),
    item: choice(CHECKLIST_ITEMS),
    answer: checklistAnswer,
    answeredAt: isoTimestamp(),
  }),
  reading: obj('a reading record body', { seamId: id, reading: readingSchema }),
  /** A tag linked to or unlinked from a seam; a move is an unlink from one seam and a link to the other. */
  tagLink: obj('a tag link record body', {
    seamId: id,
    action: choice(TAG_ACTIONS),
    tag: text(MAX_TAG_LENGTH, 'a tag'),
    via: choice(TAG_VIA),
    at: isoTimestamp(),
  }),
  /** Version 2: how a round was looked at; a later record for the same round supersedes an earlier one. */
  viewing: obj('a viewing record body', {
    seamId: id,
    round: count(1, 999),
    conditions: viewingConditionsSchema,
    recordedAt: isoTimestamp(),
  }),
} as const;

export type RecordBodies = { [K in RecordKind]: v.InferOutput<(typeof recordBodySchemas)[K]> };

const envelopeSchema = obj('a record', {
  id,
  kind: choice(RECORD_KINDS),
  schemaVersion: count(1, RECORD_SCHEMA_VERSION),
  /** The device's outbox sequence number: the order the device made its records in. */
  seq: count(1, Number.MAX_SAFE_INTEGER),
  seamId: id,
  /** When the device queued the record, by its own clock: shown, never used to order anything. */
  createdAt: isoTimestamp(),
  body: v.unknown(),
});

interface Envelope<K extends RecordKind> {
  readonly id: string;
  readonly kind: K;
  readonly schemaVersion: number;
  readonly seq: number;
  readonly seamId: string;
  readonly createdAt: string;
  readonly body: RecordBodies[K];
}

export type SyncRecord = { [K in RecordKind]: Envelope<K> }[RecordKind];

export type RecordVerdict =
  | {
      readonly status: 'valid';
      readonly record: SyncRecord;
      /**
       * True when record.body is the received body itself with every object's members in sorted order, so that
       * JSON.stringify(record.body) is its canonical JSON.
       */
      readonly bodyInOrder?: boolean;
    }
  /** A newer schema than this code knows: kept as sent, for a later version to read. */
  | {
      readonly status: 'parked';
      readonly id: string;
      readonly kind: string;
      readonly schemaVersion: number;
      readonly seamId: string | null;
      readonly raw: Readonly<Record<string, unknown>>;
    }
  | {
      readonly status: 'rejected';
      /** null when the record has no usable id; the reply then names it by its place in the batch. */
      readonly id: string | null;
      readonly reason: string;
      readonly problems: readonly Problem[];
    };

const MAX_REASONS = 5;

function rejected(recordId: string | null, problems: readonly Problem[]): RecordVerdict {
  const shown = problems.slice(0, MAX_REASONS).map((p) => `${p.path}: ${p.message}`);
  const more = problems.length > MAX_REASONS ? `; and ${problems.length - MAX_REASONS} more` : '';
  return { status: 'rejected', id: recordId, reason: shown.join('; ') + more, problems };
}

const prefixed = (prefix: string, problems: readonly Problem[]): Problem[] =>
  problems.map((p) => ({ path: p.path === '(file)' ? prefix : `${prefix}.${p.path}`, message: p.message }));

/** How deep a parked record may nest: far beyond any record shape, well inside what the canonical writer recurses. */
export const PARKED_MAX_DEPTH = 64;

/** Whether a parsed JSON value nests arrays and objects deeper than `limit` (walked without recursion). */
export function nestsDeeperThan(value: unknown, limit: number): boolean {
  const stack: { v: unknown; d: number }[] = [{ v: value, d: 0 }];
  while (stack.length) {
    const { v: item, d } = stack.pop() as { v: unknown; d: number };
    if (typeof item !== 'object' || item === null) continue;
    if (d >= limit) return true;
    for (const child of Array.isArray(item) ? item : Object.values(item)) stack.push({ v: child, d: d + 1 });
  }
  return false;
}

/** Judges one record of a batch: valid (with its typed body), parked (newer schema) or rejected (with reasons). */
export const judgeRecord = (input: unknown): RecordVerdict => judge(input, true);

/** judgeRecord with valibot alone: the reference the quick predicates are held to. */
export const judgeRecordBySchema = (input: unknown): RecordVerdict => judge(input, false);

function judge(input: unknown, quickly: boolean): RecordVerdict {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    return rejected(null, [{ path: 'record', message: 'must be an object' }]);
  }
  const raw = input as Record<string, unknown>;
  const rawId = raw['id'];
  const recordId = typeof rawId === 'string' && rawId.length > 0 && rawId.length <= 64 ? rawId : null;
  if (recordId === null) {
    return rejected(null, [{ path: 'id', message: 'must be a string of 1 to 64 characters' }]);
  }
  const version = raw['schemaVersion'];
  if (typeof version !== 'number' || !Number.isInteger(version) || version < 1) {
    return rejected(recordId, [
      {
        path: 'schemaVersion',
        message: `must be a whole number from 1; got ${JSON.stringify(version) ?? 'nothing'}`,
      },
    ]);
  }
  if (version > RECORD_SCHEMA_VERSION) {
    // Kept unread until this server learns the schema, but written out as canonical JSON: bound its depth first.
    if (nestsDeeperThan(raw, PARKED_MAX_DEPTH)) {
      return rejected(recordId, [
        { path: 'record', message: `nests deeper than ${PARKED_MAX_DEPTH} levels; no record shape does` },
      ]);
    }
    const seamId = raw['seamId'];
    return {
      status: 'parked',
      id: recordId,
      kind: typeof raw['kind'] === 'string' ? raw['kind'].slice(0, 64) : '',
      schemaVersion: version,
      seamId: typeof seamId === 'string' && seamId.length <= 64 ? seamId : null,
      raw,
    };
  }
  const quick = quickly ? quickJudge(raw) : null;
  if (quick) return quick;
  const envelope = v.safeParse(envelopeSchema, raw, { abortPipeEarly: true });
  if (!envelope.success) return rejected(recordId, toProblems(envelope.issues));
  const { kind } = envelope.output;
  const body = v.safeParse(recordBodySchemas[kind], envelope.output.body, { abortPipeEarly: true });
  if (!body.success) return rejected(recordId, prefixed('body', toProblems(body.issues)));
  const record = { ...envelope.output, body: body.output } as SyncRecord;
  const problems = crossChecks(record);
  return problems.length ? rejected(recordId, problems) : { status: 'valid', record };
}

// The schemas as predicates: a record they show valid is valid for valibot too, with the same output; anything
// else goes to valibot, which gives the reasons. A kind whose schema the predicate cannot express has none.
// Compiled on the first judgement, not at import: the tablet loads this module but never judges records.
let quick: { envelope: Predicate | null; bodies: Record<RecordKind, Predicate | null> } | null = null;
const quickPredicates = () =>
  (quick ??= {
    envelope: compilePredicate(envelopeSchema),
    bodies: Object.fromEntries(
      RECORD_KINDS.map((kind) => [kind, compilePredicate(recordBodySchemas[kind])]),
    ) as Record<RecordKind, Predicate | null>,
  });

/** The verdict on a record the predicates show valid, or null to ask valibot. */
function quickJudge(raw: Readonly<Record<string, unknown>>): RecordVerdict | null {
  const { envelope: quickEnvelope, bodies: quickBodies } = quickPredicates();
  if (!quickEnvelope || quickEnvelope(raw) === NOT_SHOWN) return null;
  const kind = raw['kind'] as RecordKind;
  const body = raw['body'];
  const check = quickBodies[kind];
  const shown = check ? check(body) : NOT_SHOWN;
  if (shown === NOT_SHOWN) return null;
  // valibot's output for closed objects without defaults is a copy of its input, members in schema order.
  const record = {
    id: raw['id'],
    kind,
    schemaVersion: raw['schemaVersion'],
    seq: raw['seq'],
    seamId: raw['seamId'],
    createdAt: raw['createdAt'],
    body,
  } as SyncRecord;
  const problems = crossChecks(record);
  return problems.length
    ? rejected(record.id, problems)
    : { status: 'valid', record, bodyInOrder: shown === VALID_IN_ORDER };
}

/** What a record says about itself that must agree; nothing here looks at other records. */
function crossChecks(record: SyncRecord): Problem[] {
  const problems: Problem[] = [];
  if (record.body.seamId !== record.seamId) {
    problems.push({ path: 'body.seamId', message: `must equal the record's seamId "${record.seamId}"` });
  }
  if (record.schemaVersion < RECORD_KIND_VERSIONS[record.kind]) {
    problems.push({
      path: 'schemaVersion',
      message: `a ${record.kind} record has schema version ${RECORD_KIND_VERSIONS[record.kind]} or later`,
    });
  }
  switch (record.kind) {
    case 'seamSetup':
      if (record.body.seam.id !== record.seamId) {
        problems.push({ path: 'body.seam.id', message: `must equal the record's seamId "${record.seamId}"` });
      }
      break;
    case 'round':
      if ((record.body.kind === 'first') !== (record.body.number === 1)) {
        problems.push({ path: 'body.kind', message: 'round 1 is the "first" round, and only round 1 is' });
      }
      break;
    case 'checklistAnswer':
      if (record.body.answer.answer === 'present' && record.body.answer.position === undefined) {
        problems.push({
          path: 'body.answer.position',
          message: 'is needed when the item is "present": where along the seam (mm)',
        });
      }
      break;
    case 'reading':
      problems.push(...readingAlone(record.id, record.seamId, record.body.reading));
      break;
    case 'tagLink': {
      // Stored as the device cleaned it: text that the device would not keep is not a tag.
      const read = readTagText(record.body.tag);
      if (!read.ok || read.tag !== record.body.tag) {
        problems.push({
          path: 'body.tag',
          message: read.ok
            ? 'must be clean tag text (NFC, no surrounding white space or control characters)'
            : read.message,
        });
      }
      break;
    }
    case 'viewing':
      break;
  }
  return problems;
}

function readingAlone(recordId: string, seamId: string, r: RecordBodies['reading']['reading']): Problem[] {
  const problems: Problem[] = [];
  const at = 'body.reading';
  if (r.id !== recordId)
    problems.push({ path: `${at}.id`, message: `must equal the record's id "${recordId}"` });
  if (r.seamId !== undefined && r.seamId !== seamId) {
    problems.push({ path: `${at}.seamId`, message: `must equal the record's seamId "${seamId}"` });
  }
  const hasValues = PARAMETER_NAMES.some((n) => r.values[n] !== undefined);
  if (r.withdrawn) {
    if (r.supersedes === undefined) {
      problems.push({ path: `${at}.supersedes`, message: 'a withdrawal must name the reading it withdraws' });
    }
    if (hasValues) problems.push({ path: `${at}.values`, message: 'a withdrawal carries no values' });
    return problems;
  }
  if (!hasValues) problems.push({ path: `${at}.values`, message: 'holds no measured value' });
  const point = r.position !== undefined;
  const span = r.start !== undefined || r.end !== undefined;
  if (point === span || (span && (r.start === undefined || r.end === undefined))) {
    problems.push({
      path: at,
      message: 'needs either a position, or both start and end for an imperfection with length',
    });
  }
  return problems;
}

/** The device store's outbox entry, as far as the protocol reads it. */
export interface OutboxEntryLike {
  readonly seq: number;
  readonly recordId: string;
  readonly kind: string;
  readonly seamId: string;
  readonly body: unknown;
  readonly createdAt: string;
}

/** The record an outbox entry travels as. */
export function recordFromOutbox(entry: OutboxEntryLike): Readonly<Record<string, unknown>> {
  return {
    id: entry.recordId,
    kind: entry.kind,
    schemaVersion: recordSchemaVersionOf(entry.kind),
    seq: entry.seq,
    seamId: entry.seamId,
    createdAt: entry.createdAt,
    body: entry.body,
  };
}
