// The contract of the one module that touches IndexedDB. Screens and the sync code use only this.
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

export type OutboxKind = 'seamSetup' | 'round' | 'checklistAnswer' | 'reading';

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
  /** Records already present with identical content: skipped, never doubled. */
  readonly duplicatesSkipped: number;
  /** Records refused, with the reason; nothing else from the file is lost. */
  readonly refused: readonly { readonly path: string; readonly reason: string }[];
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
   * One seam's readings in order of entry on this device; with `afterLocalSeq`, only those entered after it (a
   * screen that holds the earlier ones reads just what is new).
   */
  listReadings(seamId: string, afterLocalSeq?: number): Promise<ReadingRecord[]>;
  /** Append-only: a reading id that exists already is refused. Corrections and withdrawals are new readings. */
  appendReading(seamId: string, reading: Reading): Promise<ReadingRecord>;
  /** The seam with its rounds and readings, as the grader takes it (readings may be empty). */
  seamFile(seamId: string): Promise<SeamFile | undefined>;
  outboxCount(): Promise<number>;
  outboxEntries(limit?: number): Promise<OutboxEntry[]>;
  exportBackup(): Promise<BackupFile>;
  importBackup(data: unknown): Promise<ImportReport>;
  /** Stores the demo yard in the 'demo' namespace; returns how many demo seams were added (0 when already loaded). */
  loadDemo(): Promise<number>;
  /** Removes every demo record and nothing else; returns how many demo seams were removed. */
  removeDemo(): Promise<number>;
  close(): void;
}
