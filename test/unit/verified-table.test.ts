// Loading an organisation's table checked against a licensed copy (the limits reference asks for every row to be
// checked so before release). The limit values in these tables are made up for the test — they are not the
// standard's — so the tests are about the mechanism: replace, mark verified, or refuse with a specific problem.
import { describe, expect, it } from 'vitest';
import {
  applyVerifiedTable,
  BUILT_IN_CRITERIA,
  LIMITS_FILE_FORMAT,
  type CriteriaSet,
} from '../../src/domain/index.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';
import { gradeValid, requiring, rowGradeOf } from '../support/grade-one.js';

const BASE_2014 = BUILT_IN_CRITERIA['ISO 5817:2014'];

// Test values, not the standard's: the toe-angle row made stricter at C and D.
const toeTable = (over: Record<string, unknown> = {}) => ({
  format: LIMITS_FILE_FORMAT,
  edition: 'ISO 5817:2014',
  name: 'Works table 7',
  verifiedBy: 'A. Checker',
  verifiedOn: '2026-03-01',
  rows: [
    {
      id: '1.12-butt',
      bands: [
        {
          levels: {
            B: { kind: 'minAngle', deg: 150 },
            C: { kind: 'minAngle', deg: 115 },
            D: { kind: 'minAngle', deg: 95 },
          },
        },
      ],
    },
  ],
  ...over,
});

const loaded = (input: unknown, base: CriteriaSet = BASE_2014): CriteriaSet => {
  const res = applyVerifiedTable(base, input);
  if (!res.ok) throw new Error(res.problems.map((p) => `${p.path}: ${p.message}`).join('\n'));
  return res.criteria;
};

const problemsOf = (input: unknown, base: CriteriaSet = BASE_2014) => {
  const res = applyVerifiedTable(base, input);
  expect(res.ok).toBe(false);
  return res.ok ? [] : res.problems;
};

const toe = (alpha: number) => reading({ toeAngle: alpha }, { toe: { plate: 1, side: 'face' } });

describe('a valid table', () => {
  it("replaces the row's limits (test values, not the standard's): 112° meets C under the built-in row 1.12 (ISO 5817:2014 Table 1 row 1.12, C α ≥ 110° — limits reference §2, S3) and D under the loaded α ≥ 115°", () => {
    const seam = requiring(buttSeam(), 'C');
    expect(rowGradeOf(seam, toe(112), '1.12-butt').levelMet).toBe('C');
    const g = rowGradeOf(seam, toe(112), '1.12-butt', loaded(toeTable()));
    expect(g.levelMet).toBe('D');
    expect(g.governing.value).toBe(115);
    expect(g.limits.map((l) => l.status)).toEqual(['verified', 'verified', 'verified']);
    expect(g.governing.source).toBe('Works table 7, verified by A. Checker on 2026-03-01');
  });

  it('marks the row verified: the built-in row 1.12-butt rests partly on a recalled value (D α ≥ 90°, limits reference §2 — from memory (recalled, unverified)) and is listed unverified; after loading it is not', () => {
    const file = seamFile(buttSeam(), [toe(160)]);
    expect(gradeValid(file).unverifiedRows).toEqual(['1.12-butt']);
    const g = gradeValid(file, loaded(toeTable()));
    expect(g.unverifiedRows).toEqual([]);
    expect(g.verifiedTable).toEqual({
      name: 'Works table 7',
      verifiedBy: 'A. Checker',
      verifiedOn: '2026-03-01',
    });
  });

  it('leaves rows the table does not list as they were (row 1.9, b = 10: B 2, C 2.5, D 3.5 — ISO 5817:2014 Table 1 row 1.9, limits reference §2, P: S1, S2)', () => {
    const r = reading({ reinforcementHeight: 1, reinforcementWidth: 10 }, { side: 'face' });
    const g = rowGradeOf(buttSeam(), r, '1.9', loaded(toeTable()));
    expect(g.limits.map((l) => [l.value, l.status])).toEqual([
      [2, 'transcribed'],
      [2.5, 'transcribed'],
      [3.5, 'transcribed'],
    ]);
  });

  it('replaces a two-band row band by band, keeping what the row measures (test values: undercut row 1.7 with B 0.04·t above 3 mm)', () => {
    const table = toeTable({
      rows: [
        {
          id: '1.7',
          bands: [
            {
              tMax: 3,
              levels: {
                B: { kind: 'notPermitted' },
                C: { kind: 'max', t: 0.1, shortOnly: true },
                D: { kind: 'max', t: 0.2, shortOnly: true },
              },
            },
            {
              levels: {
                B: { kind: 'max', t: 0.04, cap: 0.5 },
                C: { kind: 'max', t: 0.1, cap: 0.5 },
                D: { kind: 'max', t: 0.2, cap: 1 },
              },
            },
          ],
        },
      ],
    });
    const undercut = reading({ undercutDepth: 0.45 }, { toe: { plate: 1, side: 'face' } });
    // t = 10: built-in B 0.05·10 = 0.5 → B; loaded B 0.04·10 = 0.4 → C.
    expect(rowGradeOf(buttSeam(), undercut, '1.7').levelMet).toBe('B');
    const g = rowGradeOf(buttSeam(), undercut, '1.7', loaded(table));
    expect(g.governing.value).toBe(0.4);
    expect(g.levelMet).toBe('C');
    expect(g.thicknessMm).toBe(10);
  });

  it('a 2023 table loads onto the 2023 rows', () => {
    const c = loaded(toeTable({ edition: 'ISO 5817:2023' }), BUILT_IN_CRITERIA['ISO 5817:2023']);
    expect(c.edition).toBe('ISO 5817:2023');
  });
});

