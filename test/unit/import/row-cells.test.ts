// The tokenizer's own split of unquoted text must give exactly papaparse's rows, cells and line numbers, however
// the text is chunked; numbers read in place must equal Number() of the cell, or fall back to the full reading.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { plainNumberIn, readCell } from '../../../src/domain/import/cells.js';
import { RowTokenizer, type Newline } from '../../../src/domain/import/row-tokenizer.js';
import { cutText } from '../../support/text-cuts.js';

type Row = { line: number; cells: string[] };

function viaPapaparse(chunks: readonly string[], delimiter: string, newline: Newline): Row[] {
  const t = new RowTokenizer(delimiter, newline);
  const out: Row[] = [];
  chunks.forEach((c, i) => t.feed(c, i === chunks.length - 1, (cells, line) => out.push({ line, cells })));
  return out;
}

function viaCells(chunks: readonly string[], delimiter: string, newline: Newline): Row[] {
  const t = new RowTokenizer(delimiter, newline);
  const out: Row[] = [];
  chunks.forEach((c, i) =>
    t.feedCells(c, i === chunks.length - 1, (row, line) => {
      const cells: string[] = [];
      for (let k = 0; k < row.count; k++) cells.push(row.text(k));
      out.push({ line, cells });
    }),
  );
  return out;
}

describe('unquoted rows read in place', () => {
  it('match papaparse rows and line numbers for any text without quotes and any chunking', () => {
    const alphabet = fc.constantFrom('1', '2', ',', ';', '\t', '|', '\r', '\n', ' ', 'a', '-', '.');
    fc.assert(
      fc.property(
        fc.string({ unit: alphabet, maxLength: 200 }),
        fc.constantFrom(',', ';', '\t', '|'),
        fc.constantFrom<Newline>('\n', '\r\n', '\r'),
        fc.array(fc.double({ min: 0, max: 1, noNaN: true }), { maxLength: 6 }),
        (text, delimiter, newline, cuts) => {
          const chunks = cutText(text, cuts, true);
          expect(viaCells(chunks, delimiter, newline)).toEqual(viaPapaparse(chunks, delimiter, newline));
        },
      ),
      { numRuns: 500 },
    );
  });

  it('hand a chunk holding a quote to papaparse, keeping line numbers across the switch', () => {
    const chunks = ['a;b\r\n1;2\r\n', '"x\r\ny";3\r\n4;5', '\r\n6;7\r\n'];
    const rows = viaCells(chunks, ';', '\r\n');
    expect(rows).toEqual(viaPapaparse(chunks, ';', '\r\n'));
    expect(rows.map((r) => r.line)).toEqual([1, 2, 3, 5, 6, 7]);
    expect(rows[2]?.cells).toEqual(['x\r\ny', '3']);
  });
});

describe('plainNumberIn', () => {
  it('gives the same double as Number() for plain decimals of up to 15 digits, with either mark', () => {
    fc.assert(
      fc.property(
        fc.string({ unit: fc.constantFrom(...'0123456789'), minLength: 1, maxLength: 15 }),
        fc.nat(15),
        fc.constantFrom('', '-', '+'),
        (digits, cut, sign) => {
          const frac = Math.min(cut, digits.length);
          const text = `${sign}${frac ? `${digits.slice(0, digits.length - frac)}.${digits.slice(-frac)}` : digits}`;
          const padded = `x;${text.replace('.', ',')};y`;
          expect(plainNumberIn(text, 0, text.length, '.')).toBe(Number(text));
          expect(plainNumberIn(padded, 2, padded.length - 2, ',')).toBe(Number(text));
        },
      ),
      { numRuns: 2000 },
    );
  });

  it('leaves 16 digits and more, exponents, spaces and the other mark to readCell (NaN here)', () => {
    for (const s of ['9007199254740993', '1234567890.123456', '1e3', ' 1', '1,5', '', '-', '1.2.3']) {
      expect(plainNumberIn(s, 0, s.length, '.')).toBeNaN();
    }
    // readCell then reads the long number exactly as Number() does.
    expect(readCell('9007199254740993', '.')).toEqual({ kind: 'number', value: Number('9007199254740993') });
  });
});
