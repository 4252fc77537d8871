// Which ISO 5817:2014 row grades a reading: joint family, side, single-sided joints, circumferential seams and
// prescribed unequal legs. Limits are derived by hand from the limits reference (acceptance-limits.md §2).
import { describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile } from '../../src/domain/index.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';
import { readingGradeOf, rowGradeOf } from '../support/grade-one.js';

const rowIds = (rg: { imperfections: readonly { rowId: string }[] }): string[] =>
  rg.imperfections.map((g) => g.rowId).sort();

describe('toe angle: butt and fillet rows', () => {
  it('ISO 5817:2014 Table 1 row 1.12 (505), butt weld, C α ≥ 110° (limits reference §2, S3): 105° on a butt toe meets D only', () => {
    const g = rowGradeOf(
      buttSeam(),
      reading({ toeAngle: 105 }, { toe: { plate: 1, side: 'face' } }),
      '1.12-butt',
    );
    expect(g.levelMet).toBe('D');
    expect(
      rowIds(readingGradeOf(buttSeam(), reading({ toeAngle: 105 }, { toe: { plate: 1, side: 'face' } }))),
    ).toEqual(['1.12-butt']);
  });

  it('ISO 5817:2014 Table 1 row 1.12 (505), fillet weld, C α ≥ 100° (limits reference §2, S3), B α ≥ 110° (from memory (recalled, unverified)): the same 105° on a fillet toe meets C', () => {
    const r = reading({ toeAngle: 105 }, { toe: { plate: 2, side: 'face' } });
    expect(rowIds(readingGradeOf(filletSeam(), r))).toEqual(['1.12-fillet']);
    expect(rowGradeOf(filletSeam(), r, '1.12-fillet').levelMet).toBe('C');
  });
});

describe('excess weld metal (face) and excess penetration (root)', () => {
  // b = 10: 1.9 B h ≤ 1 + 0.1·b = 2; 1.11 (t = 10 > 3) B h ≤ 1 + 0.2·b = 3, capped at 3.
  it('ISO 5817:2014 Table 1 row 1.9 (502), face side, B h ≤ 1 mm + 0.1·b (limits reference §2, P: S2): h = 2.5 on the face is graded by 1.9 only and misses B', () => {
    const rg = readingGradeOf(
      buttSeam(),
      reading({ reinforcementHeight: 2.5, reinforcementWidth: 10 }, { side: 'face' }),
    );
    expect(rowIds(rg)).toEqual(['1.9']);
    expect(rg.levelMet).toBe('C');
  });

  it('ISO 5817:2014 Table 1 row 1.11 (504), root side, t > 3, B h ≤ 1 mm + 0.2·b, max 3 (limits reference §2, P: S2): the same h = 2.5 at the root is graded by 1.11 only and meets B', () => {
    const rg = readingGradeOf(
      buttSeam(),
      reading({ reinforcementHeight: 2.5, reinforcementWidth: 10 }, { side: 'root' }),
    );
    expect(rowIds(rg)).toEqual(['1.11']);
    expect(rg.levelMet).toBe('B');
  });

  it('ISO 5817:2014 Table 1 row 1.11 (504) (limits reference §2, P: S2): a reading located by a root-side toe counts as root side', () => {
    const rg = readingGradeOf(
      buttSeam(),
      reading({ reinforcementHeight: 2.5, reinforcementWidth: 10 }, { toe: { plate: 1, side: 'root' } }),
    );
    expect(rowIds(rg)).toEqual(['1.11']);
  });

  it('ISO 5817:2014 Table 1 rows 1.9/1.11 (limits reference §2): b is graded with the height, not reported as ungraded', () => {
    const rg = readingGradeOf(
      buttSeam(),
      reading({ reinforcementHeight: 1, reinforcementWidth: 10 }, { side: 'face' }),
    );
    expect(rg.notGraded).toEqual([]);
  });
});

describe('throat deficit and excess', () => {
  // a = 5, t = 10 (> 3): 1.20 B not permitted, C short 0.3 + 0.1·a = 0.8; 1.21 B 1 + 0.15·a = 1.75, C 2.
  it('ISO 5817:2014 Table 1 row 1.20 (5213), t > 3, B not permitted, C 0.3 mm + 0.1·a (limits reference §2, B: S4; C: S5, from memory (recalled, unverified) for 2014): aA = 4.5 under a = 5 is a deficit of 0.5 and no excess', () => {
    const rg = readingGradeOf(filletSeam(), reading({ throat: 4.5 }));
    expect(rowIds(rg)).toEqual(['1.20', '1.21']);
    const deficit = rg.imperfections.find((g) => g.rowId === '1.20');
    const excess = rg.imperfections.find((g) => g.rowId === '1.21');
    expect(deficit?.measured).toBe(0.5);
    expect(deficit?.levelMet).toBe('C');
    expect(excess?.measured).toBe(0);
    expect(excess?.levelMet).toBe('B');
  });

  it('ISO 5817:2014 Table 1 row 1.21 (5214), B h ≤ 1 mm + 0.15·a (limits reference §2, S4), C 1 mm + 0.2·a (S5): aA = 6.9 over a = 5 is an excess of 1.9 and no deficit', () => {
    const rg = readingGradeOf(filletSeam(), reading({ throat: 6.9 }));
    const deficit = rg.imperfections.find((g) => g.rowId === '1.20');
    const excess = rg.imperfections.find((g) => g.rowId === '1.21');
    expect(deficit?.measured).toBe(0);
    expect(deficit?.levelMet).toBe('B');
    expect(excess?.measured).toBe(1.9);
    expect(excess?.levelMet).toBe('C');
  });
});

