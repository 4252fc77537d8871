// Accounts, sessions and the supervisor's pages: the first supervisor, sign-in and its rate limit, cookie flags,
// roles, same-origin checks, the one-time password flow, and the Devices page (code and QR, rename, revoke).
import { describe, expect, it } from 'vitest';
import { ensureSupervisor } from '../../src/server/bootstrap.js';
import { testConfig } from '../../src/server/config.js';
import { memoryLogger } from '../../src/server/log.js';
import { SqliteStorage } from '../../src/server/storage/sqlite/sqlite-storage.js';
import { SimDevice } from './sim-device.js';
import { jsonOf, ORIGIN, SUPERVISOR, testServer, type TestServer } from './support.js';

const form = (fields: Record<string, string>) => new URLSearchParams(fields).toString();

async function post(
  server: TestServer,
  path: string,
  fields: Record<string, string>,
  headers: Record<string, string> = {},
) {
  return server.request(path, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded', origin: ORIGIN, ...headers },
    body: form(fields),
  });
}

describe('first start', () => {
  it('creates the supervisor with a one-time password shown once, to be changed at first sign-in', async () => {
    const storage = SqliteStorage.open(':memory:');
    const shown: string[] = [];
    const log = memoryLogger();
    const config = testConfig();
    expect(await ensureSupervisor(storage, config, log, new Date(), (t) => shown.push(t))).toBe('created');
    expect(await ensureSupervisor(storage, config, log, new Date(), (t) => shown.push(t))).toBe('exists');
    expect(shown).toHaveLength(1);
    const password = /\n {4}(\S+)\n/.exec(shown[0] ?? '')?.[1] ?? '';
    expect(password).toHaveLength(20);
    // The password never reaches the structured log.
    expect(JSON.stringify(log.lines)).not.toContain(password);
    const account = await storage.findAccount('supervisor');
    expect(account).toMatchObject({ role: 'supervisor', mustChangePassword: true });
    expect(account?.passwordHash).toMatch(/^scrypt\$/);
    expect(account?.passwordHash).not.toContain(password);
    await storage.close();
  });

  it('takes the password from the environment without asking for a change', async () => {
    const storage = SqliteStorage.open(':memory:');
    const shown: string[] = [];
    await ensureSupervisor(
      storage,
      { ...testConfig(), supervisorPassword: 'from the environment' },
      memoryLogger(),
      new Date(),
      (t) => shown.push(t),
    );
    expect(shown).toEqual([]);
    expect(await storage.findAccount('supervisor')).toMatchObject({ mustChangePassword: false });
    await storage.close();
  });
});

