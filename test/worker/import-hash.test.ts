// The worker hashes a table file with WebCrypto (read whole, at most the table limit) and gets the same SHA-256 as
// node:crypto; beyond the limit it leaves hashing to the import's streaming hasher.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { MAPPING_FORMAT, MAX_TABLE_BYTES } from '../../src/domain/import/index.js';
import { importApi } from '../../workers/import-api.js';
import { webCryptoHasher } from '../../workers/web-crypto-hasher.js';
import { buttSeam } from '../support/seam-builder.js';

const context = { importId: 'hash', seam: buttSeam({ length: 10_000 }), recordedAt: '2026-11-20T08:00:00Z' };

describe('table file hash in the worker', () => {
  it('is the SHA-256 of the file bytes, as node:crypto computes it', async () => {
    let text = 'Position [mm];Angle L [deg]\r\n';
    for (let i = 0; i < 20_000; i++) text += `${i * 0.25};${140 + (i % 20)}\r\n`;
    const bytes = new TextEncoder().encode(text);
    const o = await importApi.readTable(
      new Blob([bytes]),
      { format: MAPPING_FORMAT, columns: { position: 'Position', 'plate1.toeAngle': 'Angle L' } },
      context,
    );
    expect(o.kind).toBe('read');
    expect(o.kind === 'read' && o.sha256).toBe(createHash('sha256').update(bytes).digest('hex'));
    expect(o.kind === 'read' && o.readings.length).toBe(20_000);
  });

  it('is not taken natively for a file over the table limit, nor read before it is asked for', () => {
    let reads = 0;
    const big = {
      size: MAX_TABLE_BYTES + 1,
      slice: () => ({ arrayBuffer: () => (reads++, Promise.resolve(new ArrayBuffer(0))) }),
    };
    expect(webCryptoHasher(big)).toBeNull();
    expect(reads).toBe(0);
  });

  it('refuses to give a digest before it is ready', () => {
    const pending = webCryptoHasher(new Blob([new Uint8Array([1, 2, 3])]));
    expect(pending).not.toBeNull();
    expect(() => pending?.hasher.digest()).toThrow(/not ready/);
  });
});
