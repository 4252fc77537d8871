// Everything the review shows about one seam, gathered once and used by the seam page, the JSON API, the audit
// view, the exports and the inspection report: the set-up, every reading with who, when, which device and
// instrument (corrections shown as superseding, nothing hidden), the server's grade beside the devices', the
// assessment, each batch's signature checked again now, and the decisions with their own signatures checked.
import {
  parseFlattenedJws,
  ProtocolError,
  type DecisionOutcome,
  type FlattenedJws,
} from '../../protocol/index.js';
import type { Reading, Round, Seam } from '../../domain/index.js';
import type { AppDeps } from '../deps.js';
import { HttpError } from '../http/errors.js';
import type {
  BatchRow,
  ChangeRow,
  DecisionRow,
  Device,
  DeviceGradeRow,
  SeamNamespace,
  ServerGrade,
  StoredRecord,
} from '../storage/types.js';
import { publicKeyObject, verifyJwsNode } from '../sync/verify.js';
import { gradesDiffer, latestDeviceGrade } from './facts.js';
import { reviewSeam, type SeamReview } from './seam-review.js';

export type ReadingStatus =
  /** Counts in the grade. */
  | 'current'
  /** Replaced by a later correction (which names it in `supersedes`). */
  | 'superseded'
  /** Taken back by a withdrawal. */
  | 'withdrawn'
  /** The withdrawal itself (carries no values). */
  | 'withdrawal'
  /** Stored, but left out of the grade with the grader's reason (e.g. it does not fit the seam). */
  | 'leftOut';

export interface ReadingLine {
  readonly recordId: string;
  readonly reading: Reading;
  readonly status: ReadingStatus;
  /** The reading that replaced or withdrew this one. */
  readonly supersededBy: string | null;
  readonly leftOutReason: string | null;
  readonly deviceKid: string | null;
  readonly deviceName: string | null;
  readonly batchId: string | null;
  /** Server clock. */
  readonly receivedAt: string;
  readonly receiveSeq: number;
}

export interface BatchCheck {
  readonly batchId: string;
  readonly deviceKid: string;
  readonly deviceName: string | null;
  readonly deviceRevokedAt: string | null;
  readonly deviceSeq: number;
  readonly receivedAt: string;
  readonly recordCount: number;
  /** The body exactly as received. */
  readonly jws: string;
  /** The kid in the batch's protected header. */
  readonly kid: string | null;
  readonly verified: boolean;
  readonly problem: string | null;
}

export interface DecisionLine extends DecisionRow {
  readonly verified: boolean;
}

export interface DeviceGradeLine {
  readonly deviceKid: string;
  readonly deviceName: string | null;
  readonly batchSeq: number;
  readonly state: string | null;
  readonly levelMet: string | null;
  readonly meetsRequired: boolean | null;
  readonly readingCount: number | null;
  readonly gradedAt: string | null;
}

export interface AssignmentLine {
  readonly id: string;
  readonly deviceKid: string | null;
  readonly deviceName: string | null;
  /** The inspector account the seam was assigned to (every tablet working for that inspector pulls it). */
  readonly inspector: string | null;
  readonly note: string | null;
  readonly assignedBy: string | null;
  readonly assignedAt: string;
}

export interface SeamDetail {
  readonly id: string;
  readonly namespace: SeamNamespace;
  readonly seam: Seam | null;
  readonly rounds: readonly Round[];
  readonly review: SeamReview;
  readonly serverGrade: ServerGrade | null;
  readonly readings: readonly ReadingLine[];
  /** Every record of the seam as stored, in receive order (the audit trail). */
  readonly records: readonly StoredRecord[];
  readonly deviceGrades: readonly DeviceGradeLine[];
  /** The newest device grade differs from the server's level. */
  readonly mismatch: boolean;
  readonly batches: readonly BatchCheck[];
  readonly decisions: readonly DecisionLine[];
  readonly assignments: readonly AssignmentLine[];
  readonly changes: readonly ChangeRow[];
  /** The newest record the page shows (a decision made from it carries this). */
  readonly latestRecordSeq: number;
  readonly devices: ReadonlyMap<string, Device>;
}

