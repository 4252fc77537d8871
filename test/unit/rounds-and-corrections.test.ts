// Rounds and corrections: a seam is graded by its latest complete round, earlier rounds stay as history, and a
// correction replaces the reading it supersedes. Limits: ISO 5817:2014 Table 1 row 1.7 (5011/5012 undercut),
// t = 10 > 3: B h ≤ 0.05·t = 0.5, C h ≤ 0.1·t → max 0.5, D h ≤ 0.2·t → max 1 (limits reference §2, P: S2, S3, S4,
// S6). So 0.3 meets B, 0.8 meets D only, 1.5 is below D.
import { describe, expect, it } from 'vitest';
import type { Reading, Round } from '../../src/domain/index.js';
import { buttSeam, completeChecklist, reading, seamFile } from '../support/seam-builder.js';
import { gradeValid } from '../support/grade-one.js';

const SRC =
  'ISO 5817:2014 Table 1 row 1.7, t > 3, B h ≤ 0.05·t, max 0.5; D h ≤ 0.2·t, max 1 (limits reference §2, P: S2)';

const undercut = (h: number, over: Partial<Reading> = {}): Reading =>
  reading({ undercutDepth: h }, { toe: { plate: 1, side: 'face' }, ...over });

const round = (number: number, kind: Round['kind'], complete = true): Round => {
  const checklist = completeChecklist();
  if (!complete) delete checklist.spatter;
  return { number, kind, checklist };
};

describe('rounds', () => {
  it(`${SRC}: round 1 fails (0.8 → D), round 2 after repair passes (0.3 → B): the seam passes on round 2 and round 1 is kept`, () => {
    const g = gradeValid(
      seamFile(
        buttSeam(),
        [undercut(0.8, { round: 1 }), undercut(0.3, { round: 2 })],
        [round(1, 'first'), round(2, 'afterRepair')],
      ),
    );
    expect(g.state).toBe('graded');
    expect(g.gradedRound).toBe(2);
    expect(g.levelMet).toBe('B');
    expect(g.meetsRequired).toBe(true);
    expect(g.rounds.map((r) => [r.round, r.kind, r.levelMet, r.meetsRequired])).toEqual([
      [1, 'first', 'D', false],
      [2, 'afterRepair', 'B', true],
    ]);
  });

  it(`${SRC}: a later incomplete round (3, below D so far) does not replace the latest complete round`, () => {
    const g = gradeValid(
      seamFile(
        buttSeam(),
        [undercut(0.8, { round: 1 }), undercut(0.3, { round: 2 }), undercut(1.5, { round: 3 })],
        [round(1, 'first'), round(2, 'afterRepair'), round(3, 'additional', false)],
      ),
    );
    expect(g.gradedRound).toBe(2);
    expect(g.levelMet).toBe('B');
    expect(g.meetsRequired).toBe(true);
    const r3 = g.rounds[2];
    expect(r3?.complete).toBe(false);
    expect(r3?.meetsRequired).toBeNull();
    expect(r3?.levelMet).toBe('belowD'); // provisional, shown but not the seam's grade
  });

  it(`${SRC}: a failing complete round after a passing one is the seam's grade (the latest complete round governs, not the best)`, () => {
    const g = gradeValid(
      seamFile(
        buttSeam(),
        [undercut(0.3, { round: 1 }), undercut(0.8, { round: 2 })],
        [round(1, 'first'), round(2, 'additional')],
      ),
    );
    expect(g.gradedRound).toBe(2);
    expect(g.levelMet).toBe('D');
    expect(g.meetsRequired).toBe(false);
  });

  it(`${SRC}: when only round 1 is complete and it fails, the seam fails even though an incomplete round 2 looks fine`, () => {
    const g = gradeValid(
      seamFile(
        buttSeam(),
        [undercut(0.8, { round: 1 }), undercut(0.3, { round: 2 })],
        [round(1, 'first'), round(2, 'afterRepair', false)],
      ),
    );
    expect(g.gradedRound).toBe(1);
    expect(g.levelMet).toBe('D');
    expect(g.meetsRequired).toBe(false);
  });

  it(`${SRC}: rounds are graded in number order whatever order the file lists them in`, () => {
    const g = gradeValid(
      seamFile(
        buttSeam(),
        [undercut(0.3, { round: 2 }), undercut(0.8, { round: 1 })],
        [round(2, 'afterRepair'), round(1, 'first')],
      ),
    );
    expect(g.rounds.map((r) => r.round)).toEqual([1, 2]);
    expect(g.gradedRound).toBe(2);
  });

  it('a round with no readings is graded on its checklist alone, with a note', () => {
    const g = gradeValid(
      seamFile(buttSeam(), [undercut(0.8, { round: 1 })], [round(1, 'first'), round(2, 'afterRepair')]),
    );
    expect(g.gradedRound).toBe(2);
    expect(g.levelMet).toBe('B');
    expect(g.notes).toContain('round 2 has no readings: only its checklist is graded');
  });
});

describe('corrections', () => {
  it(`${SRC}: a correction replaces the reading it supersedes (0.8 corrected to 0.3 → B) and the superseded id is listed`, () => {
    const wrong = undercut(0.8, { id: 'reading-a' });
    const fixed = undercut(0.3, { id: 'reading-b', supersedes: 'reading-a' });
    const g = gradeValid(seamFile(buttSeam(), [wrong, fixed]));
    const r1 = g.rounds[0];
    expect(r1?.readings.map((r) => r.readingId)).toEqual(['reading-b']);
    expect(r1?.supersededReadings).toEqual(['reading-a']);
    expect(g.levelMet).toBe('B');
    expect(g.meetsRequired).toBe(true);
  });

  it(`${SRC}: a correction can make the grade worse (0.3 corrected to 0.8 → D)`, () => {
    const first = undercut(0.3, { id: 'reading-a' });
    const fixed = undercut(0.8, { id: 'reading-b', supersedes: 'reading-a' });
    const g = gradeValid(seamFile(buttSeam(), [first, fixed]));
    expect(g.levelMet).toBe('D');
  });

  it(`${SRC}: a chain of corrections keeps only the last one; every replaced id is listed`, () => {
    const a = undercut(1.5, { id: 'reading-a' });
    const b = undercut(0.8, { id: 'reading-b', supersedes: 'reading-a' });
    const c = undercut(0.3, { id: 'reading-c', supersedes: 'reading-b' });
    const g = gradeValid(seamFile(buttSeam(), [c, a, b]));
    expect(g.rounds[0]?.readings.map((r) => r.readingId)).toEqual(['reading-c']);
    expect([...(g.rounds[0]?.supersededReadings ?? [])].sort()).toEqual(['reading-a', 'reading-b']);
    expect(g.levelMet).toBe('B');
  });

  it(`${SRC}: corrections stay in their round — a corrected reading in round 1 does not touch round 2`, () => {
    const g = gradeValid(
      seamFile(
        buttSeam(),
        [
          undercut(1.5, { id: 'reading-a', round: 1 }),
          undercut(0.8, { id: 'reading-b', round: 1, supersedes: 'reading-a' }),
          undercut(0.3, { id: 'reading-c', round: 2 }),
        ],
        [round(1, 'first'), round(2, 'afterRepair')],
      ),
    );
    expect(g.rounds[0]?.supersededReadings).toEqual(['reading-a']);
    expect(g.rounds[0]?.levelMet).toBe('D');
    expect(g.rounds[1]?.supersededReadings).toEqual([]);
    expect(g.levelMet).toBe('B');
  });
});
