// Applying signed batches: per-record answers, idempotence (F5, F9), order independence (F6), partial failure
// (F2), server failures (F10), newer schemas (F14), device clocks (F17), replay identity and batch-id reuse.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { uuidv7 } from '../../src/store/ids.js';
import { allNoneFound, bodies, testSeam, toeReading } from './records.js';
import { SimDevice } from './sim-device.js';
import { jsonOf, recordCounts, recordTablesHash, testServer, type TestServer } from './support.js';
import {
  canonicalJson,
  jwsBody,
  RECORD_SCHEMA_VERSION,
  sealBatch,
  signJws,
  type BatchReply,
} from '../../src/protocol/index.js';

/** A seam with its set-up, first round, a complete checklist and `n` toe-angle readings, queued on the device. */
function queueSeam(device: SimDevice, n: number, seamId = uuidv7()) {
  const seam = testSeam(seamId);
  device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
  device.add('round', uuidv7(), bodies.round(seam.id));
  for (const [item, answer] of allNoneFound())
    device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, item, answer));
  const readings = Array.from({ length: n }, (_, i) =>
    toeReading(seam.id, 150 + (i % 20), { position: 10 + i }),
  );
  for (const r of readings) device.add('reading', r.id, bodies.reading(r));
  return { seam, readings };
}

async function storedIds(server: TestServer, kid: string): Promise<string[]> {
  return (await server.storage.listRecords({ deviceKid: kid })).map((r) => r.id).sort();
}

describe('batch apply', () => {
  it('stores every record of a valid batch once and answers each as accepted', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 5);
    const batch = await device.seal();
    const sent = await device.send(server, batch);
    expect(sent.status).toBe(200);
    const reply = sent.body as BatchReply;
    expect(reply.replay).toBe(false);
    expect(reply.results.map((r) => r.status)).toEqual(batch.recordIds.map(() => 'accepted'));
    expect(await storedIds(server, device.kid)).toEqual([...batch.recordIds].sort());
    expect(device.outbox).toEqual([]);
    // The JWS is kept exactly as received.
    const stored = await server.storage.getBatch(batch.batchId);
    expect(stored?.jws).toBe(batch.body);
    // The server graded the seam itself.
    await server.settle();
    const grade = await server.storage.getServerGrade(seam.id);
    expect(grade?.state).toBe('graded');
  });
});

const statuses = (sent: { body: unknown }) => (sent.body as BatchReply).results.map((r) => r.status);

describe('F2: one invalid record in a batch', () => {
  it('accepts the rest; only the bad record stays on the device, with a reason naming the field', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 3);
    const bad = toeReading(seam.id, 200);
    device.add('reading', bad.id, bodies.reading(bad));
    const sent = await device.send(server, await device.seal());
    expect(sent.status).toBe(200);
    const results = (sent.body as BatchReply).results;
    expect(results.filter((r) => r.status === 'accepted')).toHaveLength(results.length - 1);
    const rejected = results.find((r) => r.status === 'rejected');
    expect(rejected?.id).toBe(bad.id);
    expect(rejected?.reason).toContain('body.reading.values.toeAngle');
    expect(rejected?.reason).toContain('at most 180');
    expect(device.outbox.map((e) => e.recordId)).toEqual([bad.id]);
    expect(device.rejected.get(bad.id)).toContain('toeAngle');
    const stored = await storedIds(server, device.kid);
    expect(stored).not.toContain(bad.id);
    expect(stored).toHaveLength(results.length - 1);
  });

  it('rejects a record without a usable id by its place in the batch', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 1);
    const entry = device.add('round', '', bodies.round(seam.id, 2));
    const sent = await device.send(server, await device.seal());
    const results = (sent.body as BatchReply).results;
    const last = results[results.length - 1];
    expect(last).toMatchObject({ index: results.length - 1, id: null, status: 'rejected' });
    expect(last?.reason).toContain('id');
    expect(device.outbox).toContain(entry);
  });
});

