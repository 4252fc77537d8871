// Signature check on the server's hot path. The protocol's verifyJws (jose, WebCrypto) decodes and re-encodes
// the whole payload in JavaScript and waits on a thread-pool job; a 500-reading batch spends most of its
// verification there. This does the same check with node:crypto on the exact bytes received: the same strict
// header rules (readProtectedHeader, shared with the device side), ES256 over ASCII(protected "." payload), a
// 64-byte IEEE P1363 signature. test/protocol/verify-parity.test.ts holds it to the same answers as jose.
import { isUtf8 } from 'node:buffer';
import { createPublicKey, createVerify, type KeyObject } from 'node:crypto';
import {
  ProtocolError,
  readProtectedHeader,
  type FlattenedJws,
  type JwsKind,
  type Verified,
} from '../../protocol/index.js';
import { PayloadBytes } from './payload-bytes.js';

export const publicKeyObject = (publicJwk: string): KeyObject =>
  createPublicKey({ key: JSON.parse(publicJwk) as Record<string, string>, format: 'jwk' });

/** What was verified, with the payload decoded (the store may keep its bytes in place of their base64url text). */
export interface VerifiedBytes extends Verified {
  readonly payloadBytes: Buffer;
  readonly payloadDecoded: PayloadBytes;
}

export function verifyJwsNode(jws: FlattenedJws, kind: JwsKind, key: KeyObject): VerifiedBytes {
  const header = readProtectedHeader(jws, kind);
  const signature = Buffer.from(jws.signature, 'base64url');
  let ok = false;
  try {
    // The members are base64url (ASCII, checked by parseFlattenedJws), so their UTF-8 bytes are the signing input.
    const check = createVerify('sha256');
    check.update(jws.protected);
    check.update('.');
    check.update(jws.payload);
    ok = signature.length === 64 && check.verify({ key, dsaEncoding: 'ieee-p1363' }, signature);
  } catch {
    ok = false;
  }
  if (!ok) throw new ProtocolError('signature', 'the signature does not verify with the key this kid names');
  const decoded = PayloadBytes.decode(jws.payload);
  const bytes = decoded.bytes;
  // ASCII (the usual payload) is UTF-8 already; decoded that way once, the store can cut it by character.
  let payloadText = decoded.ascii();
  if (payloadText === null) {
    if (!isUtf8(bytes)) throw new ProtocolError('malformed', 'the payload is not UTF-8');
    payloadText = bytes.toString('utf8');
  }
  let payload: unknown;
  try {
    payload = JSON.parse(payloadText) as unknown;
  } catch {
    throw new ProtocolError('malformed', 'the payload is not JSON');
  }
  return { header, payloadText, payload, payloadBytes: bytes, payloadDecoded: decoded };
}
