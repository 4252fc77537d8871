// The entry-check worker's logic (workers/entry-check-api.ts), run in this process: a new reading checked in
// constant time finds exactly what parseSeamFile finds in the whole file with that reading appended, and the
// copy the worker extends one reading at a time grades exactly like gradeSeam on the whole seam.
import { describe, expect, it } from 'vitest';
import {
  gradeSeam,
  parseSeamFile,
  type Reading,
  type Round,
  type SeamFile,
  type SeamGrade,
} from '../../src/domain/index.js';
import { findReadingGrade } from '../../src/app/screens/gauge/grade-view.js';
import { checkEntry, createEntryCheckApi, entryContext } from '../../workers/entry-check-api.js';
import { buttSeam, completeChecklist, filletSeam, reading, seamFile } from '../support/seam-builder.js';

const toe1 = { plate: 1, side: 'face' } as const;
const toe2 = { plate: 2, side: 'face' } as const;

function wholeFileProblems(file: SeamFile, r: Reading) {
  const parsed = parseSeamFile({ ...file, readings: [...file.readings, r] }, { allowNoReadings: true });
  return parsed.ok ? [] : parsed.problems;
}

const byPath = (a: { path: string; message: string }, b: { path: string; message: string }) =>
  `${a.path} ${a.message}`.localeCompare(`${b.path} ${b.message}`);

const twoRounds: Round[] = [
  { number: 1, kind: 'first', checklist: completeChecklist() },
  { number: 2, kind: 'afterRepair', checklist: {} },
];
const base = seamFile(
  buttSeam(),
  [
    reading({ toeAngle: 150 }, { id: 'old', toe: toe1 }),
    reading({ toeAngle: 120 }, { id: 'fixed', toe: toe2, position: 300 }),
    reading({ toeAngle: 160 }, { id: 'fix', toe: toe2, position: 300, supersedes: 'fixed' }),
    reading({ undercutDepth: 0.2 }, { id: 'r2', toe: toe1, round: 2 }),
  ],
  twoRounds,
);
const noThroat = filletSeam();
delete (noThroat as { nominalThroat?: number }).nominalThroat;

const cases: [string, SeamFile, Reading][] = [
  ['a valid reading', base, reading({ toeAngle: 160 }, { id: 'n', toe: toe2 })],
  ['a toe angle out of range', base, reading({ toeAngle: 75 }, { id: 'n', toe: toe2 })],
  ['a position past the end', base, reading({ toeAngle: 160 }, { id: 'n', position: 1200, toe: toe2 })],
  ['a height without its width', base, reading({ reinforcementHeight: 2 }, { id: 'n', side: 'face' })],
  ['a toe value without a toe', base, reading({ undercutDepth: 0.2 }, { id: 'n' })],
  ['a reused id', base, reading({ toeAngle: 160 }, { id: 'old', toe: toe2 })],
  ['an unknown round', base, reading({ toeAngle: 160 }, { id: 'n', toe: toe2, round: 3 })],
  ['a correction', base, reading({ toeAngle: 100 }, { id: 'n', toe: toe1, supersedes: 'old' })],
  ['a correction of a corrected reading', base, reading({ toeAngle: 100 }, { id: 'n', supersedes: 'fixed' })],
  ['a correction across rounds', base, reading({ toeAngle: 100 }, { id: 'n', toe: toe1, supersedes: 'r2' })],
  ['a correction of nothing', base, reading({ toeAngle: 100 }, { id: 'n', toe: toe1, supersedes: 'gone' })],
  ['a withdrawal', base, reading({}, { id: 'n', supersedes: 'old', withdrawn: true })],
  [
    'a withdrawal with values',
    base,
    reading({ toeAngle: 100 }, { id: 'n', supersedes: 'old', withdrawn: true }),
  ],
  ['a fillet seam without a throat', seamFile(noThroat, []), reading({ throat: 4 }, { id: 'n' })],
];

describe('checking one new reading against its seam', () => {
  it.each(cases)('%s: the same problems as validating the whole file', (_, file, r) => {
    const found = checkEntry(entryContext(file), r, file.readings.length);
    expect([...found].sort(byPath)).toEqual([...wholeFileProblems(file, r)].sort(byPath));
  });

  it('finds nothing wrong with the valid reading and names the field of a bad one', () => {
    const [, file, good] = cases[0] as [string, SeamFile, Reading];
    expect(checkEntry(entryContext(file), good, 4)).toEqual([]);
    const [, , bad] = cases[1] as [string, SeamFile, Reading];
    expect(checkEntry(entryContext(base), bad, 4).map((p) => p.path)).toEqual([
      'readings[4].values.toeAngle',
    ]);
  });
});

/** The grade without per-reading grades, as the worker returns it. */
function standingOf(grade: SeamGrade): SeamGrade {
  return { ...grade, rounds: grade.rounds.map((r) => ({ ...r, readings: [] })) };
}

