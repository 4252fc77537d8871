// Opens the store: the one object through which screens and the sync code reach IndexedDB.
import type { Store } from './api.js';
import { Connection } from './connection.js';
import type { StoreContext } from './context.js';
import { loadDemo, removeDemo } from './demo-namespace.js';
import { uuidv7 } from './ids.js';
import { appendImport, listImports } from './import-writes.js';
import { appendReading } from './reading-writes.js';
import * as reads from './reads.js';
import { DEFAULT_DB_NAME } from './schema.js';
import { sendingSide } from './open-send-store.js';
import * as sendLog from './send-log.js';
import { answerChecklist, saveSeam, setSummary, startRound } from './seam-writes.js';
import type { TagLinkRecord } from './api.js';

// Linking rules load on first use: the Seams list needs only the links themselves, and first paint stays small.
const tagWrites = () => import('./tag-links.js');

export interface OpenStoreOptions {
  /** Database name; tests give each case its own. */
  name?: string;
  /** Another tab holds an older version open, so this one waits: ask the user to close or reload that tab. */
  onBlocked?(): void;
  /** Another tab is upgrading the database: this store has closed its connection; the page should reload. */
  onBlocking?(): void;
  /** The browser closed the connection abnormally; the next call reopens it. */
  onTerminated?(): void;
  /** The clock for record times (ISO 8601). Times are informative; order comes from sequence numbers. */
  now?: () => string;
  /** The id source for outbox records; UUIDv7 by default. */
  newId?: () => string;
}

/** Opens (creating or upgrading as needed) the database and resolves once it is ready to use. */
const pulled = () => import('./pulled.js');
const viewingWrites = () => import('./viewing-writes.js');

export async function openStore(options: OpenStoreOptions = {}): Promise<Store> {
  const now = options.now ?? (() => new Date().toISOString());
  const conn = new Connection({
    name: options.name ?? DEFAULT_DB_NAME,
    now,
    ...(options.onBlocked ? { onBlocked: () => options.onBlocked?.() } : {}),
    ...(options.onBlocking ? { onBlocking: () => options.onBlocking?.() } : {}),
    ...(options.onTerminated ? { onTerminated: () => options.onTerminated?.() } : {}),
  });
  const ctx: StoreContext = { conn, now, newId: options.newId ?? (() => uuidv7()) };
  await conn.open();
  return {
    health: () => conn.health(),
    listSeams: () => reads.listSeams(ctx),
    getSeam: (id) => reads.getSeam(ctx, id),
    saveSeam: (seam, namespace) => saveSeam(ctx, seam, namespace),
    setSummary: (seamId, summary) => setSummary(ctx, seamId, summary),
    listRounds: (seamId) => reads.listRounds(ctx, seamId),
    startRound: (seamId, kind, examiner) => startRound(ctx, seamId, kind, examiner),
    answerChecklist: (seamId, round, item, answer) => answerChecklist(ctx, seamId, round, item, answer),
    recordViewing: async (seamId, round, conditions) =>
      (await viewingWrites()).recordViewing(ctx, seamId, round, conditions),
    listReadings: (seamId, afterLocalSeq) => reads.listReadings(ctx, seamId, afterLocalSeq),
    appendReading: (seamId, reading) => appendReading(ctx, seamId, reading),
    appendImport: (seamId, record, readings) => appendImport(ctx, seamId, record, readings),
    listImports: (seamId) => listImports(ctx, seamId),
    seamFile: (seamId) => reads.seamFile(ctx, seamId),
    outboxCount: () => reads.outboxCount(ctx),
    outboxEntries: (limit) => reads.outboxEntries(ctx, limit),
    outboxItems: () => sendLog.outboxItems(ctx),
    ...sendingSide(ctx),
    acknowledge: (recordIds) => sendLog.acknowledge(ctx, recordIds),
    // Backups are rare: their schemas and merge rules load when asked for, not with the first screen.
    exportBackup: async () => (await import('./backup-export.js')).exportBackup(ctx),
    importBackup: async (data) => (await import('./backup-import.js')).importBackup(ctx, data),
    lookupTag: async (tag) => (await tagWrites()).lookupTag(ctx, tag),
    listTagLinks: (): Promise<TagLinkRecord[]> =>
      ctx.conn.run(['tagLinks'], 'readonly', (tx) => tx.store.getAll()),
    seamTags: async (seamId) => (await tagWrites()).seamTags(ctx, seamId),
    linkTag: async (seamId, tag, via, confirmedFrom) =>
      (await tagWrites()).linkTag(ctx, seamId, tag, via, confirmedFrom),
    unlinkTag: async (seamId, tag) => (await tagWrites()).unlinkTag(ctx, seamId, tag),
    // Pulled decisions and assignments: loaded on first use, outside the first paint.
    pullCursor: async () => (await pulled()).pullCursor(ctx),
    receivePulled: async (items, cursor) => (await pulled()).receivePulled(ctx, items, cursor),
    listDecisions: async (seamId) => (await pulled()).listDecisions(ctx, seamId),
    unseenDecisions: async () => (await pulled()).unseenDecisions(ctx),
    markDecisionsSeen: async (seamId) => (await pulled()).markDecisionsSeen(ctx, seamId),
    listAssignments: async (seamId) => (await pulled()).listAssignments(ctx, seamId),
    loadDemo: () => loadDemo(ctx),
    removeDemo: () => removeDemo(ctx),
    close: () => conn.close(),
  };
}
