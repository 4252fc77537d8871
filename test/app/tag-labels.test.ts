// Tag labels: the symbols drawn for a label (bwip-js SVG), when a Code 128 is left out and why, the sheet
// layouts' pages, and the tags minted for seams that have none.
import { describe, expect, it } from 'vitest';
import { readTagText } from '../../src/domain/index.js';
import { labelCodes, MAX_1D_LENGTH, svgDataUrl } from '../../src/app/tags/label-codes.js';
import { mintTag, paginate, SHEET_LAYOUTS } from '../../src/app/tags/label-sheets.js';

describe('labelCodes', () => {
  it('draws a QR or Data Matrix and a Code 128 as SVG for a short ASCII tag', () => {
    for (const kind of ['qr', 'dataMatrix'] as const) {
      const codes = labelCodes('KP-014', kind);
      expect(codes.twoD).toMatch(/^<svg viewBox="0 0 \d+ \d+"/);
      expect(codes.oneD).toMatch(/^<svg viewBox="0 0 \d+ \d+"/);
      expect(codes.oneDMissing).toBeNull();
    }
  });

  it('gives the quiet zones in the drawing: QR 4 modules (8 units), Code 128 10 modules', () => {
    // QR version 1 is 21 modules at 2 units each, plus 2 × 8 units of quiet zone (ISO/IEC 18004: 4 modules).
    expect(labelCodes('KP-014', 'qr').twoD).toMatch(/^<svg viewBox="0 0 58 58"/);
  });

  it('leaves out the Code 128 for non-ASCII or long tags, saying why', () => {
    expect(labelCodes('Naht-ä', 'qr')).toMatchObject({
      oneD: null,
      oneDMissing: expect.stringMatching(/ASCII/),
    });
    const long = 'X'.repeat(MAX_1D_LENGTH + 1);
    expect(labelCodes(long, 'qr')).toMatchObject({
      oneD: null,
      oneDMissing: expect.stringMatching(/longer/),
    });
  });

  it('wraps SVG as a data URL, so it is shown as an image and never as page markup', () => {
    expect(svgDataUrl('<svg x="1"/>')).toBe('data:image/svg+xml;charset=utf-8,%3Csvg%20x%3D%221%22%2F%3E');
  });
});

describe('sheet layouts', () => {
  it('fill pages of their size', () => {
    const a4 = SHEET_LAYOUTS.find((l) => l.id === 'a4-3x8');
    if (!a4) throw new Error('no A4 layout');
    expect(a4.columns * 8).toBe(a4.perPage);
    const pages = paginate(
      Array.from({ length: 50 }, (_, i) => i),
      a4,
    );
    expect(pages.map((p) => p.length)).toEqual([24, 24, 2]);
  });

  it('fit their labels on the page (A4 210 mm, Letter 215.9 mm wide)', () => {
    for (const l of SHEET_LAYOUTS) {
      const pageWidth = l.page === 'A4' ? 210 : 215.9;
      expect(l.leftMm + l.columns * l.labelWidthMm).toBeLessThanOrEqual(pageWidth);
    }
  });
});

describe('mintTag', () => {
  it('makes a clean, stable tag per seam, different for different seams', () => {
    const a = mintTag('0190f3a2-1111-7abc-8def-000000000001');
    expect(a).toMatch(/^BB-[0-9A-HJKMNP-TV-Z]{10}$/);
    expect(mintTag('0190f3a2-1111-7abc-8def-000000000001')).toBe(a);
    expect(mintTag('0190f3a2-1111-7abc-8def-000000000002')).not.toBe(a);
    const read = readTagText(a);
    expect(read.ok && read.tag).toBe(a);
  });
});
