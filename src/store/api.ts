// The contract of the one module that touches IndexedDB. Screens and the sync code use only this.
import type { DeviceGrade } from '../protocol/batch.js';
import type { ViewingConditions } from '../domain/model/viewing.js';
import type {
  ChecklistAnswerKind,
  ChecklistItem,
  LevelMet,
  Reading,
  Round,
  Seam,
  SeamFile,
} from '../domain/index.js';

/** Demo data lives in its own namespace: marked wherever it shows, removable in one step, never synced. */
export type Namespace = 'live' | 'demo';

export interface SeamRecord {
  readonly id: string;
  readonly namespace: Namespace;
  readonly seam: Seam;
  /** Increases with every saved change of the set-up; each revision is also an outbox record when live. */
  readonly revision: number;
  readonly createdAt: string;
  readonly updatedAt: string;
  /** The last grade shown, cached for the Seams list; the grade itself is always recomputed by the worker. */
  readonly summary?: SeamSummary;
}

export interface SeamSummary {
  readonly state: 'graded' | 'incomplete' | 'noReadings';
  readonly levelMet: LevelMet | null;
  readonly meetsRequired: boolean | null;
  readonly readingCount: number;
  readonly gradedAt: string;
}

export interface RoundRecord {
  readonly seamId: string;
  readonly number: number;
  readonly kind: Round['kind'];
  readonly startedAt: string;
  readonly examiner?: { readonly name: string; readonly qualification?: string };
  readonly checklist: Round['checklist'];
  /** How the round was looked at (the latest the inspector gave; earlier ones stay in the outbox history). */
  readonly viewing?: ViewingConditions;
}

export interface ChecklistAnswer {
  readonly answer: ChecklistAnswerKind;
  readonly position?: number;
  readonly note?: string;
}

export interface ReadingRecord {
  readonly seamId: string;
  readonly namespace: Namespace;
  readonly reading: Reading;
  /** Device-local order of entry; the outbox and undo use it, never the clock. */
  readonly localSeq: number;
}

export type OutboxKind = 'seamSetup' | 'round' | 'checklistAnswer' | 'reading' | 'tagLink' | 'viewing';

/**
 * What each kind of outbox entry carries as its body (added with the store; `OutboxEntry.body` stays `unknown` for
 * readers that only pass it on). Times come from the device clock and are informative only.
 */
export interface OutboxBodies {
  readonly seamSetup: {
    readonly seamId: string;
    readonly revision: number;
    readonly seam: Seam;
    readonly savedAt: string;
  };
  readonly round: {
    readonly seamId: string;
    readonly number: number;
    readonly kind: Round['kind'];
    readonly startedAt: string;
    readonly examiner?: RoundRecord['examiner'];
  };
  readonly checklistAnswer: {
    readonly seamId: string;
    readonly round: number;
    readonly item: ChecklistItem;
    readonly answer: ChecklistAnswer;
    readonly answeredAt: string;
  };
  readonly reading: { readonly seamId: string; readonly reading: Reading };
  /** Version 4: a tag linked to or unlinked from a seam (a move is an unlink and a link, in one transaction). */
  readonly tagLink: {
    readonly seamId: string;
    readonly action: 'link' | 'unlink';
    readonly tag: string;
    readonly via: TagVia | 'confirmedMove';
    readonly at: string;
  };
  /** A round's viewing and lighting conditions (record schema version 2); a later one corrects an earlier one. */
  readonly viewing: {
    readonly seamId: string;
    readonly round: number;
    readonly conditions: ViewingConditions;
    readonly recordedAt: string;
  };
}

/** How a tag was read. */
export type TagVia = 'camera' | 'photo' | 'typed' | 'printed';

/** A tag fixed to the work, linked to one seam (version 4). Keyed by the tag's match key. */
export interface TagLinkRecord {
  readonly key: string;
  /** The tag as read (clean text; shown with shownTag). */
  readonly tag: string;
  readonly seamId: string;
  readonly namespace: Namespace;
  readonly linkedAt: string;
  readonly via: TagVia;
}