describe('F5: the same batch delivered 2 to 5 times', () => {
  for (const times of [2, 3, 4, 5]) {
    it(`stores it once when delivered ${times} times in a row`, async () => {
      const server = await testServer();
      const device = await server.enrolDevice();
      queueSeam(device, 4);
      const batch = await device.seal();
      const first = await device.post(server, '/api/sync/batches', batch.body);
      expect(statuses(first).every((s) => s === 'accepted')).toBe(true);
      await server.settle();
      const hash = await recordTablesHash(server.storage);
      for (let i = 1; i < times; i++) {
        const again = await device.post(server, '/api/sync/batches', batch.body);
        expect(again.status).toBe(200);
        expect((again.body as BatchReply).replay).toBe(true);
        expect(statuses(again).every((s) => s === 'duplicate')).toBe(true);
      }
      await server.settle();
      expect(await recordTablesHash(server.storage)).toBe(hash);
      expect(await storedIds(server, device.kid)).toEqual([...batch.recordIds].sort());
    });

    it(`stores it once when delivered ${times} times at once`, async () => {
      const server = await testServer();
      const device = await server.enrolDevice();
      queueSeam(device, 4);
      const batch = await device.seal();
      const all = await Promise.all(
        Array.from({ length: times }, () => device.post(server, '/api/sync/batches', batch.body)),
      );
      expect(all.map((s) => s.status)).toEqual(all.map(() => 200));
      // Exactly one delivery applied the batch; every other one was answered as a replay of it.
      expect(all.filter((s) => !(s.body as BatchReply).replay)).toHaveLength(1);
      for (const id of batch.recordIds) {
        const answers = all.map((s) => (s.body as BatchReply).results.find((r) => r.id === id)?.status);
        expect(answers.filter((a) => a === 'accepted')).toHaveLength(1);
        expect(answers.filter((a) => a === 'duplicate')).toHaveLength(times - 1);
      }
      expect(await storedIds(server, device.kid)).toEqual([...batch.recordIds].sort());
      expect((await recordCounts(server.storage))['batches']).toBe(1);
    });
  }
});

/** Everything about a seam that must not depend on arrival order. */
async function finalState(server: TestServer, seamId: string) {
  await server.settle();
  const records = (await server.storage.listRecords({ seamId }))
    .map((r) => ({ id: r.id, kind: r.kind, body: r.body, seq: r.deviceSeq }))
    .sort((a, b) => (a.id < b.id ? -1 : 1));
  const grade = await server.storage.getServerGrade(seamId);
  return {
    records,
    grade: grade && {
      state: grade.state,
      levelMet: grade.levelMet,
      summary: JSON.parse(grade.summary) as unknown,
    },
  };
}

