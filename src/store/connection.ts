// The one cached IndexedDB connection, its lifecycle events, and the transaction runner every operation uses.
// A change is reported as saved only after its transaction's `complete` event; a connection the browser closed
// ("connection lost") is dropped and a fresh one opened on the next call.
import { openDB, type IDBPDatabase, type IDBPTransaction, type StoreNames } from 'idb';
import type { StoreHealth } from './api.js';
import { StoreError } from './errors.js';
import { readMarker, writeMarker } from './health-marker.js';
import { DB_VERSION, migrate, type BeadbookDB } from './schema.js';

export interface ConnectionOptions {
  readonly name: string;
  readonly now: () => string;
  /** Another tab holds an older version open: this one waits until that tab closes or reloads. */
  readonly onBlocked?: () => void;
  /** Another tab wants a newer version: this connection has closed so it can upgrade. */
  readonly onBlocking?: () => void;
  /** The browser closed the connection abnormally; the next call reopens it. */
  readonly onTerminated?: () => void;
}

export type Db = IDBPDatabase<BeadbookDB>;
type Names = StoreNames<BeadbookDB>;
export type Tx<N extends readonly Names[], M extends IDBTransactionMode> = IDBPTransaction<BeadbookDB, N, M>;

/** Errors that mean the connection itself is gone, not that this one request was refused. */
const CONNECTION_GONE = new Set(['InvalidStateError', 'UnknownError', 'AbortError']);

const errorName = (error: unknown) => (error instanceof Error ? error.name : 'Error');
const errorText = (error: unknown) =>
  error instanceof Error ? `${error.name}${error.message ? `: ${error.message}` : ''}` : String(error);

export class Connection {
  #current: Promise<Db> | null = null;
  #currentDb: Db | null = null;
  #closed = false;
  #health: StoreHealth | null = null;

  constructor(private readonly options: ConnectionOptions) {}

  open(): Promise<Db> {
    if (this.#closed) {
      return Promise.reject(new StoreError('closed', 'This store was closed; open it again to continue.'));
    }
    if (!this.#current) {
      const opening = this.#connect();
      this.#current = opening;
      // A failed open is not cached: the next call tries again.
      opening.catch(() => {
        if (this.#current === opening) this.#current = null;
      });
    }
    return this.#current;
  }

  async health(): Promise<StoreHealth> {
    await this.open();
    if (!this.#health) throw new StoreError('unavailable', 'The store has not finished opening; try again.');
    return this.#health;
  }

  /**
   * Runs `work` in one transaction and resolves only once the transaction has committed. `work` may await
   * nothing but requests on `tx`: IndexedDB commits a transaction as soon as it has no pending request, so any
   * other await (a timer, fetch, crypto, a worker) would let it commit early and fail the next request.
   */
  async run<const N extends readonly Names[], M extends IDBTransactionMode, R>(
    stores: N,
    mode: M,
    work: (tx: Tx<N, M>) => Promise<R>,
  ): Promise<R> {
    const { db, tx } = await this.#begin(stores, mode);
    // Observed below; this handler only keeps an abort from also surfacing as an unhandled rejection.
    tx.done.catch(() => undefined);
    try {
      const result = await work(tx);
      await tx.done;
      return result;
    } catch (error) {
      try {
        tx.abort();
      } catch {
        // Already committed or aborted.
      }
      await tx.done.catch(() => undefined);
      throw this.#failure(error, db, mode);
    }
  }

  close(): void {
    this.#closed = true;
    const current = this.#current;
    this.#current = null;
    this.#currentDb = null;
    current?.then((db) => db.close()).catch(() => undefined);
  }

  async #begin<N extends readonly Names[], M extends IDBTransactionMode>(
    stores: N,
    mode: M,
  ): Promise<{ db: Db; tx: Tx<N, M> }> {
    // Strict durability: "saved" means flushed to disk, not just handed to the operating system.
    const options: IDBTransactionOptions = mode === 'readwrite' ? { durability: 'strict' } : {};
    const db = await this.open();
    try {
      return { db, tx: db.transaction(stores, mode, options) };
    } catch (error) {
      if (!CONNECTION_GONE.has(errorName(error))) throw this.#failure(error, db, mode);
      // The browser closed the connection before its close event reached us: reopen once and go on.
      this.#forget(db);
      const again = await this.open();
      try {
        return { db: again, tx: again.transaction(stores, mode, options) };
      } catch (second) {
        throw this.#failure(second, again, mode);
      }
    }
  }

  #failure(error: unknown, db: Db, mode: IDBTransactionMode): StoreError {
    if (error instanceof StoreError) return error;
    if (CONNECTION_GONE.has(errorName(error))) this.#forget(db);
    if (mode === 'readonly') {
      return new StoreError(
        'unavailable',
        `Could not read the stored records (${errorText(error)}); try again.`,
        {
          cause: error,
        },
      );
    }
    if (errorName(error) === 'QuotaExceededError') {
      return new StoreError(
        'notSaved',
        'Not saved: this device has no storage left for Beadbook. Free some space or export a backup, then try again.',
        { cause: error },
      );
    }
    return new StoreError(
      'notSaved',
      `Not saved: the browser's database did not confirm the change (${errorText(error)}). Nothing of it was kept; try again.`,
      { cause: error },
    );
  }

