import type { SeamGrade } from '../../domain/index.js';
import type { SeamRecord, SeamSummary } from '../../store/api.js';

/** Current readings (not corrected, not withdrawn) over every round of a grade. */
export function currentReadingCount(grade: SeamGrade): number {
  return grade.rounds.reduce((n, r) => n + r.readingCount, 0);
}

/**
 * The cached line the Seams list shows, made from a grade the worker computed. A seam without gauge readings
 * says so rather than show a level from its checklist alone, unless the checklist already fails it.
 */
export function summaryFromGrade(grade: SeamGrade, gradedAt: string): SeamSummary {
  const readingCount = currentReadingCount(grade);
  return {
    state: readingCount === 0 && grade.meetsRequired !== false ? 'noReadings' : grade.state,
    levelMet: grade.levelMet,
    meetsRequired: grade.meetsRequired,
    readingCount,
    gradedAt,
  };
}

/** A summary is stale when missing or older than the last saved change of the seam. */
export function needsRegrade(rec: SeamRecord): boolean {
  return rec.summary === undefined || rec.summary.gradedAt < rec.updatedAt;
}

/** Same level, verdict, state and count: no need to write the cache again. */
export function sameSummary(a: SeamSummary | undefined, b: SeamSummary): boolean {
  return (
    a !== undefined &&
    a.state === b.state &&
    a.levelMet === b.levelMet &&
    a.meetsRequired === b.meetsRequired &&
    a.readingCount === b.readingCount
  );
}

/** Seams whose summary is surely out of date first, then the rest (readings and answers do not touch updatedAt). */
export function regradeOrder(seams: readonly SeamRecord[]): SeamRecord[] {
  return [...seams.filter(needsRegrade), ...seams.filter((s) => !needsRegrade(s))];
}
