import {
  applyVerifiedTable,
  assessSeam,
  BUILT_IN_CRITERIA,
  gradeSeam,
  parseSeamFile,
  type ParseOptions,
  type Problem,
  type SeamAssessment,
  type SeamGrade,
} from '../src/domain/index.js';

export type GradeReply =
  | { readonly ok: true; readonly grade: SeamGrade; readonly assessment: SeamAssessment }
  | { readonly ok: false; readonly problems: Problem[] };

/**
 * What the grading worker exposes. Input crosses the worker boundary as plain data and is validated here,
 * so a caller never gets a grade for a file that failed validation.
 */
export const gradeApi = {
  grade(seamFile: unknown, limitsFile?: unknown, options: ParseOptions = {}): GradeReply {
    const parsed = parseSeamFile(seamFile, options);
    if (!parsed.ok) return { ok: false, problems: parsed.problems };
    let criteria = BUILT_IN_CRITERIA[parsed.value.seam.acceptance.edition];
    if (limitsFile !== undefined) {
      const loaded = applyVerifiedTable(criteria, limitsFile);
      if (!loaded.ok) return { ok: false, problems: loaded.problems };
      criteria = loaded.criteria;
    }
    const grade = gradeSeam(parsed.value, criteria);
    // km, Kt, FAT, life and sampling adequacy ride along with the grade; each part carries the indicative caution.
    return { ok: true, grade, assessment: assessSeam(parsed.value, grade) };
  },
  validate(seamFile: unknown, options: ParseOptions = {}): Problem[] {
    const parsed = parseSeamFile(seamFile, options);
    return parsed.ok ? [] : parsed.problems;
  },
};

export type GradeApi = typeof gradeApi;
