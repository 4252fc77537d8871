// The sync protocol's version and limits. Changing anything a peer relies on means a new PROTOCOL_VERSION; a new
// shape of one kind of record means a new RECORD_SCHEMA_VERSION (older servers park such records, never drop them).

/** The version of the batch, enrolment and pull formats in this module. */
export const PROTOCOL_VERSION = 1;

/**
 * The newest record schema this code understands; a record that declares a newer one is parked by the server.
 * Version 2 added the `viewing` record (a round's viewing and lighting conditions); every other kind is unchanged
 * and still travels as version 1, so a version-1 server accepts it and parks only what it cannot read.
 */
export const RECORD_SCHEMA_VERSION = 2;

/** Media type of a flattened JWS JSON serialization (RFC 7515 §9.2.2): every signed request body uses it. */
export const JOSE_JSON = 'application/jose+json';

/** The `typ` of each kind of signed message, so a message of one kind can never be passed off as another. */
export const JWS_TYPES = {
  batch: 'beadbook-batch+jws',
  enrol: 'beadbook-enrol+jws',
  pull: 'beadbook-pull+jws',
  server: 'beadbook-server+jws',
  /** A supervisor's review decision as the server recorded it (kept for audit and exports; never pulled). */
  decision: 'beadbook-decision+jws',
} as const;

export type JwsKind = keyof typeof JWS_TYPES;

/** The only signature algorithm accepted anywhere: ECDSA P-256 with SHA-256. */
export const JWS_ALG = 'ES256';

/** Records in one batch. A device splits a longer outbox into several batches. */
export const MAX_RECORDS_PER_BATCH = 1000;

/** Items in one pull reply; the device pulls again while `more` is true. */
export const MAX_PULL_ITEMS = 200;
