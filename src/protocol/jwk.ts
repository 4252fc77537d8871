// Device and server public keys: ECDSA P-256 JWKs (RFC 7517/7518), identified by their RFC 7638 thumbprint.
import { calculateJwkThumbprint } from 'jose';
import * as v from 'valibot';
import { ProtocolError } from './errors.js';

/** A P-256 coordinate: 32 bytes in unpadded base64url is exactly 43 characters. */
const coordinate = v.pipe(
  v.string('must be a base64url string'),
  v.regex(/^[A-Za-z0-9_-]{43}$/, 'must be 43 base64url characters (a 32-byte P-256 coordinate)'),
);

/**
 * What a public key may carry. `d` (the private part) is refused outright; the WebCrypto export members `ext`,
 * `key_ops`, `alg` and `use` are allowed and dropped, so the key compares and hashes the same however it was exported.
 */
const publicJwkInput = v.looseObject({
  kty: v.literal('EC', 'kty must be "EC"'),
  crv: v.literal('P-256', 'crv must be "P-256"'),
  x: coordinate,
  y: coordinate,
  d: v.optional(v.never('a public key must not hold its private part "d"')),
  alg: v.optional(v.literal('ES256', 'alg, when given, must be "ES256"')),
  use: v.optional(v.literal('sig', 'use, when given, must be "sig"')),
});

export interface PublicJwk {
  readonly kty: 'EC';
  readonly crv: 'P-256';
  readonly x: string;
  readonly y: string;
}

/** The public key with only its defining members, or a ProtocolError naming what is wrong. */
export function toPublicJwk(input: unknown): PublicJwk {
  const parsed = v.safeParse(publicJwkInput, input, { abortPipeEarly: true });
  if (!parsed.success) {
    const issue = parsed.issues[0];
    const at = issue.path?.map((p) => String(p.key)).join('.') ?? '';
    throw new ProtocolError('malformed', `public key${at ? ` ${at}` : ''}: ${issue.message}`);
  }
  const { kty, crv, x, y } = parsed.output;
  return { kty, crv, x, y };
}

/** The key's id: its RFC 7638 SHA-256 thumbprint, base64url (43 characters). */
export async function thumbprint(jwk: PublicJwk): Promise<string> {
  return calculateJwkThumbprint({ kty: jwk.kty, crv: jwk.crv, x: jwk.x, y: jwk.y }, 'sha256');
}

/** A kid as this protocol makes them (a SHA-256 thumbprint), checked before it is used to look anything up. */
export const KID_PATTERN = /^[A-Za-z0-9_-]{43}$/;
