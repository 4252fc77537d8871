// Reading tags with the worker's decoder code (run here in Node): QR, Data Matrix and Code 128 made by bwip-js
// with their quiet zones (QR 4 modules, Data Matrix 2, Code 128 10; see test/support/barcode-images.ts), clean
// and degraded, read as a photo is and as camera frames are. Clean images must all read; degraded ones must stay
// at or above the rates measured when the decoder was written (floors a few points under them); nothing may ever
// read as other text.
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
  type ReadMode,
} from '../support/tag-decode-rates.js';
import { utf8Repaired } from '../../workers/tag-decode-core.js';

/**
 * Floors in percent per symbol and condition, a few points under the rates measured (the printed tables): a
 * photo read thoroughly (both polarities, TRY_HARDER, a 2× upscale for small images), and two camera frames
 * read quickly (one polarity each). Conditions missing here read at 0 % today: reported, not asserted.
 */
const FLOORS: Record<ReadMode, Record<string, Record<string, number>>> = {
  thorough: {
    qr: {
      'rotation 10°': 95,
      'rotation 30°': 95,
      'blur (box r=1 ×3)': 55,
      'noise σ=25': 95,
      'low contrast 100–160': 95,
      'partial glare': 15,
      'uneven light 100→35 %': 95,
      'perspective 25 %': 15,
      '50 % scale': 50,
      'light on dark': 95,
    },
    dataMatrix: {
      'rotation 10°': 10,
      'blur (box r=1 ×3)': 90,
      'noise σ=25': 95,
      'low contrast 100–160': 50,
      'partial glare': 75,
      'uneven light 100→35 %': 95,
      'perspective 25 %': 20,
      '50 % scale': 95,
      'light on dark': 95,
    },
    code128: {
      'rotation 10°': 95,
      'blur (box r=1 ×3)': 95,
      'noise σ=25': 90,
      'low contrast 100–160': 95,
      'partial glare': 95,
      'uneven light 100→35 %': 55,
      'perspective 25 %': 95,
      '50 % scale': 95,
      'light on dark': 95,
    },
  },
  camera: {
    qr: {
      'rotation 10°': 95,
      'rotation 30°': 95,
      'blur (box r=1 ×3)': 50,
      'noise σ=25': 70,
      'low contrast 100–160': 95,
      'partial glare': 15,
      'uneven light 100→35 %': 95,
      'perspective 25 %': 15,
      'light on dark': 95,
    },
    dataMatrix: {
      'rotation 10°': 10,
      'blur (box r=1 ×3)': 55,
      'noise σ=25': 85,
      'partial glare': 75,
      'uneven light 100→35 %': 95,
      '50 % scale': 45,
      'light on dark': 95,
    },
    code128: {
      'rotation 10°': 95,
      'blur (box r=1 ×3)': 95,
      'low contrast 100–160': 95,
      'partial glare': 95,
      'uneven light 100→35 %': 55,
      'perspective 25 %': 95,
      '50 % scale': 95,
      'light on dark': 95,
    },
  },
};

const tables: Record<ReadMode, RateRow[]> = { thorough: [], camera: [] };

function check(mode: ReadMode, measured: RateRow[]) {
  tables[mode].push(...measured);
  for (const row of measured) {
    const what = `${mode} ${row.symbol} ${row.condition}`;
    // A wrong text is worse than none: it would open another seam.
    expect(row.misreads, what).toBe(0);
    if (row.condition === 'clean') expect(pct(row), what).toBe(100);
    else expect(pct(row), what).toBeGreaterThanOrEqual(FLOORS[mode][row.symbol]?.[row.condition] ?? 0);
  }
}

const PAYLOADS = {
  qr: () => [...asciiPayloads(20, 60, 1), ...NON_ASCII_PAYLOADS],
  dataMatrix: () => [...asciiPayloads(20, 40, 2), ...NON_ASCII_PAYLOADS],
  code128: () => asciiPayloads(20, 16, 3),
};

for (const mode of ['thorough', 'camera'] as const) {
  describe(`tag decode rates, read ${mode === 'thorough' ? 'as a photo' : 'as camera frames'}`, () => {
    it('QR: 20 ASCII and 6 non-ASCII payloads', () => {
      check(mode, measureRates('qr', PAYLOADS.qr(), mode));
    }, 180_000);

    it('Data Matrix: 20 ASCII and 6 non-ASCII payloads', () => {
      check(mode, measureRates('dataMatrix', PAYLOADS.dataMatrix(), mode));
    }, 180_000);

    it('Code 128: 20 ASCII payloads', () => {
      check(mode, measureRates('code128', PAYLOADS.code128(), mode));
      // The table for the report (npm test output).
      console.log(`Tag decode rates, ${mode}\n${rateTable(tables[mode])}`);
    }, 180_000);
  });
}

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

  it('reads Code 39, common on older yard tags', () => {
    for (const payload of ['KP-014', 'B12 W07', 'TANK.3/A', 'X9']) {
      const img = drawSymbol('code39', payload, 2);
      expect(decode(onBackground(img, img.width + 80, img.height * 2))).toEqual({
        text: payload,
        symbol: 'code39',
        inverted: false,
      });
    }
  });

  it('finds nothing on a plain background', () => {
    const blank = { data: new Uint8ClampedArray(320 * 240).fill(190), width: 320, height: 240 };
    expect(decode(blank)).toBeNull();
  });
});
