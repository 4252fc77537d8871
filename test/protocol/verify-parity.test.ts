// The server verifies with node:crypto (src/server/sync/verify.ts); tablets and the protocol helpers use jose.
// Both must give the same answer on the same bytes: genuine messages pass both, every tampered one fails both.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  canonicalJson,
  generateDeviceKey,
  isProtocolError,
  signJws,
  verifyJws,
  type FlattenedJws,
} from '../../src/protocol/index.js';
import { publicKeyObject, verifyJwsNode } from '../../src/server/sync/verify.js';

async function outcome(f: () => unknown): Promise<string> {
  try {
    await f();
    return 'accepted';
  } catch (e) {
    if (!isProtocolError(e)) throw e;
    return e.code === 'malformed' || e.code === 'signature' ? 'refused' : e.code;
  }
}

describe('server verification agrees with jose', () => {
  it('on genuine messages and on every kind of tampering', async () => {
    const key = await generateDeviceKey();
    const other = await generateDeviceKey();
    const node = publicKeyObject(JSON.stringify(key.publicJwk));
    const jws = await signJws(
      canonicalJson({ protocol: 1, type: 'batch', note: 'ünïcode ✓', n: [1, 2, 3] }),
      'batch',
      key.privateKey,
      key.kid,
    );
    const both = async (j: FlattenedJws) => [
      await outcome(() => verifyJws(j, 'batch', key.publicKey)),
      await outcome(() => verifyJwsNode(j, 'batch', node)),
    ];
    expect(await both(jws)).toEqual(['accepted', 'accepted']);
    const wrongKey = await signJws('{}', 'batch', other.privateKey, key.kid);
    expect(await both(wrongKey)).toEqual(['refused', 'refused']);
    expect(await both({ ...jws, signature: jws.signature.slice(0, -2) })).toEqual(['refused', 'refused']);
    expect(await both({ ...jws, signature: jws.signature + 'AA' })).toEqual(['refused', 'refused']);
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom('protected', 'payload', 'signature'),
        fc.nat(),
        fc.nat({ max: 7 }),
        async (member, at, bit) => {
          const bytes = Buffer.from(jws[member as keyof FlattenedJws], 'base64url');
          const i = at % bytes.length;
          bytes[i] = (bytes[i] as number) ^ (1 << bit);
          const [a, b] = await both({ ...jws, [member]: bytes.toString('base64url') });
          expect(b).toBe(a);
          expect(a).not.toBe('accepted');
        },
      ),
      { numRuns: 300, seed: 99 },
    );
  });
});
