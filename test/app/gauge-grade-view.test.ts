// Words for a grade the grader computed (the page never grades: the worker calls the same gradeSeam used here).
// Limits: ISO 5817:2014 Table 1 row 1.7 undercut, t = 10 > 3: B 0.05·t max 0.5 → 0.5, C 0.1·t max 0.5 → 0.5,
// D 0.2·t max 1 → 1 (derived from the table, as in test/unit/withdrawal.test.ts).
import { describe, expect, it } from 'vitest';
import { gradeSeam } from '../../src/domain/index.js';
import {
  findReadingGrade,
  governingText,
  isUnverified,
  marginText,
  measuredText,
  notGradedText,
  roundSoFar,
} from '../../src/app/screens/gauge/grade-view.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

const toe = { plate: 1, side: 'face' } as const;
const good = reading({ undercutDepth: 0.2, toeRadius: 1 }, { id: 'good', toe });
const bad = reading({ undercutDepth: 0.8 }, { id: 'bad', toe, position: 300 });
const edge = reading({ undercutDepth: 0.5 }, { id: 'edge', toe, position: 500 });

describe('one reading in words', () => {
  const g = gradeSeam(seamFile(buttSeam(), [good, bad, edge]));

  it('finds the reading and its round', () => {
    const found = findReadingGrade(g, 'bad');
    expect(found?.round.round).toBe(1);
    expect(findReadingGrade(g, 'nope')).toBeNull();
  });

  it('inside the governing limit at required B (0.5 mm): margin 0.3 mm', () => {
    const u = findReadingGrade(g, 'good')?.reading.imperfections.find((x) => x.rowId === '1.7');
    if (!u) throw new Error('row 1.7 not graded');
    expect(u.levelMet).toBe('B');
    expect(marginText(u)).toBe('0.3 mm inside the limit');
    expect(governingText(u)).toMatch(/^limit at required B: .* = 0\.5 mm/);
    expect(measuredText(u)).toBe('measured 0.2 mm');
  });

  it('past the limit: D, 0.3 mm past the B limit', () => {
    const u = findReadingGrade(g, 'bad')?.reading.imperfections[0];
    expect(u?.levelMet).toBe('D');
    expect(u ? marginText(u) : '').toBe('0.3 mm past the limit');
  });

  it('on the limit: equal passes', () => {
    const u = findReadingGrade(g, 'edge')?.reading.imperfections[0];
    expect(u?.levelMet).toBe('B');
    expect(u ? marginText(u) : '').toBe('exactly on the limit (equal passes)');
  });

  it('marks a reading unverified only when a limit in play rests on recalled values', () => {
    // Row 1.7, t > 3: every level read in a reproduction of the table (confidence P: transcribed).
    const u = findReadingGrade(g, 'good')?.reading.imperfections[0];
    if (!u) throw new Error('no grade');
    expect(isUnverified(u)).toBe(false);
    // Row 3.1 for plates: recalled values (limits reference §2, from memory; see test/unit/misalignment-basis.test.ts).
    const m = reading({ linearMisalignment: 0.5 }, { id: 'm' });
    const mg = findReadingGrade(gradeSeam(seamFile(buttSeam(), [m])), 'm')?.reading.imperfections[0];
    if (!mg) throw new Error('no grade');
    expect(mg.rowId).toBe('3.1-plates');
    expect(isUnverified(mg)).toBe(true);
  });

  it('names values no quality-level row grades (toe radius is kept for the fatigue checks)', () => {
    const r = findReadingGrade(g, 'good')?.reading;
    expect(r?.notGraded).toEqual(['toeRadius']);
    expect(notGradedText(r?.notGraded ?? [])).toMatch(/^radius of the toe transition: recorded, not graded/);
  });
});

describe("the round's standing", () => {
  it('is provisional while the checklist is open (design.md §3: a round is complete only when every item is answered)', () => {
    const open = seamFile(
      buttSeam(),
      [bad],
      [{ number: 1, kind: 'first', checklist: { crack: { answer: 'noneFound' } } }],
    );
    const s = roundSoFar(gradeSeam(open), 1);
    expect(s.levelMet).toBe('D');
    expect(s.text).toBe('round 1 so far (1 reading): D — provisional, 9 checklist items still to answer');
  });

  it('states the level of a complete round', () => {
    const s = roundSoFar(gradeSeam(seamFile(buttSeam(), [good])), 1);
    expect(s.text).toBe('round 1 (1 reading, checklist complete): B');
  });
});

describe('the governing limit in words', () => {
  it('gives a formula its value for this reading and says "short imperfections only" once (ISO 5817:2014 row 1.20; a = 5)', () => {
    // Row 1.20 at C: h ≤ 0.3 mm + 0.1·a, max 1 mm, short imperfections only → 0.8 mm for a = 5 (derived from the table).
    const seam = {
      ...buttSeam(),
      joint: { type: 'filletT' as const, sides: 'two' as const, setting: 'shopFlat' as const },
      nominalThroat: 5,
      acceptance: { edition: 'ISO 5817:2014' as const, level: 'C' as const },
    };
    const r = reading({ throat: 4.5 }, { id: 't' });
    const g = findReadingGrade(gradeSeam(seamFile(seam, [r])), 't')?.reading.imperfections.find(
      (x) => x.rowId === '1.20',
    );
    if (!g) throw new Error('row 1.20 not graded');
    const text = governingText(g);
    expect(text.match(/short imperfections only/g)).toHaveLength(1);
    expect(text).toMatch(/^limit at required C: h ≤ .*·a.* = 0\.8 mm \(short imperfections only\)$/);
  });
});
