// The storage contract of the yard server. Every statement lives behind it: the HTTP layer and the sync logic
// speak only these operations, each atomic, so a PostgreSQL store can stand beside the SQLite one. Methods are
// asynchronous for that reason even where SQLite answers at once. Times are ISO 8601 UTC strings from the server
// clock (never a device's); JSON columns hold canonical JSON text.
import type { RecordResult } from '../../protocol/index.js';
import type { PayloadBytes } from '../sync/payload-bytes.js';

export type Role = 'supervisor' | 'inspector';
export type SeamNamespace = 'live' | 'demo';

export interface Account {
  readonly id: number;
  readonly username: string;
  readonly role: Role;
  readonly mustChangePassword: boolean;
  readonly createdAt: string;
}

export interface AccountWithHash extends Account {
  readonly passwordHash: string;
}

export interface NewAccount {
  readonly username: string;
  readonly role: Role;
  readonly passwordHash: string;
  readonly mustChangePassword: boolean;
  readonly createdAt: string;
}

export interface ServerKeyRow {
  readonly kid: string;
  readonly privateJwk: string;
  readonly publicJwk: string;
  readonly createdAt: string;
}

export interface Device {
  readonly kid: string;
  readonly publicJwk: string;
  readonly name: string;
  readonly enrolledAt: string;
  readonly revokedAt: string | null;
  readonly lastContactAt: string | null;
  /** Outbox length the device last reported (in a pull), with the time of its oldest waiting record. */
  readonly reportedQueue: number | null;
  readonly reportedOldestAt: string | null;
  readonly reportedAt: string | null;
  /** The inspector account the device works for (named by a supervisor): it pulls that inspector's seams. */
  readonly inspectorId: number | null;
  readonly inspectorName: string | null;
}

export interface EnrolmentCodeRow {
  readonly codeHash: string;
  readonly createdBy: number;
  readonly createdAt: string;
  readonly expiresAt: string;
  /** The inspector account a device enrolled with this code works for. */
  readonly inspectorId?: number | null;
}

export interface EnrolAttempt {
  readonly codeHash: string;
  readonly now: string;
  readonly kid: string;
  readonly publicJwk: string;
  readonly name: string;
}

export type EnrolOutcome =
  | { readonly kind: 'enrolled' | 'alreadyEnrolled'; readonly device: Device }
  | { readonly kind: 'codeUnknown' | 'codeExpired' | 'codeUsed' | 'revoked' };

/** One record of a batch as the sync layer judged it, ready to store. */
export type PlannedRecord =
  | {
      readonly index: number;
      readonly status: 'valid';
      readonly id: string;
      readonly kind: string;
      readonly schemaVersion: number;
      readonly seamId: string;
      readonly seq: number;
      /** Canonical JSON of the body: equal content gives equal text. */
      readonly body: string;
      readonly createdAt: string;
    }
  | {
      readonly index: number;
      readonly status: 'parked';
      readonly id: string;
      readonly kind: string;
      readonly schemaVersion: number;
      readonly seamId: string | null;
      /** Canonical JSON of the whole record as sent, less its transport members (seq, createdAt). */
      readonly record: string;
    }
  | {
      readonly index: number;
      readonly status: 'rejected';
      readonly id: string | null;
      readonly reason: string;
    };

export interface BatchPlan {
  readonly batchId: string;
  readonly deviceKid: string;
  readonly deviceSeq: number;
  /** SHA-256 of the payload bytes: the same batch id must always come with the same payload. */
  readonly payloadSha256: string;
  /** The request body exactly as received (the JWS), kept for audit. */
  readonly jws: string;
  /**
   * The JWS payload member as it appears in jws, decoded: a store may keep the bytes instead of the text, when they
   * encode back to exactly that text.
   */
  readonly jwsPayload?: PayloadBytes;
  readonly receivedAt: string;
  readonly records: readonly PlannedRecord[];
  readonly deviceGrades: readonly { readonly seamId: string; readonly grade: string }[];
}

