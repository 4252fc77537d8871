// A chunk's text is decoded in pieces; the binary check and the newline detection read the pieces as if joined.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { detectNewline, detectNewlineIn } from '../../../src/domain/import/row-tokenizer.js';
import { binaryAt, binaryAtAll } from '../../../src/domain/import/text-decoding.js';
import { cutText as pieces } from '../../support/text-cuts.js';

const text = fc.string({
  unit: fc.constantFrom('a', '1', ';', '\r', '\n', '\t', '\u0000', '\u0001', '\u000b', '\ufffd'),
  maxLength: 400,
});
const cuts = fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 6 });

describe('text read in pieces', () => {
  it('finds binary data where the joined text shows it', () => {
    fc.assert(
      fc.property(text, cuts, (t, c) => {
        expect(binaryAtAll(pieces(t, c))).toBe(binaryAt(t));
      }),
      { numRuns: 1000 },
    );
  });

  it('tells the newline the joined text uses', () => {
    fc.assert(
      fc.property(text, cuts, (t, c) => {
        expect(detectNewlineIn(pieces(t, c))).toBe(detectNewline(t));
      }),
      { numRuns: 1000 },
    );
  });

  it('counts control characters across pieces', () => {
    // Nine stray controls in the first 450 characters: binary only when counted across the pieces.
    const t = `${'\u0001'.repeat(9)}${'a'.repeat(441)}`;
    expect(binaryAt(t)).toBe(8);
    expect(binaryAtAll([t.slice(0, 4), t.slice(4)])).toBe(8);
  });
});
