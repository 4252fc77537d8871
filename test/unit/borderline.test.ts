// Borderline: a value within the instrument's resolution of the governing limit, on either side, is flagged so
// the inspector re-measures; a value further away is not; without a resolution nothing is flagged and a note
// says so. Limits are derived by hand from the limits reference (acceptance-limits.md §2).
import { describe, expect, it } from 'vitest';
import type { Reading } from '../../src/domain/index.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';
import { gradeValid, requiring, rowGradeOf } from '../support/grade-one.js';

// Row 1.9 (502), b = 10, level B: h ≤ 1 mm + 0.1·10 = 2 mm. Resolution 0.1 mm.
const excess = (h: number, instrument?: Reading['instrument']): Reading =>
  reading(
    { reinforcementHeight: h, reinforcementWidth: 10 },
    { side: 'face', ...(instrument ? { instrument } : {}) },
  );
const SRC_1_9 =
  'ISO 5817:2014 Table 1 row 1.9 (502), B h ≤ 1 mm + 0.1·b = 2 at b = 10 (limits reference §2, P: S2)';

describe('borderline against the governing limit (resolution 0.1 mm)', () => {
  it.each([
    [1.89, 0.11, false, 'inside by more than the resolution'],
    [1.9, 0.1, true, 'inside by exactly the resolution'],
    [1.95, 0.05, true, 'inside within the resolution'],
    [2, 0, true, 'on the limit'],
    [2.05, -0.05, true, 'outside within the resolution'],
    [2.1, -0.1, true, 'outside by exactly the resolution'],
    [2.11, -0.11, false, 'outside by more than the resolution'],
  ])(
    `${SRC_1_9}; h = %s → margin %s, borderline %s (%s; resolution band derived from the table)`,
    (h, margin, borderline) => {
      const g = rowGradeOf(buttSeam(), excess(h), '1.9');
      expect(g.resolution).toBe(0.1);
      expect(g.governing.value).toBe(2);
      expect(g.margin).toBe(margin);
      expect(g.borderline).toBe(borderline);
      expect(g.notes).not.toContain('instrument resolution not given: borderline not assessed');
    },
  );

  it(`${SRC_1_9} and C h ≤ 1 mm + 0.15·b = 2.5: the governing limit is the one at the required level, so 1.95 is borderline under B but not under C`, () => {
    const underC = rowGradeOf(requiring(buttSeam(), 'C'), excess(1.95), '1.9');
    expect(underC.governing.value).toBe(2.5);
    expect(underC.margin).toBe(0.55);
    expect(underC.borderline).toBe(false);
  });

  it(`${SRC_1_9}: the round counts its borderline values`, () => {
    const g = gradeValid(seamFile(buttSeam(), [excess(1.5), excess(1.95), excess(2.05)]));
    expect(g.rounds[0]?.borderlineCount).toBe(2);
  });
});

describe('borderline for angles (resolution 1°)', () => {
  // Row 1.12 (505) butt, C: α ≥ 110°.
  it.each([
    [108.5, false],
    [109, true],
    [110, true],
    [111, true],
    [111.5, false],
  ])(
    'ISO 5817:2014 Table 1 row 1.12 (505), butt weld, C α ≥ 110° (limits reference §2, S3); α = %s° → borderline %s (resolution band derived from the table)',
    (alpha, borderline) => {
      const g = rowGradeOf(
        requiring(buttSeam(), 'C'),
        reading({ toeAngle: alpha }, { toe: { plate: 1, side: 'face' } }),
        '1.12-butt',
      );
      expect(g.resolution).toBe(1);
      expect(g.margin).toBe(alpha - 110);
      expect(g.borderline).toBe(borderline);
    },
  );
});

describe('no resolution given', () => {
  it(`${SRC_1_9}: on the limit, but the instrument states no resolution → not borderline, with a note`, () => {
    const g = rowGradeOf(buttSeam(), excess(2, { id: 'G-9' }), '1.9');
    expect(g.resolution).toBeNull();
    expect(g.margin).toBe(0);
    expect(g.borderline).toBe(false);
    expect(g.notes).toContain('instrument resolution not given: borderline not assessed');
  });

  it('ISO 5817:2014 Table 1 row 1.12 (505) (limits reference §2, S3): a length resolution does not stand in for an angle resolution', () => {
    const g = rowGradeOf(
      requiring(buttSeam(), 'C'),
      reading(
        { toeAngle: 110 },
        { toe: { plate: 1, side: 'face' }, instrument: { id: 'G-2', resolutionMm: 0.5 } },
      ),
      '1.12-butt',
    );
    expect(g.resolution).toBeNull();
    expect(g.borderline).toBe(false);
    expect(g.notes).toContain('instrument resolution not given: borderline not assessed');
  });

  it('ISO 5817:2014 Table 1 row 1.21 (5214), D "unlimited" (limits reference §2, from memory (recalled, unverified)): no limit, no margin, never borderline', () => {
    const seam = requiring(
      buttSeam({
        joint: { type: 'filletT', preparation: 'fillet', sides: 'two', setting: 'shopFlat' },
        nominalThroat: 5,
      }),
      'D',
    );
    const g = rowGradeOf(seam, reading({ throat: 5.05 }), '1.21');
    expect(g.margin).toBeNull();
    expect(g.borderline).toBe(false);
  });
});
