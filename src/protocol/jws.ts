// Flattened JWS (RFC 7515 §7.2.2) with ES256 only. The header is checked strictly here before jose verifies the
// signature over the exact bytes received: `alg` must be ES256 (so `none` and HMAC never reach a key), `typ` must
// name the expected kind of message, `kid` must be a thumbprint, and a `crit` list or any other member is refused.
import { base64url, FlattenedSign, type CryptoKey, type JWK } from 'jose';
import { ProtocolError } from './errors.js';
import { KID_PATTERN } from './jwk.js';
import { utf8Decode, utf8Encode } from './platform.js';
import { JWS_ALG, JWS_TYPES, type JwsKind } from './version.js';

export interface FlattenedJws {
  readonly protected: string;
  readonly payload: string;
  readonly signature: string;
}

export interface ProtectedHeader {
  readonly alg: typeof JWS_ALG;
  readonly kid: string;
  readonly typ: string;
}

/** A verification key: a WebCrypto public key, or a public JWK jose imports. */
export type VerifyKey = CryptoKey | JWK;

const B64URL = /^[A-Za-z0-9_-]*$/;
const MEMBERS = ['protected', 'payload', 'signature'];
const HEADER_MEMBERS = new Set(['alg', 'kid', 'typ']);

/**
 * The three members of a flattened JWS, checked for shape only. Anything else — an unprotected `header`, a
 * `signatures` list, a member that is not base64url — is refused, so what is verified is all there is.
 */
export function parseFlattenedJws(input: unknown): FlattenedJws {
  if (typeof input !== 'object' || input === null || Array.isArray(input)) {
    throw new ProtocolError('malformed', 'the body must be a flattened JWS: a JSON object');
  }
  const record = input as Record<string, unknown>;
  const extra = Object.keys(record).filter((k) => !MEMBERS.includes(k));
  if (extra.length) {
    throw new ProtocolError(
      'malformed',
      `a flattened JWS here holds only protected, payload and signature; unexpected: ${extra.map((k) => JSON.stringify(k)).join(', ')}`,
    );
  }
  for (const key of MEMBERS) {
    const value = record[key];
    if (typeof value !== 'string' || value.length === 0 || !B64URL.test(value)) {
      throw new ProtocolError('malformed', `JWS member "${key}" must be a non-empty base64url string`);
    }
  }
  return {
    protected: record['protected'] as string,
    payload: record['payload'] as string,
    signature: record['signature'] as string,
  };
}

/** A request body exactly as jwsBody writes it: the three members in that order, no space, nothing escaped. */
const JWS_BODY =
  /^\{"protected":"([A-Za-z0-9_-]+)","payload":"([A-Za-z0-9_-]+)","signature":"([A-Za-z0-9_-]+)"\}$/;

/**
 * The flattened JWS of a body written as jwsBody writes it, read without a JSON parse (one scan of a body that is
 * mostly a long payload); null for any other text, which then goes through JSON.parse and parseFlattenedJws. What
 * it returns is what those two would return for the same text.
 */
export function readJwsBody(text: string): FlattenedJws | null {
  const m = JWS_BODY.exec(text);
  return m ? { protected: m[1] as string, payload: m[2] as string, signature: m[3] as string } : null;
}

/** A base64url JSON segment, decoded but not verified: only for finding the key to verify with. */
export function decodeJsonSegment(segment: string, what: string): unknown {
  let text: string;
  try {
    text = utf8Decode(base64url.decode(segment));
  } catch {
    throw new ProtocolError('malformed', `the ${what} is not base64url-encoded UTF-8`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new ProtocolError('malformed', `the ${what} is not JSON`);
  }
}

/** The protected header, checked strictly against the kind of message expected. Does not verify the signature. */
export function readProtectedHeader(jws: FlattenedJws, kind: JwsKind): ProtectedHeader {
  const header = decodeJsonSegment(jws.protected, 'protected header');
  if (typeof header !== 'object' || header === null || Array.isArray(header)) {
    throw new ProtocolError('malformed', 'the protected header must be a JSON object');
  }
  const h = header as Record<string, unknown>;
  if (h['alg'] !== JWS_ALG) {
    const named = typeof h['alg'] === 'string' ? `"${h['alg']}"` : 'missing';
    throw new ProtocolError('algorithm', `alg ${named} is not accepted; only ${JWS_ALG} is`);
  }
  if ('crit' in h) {
    throw new ProtocolError(
      'header',
      'crit is not accepted: this protocol defines no critical header extensions',
    );
  }
  const unknown = Object.keys(h).filter((k) => !HEADER_MEMBERS.has(k));
  if (unknown.length) {
    throw new ProtocolError(
      'header',
      `protected header members other than alg, kid and typ are not accepted; got ${unknown.map((k) => JSON.stringify(k)).join(', ')}`,
    );
  }
  const expected = JWS_TYPES[kind];
  if (h['typ'] !== expected) {
    throw new ProtocolError(
      'type',
      `typ must be "${expected}" for this request; got ${JSON.stringify(h['typ'])}`,
    );
  }
  const kid = h['kid'];
  if (typeof kid !== 'string' || !KID_PATTERN.test(kid)) {
    throw new ProtocolError('header', "kid must be the key's RFC 7638 thumbprint (43 base64url characters)");
  }
  return { alg: JWS_ALG, kid, typ: expected };
}

/** Signs the payload text (sent as its UTF-8 bytes) with an ES256 private key. */
export async function signJws(
  payloadText: string,
  kind: JwsKind,
  key: CryptoKey,
  kid: string,
): Promise<FlattenedJws> {
  const signed = await new FlattenedSign(utf8Encode(payloadText))
    .setProtectedHeader({ alg: JWS_ALG, kid, typ: JWS_TYPES[kind] })
    .sign(key);
  if (signed.protected === undefined) throw new Error('jose returned a JWS without a protected header');
  return { protected: signed.protected, payload: signed.payload, signature: signed.signature };
}

/** The request body that carries a JWS: its JSON text, which the server stores exactly as received. */
export const jwsBody = (jws: FlattenedJws): string =>
  JSON.stringify({ protected: jws.protected, payload: jws.payload, signature: jws.signature });
