// Applying a signed batch, without HTTP: the body exactly as received is parsed, its header checked, its
// signature verified with the enrolled device's key, each record judged on its own, and everything stored in
// one transaction. What the device is told per record is what it may forget: accepted, duplicate and parked
// records are held by the server; a rejected one stays on the device with the reason.
import { createHash } from 'node:crypto';
import {
  canonicalJson,
  judgeRecord,
  parseBatchPayload,
  parseFlattenedJws,
  PROTOCOL_VERSION,
  readJwsBody,
  readProtectedHeader,
  type BatchReply,
  type FlattenedJws,
} from '../../protocol/index.js';
import { isDemoId } from '../../demo/kestrel-point-yard.js';
import { HttpError } from '../http/errors.js';
import type { Logger } from '../log.js';
import type { Device, PlannedRecord, Storage } from '../storage/types.js';
import type { DeviceKeyCache } from './device-keys.js';
import { verifyJwsNode, type VerifiedBytes } from './verify.js';
import { parsesLikeItsCanonicalText, type FreshReadings } from '../grading/fresh-readings.js';
import type { Reading } from '../../domain/index.js';
import type { JwsKind } from '../../protocol/index.js';

export interface SyncDeps {
  readonly storage: Storage;
  readonly deviceKeys: DeviceKeyCache;
  readonly log: Logger;
  readonly now: () => Date;
  readonly regrade: (seamIds: readonly string[]) => void;
  /** Where the ingest leaves the readings it stored, for the re-grade that follows (see FreshReadings). */
  readonly fresh?: FreshReadings;
}

export function parseBody(text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new HttpError(400, 'malformed', 'the body is not JSON: send the flattened JWS as JSON');
  }
}

/**
 * Checks a device-signed request up to the signature: a flattened JWS, a strict header of the expected kind, a
 * kid that names an enrolled and unrevoked device, and a signature that verifies with that device's key.
 */
export async function verifyDeviceRequest(
  deps: SyncDeps,
  bodyText: string,
  kind: JwsKind,
): Promise<{ device: Device; jws: FlattenedJws; verified: VerifiedBytes }> {
  const jws = readJwsBody(bodyText) ?? parseFlattenedJws(parseBody(bodyText));
  const header = readProtectedHeader(jws, kind);
  const device = await deps.storage.getDevice(header.kid);
  if (!device) {
    deps.log.warn('security', { what: 'unknownKey', kind, kid: header.kid });
    throw new HttpError(401, 'unknownKey', 'no device is enrolled with this key: enrol the device first');
  }
  if (device.revokedAt !== null) {
    deps.log.warn('security', { what: 'revokedKey', kind, kid: device.kid });
    await deps.storage.recordSecurityEvent(
      deps.now().toISOString(),
      'revokedKeyUsed',
      device.kid,
      JSON.stringify({ kind }),
    );
    throw new HttpError(
      403,
      'revoked',
      'this device was revoked by a supervisor; it must be enrolled again as a new device',
    );
  }
  const key = deps.deviceKeys.get(device.kid, device.publicJwk);
  try {
    return { device, jws, verified: verifyJwsNode(jws, kind, key) };
  } catch (error) {
    deps.log.warn('security', { what: 'badSignature', kind, kid: device.kid });
    await deps.storage.recordSecurityEvent(
      deps.now().toISOString(),
      'badSignature',
      device.kid,
      JSON.stringify({ kind }),
    );
    throw error;
  }
}

const sha256 = (bytes: Uint8Array): string => createHash('sha256').update(bytes).digest('hex');

/**
 * Judges every record of a verified batch payload into what storage will hold. onReading sees each valid reading
 * as judged, by its place in the batch.
 */
