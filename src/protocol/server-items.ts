// What the server sends down to a device, each item signed by the server's own key: a seam assigned to the device
// (with its set-up, so the device can start on it), and a supervisor's review decision. The device verifies each
// with the key it learnt at enrolment and keeps only items addressed to itself.
import * as v from 'valibot';
import type { CryptoKey } from 'jose';
import { seamSchema } from '../domain/index.js';
import { choice, count, isoTimestamp, obj, text } from '../domain/model/schema-kit.js';
import { canonicalJson } from './canonical-json.js';
import { ProtocolError } from './errors.js';
import type { PublicJwk } from './jwk.js';
import { parseFlattenedJws, signJws, type FlattenedJws } from './jws.js';
import { verifyJws } from './jws-verify.js';
import { parsePayload, protocolField } from './payload.js';
import { PROTOCOL_VERSION } from './version.js';

export const DECISION_OUTCOMES = ['accepted', 'rework', 'moreReadings'] as const;
export type DecisionOutcome = (typeof DECISION_OUTCOMES)[number];

const common = {
  protocol: protocolField,
  id: text(64, 'an id'),
  /** The device the item is for: an item for one device is worthless to another. */
  deviceKid: text(64, 'a kid'),
  seamId: text(64, 'an id'),
  /** The server's change number: the device's next pull asks for what came after it. */
  seq: count(1, Number.MAX_SAFE_INTEGER),
};

export const assignmentSchema = obj('an assignment', {
  ...common,
  type: v.literal('assignment'),
  seam: seamSchema,
  note: v.optional(text(500, 'a note')),
  assignedBy: text(80, 'a name'),
  assignedAt: isoTimestamp(),
});

export const decisionSchema = obj('a decision', {
  ...common,
  type: v.literal('decision'),
  round: count(1, 999),
  outcome: choice(DECISION_OUTCOMES),
  comment: v.optional(text(2000, 'a comment')),
  decidedBy: text(80, 'a name'),
  decidedAt: isoTimestamp(),
});

const serverItemSchema = v.variant(
  'type',
  [assignmentSchema, decisionSchema],
  'type must be "assignment" or "decision"',
);

export type Assignment = v.InferOutput<typeof assignmentSchema>;
export type Decision = v.InferOutput<typeof decisionSchema>;
export type ServerItem = Assignment | Decision;

/** Signs an item with the server's key (server side). */
export async function signServerItem(
  item: ServerItem,
  key: CryptoKey,
  serverKid: string,
): Promise<FlattenedJws> {
  return signJws(canonicalJson({ ...item, protocol: PROTOCOL_VERSION }), 'server', key, serverKid);
}

/**
 * Verifies an item on the device: signed by the server key learnt at enrolment (and named by its kid), in the
 * expected form, and addressed to this device. Throws ProtocolError otherwise.
 */
export async function verifyServerItem(
  input: unknown,
  server: { readonly kid: string; readonly jwk: PublicJwk },
  deviceKid: string,
): Promise<ServerItem> {
  const jws = parseFlattenedJws(input);
  const verified = await verifyJws(jws, 'server', { ...server.jwk });
  if (verified.header.kid !== server.kid) {
    throw new ProtocolError(
      'signature',
      'the item is not signed by the server key this device enrolled with',
    );
  }
  const item = parsePayload(serverItemSchema, verified.payload, 'server item');
  if (item.deviceKid !== deviceKid)
    throw new ProtocolError('malformed', 'the item is addressed to another device');
  return item;
}
