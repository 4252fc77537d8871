// A batch: records signed together by one device key. The device seals a batch when it first sends it and resends
// exactly the same bytes until every record has an answer; new records go into new batches.
import * as v from 'valibot';
import { LEVELS } from '../domain/index.js';
import { choice, count, isoTimestamp, obj, text } from '../domain/model/schema-kit.js';
import { canonicalJson } from './canonical-json.js';
import { ProtocolError } from './errors.js';
import { jwsBody, signJws, type FlattenedJws } from './jws.js';
import { parsePayload, protocolField } from './payload.js';
import { randomUuid } from './platform.js';
import { recordFromOutbox, type OutboxEntryLike } from './records.js';
import { MAX_RECORDS_PER_BATCH, PROTOCOL_VERSION } from './version.js';
import type { CryptoKey } from 'jose';

const batchId = v.pipe(
  text(64, 'a batch id'),
  v.regex(/^[A-Za-z0-9_-]+$/, 'may hold only letters, digits, - and _'),
);

/** The grade the device showed for a seam when it sealed the batch; the server keeps it beside its own. */
const deviceGrade = obj('a device grade', {
  seamId: text(64, 'an id'),
  state: choice(['graded', 'incomplete', 'noReadings']),
  levelMet: v.nullable(choice([...LEVELS, 'belowD'])),
  meetsRequired: v.nullable(v.boolean('must be true, false or null')),
  readingCount: count(0, 10_000_000),
  gradedAt: isoTimestamp(),
});

export const batchPayloadSchema = obj('a batch', {
  protocol: protocolField,
  type: v.literal('batch', 'type must be "batch"'),
  batchId,
  /** The batch's number on this device (1, 2, 3, …): the order the device sealed its batches in. */
  deviceSeq: count(1, Number.MAX_SAFE_INTEGER),
  records: v.pipe(
    v.array(v.unknown(), 'records must be a list'),
    v.minLength(1, 'records must hold at least one record'),
    v.maxLength(
      MAX_RECORDS_PER_BATCH,
      (i) => `records holds ${i.received} items; at most ${MAX_RECORDS_PER_BATCH} per batch`,
    ),
  ),
  deviceGrades: v.optional(v.pipe(v.array(deviceGrade), v.maxLength(MAX_RECORDS_PER_BATCH))),
});

export type BatchPayload = v.InferOutput<typeof batchPayloadSchema>;
export type DeviceGrade = v.InferOutput<typeof deviceGrade>;

/** The batch payload, or a ProtocolError ('version' or 'malformed'). Records are judged one by one later. */
export const parseBatchPayload = (payload: unknown): BatchPayload =>
  parsePayload(batchPayloadSchema, payload, 'batch');

export const RECORD_STATUSES = ['accepted', 'duplicate', 'parked', 'rejected'] as const;
export type RecordStatus = (typeof RECORD_STATUSES)[number];

export interface RecordResult {
  /** The record's place in the batch (0-based), so a record without a usable id can still be named. */
  readonly index: number;
  readonly id: string | null;
  readonly status: RecordStatus;
  /** Why a record was rejected: the field and what was wrong. */
  readonly reason?: string;
}

export interface BatchReply {
  readonly protocol: typeof PROTOCOL_VERSION;
  readonly batchId: string;
  /** True when this batch had been applied before: nothing changed, every record is answered again. */
  readonly replay: boolean;
  readonly results: readonly RecordResult[];
}

export const batchReplySchema = v.object({
  protocol: protocolField,
  batchId: v.string(),
  replay: v.boolean(),
  results: v.array(
    v.object({
      index: v.number(),
      id: v.nullable(v.string()),
      status: v.picklist(RECORD_STATUSES),
      reason: v.exactOptional(v.string()),
    }),
  ),
});

/** The server's reply to a batch, checked (device side). */
export function parseBatchReply(input: unknown): BatchReply {
  const parsed = v.safeParse(batchReplySchema, input);
  if (!parsed.success) throw new ProtocolError('malformed', 'the batch reply is not in the expected form');
  return parsed.output;
}

/**
 * Whether the device may take the record out of its outbox: the server holds it (accepted, duplicate, or parked
 * for a newer server). A rejected record stays, with its reason, until someone deals with it.
 */
export const isAcknowledged = (result: Pick<RecordResult, 'status'>): boolean => result.status !== 'rejected';

export interface SealedBatch {
  readonly batchId: string;
  readonly deviceSeq: number;
  readonly recordIds: readonly string[];
  /** The request body: keep it and resend exactly these bytes until every record is answered. */
  readonly body: string;
  readonly jws: FlattenedJws;
}

export interface BatchInput {
  readonly deviceSeq: number;
  readonly entries: readonly OutboxEntryLike[];
  readonly deviceGrades?: readonly DeviceGrade[];
  readonly batchId?: string;
}

/** Seals outbox entries into a signed batch (canonical JSON payload, so the same content gives the same bytes). */
export async function sealBatch(input: BatchInput, key: CryptoKey, kid: string): Promise<SealedBatch> {
  const id = input.batchId ?? randomUuid();
  const payload = {
    protocol: PROTOCOL_VERSION,
    type: 'batch',
    batchId: id,
    deviceSeq: input.deviceSeq,
    records: input.entries.map(recordFromOutbox),
    ...(input.deviceGrades?.length ? { deviceGrades: input.deviceGrades } : {}),
  };
  const jws = await signJws(canonicalJson(payload), 'batch', key, kid);
  return {
    batchId: id,
    deviceSeq: input.deviceSeq,
    recordIds: input.entries.map((e) => e.recordId),
    body: jwsBody(jws),
    jws,
  };
}
