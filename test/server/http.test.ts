// The HTTP surface: the built app served with the right headers, security headers everywhere, clear 4xx for bad
// requests, rate limits on sync, and never a stack trace.
import { mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { testConfig } from '../../src/server/config.js';
import { CONTENT_SECURITY_POLICY } from '../../src/server/http/security-headers.js';
import { jsonOf, ORIGIN, testServer } from './support.js';

function fakeBuild(): string {
  const parent = mkdtempSync(join(tmpdir(), 'beadbook-app-'));
  const dir = join(parent, 'app');
  mkdirSync(join(dir, 'assets'), { recursive: true });
  writeFileSync(join(dir, 'index.html'), '<!doctype html><title>Beadbook</title><div id="app"></div>');
  writeFileSync(join(dir, 'sw.js'), 'self.addEventListener("fetch", () => {});');
  writeFileSync(join(dir, 'assets', 'index-abc123.js'), 'console.log(1)');
  writeFileSync(join(dir, 'manifest.webmanifest'), '{}');
  writeFileSync(join(parent, 'secret.txt'), 'outside the app');
  return dir;
}

describe('serving the built app', () => {
  it('serves files with their types, no-cache everywhere (sw.js included), ETags and the page for app addresses', async () => {
    const server = await testServer({ config: { appDir: fakeBuild() } });
    const sw = await server.request('/sw.js');
    expect(sw.status).toBe(200);
    expect(sw.headers.get('cache-control')).toBe('no-cache');
    expect(sw.headers.get('content-type')).toBe('text/javascript; charset=utf-8');
    const etag = sw.headers.get('etag') ?? '';
    expect((await server.request('/sw.js', { headers: { 'if-none-match': etag } })).status).toBe(304);
    const index = await server.request('/', { headers: { accept: 'text/html' } });
    expect(await index.text()).toContain('<div id="app">');
    expect(index.headers.get('content-security-policy')).toBe(CONTENT_SECURITY_POLICY);
    expect((await server.request('/manifest.webmanifest')).headers.get('content-type')).toBe(
      'application/manifest+json',
    );
    expect((await server.request('/assets/index-abc123.js')).headers.get('cache-control')).toBe('no-cache');
    const deep = await server.request('/seam/123', { headers: { accept: 'text/html' } });
    expect(await deep.text()).toContain('<div id="app">');
    const head = await server.request('/sw.js', { method: 'HEAD' });
    expect(head.status).toBe(200);
    expect(await head.text()).toBe('');
  });

  it('serves nothing outside the build directory and 404s missing files', async () => {
    const server = await testServer({ config: { appDir: fakeBuild() } });
    for (const path of [
      '/../secret.txt',
      '/%2e%2e/secret.txt',
      '/assets/%2e%2e/%2e%2e/secret.txt',
      '/missing.js',
      '/%00',
    ]) {
      const res = await server.request(path);
      expect(res.status, path).toBe(404);
      expect(await res.text()).not.toContain('outside the app');
    }
  });
});

describe('security headers', () => {
  it('sends the CSP and companions on API answers, pages and errors alike', async () => {
    const server = await testServer();
    for (const res of [
      await server.request('/healthz'),
      await server.request('/supervisor/login'),
      await server.request('/api/nothing-here'),
      await server.request('/api/sync/batches', { method: 'POST' }),
    ]) {
      expect(res.headers.get('content-security-policy')).toBe(CONTENT_SECURITY_POLICY);
      expect(res.headers.get('x-content-type-options')).toBe('nosniff');
      expect(res.headers.get('x-frame-options')).toBe('DENY');
      expect(res.headers.get('referrer-policy')).toBe('same-origin');
    }
    expect(CONTENT_SECURITY_POLICY).toContain("worker-src 'self'");
    expect(CONTENT_SECURITY_POLICY).toContain("img-src 'self' data:");
    expect(CONTENT_SECURITY_POLICY).toContain("connect-src 'self'");
    expect(CONTENT_SECURITY_POLICY).not.toContain('unsafe-inline');
  });
});

describe('bad requests', () => {
  it('answers each with a 4xx and a reason', async () => {
    const server = await testServer();
    const cookie = await server.supervisorCookie();
    const admin = (body: string, contentType = 'application/json') =>
      server.request('/api/admin/assignments', {
        method: 'POST',
        headers: { cookie, origin: ORIGIN, 'content-type': contentType },
        body,
      });
    const cases: [Response, number, string][] = [
      [await admin('{not json'), 400, 'malformed'],
      [await admin('{"seamId":"a","deviceKid":"b","extra":1}'), 400, 'invalid'],
      [await admin('seamId=a', 'application/x-www-form-urlencoded'), 415, 'unsupportedMediaType'],
      [await admin(JSON.stringify({ seamId: 'x'.repeat(70 * 1024) })), 413, 'tooLarge'],
      [await admin(JSON.stringify({ seamId: 'nope', deviceKid: 'A'.repeat(43) })), 404, 'unknownDevice'],
      [await server.request('/api/nothing'), 404, 'notFound'],
      [
        await server.request('/api/sync/pull', {
          method: 'POST',
          headers: { 'content-type': 'application/jose+json' },
          body: '{}',
        }),
        400,
        'malformed',
      ],
    ];
    for (const [res, status, error] of cases) {
      expect(res.status).toBe(status);
      const body = await jsonOf<{ error: string; message: string }>(res);
      expect(body.error).toBe(error);
      expect(body.message.length).toBeGreaterThan(5);
    }
  });

  it('never answers arbitrary bodies with a 500 or a stack trace', async () => {
    const server = await testServer();
    const cookie = await server.supervisorCookie();
    const paths = [
      '/api/sync/batches',
      '/api/sync/enrol',
      '/api/sync/pull',
      '/api/admin/decisions',
      '/api/admin/seams/x',
      '/api/session',
    ];
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...paths),
        fc.oneof(
          fc.json(),
          fc.string(),
          fc.jsonValue().map((v) => JSON.stringify({ protected: 'eyJ9', payload: v, signature: 'AA' })),
        ),
        fc.constantFrom('application/jose+json', 'application/json', 'text/plain'),
        async (path, body, contentType) => {
          const res = await server.request(path, {
            method: path.includes('/seams/') ? 'PUT' : 'POST',
            headers: { cookie, origin: ORIGIN, 'content-type': contentType },
            body,
          });
          const text = await res.text();
          expect(res.status).toBeGreaterThanOrEqual(400);
          expect(res.status).toBeLessThan(500);
          expect(text).not.toMatch(/\n\s+at |node_modules|\.ts:\d/);
        },
      ),
      { numRuns: 150, seed: 4242 },
    );
  });

  it('rate-limits sync requests per client', async () => {
    const server = await testServer({
      config: { limits: { ...testConfig().limits, sync: { limit: 5, windowMs: 60_000 } } },
    });
    const statuses = [];
    for (let i = 0; i < 7; i++)
      statuses.push((await server.request('/api/sync/nonce', { method: 'POST' })).status);
    expect(statuses).toEqual([200, 200, 200, 200, 200, 429, 429]);
  });
});
