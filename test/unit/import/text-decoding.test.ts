// The import's decoder reads well-formed UTF-8 strictly (fast) and hands over to the lenient decoder at the first
// malformed chunk: whatever the bytes and however they are chunked, the text must be the lenient decoder's.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ByteDecoder } from '../../../src/domain/import/text-decoding.js';

function lenient(chunks: readonly Uint8Array[]): string {
  const d = new TextDecoder('utf-8', { fatal: false });
  return chunks.map((c) => d.decode(c, { stream: true })).join('') + d.decode();
}

function viaByteDecoder(chunks: readonly Uint8Array[]): string {
  const d = new ByteDecoder();
  return chunks.map((c) => d.push(c)).join('') + d.end();
}

function cut(bytes: Uint8Array, at: readonly number[]): Uint8Array[] {
  const points = [...new Set(at.map((f) => Math.floor(f * bytes.length)))].sort((a, b) => a - b);
  const out: Uint8Array[] = [];
  let prev = 0;
  for (const p of points) {
    out.push(bytes.subarray(prev, p));
    prev = p;
  }
  out.push(bytes.subarray(prev));
  return out;
}

// Mostly text, with multi-byte characters, marks and stray bytes that break UTF-8.
const piece = fc.oneof(
  fc.constantFrom('a', '1;2,5\n', 'µm', '°', '€', '𝄞', '\uFEFF').map((s) => [...new TextEncoder().encode(s)]),
  fc.constantFrom([0xff], [0xc3], [0xe2, 0x82], [0xf0, 0x9d, 0x84], [0x80], [0xed, 0xa0, 0x80]),
);

describe('ByteDecoder on UTF-8', () => {
  it('gives the lenient decoder’s text for any later bytes and any chunking', () => {
    fc.assert(
      fc.property(
        fc.array(piece, { maxLength: 60 }),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 8 }),
        (pieces, at) => {
          // A first chunk of plain text, so the encoding is told as UTF-8 (a file's first chunk is 64 KiB).
          const chunks = [new TextEncoder().encode('x;y\n'), ...cut(Uint8Array.from(pieces.flat()), at)];
          expect(viaByteDecoder(chunks)).toBe(lenient(chunks));
        },
      ),
      { numRuns: 1000 },
    );
  });

  it('drops a leading byte-order mark and keeps one further on', () => {
    const bytes = Uint8Array.from([0xef, 0xbb, 0xbf, 0x61, 0xff, 0xef, 0xbb, 0xbf, 0x62]);
    const d = new ByteDecoder();
    const text = d.push(bytes.subarray(0, 4)) + d.push(bytes.subarray(4)) + d.end();
    expect(d.bom).toBe(true);
    expect(text).toBe('a\uFFFD\uFEFFb');
  });
});