export type BatchOutcome =
  | {
      readonly kind: 'applied';
      readonly replay: boolean;
      readonly results: readonly RecordResult[];
      /** Seams that gained records in this apply: the ones to re-grade. */
      readonly seamsChanged: readonly string[];
      /** Records whose id was already held with other content: each also logged as a security event. */
      readonly conflicts: readonly string[];
    }
  | { readonly kind: 'conflict'; readonly reason: string };

export interface StoredRecord {
  /** The server's receive order. */
  readonly receiveSeq: number;
  readonly id: string;
  readonly kind: string;
  readonly schemaVersion: number;
  readonly seamId: string;
  readonly deviceKid: string | null;
  readonly batchId: string | null;
  readonly deviceSeq: number;
  readonly body: string;
  readonly deviceCreatedAt: string;
  readonly receivedAt: string;
}

export interface ParkedRecord {
  readonly id: string;
  readonly kind: string;
  readonly schemaVersion: number;
  readonly seamId: string | null;
  readonly deviceKid: string;
  readonly batchId: string;
  readonly record: string;
  readonly receivedAt: string;
}

export interface SeamRow {
  readonly id: string;
  readonly namespace: SeamNamespace;
  /** The set-up (canonical JSON of a Seam) the supervisor or the demo gave; devices' set-ups are records. */
  readonly setup: string;
  readonly createdAt: string;
}

export interface SeamMaterial {
  readonly seam: SeamRow | undefined;
  readonly records: readonly StoredRecord[];
}

/** A record as the grade folds it; body is null for a record the caller said it holds already. */
export interface GradeRecord {
  readonly receiveSeq: number;
  readonly id: string;
  readonly kind: string;
  readonly deviceKid: string | null;
  readonly deviceSeq: number;
  readonly body: string | null;
}

export interface GradeMaterial {
  readonly seam: SeamRow | undefined;
  readonly records: readonly GradeRecord[];
}

export interface ServerGrade {
  readonly seamId: string;
  /** The newest receive sequence number folded in: an older grade never overwrites a newer one. */
  readonly basedOn: number;
  readonly gradedAt: string;
  readonly state: string;
  readonly levelMet: string | null;
  readonly meetsRequired: boolean | null;
  /** JSON: the grade summary and any records left out of it, with reasons. */
  readonly summary: string;
}

export interface DeviceGradeRow {
  readonly seamId: string;
  readonly deviceKid: string;
  readonly batchSeq: number;
  readonly grade: string;
}

export interface ChangeRow {
  readonly seq: number;
  readonly kind: 'assignment' | 'decision';
  readonly itemId: string;
  readonly seamId: string;
  /** The device an assignment is for; null for a decision (it goes to every device that worked on the seam). */
  readonly deviceKid: string | null;
  /** The inspector account an assignment is for (device_kid null): every device tied to it pulls it. */
  readonly inspectorId: number | null;
  readonly item: string;
  readonly createdAt: string;
}

export interface NewChange {
  readonly kind: ChangeRow['kind'];
  readonly itemId: string;
  readonly seamId: string;
  readonly deviceKid: string | null;
  readonly inspectorId?: number | null;
  readonly item: string;
  readonly createdAt: string;
  readonly createdBy: number | null;
}

export interface SecurityEvent {
  readonly id: number;
  readonly at: string;
  readonly kind: string;
  readonly deviceKid: string | null;
  readonly detail: string;
}

export interface BatchRow {
  readonly batchId: string;
  readonly deviceKid: string;
  readonly deviceSeq: number;
  readonly payloadSha256: string;
  readonly jws: string;
  readonly recordCount: number;
  readonly receivedAt: string;
}

