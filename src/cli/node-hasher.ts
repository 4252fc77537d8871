// The import's file hash on the command line (and in the bench): node:crypto's native SHA-256 behind the
// domain's Hasher interface, in place of the pure JS fallback.
import { createHash } from 'node:crypto';
import type { Hasher } from '../domain/import/index.js';

export function nodeHasher(): Hasher {
  const h = createHash('sha256');
  return { update: (b) => void h.update(b), digest: () => h.digest('hex') };
}