describe('F6: batches arriving out of order', () => {
  it('reaches the same final state, grade included, in any order', async () => {
    const device = await SimDevice.create();
    const seam = testSeam();
    const readings = Array.from({ length: 6 }, (_, i) =>
      toeReading(seam.id, 140 + i * 5, { position: 50 * (i + 1) }),
    );
    const correction = toeReading(seam.id, 170, { position: 50, supersedes: readings[0]?.id as string });
    device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
    device.add('round', uuidv7(), bodies.round(seam.id));
    const b1 = await device.seal();
    for (const [item, answer] of allNoneFound())
      device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, item, answer));
    // The same item answered twice: the later answer (by the device's sequence) must win whatever the order.
    device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, 'spatter', 'present'));
    const b2 = await device.seal();
    for (const r of readings.slice(0, 3)) device.add('reading', r.id, bodies.reading(r));
    const b3 = await device.seal();
    for (const r of [...readings.slice(3), correction]) device.add('reading', r.id, bodies.reading(r));
    device.add('seamSetup', uuidv7(), bodies.seamSetup({ ...seam, label: 'Renamed at revision 2' }, 2));
    const b4 = await device.seal();
    const batches = [b1, b2, b3, b4];

    const orders = [
      [0, 1, 2, 3],
      [3, 2, 1, 0],
      [2, 0, 3, 1],
      [1, 3, 0, 2],
    ];
    const states = [];
    for (const order of orders) {
      const server = await testServer();
      const code = (await jsonOf<{ code: string }>(await server.admin('POST', '/enrolment-codes'))).code;
      expect((await device.enrol(server, code)).status).toBe(201);
      for (const i of order) {
        const batch = batches[i];
        if (!batch) throw new Error('no batch');
        const sent = await device.post(server, '/api/sync/batches', batch.body);
        expect(statuses(sent).every((s) => s === 'accepted')).toBe(true);
      }
      states.push(await finalState(server, seam.id));
    }
    const [first, ...rest] = states;
    for (const s of rest) expect(s).toEqual(first);
    const summary = first?.grade?.summary as {
      leftOut: unknown[];
      readingCount: number;
      rounds: { complete: boolean }[];
    };
    expect(first?.grade?.state).toBe('graded');
    expect(summary.leftOut).toEqual([]);
    expect(summary.readingCount).toBe(7);
    const setup = (await (await testServerWith(device, batches)).admin('GET', `/seams/${seam.id}`)).json();
    expect(((await setup) as { setup: { label: string } }).setup.label).toBe('Renamed at revision 2');
  });
});

async function testServerWith(device: SimDevice, batches: readonly { body: string }[]): Promise<TestServer> {
  const server = await testServer();
  const code = (await jsonOf<{ code: string }>(await server.admin('POST', '/enrolment-codes'))).code;
  await device.enrol(server, code);
  for (const b of [...batches].reverse()) await device.post(server, '/api/sync/batches', b.body);
  await server.settle();
  return server;
}

describe('F9: the server commits and the response is lost', () => {
  it('answers the resend as duplicates, so the device can empty its outbox; nothing is stored twice', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    queueSeam(device, 3);
    const batch = await device.seal();
    const lost = await device.post(server, '/api/sync/batches', batch.body);
    expect(lost.status).toBe(200);
    expect(device.outbox).toHaveLength(batch.recordIds.length);
    const resent = await device.send(server, batch);
    expect(resent.status).toBe(200);
    expect(statuses(resent).every((s) => s === 'duplicate')).toBe(true);
    expect(device.outbox).toEqual([]);
    expect(await storedIds(server, device.kid)).toEqual([...batch.recordIds].sort());
  });
});

describe('F10: the server fails while applying', () => {
  it('answers 500 without internals, stores nothing of the batch, and the resend succeeds', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { readings } = queueSeam(device, 4);
    const batch = await device.seal();
    const poisoned = readings[2]?.id as string;
    const before = await recordTablesHash(server.storage);
    // A failure in the middle of the transaction, after several rows were written.
    server.storage.database.exec(
      `CREATE TEMP TRIGGER fail_once BEFORE INSERT ON records WHEN NEW.id = '${poisoned}'
       BEGIN SELECT RAISE(ABORT, 'disk on fire'); END`,
    );
    const failed = await device.send(server, batch);
    expect(failed.status).toBe(500);
    const body = failed.body as { error: string; message: string };
    expect(body.error).toBe('internal');
    expect(JSON.stringify(body)).not.toMatch(/disk on fire|SqliteError|\bat \w|\.ts:|\.js:/);
    expect(device.outbox).toHaveLength(batch.recordIds.length);
    expect(await recordTablesHash(server.storage)).toBe(before);
    const logged = server.log.lines.find((l) => l['event'] === 'unhandled') as {
      error: { message: string; stack: string };
    };
    expect(logged.error.message).toContain('disk on fire');
    expect(logged.error.stack).toBeTruthy();

    server.storage.database.exec('DROP TRIGGER fail_once');
    const resent = await device.send(server, batch);
    expect(resent.status).toBe(200);
    expect(statuses(resent).every((s) => s === 'accepted')).toBe(true);
    expect(device.outbox).toEqual([]);
  });
});

