// Grades one reading on one seam and picks out what a test is about. Every file graded here is first checked
// by the validator, so an outcome never rests on input the app would refuse.
import { expect } from 'vitest';
import {
  gradeSeam,
  parseSeamFile,
  describeProblems,
  type CriteriaSet,
  type ImperfectionGrade,
  type Level,
  type LevelMet,
  type Reading,
  type ReadingGrade,
  type Seam,
  type SeamFile,
  type SeamGrade,
} from '../../src/domain/index.js';
import { seamFile } from './seam-builder.js';

/** Fails the test with the validator's own words when the file is not one the app would accept. */
export function expectValid(file: SeamFile): void {
  const parsed = parseSeamFile(file);
  expect(parsed.ok ? '' : describeProblems(parsed.problems)).toBe('');
}

export function gradeValid(file: SeamFile, criteria?: CriteriaSet, validate = true): SeamGrade {
  if (validate) expectValid(file);
  return criteria ? gradeSeam(file, criteria) : gradeSeam(file);
}

/** The grade of the single reading in a one-reading file. */
export function readingGradeOf(
  seam: Seam,
  r: Reading,
  criteria?: CriteriaSet,
  validate = true,
): ReadingGrade {
  const g = gradeValid(seamFile(seam, [r]), criteria, validate);
  const rg = g.rounds[0]?.readings[0];
  if (!rg) throw new Error('the round holds no graded reading');
  return rg;
}

/** The grade of one table row for the single reading in a one-reading file. */
export function rowGradeOf(
  seam: Seam,
  r: Reading,
  rowId: string,
  criteria?: CriteriaSet,
  validate = true,
): ImperfectionGrade {
  const rg = readingGradeOf(seam, r, criteria, validate);
  const g = rg.imperfections.find((x) => x.rowId === rowId);
  if (!g) {
    const graded = rg.imperfections.map((x) => x.rowId).join(', ') || 'none';
    throw new Error(`row ${rowId} was not graded for this reading (graded: ${graded})`);
  }
  return g;
}

/** The same seam with another required level. */
export const requiring = (seam: Seam, level: Level): Seam => ({
  ...seam,
  acceptance: { edition: seam.acceptance.edition, level },
});

/** A limit written out by hand from the limits reference: a maximum h, or a minimum angle α. */
export interface HandLimits {
  readonly D: number;
  readonly C: number;
  readonly B: number;
}

/**
 * The level a measured value meets under hand-written limits, nested as ISO 5817 reads (meeting B implies C and
 * D): the best level such that it and every less stringent level pass. Equality passes ("h ≤", "α ≥").
 */
export function expectedLevel(measured: number, limits: HandLimits, angle = false): LevelMet {
  const ok = (l: number) => (angle ? measured >= l : measured <= l);
  if (!ok(limits.D)) return 'belowD';
  if (!ok(limits.C)) return 'D';
  if (!ok(limits.B)) return 'C';
  return 'B';
}

/** A value as an inspector types it: rounded to the micrometre, so a hand sum such as 2.8 + 0.01 stays 2.81. */
export const typed = (x: number): number => Math.round(x * 1e6) / 1e6;
