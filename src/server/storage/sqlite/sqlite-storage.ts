// The SQLite store: every SQL statement of the server. Statements are constant text, prepared once, with values
// bound as parameters: nothing is ever built from field names or input. Each operation that writes more than
// one row runs in one explicit IMMEDIATE transaction.
import type { RecordResult } from '../../../protocol/index.js';
import type {
  Account,
  AccountWithHash,
  BatchOutcome,
  BatchPlan,
  BatchRow,
  ChangeRow,
  DecisionOutcomeOfAdd,
  DecisionRow,
  Device,
  DeviceGradeRow,
  EnrolAttempt,
  EnrolmentCodeRow,
  EnrolOutcome,
  GradeMaterial,
  GradeRecord,
  NewAccount,
  NewChange,
  NewDecision,
  ParkedRecord,
  PlannedRecord,
  ReviewChoices,
  ReviewFacts,
  ReviewQuery,
  ReviewQueuePage,
  SeamMaterial,
  SeamRow,
  SecurityEvent,
  ServerGrade,
  ServerKeyRow,
  Storage,
  StoredRecord,
} from '../types.js';
import { toChange, type ChangeDbRow } from './change-rows.js';
import { joinJws, splitJws } from './jws-columns.js';
import { parseCuts, restoreBodies } from './payload-cuts.js';
import {
  cutRecords,
  isRecordCutsText,
  parseRecordCuts,
  recordCutsText,
  restoreRecords,
  type RecordColumns,
} from './record-cuts.js';
import { openDatabase, type Db, type OpenOptions } from './open.js';
import { ReviewStatements } from './review-store.js';

interface AccountRow {
  id: number;
  username: string;
  role: 'supervisor' | 'inspector';
  password_hash: string;
  must_change_password: number;
  created_at: string;
}

interface DeviceRow {
  kid: string;
  public_jwk: string;
  name: string;
  enrolled_at: string;
  revoked_at: string | null;
  last_contact_at: string | null;
  reported_queue: number | null;
  reported_oldest_at: string | null;
  reported_at: string | null;
  inspector_id: number | null;
  inspector_name: string | null;
}

interface RecordRow {
  receive_seq: number;
  id: string;
  kind: string;
  schema_version: number;
  seam_id: string;
  device_kid: string | null;
  batch_id: string | null;
  device_seq: number;
  body: string;
  device_created_at: string;
  received_at: string;
}

const toAccount = (r: AccountRow): AccountWithHash => ({
  id: r.id,
  username: r.username,
  role: r.role,
  mustChangePassword: r.must_change_password === 1,
  createdAt: r.created_at,
  passwordHash: r.password_hash,
});

const withoutHash = ({ passwordHash: _hash, ...account }: AccountWithHash): Account => account;

const toDevice = (r: DeviceRow): Device => ({
  kid: r.kid,
  publicJwk: r.public_jwk,
  name: r.name,
  enrolledAt: r.enrolled_at,
  revokedAt: r.revoked_at,
  lastContactAt: r.last_contact_at,
  reportedQueue: r.reported_queue,
  reportedOldestAt: r.reported_oldest_at,
  reportedAt: r.reported_at,
  inspectorId: r.inspector_id,
  inspectorName: r.inspector_name,
});

const toRecord = (r: RecordRow): StoredRecord => ({
  receiveSeq: r.receive_seq,
  id: r.id,
  kind: r.kind,
  schemaVersion: r.schema_version,
  seamId: r.seam_id,
  deviceKid: r.device_kid,
  batchId: r.batch_id,
  deviceSeq: r.device_seq,
  body: r.body,
  deviceCreatedAt: r.device_created_at,
  receivedAt: r.received_at,
});

/** The tables a replayed batch must leave byte-identical, with the order their dump is taken in. */
const RECORD_TABLE_DUMPS = {
  // The JWS as received, whichever way it is laid out in its columns (joined below).
  batches: `SELECT batch_id, device_kid, device_seq, payload_sha256, jws, record_count, received_at, jws_payload,
    jws_payload_at, jws_payload_cuts FROM batches ORDER BY batch_id`,
  records: 'SELECT * FROM records ORDER BY receive_seq',
  parked_records: 'SELECT * FROM parked_records ORDER BY id',
  rejections: 'SELECT * FROM rejections ORDER BY batch_id, record_index',
  device_seams: 'SELECT * FROM device_seams ORDER BY device_kid, seam_id',
  device_grades: 'SELECT * FROM device_grades ORDER BY seam_id, device_kid',
  server_grades: 'SELECT * FROM server_grades ORDER BY seam_id',
} as const;

export class SqliteStorage implements Storage {
  readonly dialect = 'sqlite';
  readonly #db: Db;
  readonly #s;
  readonly #review: ReviewStatements;
  /** The connection's synchronous setting (FULL unless opened otherwise). */
  readonly #synchronous: 'FULL' | 'NORMAL';