describe('F14: records of a newer schema', () => {
  it('parks them (kept as sent, acknowledged), answers a resend as duplicate, and lets no v1 record take the id', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 1);
    const newer = {
      seq: 99,
      id: uuidv7(),
      kind: 'photo',
      schemaVersion: RECORD_SCHEMA_VERSION + 1,
      seamId: seam.id,
      createdAt: '2026-12-01T09:00:00Z',
      body: { sha256: 'ab'.repeat(32), caption: 'toe at 120 mm' },
    };
    const newerReading = {
      ...newer,
      id: uuidv7(),
      kind: 'reading',
      schemaVersion: 7,
      body: { seamId: seam.id, reading: { shape: 'unknown to v1' } },
    };
    const entries = [...device.unsealed()];
    const raw = await sealBatch({ deviceSeq: 1, entries }, device.key.privateKey, device.kid);
    // Built by hand: a newer device would put the newer records in the same batch.
    const payload = JSON.parse(Buffer.from(raw.jws.payload, 'base64url').toString('utf8')) as {
      records: unknown[];
    };
    payload.records.push(newer, newerReading);
    const body = jwsBody(await signJws(canonicalJson(payload), 'batch', device.key.privateKey, device.kid));
    const sent = await device.post(server, '/api/sync/batches', body);
    expect(sent.status).toBe(200);
    const results = (sent.body as BatchReply).results;
    expect(results.slice(-2).map((r) => [r.id, r.status])).toEqual([
      [newer.id, 'parked'],
      [newerReading.id, 'parked'],
    ]);
    const parked = await jsonOf<{ id: string; schemaVersion: number; record: { body: unknown } }[]>(
      await server.admin('GET', '/parked'),
    );
    expect(parked.map((p) => p.id).sort()).toEqual([newer.id, newerReading.id].sort());
    expect(parked.find((p) => p.id === newer.id)?.record.body).toEqual(newer.body);
    const again = await device.post(server, '/api/sync/batches', body);
    expect((again.body as BatchReply).results.slice(-2).map((r) => r.status)).toEqual([
      'duplicate',
      'duplicate',
    ]);

    const clash = toeReading(seam.id, 150, { id: newer.id });
    device.add('reading', clash.id, bodies.reading(clash));
    const clashSent = await device.send(server, await device.seal([device.made.get(clash.id) as never]));
    expect((clashSent.body as BatchReply).results[0]).toMatchObject({ id: newer.id, status: 'rejected' });
    expect((await server.storage.listRecords({ deviceKid: device.kid })).map((r) => r.id)).not.toContain(
      newer.id,
    );
  });
});

describe('F17: device clocks off by 30 days', () => {
  it('accepts the records and orders by the device sequence and revision, not by device times', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const day = 86_400_000;
    const ahead = new Date(server.clock.now().getTime() + 30 * day).toISOString();
    const behind = new Date(server.clock.now().getTime() - 30 * day).toISOString();
    const seam = testSeam();
    device.add(
      'seamSetup',
      uuidv7(),
      bodies.seamSetup({ ...seam, label: 'revision 2, clock behind' }, 2, behind),
      behind,
    );
    device.add('seamSetup', uuidv7(), bodies.seamSetup(seam, 1, ahead), ahead);
    device.add('round', uuidv7(), bodies.round(seam.id, 1, ahead), ahead);
    for (const [item, answer] of allNoneFound())
      device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, item, answer, 1, ahead), ahead);
    // Answered later on the device (higher sequence number) although its clock says a month earlier.
    device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, 'crack', 'present', 1, behind), behind);
    const r = toeReading(seam.id, 160, { recordedAt: behind });
    device.add('reading', r.id, bodies.reading(r), behind);
    const sent = await device.send(server, await device.seal());
    expect(statuses(sent).every((s) => s === 'accepted')).toBe(true);
    await server.settle();
    const view = await jsonOf<{ setup: { label: string }; serverGrade: { levelMet: string } }>(
      await server.admin('GET', `/seams/${seam.id}`),
    );
    expect(view.setup.label).toBe('revision 2, clock behind');
    // A crack found is below every level (ISO 5817 permits no cracks, common practice).
    expect(view.serverGrade.levelMet).toBe('belowD');
  });
});

