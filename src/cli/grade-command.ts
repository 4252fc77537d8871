import { readFile, stat } from 'node:fs/promises';
import {
  applyVerifiedTable,
  assessSeam,
  BUILT_IN_CRITERIA,
  describeProblems,
  gradeSeam,
  parseSeamFile,
  type CriteriaSet,
  type Problem,
} from '../domain/index.js';
import { formatAssessment } from './format-assessment.js';
import { formatGrade } from './format-grade.js';

export const MAX_FILE_BYTES = 64 * 1024 * 1024;

export class InputError extends Error {}

async function readJson(path: string, what: string): Promise<unknown> {
  let info;
  try {
    info = await stat(path);
  } catch {
    throw new InputError(`${what} "${path}" cannot be read: no such file, or no permission`);
  }
  if (!info.isFile()) throw new InputError(`${what} "${path}" is not a file`);
  if (info.size > MAX_FILE_BYTES) {
    const mib = (n: number) => (n / 1024 / 1024).toFixed(1);
    throw new InputError(
      `${what} "${path}" is ${mib(info.size)} MiB; at most ${mib(MAX_FILE_BYTES)} MiB is accepted`,
    );
  }
  let text: string;
  try {
    text = (await readFile(path, 'utf8')).replace(/^\uFEFF/, '');
  } catch (e) {
    throw new InputError(`${what} "${path}" cannot be read: ${(e as Error).message}`);
  }
  try {
    return JSON.parse(text) as unknown;
  } catch (e) {
    throw new InputError(`${what} "${path}" is not valid JSON: ${(e as Error).message}`);
  }
}

const problemsError = (what: string, problems: Problem[]): InputError =>
  new InputError(
    `${what} is not valid (${problems.length} problem${problems.length === 1 ? '' : 's'}):\n${describeProblems(problems)}`,
  );

export interface GradeOptions {
  readonly file: string;
  readonly json: boolean;
  readonly limits?: string | undefined;
}

/** Reads, validates and grades one seam file; returns the text to print. Throws InputError on bad input. */
export async function gradeCommand(opts: GradeOptions): Promise<string> {
  const parsed = parseSeamFile(await readJson(opts.file, 'Seam file'));
  if (!parsed.ok) throw problemsError(`Seam file "${opts.file}"`, parsed.problems);
  let criteria: CriteriaSet = BUILT_IN_CRITERIA[parsed.value.seam.acceptance.edition];
  if (opts.limits) {
    const loaded = applyVerifiedTable(criteria, await readJson(opts.limits, 'Limit table'));
    if (!loaded.ok) throw problemsError(`Limit table "${opts.limits}"`, loaded.problems);
    criteria = loaded.criteria;
  }
  const grade = gradeSeam(parsed.value, criteria);
  const assessment = assessSeam(parsed.value, grade);
  return opts.json
    ? JSON.stringify({ ...grade, assessment }, null, 2)
    : `${formatGrade(grade)}\n\n${formatAssessment(assessment)}`;
}
