// The demo yard is valid input for the grader and shows every kind of result a user will meet.
import { describe, expect, it } from 'vitest';
import { describeProblems, gradeSeam, parseSeamFile, type SeamGrade } from '../../src/domain/index.js';
import { isDemoId, kestrelPointYard } from '../../src/demo/kestrel-point-yard.js';

function graded(): SeamGrade[] {
  return kestrelPointYard().map((file) => {
    // Strict parse (readings required): each demo seam is a complete file for the grader.
    const parsed = parseSeamFile(file);
    if (!parsed.ok) throw new Error(`${file.seam.id}: ${describeProblems(parsed.problems)}`);
    return gradeSeam(parsed.value);
  });
}

describe('Kestrel Point Yard demo', () => {
  it('has 5 to 7 seams, every one accepted by the grader, all with demo ids and marked as demo', () => {
    const files = kestrelPointYard();
    expect(files.length).toBeGreaterThanOrEqual(5);
    expect(files.length).toBeLessThanOrEqual(7);
    for (const file of files) {
      const parsed = parseSeamFile(file);
      expect(parsed.ok ? '' : describeProblems(parsed.problems)).toBe('');
      expect(isDemoId(file.seam.id)).toBe(true);
      expect(file.readings.every((r) => isDemoId(r.id))).toBe(true);
      expect(file.seam.organisation).toBe('Kestrel Point Yard (demo)');
    }
    expect(new Set(files.map((f) => f.seam.id)).size).toBe(files.length);
    expect(new Set(files.flatMap((f) => f.readings.map((r) => r.id))).size).toBe(
      files.reduce((n, f) => n + f.readings.length, 0),
    );
  });

  it('covers butt and fillet joints, shop and site', () => {
    const joints = kestrelPointYard().map((f) => `${f.seam.joint.type}/${f.seam.joint.setting}`);
    expect(new Set(joints)).toEqual(
      new Set(['butt/shopFlat', 'butt/site', 'filletT/shopFlat', 'filletT/site']),
    );
  });

  it('shows level B, C and D, below D, an incomplete checklist, and a repaired seam that passes', () => {
    const grades = graded();
    const levels = grades.filter((g) => g.state === 'graded').map((g) => g.levelMet);
    expect(levels).toEqual(expect.arrayContaining(['B', 'C', 'D', 'belowD']));
    const incomplete = grades.filter((g) => g.state === 'incomplete');
    expect(incomplete.length).toBeGreaterThanOrEqual(1);
    expect(incomplete.every((g) => g.levelMet === null && g.meetsRequired === null)).toBe(true);
    const repaired = grades.find(
      (g) =>
        g.rounds.length >= 2 &&
        g.rounds[0]?.complete === true &&
        g.rounds[0].meetsRequired === false &&
        g.rounds.at(-1)?.kind === 'afterRepair',
    );
    expect(repaired?.gradedRound).toBe(2);
    expect(repaired?.meetsRequired).toBe(true);
    // The seam below D fails what it requires.
    expect(grades.find((g) => g.levelMet === 'belowD')?.meetsRequired).toBe(false);
  });

  it('shows a correction and a withdrawal, which drop out of the grade but stay listed', () => {
    const grades = graded();
    const superseded = grades.flatMap((g) => g.rounds.flatMap((r) => r.supersededReadings));
    expect(superseded).toEqual(expect.arrayContaining(['demo-kp-014-r04', 'demo-kp-118-r03']));
  });

  it('is pure: the same yard on every call, never shared objects', () => {
    const a = kestrelPointYard();
    const b = kestrelPointYard();
    expect(a).toEqual(b);
    expect(a[0]).not.toBe(b[0]);
    expect(a[0]?.readings[0]).not.toBe(b[0]?.readings[0]);
  });
});
