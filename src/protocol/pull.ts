// Pull: the device asks for what changed for it since its cursor. The request is signed and carries a nonce the
// server issued moments before and accepts once, so a captured request cannot be replayed. The request also
// reports how much waits in the device's outbox, which the supervisor sees on the Devices page.
import * as v from 'valibot';
import type { CryptoKey } from 'jose';
import { count, isoTimestamp, obj } from '../domain/model/schema-kit.js';
import { canonicalJson } from './canonical-json.js';
import { jwsBody, signJws } from './jws.js';
import { parsePayload, protocolField } from './payload.js';
import { MAX_PULL_ITEMS, PROTOCOL_VERSION } from './version.js';

const nonce = v.pipe(
  v.string('must be a string'),
  v.regex(/^[A-Za-z0-9_-]{22,128}$/, 'must be the nonce the server issued'),
);
const cursor = v.pipe(
  v.string('must be a string'),
  v.regex(/^c\d{1,16}$/, 'must be a cursor the server gave, such as "c42"'),
);

export const pullPayloadSchema = obj('a pull request', {
  protocol: protocolField,
  type: v.literal('pull', 'type must be "pull"'),
  nonce,
  /** null on the first pull: everything for this device from the start. */
  cursor: v.nullable(cursor),
  limit: v.optional(count(1, MAX_PULL_ITEMS)),
  outbox: obj('outbox', {
    queued: count(0, Number.MAX_SAFE_INTEGER),
    /** When the oldest waiting record was made, by the device clock (shown, not used to order anything). */
    oldestQueuedAt: v.optional(isoTimestamp()),
  }),
});

export type PullPayload = v.InferOutput<typeof pullPayloadSchema>;

export const parsePullPayload = (payload: unknown): PullPayload =>
  parsePayload(pullPayloadSchema, payload, 'pull request');

export interface PullInput {
  readonly nonce: string;
  readonly cursor: string | null;
  readonly queued: number;
  readonly oldestQueuedAt?: string;
  readonly limit?: number;
}

export async function signPullRequest(input: PullInput, key: CryptoKey, kid: string): Promise<string> {
  const payload = {
    protocol: PROTOCOL_VERSION,
    type: 'pull',
    nonce: input.nonce,
    cursor: input.cursor,
    ...(input.limit !== undefined ? { limit: input.limit } : {}),
    outbox: {
      queued: input.queued,
      ...(input.oldestQueuedAt !== undefined ? { oldestQueuedAt: input.oldestQueuedAt } : {}),
    },
  };
  return jwsBody(await signJws(canonicalJson(payload), 'pull', key, kid));
}

/** The nonce reply: use it in one pull request before it expires (server clock). */
export const nonceReplySchema = v.object({ nonce, expiresAt: v.string() });

export const pullReplySchema = v.object({
  protocol: protocolField,
  cursor,
  /** More items wait: pull again with the new cursor. */
  more: v.boolean(),
  /** Server-signed items (flattened JWS); check each with verifyServerItem. */
  items: v.array(v.unknown()),
});

export type PullReply = v.InferOutput<typeof pullReplySchema>;

export const cursorOf = (seq: number): string => `c${seq}`;

/** The change number a cursor stands for (0 for none). */
export function seqOfCursor(c: string | null): number {
  return c === null ? 0 : Number(c.slice(1));
}
