// The shape of the IndexedDB database and the steps that bring any older shape up to it. A database made by an
// older app version is upgraded in place: migrations only add and back-fill, they never drop data.
import type { DBSchema, IDBPDatabase, IDBPTransaction, StoreNames } from 'idb';
import type {
  ImportRecord,
  AssignmentRecord,
  DecisionRecord,
  Namespace,
  OutboxEntry,
  ReadingRecord,
  RoundRecord,
  SealedBatchRecord,
  SeamRecord,
  SendState,
  TagLinkRecord,
} from './api.js';

export const DEFAULT_DB_NAME = 'beadbook';

/** Small values kept beside the records: when this database was made, and the last local sequence number. */
export type MetaRecord =
  | { readonly key: 'created'; readonly createdAt: string }
  | { readonly key: 'localSeq'; readonly value: number }
  /** The last batch number this device sealed (version 3). */
  | { readonly key: 'batchSeq'; readonly value: number }
  /** A scanner import: the file's hash, name and counts (kept in meta, so no schema change was needed). */
  | { readonly key: `import:${string}`; readonly record: ImportRecord }
  /** Where the next pull starts: the server's cursor from the last pull stored (version 6). */
  | { readonly key: 'pullCursor'; readonly value: string };

export interface BeadbookDB extends DBSchema {
  meta: { key: MetaRecord['key']; value: MetaRecord };
  seams: { key: string; value: SeamRecord; indexes: { byNamespace: Namespace } };
  /** Keyed by [seamId, number], so one seam's rounds are one key range, in order. */
  rounds: { key: [string, number]; value: RoundRecord };
  /** Keyed by the reading id: a second reading with the same id cannot be stored. */
  readings: {
    key: string;
    value: ReadingRecord;
    indexes: {
      bySeam: string;
      /** One seam's readings in order of entry (version 2). */
      bySeamSeq: [string, number];
      /** Lets the demo be removed without touching live readings (version 2). */
      byNamespace: Namespace;
      /** Finds the correction or withdrawal of a reading, so a reading is superseded at most once (version 2). */
      bySupersedes: string;
    };
  };
  /** What waits for the server, in the order it was made on this device. */
  outbox: { key: number; value: OutboxEntry; indexes: { byRecord: string } };
  /** Batches sealed and not yet answered in full, kept to be resent byte for byte (version 3). */
  batches: { key: string; value: SealedBatchRecord; indexes: { byDeviceSeq: number } };
  /** How sending went for each waiting record: its batch, attempts, last error, rejection (version 3). */
  sendLog: { key: string; value: SendState };
  /** Each tag's one seam, keyed by the tag's match key (version 4). */
  tagLinks: {
    key: string;
    value: TagLinkRecord;
    indexes: { bySeam: string; byNamespace: Namespace };
  };
  /** Supervisors' decisions pulled from the server, each with its signed item (version 6). */
  decisions: { key: string; value: DecisionRecord; indexes: { bySeam: string } };
  /** Seams the supervisor assigned to this device, each with its signed item (version 6). */
  assignments: { key: string; value: AssignmentRecord; indexes: { bySeam: string } };
}

export type UpgradeTransaction = IDBPTransaction<BeadbookDB, StoreNames<BeadbookDB>[], 'versionchange'>;
type Migration = (db: IDBPDatabase<BeadbookDB>, tx: UpgradeTransaction) => void | Promise<void>;

/** Version 1: the first shape. Readings carried no local sequence number and had only the per-seam index. */
function version1(db: IDBPDatabase<BeadbookDB>): void {
  db.createObjectStore('meta', { keyPath: 'key' });
  db.createObjectStore('seams', { keyPath: 'id' }).createIndex('byNamespace', 'namespace');
  db.createObjectStore('rounds', { keyPath: ['seamId', 'number'] });
  db.createObjectStore('readings', { keyPath: 'reading.id' }).createIndex('bySeam', 'seamId');
  db.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true }).createIndex(
    'byRecord',
    'recordId',
    {
      unique: true,
    },
  );
}

