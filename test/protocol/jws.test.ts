// The JWS helpers: ES256 round trips with non-extractable WebCrypto keys, the strict header rules, thumbprints,
// and that no single flipped bit anywhere passes.
import { createHash } from 'node:crypto';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  canonicalJson,
  generateDeviceKey,
  isProtocolError,
  jwsBody,
  JWS_TYPES,
  parseFlattenedJws,
  readJwsBody,
  readProtectedHeader,
  signJws,
  thumbprint,
  toPublicJwk,
  verifyJws,
  type FlattenedJws,
} from '../../src/protocol/index.js';

const b64 = (s: string) => Buffer.from(s).toString('base64url');

async function codeOf(promise: Promise<unknown>): Promise<string> {
  try {
    await promise;
    return 'accepted';
  } catch (e) {
    if (!isProtocolError(e)) throw e;
    return e.code;
  }
}

describe('JWS helpers', () => {
  it('signs with a non-extractable device key and verifies the exact payload text', async () => {
    const key = await generateDeviceKey();
    expect(key.privateKey.extractable).toBe(false);
    const text = '{"records":[{"note":"crème brûlée ✓"}]}';
    const jws = await signJws(text, 'batch', key.privateKey, key.kid);
    const header = JSON.parse(Buffer.from(jws.protected, 'base64url').toString()) as unknown;
    expect(header).toEqual({ alg: 'ES256', kid: key.kid, typ: JWS_TYPES.batch });
    const verified = await verifyJws(jws, 'batch', key.publicKey);
    expect(verified.payloadText).toBe(text);
    expect(verified.payload).toEqual(JSON.parse(text));
    expect(await codeOf(verifyJws(jws, 'batch', { ...key.publicJwk }))).toBe('accepted');
  });

  it('names the key by its RFC 7638 thumbprint', async () => {
    const key = await generateDeviceKey();
    const { crv, kty, x, y } = key.publicJwk;
    // RFC 7638 §3.2: the required members in lexicographic order, no whitespace, SHA-256, base64url.
    const expected = createHash('sha256')
      .update(`{"crv":"${crv}","kty":"${kty}","x":"${x}","y":"${y}"}`)
      .digest('base64url');
    expect(key.kid).toBe(expected);
    expect(await thumbprint(toPublicJwk({ ...key.publicJwk, ext: true, key_ops: ['verify'] }))).toBe(
      expected,
    );
  });

  it('refuses a public key that is not P-256 or carries its private part', () => {
    const jwk = { kty: 'EC', crv: 'P-256', x: 'A'.repeat(43), y: 'B'.repeat(43) };
    expect(toPublicJwk(jwk)).toEqual(jwk);
    expect(() => toPublicJwk({ ...jwk, crv: 'P-384' })).toThrow(/P-256/);
    expect(() => toPublicJwk({ ...jwk, d: 'C'.repeat(43) })).toThrow(/private part/);
    expect(() => toPublicJwk({ ...jwk, x: 'short' })).toThrow(/43 base64url/);
    expect(() => toPublicJwk({ kty: 'oct', k: 'abc' })).toThrow();
  });

  it('checks the header strictly before any key is used', async () => {
    const key = await generateDeviceKey();
    const jws = await signJws('{}', 'pull', key.privateKey, key.kid);
    const header = (h: unknown): FlattenedJws => ({ ...jws, protected: b64(JSON.stringify(h)) });
    const code = (j: FlattenedJws) => {
      try {
        readProtectedHeader(j, 'pull');
        return 'accepted';
      } catch (e) {
        return isProtocolError(e) ? e.code : 'other';
      }
    };
    const typ = JWS_TYPES.pull;
    expect(code(jws)).toBe('accepted');
    expect(code(header({ alg: 'none', kid: key.kid, typ }))).toBe('algorithm');
    expect(code(header({ alg: 'HS256', kid: key.kid, typ }))).toBe('algorithm');
    expect(code(header({ alg: 'ES384', kid: key.kid, typ }))).toBe('algorithm');
    expect(code(header({ kid: key.kid, typ }))).toBe('algorithm');
    expect(code(header({ alg: 'ES256', kid: key.kid, typ, crit: ['b64'], b64: false }))).toBe('header');
    expect(code(header({ alg: 'ES256', kid: key.kid, typ, jwk: key.publicJwk }))).toBe('header');
    expect(code(header({ alg: 'ES256', kid: key.kid, typ: JWS_TYPES.batch }))).toBe('type');
    expect(code(header({ alg: 'ES256', kid: 'short', typ }))).toBe('header');
    expect(code(header([]))).toBe('malformed');
    expect(code({ ...jws, protected: b64('not json') })).toBe('malformed');
  });

  it('refuses anything but the three members of a flattened JWS', () => {
    const ok = { protected: 'eyJ9', payload: 'e30', signature: 'AA' };
    expect(parseFlattenedJws(ok)).toEqual(ok);
    for (const bad of [
      null,
      [],
      'a.b.c',
      { ...ok, header: {} },
      { ...ok, payload: '' },
      { ...ok, signature: 'a+b/' },
      { protected: 'x', payload: 'y' },
    ]) {
      expect(() => parseFlattenedJws(bad)).toThrow();
    }
  });

  it('reads a body as jwsBody writes it without a JSON parse, and leaves every other text to the parser', () => {
    const jws = { protected: b64('{"alg":"ES256"}'), payload: b64('{"a":1}'), signature: 'c2ln-_' };
    const body = jwsBody(jws);
    expect(readJwsBody(body)).toEqual(parseFlattenedJws(JSON.parse(body)));
    const others = [
      JSON.stringify(jws, null, 1),
      JSON.stringify({ payload: jws.payload, protected: jws.protected, signature: jws.signature }),
      JSON.stringify({ ...jws, header: {} }),
      body.replace(jws.payload, `${jws.payload.slice(0, 2)}\\u0041${jws.payload.slice(3)}`),
      body.replace(jws.signature, ''),
      body.replace(jws.signature, 'c2ln='),
      `${body}\n`,
      ` ${body}`,
    ];
    for (const text of others) expect(readJwsBody(text)).toBeNull();
    // Members drawn from base64url and the characters that would change how JSON reads them.
    const member = fc.string({ unit: fc.constantFrom('A', 'z', '0', '-', '_', '=', '\\', '"', ' ', 'u') });
    fc.assert(
      fc.property(member, member, member, (p, q, r) => {
        const text = `{"protected":"${p}","payload":"${q}","signature":"${r}"}`;
        const read = readJwsBody(text);
        if (read) expect(read).toEqual(parseFlattenedJws(JSON.parse(text)));
        else expect([p, q, r].every((m) => /^[A-Za-z0-9_-]+$/.test(m))).toBe(false);
      }),
      { numRuns: 500, seed: 5 },
    );
  });

  it('refuses every single flipped bit in header, payload or signature', async () => {
    const key = await generateDeviceKey();
    const jws = await signJws(
      canonicalJson({ protocol: 1, n: 42, text: 'seam 7' }),
      'batch',
      key.privateKey,
      key.kid,
    );
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom('protected', 'payload', 'signature'),
        fc.nat(),
        async (member, bit) => {
          const bytes = Buffer.from(jws[member as keyof FlattenedJws], 'base64url');
          const i = Math.floor(bit / 8) % bytes.length;
          bytes[i] = (bytes[i] as number) ^ (1 << (bit % 8));
          const tampered = { ...jws, [member]: bytes.toString('base64url') };
          expect(await codeOf(verifyJws(tampered, 'batch', key.publicKey))).not.toBe('accepted');
        },
      ),
      { numRuns: 200, seed: 11 },
    );
  });

  it('refuses a signature made by another key', async () => {
    const [a, b] = [await generateDeviceKey(), await generateDeviceKey()];
    const jws = await signJws('{}', 'batch', b.privateKey, a.kid);
    expect(await codeOf(verifyJws(jws, 'batch', a.publicKey))).toBe('signature');
  });
});
