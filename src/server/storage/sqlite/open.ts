// Opens (and on first use creates) the SQLite database: WAL, foreign keys on, synchronous FULL (a record the
// device was told is stored must survive a power cut, since the device then forgets it), then pending migrations.
import Database from 'better-sqlite3';
import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import { MIGRATIONS, type Migration } from './migrations.js';

export type Db = Database.Database;

export interface OpenOptions {
  /**
   * FULL (the default) syncs every commit to disk. NORMAL survives a crash of the process but may lose the
   * last commits on a power cut: for tests and benchmarks that restart the process, never for a yard.
   */
  readonly synchronous?: 'FULL' | 'NORMAL';
  readonly migrations?: readonly Migration[];
}

export function openDatabase(file: string, options: OpenOptions = {}): Db {
  const migrations = options.migrations ?? MIGRATIONS;
  const memory = file === ':memory:';
  if (!memory) mkdirSync(dirname(file), { recursive: true });
  const db = new Database(file);
  try {
    if (!memory) db.pragma('journal_mode = WAL');
    db.pragma('foreign_keys = ON');
    db.pragma(options.synchronous === 'NORMAL' ? 'synchronous = NORMAL' : 'synchronous = FULL');
    db.pragma('busy_timeout = 5000');
    // 64 MiB of page cache (the default is 2 MiB): record ids are random, so each batch touches index pages all
    // over the id index, and re-reading them from the OS for every batch costs more than the memory.
    db.pragma('cache_size = -65536');
    migrate(db, migrations);
    return db;
  } catch (error) {
    db.close();
    throw error;
  }
}

export function migrate(db: Db, migrations: readonly Migration[]): number[] {
  db.exec(`CREATE TABLE IF NOT EXISTS migrations (
    version INTEGER PRIMARY KEY,
    name TEXT NOT NULL,
    applied_at TEXT NOT NULL
  )`);
  const applied = new Set(
    (db.prepare('SELECT version FROM migrations').all() as { version: number }[]).map((r) => r.version),
  );
  const known = Math.max(0, ...migrations.map((m) => m.version));
  const newest = Math.max(0, ...applied);
  if (newest > known) {
    throw new Error(
      `the database is at schema version ${newest}, newer than this server knows (${known}): run the newer server`,
    );
  }
  const note = db.prepare('INSERT INTO migrations (version, name, applied_at) VALUES (?, ?, ?)');
  const ran: number[] = [];
  for (const m of [...migrations].sort((a, b) => a.version - b.version)) {
    if (applied.has(m.version)) continue;
    db.transaction(() => {
      db.exec(m.sql);
      note.run(m.version, m.name, new Date().toISOString());
    }).immediate();
    ran.push(m.version);
  }
  return ran;
}
