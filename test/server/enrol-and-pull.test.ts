// Enrolment (one-time code, proof of possession, expiry, revocation) and pull (single-use nonces, cursors,
// server-signed assignments and decisions the device can check).
import { describe, expect, it } from 'vitest';
import {
  checkEnrolReply,
  generateDeviceKey,
  jwsBody,
  parseEnrolmentTicket,
  PROTOCOL_VERSION,
  signJws,
  signPullRequest,
  verifyServerItem,
  type Assignment,
  type Decision,
  type EnrolReply,
  type PullReply,
} from '../../src/protocol/index.js';
import { uuidv7 } from '../../src/store/ids.js';
import { bodies, testSeam, toeReading } from './records.js';
import { SimDevice } from './sim-device.js';
import { jsonOf, testServer, type TestServer } from './support.js';

async function code(
  server: TestServer,
): Promise<{ code: string; ticket: string; expiresAt: string; serverKid: string }> {
  const res = await server.admin('POST', '/enrolment-codes');
  expect(res.status).toBe(201);
  return jsonOf(res);
}

describe('enrolment', () => {
  it('enrols a device that proves possession of its key; the reply carries the server key the ticket names', async () => {
    const server = await testServer();
    const issued = await code(server);
    const ticket = parseEnrolmentTicket(issued.ticket);
    expect(ticket).toEqual({ code: issued.code, serverKid: server.deps.serverKey.kid });
    const device = await SimDevice.create();
    // Typed by hand in lower case with spaces: still the same code.
    const sent = await device.enrol(server, issued.code.toLowerCase().replace('-', ' '), 'Tablet in bay 3');
    expect(sent.status).toBe(201);
    const reply = await checkEnrolReply(sent.body, device.key, ticket?.serverKid ?? null);
    expect(reply).toMatchObject({
      protocol: PROTOCOL_VERSION,
      deviceKid: device.kid,
      name: 'Tablet in bay 3',
    });
    const devices = await jsonOf<{ kid: string; name: string; revokedAt: null }[]>(
      await server.admin('GET', '/devices'),
    );
    expect(devices.map((d) => [d.kid, d.name, d.revokedAt])).toEqual([[device.kid, 'Tablet in bay 3', null]]);
  });

  it('answers a retry with the same code and key the same way (a lost reply), and refuses the code to anyone else', async () => {
    const server = await testServer();
    const issued = await code(server);
    const device = await SimDevice.create();
    expect((await device.enrol(server, issued.code)).status).toBe(201);
    const again = await device.enrol(server, issued.code);
    expect(again.status).toBe(200);
    expect((again.body as EnrolReply).deviceKid).toBe(device.kid);
    const second = await SimDevice.create();
    expect(await second.enrol(server, issued.code)).toMatchObject({
      status: 403,
      body: { error: 'codeUsed' },
    });
  });

  it('refuses an expired code, an unknown code and a malformed one', async () => {
    const server = await testServer();
    const issued = await code(server);
    server.clock.advance(server.deps.config.enrolmentCodeMinutes * 60_000 + 1);
    const device = await SimDevice.create();
    expect(await device.enrol(server, issued.code)).toMatchObject({
      status: 403,
      body: { error: 'codeExpired' },
    });
    expect(await device.enrol(server, 'ZZZZ-ZZZZ')).toMatchObject({
      status: 403,
      body: { error: 'codeUnknown' },
    });
    expect(await device.enrol(server, 'K7Q!-M2X')).toMatchObject({
      status: 400,
      body: { error: 'codeMalformed' },
    });
    expect(await server.storage.listDevices()).toEqual([]);
  });

  it('refuses a request signed by another key than the one it enrols (no proof of possession)', async () => {
    const server = await testServer();
    const issued = await code(server);
    const victim = await generateDeviceKey();
    const attacker = await generateDeviceKey();
    const payload = JSON.stringify({ protocol: 1, type: 'enrol', code: issued.code, jwk: victim.publicJwk });
    const asVictim = jwsBody(await signJws(payload, 'enrol', attacker.privateKey, victim.kid));
    const res = await server.request('/api/sync/enrol', {
      method: 'POST',
      headers: { 'content-type': 'application/jose+json' },
      body: asVictim,
    });
    expect(res.status).toBe(401);
    const asAttacker = jwsBody(await signJws(payload, 'enrol', attacker.privateKey, attacker.kid));
    const res2 = await server.request('/api/sync/enrol', {
      method: 'POST',
      headers: { 'content-type': 'application/jose+json' },
      body: asAttacker,
    });
    expect(res2.status).toBe(400);
    expect(await jsonOf(res2)).toMatchObject({ error: 'header' });
    expect(await server.storage.listDevices()).toEqual([]);
    // The code was not used up by the failed attempts.
    expect((await (await SimDevice.create()).enrol(server, issued.code)).status).toBe(201);
  });

  it('refuses a revoked key; a wiped device enrols again as a new device', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    await server.admin('POST', `/devices/${device.kid}/revoke`);
    expect(await device.enrol(server, (await code(server)).code)).toMatchObject({
      status: 403,
      body: { error: 'revoked' },
    });
    const again = await server.enrolDevice();
    expect(again.kid).not.toBe(device.kid);
    const byKid = new Map((await server.storage.listDevices()).map((d) => [d.kid, d.revokedAt]));
    expect(byKid.get(device.kid)).not.toBeNull();
    expect(byKid.get(again.kid)).toBeNull();
  });
});

