// The server as `npm start` runs it (after building): a child process on a free port, a database file created
// on first start, the one-time supervisor password printed once, the demo only when asked, https with a given
// certificate and key, and a clean stop.
import { execFileSync, spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { get as httpsGet } from 'node:https';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterEach, beforeAll, describe, expect, it } from 'vitest';
import { BUILD_TIMEOUT_MS, buildNode, ROOT } from '../support/build-node.js';

const MAIN = join(ROOT, 'dist/node/src/server/main.js');

interface Started {
  readonly child: ChildProcess;
  readonly origin: string;
  readonly stderr: () => string;
  readonly lines: () => Record<string, unknown>[];
}

const children: ChildProcess[] = [];
afterEach(async () => {
  for (const child of children.splice(0)) {
    if (child.exitCode === null) {
      child.kill('SIGTERM');
      await new Promise((resolve) => child.once('exit', resolve));
    }
  }
});

async function start(env: Record<string, string>, args: string[] = []): Promise<Started> {
  const child = spawn(process.execPath, [MAIN, ...args], {
    cwd: ROOT,
    env: { PATH: process.env['PATH'] ?? '', BEADBOOK_HOST: '127.0.0.1', BEADBOOK_PORT: '0', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  children.push(child);
  let out = '';
  let err = '';
  child.stderr.on('data', (d: Buffer) => (err += d.toString()));
  const lines = () =>
    out
      .split('\n')
      .filter(Boolean)
      .map((l) => JSON.parse(l) as Record<string, unknown>);
  const listening = await new Promise<Record<string, unknown>>((resolve, reject) => {
    child.stdout.on('data', (d: Buffer) => {
      out += d.toString();
      const line = lines().find((l) => l['event'] === 'listening');
      if (line) resolve(line);
    });
    child.once('exit', (code) => reject(new Error(`server exited (${code}): ${err}${out}`)));
  });
  return { child, origin: String(listening['url']), stderr: () => err, lines };
}

const fakeApp = () => {
  const dir = mkdtempSync(join(tmpdir(), 'beadbook-app-'));
  writeFileSync(join(dir, 'index.html'), '<!doctype html><title>Beadbook</title>');
  writeFileSync(join(dir, 'sw.js'), '// sw');
  return dir;
};

beforeAll(buildNode, BUILD_TIMEOUT_MS);

describe('the server process', () => {
  it('creates its database on first start, prints the one-time password once, and serves app and API', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'beadbook-srv-'));
    const env = { BEADBOOK_DB: join(dir, 'data', 'yard.sqlite'), BEADBOOK_APP_DIR: fakeApp() };
    const first = await start(env);
    expect(existsSync(env.BEADBOOK_DB)).toBe(true);
    expect(first.stderr()).toMatch(/one-time password\n\n {4}\S{20}\n/);
    const health = await fetch(`${first.origin}/healthz`);
    expect(await health.json()).toMatchObject({ ok: true, protocol: 1 });
    const sw = await fetch(`${first.origin}/sw.js`);
    expect(sw.headers.get('cache-control')).toBe('no-cache');
    expect(sw.headers.get('content-security-policy')).toContain("worker-src 'self'");
    const seams = first.lines().find((l) => l['event'] === 'demoLoaded');
    expect(seams).toBeUndefined();
    first.child.kill('SIGTERM');
    const code = await new Promise((resolve) => first.child.once('exit', resolve));
    expect(code).toBe(0);
    const second = await start(env);
    expect(second.stderr()).not.toContain('one-time password');
    expect(second.lines().find((l) => l['event'] === 'listening')?.['demo']).toBe(false);
  });

  it('loads the demo yard only when asked', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'beadbook-srv-'));
    const s = await start(
      {
        BEADBOOK_DB: join(dir, 'y.sqlite'),
        BEADBOOK_APP_DIR: fakeApp(),
        BEADBOOK_SUPERVISOR_PASSWORD: 'demo password 1',
      },
      ['--demo'],
    );
    expect(s.lines().find((l) => l['event'] === 'demoLoaded')).toMatchObject({ seams: 6 });
    expect(s.stderr()).toBe('');
  });

  it('serves https with the given certificate and key', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'beadbook-tls-'));
    const key = join(dir, 'yard.key');
    const crt = join(dir, 'yard.crt');
    execFileSync(
      'openssl',
      [
        'req',
        '-x509',
        '-newkey',
        'ec',
        '-pkeyopt',
        'ec_paramgen_curve:P-256',
        '-nodes',
        '-days',
        '2',
        '-keyout',
        key,
        '-out',
        crt,
        '-subj',
        '/CN=beadbook',
        '-addext',
        'subjectAltName=IP:127.0.0.1',
      ],
      { stdio: 'pipe' },
    );
    const s = await start({
      BEADBOOK_DB: join(dir, 'y.sqlite'),
      BEADBOOK_APP_DIR: fakeApp(),
      BEADBOOK_TLS_CERT: crt,
      BEADBOOK_TLS_KEY: key,
      BEADBOOK_SUPERVISOR_PASSWORD: 'tls password 12',
    });
    expect(s.origin).toMatch(/^https:\/\/127\.0\.0\.1:\d+$/);
    const res = await new Promise<{ status: number; hsts: string | undefined }>((resolve, reject) => {
      httpsGet(`${s.origin}/healthz`, { ca: readFileSync(crt) }, (r) => {
        r.resume();
        resolve({ status: r.statusCode ?? 0, hsts: r.headers['strict-transport-security'] });
      }).on('error', reject);
    });
    expect(res).toEqual({ status: 200, hsts: 'max-age=31536000' });
  });

  it('refuses a wrong setting with a message naming it', async () => {
    const child = spawn(process.execPath, [MAIN], {
      cwd: ROOT,
      env: { PATH: process.env['PATH'] ?? '', BEADBOOK_PORT: 'eighty' },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    let err = '';
    child.stderr.on('data', (d: Buffer) => (err += d.toString()));
    const code = await new Promise((resolve) => child.once('exit', resolve));
    expect(code).toBe(1);
    expect(err).toContain('BEADBOOK_PORT must be a whole number');
  });
});
