import {
  applyVerifiedTable,
  BUILT_IN_CRITERIA,
  gradeSeam,
  parseSeamFile,
  type ParseOptions,
  type Problem,
  type SeamGrade,
} from '../src/domain/index.js';

export type GradeReply =
  { readonly ok: true; readonly grade: SeamGrade } | { readonly ok: false; readonly problems: Problem[] };

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
    return { ok: true, grade: gradeSeam(parsed.value, criteria) };
  },
  validate(seamFile: unknown, options: ParseOptions = {}): Problem[] {
    const parsed = parseSeamFile(seamFile, options);
    return parsed.ok ? [] : parsed.problems;
  },
};

export type GradeApi = typeof gradeApi;