  constructor(db: Db) {
    this.#db = db;
    this.#synchronous = db.pragma('synchronous', { simple: true }) === 1 ? 'NORMAL' : 'FULL';
    this.#review = new ReviewStatements(db);
    const p = (sql: string) => db.prepare(sql);
    this.#s = {
      countAccounts: p('SELECT count(*) AS n FROM accounts'),
      insertAccount: p(
        `INSERT INTO accounts (username, role, password_hash, must_change_password, created_at)
         VALUES (@username, @role, @passwordHash, @mustChange, @createdAt)`,
      ),
      accountById: p('SELECT * FROM accounts WHERE id = ?'),
      accountByName: p('SELECT * FROM accounts WHERE username = ?'),
      accountsOfRole: p('SELECT * FROM accounts WHERE role = ? ORDER BY username'),
      setPassword: p('UPDATE accounts SET password_hash = ?, must_change_password = ? WHERE id = ?'),
      insertSession: p(
        'INSERT INTO sessions (token_hash, account_id, created_at, expires_at) VALUES (?, ?, ?, ?)',
      ),
      sessionAccount: p(
        `SELECT a.* FROM sessions s JOIN accounts a ON a.id = s.account_id
         WHERE s.token_hash = ? AND s.expires_at > ?`,
      ),
      deleteSession: p('DELETE FROM sessions WHERE token_hash = ?'),
      deleteSessionsOf: p('DELETE FROM sessions WHERE account_id = ? AND token_hash IS NOT ?'),
      deleteExpiredSessions: p('DELETE FROM sessions WHERE expires_at <= ?'),
      serverKey: p('SELECT * FROM server_keys ORDER BY created_at, kid LIMIT 1'),
      insertServerKey: p(
        'INSERT INTO server_keys (kid, private_jwk, public_jwk, created_at) VALUES (?, ?, ?, ?) ON CONFLICT DO NOTHING',
      ),
      insertCode: p(
        `INSERT INTO enrolment_codes (code_hash, created_by, created_at, expires_at, inspector_id)
         VALUES (?, ?, ?, ?, ?)`,
      ),
      codeByHash: p('SELECT * FROM enrolment_codes WHERE code_hash = ?'),
      useCode: p(
        'UPDATE enrolment_codes SET used_at = ?, used_by_kid = ? WHERE code_hash = ? AND used_at IS NULL',
      ),
      deleteOldCodes: p('DELETE FROM enrolment_codes WHERE used_at IS NULL AND expires_at <= ?'),
      device: p(
        `SELECT d.*, a.username AS inspector_name FROM devices d LEFT JOIN accounts a ON a.id = d.inspector_id
         WHERE d.kid = ?`,
      ),
      devices: p(
        `SELECT d.*, a.username AS inspector_name FROM devices d LEFT JOIN accounts a ON a.id = d.inspector_id
         ORDER BY d.enrolled_at, d.kid`,
      ),
      setInspector: p('UPDATE devices SET inspector_id = ?, inspector_from_seq = ? WHERE kid = ?'),
      // The newest assignment of each seam to the inspector, made up to the given change number.
      inspectorAssignments: p(
        `SELECT * FROM changes WHERE seq IN (
           SELECT max(seq) FROM changes WHERE kind = 'assignment' AND inspector_id = ? AND seq <= ? GROUP BY seam_id)
         ORDER BY seq`,
      ),
      insertDevice: p(
        'INSERT INTO devices (kid, public_jwk, name, enrolled_at, last_contact_at) VALUES (?, ?, ?, ?, ?)',
      ),
      renameDevice: p('UPDATE devices SET name = ? WHERE kid = ?'),
      revokeDevice: p('UPDATE devices SET revoked_at = coalesce(revoked_at, ?) WHERE kid = ?'),
      touchDevice: p('UPDATE devices SET last_contact_at = ? WHERE kid = ?'),
      reportQueue: p(
        `UPDATE devices SET last_contact_at = ?, reported_queue = ?, reported_oldest_at = ?, reported_at = ?
         WHERE kid = ?`,
      ),
      insertNonce: p('INSERT INTO nonces (nonce, expires_at) VALUES (?, ?)'),
      takeNonce: p('DELETE FROM nonces WHERE nonce = ? AND expires_at > ?'),
      deleteExpiredNonces: p('DELETE FROM nonces WHERE expires_at <= ?'),
      batch: p('SELECT * FROM batches WHERE batch_id = ?'),
      batchOwner: p('SELECT device_kid, payload_sha256 FROM batches WHERE batch_id = ?'),
      insertBatch: p(
        `INSERT INTO batches (batch_id, device_kid, device_seq, payload_sha256, jws, record_count, received_at,
           jws_payload, jws_payload_at, jws_payload_cuts)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      setBatchPayload: p('UPDATE batches SET jws_payload = ?, jws_payload_cuts = ? WHERE batch_id = ?'),
      recordColumnsIn: p(
        `SELECT receive_seq, id, kind, schema_version, seam_id, device_seq, body, device_created_at FROM records
         WHERE receive_seq BETWEEN ? AND ?`,
      ).raw(true),
      bodyById: p('SELECT body FROM records WHERE id = ?').pluck(),
      insertRecord: p(
        `INSERT INTO records (id, kind, schema_version, seam_id, device_kid, batch_id, device_seq, body,
           device_created_at, received_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?, ?, ?) ON CONFLICT (id) DO NOTHING`,
      ),
      recordContent: p('SELECT kind, schema_version, seam_id, body FROM records WHERE id = ?'),
      parkedExists: p('SELECT 1 FROM parked_records WHERE id = ?'),
      anyParked: p('SELECT 1 FROM parked_records LIMIT 1'),
      recordExists: p('SELECT 1 FROM records WHERE id = ?'),
      insertParked: p(
        `INSERT INTO parked_records (id, kind, schema_version, seam_id, device_kid, batch_id, record, received_at)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?) ON CONFLICT (id) DO NOTHING`,
      ),
      parkedContent: p('SELECT record FROM parked_records WHERE id = ?'),
      insertRejection: p(
        'INSERT INTO rejections (batch_id, record_index, record_id, reason) VALUES (?, ?, ?, ?)',
      ),
      linkDeviceSeam: p(
        'INSERT INTO device_seams (device_kid, seam_id) VALUES (?, ?) ON CONFLICT DO NOTHING',
      ),
      upsertDeviceGrade: p(
        `INSERT INTO device_grades (seam_id, device_kid, batch_seq, grade) VALUES (?, ?, ?, ?)
         ON CONFLICT (seam_id, device_kid) DO UPDATE SET batch_seq = excluded.batch_seq, grade = excluded.grade
         WHERE excluded.batch_seq > device_grades.batch_seq`,
      ),
      insertSecurityEvent: p(
        'INSERT INTO security_events (at, kind, device_kid, detail) VALUES (?, ?, ?, ?)',
      ),
      securityEvents: p('SELECT * FROM security_events ORDER BY id DESC LIMIT ?'),
      recordsAll: p('SELECT * FROM records ORDER BY receive_seq'),
      recordsOfSeam: p('SELECT * FROM records WHERE seam_id = ? ORDER BY receive_seq'),
      viewingOfSeam: p("SELECT * FROM records WHERE seam_id = ? AND kind = 'viewing' ORDER BY receive_seq"),
      recordHeadsOfSeam: p(
        'SELECT receive_seq, id, kind, device_kid, device_seq FROM records WHERE seam_id = ? ORDER BY receive_seq',
      ).raw(true),
      recordBody: p('SELECT body FROM records WHERE receive_seq = ?'),
      recordsOfDevice: p('SELECT * FROM records WHERE device_kid = ? ORDER BY receive_seq'),
      recordsOfSeamAndDevice: p(
        'SELECT * FROM records WHERE seam_id = ? AND device_kid = ? ORDER BY receive_seq',
      ),
      parked: p('SELECT * FROM parked_records ORDER BY id'),
      insertServerRecord: p(
        `INSERT INTO records (id, kind, schema_version, seam_id, device_kid, batch_id, device_seq, body,
           device_created_at, received_at)
         VALUES (?, ?, ?, ?, NULL, NULL, ?, ?, ?, ?) ON CONFLICT (id) DO NOTHING`,
      ),
      seam: p('SELECT id, namespace, setup, created_at FROM seams WHERE id = ?'),
      seamIds: p('SELECT id FROM seams UNION SELECT DISTINCT seam_id FROM records ORDER BY 1'),
      insertSeam: p(
        `INSERT INTO seams (id, namespace, setup, created_at, created_by) VALUES (?, ?, ?, ?, ?)
         ON CONFLICT (id) DO UPDATE SET setup = excluded.setup`,
      ),
      seamExists: p('SELECT 1 FROM seams WHERE id = ?'),
      saveGrade: p(
        `INSERT INTO server_grades (seam_id, based_on, graded_at, state, level_met, meets_required, summary)
         VALUES (@seamId, @basedOn, @gradedAt, @state, @levelMet, @meetsRequired, @summary)
         ON CONFLICT (seam_id) DO UPDATE SET based_on = excluded.based_on, graded_at = excluded.graded_at,
           state = excluded.state, level_met = excluded.level_met, meets_required = excluded.meets_required,
           summary = excluded.summary
         WHERE excluded.based_on >= server_grades.based_on`,
      ),
      grade: p('SELECT * FROM server_grades WHERE seam_id = ?'),
      staleSeams: p(
        `SELECT r.seam_id AS id FROM records r LEFT JOIN server_grades g ON g.seam_id = r.seam_id
         GROUP BY r.seam_id HAVING max(r.receive_seq) > coalesce(max(g.based_on), 0) ORDER BY r.seam_id`,
      ),
      deviceGrades: p('SELECT * FROM device_grades WHERE seam_id = ? ORDER BY device_kid'),
      insertChange: p(
        `INSERT INTO changes (kind, item_id, seam_id, device_kid, inspector_id, item, created_at, created_by)
         VALUES (?, ?, ?, ?, ?, ?, ?, ?)`,
      ),
      changeBySeq: p('SELECT * FROM changes WHERE seq = ?'),
      // Addressed to the device; a decision on a seam the device worked on or its inspector was assigned; an
      // assignment to its inspector made after the device was tied (earlier ones were copied to it then).
      changesFor: p(
        `WITH me AS (SELECT inspector_id, inspector_from_seq FROM devices WHERE kid = @kid)
         SELECT c.* FROM changes c
         WHERE c.seq > @after AND (c.device_kid = @kid
           OR (c.device_kid IS NULL AND c.inspector_id IS NULL AND (
             c.seam_id IN (SELECT seam_id FROM device_seams WHERE device_kid = @kid)
             OR c.seam_id IN (SELECT a.seam_id FROM changes a, me
               WHERE a.kind = 'assignment' AND a.inspector_id = me.inspector_id)))
           OR (c.device_kid IS NULL AND c.inspector_id = (SELECT inspector_id FROM me)
             AND c.seq > (SELECT inspector_from_seq FROM me)))
         ORDER BY c.seq LIMIT @limit`,
      ),
      lastChange: p('SELECT coalesce(max(seq), 0) AS seq FROM changes'),
      seamsAssignedToDevice: p(
        `SELECT DISTINCT seam_id AS id FROM changes WHERE kind = 'assignment' AND device_kid = ? ORDER BY seam_id`,
      ),
      seamsAssignedToInspector: p(
        `SELECT DISTINCT seam_id AS id FROM changes WHERE kind = 'assignment' AND inspector_id = ? ORDER BY seam_id`,
      ),
    };
  }

  /** Opens (creating it on first use) the database file and brings its schema up to date. */
  static open(file: string, options: OpenOptions = {}): SqliteStorage {
    return new SqliteStorage(openDatabase(file, options));
  }

  /** The connection, for tests that must reach under the contract (e.g. to inject a failing trigger). */
  get database(): Db {
    return this.#db;
  }

  async close(): Promise<void> {
    if (this.#db.open) this.#db.close();
  }

  async countAccounts(): Promise<number> {
    return (this.#s.countAccounts.get() as { n: number }).n;
  }

  async createAccount(a: NewAccount): Promise<Account> {
    const info = this.#s.insertAccount.run({
      username: a.username,
      role: a.role,
      passwordHash: a.passwordHash,
      mustChange: a.mustChangePassword ? 1 : 0,
      createdAt: a.createdAt,
    });
    return withoutHash(toAccount(this.#s.accountById.get(info.lastInsertRowid) as AccountRow));
  }

  async listAccounts(role: Account['role']): Promise<Account[]> {
    return (this.#s.accountsOfRole.all(role) as AccountRow[]).map((r) => withoutHash(toAccount(r)));
  }

  async findAccount(username: string): Promise<AccountWithHash | undefined> {
    const row = this.#s.accountByName.get(username) as AccountRow | undefined;
    return row && toAccount(row);
  }

  async setPassword(accountId: number, passwordHash: string, mustChangePassword: boolean): Promise<void> {
    this.#s.setPassword.run(passwordHash, mustChangePassword ? 1 : 0, accountId);
  }

  async createSession(
    tokenHash: string,
    accountId: number,
    createdAt: string,
    expiresAt: string,
  ): Promise<void> {
    this.#db
      .transaction(() => {
        this.#s.deleteExpiredSessions.run(createdAt);
        this.#s.insertSession.run(tokenHash, accountId, createdAt, expiresAt);
      })
      .immediate();
  }

  async findSession(tokenHash: string, now: string): Promise<Account | undefined> {
    const row = this.#s.sessionAccount.get(tokenHash, now) as AccountRow | undefined;
    return row && withoutHash(toAccount(row));
  }

  async deleteSession(tokenHash: string): Promise<void> {
    this.#s.deleteSession.run(tokenHash);
  }

  async deleteSessionsOf(accountId: number, keepTokenHash: string | null): Promise<void> {
    this.#s.deleteSessionsOf.run(accountId, keepTokenHash);
  }

  async getServerKey(): Promise<ServerKeyRow | undefined> {
    const row = this.#s.serverKey.get() as
      { kid: string; private_jwk: string; public_jwk: string; created_at: string } | undefined;
    return (
      row && {
        kid: row.kid,
        privateJwk: row.private_jwk,
        publicJwk: row.public_jwk,
        createdAt: row.created_at,
      }
    );
  }

  async saveServerKey(key: ServerKeyRow): Promise<ServerKeyRow> {
    this.#db
      .transaction(() => {
        if (!this.#s.serverKey.get())
          this.#s.insertServerKey.run(key.kid, key.privateJwk, key.publicJwk, key.createdAt);
      })
      .immediate();
    return (await this.getServerKey()) as ServerKeyRow;
  }

  async createEnrolmentCode(code: EnrolmentCodeRow): Promise<void> {
    this.#db
      .transaction(() => {
        this.#s.deleteOldCodes.run(code.createdAt);
        this.#s.insertCode.run(
          code.codeHash,
          code.createdBy,
          code.createdAt,
          code.expiresAt,
          code.inspectorId ?? null,
        );
      })
      .immediate();
  }

  async enrolDevice(a: EnrolAttempt): Promise<EnrolOutcome> {
    return this.#db
      .transaction((): EnrolOutcome => {
        const code = this.#s.codeByHash.get(a.codeHash) as
          | {
              expires_at: string;
              used_at: string | null;
              used_by_kid: string | null;
              inspector_id: number | null;
            }
          | undefined;
        const existing = this.#s.device.get(a.kid) as DeviceRow | undefined;
        if (!code) return { kind: 'codeUnknown' };
        if (code.used_at !== null) {
          // The same device asking again with the code it used (its reply was lost): the same answer again.
          if (code.used_by_kid === a.kid && existing && existing.revoked_at === null) {
            return { kind: 'alreadyEnrolled', device: toDevice(existing) };
          }
          return { kind: 'codeUsed' };
        }
        if (code.expires_at <= a.now) return { kind: 'codeExpired' };
        if (existing?.revoked_at != null) return { kind: 'revoked' };
        if (!existing) {
          this.#s.insertDevice.run(a.kid, a.publicJwk, a.name, a.now, a.now);
          // A new device pulls from the start, so every assignment to its inspector reaches it.
          if (code.inspector_id !== null) this.#s.setInspector.run(code.inspector_id, 0, a.kid);
        }
        this.#s.useCode.run(a.now, a.kid, a.codeHash);
        const device = toDevice(this.#s.device.get(a.kid) as DeviceRow);
        return { kind: existing ? 'alreadyEnrolled' : 'enrolled', device };
      })
      .immediate();
  }

  async getDevice(kid: string): Promise<Device | undefined> {
    const row = this.#s.device.get(kid) as DeviceRow | undefined;
    return row && toDevice(row);
  }

  async listDevices(): Promise<Device[]> {
    return (this.#s.devices.all() as DeviceRow[]).map(toDevice);
  }

  async tieDevice(
    kid: string,
    inspectorId: number | null,
    copy: (assignment: ChangeRow) => NewChange,
  ): Promise<boolean> {
    return this.#db
      .transaction(() => {
        const device = this.#s.device.get(kid) as DeviceRow | undefined;
        if (!device) return false;
        if (device.inspector_id === inspectorId) return true;
        if (inspectorId !== null) {
          const through = (this.#s.lastChange.get() as { seq: number }).seq;
          for (const row of this.#s.inspectorAssignments.all(inspectorId, through) as ChangeDbRow[])
            this.#insertChange(copy(toChange(row)));
        }
        this.#s.setInspector.run(inspectorId, (this.#s.lastChange.get() as { seq: number }).seq, kid);
        return true;
      })
      .immediate();
  }

  async renameDevice(kid: string, name: string): Promise<boolean> {
    return this.#s.renameDevice.run(name, kid).changes === 1;
  }

  async revokeDevice(kid: string, at: string): Promise<boolean> {
    return this.#s.revokeDevice.run(at, kid).changes === 1;
  }

  async touchDevice(
    kid: string,
    at: string,
    report?: { queued: number; oldestAt: string | null },
  ): Promise<void> {
    if (report) this.#s.reportQueue.run(at, report.queued, report.oldestAt, at, kid);
    else this.#s.touchDevice.run(at, kid);
  }

  async issueNonce(nonce: string, expiresAt: string): Promise<void> {
    this.#s.insertNonce.run(nonce, expiresAt);
  }

  async consumeNonce(nonce: string, now: string): Promise<boolean> {
    return this.#db
      .transaction(() => {
        const taken = this.#s.takeNonce.run(nonce, now).changes === 1;
        this.#s.deleteExpiredNonces.run(now);
        return taken;
      })
      .immediate();
  }

  async applyBatch(plan: BatchPlan): Promise<BatchOutcome> {
    return this.#db.transaction((): BatchOutcome => this.#apply(plan)).immediate();
  }

  #apply(plan: BatchPlan): BatchOutcome {
    const s = this.#s;
    const known = s.batchOwner.get(plan.batchId) as
      { device_kid: string; payload_sha256: string } | undefined;
    if (known && (known.device_kid !== plan.deviceKid || known.payload_sha256 !== plan.payloadSha256)) {
      return {
        kind: 'conflict',
        reason:
          known.device_kid !== plan.deviceKid
            ? 'this batch id was used by another device'
            : 'this batch id was used before with a different payload',
      };
    }
    const replay = known !== undefined;
    // The payload is kept without the records this batch adds (record-cuts.ts): those are known only once inserted,
    // so the batch row goes in first without its payload bytes and gets them after the records.
    let cutFrom: { readonly ascii: string; readonly payload: Buffer } | null = null;
    if (!replay) {
      const jws = splitJws(plan.jws, plan.jwsPayload);
      // Cut by character, which is by byte only for an ASCII payload (the usual one); others are kept whole.
      const ascii = jws.payload ? (plan.jwsPayload?.ascii() ?? null) : null;
      if (ascii !== null && jws.payload) cutFrom = { ascii, payload: jws.payload };
      s.insertBatch.run(
        plan.batchId,
        plan.deviceKid,
        plan.deviceSeq,
        plan.payloadSha256,
        jws.jws,
        plan.records.length,
        plan.receivedAt,
        cutFrom ? null : jws.payload,
        jws.payloadAt,
        null,
      );
    }
    const added: { receiveSeq: number; columns: RecordColumns }[] = [];
    const results: RecordResult[] = [];
    const seamsChanged = new Set<string>();
    const seamsSeen = new Set<string>();
    const conflicts: string[] = [];
    const conflict = (r: PlannedRecord & { id: string }, why: string): RecordResult => {
      conflicts.push(r.id);
      s.insertSecurityEvent.run(
        plan.receivedAt,
        'recordIdConflict',
        plan.deviceKid,
        JSON.stringify({ batchId: plan.batchId, recordId: r.id, why }),
      );
      return { index: r.index, id: r.id, status: 'rejected', reason: why };
    };
    // Parked records are rare: look each id up among them only when there are any.
    const parkedHeld = s.anyParked.get() !== undefined;
    for (const r of plan.records) {
      let result: RecordResult;
      if (r.status === 'valid') {
        seamsSeen.add(r.seamId);
        if (parkedHeld && s.parkedExists.get(r.id)) {
          result = conflict(r, `record id "${r.id}" is already held as a record of a newer schema`);
        } else {
          const info = s.insertRecord.run(
            r.id,
            r.kind,
            r.schemaVersion,
            r.seamId,
            plan.deviceKid,
            plan.batchId,
            r.seq,
            r.body,
            r.createdAt,
            plan.receivedAt,
          );
          if (info.changes === 1) {
            if (cutFrom) added.push({ receiveSeq: Number(info.lastInsertRowid), columns: r });
            seamsChanged.add(r.seamId);
            result = { index: r.index, id: r.id, status: 'accepted' };
          } else {
            const held = s.recordContent.get(r.id) as
              { kind: string; schema_version: number; seam_id: string; body: string } | undefined;
            const same =
              held?.kind === r.kind &&
              held.schema_version === r.schemaVersion &&
              held.seam_id === r.seamId &&
              held.body === r.body;
            result = same
              ? { index: r.index, id: r.id, status: 'duplicate' }
              : conflict(
                  r,
                  `record id "${r.id}" is already stored with other content; records are never overwritten`,
                );
          }
        }
      } else if (r.status === 'parked') {
        if (s.recordExists.get(r.id)) {
          result = conflict(r, `record id "${r.id}" is already stored as a record of schema version 1`);
        } else {
          const info = s.insertParked.run(
            r.id,
            r.kind,
            r.schemaVersion,
            r.seamId,
            plan.deviceKid,
            plan.batchId,
            r.record,
            plan.receivedAt,
          );
          if (info.changes === 1) result = { index: r.index, id: r.id, status: 'parked' };
          else {
            const held = s.parkedContent.get(r.id) as { record: string } | undefined;
            result =
              held?.record === r.record
                ? { index: r.index, id: r.id, status: 'duplicate' }
                : conflict(r, `record id "${r.id}" is already held with other content`);
          }
        }
      } else {
        if (!replay) s.insertRejection.run(plan.batchId, r.index, r.id, r.reason);
        result = { index: r.index, id: r.id, status: 'rejected', reason: r.reason };
      }
      results.push(result);
    }
    if (cutFrom) {
      const cut = cutRecords(cutFrom.ascii, added);
      s.setBatchPayload.run(
        cut ? Buffer.from(cut.rest, 'latin1') : cutFrom.payload,
        cut ? recordCutsText(cut.cuts) : null,
        plan.batchId,
      );
    }
    for (const seamId of seamsSeen) s.linkDeviceSeam.run(plan.deviceKid, seamId);
    for (const g of plan.deviceGrades)
      s.upsertDeviceGrade.run(g.seamId, plan.deviceKid, plan.deviceSeq, g.grade);
    s.touchDevice.run(plan.receivedAt, plan.deviceKid);
    return { kind: 'applied', replay, results, seamsChanged: [...seamsChanged], conflicts };
  }

  async getBatch(batchId: string): Promise<BatchRow | undefined> {
    const row = this.#s.batch.get(batchId) as
      | {
          batch_id: string;
          device_kid: string;
          device_seq: number;
          payload_sha256: string;
          jws: string;
          record_count: number;
          received_at: string;
          jws_payload: Buffer | null;
          jws_payload_at: number | null;
          jws_payload_cuts: string | null;
        }
      | undefined;
    return (
      row && {
        batchId: row.batch_id,
        deviceKid: row.device_kid,
        deviceSeq: row.device_seq,
        payloadSha256: row.payload_sha256,
        jws: joinJws(row.jws, this.#payloadOf(row.jws_payload, row.jws_payload_cuts), row.jws_payload_at),
        recordCount: row.record_count,
        receivedAt: row.received_at,
      }
    );
  }

  /** A batch's payload bytes as received, with any record bodies that were cut out put back. */
  #payloadOf(kept: Buffer | null, cuts: string | null): Buffer | null {
    if (kept === null || cuts === null) return kept;
    if (!isRecordCutsText(cuts)) {
      return restoreBodies(kept, parseCuts(cuts), (id) => this.#s.bodyById.get(id) as string | undefined);
    }
    const list = parseRecordCuts(cuts);
    const seqs = list.map(([, seq]) => seq);
    const rows = new Map<number, RecordColumns>();
    if (seqs.length) {
      const found = this.#s.recordColumnsIn.all(Math.min(...seqs), Math.max(...seqs)) as [
        number,
        string,
        string,
        number,
        string,
        number,
        string,
        string,
      ][];
      for (const [receiveSeq, id, kind, schemaVersion, seamId, seq, body, createdAt] of found) {
        rows.set(receiveSeq, { id, kind, schemaVersion, seamId, seq, body, createdAt });
      }
    }
    return restoreRecords(kept, list, (seq) => rows.get(seq));
  }

  async recordSecurityEvent(
    at: string,
    kind: string,
    deviceKid: string | null,
    detail: string,
  ): Promise<void> {
    this.#s.insertSecurityEvent.run(at, kind, deviceKid, detail);
  }

  async listSecurityEvents(limit: number): Promise<SecurityEvent[]> {
    return (
      this.#s.securityEvents.all(limit) as {
        id: number;
        at: string;
        kind: string;
        device_kid: string | null;
        detail: string;
      }[]
    ).map((r) => ({ id: r.id, at: r.at, kind: r.kind, deviceKid: r.device_kid, detail: r.detail }));
  }

  async listRecords(filter: { seamId?: string; deviceKid?: string }): Promise<StoredRecord[]> {
    const s = this.#s;
    const rows =
      filter.seamId !== undefined && filter.deviceKid !== undefined
        ? s.recordsOfSeamAndDevice.all(filter.seamId, filter.deviceKid)
        : filter.seamId !== undefined
          ? s.recordsOfSeam.all(filter.seamId)
          : filter.deviceKid !== undefined
            ? s.recordsOfDevice.all(filter.deviceKid)
            : s.recordsAll.all();
    return (rows as RecordRow[]).map(toRecord);
  }

  async listParked(): Promise<ParkedRecord[]> {
    return (
      this.#s.parked.all() as {
        id: string;
        kind: string;
        schema_version: number;
        seam_id: string | null;
        device_kid: string;
        batch_id: string;
        record: string;
        received_at: string;
      }[]
    ).map((r) => ({
      id: r.id,
      kind: r.kind,
      schemaVersion: r.schema_version,
      seamId: r.seam_id,
      deviceKid: r.device_kid,
      batchId: r.batch_id,
      record: r.record,
      receivedAt: r.received_at,
    }));
  }

  async insertServerRecords(
    records: readonly Omit<StoredRecord, 'receiveSeq' | 'deviceKid' | 'batchId'>[],
  ): Promise<number> {
    return this.#db
      .transaction(() => {
        let added = 0;
        for (const r of records) {
          added += this.#s.insertServerRecord.run(
            r.id,
            r.kind,
            r.schemaVersion,
            r.seamId,
            r.deviceSeq,
            r.body,
            r.deviceCreatedAt,
            r.receivedAt,
          ).changes;
        }
        return added;
      })
      .immediate();
  }

  async putSeam(seam: SeamRow, createdBy: number | null): Promise<'created' | 'updated'> {
    return this.#db
      .transaction(() => {
        const existed = this.#s.seamExists.get(seam.id) !== undefined;
        this.#s.insertSeam.run(seam.id, seam.namespace, seam.setup, seam.createdAt, createdBy);
        return existed ? ('updated' as const) : ('created' as const);
      })
      .immediate();
  }

  async getSeam(id: string): Promise<SeamRow | undefined> {
    const row = this.#s.seam.get(id) as
      { id: string; namespace: SeamRow['namespace']; setup: string; created_at: string } | undefined;
    return row && { id: row.id, namespace: row.namespace, setup: row.setup, createdAt: row.created_at };
  }

  async listSeamIds(): Promise<string[]> {
    return (this.#s.seamIds.all() as { id: string }[]).map((r) => r.id);
  }

  async seamMaterial(seamId: string): Promise<SeamMaterial> {
    return this.#db.transaction(() => ({
      seam: this.#seamSync(seamId),
      records: (this.#s.recordsOfSeam.all(seamId) as RecordRow[]).map(toRecord),
    }))();
  }

  async viewingRecordsOf(seamId: string): Promise<StoredRecord[]> {
    return (this.#s.viewingOfSeam.all(seamId) as RecordRow[]).map(toRecord);
  }

  async gradeMaterial(seamId: string, bodiesHeld: ReadonlySet<string>): Promise<GradeMaterial> {
    const s = this.#s;
    return this.#db.transaction((): GradeMaterial => {
      // Rows as arrays: a seam may have many thousand records, and the grade needs only these columns.
      const heads = s.recordHeadsOfSeam.all(seamId) as [number, string, string, string | null, number][];
      const missing = heads.reduce((n, h) => (bodiesHeld.has(h[1]) ? n : n + 1), 0);
      // Fetching bodies one by one pays off only while few are missing; otherwise one scan reads them all.
      const bodies =
        missing * 4 <= heads.length
          ? null
          : new Map((s.recordsOfSeam.all(seamId) as RecordRow[]).map((r) => [r.receive_seq, r.body]));
      const records = heads.map(([receiveSeq, id, kind, deviceKid, deviceSeq]): GradeRecord => ({
        receiveSeq,
        id,
        kind,
        deviceKid,
        deviceSeq,
        body: bodiesHeld.has(id)
          ? null
          : (bodies?.get(receiveSeq) ?? (s.recordBody.get(receiveSeq) as { body: string }).body),
      }));
      return { seam: this.#seamSync(seamId), records };
    })();
  }

  #seamSync(id: string): SeamRow | undefined {
    const row = this.#s.seam.get(id) as
      { id: string; namespace: SeamRow['namespace']; setup: string; created_at: string } | undefined;
    return row && { id: row.id, namespace: row.namespace, setup: row.setup, createdAt: row.created_at };
  }

  async saveServerGrade(g: ServerGrade): Promise<void> {
    // A grade is derived and recomputed at start when it lags its records (staleSeams), so its commit need not
    // wait for the disk: NORMAL in WAL mode skips that fsync, and the next FULL commit persists it anyway.
    if (this.#synchronous === 'FULL') this.#db.pragma('synchronous = NORMAL');
    try {
      this.#saveGrade(g);
    } finally {
      if (this.#synchronous === 'FULL') this.#db.pragma('synchronous = FULL');
    }
  }

  #saveGrade(g: ServerGrade): void {
    this.#s.saveGrade.run({
      seamId: g.seamId,
      basedOn: g.basedOn,
      gradedAt: g.gradedAt,
      state: g.state,
      levelMet: g.levelMet,
      meetsRequired: g.meetsRequired === null ? null : g.meetsRequired ? 1 : 0,
      summary: g.summary,
    });
  }

  async staleSeams(): Promise<string[]> {
    return (this.#s.staleSeams.all() as { id: string }[]).map((r) => r.id);
  }

  async getServerGrade(seamId: string): Promise<ServerGrade | undefined> {
    const row = this.#s.grade.get(seamId) as
      | {
          seam_id: string;
          based_on: number;
          graded_at: string;
          state: string;
          level_met: string | null;
          meets_required: number | null;
          summary: string;
        }
      | undefined;
    return (
      row && {
        seamId: row.seam_id,
        basedOn: row.based_on,
        gradedAt: row.graded_at,
        state: row.state,
        levelMet: row.level_met,
        meetsRequired: row.meets_required === null ? null : row.meets_required === 1,
        summary: row.summary,
      }
    );
  }

  async listDeviceGrades(seamId: string): Promise<DeviceGradeRow[]> {
    return (
      this.#s.deviceGrades.all(seamId) as {
        seam_id: string;
        device_kid: string;
        batch_seq: number;
        grade: string;
      }[]
    ).map((r) => ({ seamId: r.seam_id, deviceKid: r.device_kid, batchSeq: r.batch_seq, grade: r.grade }));
  }

  async addChange(c: NewChange): Promise<ChangeRow> {
    return this.#db.transaction(() => this.#insertChange(c)).immediate();
  }

  #insertChange(c: NewChange): ChangeRow {
    const info = this.#s.insertChange.run(
      c.kind,
      c.itemId,
      c.seamId,
      c.deviceKid,
      c.inspectorId ?? null,
      c.item,
      c.createdAt,
      c.createdBy,
    );
    // An assignment makes the device one that works on the seam: it receives the seam's decisions too.
    if (c.deviceKid !== null) this.#s.linkDeviceSeam.run(c.deviceKid, c.seamId);
    return toChange(this.#s.changeBySeq.get(info.lastInsertRowid) as ChangeDbRow);
  }

  async changesFor(
    kid: string,
    afterSeq: number,
    limit: number,
  ): Promise<{ changes: ChangeRow[]; through: number; more: boolean }> {
    return this.#db.transaction(() => {
      const rows = (this.#s.changesFor.all({ after: afterSeq, kid, limit: limit + 1 }) as ChangeDbRow[]).map(
        toChange,
      );
      const more = rows.length > limit;
      const changes = more ? rows.slice(0, limit) : rows;
      const last = (this.#s.lastChange.get() as { seq: number }).seq;
      const through = more ? (changes[changes.length - 1] as ChangeRow).seq : Math.max(afterSeq, last);
      return { changes, through, more };
    })();
  }

  async assignedSeams(target: { deviceKid: string } | { inspectorId: number }): Promise<string[]> {
    const rows = (
      'deviceKid' in target
        ? this.#s.seamsAssignedToDevice.all(target.deviceKid)
        : this.#s.seamsAssignedToInspector.all(target.inspectorId)
    ) as { id: string }[];
    return rows.map((r) => r.id);
  }

  async latestRecordSeq(seamId: string): Promise<number> {
    return this.#review.latestRecordSeq(seamId);
  }

  async addDecision(decision: NewDecision): Promise<DecisionOutcomeOfAdd> {
    return this.#review.addDecision(decision);
  }

  async getDecision(id: string): Promise<DecisionRow | undefined> {
    return this.#review.getDecision(id);
  }

  async listDecisions(seamId: string): Promise<DecisionRow[]> {
    return this.#review.listDecisions(seamId);
  }

  async listChangesOfSeam(seamId: string): Promise<ChangeRow[]> {
    return this.#review.listChangesOfSeam(seamId);
  }

  async batchesOfSeam(seamId: string): Promise<BatchRow[]> {
    const batches: BatchRow[] = [];
    for (const id of this.#review.batchIdsOfSeam(seamId)) {
      const batch = await this.getBatch(id);
      if (batch) batches.push(batch);
    }
    return batches;
  }

  async saveReviewFacts(facts: ReviewFacts): Promise<void> {
    this.#review.saveFacts(facts);
  }

  async staleReviewFacts(): Promise<string[]> {
    return this.#review.staleFacts();
  }

  async getReviewFacts(seamId: string): Promise<ReviewFacts | undefined> {
    return this.#review.getFacts(seamId);
  }

  async reviewQueue(query: ReviewQuery): Promise<ReviewQueuePage> {
    return this.#review.queue(query);
  }

  async reviewSelection(query: Omit<ReviewQuery, 'offset' | 'limit'>, max: number): Promise<string[]> {
    return this.#review.selection(query, max);
  }

  async reviewChoices(): Promise<ReviewChoices> {
    return this.#review.choices();
  }

  async dumpRecordTables(): Promise<Record<string, unknown[]>> {
    return this.#db.transaction(() => {
      const dump: Record<string, unknown[]> = {};
      for (const [table, sql] of Object.entries(RECORD_TABLE_DUMPS)) {
        dump[table] = this.#db.prepare(sql).raw(true).all();
      }
      dump['batches'] = (dump['batches'] as unknown[][]).map((row) => {
        const [jwsPayload, jwsPayloadAt, cuts] = row.slice(7) as [
          Buffer | null,
          number | null,
          string | null,
        ];
        const payload = this.#payloadOf(jwsPayload, cuts);
        return [...row.slice(0, 4), joinJws(row[4] as string, payload, jwsPayloadAt), ...row.slice(5, 7)];
      });
      return dump;
    })();
  }
}