describe('pull', () => {
  it('gives a device its assignments and the decisions on its seams, signed by the server key it enrolled with', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const otherDevice = await server.enrolDevice();
    const assigned = testSeam();
    expect((await server.admin('PUT', `/seams/${assigned.id}`, { seam: assigned })).status).toBe(201);
    expect(
      (
        await server.admin('POST', '/assignments', {
          seamId: assigned.id,
          deviceKid: device.kid,
          note: 'Start at the bow end',
        })
      ).status,
    ).toBe(201);
    // A seam the device worked on (sent records for) gets its decisions too.
    const worked = testSeam();
    device.add('seamSetup', uuidv7(), bodies.seamSetup(worked));
    device.add('round', uuidv7(), bodies.round(worked.id));
    const r = toeReading(worked.id, 150);
    device.add('reading', r.id, bodies.reading(r));
    await device.send(server, await device.seal());
    expect(
      (
        await server.admin('POST', '/decisions', {
          seamId: worked.id,
          round: 1,
          outcome: 'rework',
          comment: 'Grind the toe at 100 mm',
        })
      ).status,
    ).toBe(201);
    // Neither for this device:
    const elsewhere = testSeam();
    await server.admin('PUT', `/seams/${elsewhere.id}`, { seam: elsewhere });
    await server.admin('POST', '/assignments', { seamId: elsewhere.id, deviceKid: otherDevice.kid });
    await server.admin('POST', '/decisions', { seamId: elsewhere.id, round: 1, outcome: 'accepted' });

    const enrolReply = { kid: server.deps.serverKey.kid, jwk: server.deps.serverKey.publicJwk };
    const pulled = await device.pull(server, null, 7);
    expect(pulled.status).toBe(200);
    const reply = pulled.body as PullReply;
    expect(reply.more).toBe(false);
    const items = await Promise.all(reply.items.map((i) => verifyServerItem(i, enrolReply, device.kid)));
    expect(items.map((i) => [i.type, i.seamId])).toEqual([
      ['assignment', assigned.id],
      ['decision', worked.id],
    ]);
    expect((items[0] as Assignment).seam).toEqual(assigned);
    expect((items[0] as Assignment).note).toBe('Start at the bow end');
    expect(items[1] as Decision).toMatchObject({
      round: 1,
      outcome: 'rework',
      comment: 'Grind the toe at 100 mm',
      decidedBy: 'supervisor',
    });
    // Addressed to this device only: another device cannot use these items.
    await expect(verifyServerItem(reply.items[0], enrolReply, otherDevice.kid)).rejects.toThrow(
      /another device/,
    );
    // The queue length the device reported shows on the Devices list.
    const listed = (await server.storage.listDevices()).find((d) => d.kid === device.kid);
    expect(listed?.reportedQueue).toBe(7);
    expect(listed?.lastContactAt).toBe(server.clock.now().toISOString());

    // Nothing new since the cursor.
    const next = await device.pull(server, reply.cursor);
    expect((next.body as PullReply).items).toEqual([]);
    expect((next.body as PullReply).cursor).toBe(reply.cursor);
  });

  it('pages with the cursor', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const seam = testSeam();
    await server.admin('PUT', `/seams/${seam.id}`, { seam });
    for (let i = 0; i < 5; i++)
      await server.admin('POST', '/assignments', { seamId: seam.id, deviceKid: device.kid, note: `n${i}` });
    const nonce = async () =>
      ((await device.post(server, '/api/sync/nonce', '')).body as { nonce: string }).nonce;
    const seen: string[] = [];
    let cursor: string | null = null;
    for (let page = 0; page < 5; page++) {
      const body = await signPullRequest(
        { nonce: await nonce(), cursor, queued: 0, limit: 2 },
        device.key.privateKey,
        device.kid,
      );
      const reply = (await device.post(server, '/api/sync/pull', body)).body as PullReply;
      for (const item of reply.items)
        seen.push(
          (
            (await verifyServerItem(
              item,
              { kid: server.deps.serverKey.kid, jwk: server.deps.serverKey.publicJwk },
              device.kid,
            )) as Assignment
          ).note ?? '',
        );
      cursor = reply.cursor;
      if (!reply.more) break;
    }
    expect(seen).toEqual(['n0', 'n1', 'n2', 'n3', 'n4']);
  });

  it('accepts a nonce once, refuses it again (a captured request cannot be replayed), and refuses it when expired', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const nonce = ((await device.post(server, '/api/sync/nonce', '')).body as { nonce: string }).nonce;
    const body = await signPullRequest({ nonce, cursor: null, queued: 0 }, device.key.privateKey, device.kid);
    expect((await device.post(server, '/api/sync/pull', body)).status).toBe(200);
    expect(await device.post(server, '/api/sync/pull', body)).toMatchObject({
      status: 401,
      body: { error: 'nonce' },
    });
    const late = ((await device.post(server, '/api/sync/nonce', '')).body as { nonce: string }).nonce;
    server.clock.advance(server.deps.config.nonceSeconds * 1000 + 1);
    const lateBody = await signPullRequest(
      { nonce: late, cursor: null, queued: 0 },
      device.key.privateKey,
      device.kid,
    );
    expect(await device.post(server, '/api/sync/pull', lateBody)).toMatchObject({
      status: 401,
      body: { error: 'nonce' },
    });
    const made = await signPullRequest(
      { nonce: 'x'.repeat(32), cursor: null, queued: 0 },
      device.key.privateKey,
      device.kid,
    );
    expect((await device.post(server, '/api/sync/pull', made)).status).toBe(401);
  });

  it('refuses a pull from a revoked device and a pull signed as a batch', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const nonce = ((await device.post(server, '/api/sync/nonce', '')).body as { nonce: string }).nonce;
    const payload = JSON.stringify({ protocol: 1, type: 'pull', nonce, cursor: null, outbox: { queued: 0 } });
    const asBatch = jwsBody(await signJws(payload, 'batch', device.key.privateKey, device.kid));
    expect(await device.post(server, '/api/sync/pull', asBatch)).toMatchObject({
      status: 400,
      body: { error: 'type' },
    });
    await server.admin('POST', `/devices/${device.kid}/revoke`);
    expect((await device.pull(server, null)).status).toBe(403);
  });

  it('serves the server key, which devices check items against', async () => {
    const server = await testServer();
    const res = await server.request('/api/sync/server-key');
    expect(await jsonOf(res)).toEqual({
      protocol: 1,
      kid: server.deps.serverKey.kid,
      jwk: server.deps.serverKey.publicJwk,
    });
  });
});