  /** Drops a connection that is closed or failing, so the next call opens a fresh one. */
  #forget(db: Db | null): void {
    if (db && this.#currentDb === db) {
      this.#current = null;
      this.#currentDb = null;
    }
    try {
      db?.close();
    } catch {
      // Closing a connection the browser already closed is harmless.
    }
  }

  async #connect(): Promise<Db> {
    const { name, now } = this.options;
    let upgradeFailure: unknown = null;
    const holder: { db: Db | null } = { db: null };
    let db: Db;
    try {
      db = await openDB<BeadbookDB>(name, DB_VERSION, {
        upgrade: (database, oldVersion, _newVersion, tx) => {
          // The open request reports a failed upgrade; this only keeps the abort from going unhandled too.
          tx.done.catch(() => undefined);
          migrate(database, tx, oldVersion).catch((error: unknown) => {
            // An aborted upgrade leaves the database exactly as it was, at its old version.
            upgradeFailure = error;
            try {
              tx.abort();
            } catch {
              // Already finished.
            }
          });
        },
        blocked: () => this.options.onBlocked?.(),
        blocking: () => {
          // Another tab needs a newer version (or is deleting the database): step aside so it can go ahead.
          this.#forget(holder.db);
          this.options.onBlocking?.();
        },
        terminated: () => {
          this.#forget(holder.db);
          this.options.onTerminated?.();
        },
      });
    } catch (error) {
      throw openFailure(name, error, upgradeFailure);
    }
    holder.db = db;
    this.#currentDb = db;
    let health: StoreHealth;
    try {
      health = await this.#checkHealth(db, name, now);
    } catch (error) {
      this.#forget(db);
      throw openFailure(name, error, null);
    }
    // A wipe, once found, stays reported for the life of this store; otherwise the first opening's state holds.
    if (this.#health === null || health.state === 'wiped') this.#health = health;
    return db;
  }

  async #checkHealth(db: Db, name: string, now: () => string): Promise<StoreHealth> {
    const tx = db.transaction('meta', 'readwrite', { durability: 'strict' });
    tx.done.catch(() => undefined);
    const stored = await tx.store.get('created');
    const createdAt = stored?.key === 'created' ? stored.createdAt : now();
    if (stored === undefined) await tx.store.put({ key: 'created', createdAt });
    await tx.done;
    const previously = readMarker(name);
    writeMarker(name, createdAt);
    if (stored !== undefined) return { state: 'ok', createdAt };
    // No creation marker in the database: it was just made. If this browser noted one before, it was removed.
    return previously !== null
      ? { state: 'wiped', previouslyCreatedAt: previously, createdAt }
      : { state: 'new', createdAt };
  }
}

function openFailure(name: string, error: unknown, upgradeFailure: unknown): StoreError {
  if (errorName(error) === 'VersionError') {
    return new StoreError(
      'upgraded',
      'A newer version of Beadbook has upgraded the stored records in another tab. Reload this page to continue; nothing was lost.',
      { cause: error },
    );
  }
  if (upgradeFailure !== null) {
    return new StoreError(
      'unavailable',
      `Bringing the stored records up to this version failed (${errorText(upgradeFailure)}). They were left as they were; reload to try again.`,
      { cause: upgradeFailure },
    );
  }
  return new StoreError(
    'unavailable',
    `The browser's database "${name}" could not be opened (${errorText(error)}). Nothing can be saved until it opens; reload to try again (private browsing may allow no storage).`,
    { cause: error },
  );
}