/** What the review queue filters and sorts on, derived per seam after each re-grade (see review/facts.ts). */
export interface ReviewFacts {
  readonly seamId: string;
  readonly namespace: SeamNamespace;
  readonly label: string;
  readonly tags: readonly string[];
  readonly organisation: string | null;
  readonly area: string | null;
  readonly drawing: string | null;
  readonly welder: string | null;
  readonly procedure: string | null;
  readonly requiredLevel: string | null;
  readonly edition: string | null;
  /** The server grade's state (graded, incomplete, noReadings, noSetup, noRounds, invalid). */
  readonly state: string;
  readonly levelMet: string | null;
  /** 3 for B down to 0 for below D (sorts worst first ascending); null when not graded. */
  readonly levelRank: number | null;
  readonly meetsRequired: boolean | null;
  readonly gradedRound: number | null;
  readonly latestRound: number | null;
  readonly readingCount: number;
  /** Values within the instrument resolution of a limit, in the round the grade comes from (else the latest). */
  readonly borderlineCount: number;
  /** The seam assessment's fatigue-class flag: 'below' when the measured geometry falls short of the required FAT. */
  readonly fatFlag: 'meets' | 'below' | 'notAssessable' | null;
  /** Whether every measured parameter had enough at-pitch positions (null: nothing to judge). */
  readonly samplingAdequate: boolean | null;
  readonly unverifiedRows: number;
  /** The level the newest device grade reported, and whether it differs from the server's. */
  readonly deviceLevelMet: string | null;
  readonly gradeMismatch: boolean;
  /** First and last inspection day by the device clocks (readings, rounds), YYYY-MM-DD. */
  readonly inspectedFirst: string | null;
  readonly inspectedLast: string | null;
  readonly lastReceivedAt: string | null;
  /** The newest receive sequence number of the seam's records folded in. */
  readonly basedOn: number;
  /** The server grade these facts were made with. */
  readonly gradedAt: string;
  readonly computedAt: string;
  readonly inspectors: readonly string[];
}

export const REVIEW_FLAGS = [
  'belowRequired',
  'fatBelow',
  'samplingShort',
  'borderline',
  'unreviewed',
] as const;
export type ReviewFlag = (typeof REVIEW_FLAGS)[number];

export const REVIEW_SORTS = [
  'label',
  'level',
  'required',
  'welder',
  'procedure',
  'drawing',
  'area',
  'inspected',
  'received',
  'borderline',
  'decision',
] as const;
export type ReviewSort = (typeof REVIEW_SORTS)[number];

export interface ReviewQuery {
  /** Every flag given must hold (below required level, fatigue flag below, …). */
  readonly flags: readonly ReviewFlag[];
  readonly welder: string | null;
  readonly procedure: string | null;
  readonly drawing: string | null;
  readonly area: string | null;
  readonly deviceKid: string | null;
  readonly inspector: string | null;
  /** Inspection days (device clock) overlapping from..to, YYYY-MM-DD, both inclusive. */
  readonly from: string | null;
  readonly to: string | null;
  /** Part of the label, seam id or a tag. */
  readonly text: string | null;
  readonly sort: ReviewSort;
  readonly descending: boolean;
  readonly offset: number;
  readonly limit: number;
}

export interface DecisionRow {
  readonly seq: number;
  readonly id: string;
  readonly seamId: string;
  readonly round: number;
  readonly outcome: 'accepted' | 'rework' | 'moreReadings';
  readonly comment: string | null;
  readonly decidedBy: number;
  readonly decidedByName: string;
  readonly decidedAt: string;
  /** The newest receive sequence number of the seam's records the supervisor saw. */
  readonly basedOn: number;
  readonly serverLevelMet: string | null;
  /** The decision event signed by the server key (flattened JWS JSON, typ beadbook-decision+jws). */
  readonly jws: string;
  readonly changeSeq: number;
}

export type NewDecision = Omit<DecisionRow, 'seq' | 'changeSeq'> & {
  /** The seam's newest decision the event names as its previous one (null for the first): checked on insert. */
  readonly previousId: string | null;
  /** The item devices pull (canonical JSON). */
  readonly item: string;
};