const problemText = (error: unknown): string =>
  error instanceof ProtocolError ? error.message : 'the stored body could not be read as a flattened JWS';

/** Checks a stored batch again with its device's enrolled key: the signature over the exact bytes received. */
export function checkBatch(batch: BatchRow, device: Device | undefined): BatchCheck {
  const base = {
    batchId: batch.batchId,
    deviceKid: batch.deviceKid,
    deviceName: device?.name ?? null,
    deviceRevokedAt: device?.revokedAt ?? null,
    deviceSeq: batch.deviceSeq,
    receivedAt: batch.receivedAt,
    recordCount: batch.recordCount,
    jws: batch.jws,
  };
  let jws: FlattenedJws;
  try {
    jws = parseFlattenedJws(JSON.parse(batch.jws));
  } catch (error) {
    return { ...base, kid: null, verified: false, problem: problemText(error) };
  }
  if (!device) return { ...base, kid: null, verified: false, problem: 'the device is not known' };
  try {
    const verified = verifyJwsNode(jws, 'batch', publicKeyObject(device.publicJwk));
    if (verified.header.kid !== device.kid) {
      return { ...base, kid: verified.header.kid, verified: false, problem: 'the kid names another key' };
    }
    return { ...base, kid: verified.header.kid, verified: true, problem: null };
  } catch (error) {
    return { ...base, kid: null, verified: false, problem: problemText(error) };
  }
}

/** Checks a decision's stored JWS with the server's key. */
export function checkDecision(deps: AppDeps, d: DecisionRow): boolean {
  try {
    const jws = parseFlattenedJws(JSON.parse(d.jws));
    const verified = verifyJwsNode(
      jws,
      'decision',
      publicKeyObject(JSON.stringify(deps.serverKey.publicJwk)),
    );
    const event = verified.payload as { id?: unknown; seamId?: unknown; outcome?: unknown };
    return (
      verified.header.kid === deps.serverKey.kid &&
      event.id === d.id &&
      event.seamId === d.seamId &&
      event.outcome === d.outcome
    );
  } catch {
    return false;
  }
}

export function readingLines(
  review: SeamReview,
  records: readonly StoredRecord[],
  devices: ReadonlyMap<string, Device>,
): ReadingLine[] {
  const byId = new Map(records.map((r) => [r.id, r]));
  const replacedBy = new Map<string, { by: string; withdrawn: boolean }>();
  for (const { reading } of review.folded.readings) {
    if (reading.supersedes !== undefined) {
      replacedBy.set(reading.supersedes, { by: reading.id, withdrawn: reading.withdrawn === true });
    }
  }
  const left = new Map(review.summary.leftOut.map((l) => [l.recordId, l.reason]));
  return review.folded.readings
    .map(({ recordId, reading }): ReadingLine => {
      const record = byId.get(recordId);
      const replaced = replacedBy.get(reading.id);
      const leftOut = left.get(recordId) ?? null;
      const status: ReadingStatus = leftOut
        ? 'leftOut'
        : reading.withdrawn
          ? 'withdrawal'
          : replaced
            ? replaced.withdrawn
              ? 'withdrawn'
              : 'superseded'
            : 'current';
      const kid = record?.deviceKid ?? null;
      return {
        recordId,
        reading,
        status,
        supersededBy: replaced?.by ?? null,
        leftOutReason: leftOut,
        deviceKid: kid,
        deviceName: kid ? (devices.get(kid)?.name ?? null) : null,
        batchId: record?.batchId ?? null,
        receivedAt: record?.receivedAt ?? '',
        receiveSeq: record?.receiveSeq ?? 0,
      };
    })
    .sort(
      (a, b) =>
        a.reading.round - b.reading.round ||
        (a.reading.position ?? a.reading.start ?? 0) - (b.reading.position ?? b.reading.start ?? 0) ||
        a.receiveSeq - b.receiveSeq,
    );
}

