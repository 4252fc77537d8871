// The SQLite schema, as numbered migrations applied in order, each in its own transaction and noted in the
// `migrations` table. Never edit a migration that has shipped: add the next one.

export interface Migration {
  readonly version: number;
  readonly name: string;
  readonly sql: string;
}

export const MIGRATIONS: readonly Migration[] = [
  {
    version: 1,
    name: 'accounts, devices, signed sync, review changes',
    sql: `
CREATE TABLE accounts (
  id INTEGER PRIMARY KEY,
  username TEXT NOT NULL UNIQUE,
  role TEXT NOT NULL CHECK (role IN ('supervisor', 'inspector')),
  password_hash TEXT NOT NULL,
  must_change_password INTEGER NOT NULL DEFAULT 0 CHECK (must_change_password IN (0, 1)),
  created_at TEXT NOT NULL
);

CREATE TABLE sessions (
  token_hash TEXT PRIMARY KEY,
  account_id INTEGER NOT NULL REFERENCES accounts (id) ON DELETE CASCADE,
  created_at TEXT NOT NULL,
  expires_at TEXT NOT NULL
);
CREATE INDEX sessions_by_account ON sessions (account_id);

CREATE TABLE server_keys (
  kid TEXT PRIMARY KEY,
  private_jwk TEXT NOT NULL,
  public_jwk TEXT NOT NULL,
  created_at TEXT NOT NULL
);

CREATE TABLE devices (
  kid TEXT PRIMARY KEY,
  public_jwk TEXT NOT NULL,
  name TEXT NOT NULL,
  enrolled_at TEXT NOT NULL,
  revoked_at TEXT,
  last_contact_at TEXT,
  reported_queue INTEGER,
  reported_oldest_at TEXT,
  reported_at TEXT
);

CREATE TABLE enrolment_codes (
  code_hash TEXT PRIMARY KEY,
  created_by INTEGER NOT NULL REFERENCES accounts (id),
  created_at TEXT NOT NULL,
  expires_at TEXT NOT NULL,
  used_at TEXT,
  used_by_kid TEXT REFERENCES devices (kid)
);

CREATE TABLE nonces (
  nonce TEXT PRIMARY KEY,
  expires_at TEXT NOT NULL
);

CREATE TABLE batches (
  batch_id TEXT PRIMARY KEY,
  device_kid TEXT NOT NULL REFERENCES devices (kid),
  device_seq INTEGER NOT NULL,
  payload_sha256 TEXT NOT NULL,
  jws TEXT NOT NULL,
  record_count INTEGER NOT NULL,
  received_at TEXT NOT NULL
);

-- receive_seq is the server's receive order (an alias of the rowid, so it survives VACUUM).
CREATE TABLE records (
  receive_seq INTEGER PRIMARY KEY,
  id TEXT NOT NULL UNIQUE,
  kind TEXT NOT NULL,
  schema_version INTEGER NOT NULL,
  seam_id TEXT NOT NULL,
  device_kid TEXT REFERENCES devices (kid),
  batch_id TEXT REFERENCES batches (batch_id),
  device_seq INTEGER NOT NULL,
  body TEXT NOT NULL,
  device_created_at TEXT NOT NULL,
  received_at TEXT NOT NULL
);
CREATE INDEX records_by_seam ON records (seam_id);
CREATE INDEX records_by_device ON records (device_kid);

CREATE TABLE parked_records (
  id TEXT PRIMARY KEY,
  kind TEXT NOT NULL,
  schema_version INTEGER NOT NULL,
  seam_id TEXT,
  device_kid TEXT NOT NULL REFERENCES devices (kid),
  batch_id TEXT NOT NULL REFERENCES batches (batch_id),
  record TEXT NOT NULL,
  received_at TEXT NOT NULL
);

CREATE TABLE rejections (
  batch_id TEXT NOT NULL REFERENCES batches (batch_id),
  record_index INTEGER NOT NULL,
  record_id TEXT,
  reason TEXT NOT NULL,
  PRIMARY KEY (batch_id, record_index)
);

CREATE TABLE device_seams (
  device_kid TEXT NOT NULL REFERENCES devices (kid),
  seam_id TEXT NOT NULL,
  PRIMARY KEY (device_kid, seam_id)
) WITHOUT ROWID;

CREATE TABLE seams (
  id TEXT PRIMARY KEY,
  namespace TEXT NOT NULL CHECK (namespace IN ('live', 'demo')),
  setup TEXT NOT NULL,
  created_at TEXT NOT NULL,
  created_by INTEGER REFERENCES accounts (id)
);

CREATE TABLE changes (
  seq INTEGER PRIMARY KEY AUTOINCREMENT,
  kind TEXT NOT NULL CHECK (kind IN ('assignment', 'decision')),
  item_id TEXT NOT NULL UNIQUE,
  seam_id TEXT NOT NULL,
  device_kid TEXT REFERENCES devices (kid),
  item TEXT NOT NULL,
  created_at TEXT NOT NULL,
  created_by INTEGER REFERENCES accounts (id)
);
CREATE INDEX changes_by_device ON changes (device_kid, seq);
CREATE INDEX changes_by_seam ON changes (seam_id, seq);

CREATE TABLE server_grades (
  seam_id TEXT PRIMARY KEY,
  based_on INTEGER NOT NULL,
  graded_at TEXT NOT NULL,
  state TEXT NOT NULL,
  level_met TEXT,
  meets_required INTEGER,
  summary TEXT NOT NULL
);

CREATE TABLE device_grades (
  seam_id TEXT NOT NULL,
  device_kid TEXT NOT NULL REFERENCES devices (kid),
  batch_seq INTEGER NOT NULL,
  grade TEXT NOT NULL,
  PRIMARY KEY (seam_id, device_kid)
);

CREATE TABLE security_events (
  id INTEGER PRIMARY KEY AUTOINCREMENT,
  at TEXT NOT NULL,
  kind TEXT NOT NULL,
  device_kid TEXT,
  detail TEXT NOT NULL
);
`,
  },
  {
    version: 2,
    name: 'batch payloads kept as their bytes',
    // A batch's JWS is kept exactly as received. Most of it is the base64url payload, a third larger than the
    // bytes it encodes; when those bytes encode back to exactly the received text, they are kept as a blob and
    // jws holds the rest of the body, with the payload's place in it (jws_payload_at, in UTF-16 code units).
    sql: `
ALTER TABLE batches ADD COLUMN jws_payload BLOB;
ALTER TABLE batches ADD COLUMN jws_payload_at INTEGER;
`,
  },
  {
    version: 3,
    name: 'review: decisions as signed immutable events, review facts per seam',
    sql: `
-- A supervisor's decision on a seam, signed by the server key when made (jws: the flattened JWS of the decision
-- event, typ beadbook-decision+jws). based_on is the newest receive_seq of the seam's records the supervisor
-- saw: records received after it make the seam "not yet reviewed" again. Rows are never changed or removed.
CREATE TABLE decisions (
  seq INTEGER PRIMARY KEY AUTOINCREMENT,
  id TEXT NOT NULL UNIQUE,
  seam_id TEXT NOT NULL,
  round INTEGER NOT NULL,
  outcome TEXT NOT NULL CHECK (outcome IN ('accepted', 'rework', 'moreReadings')),
  comment TEXT,
  decided_by INTEGER NOT NULL REFERENCES accounts (id),
  decided_by_name TEXT NOT NULL,
  decided_at TEXT NOT NULL,
  based_on INTEGER NOT NULL,
  server_level_met TEXT,
  jws TEXT NOT NULL,
  change_seq INTEGER NOT NULL UNIQUE REFERENCES changes (seq)
);
CREATE INDEX decisions_by_seam ON decisions (seam_id, seq);

CREATE TRIGGER decisions_are_immutable BEFORE UPDATE ON decisions
BEGIN SELECT RAISE(ABORT, 'decisions are immutable: record a new decision instead'); END;
CREATE TRIGGER decisions_are_kept BEFORE DELETE ON decisions
BEGIN SELECT RAISE(ABORT, 'decisions are immutable: they are never removed'); END;
-- What devices pull (assignments, decisions) is history too: a device may hold it already.
CREATE TRIGGER changes_are_immutable BEFORE UPDATE ON changes
BEGIN SELECT RAISE(ABORT, 'changes sent to devices are immutable'); END;
CREATE TRIGGER changes_are_kept BEFORE DELETE ON changes
BEGIN SELECT RAISE(ABORT, 'changes sent to devices are never removed'); END;

-- What the review queue filters and sorts on, one row per seam, derived (recomputed after each re-grade) from
-- the records, the server grade and the seam assessment. Never the source of truth.
CREATE TABLE review_facts (
  seam_id TEXT PRIMARY KEY,
  namespace TEXT NOT NULL,
  label TEXT NOT NULL,
  tags TEXT NOT NULL,
  organisation TEXT,
  area TEXT,
  drawing TEXT,
  welder TEXT,
  procedure TEXT,
  required_level TEXT,
  edition TEXT,
  state TEXT NOT NULL,
  level_met TEXT,
  level_rank INTEGER,
  meets_required INTEGER,
  graded_round INTEGER,
  latest_round INTEGER,
  reading_count INTEGER NOT NULL,
  borderline_count INTEGER NOT NULL,
  fat_flag TEXT,
  sampling_adequate INTEGER,
  unverified_rows INTEGER NOT NULL,
  device_level_met TEXT,
  grade_mismatch INTEGER NOT NULL,
  inspected_first TEXT,
  inspected_last TEXT,
  last_received_at TEXT,
  based_on INTEGER NOT NULL,
  graded_at TEXT NOT NULL,
  computed_at TEXT NOT NULL
);

CREATE TABLE review_inspectors (
  seam_id TEXT NOT NULL,
  name TEXT NOT NULL,
  PRIMARY KEY (seam_id, name)
) WITHOUT ROWID;
CREATE INDEX review_inspectors_by_name ON review_inspectors (name, seam_id);
`,
  },
  {
    version: 4,
    name: 'assignments to inspectors: devices tied to an inspector account',
    sql: `
-- A device may be tied to an inspector account (named by the supervisor at enrolment or on the Devices page);
-- it then pulls the seams assigned to that inspector. inspector_from_seq is the change number at the moment of
-- tying: the inspector's assignments up to it reach the device as copies addressed to it (see tieDevice), those
-- after it through the inspector.
ALTER TABLE devices ADD COLUMN inspector_id INTEGER REFERENCES accounts (id);
ALTER TABLE devices ADD COLUMN inspector_from_seq INTEGER NOT NULL DEFAULT 0;
ALTER TABLE enrolment_codes ADD COLUMN inspector_id INTEGER REFERENCES accounts (id);
-- An assignment to an inspector: device_kid is NULL and inspector_id names the account.
ALTER TABLE changes ADD COLUMN inspector_id INTEGER REFERENCES accounts (id);
CREATE INDEX changes_by_inspector ON changes (inspector_id, seq);
`,
  },
  {
    version: 5,
    name: 'batch payloads kept without the record bodies stored beside them',
    // The bodies of the records a batch brought are most of its payload and are stored in records already. When
    // jws_payload_cuts is set, jws_payload lacks them: a JSON list of [offset in jws_payload, record id], in order,
    // says where each record's stored body goes back to give the payload bytes as received.
    sql: `
ALTER TABLE batches ADD COLUMN jws_payload_cuts TEXT;
`,
  },
];