describe('sign-in and sessions', () => {
  it('sets an http-only, SameSite=Strict session cookie, Secure with the __Host- prefix under https', async () => {
    const plain = await testServer();
    const res = await plain.request('/api/session', {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: ORIGIN },
      body: JSON.stringify(SUPERVISOR),
    });
    expect(res.status).toBe(200);
    const cookie = res.headers.get('set-cookie') ?? '';
    expect(cookie).toMatch(/^beadbook_session=[A-Za-z0-9_-]{43};/);
    expect(cookie).toContain('HttpOnly');
    expect(cookie).toContain('SameSite=Strict');
    expect(cookie).toContain('Path=/');

    const tls = await testServer({ config: { tls: { certFile: 'unused.crt', keyFile: 'unused.key' } } });
    const res2 = await tls.app.request('https://yard.example/api/session', {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: 'https://yard.example' },
      body: JSON.stringify(SUPERVISOR),
    });
    const secure = res2.headers.get('set-cookie') ?? '';
    expect(secure).toMatch(/^__Host-beadbook_session=/);
    expect(secure).toContain('Secure');
    expect(res2.headers.get('strict-transport-security')).toContain('max-age=');
  });

  it('refuses wrong credentials alike for a wrong password and an unknown name, and rate-limits sign-in', async () => {
    const server = await testServer({
      config: { limits: { ...testConfig().limits, login: { limit: 3, windowMs: 60_000 } } },
    });
    const attempt = (username: string, password: string) =>
      server.request('/api/session', {
        method: 'POST',
        headers: { 'content-type': 'application/json', origin: ORIGIN },
        body: JSON.stringify({ username, password }),
      });
    const a = await attempt('supervisor', 'wrong password');
    const b = await attempt('nobody', 'wrong password');
    expect([a.status, b.status]).toEqual([401, 401]);
    expect(await jsonOf(a)).toEqual(await jsonOf(b));
    expect((await attempt('supervisor', SUPERVISOR.password)).status).toBe(200);
    const limited = await attempt('supervisor', SUPERVISOR.password);
    expect(limited.status).toBe(429);
    expect(Number(limited.headers.get('retry-after'))).toBeGreaterThan(0);
    server.clock.advance(60_001);
    expect((await attempt('supervisor', SUPERVISOR.password)).status).toBe(200);
  });

  it('requires a supervisor session on every supervisor endpoint', async () => {
    const server = await testServer();
    for (const [method, path] of [
      ['GET', '/api/admin/devices'],
      ['POST', '/api/admin/enrolment-codes'],
      ['POST', '/api/admin/devices/x/revoke'],
      ['PUT', '/api/admin/seams/x'],
      ['POST', '/api/admin/assignments'],
      ['POST', '/api/admin/decisions'],
      ['GET', '/api/admin/records'],
      ['GET', '/api/admin/security-events'],
    ] as const) {
      const res = await server.request(path, {
        method,
        headers: { origin: ORIGIN, 'content-type': 'application/json' },
        body: method === 'GET' ? null : '{}',
      });
      expect(res.status, `${method} ${path}`).toBe(401);
    }
    const page = await server.request('/supervisor/devices');
    expect(page.status).toBe(303);
    expect(page.headers.get('location')).toBe('/supervisor/login');
  });

  it('gives an inspector no supervisor endpoint', async () => {
    const server = await testServer();
    expect(
      (
        await server.admin('POST', '/accounts', {
          username: 'ines',
          password: 'inspector-pass-1',
          role: 'inspector',
        })
      ).status,
    ).toBe(201);
    const res = await server.request('/api/session', {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: ORIGIN },
      body: JSON.stringify({ username: 'ines', password: 'inspector-pass-1' }),
    });
    const cookie = (res.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    expect((await server.request('/api/admin/devices', { headers: { cookie } })).status).toBe(403);
    expect((await server.request('/supervisor/devices', { headers: { cookie } })).status).toBe(403);
  });

  it('refuses changes from another origin', async () => {
    const server = await testServer();
    const cookie = await server.supervisorCookie();
    const res = await server.request('/api/admin/enrolment-codes', {
      method: 'POST',
      headers: { cookie, origin: 'https://evil.example' },
    });
    expect(res.status).toBe(403);
    const res2 = await server.request('/supervisor/devices/code', {
      method: 'POST',
      headers: {
        cookie,
        'sec-fetch-site': 'cross-site',
        'content-type': 'application/x-www-form-urlencoded',
      },
      body: '',
    });
    expect(res2.status).toBe(403);
  });

  it('ends the session on sign-out and after it expires', async () => {
    const server = await testServer();
    const cookie = await server.supervisorCookie();
    expect((await server.request('/api/admin/devices', { headers: { cookie } })).status).toBe(200);
    server.clock.advance(server.deps.config.sessionHours * 3_600_000 + 1);
    expect((await server.request('/api/admin/devices', { headers: { cookie } })).status).toBe(401);
    const fresh = await testServer();
    const c2 = await fresh.supervisorCookie();
    expect(
      (await fresh.request('/api/session', { method: 'DELETE', headers: { cookie: c2, origin: ORIGIN } }))
        .status,
    ).toBe(204);
    expect((await fresh.request('/api/admin/devices', { headers: { cookie: c2 } })).status).toBe(401);
  });

  it('makes a one-time password account choose its own before anything else', async () => {
    const storage = SqliteStorage.open(':memory:');
    let shown = '';
    await ensureSupervisor(storage, testConfig(), memoryLogger(), new Date(), (t) => (shown = t));
    const oneTime = /\n {4}(\S+)\n/.exec(shown)?.[1] ?? '';
    const server = await testServer({ storage });
    const signIn = await post(server, '/supervisor/login', { username: 'supervisor', password: oneTime });
    expect(signIn.status).toBe(303);
    expect(signIn.headers.get('location')).toBe('/supervisor/password');
    const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    expect(
      (await server.request('/supervisor/devices', { headers: { cookie } })).headers.get('location'),
    ).toBe('/supervisor/password');
    expect((await server.request('/api/admin/devices', { headers: { cookie } })).status).toBe(403);
    const tooShort = await post(
      server,
      '/supervisor/password',
      { current: oneTime, next: 'short' },
      { cookie },
    );
    expect(tooShort.status).toBe(400);
    const changed = await post(
      server,
      '/supervisor/password',
      { current: oneTime, next: 'my own long password' },
      { cookie },
    );
    expect(changed.status).toBe(303);
    expect((await server.request('/supervisor/devices', { headers: { cookie } })).status).toBe(200);
    const old = await post(server, '/supervisor/login', { username: 'supervisor', password: oneTime });
    expect(old.status).toBe(401);
  });
});

describe('Devices page', () => {
  it('shows an enrolment code as text and as a QR code, then lists the device with its last contact', async () => {
    const server = await testServer();
    const cookie = await server.supervisorCookie();
    const empty = await (await server.request('/supervisor/devices', { headers: { cookie } })).text();
    expect(empty).toContain('No device is enrolled yet.');
    const res = await post(server, '/supervisor/devices/code', {}, { cookie });
    expect(res.status).toBe(200);
    const page = await res.text();
    const code = /<p class="code">([0-9A-Z]{4}-[0-9A-Z]{4})<\/p>/.exec(page)?.[1];
    expect(code).toBeDefined();
    expect(page).toMatch(/<svg role="img" aria-label="Enrolment QR code"/);
    expect(page).toContain('expires at');
    const device = await SimDevice.create();
    expect((await device.enrol(server, code ?? '', 'Bay 3 tablet')).status).toBe(201);
    const listed = await (await server.request('/supervisor/devices', { headers: { cookie } })).text();
    expect(listed).toContain('Bay 3 tablet');
    expect(listed).toContain(device.kid);
    expect(listed).toContain('not reported');
  });

  it('renames and, after confirmation, revokes a device', async () => {
    const server = await testServer();
    const cookie = await server.supervisorCookie();
    const device = await server.enrolDevice('old name');
    const renamed = await post(
      server,
      `/supervisor/devices/${device.kid}/name`,
      { name: 'Hull tablet 2' },
      { cookie },
    );
    expect(await renamed.text()).toContain('Renamed to “Hull tablet 2”.');
    const unconfirmed = await post(server, `/supervisor/devices/${device.kid}/revoke`, {}, { cookie });
    expect(await unconfirmed.text()).toContain('the device was not revoked');
    expect((await server.storage.getDevice(device.kid))?.revokedAt).toBeNull();
    const revoked = await post(
      server,
      `/supervisor/devices/${device.kid}/revoke`,
      { confirm: 'yes' },
      { cookie },
    );
    expect(await revoked.text()).toContain('revoked');
    expect((await server.storage.getDevice(device.kid))?.revokedAt).toBe(server.clock.now().toISOString());
  });
});
