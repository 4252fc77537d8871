// Tag text rules: what is kept, how tags are matched, what is shown (the rules are ours; Unicode normalisation
// forms per Unicode Standard Annex #15).
import { describe, expect, it } from 'vitest';
import { MAX_TAG_LENGTH, readTagText, shortTag, shownTag, tagKey } from '../../src/domain/index.js';

const ok = (raw: string) => {
  const read = readTagText(raw);
  if (!read.ok) throw new Error(read.message);
  return read;
};

describe('readTagText', () => {
  it('keeps the text, trimmed of the white space and line ends scanners add', () => {
    expect(ok('  KP-014\r\n').tag).toBe('KP-014');
    expect(ok('\tB 12 / 3\u0000').tag).toBe('B 12 / 3');
  });

  it('keeps quotes, markup and control characters inside the text as data', () => {
    const raw = `"><img src=x onerror=alert(1)>'; DROP TABLE seams;--\u0007x`;
    expect(ok(raw).tag).toBe(raw);
  });

  it('stores NFC (UAX #15): a decomposed é and a composed é are the same tag', () => {
    expect(ok('Soudure-e\u0301').tag).toBe('Soudure-\u00e9');
  });

  it('replaces a lone surrogate so the stored text is well-formed', () => {
    expect(ok('A\uD800B').tag).toBe('A\uFFFDB');
  });

  it('refuses empty and white-space-only text with a clear message', () => {
    for (const raw of ['', '   ', '\r\n', '\u0000\u0001']) {
      const read = readTagText(raw);
      expect(read.ok).toBe(false);
      if (!read.ok) {
        expect(read.problem).toBe('empty');
        expect(read.message).toMatch(/empty/);
      }
    }
  });

  it(`accepts ${MAX_TAG_LENGTH} characters and refuses one more, naming the length`, () => {
    expect(ok('x'.repeat(MAX_TAG_LENGTH)).tag).toHaveLength(MAX_TAG_LENGTH);
    const read = readTagText('x'.repeat(MAX_TAG_LENGTH + 1));
    expect(read).toMatchObject({ ok: false, problem: 'tooLong' });
    if (!read.ok) expect(read.message).toContain(`${MAX_TAG_LENGTH + 1} characters`);
    expect(readTagText('y'.repeat(1_000_000))).toMatchObject({ ok: false, problem: 'tooLong' });
  });
});

describe('tagKey', () => {
  it('matches typed, full-width and scanned forms of one tag (NFKC, case, white space)', () => {
    expect(tagKey('kp-014')).toBe('KP-014');
    expect(tagKey('ＫＰ-０１４')).toBe('KP-014');
    expect(tagKey('B  12\t/3')).toBe('B 12 /3');
  });

  it('keeps different tags apart', () => {
    expect(tagKey('KP-014')).not.toBe(tagKey('KP-0140'));
  });
});

describe('shownTag', () => {
  it('shows control characters as control pictures and hidden format characters by code point', () => {
    expect(shownTag('A\u0007B\u001DC\u007F')).toBe('A\u2407B\u241DC\u2421');
    expect(shownTag('abc\u202Efed')).toBe('abc⟨U+202E⟩fed');
    expect(shownTag('x\u200By')).toBe('x⟨U+200B⟩y');
  });

  it('leaves visible text, markup included, as it is (it is rendered as text, never as HTML)', () => {
    expect(shownTag('<b>KP</b> "é"')).toBe('<b>KP</b> "é"');
  });

  it('cuts long tags for lists with an ellipsis', () => {
    expect(shortTag('x'.repeat(100), 10)).toBe(`${'x'.repeat(9)}…`);
    expect(shortTag('short', 10)).toBe('short');
  });
});