function valid(file: SeamFile): SeamFile {
  const parsed = parseSeamFile(file, { allowNoReadings: true });
  if (!parsed.ok) throw new Error(parsed.problems.map((p) => `${p.path}: ${p.message}`).join('\n'));
  return parsed.value;
}

describe('the copy the Gauge screen extends', () => {
  const api = createEntryCheckApi();
  const start = valid(seamFile(buttSeam({ acceptance: { edition: 'ISO 5817:2014', level: 'C' } }), []));
  const entries: Reading[] = [
    reading({ toeAngle: 155 }, { id: 'e1', toe: toe1, position: 10 }),
    reading({ toeAngle: 105 }, { id: 'e2', toe: toe2, position: 20 }),
    reading({ undercutDepth: 0.7 }, { id: 'e3', toe: toe1, position: 30 }),
    reading({ undercutDepth: 0.3 }, { id: 'e4', toe: toe1, position: 30, supersedes: 'e3' }),
    reading({}, { id: 'e5', position: 20, supersedes: 'e2', withdrawn: true }),
  ];

  it('grades each added reading, and the seam so far, as gradeSeam grades the whole seam', () => {
    const opened = api.open(start, null);
    expect(opened).toEqual({ ok: true, standing: standingOf(gradeSeam(start)), reading: null });
    let file = start;
    for (const r of entries) {
      const reply = api.update(
        { seam: file.seam, rounds: file.rounds, base: file.readings.length, added: [r] },
        r.id,
      );
      file = valid({ ...file, readings: [...file.readings, r] });
      const whole = gradeSeam(file);
      expect(reply).toEqual({
        ok: true,
        standing: standingOf(whole),
        reading: findReadingGrade(whole, r.id)?.reading ?? null,
      });
    }
    const last = api.update({ seam: file.seam, rounds: file.rounds, base: 5, added: [] }, 'e4');
    if (last.ok !== true) throw new Error('expected a grade');
    // ISO 5817:2014 row 1.7 (undercut), t = 10 mm: B allows h ≤ 0.05·t, max 0.5 mm = 0.5 mm, so the correction
    // to 0.3 mm meets B.
    expect(last.reading?.levelMet).toBe('B');
    expect(last.standing.rounds[0]?.readingCount).toBe(2);
  });

  it('asks for the whole seam again when the count, or the seam, is not the one it holds', () => {
    api.open(start, null);
    const r = reading({ toeAngle: 150 }, { id: 'x1', toe: toe1 });
    expect(api.update({ seam: start.seam, rounds: start.rounds, base: 3, added: [r] })).toEqual({
      ok: 'resync',
    });
    const other = buttSeam({ id: 'seam-2' });
    expect(api.update({ seam: other, rounds: start.rounds, base: 0, added: [] })).toEqual({ ok: 'resync' });
  });

  it('re-checks the whole seam when its rounds changed, and grades the answered checklist', () => {
    const file = valid(
      seamFile(
        buttSeam(),
        [reading({ toeAngle: 155 }, { id: 'c1', toe: toe1 })],
        [{ number: 1, kind: 'first', checklist: {} }],
      ),
    );
    const opened = api.open(file, null);
    expect(opened.ok === true && opened.standing.state).toBe('incomplete');
    const rounds: Round[] = [{ number: 1, kind: 'first', checklist: completeChecklist() }];
    const reply = api.update({ seam: file.seam, rounds, base: 1, added: [] });
    expect(reply).toEqual({
      ok: true,
      standing: standingOf(gradeSeam({ ...file, rounds })),
      reading: null,
    });
  });

  it('refuses a reading the seam does not allow, and then wants the seam whole again', () => {
    api.open(start, null);
    const bad = reading({ toeAngle: 150 }, { id: 'b1', position: 5000, toe: toe1 });
    const reply = api.update({ seam: start.seam, rounds: start.rounds, base: 0, added: [bad] });
    expect(reply).toEqual({
      ok: false,
      problems: [
        { path: 'readings[0].position', message: "lies beyond the seam's length of 1000 mm; got 5000" },
      ],
    });
    expect(api.update({ seam: start.seam, rounds: start.rounds, base: 0, added: [] })).toEqual({
      ok: 'resync',
    });
  });

  it('gives a seam standing without keeping a copy, and refuses what the validator refuses', () => {
    const file = valid(seamFile(buttSeam(), [reading({ toeAngle: 155 }, { id: 's1', toe: toe1 })]));
    expect(api.standing(file)).toEqual({ ok: true, standing: standingOf(gradeSeam(file)) });
    const refused = api.standing({ ...file, readings: [{ ...file.readings[0], round: 0 }] });
    expect(refused.ok).toBe(false);
  });
});
