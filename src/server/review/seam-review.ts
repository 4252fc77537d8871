// A seam as the review sees it: the records folded the same way the re-grade folds them, the readings the
// re-grade kept (its leftOut list decides, so the review never disagrees with the stored server grade), graded
// again with the same core and assessed (km, toe ranking, FAT flag, life, sensitivity, sampling adequacy).
import {
  assessSeam,
  gradeSeam,
  parseSeamFile,
  type Problem,
  type SeamAssessment,
  type SeamFile,
  type SeamGrade,
} from '../../domain/index.js';
import { foldSeam, seamFileOf, type FoldedSeam } from '../grading/fold.js';
import { gradeFolded, type GradeSummary } from '../grading/regrade.js';
import type { SeamMaterial, ServerGrade } from '../storage/types.js';

export interface SeamReview {
  readonly folded: FoldedSeam;
  /** The server grade's summary these results agree with (the stored one when current, else computed now). */
  readonly summary: GradeSummary;
  /** Whether the summary is the stored server grade (false: a re-grade was still pending and this one is fresh). */
  readonly stored: boolean;
  readonly file: SeamFile | null;
  readonly grade: SeamGrade | null;
  readonly assessment: SeamAssessment | null;
  readonly problems: readonly Problem[];
}

export interface ReviewOptions {
  /** 'objects' for a page that lists every reading's grade; 'columns' when only summaries are needed. */
  readonly readings: 'objects' | 'columns';
  /** The sensitivity study re-evaluates the assessment per input: only the seam page shows it. */
  readonly sensitivity: boolean;
  /** false: fold and summary only, no grade or assessment (the readings export needs no more). */
  readonly grade?: boolean;
}

export function reviewSeam(
  material: SeamMaterial,
  stored: ServerGrade | undefined,
  options: ReviewOptions,
): SeamReview {
  const folded = foldSeam(material);
  let summary: GradeSummary;
  let fromStore = false;
  if (stored && stored.basedOn === folded.basedOn) {
    summary = JSON.parse(stored.summary) as GradeSummary;
    fromStore = true;
  } else {
    summary = gradeFolded(material).summary;
  }
  const none = { folded, summary, stored: fromStore, file: null, grade: null, assessment: null };
  if (options.grade === false || !folded.seam || !folded.rounds.length || summary.state === 'invalid') {
    return { ...none, problems: summary.problems };
  }
  const left = new Set(summary.leftOut.map((l) => l.recordId));
  const kept = folded.readings.filter((r) => !left.has(r.recordId)).map((r) => r.reading);
  const parsed = parseSeamFile(seamFileOf(folded, kept), { allowNoReadings: true });
  if (!parsed.ok) return { ...none, problems: parsed.problems };
  const grade = gradeSeam(parsed.value, undefined, { readings: options.readings });
  const assessment = assessSeam(parsed.value, grade, { sensitivity: options.sensitivity });
  return { folded, summary, stored: fromStore, file: parsed.value, grade, assessment, problems: [] };
}