export type DecisionOutcomeOfAdd =
  | { readonly kind: 'added'; readonly decision: DecisionRow; readonly change: ChangeRow }
  /** Another decision on the seam was recorded meanwhile: sign again naming it as the previous one. */
  | { readonly kind: 'stale'; readonly latestId: string | null };

export interface ReviewQueueRow extends Omit<ReviewFacts, 'inspectors'> {
  readonly decision: {
    readonly id: string;
    readonly outcome: DecisionRow['outcome'];
    readonly round: number;
    readonly decidedAt: string;
    readonly decidedByName: string;
  } | null;
  /** A decision was made on every record the seam holds. */
  readonly reviewed: boolean;
}

export interface ReviewQueuePage {
  readonly rows: readonly ReviewQueueRow[];
  /** Seams matching every filter. */
  readonly total: number;
  /** Seams matching the filters other than the flags, and how many of those carry each flag. */
  readonly scope: number;
  readonly counts: Readonly<Record<ReviewFlag, number>>;
}

export interface Choice {
  readonly value: string;
  readonly label: string;
  readonly count: number;
}

export interface ReviewChoices {
  readonly welders: readonly Choice[];
  readonly procedures: readonly Choice[];
  readonly drawings: readonly Choice[];
  readonly areas: readonly Choice[];
  readonly devices: readonly Choice[];
  readonly inspectors: readonly Choice[];
}

export interface Storage {
  readonly dialect: string;
  close(): Promise<void>;

  // Accounts and sessions
  countAccounts(): Promise<number>;
  createAccount(account: NewAccount): Promise<Account>;
  findAccount(username: string): Promise<AccountWithHash | undefined>;
  /** Accounts of the role, by name. */
  listAccounts(role: Role): Promise<Account[]>;
  setPassword(accountId: number, passwordHash: string, mustChangePassword: boolean): Promise<void>;
  createSession(tokenHash: string, accountId: number, createdAt: string, expiresAt: string): Promise<void>;
  /** The account of an unexpired session. */
  findSession(tokenHash: string, now: string): Promise<Account | undefined>;
  deleteSession(tokenHash: string): Promise<void>;
  /** Ends every session of the account (after a password change), except the one given. */
  deleteSessionsOf(accountId: number, keepTokenHash: string | null): Promise<void>;

  // The server's signing key (made on first start)
  getServerKey(): Promise<ServerKeyRow | undefined>;
  /** Stores the key unless one exists already; returns the key in force. */
  saveServerKey(key: ServerKeyRow): Promise<ServerKeyRow>;

  // Devices
  createEnrolmentCode(code: EnrolmentCodeRow): Promise<void>;
  /** Uses the code and enrols the device in one transaction. */
  enrolDevice(attempt: EnrolAttempt): Promise<EnrolOutcome>;
  getDevice(kid: string): Promise<Device | undefined>;
  listDevices(): Promise<Device[]>;
  renameDevice(kid: string, name: string): Promise<boolean>;
  revokeDevice(kid: string, at: string): Promise<boolean>;
  touchDevice(kid: string, at: string, report?: { queued: number; oldestAt: string | null }): Promise<void>;
  /**
   * Ties the device to an inspector account (or to none), in one transaction: the inspector's assignments made
   * so far are added as changes addressed to the device (made by `copy` from each seam's newest one), so a
   * device that pulled before still receives them. False when there is no such device.
   */
  tieDevice(
    kid: string,
    inspectorId: number | null,
    copy: (assignment: ChangeRow) => NewChange,
  ): Promise<boolean>;

  // Pull nonces: issued, then accepted once before they expire
  issueNonce(nonce: string, expiresAt: string): Promise<void>;
  consumeNonce(nonce: string, now: string): Promise<boolean>;

