// An in-process yard server for tests (hono's app.request: no sockets), with a clock the test moves, a log the
// test reads, and helpers to sign in as the supervisor and to enrol simulated devices.
import { createHash } from 'node:crypto';
import { afterEach } from 'vitest';
import { canonicalJson } from '../../src/protocol/index.js';
import { createApp, type BeadbookApp } from '../../src/server/app.js';
import { ensureSupervisor } from '../../src/server/bootstrap.js';
import { testConfig, type ServerConfig } from '../../src/server/config.js';
import { memoryLogger } from '../../src/server/log.js';
import { SqliteStorage } from '../../src/server/storage/sqlite/sqlite-storage.js';
import { SimDevice } from './sim-device.js';

export const ORIGIN = 'http://localhost';
export const SUPERVISOR = { username: 'supervisor', password: 'correct horse battery' };

export class TestClock {
  #t: number;
  constructor(start = Date.UTC(2026, 11, 2, 9, 0, 0)) {
    this.#t = start;
  }
  readonly now = (): Date => new Date(this.#t);
  advance(ms: number): void {
    this.#t += ms;
  }
}

export interface TestServer extends BeadbookApp {
  readonly storage: SqliteStorage;
  readonly log: ReturnType<typeof memoryLogger>;
  readonly clock: TestClock;
  request(path: string, init?: RequestInit): Promise<Response>;
  /** A signed-in supervisor's cookie header. */
  supervisorCookie(): Promise<string>;
  /** A JSON request to the supervisor API as the signed-in supervisor. */
  admin(method: string, path: string, body?: unknown): Promise<Response>;
  /** A new simulated device, enrolled with a fresh code. */
  enrolDevice(label?: string): Promise<SimDevice>;
  /** Waits for scheduled re-grades. */
  settle(): Promise<void>;
  close(): Promise<void>;
}

const open: TestServer[] = [];
afterEach(async () => {
  for (const s of open.splice(0)) await s.close();
});

export interface TestServerOptions {
  readonly config?: Partial<ServerConfig>;
  /** A database file to (re)open; in memory when not given. */
  readonly dbFile?: string;
  readonly storage?: SqliteStorage;
  readonly clock?: TestClock;
  /** SQLite's synchronous setting for a file database (NORMAL where a test restarts the process only). */
  readonly synchronous?: 'FULL' | 'NORMAL';
  /** Closed by the test itself (e.g. to restart on the same file). */
  readonly keepOpen?: boolean;
}

export async function testServer(options: TestServerOptions = {}): Promise<TestServer> {
  const config = testConfig(options.config);
  const storage =
    options.storage ??
    SqliteStorage.open(
      options.dbFile ?? ':memory:',
      options.synchronous ? { synchronous: options.synchronous } : {},
    );
  const log = memoryLogger();
  const clock = options.clock ?? new TestClock();
  await ensureSupervisor(
    storage,
    { ...config, supervisorPassword: SUPERVISOR.password },
    log,
    clock.now(),
    () => {},
  );
  const built = await createApp({ config, storage, log, now: clock.now });
  let cookie: string | null = null;
  const request = async (path: string, init?: RequestInit): Promise<Response> =>
    built.app.request(`${ORIGIN}${path}`, init);
  const server: TestServer = {
    ...built,
    storage,
    log,
    clock,
    request,
    async supervisorCookie() {
      if (cookie) return cookie;
      const res = await request('/api/session', {
        method: 'POST',
        headers: { 'content-type': 'application/json', origin: ORIGIN },
        body: JSON.stringify(SUPERVISOR),
      });
      if (res.status !== 200) throw new Error(`sign-in failed: ${res.status} ${await res.text()}`);
      cookie = (res.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
      return cookie;
    },
    async admin(method, path, body) {
      return request(`/api/admin${path}`, {
        method,
        headers: {
          cookie: await server.supervisorCookie(),
          origin: ORIGIN,
          ...(body === undefined ? {} : { 'content-type': 'application/json' }),
        },
        ...(body === undefined ? {} : { body: JSON.stringify(body) }),
      });
    },
    async enrolDevice(label) {
      const res = await server.admin('POST', '/enrolment-codes');
      const { code } = (await res.json()) as { code: string };
      const device = await SimDevice.create();
      const reply = await device.enrol(server, code, label);
      if (reply.status !== 201)
        throw new Error(`enrolment failed: ${reply.status} ${JSON.stringify(reply.body)}`);
      return device;
    },
    async settle() {
      await built.deps.regrader.idle();
      await built.deps.reviewIndexer.idle();
    },
    async close() {
      await built.deps.regrader.idle();
      await built.deps.reviewIndexer.idle();
      await storage.close();
    },
  };
  if (!options.keepOpen) open.push(server);
  return server;
}

/** SHA-256 of a canonical dump of the record tables: equal hashes, byte-identical tables. */
export async function recordTablesHash(storage: SqliteStorage): Promise<string> {
  return createHash('sha256')
    .update(canonicalJson(await storage.dumpRecordTables()))
    .digest('hex');
}

/** Row counts of the record tables. */
export async function recordCounts(storage: SqliteStorage): Promise<Record<string, number>> {
  const dump = await storage.dumpRecordTables();
  return Object.fromEntries(Object.entries(dump).map(([k, rows]) => [k, rows.length]));
}

export const jsonOf = async <T = Record<string, unknown>>(res: Response): Promise<T> =>
  (await res.json()) as T;
