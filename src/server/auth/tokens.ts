import { createHash, randomBytes } from 'node:crypto';

/** A secret token for a cookie or a nonce: 32 random bytes, base64url. */
export const newToken = (bytes = 32): string => randomBytes(bytes).toString('base64url');

/** What the database keeps of a secret: its SHA-256, so a copy of the database opens no session. */
export const tokenHash = (token: string): string => createHash('sha256').update(token, 'utf8').digest('hex');

/** A readable one-time password: 20 characters from an alphabet without look-alikes. */
export function newPassword(): string {
  const digits = 'abcdefghjkmnpqrstuvwxyzABCDEFGHJKMNPQRSTUVWXYZ23456789';
  return [...randomBytes(20)].map((b) => digits[b % digits.length]).join('');
}