export function planRecords(
  records: readonly unknown[],
  onReading?: (index: number, reading: Reading) => void,
): PlannedRecord[] {
  return records.map((input, index): PlannedRecord => {
    const verdict = judgeRecord(input);
    switch (verdict.status) {
      case 'valid': {
        const r = verdict.record;
        if (isDemoId(r.seamId)) {
          return {
            index,
            status: 'rejected',
            id: r.id,
            reason: 'seamId: demo seams stay on the device and never sync',
          };
        }
        if (onReading && r.kind === 'reading') onReading(index, r.body.reading);
        // A valid reading body is, member for member, the one received: its schema holds closed objects only and
        // changes no value. Written from the received value, whose members a canonical payload keeps in order, the
        // canonical text comes from JSON.stringify. (Set-ups can differ: a record-of-levels schema drops some keys.)
        // When the judge already saw every member in order, no second walk is needed to know that.
        const body = verdict.bodyInOrder
          ? JSON.stringify(r.body)
          : canonicalJson(r.kind === 'reading' ? (input as { body: unknown }).body : r.body);
        return {
          index,
          status: 'valid',
          id: r.id,
          kind: r.kind,
          schemaVersion: r.schemaVersion,
          seamId: r.seamId,
          seq: r.seq,
          body,
          createdAt: r.createdAt,
        };
      }
      case 'parked': {
        // Transport members (the device's sequence number and clock) are not part of the record's content.
        const content = Object.fromEntries(
          Object.entries(verdict.raw).filter(([k]) => k !== 'seq' && k !== 'createdAt'),
        );
        return {
          index,
          status: 'parked',
          id: verdict.id,
          kind: verdict.kind,
          schemaVersion: verdict.schemaVersion,
          seamId: verdict.seamId,
          record: canonicalJson(content),
        };
      }
      case 'rejected':
        return { index, status: 'rejected', id: verdict.id, reason: verdict.reason };
    }
  });
}

/** The stages of an apply, for `npm run bench:ingest` to say where the time goes. */
export type IngestStage = 'parseVerify' | 'validate' | 'store';

/** Applies one batch request body. Throws HttpError (4xx) for anything refused as a whole. */
export async function ingestBatch(
  deps: SyncDeps,
  bodyText: string,
  timed?: (stage: IngestStage, ms: number) => void,
): Promise<BatchReply> {
  let mark = timed ? performance.now() : 0;
  const lap = (stage: IngestStage) => {
    if (!timed) return;
    const t = performance.now();
    timed(stage, t - mark);
    mark = t;
  };
  const { device, verified } = await verifyDeviceRequest(deps, bodyText, 'batch');
  lap('parseVerify');
  const payload = parseBatchPayload(verified.payload);
  const readings = new Map<number, Reading>();
  const handOver = deps.fresh !== undefined && parsesLikeItsCanonicalText(verified.payloadText);
  const planned = planRecords(
    payload.records,
    handOver ? (index, reading) => readings.set(index, reading) : undefined,
  );
  lap('validate');
  const receivedAt = deps.now().toISOString();
  const outcome = await deps.storage.applyBatch({
    batchId: payload.batchId,
    deviceKid: device.kid,
    deviceSeq: payload.deviceSeq,
    // The payload's bytes are checked UTF-8, so this is the hash of payloadText's UTF-8 as well.
    payloadSha256: sha256(verified.payloadBytes),
    jws: bodyText,
    jwsPayload: verified.payloadDecoded,
    receivedAt,
    records: planned,
    deviceGrades: (payload.deviceGrades ?? []).map((g) => ({ seamId: g.seamId, grade: canonicalJson(g) })),
  });
  lap('store');
  if (outcome.kind === 'conflict') {
    deps.log.warn('security', {
      what: 'batchConflict',
      kid: device.kid,
      batchId: payload.batchId,
      reason: outcome.reason,
    });
    await deps.storage.recordSecurityEvent(
      receivedAt,
      'batchConflict',
      device.kid,
      JSON.stringify({ batchId: payload.batchId, reason: outcome.reason }),
    );
    throw new HttpError(422, 'batchConflict', `${outcome.reason}: nothing of it was applied`);
  }
  for (const id of outcome.conflicts) {
    deps.log.warn('security', {
      what: 'recordIdConflict',
      kid: device.kid,
      batchId: payload.batchId,
      recordId: id,
    });
  }
  if (deps.fresh && handOver) {
    for (const r of outcome.results) {
      const reading = r.status === 'accepted' ? readings.get(r.index) : undefined;
      const p = planned[r.index];
      if (reading && p?.status === 'valid') deps.fresh.add(p.seamId, p.id, reading);
    }
  }
  if (outcome.seamsChanged.length) deps.regrade(outcome.seamsChanged);
  const counts = { accepted: 0, duplicate: 0, parked: 0, rejected: 0 };
  for (const r of outcome.results) counts[r.status] += 1;
  deps.log.info('batch', { kid: device.kid, batchId: payload.batchId, replay: outcome.replay, ...counts });
  return {
    protocol: PROTOCOL_VERSION,
    batchId: payload.batchId,
    replay: outcome.replay,
    results: outcome.results,
  };
}
