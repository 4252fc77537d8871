// How a batch's JWS, kept exactly as received, is laid out in the batches table: either whole in `jws`, or with the
// payload member cut out and kept as the bytes it encodes (a quarter fewer bytes to write). The cut is made only
// when encoding those bytes gives back exactly the text that was cut, so joining always restores the received body.
import type { PayloadBytes } from '../../sync/payload-bytes.js';

export interface JwsColumns {
  readonly jws: string;
  readonly payload: Buffer | null;
  readonly payloadAt: number | null;
}

export function splitJws(received: string, payload: PayloadBytes | undefined): JwsColumns {
  if (payload?.encodesBack) {
    // Where a body written as jwsBody writes it holds the payload; anywhere else the text is searched for.
    const expected = received.indexOf('"payload":"') + '"payload":"'.length;
    const at = received.startsWith(payload.text, expected) ? expected : received.indexOf(payload.text);
    if (at >= 0) {
      return {
        jws: received.slice(0, at) + received.slice(at + payload.text.length),
        payload: payload.bytes,
        payloadAt: at,
      };
    }
  }
  return { jws: received, payload: null, payloadAt: null };
}

export function joinJws(jws: string, payload: Uint8Array | null, payloadAt: number | null): string {
  if (payload === null || payloadAt === null) return jws;
  const text = Buffer.from(payload.buffer, payload.byteOffset, payload.byteLength).toString('base64url');
  return jws.slice(0, payloadAt) + text + jws.slice(payloadAt);
}
