// F12: every tampered, mis-signed or unauthorised batch is refused with a 4xx and leaves no record behind.
import { createHmac } from 'node:crypto';
import { beforeEach, describe, expect, it } from 'vitest';
import {
  canonicalJson,
  generateDeviceKey,
  jwsBody,
  signJws,
  type SealedBatch,
} from '../../src/protocol/index.js';
import { testConfig } from '../../src/server/config.js';
import { uuidv7 } from '../../src/store/ids.js';
import { bodies, testSeam, toeReading } from './records.js';
import { SimDevice } from './sim-device.js';
import { recordTablesHash, testServer, type TestServer } from './support.js';

const b64 = (text: string | Buffer) => Buffer.from(text).toString('base64url');
const unb64 = (text: string) => Buffer.from(text, 'base64url');

function flipBit(segment: string, bit: number): string {
  const bytes = unb64(segment);
  const i = Math.floor(bit / 8) % bytes.length;
  bytes[i] = (bytes[i] as number) ^ (1 << (bit % 8));
  return bytes.toString('base64url');
}

let server: TestServer;
let device: SimDevice;
let other: SimDevice;
let batch: SealedBatch;
let before: string;

beforeEach(async () => {
  server = await testServer({
    config: {
      limits: { ...testConfig().limits, batchBytes: 64 * 1024 },
    },
  });
  device = await server.enrolDevice('tablet A');
  other = await server.enrolDevice('tablet B');
  const seam = testSeam();
  device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
  device.add('round', uuidv7(), bodies.round(seam.id));
  for (let i = 0; i < 3; i++) {
    const r = toeReading(seam.id, 150 + i);
    device.add('reading', r.id, bodies.reading(r));
  }
  batch = await device.seal();
  before = await recordTablesHash(server.storage);
});

async function refused(body: string, status: number, error?: string, contentType?: string): Promise<void> {
  const sent = await device.post(server, '/api/sync/batches', body, contentType);
  expect(sent.status, JSON.stringify(sent.body)).toBe(status);
  if (error) expect(sent.body).toMatchObject({ error });
  expect((sent.body as { message: string }).message.length).toBeGreaterThan(10);
  await server.settle();
  expect(await recordTablesHash(server.storage)).toBe(before);
}

const withParts = (parts: Partial<Record<'protected' | 'payload' | 'signature', string>>) =>
  JSON.stringify({ ...batch.jws, ...parts });