/** A reading as version 1 stored it. */
type Version1Reading = Omit<ReadingRecord, 'localSeq'>;

/**
 * Version 2: readings get `localSeq`, the device-local order of entry, and indexes by seam and order, by
 * namespace and by superseded reading. Version 1 kept no order of entry, so the back-fill uses the best evidence
 * left: readings already acknowledged (gone from the outbox) came before those still waiting; the waiting ones
 * keep their outbox order; the rest go by recorded time, then id.
 */
async function version2(_db: IDBPDatabase<BeadbookDB>, tx: UpgradeTransaction): Promise<void> {
  const readings = tx.objectStore('readings');
  readings.createIndex('bySeamSeq', ['seamId', 'localSeq']);
  readings.createIndex('byNamespace', 'namespace');
  readings.createIndex('bySupersedes', 'reading.supersedes');
  const old = (await readings.getAll()) as Version1Reading[];
  const waiting = new Map<string, number>();
  for (const entry of await tx.objectStore('outbox').getAll()) {
    if (entry.kind === 'reading') waiting.set(entry.recordId, entry.seq);
  }
  const rank = (r: Version1Reading) => waiting.get(r.reading.id) ?? -1;
  old.sort(
    (a, b) =>
      rank(a) - rank(b) ||
      a.reading.recordedAt.localeCompare(b.reading.recordedAt) ||
      a.reading.id.localeCompare(b.reading.id),
  );
  await Promise.all(old.map((r, i) => readings.put({ ...r, localSeq: i + 1 })));
  await tx.objectStore('meta').put({ key: 'localSeq', value: old.length });
}

/**
 * Version 3: the sender's bookkeeping beside the outbox, which itself stays as it is (entries are immutable and
 * leave it only when acknowledged): sealed batches, and a send log per waiting record.
 */
function version3(db: IDBPDatabase<BeadbookDB>): void {
  db.createObjectStore('batches', { keyPath: 'batchId' }).createIndex('byDeviceSeq', 'deviceSeq', {
    unique: true,
  });
  db.createObjectStore('sendLog', { keyPath: 'recordId' });
}

/**
 * Version 4: tag links (tag → seam), with indexes by seam and by namespace (the demo's links leave with it).
 * Nothing older holds links, so nothing is back-filled: tags listed in set-ups are read from the seams.
 */
function version4(db: IDBPDatabase<BeadbookDB>): void {
  const links = db.createObjectStore('tagLinks', { keyPath: 'key' });
  links.createIndex('bySeam', 'seamId');
  links.createIndex('byNamespace', 'namespace');
}

/** Version 5 changed nothing: the number was kept for scanner imports, which went into `meta` instead. */
function version5(): void {}

/** Version 6: what the device pulls from the server: review decisions and assignments, by id and by seam. */
function version6(db: IDBPDatabase<BeadbookDB>): void {
  db.createObjectStore('decisions', { keyPath: 'id' }).createIndex('bySeam', 'seamId');
  db.createObjectStore('assignments', { keyPath: 'id' }).createIndex('bySeam', 'seamId');
}

/** MIGRATIONS[n - 1] brings a database from version n - 1 to version n. Append only; never edit a shipped step. */
export const MIGRATIONS: readonly Migration[] = [version1, version2, version3, version4, version5, version6];
export const DB_VERSION = MIGRATIONS.length;

/**
 * Runs the steps from oldVersion to the current version inside the upgrade transaction. A step that makes no
 * requests runs synchronously, so schema changes happen while the upgrade event is still being handled.
 */
export async function migrate(
  db: IDBPDatabase<BeadbookDB>,
  tx: UpgradeTransaction,
  oldVersion: number,
): Promise<void> {
  for (const step of MIGRATIONS.slice(oldVersion)) {
    const pending = step(db, tx);
    if (pending) await pending;
  }
}
