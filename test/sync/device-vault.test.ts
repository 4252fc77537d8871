// The device key lives in its own IndexedDB database: made once, non-extractable, the same key after a reopen;
// enrolment is kept beside it, and a wiped database means a new key and no enrolment (enrol again).
import 'fake-indexeddb/auto';
import { deleteDB } from 'idb';
import { afterEach, describe, expect, it } from 'vitest';
import { signJws, verifyJws, parseFlattenedJws, jwsBody } from '../../src/protocol/index.js';
import { openDeviceVault, type DeviceVault, type Enrolment } from '../../src/app/sync/device-vault.js';

const vaults: DeviceVault[] = [];
const freshVault = (name: string) => {
  const vault = openDeviceVault({ name, now: () => '2026-12-02T09:00:00.000Z' });
  vaults.push(vault);
  return vault;
};
afterEach(() => {
  for (const v of vaults.splice(0)) v.close();
});

const enrolmentOf = (deviceKid: string): Enrolment => ({
  serverOrigin: 'https://yard.test',
  deviceKid,
  name: 'Tablet 1',
  enrolledAt: '2026-12-02T09:01:00.000Z',
  serverKid: 'server-kid',
  serverJwk: { kty: 'EC', crv: 'P-256', x: 'x', y: 'y' },
});

describe('device vault', () => {
  it('makes one non-extractable P-256 key and gives it back after a reopen', async () => {
    const name = `device-${crypto.randomUUID()}`;
    const vault = freshVault(name);
    const [a, b] = await Promise.all([vault.key(), vault.key()]);
    expect(a.kid).toBe(b.kid);
    // Design notes §4: the private key is non-extractable (it can sign, never leave the browser).
    expect(a.privateKey.extractable).toBe(false);
    expect(a.privateKey.algorithm).toMatchObject({ name: 'ECDSA', namedCurve: 'P-256' });
    await expect(crypto.subtle.exportKey('jwk', a.privateKey as never)).rejects.toThrow();
    vault.close();

    const again = freshVault(name);
    const key = await again.key();
    expect(key.kid).toBe(a.kid);
    expect(key.createdAt).toBe('2026-12-02T09:00:00.000Z');
    // The stored key still signs, and its signature checks with the public key (RFC 7515 ES256).
    const jws = await signJws('{"a":1}', 'batch', key.privateKey, key.kid);
    const verified = await verifyJws(parseFlattenedJws(JSON.parse(jwsBody(jws))), 'batch', {
      ...key.publicJwk,
    });
    expect(verified.payload).toEqual({ a: 1 });
  });

  it('keeps the enrolment of the current key only', async () => {
    const name = `device-${crypto.randomUUID()}`;
    const vault = freshVault(name);
    expect(await vault.enrolment()).toBeNull();
    const key = await vault.key();
    await vault.saveEnrolment(enrolmentOf('another-kid'));
    expect(await vault.enrolment()).toBeNull();
    await vault.saveEnrolment(enrolmentOf(key.kid));
    vault.close();
    expect(await freshVault(name).enrolment()).toEqual(enrolmentOf(key.kid));
  });

  it('after a wipe makes a new key and is not enrolled', async () => {
    const name = `device-${crypto.randomUUID()}`;
    const vault = freshVault(name);
    const old = await vault.key();
    await vault.saveEnrolment(enrolmentOf(old.kid));
    vault.close();
    await deleteDB(name);
    const wiped = freshVault(name);
    expect(await wiped.enrolment()).toBeNull();
    expect((await wiped.key()).kid).not.toBe(old.kid);
  });
});
