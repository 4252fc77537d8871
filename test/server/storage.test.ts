// The storage module on its own: schema and migrations, and every operation's contract. Written against the
// Storage interface, so a second implementation (PostgreSQL) can run the same checks.
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { openDatabase } from '../../src/server/storage/sqlite/open.js';
import { MIGRATIONS } from '../../src/server/storage/sqlite/migrations.js';
import { SqliteStorage } from '../../src/server/storage/sqlite/sqlite-storage.js';
import { PayloadBytes } from '../../src/server/sync/payload-bytes.js';
import { cutBodies, cutsText } from '../support/body-cuts.js';
import type { BatchPlan, PlannedRecord, Storage } from '../../src/server/storage/types.js';

const T = (minute: number) => new Date(Date.UTC(2026, 11, 2, 9, minute)).toISOString();
const KID_A = 'A'.repeat(43);
const KID_B = 'B'.repeat(43);

const tempFile = () => join(mkdtempSync(join(tmpdir(), 'beadbook-db-')), 'nested', 'dir', 'beadbook.sqlite');

describe('SQLite database file', () => {
  it('is created on first open with WAL, foreign keys and the migrations table; reopening runs nothing again', async () => {
    const file = tempFile();
    const db = openDatabase(file);
    expect(db.pragma('journal_mode', { simple: true })).toBe('wal');
    expect(db.pragma('foreign_keys', { simple: true })).toBe(1);
    const versions = db.prepare('SELECT version FROM migrations').all();
    expect(versions).toEqual(MIGRATIONS.map((m) => ({ version: m.version })));
    db.close();
    const again = openDatabase(file);
    expect(again.prepare('SELECT count(*) AS n FROM migrations').get()).toEqual({ n: MIGRATIONS.length });
    again.close();
  });

  it('writes derived grades without an fsync, and keeps every other commit synchronous FULL', async () => {
    const storage = SqliteStorage.open(tempFile());
    const grade = {
      seamId: 's',
      basedOn: 1,
      gradedAt: T(0),
      state: 'graded',
      levelMet: 'B',
      meetsRequired: true,
      summary: '{}',
    };
    await storage.saveServerGrade(grade);
    expect(storage.database.pragma('synchronous', { simple: true })).toBe(2);
    expect((await storage.getServerGrade('s'))?.levelMet).toBe('B');
    await storage.close();
  });

  it('refuses a database from a newer server', () => {
    const file = tempFile();
    openDatabase(file).close();
    const raw = new Database(file);
    raw.prepare('INSERT INTO migrations (version, name, applied_at) VALUES (99, ?, ?)').run('future', T(0));
    raw.close();
    expect(() => openDatabase(file)).toThrow(/schema version 99, newer than this server knows/);
  });

  it('applies a failing migration not at all', () => {
    const file = tempFile();
    const latest = Math.max(...MIGRATIONS.map((m) => m.version));
    const broken = [
      ...MIGRATIONS,
      {
        version: latest + 1,
        name: 'broken',
        sql: 'CREATE TABLE half (x INTEGER); SELECT no_such_function();',
      },
    ];
    expect(() => openDatabase(file, { migrations: broken })).toThrow();
    const db = openDatabase(file);
    expect(db.prepare("SELECT count(*) AS n FROM sqlite_master WHERE name = 'half'").get()).toEqual({ n: 0 });
    expect(db.prepare('SELECT max(version) AS v FROM migrations').get()).toEqual({ v: latest });
    db.close();
  });
});

async function withDevice(storage: Storage, kid = KID_A): Promise<void> {
  const account =
    (await storage.findAccount('sup')) ??
    (await storage.createAccount({
      username: 'sup',
      role: 'supervisor',
      passwordHash: 'x',
      mustChangePassword: false,
      createdAt: T(0),
    }));
  await storage.createEnrolmentCode({
    codeHash: `code-${kid}`,
    createdBy: account.id,
    createdAt: T(0),
    expiresAt: T(10),
  });
  const outcome = await storage.enrolDevice({
    codeHash: `code-${kid}`,
    now: T(1),
    kid,
    publicJwk: '{}',
    name: `device ${kid[0]}`,
  });
  expect(outcome.kind).toBe('enrolled');
}

const valid = (index: number, id: string, body = `{"n":${index}}`, seamId = 'seam-1'): PlannedRecord => ({
  index,
  status: 'valid',
  id,
  kind: 'reading',
  schemaVersion: 1,
  seamId,
  seq: index + 1,
  body,
  createdAt: T(2),
});

