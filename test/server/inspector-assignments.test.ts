// Seams assigned to an inspector account: every device tied to that inspector (by its enrolment code, or later on
// the Devices page) pulls them, signed and addressed to itself, exactly once; other devices do not.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { MIGRATIONS } from '../../src/server/storage/sqlite/migrations.js';
import { openDatabase } from '../../src/server/storage/sqlite/open.js';
import { SqliteStorage } from '../../src/server/storage/sqlite/sqlite-storage.js';
import { verifyServerItem, type PullReply, type ServerItem } from '../../src/protocol/index.js';
import { testSeam } from './records.js';
import { SimDevice } from './sim-device.js';
import { jsonOf, ORIGIN, testServer, type TestServer } from './support.js';

async function addInspector(server: TestServer, username: string): Promise<void> {
  const res = await server.admin('POST', '/accounts', {
    username,
    password: `${username}-pass-123`,
    role: 'inspector',
  });
  expect(res.status).toBe(201);
}

async function enrolFor(server: TestServer, inspector: string | null): Promise<SimDevice> {
  const res = await server.admin('POST', '/enrolment-codes', { inspector });
  expect(res.status).toBe(201);
  const { code } = await jsonOf<{ code: string }>(res);
  const device = await SimDevice.create();
  expect((await device.enrol(server, code)).status).toBe(201);
  return device;
}

async function newSeam(server: TestServer, label: string): Promise<string> {
  const seam = testSeam(undefined, { label });
  expect((await server.admin('PUT', `/seams/${seam.id}`, { seam })).status).toBe(201);
  return seam.id;
}

/** Pulls from the cursor; the items checked with the server key and addressed to the device. */
async function pullItems(
  server: TestServer,
  device: SimDevice,
  cursor: string | null,
): Promise<{ items: ServerItem[]; cursor: string }> {
  const sent = await device.pull(server, cursor);
  expect(sent.status).toBe(200);
  const reply = sent.body as PullReply;
  const key = { kid: server.deps.serverKey.kid, jwk: server.deps.serverKey.publicJwk };
  const items = await Promise.all(reply.items.map((i) => verifyServerItem(i, key, device.kid)));
  return { items, cursor: reply.cursor };
}

const form = async (server: TestServer, path: string, body: Record<string, string>) =>
  server.request(path, {
    method: 'POST',
    headers: {
      cookie: await server.supervisorCookie(),
      origin: ORIGIN,
      'content-type': 'application/x-www-form-urlencoded',
    },
    body: new URLSearchParams(body).toString(),
  });

