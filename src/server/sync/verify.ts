// Signature check on the server's hot path. The protocol's verifyJws (jose, WebCrypto) decodes and re-encodes
// the whole payload in JavaScript and waits on a thread-pool job; a 500-reading batch spends most of its
// verification there. This does the same check with node:crypto on the exact bytes received: the same strict
// header rules (readProtectedHeader, shared with the device side), ES256 over ASCII(protected "." payload), a
// 64-byte IEEE P1363 signature. test/protocol/verify-parity.test.ts holds it to the same answers as jose.
import { createPublicKey, verify, type KeyObject } from 'node:crypto';
import {
  ProtocolError,
  readProtectedHeader,
  type FlattenedJws,
  type JwsKind,
  type Verified,
} from '../../protocol/index.js';

const decoder = new TextDecoder('utf-8', { fatal: true });

export const publicKeyObject = (publicJwk: string): KeyObject =>
  createPublicKey({ key: JSON.parse(publicJwk) as Record<string, string>, format: 'jwk' });

export function verifyJwsNode(jws: FlattenedJws, kind: JwsKind, key: KeyObject): Verified {
  const header = readProtectedHeader(jws, kind);
  const signature = Buffer.from(jws.signature, 'base64url');
  const input = Buffer.from(`${jws.protected}.${jws.payload}`, 'latin1');
  let ok = false;
  try {
    ok = signature.length === 64 && verify('sha256', input, { key, dsaEncoding: 'ieee-p1363' }, signature);
  } catch {
    ok = false;
  }
  if (!ok) throw new ProtocolError('signature', 'the signature does not verify with the key this kid names');
  let payloadText: string;
  try {
    payloadText = decoder.decode(Buffer.from(jws.payload, 'base64url'));
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
