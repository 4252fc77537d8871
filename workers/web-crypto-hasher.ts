// The table import's file hash in the worker: WebCrypto's native SHA-256 in place of the domain's pure JS one. Its
// digest is one-shot, so it reads the file whole, once, beside the streamed reading; a table file is at most
// 64 MiB (MAX_TABLE_BYTES). Larger files (profile files) keep the streaming JS hasher.
import { MAX_TABLE_BYTES, type Hasher } from '../src/domain/import/index.js';
import type { ByteSource } from './import-api.js';

export interface PendingHasher {
  /** Pass to the import: it ignores the streamed chunks, the file is hashed whole. */
  readonly hasher: Hasher;
  /** Settles when the digest is known; await it before finishing the import. */
  readonly ready: Promise<void>;
}

// Typed here, as the domain types TextDecoder: this module compiles with the shared code, which sees no globals.
interface Digester {
  digest(algorithm: 'SHA-256', data: ArrayBuffer): Promise<ArrayBuffer>;
}
const subtleCrypto = (globalThis as unknown as { readonly crypto?: { readonly subtle?: Digester } }).crypto
  ?.subtle;

function hex(buffer: ArrayBuffer): string {
  return Array.from(new Uint8Array(buffer), (b) => b.toString(16).padStart(2, '0')).join('');
}

/** A WebCrypto hasher for `file`, or null where WebCrypto is missing or the file is too large to read whole. */
export function webCryptoHasher(file: ByteSource): PendingHasher | null {
  const subtle = subtleCrypto;
  if (!subtle || file.size > MAX_TABLE_BYTES) return null;
  let digest: string | null = null;
  const ready = file
    .slice(0, file.size)
    .arrayBuffer()
    .then((bytes) => subtle.digest('SHA-256', bytes))
    .then((d) => {
      digest = hex(d);
    });
  return {
    hasher: {
      update() {},
      digest() {
        if (digest === null) throw new Error('the file hash is not ready: await `ready` first');
        return digest;
      },
    },
    ready,
  };
}