describe('F12: tampering', () => {
  it('refuses a flipped bit anywhere in the payload', async () => {
    const bits = unb64(batch.jws.payload).length * 8;
    for (const bit of [0, 7, 8 * 17 + 3, Math.floor(bits / 2), bits - 1]) {
      await refused(withParts({ payload: flipBit(batch.jws.payload, bit) }), 401, 'signature');
    }
  });

  it('refuses a flipped bit anywhere in the protected header', async () => {
    const bits = unb64(batch.jws.protected).length * 8;
    for (let bit = 0; bit < bits; bit += 13) {
      const sent = await device.post(
        server,
        '/api/sync/batches',
        withParts({ protected: flipBit(batch.jws.protected, bit) }),
      );
      expect(sent.status, `bit ${bit}`).toBeGreaterThanOrEqual(400);
      expect(sent.status, `bit ${bit}`).toBeLessThan(500);
    }
    expect(await recordTablesHash(server.storage)).toBe(before);
  });

  it('refuses a flipped bit anywhere in the signature', async () => {
    for (const bit of [0, 100, 255, 256, 511]) {
      await refused(withParts({ signature: flipBit(batch.jws.signature, bit) }), 401, 'signature');
    }
  });

  it('refuses a swapped kid (another enrolled device), however the signature was made', async () => {
    const header = JSON.parse(unb64(batch.jws.protected).toString()) as Record<string, string>;
    await refused(
      withParts({ protected: b64(JSON.stringify({ ...header, kid: other.kid })) }),
      401,
      'signature',
    );
    // Signed with A's key under B's kid: B's key does not verify it.
    const payloadText = unb64(batch.jws.payload).toString('utf8');
    const forged = await signJws(payloadText, 'batch', device.key.privateKey, other.kid);
    await refused(jwsBody(forged), 401, 'signature');
  });

  it('refuses alg "none"', async () => {
    const header = b64(JSON.stringify({ alg: 'none', kid: device.kid, typ: 'beadbook-batch+jws' }));
    await refused(withParts({ protected: header, signature: 'AA' }), 400, 'algorithm');
    await refused(
      JSON.stringify({ protected: header, payload: batch.jws.payload, signature: '' }),
      400,
      'malformed',
    );
  });

  it('refuses HS256, including one keyed with the public key (algorithm confusion)', async () => {
    const header = b64(JSON.stringify({ alg: 'HS256', kid: device.kid, typ: 'beadbook-batch+jws' }));
    const secret = Buffer.from(canonicalJson(device.key.publicJwk));
    const signature = createHmac('sha256', secret)
      .update(`${header}.${batch.jws.payload}`)
      .digest('base64url');
    await refused(withParts({ protected: header, signature }), 400, 'algorithm');
  });

  it('refuses an unknown crit, even when properly signed', async () => {
    // jose will not sign an unknown crit, so the signature is made with WebCrypto directly.
    const header = b64(
      JSON.stringify({
        alg: 'ES256',
        kid: device.kid,
        typ: 'beadbook-batch+jws',
        crit: ['beadbook-urgent'],
        'beadbook-urgent': true,
      }),
    );
    const input = new TextEncoder().encode(`${header}.${batch.jws.payload}`);
    const sig = await crypto.subtle.sign(
      { name: 'ECDSA', hash: 'SHA-256' },
      device.key.privateKey as CryptoKey,
      input,
    );
    const signed = {
      protected: header,
      payload: batch.jws.payload,
      signature: Buffer.from(sig).toString('base64url'),
    };
    const ecdsa = { name: 'ECDSA', hash: 'SHA-256' };
    expect(await crypto.subtle.verify(ecdsa, device.key.publicKey as CryptoKey, sig, input)).toBe(true);
    await refused(JSON.stringify(signed), 400, 'header');
  });

  it('refuses a key that was never enrolled', async () => {
    const stranger = await SimDevice.create();
    for (const e of device.outbox) stranger.add(e.kind, e.recordId, e.body as { seamId: string });
    const sealed = await stranger.seal();
    await refused(sealed.body, 401, 'unknownKey');
  });

  it('refuses a revoked key, and records the attempt', async () => {
    expect((await server.admin('POST', `/devices/${device.kid}/revoke`)).status).toBe(200);
    await refused(batch.body, 403, 'revoked');
    expect((await server.storage.listSecurityEvents(5)).map((e) => e.kind)).toContain('revokedKeyUsed');
  });

  it('refuses an oversize body, declared or not', async () => {
    const huge = JSON.stringify({ ...batch.jws, payload: 'A'.repeat(70 * 1024) });
    await refused(huge, 413, 'tooLarge');
    const res = await server.request('/api/sync/batches', {
      method: 'POST',
      headers: { 'content-type': 'application/jose+json', 'content-length': String(10 * 1024 * 1024) },
      body: batch.body,
    });
    expect(res.status).toBe(413);
    expect(await recordTablesHash(server.storage)).toBe(before);
  });

  it('refuses what is not a flattened JWS', async () => {
    await refused('not json', 400, 'malformed');
    await refused('[1,2,3]', 400, 'malformed');
    await refused(`${batch.jws.protected}.${batch.jws.payload}.${batch.jws.signature}`, 400, 'malformed');
    await refused(JSON.stringify({ ...batch.jws, header: { kid: device.kid } }), 400, 'malformed');
    await refused(JSON.stringify({ ...batch.jws, payload: 'not*base64url' }), 400, 'malformed');
    await refused(JSON.stringify({ signatures: [batch.jws] }), 400, 'malformed');
  });

  it('refuses the wrong content type', async () => {
    await refused(batch.body, 415, 'unsupportedMediaType', 'application/json');
    await refused(batch.body, 415, 'unsupportedMediaType', 'text/plain');
  });

  it('refuses a message of another kind (typ) sent as a batch', async () => {
    const payloadText = unb64(batch.jws.payload).toString('utf8');
    await refused(
      jwsBody(await signJws(payloadText, 'pull', device.key.privateKey, device.kid)),
      400,
      'type',
    );
  });

  it('refuses a signed payload of another protocol version or shape', async () => {
    const payload = JSON.parse(unb64(batch.jws.payload).toString('utf8')) as Record<string, unknown>;
    const sign = async (p: unknown) =>
      jwsBody(await signJws(JSON.stringify(p), 'batch', device.key.privateKey, device.kid));
    await refused(await sign({ ...payload, protocol: 2 }), 400, 'version');
    await refused(await sign({ ...payload, records: [] }), 400, 'malformed');
    await refused(await sign({ ...payload, extra: true }), 400, 'malformed');
    await refused(await sign([payload]), 400, 'malformed');
  });

  it('a key generated elsewhere cannot sign for an enrolled kid', async () => {
    const stolenName = await generateDeviceKey();
    const payloadText = unb64(batch.jws.payload).toString('utf8');
    await refused(
      jwsBody(await signJws(payloadText, 'batch', stolenName.privateKey, device.kid)),
      401,
      'signature',
    );
  });
});
