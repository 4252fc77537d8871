// What a backup file must hold, record by record. Records use the grading core's own schemas for seams, rounds
// and readings, so a restored record is one the grader accepts.
import * as v from 'valibot';
import {
  LEVELS,
  MAX_TAG_LENGTH,
  readingSchema,
  readTagText,
  roundSchema,
  seamSchema,
} from '../domain/index.js';
import { choice, count, isoTimestamp, obj, text, toProblems } from '../domain/model/schema-kit.js';
import { viewingConditionsSchema } from '../domain/model/viewing.js';
import type { OutboxEntry, ReadingRecord, RoundRecord, SeamRecord, TagLinkRecord } from './api.js';

const namespace = choice(['live', 'demo']);
const sequence = count(1, Number.MAX_SAFE_INTEGER);

const summary = obj('summary', {
  state: choice(['graded', 'incomplete', 'noReadings']),
  levelMet: v.nullable(choice([...LEVELS, 'belowD'])),
  meetsRequired: v.nullable(v.boolean('must be true, false or null')),
  readingCount: count(0, Number.MAX_SAFE_INTEGER),
  gradedAt: isoTimestamp(),
});

const seamRecord = obj('seam record', {
  id: text(64, 'an id'),
  namespace,
  seam: seamSchema,
  revision: sequence,
  createdAt: isoTimestamp(),
  updatedAt: isoTimestamp(),
  summary: v.optional(summary),
});

const roundRecord = obj('round record', {
  ...roundSchema.entries,
  seamId: text(64, 'an id'),
  startedAt: isoTimestamp(),
  viewing: v.optional(viewingConditionsSchema),
});

const readingRecord = obj('reading record', {
  seamId: text(64, 'an id'),
  namespace,
  reading: readingSchema,
  localSeq: sequence,
});

const outboxEntry = obj('outbox entry', {
  seq: sequence,
  recordId: text(64, 'an id'),
  kind: choice(['seamSetup', 'round', 'checklistAnswer', 'reading', 'tagLink', 'viewing']),
  seamId: text(64, 'an id'),
  body: v.record(v.string(), v.unknown(), 'must be an object'),
  createdAt: isoTimestamp(),
});

export type Checked<T> =
  { readonly ok: true; readonly value: T } | { readonly ok: false; readonly reason: string };

function checker<T>(schema: v.GenericSchema<unknown, unknown>) {
  return (input: unknown): Checked<T> => {
    const parsed = v.safeParse(schema, input, { abortEarly: false, abortPipeEarly: true });
    if (parsed.success) return { ok: true, value: parsed.output as T };
    const problems = toProblems(parsed.issues).slice(0, 5);
    return { ok: false, reason: problems.map((p) => `${p.path}: ${p.message}`).join('; ') };
  };
}

export const checkSeamRecord = checker<SeamRecord>(seamRecord);
export const checkRoundRecord = checker<RoundRecord>(roundRecord);
export const checkReadingRecord = checker<ReadingRecord>(readingRecord);
export const checkOutboxEntry = checker<OutboxEntry>(outboxEntry);

const tagLinkRecord = obj('tag link record', {
  key: text(MAX_TAG_LENGTH * 4, 'a tag key'),
  tag: text(MAX_TAG_LENGTH, 'a tag'),
  seamId: text(64, 'an id'),
  namespace,
  linkedAt: isoTimestamp(),
  via: choice(['camera', 'photo', 'typed', 'printed']),
});
const checkTagLinkShape = checker<TagLinkRecord>(tagLinkRecord);

/** A tag link as this device would have stored it: clean tag text, keyed by its match key. */
export function checkTagLinkRecord(input: unknown): Checked<TagLinkRecord> {
  const shaped = checkTagLinkShape(input);
  if (!shaped.ok) return shaped;
  const read = readTagText(shaped.value.tag);
  if (!read.ok || read.tag !== shaped.value.tag) return { ok: false, reason: 'tag: is not clean tag text' };
  if (read.key !== shaped.value.key)
    return { ok: false, reason: `key: must be "${read.key}", the tag's match key` };
  return shaped;
}
