// Whether a payload's text may be kept as its bytes: the quick answer is always the one encoding the bytes gives.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { PayloadBytes } from '../../src/server/sync/payload-bytes.js';

const reEncodes = (text: string): boolean => Buffer.from(text, 'base64url').toString('base64url') === text;

// Mostly the base64url alphabet, with the characters Node's lenient decoder also reads or skips.
const char = fc.oneof(
  {
    weight: 20,
    arbitrary: fc.constantFrom(...'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_'),
  },
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      '+',
      '/',
      '=',
      ' ',
      '.',
      '\n',
      '\t',
      '%',
      'é',
      '\u00ff',
      '\u0100',
      '\uD800',
      '\uFFFF',
    ),
  },
);

describe('a decoded payload', () => {
  it('says it encodes back exactly when encoding its bytes gives its text', () => {
    fc.assert(
      fc.property(fc.array(char, { maxLength: 40 }), (chars) => {
        const text = chars.join('');
        const decoded = PayloadBytes.decode(text);
        expect(decoded.encodesBack).toBe(reEncodes(text));
        expect(decoded.bytes.equals(Buffer.from(text, 'base64url'))).toBe(true);
      }),
      { numRuns: 3000 },
    );
  });

  it('encodes back for the encoding of any bytes, and not once a last character carries stray bits', () => {
    fc.assert(
      fc.property(fc.uint8Array({ maxLength: 64 }), (bytes) => {
        const text = Buffer.from(bytes).toString('base64url');
        expect(PayloadBytes.decode(text).encodesBack).toBe(true);
      }),
    );
    // "QQ" and "QR" both decode to "A"; "QUI" and "QUJ" both to "AB".
    expect(PayloadBytes.decode('QQ').encodesBack).toBe(true);
    expect(PayloadBytes.decode('QR').encodesBack).toBe(false);
    expect(PayloadBytes.decode('QUI').encodesBack).toBe(true);
    expect(PayloadBytes.decode('QUJ').encodesBack).toBe(false);
    expect(PayloadBytes.decode('QQ==').encodesBack).toBe(false);
    expect(PayloadBytes.decode('a+b/').encodesBack).toBe(false);
  });

  it('reads as ASCII text only when every byte is ASCII', () => {
    const plain = PayloadBytes.decode(Buffer.from('{"a":"b"}').toString('base64url'));
    expect(plain.ascii()).toBe('{"a":"b"}');
    expect(PayloadBytes.decode(Buffer.from('{"a":"ø"}').toString('base64url')).ascii()).toBeNull();
    expect(PayloadBytes.decode(Buffer.from([0x7b, 0xff]).toString('base64url')).ascii()).toBeNull();
  });
});
