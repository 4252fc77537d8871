// Passwords are hashed with scrypt (memory-hard; node:crypto), each with its own random salt. The stored form
// names its parameters, so the cost can be raised later without breaking existing hashes.
import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';

const KEY_LENGTH = 32;

function derive(password: string, salt: Buffer, options: ScryptOptions): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    scrypt(password.normalize('NFC'), salt, KEY_LENGTH, options, (error, key) =>
      error ? reject(error) : resolve(key),
    );
  });
}

const memoryFor = (N: number, r: number) => 128 * N * r * 2 + 1024 * 1024;

/** scrypt$N$r$p$salt$hash (base64url). N = 2^15, r = 8 uses 32 MiB per hash. */
export async function hashPassword(password: string, N = 2 ** 15): Promise<string> {
  const r = 8;
  const p = 1;
  const salt = randomBytes(16);
  const key = await derive(password, salt, { N, r, p, maxmem: memoryFor(N, r) });
  return `scrypt$${N}$${r}$${p}$${salt.toString('base64url')}$${key.toString('base64url')}`;
}

export async function verifyPassword(password: string, stored: string): Promise<boolean> {
  const [scheme, n, r, p, salt, hash] = stored.split('$');
  if (scheme !== 'scrypt' || !n || !r || !p || !salt || !hash) return false;
  const N = Number(n);
  const R = Number(r);
  const expected = Buffer.from(hash, 'base64url');
  const key = await derive(password, Buffer.from(salt, 'base64url'), {
    N,
    r: R,
    p: Number(p),
    maxmem: memoryFor(N, R),
  });
  return key.length === expected.length && timingSafeEqual(key, expected);
}

/** A hash of nothing anyone can type, checked when the account does not exist, so both cases take as long. */
let decoy: Promise<string> | undefined;
export function decoyHash(N: number): Promise<string> {
  decoy ??= hashPassword(randomBytes(24).toString('base64url'), N);
  return decoy;
}
