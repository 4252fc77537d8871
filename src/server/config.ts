// Server settings from the environment and the command line, checked at start: a wrong value stops the server
// with a message naming the variable, rather than running with a surprise.
import { resolve } from 'node:path';

export interface RateLimit {
  /** Requests allowed per window from one client address. */
  readonly limit: number;
  readonly windowMs: number;
}

export interface ServerConfig {
  readonly host: string;
  readonly port: number;
  readonly dbFile: string;
  /** The built app (vite build output) served at /. */
  readonly appDir: string;
  readonly tls: { readonly certFile: string; readonly keyFile: string } | null;
  readonly demo: boolean;
  readonly supervisorName: string;
  readonly supervisorPassword: string | null;
  readonly limits: {
    /** Largest request body of a sync batch, in bytes. */
    readonly batchBytes: number;
    /** Largest body of any other request. */
    readonly otherBytes: number;
    readonly login: RateLimit;
    readonly sync: RateLimit;
  };
  readonly enrolmentCodeMinutes: number;
  readonly sessionHours: number;
  readonly nonceSeconds: number;
  /** scrypt cost N (a power of two); lower it only in tests. */
  readonly scryptCost: number;
  /** Trust X-Forwarded-For for the client address (only behind a reverse proxy that sets it). */
  readonly trustProxy: boolean;
}

export class ConfigError extends Error {
  override readonly name = 'ConfigError';
}

type Env = Readonly<Record<string, string | undefined>>;

function int(env: Env, name: string, fallback: number, min: number, max: number): number {
  const raw = env[name];
  if (raw === undefined || raw === '') return fallback;
  const n = Number(raw);
  if (!Number.isInteger(n) || n < min || n > max) {
    throw new ConfigError(`${name} must be a whole number from ${min} to ${max}; got "${raw}"`);
  }
  return n;
}

function flag(env: Env, name: string): boolean {
  const raw = env[name];
  if (raw === undefined || raw === '' || raw === '0' || raw === 'false') return false;
  if (raw === '1' || raw === 'true') return true;
  throw new ConfigError(`${name} must be 1 or 0; got "${raw}"`);
}

export const DEFAULTS = {
  port: 4173,
  host: '0.0.0.0',
  dbFile: './data/beadbook.sqlite',
  appDir: './dist/app',
} as const;

export function readConfig(env: Env, argv: readonly string[] = [], cwd = process.cwd()): ServerConfig {
  const unknownArgs = argv.filter((a) => a !== '--demo');
  if (unknownArgs.length) {
    throw new ConfigError(
      `unknown argument${unknownArgs.length > 1 ? 's' : ''}: ${unknownArgs.join(' ')} (known: --demo)`,
    );
  }
  const certFile = env['BEADBOOK_TLS_CERT'] || undefined;
  const keyFile = env['BEADBOOK_TLS_KEY'] || undefined;
  if ((certFile === undefined) !== (keyFile === undefined)) {
    throw new ConfigError('give both BEADBOOK_TLS_CERT and BEADBOOK_TLS_KEY, or neither');
  }
  const password = env['BEADBOOK_SUPERVISOR_PASSWORD'] || null;
  if (password !== null && password.length < 10) {
    throw new ConfigError('BEADBOOK_SUPERVISOR_PASSWORD must be at least 10 characters long');
  }
  const supervisorName = env['BEADBOOK_SUPERVISOR_NAME'] || 'supervisor';
  if (!/^[A-Za-z0-9._-]{1,40}$/.test(supervisorName)) {
    throw new ConfigError(
      'BEADBOOK_SUPERVISOR_NAME may hold 1 to 40 letters, digits, dots, dashes and underscores',
    );
  }
  const dbFile = env['BEADBOOK_DB'] || DEFAULTS.dbFile;
  return {
    host: env['BEADBOOK_HOST'] || env['HOST'] || DEFAULTS.host,
    port: int(env, env['BEADBOOK_PORT'] !== undefined ? 'BEADBOOK_PORT' : 'PORT', DEFAULTS.port, 0, 65535),
    dbFile: dbFile === ':memory:' ? dbFile : resolve(cwd, dbFile),
    appDir: resolve(cwd, env['BEADBOOK_APP_DIR'] || DEFAULTS.appDir),
    tls: certFile && keyFile ? { certFile: resolve(cwd, certFile), keyFile: resolve(cwd, keyFile) } : null,
    demo: argv.includes('--demo') || flag(env, 'BEADBOOK_DEMO'),
    supervisorName,
    supervisorPassword: password,
    limits: {
      batchBytes: int(env, 'BEADBOOK_MAX_BATCH_BYTES', 4 * 1024 * 1024, 1024, 64 * 1024 * 1024),
      otherBytes: 64 * 1024,
      login: { limit: int(env, 'BEADBOOK_LOGIN_RATE', 10, 1, 100_000), windowMs: 60_000 },
      sync: { limit: int(env, 'BEADBOOK_SYNC_RATE', 600, 1, 1_000_000), windowMs: 60_000 },
    },
    enrolmentCodeMinutes: int(env, 'BEADBOOK_ENROL_MINUTES', 10, 1, 24 * 60),
    sessionHours: int(env, 'BEADBOOK_SESSION_HOURS', 12, 1, 24 * 30),
    nonceSeconds: 120,
    scryptCost: 2 ** 15,
    trustProxy: flag(env, 'BEADBOOK_TRUST_PROXY'),
  };
}

/** Settings for tests: in memory, cheap password hashing, generous rate limits; override what a test is about. */
export function testConfig(over: Partial<ServerConfig> = {}): ServerConfig {
  const base = readConfig({
    BEADBOOK_DB: ':memory:',
    BEADBOOK_SYNC_RATE: '1000000',
    BEADBOOK_LOGIN_RATE: '100000',
  });
  return { ...base, scryptCost: 2 ** 10, ...over };
}