describe('asymmetry of a fillet weld', () => {
  // a = 5: B h ≤ 1.5 + 0.15·5 = 2.25; legs 9 and 6 differ by 3 → D (D allows 2 + 0.2·5 = 3).
  it('ISO 5817:2014 Table 1 row 1.16 (512), D h ≤ 2 mm + 0.2·a (limits reference §2, S5): equal legs prescribed, legs 9 and 6 → h = 3 meets D', () => {
    const seam = filletSeam({ nominalLegs: { leg1: 7, leg2: 7 } });
    const g = rowGradeOf(seam, reading({ leg1: 9, leg2: 6 }), '1.16');
    expect(g.measured).toBe(3);
    expect(g.levelMet).toBe('D');
  });

  it('ISO 5817:2014 Table 1 row 1.16 (512): "only where asymmetry is not prescribed" (limits reference §2): with unequal nominal legs the row is skipped and both legs are listed as not graded', () => {
    const seam = filletSeam({ nominalLegs: { leg1: 9, leg2: 6 } });
    const rg = readingGradeOf(seam, reading({ leg1: 9, leg2: 6 }));
    expect(rg.imperfections).toEqual([]);
    expect(rg.levelMet).toBeNull();
    expect(rg.notGraded).toEqual(['leg1', 'leg2']);
  });
});

describe('root gap of a fillet weld', () => {
  // t = 10, a = 5: B 0.5 + 0.1·5 = 1.0, C 0.5 + 0.2·5 = 1.5, D 1 + 0.3·5 = 2.5.
  it('ISO 5817:2014 Table 1 row 3.2 (617), t > 3 (limits reference §2, S5, S8): a gap of 1.2 mm meets C, not B', () => {
    const g = rowGradeOf(filletSeam(), reading({ rootGap: 1.2 }), '3.2');
    expect(g.levelMet).toBe('C');
    expect(g.limits.map((l) => [l.level, l.value])).toEqual([
      ['B', 1],
      ['C', 1.5],
      ['D', 2.5],
    ]);
  });
});

describe('linear misalignment: plates and circumferential welds', () => {
  // t = 10: plates B 0.1·t = 1, C 1.5, D 2.5; circumferential 0.5·t = 5 → B max 2, C max 3, D max 4.
  it('ISO 5817:2014 Table 1 row 3.1 (507), plates, t > 3, B h ≤ 0.1·t (limits reference §2, from memory (recalled, unverified)): 1.8 mm on a longitudinal seam meets D only', () => {
    const rg = readingGradeOf(buttSeam(), reading({ linearMisalignment: 1.8 }));
    expect(rowIds(rg)).toEqual(['3.1-plates']);
    expect(rg.levelMet).toBe('D');
  });

  it('ISO 5817:2014 Table 1 row 3.1 (507), circumferential welds, B h ≤ 0.5·t, max 2 (limits reference §2, from memory (recalled, unverified)): the same 1.8 mm on a circumferential seam meets B', () => {
    const rg = readingGradeOf(buttSeam({ circumferential: true }), reading({ linearMisalignment: 1.8 }));
    expect(rowIds(rg)).toEqual(['3.1-circumferential']);
    expect(rg.levelMet).toBe('B');
  });

  it('ISO 5817:2014 Table 1 row 3.1 (507) (limits reference §2): h is the size of the offset, so −1.8 grades as 1.8', () => {
    const g = rowGradeOf(buttSeam(), reading({ linearMisalignment: -1.8 }), '3.1-plates');
    expect(g.measured).toBe(1.8);
    expect(g.levelMet).toBe('D');
  });

  it('misalignment is graded for butt joints only: on a fillet joint it is kept as not graded (limits reference §2, row 3.1 covers plates and tubes of butt welds)', () => {
    const rg = readingGradeOf(filletSeam(), reading({ linearMisalignment: 1 }));
    expect(rg.imperfections).toEqual([]);
    expect(rg.notGraded).toEqual(['linearMisalignment']);
  });
});

describe('incomplete root penetration: single-sided butt welds only', () => {
  // t = 10: D short h ≤ 0.2·t, max 2 → 2.
  it('ISO 5817:2014 Table 1 row 1.6 (4021), "single-side butt welds only", D short h ≤ 0.2·t, max 2 (limits reference §2, P: S1, S2): graded on a single-sided butt weld', () => {
    const g = rowGradeOf(buttSeam(), reading({ incompleteRootPenetration: 1.5 }, { side: 'root' }), '1.6');
    expect(g.levelMet).toBe('D');
    expect(g.governing.value).toBe(0);
  });

  it('ISO 5817:2014 Table 1 row 1.6 (4021) (limits reference §2, P: S1, S2): on a two-sided butt weld the validator refuses the value and the grader does not apply the row', () => {
    const seam = buttSeam({
      joint: { type: 'butt', preparation: 'doubleV', sides: 'two', setting: 'shopFlat' },
    });
    const file = seamFile(seam, [reading({ incompleteRootPenetration: 1.5 }, { side: 'root' })]);
    const parsed = parseSeamFile(file);
    expect(parsed.ok).toBe(false);
    const rg = gradeSeam(file).rounds[0]?.readings[0];
    expect(rg?.imperfections).toEqual([]);
    expect(rg?.notGraded).toEqual(['incompleteRootPenetration']);
  });

  it('ISO 5817:2014 Table 1 row 1.6 (4021) is a root-side imperfection (limits reference §2): recorded on the face side it is not graded', () => {
    const rg = readingGradeOf(buttSeam(), reading({ incompleteRootPenetration: 1.5 }, { side: 'face' }));
    expect(rg.imperfections).toEqual([]);
    expect(rg.notGraded).toEqual(['incompleteRootPenetration']);
  });
});