describe('assignments to an inspector', () => {
  it('reach every device enrolled for the inspector and no other', async () => {
    const server = await testServer();
    await addInspector(server, 'ines');
    await addInspector(server, 'otto');
    const ines1 = await enrolFor(server, 'ines');
    const ines2 = await enrolFor(server, 'ines');
    const otto = await enrolFor(server, 'otto');
    const nobody = await enrolFor(server, null);
    expect((await server.storage.getDevice(ines1.kid))?.inspectorName).toBe('ines');
    expect((await server.storage.getDevice(nobody.kid))?.inspectorName).toBeNull();

    const s1 = await newSeam(server, 'Girder web splice');
    const made = await server.admin('POST', '/assignments', {
      seamId: s1,
      inspector: 'ines',
      note: 'Web first',
    });
    expect(made.status).toBe(201);

    for (const device of [ines1, ines2]) {
      const { items } = await pullItems(server, device, null);
      expect(items.map((i) => [i.type, i.seamId, i.deviceKid])).toEqual([['assignment', s1, device.kid]]);
      expect(items[0]).toMatchObject({
        note: 'Web first',
        assignedBy: 'supervisor',
        seam: { label: 'Girder web splice' },
      });
    }
    for (const device of [otto, nobody]) expect((await pullItems(server, device, null)).items).toEqual([]);
    // The seam page names the inspector the seam was assigned to.
    const seamPage = await server.request(`/supervisor/review/seams/${s1}`, {
      headers: { cookie: await server.supervisorCookie() },
    });
    expect((await seamPage.text()).replace(/\s+/g, ' ')).toContain('to inspector ines by supervisor');

    // A decision on the inspector's seam goes to the inspector's devices too, though they sent nothing for it.
    expect(
      (await server.admin('POST', '/decisions', { seamId: s1, round: 1, outcome: 'accepted' })).status,
    ).toBe(201);
    const again = await pullItems(server, ines1, null);
    expect(again.items.map((i) => [i.type, i.seamId])).toEqual([
      ['assignment', s1],
      ['decision', s1],
    ]);
    expect((await pullItems(server, otto, null)).items).toEqual([]);
  });

  it('sends a device tied later the seams assigned before, once, and what is assigned after', async () => {
    const server = await testServer();
    await addInspector(server, 'ines');
    const tablet = await enrolFor(server, null);
    const s1 = await newSeam(server, 'Before the tie');
    await server.admin('POST', '/assignments', { seamId: s1, inspector: 'ines' });
    // The tablet pulls first: its cursor passes the inspector's assignment, which is not for it yet.
    const first = await pullItems(server, tablet, null);
    expect(first.items).toEqual([]);

    const tied = await form(server, `/supervisor/devices/${tablet.kid}/inspector`, { inspector: 'ines' });
    expect(tied.status).toBe(200);
    expect(await tied.text()).toContain('now works for ines');
    const caught = await pullItems(server, tablet, first.cursor);
    expect(caught.items.map((i) => [i.type, i.seamId, i.deviceKid])).toEqual([
      ['assignment', s1, tablet.kid],
    ]);

    const s2 = await newSeam(server, 'After the tie');
    await server.admin('POST', '/assignments', { seamId: s2, inspector: 'ines' });
    const next = await pullItems(server, tablet, caught.cursor);
    expect(next.items.map((i) => i.seamId)).toEqual([s2]);
    // From the start, every seam comes once: the copy made at the tie, then the later assignment.
    const all = await pullItems(server, tablet, null);
    expect(all.items.map((i) => i.seamId)).toEqual([s1, s2]);
    // Tying the same inspector again adds nothing.
    await server.admin('PUT', `/devices/${tablet.kid}/inspector`, { inspector: 'ines' });
    expect((await pullItems(server, tablet, next.cursor)).items).toEqual([]);
    // Untied: later assignments to the inspector no longer reach it.
    const untied = await server.admin('PUT', `/devices/${tablet.kid}/inspector`, { inspector: null });
    expect(await jsonOf(untied)).toMatchObject({ inspectorName: null });
    const s3 = await newSeam(server, 'After the untie');
    await server.admin('POST', '/assignments', { seamId: s3, inspector: 'ines' });
    expect((await pullItems(server, tablet, next.cursor)).items).toEqual([]);
  });

  it('refuses an unknown inspector, a supervisor account and a request naming both a tablet and an inspector', async () => {
    const server = await testServer();
    await addInspector(server, 'ines');
    const tablet = await server.enrolDevice();
    const s1 = await newSeam(server, 'Refused');
    const unknown = await server.admin('POST', '/assignments', { seamId: s1, inspector: 'nobody' });
    expect(unknown.status).toBe(404);
    const supervisor = await server.admin('POST', '/assignments', { seamId: s1, inspector: 'supervisor' });
    expect(supervisor.status).toBe(409);
    expect(await jsonOf(supervisor)).toMatchObject({ error: 'notInspector' });
    const both = await server.admin('POST', '/assignments', {
      seamId: s1,
      inspector: 'ines',
      deviceKid: tablet.kid,
    });
    expect(both.status).toBe(400);
    const code = await server.admin('POST', '/enrolment-codes', { inspector: 'nobody' });
    expect(code.status).toBe(404);
    expect(await server.storage.listChangesOfSeam(s1)).toEqual([]);
  });

  it('adds inspectors and assigns from the supervisor pages, keeping nothing when the inspector is unknown', async () => {
    const server = await testServer();
    const added = await form(server, '/supervisor/inspectors', {
      username: 'ines',
      password: 'ten-chars-or-more',
    });
    expect(added.status).toBe(200);
    const page = await added.text();
    expect(page).toContain('Inspector “ines” added.');
    expect(page).toMatch(/<option value="ines"[^>]*>\s*ines\s*<\/option>/);
    expect(
      (await form(server, '/supervisor/inspectors', { username: 'ines', password: 'ten-chars-or-more' }))
        .status,
    ).toBe(400);

    const seam = {
      label: 'Stiffener 9',
      jointType: 'butt',
      t1: '10',
      length: '400',
      material: 'S355',
    };
    const refused = await form(server, '/supervisor/seams', { ...seam, inspector: 'nobody' });
    expect(refused.status).toBe(400);
    expect(await refused.text()).toContain('no account is named');
    expect(await server.storage.listSeamIds()).toEqual([]);

    const done = await form(server, '/supervisor/seams', { ...seam, inspector: 'ines' });
    expect(done.status).toBe(303);
    const [id] = await server.storage.listSeamIds();
    const changes = await server.storage.listChangesOfSeam(id ?? '');
    expect(changes.map((c) => [c.kind, c.deviceKid, c.inspectorId !== null])).toEqual([
      ['assignment', null, true],
    ]);

    const tablet = await server.enrolDevice();
    const tie = await form(server, `/supervisor/devices/${tablet.kid}/inspector`, { inspector: 'ines' });
    expect(tie.status).toBe(200);
    expect((await pullItems(server, tablet, null)).items.map((i) => i.seamId)).toEqual([id]);

    const ticked = await form(server, '/supervisor/seams/assign', { seam: id ?? '', inspector: 'ines' });
    expect(ticked.status).toBe(303);
    expect(decodeURIComponent(ticked.headers.get('location') ?? '')).toContain('assigned to inspector ines');
  });
});

describe('migration 4 on a database in use', () => {
  it('keeps the devices and what they pull; the devices work for no inspector until a supervisor ties them', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'beadbook-m4-')), 'beadbook.sqlite');
    const before = openDatabase(file, { migrations: MIGRATIONS.filter((m) => m.version <= 3) });
    const kid = 'K'.repeat(43);
    before
      .prepare('INSERT INTO devices (kid, public_jwk, name, enrolled_at) VALUES (?, ?, ?, ?)')
      .run(kid, '{}', 'Old tablet', '2026-11-01T08:00:00.000Z');
    before
      .prepare(
        `INSERT INTO changes (kind, item_id, seam_id, device_kid, item, created_at) VALUES ('assignment', ?, ?, ?, ?, ?)`,
      )
      .run('item-1', 'seam-1', kid, '{"id":"item-1"}', '2026-11-01T09:00:00.000Z');
    before.close();

    const storage = SqliteStorage.open(file);
    expect(await storage.getDevice(kid)).toMatchObject({
      name: 'Old tablet',
      inspectorId: null,
      inspectorName: null,
    });
    const page = await storage.changesFor(kid, 0, 10);
    expect(page.changes.map((c) => [c.itemId, c.deviceKid, c.inspectorId])).toEqual([['item-1', kid, null]]);
    await storage.close();
  });
});
