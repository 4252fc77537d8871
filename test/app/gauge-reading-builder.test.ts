// The form → Reading step and the undo records. Every reading built here is put through the validator the store
// and grader use (parseSeamFile), so a test never passes on a record the app would refuse.
import { describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile, type Reading } from '../../src/domain/index.js';
import { EMPTY_ANGULAR, EMPTY_LINEAR } from '../../src/app/screens/gauge/misalignment-entry.js';
import {
  buildReading,
  buildRestore,
  buildWithdrawal,
  draftValuesOf,
  newReadingId,
  type EntryDraft,
} from '../../src/app/screens/gauge/reading-builder.js';
import { buttSeam, filletSeam, seamFile } from '../support/seam-builder.js';
import { describeProblems } from '../../src/domain/index.js';

const seam = buttSeam(); // t1 = t2 = 10, length 1000, required B
const draft = (over: Partial<EntryDraft>): EntryDraft => ({
  fields: ['toeAngle', 'toeRadius'],
  values: {},
  linear: EMPTY_LINEAR,
  angular: EMPTY_ANGULAR,
  where: { plate: 2, side: 'face' },
  runsAlong: false,
  position: 150,
  start: undefined,
  end: undefined,
  sampling: 'atPitch',
  ...over,
});
const ctx = (id: string, over: object = {}) => ({
  id,
  round: 1,
  seam,
  instrument: {
    id: 'TG-03',
    kind: 'toeGauge' as const,
    resolutionMm: 0.1,
    resolutionDeg: 1,
    calibratedOn: '2026-06-02',
  },
  recordedAt: '2026-11-19T08:22:00Z',
  ...over,
});
function built(d: EntryDraft, c = ctx('r1')): Reading {
  const b = buildReading(d, c);
  if (!b.ok) throw new Error(JSON.stringify(b.problems));
  return b.reading;
}
function expectValid(readings: Reading[], s = seam): void {
  const parsed = parseSeamFile(seamFile(s, readings), { allowNoReadings: true });
  expect(parsed.ok ? '' : describeProblems(parsed.problems)).toBe('');
}