/** Where a tag leads: its owners (a link, or the set-ups listing it) and the scan outcome. */
export interface TagLookup {
  readonly tag: string;
  readonly key: string;
  readonly link: TagLinkRecord | undefined;
  /** Seams whose set-up lists the tag (consulted only when no link decides). */
  readonly setupSeamIds: readonly string[];
}

export interface OutboxEntry {
  /** Device sequence number (auto-increment): the order records were made on this device. */
  readonly seq: number;
  readonly recordId: string;
  readonly kind: OutboxKind;
  readonly seamId: string;
  readonly body: unknown;
  readonly createdAt: string;
}

/** A batch as sealed (signed) when first sent; kept until the server has answered every record in it. */
export interface SealedBatchRecord {
  readonly batchId: string;
  /** The batch's number on this device (1, 2, 3, …), in the order the batches were sealed. */
  readonly deviceSeq: number;
  /** The key it was signed with. */
  readonly kid: string;
  readonly recordIds: readonly string[];
  /** The exact request body: resent byte for byte, never sealed again. */
  readonly body: string;
  readonly sealedAt: string;
  readonly attempts: number;
  readonly lastAttemptAt?: string;
  readonly lastError?: string;
}

/** How sending went for one waiting record. */
export interface SendState {
  readonly recordId: string;
  /** The sealed batch it travels in, while that batch waits for an answer. */
  readonly batchId?: string;
  readonly attempts: number;
  readonly lastAttemptAt?: string;
  readonly lastError?: string;
  /** The server refused the record (it stays here, with the reason, and is not sent again by itself). */
  readonly rejected?: { readonly reason: string; readonly at: string };
}

/** A flattened JWS as the server signed it (kept so the item can be checked again later). */
export interface SignedItem {
  readonly protected: string;
  readonly payload: string;
  readonly signature: string;
}

/** A supervisor's review decision on a seam, as pulled and verified (version 6). */
export interface DecisionRecord {
  readonly id: string;
  readonly seamId: string;
  readonly round: number;
  readonly outcome: 'accepted' | 'rework' | 'moreReadings';
  readonly comment?: string;
  readonly decidedBy: string;
  /** Server clock. */
  readonly decidedAt: string;
  /** Device clock: when the pull stored it. */
  readonly receivedAt: string;
  /** When the inspector saw it on the seam's screen; until then the Seams list points it out. */
  readonly seenAt?: string;
  /** The round a "rework" decision opened on this device. */
  readonly roundOpened?: number;
  readonly signed: SignedItem;
}

/** A seam the supervisor assigned to this device (version 6). */
export interface AssignmentRecord {
  readonly id: string;
  readonly seamId: string;
  readonly note?: string;
  readonly assignedBy: string;
  readonly assignedAt: string;
  readonly receivedAt: string;
  /** Whether the seam was set up on this device from the assignment (false: it was here already). */
  readonly seamAdded: boolean;
  readonly signed: SignedItem;
}

/** One verified item of a pull, with the signed form it came in. */
export type PulledItem =
  | {
      readonly type: 'decision';
      readonly id: string;
      readonly seamId: string;
      readonly round: number;
      readonly outcome: DecisionRecord['outcome'];
      readonly comment?: string;
      readonly decidedBy: string;
      readonly decidedAt: string;
      readonly signed: SignedItem;
    }
  | {
      readonly type: 'assignment';
      readonly id: string;
      readonly seamId: string;
      readonly seam: Seam;
      readonly note?: string;
      readonly assignedBy: string;
      readonly assignedAt: string;
      readonly signed: SignedItem;
    };

export interface PullApplied {
  readonly decisions: number;
  readonly assignments: number;
  readonly seamsAdded: number;
  readonly roundsOpened: number;
}

/** A waiting record with its send state, for the Outbox screen. */
export interface OutboxItem {
  readonly entry: OutboxEntry;
  readonly send: SendState | null;
}

/** The server's answer for one record of a batch. */
export interface RecordAnswer {
  readonly id: string;
  readonly acknowledged: boolean;
  readonly reason?: string;
}

export type StoreHealth =
  | { readonly state: 'new'; readonly createdAt: string }
  | { readonly state: 'ok'; readonly createdAt: string }
  /** The database is empty or missing although this browser had one before: the browser removed it. */
  | { readonly state: 'wiped'; readonly previouslyCreatedAt: string; readonly createdAt: string };

