// Verifying a flattened JWS with jose, after the strict header checks of jws.ts. Kept in a module of its own so
// code that only signs (the tablet's sender, in the first paint) does not carry jose's verification code.
import { flattenedVerify } from 'jose';
import { ProtocolError } from './errors.js';
import { readProtectedHeader, type FlattenedJws, type ProtectedHeader, type VerifyKey } from './jws.js';
import { utf8Decode } from './platform.js';
import { JWS_ALG, type JwsKind } from './version.js';

export interface Verified {
  readonly header: ProtectedHeader;
  /** The payload exactly as signed, decoded from base64url and UTF-8. */
  readonly payloadText: string;
  readonly payload: unknown;
}

/**
 * Verifies the signature over the exact bytes received with the given key, after the strict header checks. The
 * header's kid is not trusted to pick the key: the caller looked the key up by that kid and passes it here.
 */
export async function verifyJws(jws: FlattenedJws, kind: JwsKind, key: VerifyKey): Promise<Verified> {
  const header = readProtectedHeader(jws, kind);
  let payloadBytes: Uint8Array;
  try {
    const result = await flattenedVerify(jws, key, { algorithms: [JWS_ALG], crit: {} });
    payloadBytes = result.payload;
  } catch {
    throw new ProtocolError('signature', 'the signature does not verify with the key this kid names');
  }
  let payloadText: string;
  try {
    payloadText = utf8Decode(payloadBytes);
  } catch {
    throw new ProtocolError('malformed', 'the payload is not UTF-8');
  }
  let payload: unknown;
  try {
    payload = JSON.parse(payloadText) as unknown;
  } catch {
    throw new ProtocolError('malformed', 'the payload is not JSON');
  }
  return { header, payloadText, payload };
}