describe('replaying an accepted batch', () => {
  it('leaves the record tables byte-identical (hash of a canonical dump)', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 5);
    const bad = toeReading(seam.id, 10);
    device.add('reading', bad.id, bodies.reading(bad));
    const grades = [
      {
        seamId: seam.id,
        state: 'graded' as const,
        levelMet: 'B' as const,
        meetsRequired: true,
        readingCount: 5,
        gradedAt: '2026-12-01T08:30:00Z',
      },
    ];
    const batch = await device.seal(device.unsealed(), grades);
    await device.post(server, '/api/sync/batches', batch.body);
    await server.settle();
    const before = await recordTablesHash(server.storage);
    server.clock.advance(3_600_000);
    for (let i = 0; i < 3; i++) {
      const again = await device.post(server, '/api/sync/batches', batch.body);
      expect(again.status).toBe(200);
    }
    await server.settle();
    expect(await recordTablesHash(server.storage)).toBe(before);
  });
});

describe('the same batch id with another payload', () => {
  it('is a 422, logged as a security event, and applies nothing', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    queueSeam(device, 2);
    const batch = await device.seal();
    expect((await device.post(server, '/api/sync/batches', batch.body)).status).toBe(200);
    await server.settle();
    const before = await recordTablesHash(server.storage);
    const extra = toeReading(uuidv7(), 150);
    device.add('reading', extra.id, bodies.reading(extra));
    const forged = await sealBatch(
      { batchId: batch.batchId, deviceSeq: 9, entries: [device.made.get(extra.id) as never] },
      device.key.privateKey,
      device.kid,
    );
    const sent = await device.post(server, '/api/sync/batches', forged.body);
    expect(sent.status).toBe(422);
    expect(sent.body).toMatchObject({ error: 'batchConflict' });
    expect(await recordTablesHash(server.storage)).toBe(before);
    const events = await jsonOf<{ kind: string; deviceKid: string; detail: string }[]>(
      await server.admin('GET', '/security-events'),
    );
    expect(events[0]).toMatchObject({ kind: 'batchConflict', deviceKid: device.kid });
    expect(events[0]?.detail).toContain(batch.batchId);
    expect(server.log.lines.some((l) => l['event'] === 'security' && l['what'] === 'batchConflict')).toBe(
      true,
    );
  });

  it('is a 422 when another device reuses a batch id', async () => {
    const server = await testServer();
    const a = await server.enrolDevice();
    const b = await server.enrolDevice();
    queueSeam(a, 1);
    const batch = await a.seal();
    await a.post(server, '/api/sync/batches', batch.body);
    const r = toeReading(uuidv7(), 150);
    b.add('reading', r.id, bodies.reading(r));
    const copy = await sealBatch(
      { batchId: batch.batchId, deviceSeq: 1, entries: b.unsealed() },
      b.key.privateKey,
      b.kid,
    );
    expect((await b.post(server, '/api/sync/batches', copy.body)).status).toBe(422);
    expect(await server.storage.listRecords({ deviceKid: b.kid })).toEqual([]);
  });
});

