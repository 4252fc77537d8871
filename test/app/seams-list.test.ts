// The Seams list: one search box over label, tags, drawing and welder; summaries made from the worker's grade.
import { describe, expect, it } from 'vitest';
import { gradeSeam } from '../../src/domain/index.js';
import { matchesSearch, sortSeams } from '../../src/app/components/seam-search.js';
import {
  needsRegrade,
  regradeOrder,
  sameSummary,
  summaryFromGrade,
} from '../../src/app/components/summary.js';
import { requiredLevelOf, requiredText } from '../../src/app/components/required-level.js';
import type { SeamRecord } from '../../src/store/api.js';
import { buttSeam, completeChecklist, reading, seamFile } from '../support/seam-builder.js';

const rec = (
  over: Partial<SeamRecord['seam']>,
  at = '2026-03-01T10:00:00Z',
  summary?: SeamRecord['summary'],
) =>
  ({
    id: over.id ?? 's',
    namespace: 'live',
    seam: buttSeam(over),
    revision: 1,
    createdAt: at,
    updatedAt: at,
    ...(summary ? { summary } : {}),
  }) as SeamRecord;

describe('search', () => {
  const seams = [
    rec({ id: 'a', label: 'Girder 4 web', tags: ['TX-101'], drawing: 'D-200', welder: 'Kovač' }),
    rec({ id: 'b', label: 'Tank shell C3', tags: ['TX-202'], drawing: 'D-310', welder: 'Okafor' }),
  ];
  const find = (q: string) => seams.filter((s) => matchesSearch(s, q)).map((s) => s.id);

  it('finds by a tag linked by scanning', () => {
    expect(
      seams.filter((s) => matchesSearch(s, 'kp-77', s.id === 'b' ? ['KP-77'] : [])).map((s) => s.id),
    ).toEqual(['b']);
  });

  it('finds by label, tag, drawing and welder, ignoring case and accents', () => {
    expect(find('girder')).toEqual(['a']);
    expect(find('tx-202')).toEqual(['b']);
    expect(find('D-310')).toEqual(['b']);
    expect(find('kovac')).toEqual(['a']);
  });

  it('every word must match somewhere; an empty query shows all', () => {
    expect(find('tank okafor')).toEqual(['b']);
    expect(find('tank kovac')).toEqual([]);
    expect(find('   ')).toEqual(['a', 'b']);
  });

  it('lists the most recently changed seam first', () => {
    const old = rec({ id: 'old', label: 'A' }, '2026-01-01T00:00:00Z');
    const recent = rec({ id: 'new', label: 'Z' }, '2026-02-01T00:00:00Z');
    expect(sortSeams([old, recent]).map((s) => s.id)).toEqual(['new', 'old']);
  });
});

describe('summaries', () => {
  it('a graded seam gives its level, verdict and reading count', () => {
    // ISO 5817:2014 row 1.7, t = 10: undercut 0.8 mm meets D only (limits reference §2).
    const g = gradeSeam(
      seamFile(buttSeam(), [reading({ undercutDepth: 0.8 }, { toe: { plate: 1, side: 'face' } })]),
    );
    expect(summaryFromGrade(g, '2026-03-02T00:00:00Z')).toEqual({
      state: 'graded',
      levelMet: 'D',
      meetsRequired: false,
      readingCount: 1,
      gradedAt: '2026-03-02T00:00:00Z',
    });
  });

  it('a seam with an open checklist is incomplete; one with no readings says so', () => {
    const checklist = completeChecklist();
    delete checklist.crack;
    const open = gradeSeam(
      seamFile(
        buttSeam(),
        [reading({ undercutDepth: 0.3 }, { toe: { plate: 1, side: 'face' } })],
        [{ number: 1, kind: 'first', checklist }],
      ),
    );
    expect(summaryFromGrade(open, 'x').state).toBe('incomplete');
    expect(summaryFromGrade(open, 'x').meetsRequired).toBeNull();
    const none = gradeSeam(seamFile(buttSeam(), []));
    expect(summaryFromGrade(none, 'x')).toMatchObject({ state: 'noReadings', readingCount: 0 });
    // ISO 5817:2014 row 1.1: a crack is not permitted at any level, so the checklist alone fails the seam.
    const cracked = completeChecklist();
    cracked.crack = { answer: 'present', position: 40 };
    const failed = gradeSeam(seamFile(buttSeam(), [], [{ number: 1, kind: 'first', checklist: cracked }]));
    expect(summaryFromGrade(failed, 'x')).toMatchObject({
      state: 'graded',
      levelMet: 'belowD',
      meetsRequired: false,
      readingCount: 0,
    });
  });

  it('regrades when the summary is missing or older than the set-up', () => {
    const summary = { state: 'graded', levelMet: 'B', meetsRequired: true, readingCount: 1 } as const;
    expect(needsRegrade(rec({}, '2026-03-01T10:00:00Z'))).toBe(true);
    expect(
      needsRegrade(rec({}, '2026-03-01T10:00:00Z', { ...summary, gradedAt: '2026-03-01T09:00:00Z' })),
    ).toBe(true);
    expect(
      needsRegrade(rec({}, '2026-03-01T10:00:00Z', { ...summary, gradedAt: '2026-03-01T11:00:00Z' })),
    ).toBe(false);
  });

  it('an execution class names its base level and what it relaxes', () => {
    const exc2 = buttSeam({ acceptance: { edition: 'ISO 5817:2014', preset: 'EXC2' } });
    expect(requiredLevelOf(exc2)).toBe('C');
    expect(requiredText(exc2)).toBe('EXC2 (level C, 506, 601, 2025, 5011, 5012 at D)');
    const own = buttSeam({
      acceptance: { edition: 'ISO 5817:2014', level: 'B', overrides: { '5011': 'C' } },
    });
    expect(requiredText(own)).toBe('level B; 5011 at C');
  });
});

describe('keeping the list up to date', () => {
  const summary = {
    state: 'graded',
    levelMet: 'C',
    meetsRequired: true,
    readingCount: 3,
    gradedAt: '2026-03-01T11:00:00Z',
  } as const;

  it('grades seams with a missing or outdated summary first, then the rest', () => {
    const fresh = rec({ id: 'fresh' }, '2026-03-01T10:00:00Z', summary);
    const none = rec({ id: 'none' }, '2026-03-01T10:00:00Z');
    const old = rec({ id: 'old' }, '2026-03-01T12:00:00Z', summary);
    expect(regradeOrder([fresh, none, old]).map((s) => s.id)).toEqual(['none', 'old', 'fresh']);
  });

  it('a summary differing only in when it was made is the same; a new reading count is not', () => {
    expect(sameSummary(summary, { ...summary, gradedAt: '2027-01-01T00:00:00Z' })).toBe(true);
    expect(sameSummary(summary, { ...summary, readingCount: 4 })).toBe(false);
    expect(sameSummary(summary, { ...summary, levelMet: 'D', meetsRequired: false })).toBe(false);
    expect(sameSummary(undefined, summary)).toBe(false);
  });
});