function deviceGradeLines(rows: readonly DeviceGradeRow[], devices: ReadonlyMap<string, Device>) {
  return rows.map((r): DeviceGradeLine => {
    const g = JSON.parse(r.grade) as Partial<{
      state: string;
      levelMet: string | null;
      meetsRequired: boolean | null;
      readingCount: number;
      gradedAt: string;
    }>;
    return {
      deviceKid: r.deviceKid,
      deviceName: devices.get(r.deviceKid)?.name ?? null,
      batchSeq: r.batchSeq,
      state: g.state ?? null,
      levelMet: g.levelMet ?? null,
      meetsRequired: g.meetsRequired ?? null,
      readingCount: g.readingCount ?? null,
      gradedAt: g.gradedAt ?? null,
    };
  });
}

function assignmentLines(
  changes: readonly ChangeRow[],
  devices: ReadonlyMap<string, Device>,
  inspectors: ReadonlyMap<number, string>,
) {
  return changes
    .filter((c) => c.kind === 'assignment')
    .map((c): AssignmentLine => {
      const item = JSON.parse(c.item) as { note?: string; assignedBy?: string };
      return {
        id: c.itemId,
        deviceKid: c.deviceKid,
        deviceName: c.deviceKid ? (devices.get(c.deviceKid)?.name ?? null) : null,
        inspector: c.inspectorId !== null ? (inspectors.get(c.inspectorId) ?? null) : null,
        note: item.note ?? null,
        assignedBy: item.assignedBy ?? null,
        assignedAt: c.createdAt,
      };
    });
}

export async function seamDetail(
  deps: AppDeps,
  seamId: string,
  options: { readonly sensitivity: boolean } = { sensitivity: true },
): Promise<SeamDetail> {
  const s = deps.storage;
  const [row, material, grade, deviceGrades, batches, decisions, changes, deviceList, inspectorList] =
    await Promise.all([
      s.getSeam(seamId),
      s.seamMaterial(seamId),
      s.getServerGrade(seamId),
      s.listDeviceGrades(seamId),
      s.batchesOfSeam(seamId),
      s.listDecisions(seamId),
      s.listChangesOfSeam(seamId),
      s.listDevices(),
      s.listAccounts('inspector'),
    ]);
  if (!row && material.records.length === 0) {
    throw new HttpError(404, 'unknownSeam', `no seam "${seamId}" is known to this server`);
  }
  const devices = new Map(deviceList.map((d) => [d.kid, d]));
  const review = reviewSeam(material, grade, { readings: 'objects', sensitivity: options.sensitivity });
  const latest = latestDeviceGrade(deviceGrades);
  return {
    id: seamId,
    namespace: row?.namespace ?? 'live',
    seam: review.folded.seam,
    rounds: review.folded.rounds,
    review,
    serverGrade: grade ?? null,
    readings: readingLines(review, material.records, devices),
    records: material.records,
    deviceGrades: deviceGradeLines(deviceGrades, devices),
    mismatch: gradesDiffer(review.summary.levelMet, latest),
    batches: batches.map((b) => checkBatch(b, devices.get(b.deviceKid))),
    decisions: decisions.map((d) => ({ ...d, verified: checkDecision(deps, d) })),
    assignments: assignmentLines(changes, devices, new Map(inspectorList.map((a) => [a.id, a.username]))),
    changes,
    latestRecordSeq: material.records.reduce((n, r) => Math.max(n, r.receiveSeq), 0),
    devices,
  };
}

/** The round a new decision is about: the latest the seam has. */
export const currentRound = (d: SeamDetail): number => d.rounds[d.rounds.length - 1]?.number ?? 1;

export const outcomeOf = (d: SeamDetail): DecisionOutcome | null =>
  d.decisions[d.decisions.length - 1]?.outcome ?? null;