describe('a record id already stored with other content', () => {
  it('is rejected with a reason and a security event; the stored record is unchanged', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { readings } = queueSeam(device, 1);
    await device.send(server, await device.seal());
    const original = readings[0];
    if (!original) throw new Error('no reading');
    const altered = { ...original, values: { toeAngle: 91 } };
    device.add('reading', altered.id, bodies.reading(altered));
    const sent = await device.send(server, await device.seal());
    expect((sent.body as BatchReply).results[0]).toMatchObject({ id: original.id, status: 'rejected' });
    expect((sent.body as BatchReply).results[0]?.reason).toContain('already stored with other content');
    const stored = (await server.storage.listRecords({ deviceKid: device.kid })).find(
      (r) => r.id === original.id,
    );
    expect((JSON.parse(stored?.body ?? '{}') as { reading: { values: unknown } }).reading.values).toEqual({
      toeAngle: original.values.toeAngle,
    });
    const events = await server.storage.listSecurityEvents(10);
    expect(events.map((e) => e.kind)).toContain('recordIdConflict');
  });

  it('answers the same record sent again by a re-enrolled device (restored backup) as a duplicate', async () => {
    const server = await testServer();
    const old = await server.enrolDevice();
    queueSeam(old, 2);
    await old.send(server, await old.seal());
    const fresh = await server.enrolDevice();
    // The restored outbox carries the same records with new sequence numbers.
    for (const e of old.made.values())
      fresh.add(e.kind, e.recordId, e.body as { seamId: string }, e.createdAt);
    const sent = await fresh.send(server, await fresh.seal());
    expect(statuses(sent).every((s) => s === 'duplicate')).toBe(true);
    expect(fresh.outbox).toEqual([]);
  });
});

describe("the server's grade beside the device's", () => {
  it('keeps both, and leaves out a reading that does not fit its seam, with the reason', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 3);
    // Valid on its own, but a throat belongs to fillet welds, not to this butt seam.
    const misfit = {
      ...toeReading(seam.id, 150),
      toe: undefined,
      side: 'face' as const,
      values: { throat: 4 },
    };
    delete (misfit as { toe?: unknown }).toe;
    device.add('reading', misfit.id, bodies.reading(misfit));
    const grades = [
      {
        seamId: seam.id,
        state: 'graded' as const,
        levelMet: 'B' as const,
        meetsRequired: true,
        readingCount: 3,
        gradedAt: '2026-12-01T08:30:00Z',
      },
    ];
    const sent = await device.send(server, await device.seal(device.unsealed(), grades));
    expect(statuses(sent).every((s) => s === 'accepted')).toBe(true);
    await server.settle();
    const view = await jsonOf<{
      serverGrade: {
        state: string;
        summary: { readingCount: number; leftOut: { recordId: string; reason: string }[] };
      };
      deviceGrades: { deviceKid: string; grade: { levelMet: string } }[];
    }>(await server.admin('GET', `/seams/${seam.id}`));
    expect(view.serverGrade.state).toBe('graded');
    expect(view.serverGrade.summary.readingCount).toBe(3);
    expect(view.serverGrade.summary.leftOut).toEqual([
      { recordId: misfit.id, reason: expect.stringContaining('does not apply to a butt joint') as unknown },
    ]);
    expect(view.deviceGrades).toEqual([
      expect.objectContaining({ deviceKid: device.kid, grade: expect.objectContaining({ levelMet: 'B' }) }),
    ]);
  });
});

describe('a re-grade lost to a restart', () => {
  it('is made up for when the server starts again', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'beadbook-regrade-'));
    const dbFile = `${dir}/yard.sqlite`;
    const first = await testServer({ dbFile, keepOpen: true });
    const device = await first.enrolDevice();
    const { seam } = queueSeam(device, 3);
    // Stop the re-grade from running, as a crash right after the commit would.
    (first.deps.regrader as unknown as { schedule: (ids: string[]) => void }).schedule = () => {};
    expect(statuses(await device.send(first, await device.seal())).every((s) => s === 'accepted')).toBe(true);
    expect(await first.storage.getServerGrade(seam.id)).toBeUndefined();
    expect(await first.storage.staleSeams()).toEqual([seam.id]);
    await first.close();
    const second = await testServer({ dbFile });
    await second.settle();
    expect((await second.storage.getServerGrade(seam.id))?.state).toBe('graded');
    expect(await second.storage.staleSeams()).toEqual([]);
  });
});