describe('building a reading from the form', () => {
  it('a toe-gauge reading names its toe and instrument and is a gauge reading (docs/seam-file.md readings[])', () => {
    const r = built(
      draft({ values: { toeAngle: 148, toeRadius: 1.2 } }),
      ctx('r1', { examiner: { name: 'R. O.' } }),
    );
    expect(r).toEqual({
      id: 'r1',
      seamId: 'seam-1',
      round: 1,
      position: 150,
      sampling: 'atPitch',
      toe: { plate: 2, side: 'face' },
      values: { toeAngle: 148, toeRadius: 1.2 },
      instrument: {
        id: 'TG-03',
        kind: 'toeGauge',
        resolutionMm: 0.1,
        resolutionDeg: 1,
        calibratedOn: '2026-06-02',
      },
      source: { kind: 'gauge' },
      recordedAt: '2026-11-19T08:22:00Z',
      examiner: { name: 'R. O.' },
    });
    expectValid([r]);
  });

  it('records only the fields on screen', () => {
    const r = built(draft({ fields: ['toeAngle'], values: { toeAngle: 150, undercutDepth: 0.4 } }));
    expect(r.values).toEqual({ toeAngle: 150 });
  });

  it('a side value gets the side and no toe; a toe value with a side value gets both, agreeing (validator rule)', () => {
    const side = built(
      draft({ fields: ['rootConcavity'], values: { rootConcavity: 0.3 }, where: { plate: 1, side: 'root' } }),
    );
    expect(side.side).toBe('root');
    expect(side.toe).toBeUndefined();
    const both = built(
      draft({
        fields: ['undercutDepth', 'rootConcavity'],
        values: { undercutDepth: 0.2, rootConcavity: 0.3 },
        where: { plate: 1, side: 'root' },
      }),
      ctx('r2'),
    );
    expect(both.toe).toEqual({ plate: 1, side: 'root' });
    expect(both.side).toBe('root');
    expectValid([side, both]);
  });

  it('a fillet-gauge reading carries neither toe nor side', () => {
    const fillet = filletSeam();
    const r = built(
      draft({ fields: ['throat', 'leg1', 'leg2'], values: { throat: 4.6, leg1: 6.5, leg2: 6.5 } }),
      ctx('f1', { seam: fillet }),
    );
    expect(r.toe).toBeUndefined();
    expect(r.side).toBeUndefined();
    expectValid([r], fillet);
  });

  it('runs along the seam: start and end instead of a position', () => {
    const r = built(
      draft({
        fields: ['undercutDepth'],
        values: { undercutDepth: 0.3 },
        runsAlong: true,
        position: 150,
        start: 150,
        end: 190,
      }),
    );
    expect(r.position).toBeUndefined();
    expect([r.start, r.end]).toEqual([150, 190]);
    expectValid([r]);
  });

  it('says what is missing, per field', () => {
    expect(buildReading(draft({ values: {} }), ctx('x'))).toEqual({
      ok: false,
      problems: { form: 'enter at least one value before saving' },
    });
    const noPos = buildReading(draft({ values: { toeAngle: 150 }, position: undefined }), ctx('x'));
    expect(noPos.ok ? null : Object.keys(noPos.problems)).toEqual(['position']);
    const noEnd = buildReading(
      draft({
        fields: ['undercutDepth'],
        values: { undercutDepth: 0.3 },
        runsAlong: true,
        start: 10,
        end: undefined,
      }),
      ctx('x'),
    );
    expect(noEnd.ok ? null : Object.keys(noEnd.problems)).toEqual(['end']);
  });

  it('a correction keeps its round and supersedes the reading it corrects; the grade uses the correction', () => {
    const first = built(draft({ fields: ['undercutDepth'], values: { undercutDepth: 0.8 } }), ctx('a'));
    const fix = built(
      draft({ fields: ['undercutDepth'], values: { undercutDepth: 0.2 } }),
      ctx('b', { supersedes: 'a', recordedAt: '2026-11-19T08:30:00Z' }),
    );
    expect(fix.supersedes).toBe('a');
    expectValid([first, fix]);
    // ISO 5817:2014 Table 1 row 1.7, t = 10: B limit 0.5 (derived from the table; recalled rows as in the core tests).
    const g = gradeSeam(seamFile(seam, [first, fix]));
    expect(g.rounds[0]?.readings.map((r) => r.readingId)).toEqual(['b']);
    expect(g.rounds[0]?.supersededReadings).toEqual(['a']);
    expect(g.rounds[0]?.readings[0]?.levelMet).toBe('B');
  });

  it('puts a stored reading back into the form values (misalignment goes to its own controls)', () => {
    const r = built(draft({ values: { toeAngle: 150, toeRadius: 1 } }));
    expect(draftValuesOf(r)).toEqual({ toeAngle: 150, toeRadius: 1 });
  });

  it('ids are random UUID based and fit the record (at most 64 characters)', () => {
    const id = newReadingId(() => '0190c6f2-7b1e-7c3a-9a4e-2f1d5c6b7a80');
    expect(id).toBe('rd-0190c6f2-7b1e-7c3a-9a4e-2f1d5c6b7a80');
    expect(id.length).toBeLessThanOrEqual(64);
  });
});

describe('undo records: nothing is deleted', () => {
  const a = built(draft({ fields: ['undercutDepth'], values: { undercutDepth: 0.8 } }), ctx('a'));
  const stamp = { id: 'w', recordedAt: '2026-11-19T09:00:00Z' };

  it('a withdrawal supersedes the reading, carries no values, passes validation and leaves the reading on record', () => {
    const w = buildWithdrawal(a, stamp);
    expect(w).toMatchObject({ id: 'w', round: 1, supersedes: 'a', withdrawn: true, values: {} });
    expectValid([a, w]);
    const g = gradeSeam(seamFile(seam, [a, w]));
    expect(g.rounds[0]?.readingCount).toBe(0);
    expect(g.rounds[0]?.supersededReadings).toEqual(['a']);
  });

  it('undoing a correction records the corrected values again, superseding the correction', () => {
    const fix = built(
      draft({ fields: ['undercutDepth'], values: { undercutDepth: 0.2 } }),
      ctx('b', { supersedes: 'a' }),
    );
    const back = buildRestore(a, fix, { ...stamp, id: 'c' });
    expect(back).toMatchObject({ id: 'c', supersedes: 'b', values: { undercutDepth: 0.8 }, toe: a.toe });
    expectValid([a, fix, back]);
    const g = gradeSeam(seamFile(seam, [a, fix, back]));
    expect(g.rounds[0]?.readings.map((r) => r.readingId)).toEqual(['c']);
    expect(g.rounds[0]?.readings[0]?.imperfections[0]?.measured).toBe(0.8);
  });
});