export interface BackupFile {
  readonly format: 'beadbook.backup/1';
  readonly exportedAt: string;
  readonly seams: readonly SeamRecord[];
  readonly rounds: readonly RoundRecord[];
  readonly readings: readonly ReadingRecord[];
  readonly outbox: readonly OutboxEntry[];
  /** Tag links (store version 4; a backup made before has none). */
  readonly tagLinks?: readonly TagLinkRecord[];
}

export interface ImportReport {
  readonly seamsAdded: number;
  readonly seamsUpdated: number;
  readonly readingsAdded: number;
  /** Rounds new to this device (added with the store). */
  readonly roundsAdded: number;
  /** Rounds here that gained checklist answers from the file, none of them contradicting (added with the store). */
  readonly roundsUpdated: number;
  /** Outbox entries restored so they still reach the server (added with the store). */
  readonly outboxAdded: number;
  /** Tag links restored (a tag linked to another seam here is refused, never moved). */
  readonly tagLinksAdded: number;
  /** Records already present with identical content: skipped, never doubled. */
  readonly duplicatesSkipped: number;
  /** Records refused, with the reason; nothing else from the file is lost. */
  readonly refused: readonly { readonly path: string; readonly reason: string }[];
}

/** One scanner import as this device keeps it: enough to trace each of its readings to the file. */
export interface ImportRecord {
  readonly importId: string;
  readonly seamId: string;
  readonly kind: 'table' | 'profiles';
  readonly fileName: string;
  readonly bytes: number;
  /** SHA-256 of the file as read, lower-case hex. */
  readonly sha256: string;
  readonly encoding?: string;
  /** The mapping used, as JSON (tables). */
  readonly mapping?: string;
  readonly readingCount: number;
  /** Rows or slices set aside, by the user's decision not imported, with the first reasons. */
  readonly quarantined: number;
  readonly quarantineSample?: readonly { readonly line: number; readonly reason: string }[];
  readonly importedAt: string;
}