const plan = (batchId: string, records: PlannedRecord[], over: Partial<BatchPlan> = {}): BatchPlan => ({
  batchId,
  deviceKid: KID_A,
  deviceSeq: 1,
  payloadSha256: `sha-${batchId}`,
  jws: `{"jws":"${batchId}"}`,
  receivedAt: T(3),
  records,
  deviceGrades: [],
  ...over,
});

function contract(name: string, make: () => Storage) {
  describe(`${name} storage`, () => {
    it('keeps accounts and sessions, and ends sessions at expiry or on request', async () => {
      const s = make();
      const a = await s.createAccount({
        username: 'ana',
        role: 'supervisor',
        passwordHash: 'h1',
        mustChangePassword: true,
        createdAt: T(0),
      });
      await expect(
        s.createAccount({
          username: 'ana',
          role: 'inspector',
          passwordHash: 'h',
          mustChangePassword: false,
          createdAt: T(0),
        }),
      ).rejects.toThrow();
      expect(await s.findAccount('ana')).toMatchObject({
        id: a.id,
        role: 'supervisor',
        passwordHash: 'h1',
        mustChangePassword: true,
      });
      await s.setPassword(a.id, 'h2', false);
      expect(await s.findAccount('ana')).toMatchObject({ passwordHash: 'h2', mustChangePassword: false });
      await s.createSession('t1', a.id, T(0), T(30));
      await s.createSession('t2', a.id, T(0), T(30));
      expect((await s.findSession('t1', T(29)))?.username).toBe('ana');
      expect(await s.findSession('t1', T(30))).toBeUndefined();
      await s.deleteSessionsOf(a.id, 't2');
      expect(await s.findSession('t1', T(1))).toBeUndefined();
      expect(await s.findSession('t2', T(1))).toBeDefined();
      await s.deleteSession('t2');
      expect(await s.findSession('t2', T(1))).toBeUndefined();
      await s.close();
    });

    it('keeps the first server key', async () => {
      const s = make();
      const first = await s.saveServerKey({ kid: 'k1', privateJwk: 'p1', publicJwk: 'q1', createdAt: T(0) });
      const second = await s.saveServerKey({ kid: 'k2', privateJwk: 'p2', publicJwk: 'q2', createdAt: T(1) });
      expect(second).toEqual(first);
      expect(first.kid).toBe('k1');
      await s.close();
    });

    it('uses an enrolment code once, within its time, and never for a revoked key', async () => {
      const s = make();
      const sup = await s.createAccount({
        username: 'sup',
        role: 'supervisor',
        passwordHash: 'x',
        mustChangePassword: false,
        createdAt: T(0),
      });
      await s.createEnrolmentCode({ codeHash: 'c1', createdBy: sup.id, createdAt: T(0), expiresAt: T(10) });
      const attempt = (codeHash: string, kid: string, now = T(5)) =>
        s.enrolDevice({ codeHash, now, kid, publicJwk: '{}', name: 'tablet' });
      expect((await attempt('nope', KID_A)).kind).toBe('codeUnknown');
      expect((await attempt('c1', KID_A)).kind).toBe('enrolled');
      expect((await attempt('c1', KID_A)).kind).toBe('alreadyEnrolled');
      expect((await attempt('c1', KID_B)).kind).toBe('codeUsed');
      await s.createEnrolmentCode({ codeHash: 'c2', createdBy: sup.id, createdAt: T(0), expiresAt: T(10) });
      expect((await attempt('c2', KID_B, T(10))).kind).toBe('codeExpired');
      await s.revokeDevice(KID_A, T(6));
      await s.createEnrolmentCode({ codeHash: 'c3', createdBy: sup.id, createdAt: T(6), expiresAt: T(20) });
      expect((await attempt('c3', KID_A, T(7))).kind).toBe('revoked');
      expect((await attempt('c1', KID_A, T(7))).kind).toBe('codeUsed');
      const devices = await s.listDevices();
      expect(devices.map((d) => [d.kid, d.revokedAt])).toEqual([[KID_A, T(6)]]);
      await s.close();
    });

    it('renames, revokes once, and records last contact and the reported queue', async () => {
      const s = make();
      await withDevice(s);
      expect(await s.renameDevice(KID_A, `Tablet "7" <b>`)).toBe(true);
      expect(await s.renameDevice(KID_B, 'x')).toBe(false);
      await s.touchDevice(KID_A, T(8), { queued: 12, oldestAt: T(-100) });
      await s.touchDevice(KID_A, T(9));
      expect(await s.getDevice(KID_A)).toMatchObject({
        name: `Tablet "7" <b>`,
        lastContactAt: T(9),
        reportedQueue: 12,
        reportedAt: T(8),
        reportedOldestAt: T(-100),
      });
      await s.revokeDevice(KID_A, T(10));
      await s.revokeDevice(KID_A, T(11));
      expect((await s.getDevice(KID_A))?.revokedAt).toBe(T(10));
      await s.close();
    });

    it('accepts a nonce once and never after it expires', async () => {
      const s = make();
      await s.issueNonce('n1', T(5));
      await s.issueNonce('n2', T(5));
      expect(await s.consumeNonce('n1', T(4))).toBe(true);
      expect(await s.consumeNonce('n1', T(4))).toBe(false);
      expect(await s.consumeNonce('n2', T(5))).toBe(false);
      expect(await s.consumeNonce('never', T(0))).toBe(false);
      await s.close();
    });

    it('applies a batch: accepted, duplicate, conflicting, parked and rejected records, all in one go', async () => {
      const s = make();
      await withDevice(s);
      const first = await s.applyBatch(
        plan('b1', [
          valid(0, 'r1'),
          valid(1, 'r2'),
          { index: 2, status: 'rejected', id: 'r3', reason: 'values.toeAngle: too big' },
        ]),
      );
      expect(first).toMatchObject({
        kind: 'applied',
        replay: false,
        seamsChanged: ['seam-1'],
        conflicts: [],
      });
      if (first.kind !== 'applied') throw new Error();
      expect(first.results.map((r) => r.status)).toEqual(['accepted', 'accepted', 'rejected']);
      const second = await s.applyBatch(
        plan(
          'b2',
          [
            valid(0, 'r1'),
            valid(1, 'r2', '{"n":"changed"}'),
            valid(2, 'r4'),
            valid(3, 'r4', '{"n":2}'),
            {
              index: 4,
              status: 'parked',
              id: 'p1',
              kind: 'photo',
              schemaVersion: 2,
              seamId: null,
              record: '{"x":1}',
            },
          ],
          { deviceSeq: 2, payloadSha256: 'sha-b2' },
        ),
      );
      if (second.kind !== 'applied') throw new Error();
      expect(second.results.map((r) => r.status)).toEqual([
        'duplicate',
        'rejected',
        'accepted',
        'duplicate',
        'parked',
      ]);
      expect(second.conflicts).toEqual(['r2']);
      expect((await s.listRecords({})).map((r) => [r.id, r.body])).toEqual([
        ['r1', '{"n":0}'],
        ['r2', '{"n":1}'],
        ['r4', '{"n":2}'],
      ]);
      expect((await s.listParked()).map((p) => p.id)).toEqual(['p1']);
      expect((await s.listSecurityEvents(5)).map((e) => e.kind)).toEqual(['recordIdConflict']);
      // The same batch again: a replay, nothing changes.
      const dump = JSON.stringify(await s.dumpRecordTables());
      const replay = await s.applyBatch(
        plan('b1', [
          valid(0, 'r1'),
          valid(1, 'r2'),
          { index: 2, status: 'rejected', id: 'r3', reason: 'values.toeAngle: too big' },
        ]),
      );
      expect(replay).toMatchObject({ kind: 'applied', replay: true, seamsChanged: [] });
      expect(JSON.stringify(await s.dumpRecordTables())).toBe(dump);
      // The same batch id with another payload, or from another device: refused whole.
      expect(await s.applyBatch(plan('b1', [valid(0, 'r9')], { payloadSha256: 'other' }))).toMatchObject({
        kind: 'conflict',
      });
      await withDevice(s, KID_B);
      expect(await s.applyBatch(plan('b1', [valid(0, 'r9')], { deviceKid: KID_B }))).toMatchObject({
        kind: 'conflict',
      });
      expect(JSON.stringify(await s.dumpRecordTables())).toBe(dump);
      await s.close();
    });

    it('gives back each batch body exactly as received, whether its payload text was kept as bytes or not', async () => {
      const s = make();
      await withDevice(s);
      const text = Buffer.from('{"records":["ä",1]}', 'utf8').toString('base64url');
      // "QQ" and "QR" both decode to the byte "A"; only "QQ" is what encoding that byte writes back.
      const cases = [
        {
          id: 'b1',
          jws: `{"protected":"eyJ9","payload":"${text}","signature":"c2ln"}`,
          payload: PayloadBytes.decode(text),
        },
        { id: 'b2', jws: '{ "payload" : "QR", "protected":"eyJ9" }', payload: PayloadBytes.decode('QR') },
        {
          id: 'b3',
          jws: '{"payload":"QQ","protected":"eyJ9","signature":"QQ"}',
          payload: PayloadBytes.decode('QQ'),
        },
        { id: 'b4', jws: '{"payload":"QQ"}', payload: undefined },
        // A hint that does not match the body cannot change what is kept.
        { id: 'b5', jws: '{"payload":"QUJD"}', payload: PayloadBytes.decode('QQ') },
      ];
      for (const [i, c] of cases.entries()) {
        await s.applyBatch(
          plan(c.id, [valid(0, `r${i}`)], { jws: c.jws, ...(c.payload ? { jwsPayload: c.payload } : {}) }),
        );
      }
      for (const c of cases) expect((await s.getBatch(c.id))?.jws).toBe(c.jws);
      const dumped = (await s.dumpRecordTables())['batches'] as unknown[][];
      expect(dumped.map((row) => row[4])).toEqual(cases.map((c) => c.jws));
      await s.close();
    });

    it('keeps a payload without the records the batch added, and gives back each record', async () => {
      // Read at the column level, so on a file as the server keeps it.
      const s = SqliteStorage.open(tempFile());
      await withDevice(s);
      const body = (n: number, note = 'x') =>
        `{"reading":{"id":"r${n}","note":"${note.repeat(200)}"},"seamId":"seam-1"}`;
      const sent = (batchId: string, records: { id: string; body: string; seq?: number }[]) => {
        const planned = records.map((r, i) => ({
          ...(valid(i, r.id, r.body) as PlannedRecord & { status: 'valid' }),
          ...(r.seq ? { seq: r.seq } : {}),
        }));
        // As a device writes them: canonical, members sorted.
        const texts = planned.map(
          (r) =>
            `{"body":${r.body},"createdAt":"${r.createdAt}","id":"${r.id}","kind":"${r.kind}","schemaVersion":${r.schemaVersion},"seamId":"${r.seamId}","seq":${r.seq}}`,
        );
        const payload = `{"batchId":"${batchId}","records":[${texts.join(',')}]}`;
        const text = Buffer.from(payload, 'utf8').toString('base64url');
        const jws = `{"protected":"eyJ9","payload":"${text}","signature":"c2ln"}`;
        return {
          jws,
          size: Buffer.byteLength(payload),
          texts,
          plan: plan(batchId, planned, { jws, jwsPayload: PayloadBytes.decode(text) }),
        };
      };
      const stored = () =>
        s.database
          .prepare('SELECT batch_id, length(jws_payload) AS kept, jws_payload_cuts AS cuts FROM batches')
          .all() as {
          batch_id: string;
          kept: number;
          cuts: string | null;
        }[];
      // New records; a resend of one of them among a new one (the duplicate stays in the payload); one id with
      // other content (refused, stays) beside a new one; a payload that is not ASCII (kept whole); a record whose
      // text is not what its row writes (a sequence number the row does not hold: stays).
      const b1 = sent(
        'b1',
        [1, 2, 3].map((n) => ({ id: `r${n}`, body: body(n) })),
      );
      const b2 = sent('b2', [
        { id: 'r3', body: body(3) },
        { id: 'r4', body: body(4) },
      ]);
      const b3 = sent('b3', [
        { id: 'r5', body: body(5) },
        { id: 'r1', body: body(9) },
      ]);
      const b4 = sent('b4', [{ id: 'r6', body: body(6, 'ø') }]);
      const b5 = sent('b5', [{ id: 'r7', body: body(7), seq: 9 }]);
      for (const b of [b1, b2, b3, b4]) await s.applyBatch(b.plan);
      // b5's payload says seq 9 while its plan (what the row keeps) says 1.
      await s.applyBatch({ ...b5.plan, records: b5.plan.records.map((r) => ({ ...r, seq: 1 })) });
      const [k1, k2, k3, k4, k5] = stored();
      const length = (xs: string[]) => xs.reduce((n, t) => n + t.length, 0);
      expect(k1?.kept).toBe(b1.size - length(b1.texts));
      expect(k1?.cuts).toMatch(/^R:/);
      expect(k2?.kept).toBe(b2.size - length(b2.texts.slice(1)));
      expect(k3?.kept).toBe(b3.size - length(b3.texts.slice(0, 1)));
      expect(k4).toMatchObject({ kept: b4.size, cuts: null });
      expect(k5).toMatchObject({ kept: b5.size, cuts: null });
      for (const b of [b1, b2, b3, b4, b5]) expect((await s.getBatch(b.plan.batchId))?.jws).toBe(b.jws);
      const dumped = (await s.dumpRecordTables())['batches'] as unknown[][];
      expect(dumped.map((row) => row[4])).toEqual([b1.jws, b2.jws, b3.jws, b4.jws, b5.jws]);
      await s.close();
    });

    it('still gives back payloads stored with their bodies cut out (the earlier layout)', async () => {
      const s = SqliteStorage.open(tempFile());
      await withDevice(s);
      const bodyText = `{"reading":{"id":"r1","note":"${'y'.repeat(300)}"},"seamId":"seam-1"}`;
      const payload = `{"batchId":"old","records":[{"body":${bodyText},"id":"r1"}]}`;
      const text = Buffer.from(payload, 'utf8').toString('base64url');
      const jws = `{"protected":"eyJ9","payload":"${text}","signature":"c2ln"}`;
      await s.applyBatch(plan('old', [valid(0, 'r1', bodyText)], { jws }));
      const cut = cutBodies(payload, [{ id: 'r1', body: bodyText }]);
      if (!cut) throw new Error('the body should be found in the payload');
      // As a server of the earlier layout wrote the row.
      s.database
        .prepare(
          `UPDATE batches SET jws = ?, jws_payload = ?, jws_payload_at = ?, jws_payload_cuts = ? WHERE batch_id = 'old'`,
        )
        .run(jws.replace(text, ''), Buffer.from(cut.rest, 'latin1'), jws.indexOf(text), cutsText(cut.cuts));
      expect((await s.getBatch('old'))?.jws).toBe(jws);
      await s.close();
    });

    it('stores nothing of a batch from a device it does not know', async () => {
      const s = make();
      const dump = JSON.stringify(await s.dumpRecordTables());
      await expect(s.applyBatch(plan('b1', [valid(0, 'r1')], { deviceKid: KID_B }))).rejects.toThrow();
      expect(JSON.stringify(await s.dumpRecordTables())).toBe(dump);
      await s.close();
    });

    it('keeps text that looks like SQL or markup exactly as given', async () => {
      const s = make();
      await withDevice(s);
      const hostile = `{"label":"x'); DROP TABLE records; --","tag":"<script>alert(1)</script>"}`;
      await s.applyBatch(
        plan(`b'); DELETE FROM batches; --`, [valid(0, `r" OR "1"="1`, hostile, `seam'--`)]),
      );
      const [r] = await s.listRecords({ seamId: `seam'--` });
      expect(r).toMatchObject({ id: `r" OR "1"="1`, body: hostile, batchId: `b'); DELETE FROM batches; --` });
      expect(await s.getBatch(`b'); DELETE FROM batches; --`)).toBeDefined();
      await s.close();
    });

    it("keeps the devices' grades by batch order and never lets an older server grade overwrite a newer one", async () => {
      const s = make();
      await withDevice(s);
      await s.applyBatch(
        plan('b2', [valid(0, 'r1')], {
          deviceSeq: 2,
          deviceGrades: [{ seamId: 'seam-1', grade: '{"v":2}' }],
        }),
      );
      await s.applyBatch(
        plan('b1', [valid(0, 'r2')], {
          deviceSeq: 1,
          payloadSha256: 'x',
          deviceGrades: [{ seamId: 'seam-1', grade: '{"v":1}' }],
        }),
      );
      expect((await s.listDeviceGrades('seam-1')).map((g) => g.grade)).toEqual(['{"v":2}']);
      const grade = {
        seamId: 'seam-1',
        gradedAt: T(5),
        state: 'graded',
        levelMet: 'B',
        meetsRequired: true,
        summary: '{}',
      };
      await s.saveServerGrade({ ...grade, basedOn: 2 });
      await s.saveServerGrade({ ...grade, basedOn: 1, levelMet: 'D' });
      expect((await s.getServerGrade('seam-1'))?.levelMet).toBe('B');
      await s.saveServerGrade({ ...grade, basedOn: 3, levelMet: 'C', meetsRequired: false });
      expect(await s.getServerGrade('seam-1')).toMatchObject({
        levelMet: 'C',
        meetsRequired: false,
        basedOn: 3,
      });
      await s.close();
    });

    it("lists a device's changes after a cursor: its assignments, and decisions on seams it worked on", async () => {
      const s = make();
      await withDevice(s, KID_A);
      await withDevice(s, KID_B);
      const change = (
        kind: 'assignment' | 'decision',
        itemId: string,
        seamId: string,
        deviceKid: string | null,
      ) =>
        s.addChange({
          kind,
          itemId,
          seamId,
          deviceKid,
          item: `{"id":"${itemId}"}`,
          createdAt: T(4),
          createdBy: null,
        });
      await change('assignment', 'a1', 'seam-x', KID_A);
      await change('assignment', 'a2', 'seam-y', KID_B);
      await change('decision', 'd1', 'seam-x', null);
      await change('decision', 'd2', 'seam-y', null);
      await s.applyBatch(plan('b1', [valid(0, 'r1', '{}', 'seam-z')]));
      await change('decision', 'd3', 'seam-z', null);
      const all = await s.changesFor(KID_A, 0, 10);
      expect(all.changes.map((c) => c.itemId)).toEqual(['a1', 'd1', 'd3']);
      expect(all).toMatchObject({ through: 5, more: false });
      const page = await s.changesFor(KID_A, 0, 2);
      expect(page.changes.map((c) => c.itemId)).toEqual(['a1', 'd1']);
      expect(page).toMatchObject({ through: 3, more: true });
      const rest = await s.changesFor(KID_A, page.through, 2);
      expect(rest.changes.map((c) => c.itemId)).toEqual(['d3']);
      expect(await s.changesFor(KID_A, 5, 2)).toMatchObject({ changes: [], through: 5, more: false });
      await s.close();
    });

    it("gives a seam's material: its server set-up and its records in receive order", async () => {
      const s = make();
      await withDevice(s);
      expect(
        await s.putSeam({ id: 'seam-1', namespace: 'live', setup: '{"id":"seam-1"}', createdAt: T(0) }, null),
      ).toBe('created');
      expect(
        await s.putSeam(
          { id: 'seam-1', namespace: 'live', setup: '{"id":"seam-1","v":2}', createdAt: T(1) },
          null,
        ),
      ).toBe('updated');
      await s.applyBatch(plan('b1', [valid(0, 'r2'), valid(1, 'r1')]));
      const material = await s.seamMaterial('seam-1');
      expect(material.seam?.setup).toBe('{"id":"seam-1","v":2}');
      expect(material.records.map((r) => [r.id, r.receiveSeq])).toEqual([
        ['r2', 1],
        ['r1', 2],
      ]);
      expect(await s.listSeamIds()).toEqual(['seam-1']);
      await s.close();
    });

    it('gives the grade its material without the bodies it holds already, however few or many those are', async () => {
      const s = make();
      await withDevice(s);
      const ids = Array.from({ length: 8 }, (_, i) => `r${i}`);
      await s.applyBatch(
        plan(
          'b1',
          ids.map((id, i) => valid(i, id)),
        ),
      );
      const full = (await s.seamMaterial('seam-1')).records.map((r) => [r.id, r.receiveSeq, r.body]);
      // Most held (bodies fetched one by one), none held, and some held (one scan).
      for (const held of [new Set(ids.slice(1)), new Set<string>(), new Set(['r0', 'r5', 'nope'])]) {
        const material = await s.gradeMaterial('seam-1', held);
        expect(material.records.map((r) => [r.id, r.receiveSeq, r.body])).toEqual(
          full.map(([id, seq, body]) => [id, seq, held.has(id as string) ? null : body]),
        );
        expect(material.records.every((r) => r.kind === 'reading' && r.deviceKid === KID_A)).toBe(true);
        expect(material.records.map((r) => r.deviceSeq)).toEqual(ids.map((_, i) => i + 1));
      }
      await s.close();
    });
  });
}

contract('SQLite (in memory)', () => SqliteStorage.open(':memory:'));
contract('SQLite (file, WAL)', () => SqliteStorage.open(tempFile()));