describe('a table that is refused, with a specific problem (loader checks; no ISO 5817 value involved)', () => {
  it('wrong edition: a 2023 table on 2014 rows', () => {
    const problems = problemsOf(toeTable({ edition: 'ISO 5817:2023' }));
    expect(problems).toEqual([
      { path: 'edition', message: 'the table is for ISO 5817:2023; the seam asks ISO 5817:2014' },
    ]);
  });

  it('unknown row id', () => {
    const problems = problemsOf(
      toeTable({
        rows: [
          {
            id: '9.9',
            bands: [
              {
                levels: {
                  B: { kind: 'notPermitted' },
                  C: { kind: 'notPermitted' },
                  D: { kind: 'unlimited' },
                },
              },
            ],
          },
        ],
      }),
    );
    expect(problems).toHaveLength(1);
    expect(problems[0]?.path).toBe('rows[0].id');
    expect(problems[0]?.message).toMatch(/^unknown row "9\.9"; known rows: .*1\.12-butt/);
  });

  it('missing tMax on a band that is not the last', () => {
    const lv = { B: { kind: 'notPermitted' }, C: { kind: 'notPermitted' }, D: { kind: 'max', t: 0.2 } };
    const problems = problemsOf(toeTable({ rows: [{ id: '1.7', bands: [{ levels: lv }, { levels: lv }] }] }));
    expect(problems).toEqual([
      { path: 'rows[0].bands[0].tMax', message: 'every band but the last needs tMax; the last has none' },
    ]);
  });

  it('tMax on the last band', () => {
    const lv = { B: { kind: 'notPermitted' }, C: { kind: 'notPermitted' }, D: { kind: 'max', t: 0.2 } };
    const problems = problemsOf(toeTable({ rows: [{ id: '1.7', bands: [{ tMax: 3, levels: lv }] }] }));
    expect(problems).toEqual([
      { path: 'rows[0].bands[0].tMax', message: 'every band but the last needs tMax; the last has none' },
    ]);
  });

  it('a negative coefficient', () => {
    const problems = problemsOf(
      toeTable({
        rows: [
          {
            id: '1.9',
            bands: [
              {
                levels: {
                  B: { kind: 'max', c: 1, b: 0.1, cap: 5 },
                  C: { kind: 'max', c: 1, b: -0.15, cap: 7 },
                  D: { kind: 'max', c: 1, b: 0.25, cap: 10 },
                },
              },
            ],
          },
        ],
      }),
    );
    expect(problems).toEqual([{ path: 'rows[0].bands[0].levels.C.b', message: 'must be ≥ 0' }]);
  });

  it('a wrong format tag', () => {
    const problems = problemsOf(toeTable({ format: 'beadbook.limits/0' }));
    expect(problems.map((p) => p.path)).toEqual(['format']);
  });
});
