// Which plate thickness t selects the band and enters the formula. The limits reference (§2, §7 doubt 8) says
// only 507 names "the smaller thickness"; the engine reads t on the plate at the toe for toe imperfections
// (undercut, toe angle, overlap) and the thinner plate otherwise. Limits are derived by hand from §2.
import { describe, expect, it } from 'vitest';
import { parseSeamFile } from '../../src/domain/index.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';
import { rowGradeOf } from '../support/grade-one.js';

// Plate 1 is 3 mm (0.5–3 band), plate 2 is 10 mm (> 3 band).
const unequalButt = buttSeam({ plate1: { thickness: 3 }, plate2: { thickness: 10 } });
const unequalFillet = filletSeam({ plate1: { thickness: 3 }, plate2: { thickness: 10 } });

describe('toe plate for undercut, toe angle and overlap', () => {
  // Undercut h = 0.3: at t = 3, B not permitted and C short h ≤ 0.1·3 = 0.3 → C; at t = 10, B h ≤ 0.05·10 = 0.5 → B.
  it('ISO 5817:2014 Table 1 row 1.7 (5011/5012), t ≤ 3, B not permitted, C h ≤ 0.1·t (limits reference §2, P: S2): undercut 0.3 at the toe on the 3 mm plate meets C', () => {
    const g = rowGradeOf(
      unequalButt,
      reading({ undercutDepth: 0.3 }, { toe: { plate: 1, side: 'face' } }),
      '1.7',
    );
    expect(g.thicknessMm).toBe(3);
    expect(g.levelMet).toBe('C');
  });

  it('ISO 5817:2014 Table 1 row 1.7 (5011/5012), t > 3, B h ≤ 0.05·t, max 0.5 (limits reference §2, P: S2, S4): the same 0.3 at the toe on the 10 mm plate meets B', () => {
    const g = rowGradeOf(
      unequalButt,
      reading({ undercutDepth: 0.3 }, { toe: { plate: 2, side: 'face' } }),
      '1.7',
    );
    expect(g.thicknessMm).toBe(10);
    expect(g.levelMet).toBe('B');
    expect(g.governing.value).toBe(0.5);
  });

  it('ISO 5817:2014 Table 1 row 1.7 on a fillet weld (limits reference §2, P: S2): the toe plate governs there too', () => {
    const onThin = rowGradeOf(
      unequalFillet,
      reading({ undercutDepth: 0.3 }, { toe: { plate: 1, side: 'face' } }),
      '1.7',
    );
    const onThick = rowGradeOf(
      unequalFillet,
      reading({ undercutDepth: 0.3 }, { toe: { plate: 2, side: 'face' } }),
      '1.7',
    );
    expect([onThin.thicknessMm, onThin.levelMet]).toEqual([3, 'C']);
    expect([onThick.thicknessMm, onThick.levelMet]).toEqual([10, 'B']);
  });

  it('ISO 5817:2014 Table 1 row 1.12 (505), butt weld (limits reference §2, C: S3): the toe angle is reported against the plate at its toe', () => {
    const g1 = rowGradeOf(
      unequalButt,
      reading({ toeAngle: 160 }, { toe: { plate: 1, side: 'face' } }),
      '1.12-butt',
    );
    const g2 = rowGradeOf(
      unequalButt,
      reading({ toeAngle: 160 }, { toe: { plate: 2, side: 'root' } }),
      '1.12-butt',
    );
    expect(g1.thicknessMm).toBe(3);
    expect(g2.thicknessMm).toBe(10);
  });

  it('ISO 5817:2014 Table 1 row 1.13 (506), D h ≤ 0.2·b (limits reference §2, from memory (recalled, unverified)): overlap is reported against the plate at its toe', () => {
    const g = rowGradeOf(
      unequalButt,
      reading({ overlap: 1, reinforcementWidth: 10 }, { toe: { plate: 2, side: 'face' } }),
      '1.13',
    );
    expect(g.thicknessMm).toBe(10);
    expect(g.levelMet).toBe('D');
  });
});

describe('thinner plate for the other rows', () => {
  // Shrinkage groove h = 0.3 on plates 3 and 10: t = 3 → B not permitted, C short h ≤ 0.3 → C (at t = 10, B
  // would allow 0.5).
  it('ISO 5817:2014 Table 1 row 1.8 (5013), t ≤ 3, B not permitted (limits reference §2, P: S2): plates 3 and 10 use t = 3', () => {
    const g = rowGradeOf(unequalButt, reading({ shrinkageGroove: 0.3 }, { side: 'root' }), '1.8');
    expect(g.thicknessMm).toBe(3);
    expect(g.levelMet).toBe('C');
  });

  // End crater pipe h = 0.5 on plates 3 and 10: t = 3 → D 0.2·3 = 0.6, C not permitted → D.
  it('ISO 5817:2014 Table 1 row 1.4 (2025), t ≤ 3, C not permitted (limits reference §2, P: S1): plates 3 and 10 use t = 3', () => {
    const g = rowGradeOf(unequalButt, reading({ endCraterDepth: 0.5 }), '1.4');
    expect(g.thicknessMm).toBe(3);
    expect(g.levelMet).toBe('D');
  });

  // Root gap on a fillet: t = 3 selects 0.5–3 band, a = 5: B 0.2 + 0.1·5 = 0.7 (the > 3 band would give 1.0).
  it('ISO 5817:2014 Table 1 row 3.2 (617), t ≤ 3, B h ≤ 0.2 mm + 0.1·a (limits reference §2, from memory (recalled, unverified)): the thinner plate picks the band', () => {
    const g = rowGradeOf(unequalFillet, reading({ rootGap: 0.8 }), '3.2');
    expect(g.thicknessMm).toBe(3);
    expect(g.governing.value).toBe(0.7);
    expect(g.levelMet).toBe('C');
  });

  // Misalignment on plates 10 and 20 (mid-plane reading): t = smaller = 10 → B 0.1·10 = 1, C 1.5 (with 20 B
  // would allow 2).
  it('ISO 5817:2014 Table 1 row 3.1 (507), "t = smaller thickness", B h ≤ 0.1·t (limits reference §2, from memory (recalled, unverified)): plates 10 and 20 use t = 10', () => {
    const seam = buttSeam({ plate1: { thickness: 20 }, plate2: { thickness: 10 } });
    const g = rowGradeOf(
      seam,
      reading({ linearMisalignment: 1.2 }, { misalignmentBasis: 'midPlane' }),
      '3.1-plates',
    );
    expect(g.thicknessMm).toBe(10);
    expect(g.governing.value).toBe(1);
    expect(g.levelMet).toBe('C');
  });

  it('ISO 5817:2014 Table 1 row 1.7 (limits reference §2): an undercut recorded without a toe is refused by the validator, so the toe-plate rule always has a toe to read', () => {
    const r = reading({ undercutDepth: 0.3 }, { side: 'face' });
    expect(parseSeamFile(seamFile(unequalButt, [r])).ok).toBe(false);
    // The rule's fallback (thinner plate) is reached only through unvalidated input; graded unchecked here.
    const g = rowGradeOf(unequalButt, r, '1.7', undefined, false);
    expect(g.thicknessMm).toBe(3);
  });
});