  // Sync
  applyBatch(plan: BatchPlan): Promise<BatchOutcome>;
  getBatch(batchId: string): Promise<BatchRow | undefined>;
  recordSecurityEvent(at: string, kind: string, deviceKid: string | null, detail: string): Promise<void>;
  listSecurityEvents(limit: number): Promise<SecurityEvent[]>;
  listRecords(filter: { seamId?: string; deviceKid?: string }): Promise<StoredRecord[]>;
  listParked(): Promise<ParkedRecord[]>;
  /** Records added by the server itself (the demo yard): no device, no batch. */
  insertServerRecords(
    records: readonly Omit<StoredRecord, 'receiveSeq' | 'deviceKid' | 'batchId'>[],
  ): Promise<number>;

  // Seams and grades
  putSeam(seam: SeamRow, createdBy: number | null): Promise<'created' | 'updated'>;
  getSeam(id: string): Promise<SeamRow | undefined>;
  listSeamIds(): Promise<string[]>;
  /** What a grade is computed from: the seam's set-up given on the server, and every record of the seam. */
  seamMaterial(seamId: string): Promise<SeamMaterial>;
  /**
   * seamMaterial as the re-grade needs it: the bodies of the records named in bodiesHeld (which the caller holds
   * parsed already) may be left out, as null.
   */
  gradeMaterial(seamId: string, bodiesHeld: ReadonlySet<string>): Promise<GradeMaterial>;
  /** The seam's viewing records alone, in the order received: its viewing conditions without reading the rest. */
  viewingRecordsOf(seamId: string): Promise<StoredRecord[]>;
  saveServerGrade(grade: ServerGrade): Promise<void>;
  /** Seams holding records newer than their server grade (a re-grade was lost, e.g. to a restart). */
  staleSeams(): Promise<string[]>;
  getServerGrade(seamId: string): Promise<ServerGrade | undefined>;
  listDeviceGrades(seamId: string): Promise<DeviceGradeRow[]>;

  // What devices pull
  addChange(change: NewChange): Promise<ChangeRow>;
  /**
   * The device's changes after `afterSeq`, oldest first, at most `limit`; `through` is the last change number
   * the answer covers (the next cursor), whether or not it was for this device.
   */
  changesFor(
    kid: string,
    afterSeq: number,
    limit: number,
  ): Promise<{ changes: ChangeRow[]; through: number; more: boolean }>;

  /** Seams ever assigned to the device, or to the inspector account, by id. */
  assignedSeams(target: { readonly deviceKid: string } | { readonly inspectorId: number }): Promise<string[]>;

  // Review (decisions, facts for the queue)
  /** The newest receive sequence number among the seam's records (0 when it has none). */
  latestRecordSeq(seamId: string): Promise<number>;
  /** Records the decision and the change devices pull, in one transaction, if previousId is still the newest. */
  addDecision(decision: NewDecision): Promise<DecisionOutcomeOfAdd>;
  getDecision(id: string): Promise<DecisionRow | undefined>;
  /** The seam's decisions, oldest first. */
  listDecisions(seamId: string): Promise<DecisionRow[]>;
  /** The seam's changes (assignments and decisions) in order. */
  listChangesOfSeam(seamId: string): Promise<ChangeRow[]>;
  /** The batches that brought records of the seam, in the order received, each as getBatch gives it. */
  batchesOfSeam(seamId: string): Promise<BatchRow[]>;
  /** Keeps the facts unless newer ones are held (by basedOn, then gradedAt). */
  saveReviewFacts(facts: ReviewFacts): Promise<void>;
  /** Seams whose server grade is newer than their review facts, or that have none. */
  staleReviewFacts(): Promise<string[]>;
  getReviewFacts(seamId: string): Promise<ReviewFacts | undefined>;
  reviewQueue(query: ReviewQuery): Promise<ReviewQueuePage>;
  /** Seam ids matching the query's filters, in its order, without paging (exports, reports of a selection). */
  reviewSelection(query: Omit<ReviewQuery, 'offset' | 'limit'>, max: number): Promise<string[]>;
  reviewChoices(): Promise<ReviewChoices>;

  /** Every row of the record tables in a fixed order, for a canonical dump (tests and audits). */
  dumpRecordTables(): Promise<Record<string, unknown[]>>;
}