export interface Store {
  health(): Promise<StoreHealth>;
  listSeams(): Promise<SeamRecord[]>;
  getSeam(id: string): Promise<SeamRecord | undefined>;
  /**
   * Creates the seam (with its first round) or saves a new revision of its set-up. `namespace` applies to a new
   * seam ('live' when not given); an existing seam keeps its own, and naming the other one is refused.
   */
  saveSeam(seam: Seam, namespace?: Namespace): Promise<SeamRecord>;
  setSummary(seamId: string, summary: SeamSummary): Promise<void>;
  listRounds(seamId: string): Promise<RoundRecord[]>;
  startRound(seamId: string, kind: Round['kind'], examiner?: RoundRecord['examiner']): Promise<RoundRecord>;
  answerChecklist(
    seamId: string,
    round: number,
    item: ChecklistItem,
    answer: ChecklistAnswer,
  ): Promise<RoundRecord>;
  /**
   * Records how the round was looked at (viewing, illuminance, distance, angle, lighting, aids), queued for the
   * server for a live seam. The same conditions again change nothing; new ones correct the earlier ones.
   */
  recordViewing(seamId: string, round: number, conditions: ViewingConditions): Promise<RoundRecord>;
  /**
   * One seam's readings in order of entry on this device; with `afterLocalSeq`, only those entered after it (a
   * screen that holds the earlier ones reads just what is new).
   */
  listReadings(seamId: string, afterLocalSeq?: number): Promise<ReadingRecord[]>;
  /** Append-only: a reading id that exists already is refused. Corrections and withdrawals are new readings. */
  appendReading(seamId: string, reading: Reading): Promise<ReadingRecord>;
  /**
   * Appends a scanner import's readings and its record in one transaction: all or nothing. The readings must name
   * the import as their source; they are checked with the grader's rules against the seam first.
   */
  appendImport(seamId: string, record: ImportRecord, readings: readonly Reading[]): Promise<ImportRecord>;
  /** The imports made into a seam on this device, oldest first. */
  listImports(seamId: string): Promise<ImportRecord[]>;
  /** The seam with its rounds and readings, as the grader takes it (readings may be empty). */
  seamFile(seamId: string): Promise<SeamFile | undefined>;
  outboxCount(): Promise<number>;
  outboxEntries(limit?: number): Promise<OutboxEntry[]>;
  /** Waiting records with how sending went for each, oldest first. */
  outboxItems(): Promise<OutboxItem[]>;
  /** Waiting records in no sealed batch and not refused by the server, oldest first: what the next batch takes. */
  unsealedEntries(limit: number): Promise<OutboxEntry[]>;
  /** The grade last shown for each of these seams (live, graded ones), as it travels with a batch. */
  shownGrades(seamIds: readonly string[]): Promise<DeviceGrade[]>;
  /** Reserves the next batch number. */
  nextBatchSeq(): Promise<number>;
  /**
   * Keeps a batch sealed from waiting records. Returns false (and keeps nothing) when any of its records has
   * meanwhile left the outbox or joined another batch: such a batch was never sent and is simply dropped.
   */
  keepSealedBatch(batch: Omit<SealedBatchRecord, 'attempts' | 'sealedAt'>): Promise<boolean>;
  /** Sealed batches still waiting for answers, in the order they were sealed. */
  pendingBatches(): Promise<SealedBatchRecord[]>;
  /** Notes a send attempt of a batch (and of each of its records), with its error when it failed. */
  noteAttempt(batchId: string, error: string | null): Promise<void>;
  /**
   * Applies the server's answers: acknowledged records leave the outbox, refused ones stay with their reason;
   * the batch is dropped once every one of its records is answered. Returns how many records left the outbox.
   */
  settleBatch(batchId: string, answers: readonly RecordAnswer[]): Promise<number>;
  /**
   * Gives up a batch that was never accepted and never will be (signed by a key the server refuses since the
   * device enrolled again): its records stay in the outbox and go into new batches.
   */
  releaseBatch(batchId: string): Promise<void>;
  /** Takes acknowledged records out of the outbox (and nothing else: readings stay). Returns how many left. */
  acknowledge(recordIds: readonly string[]): Promise<number>;
  /** The cursor the next pull starts from (null before the first). */
  pullCursor(): Promise<string | null>;
  /**
   * Keeps verified pulled items and the new cursor in one transaction. An assignment of a seam not on this device
   * sets it up (its first round is queued for the server; the set-up itself came from there); a "rework" decision
   * on the device's latest round opens the next round. An item already held changes nothing.
   */
  receivePulled(items: readonly PulledItem[], cursor: string): Promise<PullApplied>;
  /** The seam's decisions, oldest first. */
  listDecisions(seamId: string): Promise<DecisionRecord[]>;
  /** The newest decision of each seam that the inspector has not seen yet, by seam id. */
  unseenDecisions(): Promise<Map<string, DecisionRecord>>;
  /** Marks the seam's decisions as seen now. */
  markDecisionsSeen(seamId: string): Promise<void>;
  listAssignments(seamId: string): Promise<AssignmentRecord[]>;
  exportBackup(): Promise<BackupFile>;
  importBackup(data: unknown): Promise<ImportReport>;
  /** Stores the demo yard in the 'demo' namespace; returns how many demo seams were added (0 when already loaded). */
  loadDemo(): Promise<number>;
  /** Where a tag leads (clean tag text: see readTagText). */
  lookupTag(tag: string): Promise<TagLookup>;
  /** Every tag link, for search. */
  listTagLinks(): Promise<TagLinkRecord[]>;
  /** The tags linked to one seam. */
  seamTags(seamId: string): Promise<TagLinkRecord[]>;
  /**
   * Links a tag to a seam, recording the event (queued for the server when live). A tag owned by another seam
   * (a link, or that seam's set-up) is moved only with `confirmedFrom` naming that seam; otherwise a StoreError
   * 'conflict' names the owner and nothing changes.
   */
  linkTag(seamId: string, tag: string, via: TagVia, confirmedFrom?: string): Promise<TagLinkRecord>;
  /** Unlinks a tag from a seam, recording the event; false when it was not linked there. */
  unlinkTag(seamId: string, tag: string): Promise<boolean>;
  /** Removes every demo record and nothing else; returns how many demo seams were removed. */
  removeDemo(): Promise<number>;
  close(): void;
}
