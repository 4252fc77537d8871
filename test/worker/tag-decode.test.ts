// Reading tags with the worker's decoder code (run here in Node): QR, Data Matrix and Code 128 made by bwip-js
// with their quiet zones (QR 4 modules, Data Matrix 2, Code 128 10; see test/support/barcode-images.ts), clean
// and degraded. Clean images must all read; degraded ones must stay at or above the rates measured when the
// decoder was written (floors a few points under them); nothing may ever read as other text.
import { describe, expect, it } from 'vitest';
import { drawSymbol, onBackground } from '../support/barcode-images.js';
import {
  asciiPayloads,
  decode,
  measureRates,
  NON_ASCII_PAYLOADS,
  pct,
  rateTable,
  type RateRow,
} from '../support/tag-decode-rates.js';
import { utf8Repaired } from '../../workers/tag-decode-core.js';

/** Floors in percent, per symbol and condition, from the rates measured (the printed table); 0 where the
 * decoder cannot read that condition at all today — reported, not asserted. */
const FLOORS: Record<string, Record<string, number>> = {
  qr: {
    'rotation 10°': 95,
    'rotation 30°': 95,
    'blur (box r=1 ×3)': 45,
    'noise σ=25': 65,
    'low contrast 100–160': 95,
    'partial glare': 15,
    'uneven light 100→35 %': 95,
    'perspective 25 %': 10,
    'light on dark': 95,
  },
  dataMatrix: {
    'rotation 10°': 10,
    'blur (box r=1 ×3)': 50,
    'noise σ=25': 80,
    'partial glare': 70,
    'uneven light 100→35 %': 95,
    '50 % scale': 40,
    'light on dark': 95,
  },
  code128: {
    'rotation 10°': 95,
    'blur (box r=1 ×3)': 95,
    'low contrast 100–160': 95,
    'partial glare': 95,
    'uneven light 100→35 %': 50,
    'perspective 25 %': 95,
    '50 % scale': 95,
    'light on dark': 95,
  },
};

const rows: RateRow[] = [];

function check(measured: RateRow[]) {
  rows.push(...measured);
  for (const row of measured) {
    // A wrong text is worse than none: it would open another seam.
    expect(row.misreads, `${row.symbol} ${row.condition}`).toBe(0);
    if (row.condition === 'clean') expect(pct(row), `${row.symbol} clean`).toBe(100);
    else
      expect(pct(row), `${row.symbol} ${row.condition}`).toBeGreaterThanOrEqual(
        FLOORS[row.symbol]?.[row.condition] ?? 0,
      );
  }
}

describe('tag decode rates', () => {
  it('QR: 20 ASCII and 6 non-ASCII payloads', () => {
    check(measureRates('qr', [...asciiPayloads(20, 60, 1), ...NON_ASCII_PAYLOADS]));
  }, 120_000);

  it('Data Matrix: 20 ASCII and 6 non-ASCII payloads', () => {
    check(measureRates('dataMatrix', [...asciiPayloads(20, 40, 2), ...NON_ASCII_PAYLOADS]));
  }, 120_000);

  it('Code 128: 20 ASCII payloads', () => {
    check(measureRates('code128', asciiPayloads(20, 16, 3)));
    // The table for the report (npm test output): symbol, condition, rate.
    console.log(`Tag decode rates\n${rateTable(rows)}`);
  }, 120_000);
});

describe('tag text from 2D symbols', () => {
  it('reads non-ASCII QR and Data Matrix payloads as UTF-8 (RFC 3629)', () => {
    for (const symbol of ['qr', 'dataMatrix'] as const) {
      for (const payload of NON_ASCII_PAYLOADS) {
        const img = drawSymbol(symbol, payload, 4);
        expect(decode(onBackground(img, img.width + 40, img.height + 40, 255))?.text).toBe(payload);
      }
    }
  });

  it('repairs ISO-8859-1 text that holds UTF-8 bytes, and leaves other text alone', () => {
    expect(utf8Repaired('Ã¤')).toBe('ä');
    expect(utf8Repaired('Ã')).toBe('Ã');
    expect(utf8Repaired('Ü-12')).toBe('Ü-12');
    expect(utf8Repaired('焊缝')).toBe('焊缝');
  });

  it('finds nothing on a plain background', () => {
    const blank = { data: new Uint8ClampedArray(320 * 240).fill(190), width: 320, height: 240 };
    expect(decode(blank)).toBeNull();
  });
});
