// Input is checked with the grading core's own rules before anything is written, so the store never holds a
// seam or reading the grader would refuse. Messages name the field and what is allowed.
import * as v from 'valibot';
import {
  CHECKLIST_ITEMS,
  describeProblems,
  parseSeamFile,
  readingSchema,
  roundSchema,
  SEAM_FILE_FORMAT,
  type ChecklistItem,
  type Problem,
  type Reading,
  type Round,
  type Seam,
} from '../domain/index.js';
import type { ChecklistAnswer, RoundRecord } from './api.js';
import { StoreError } from './errors.js';
import { cleanAnswer, cleanExaminer } from './records.js';

const invalid = (what: string, problems: readonly Problem[]) =>
  new StoreError('invalid', `${what} not saved:\n${describeProblems(problems)}`);

const fileOf = (seam: unknown, rounds: readonly Round[], readings: readonly unknown[]) => ({
  format: SEAM_FILE_FORMAT,
  units: { length: 'mm', angle: 'deg' },
  seam,
  rounds,
  readings,
});

const PLACEHOLDER_ROUND: Round = { number: 1, kind: 'first', checklist: {} };

/** The seam set-up, checked alone (its fields and how they relate); returns the validated copy. */
export function checkSeam(seam: unknown): Seam {
  const parsed = parseSeamFile(fileOf(seam, [PLACEHOLDER_ROUND], []), { allowNoReadings: true });
  if (!parsed.ok) throw invalid('Seam', parsed.problems);
  return parsed.value.seam;
}

/** The reading's own shape, before anything is read from the database. */
export function checkReadingShape(reading: unknown): Reading {
  const parsed = v.safeParse(readingSchema, reading, { abortPipeEarly: true });
  if (!parsed.success) {
    throw invalid(
      'Reading',
      parsed.issues.map((i) => ({ path: `reading${pathOf(i.path)}`, message: i.message })),
    );
  }
  return parsed.output as Reading;
}

function pathOf(path: readonly { key: unknown }[] | undefined): string {
  return (path ?? []).map(({ key }) => (typeof key === 'number' ? `[${key}]` : `.${String(key)}`)).join('');
}

/**
 * The reading against its seam, rounds and (for a correction or withdrawal) the reading it supersedes, by the
 * same rules the grader applies to a whole seam file.
 */
export function checkReadingInContext(
  seam: Seam,
  rounds: readonly RoundRecord[],
  reading: Reading,
  superseded: Reading | undefined,
): void {
  if (!rounds.length) {
    throw invalid('Reading', [
      { path: 'reading.round', message: `seam "${seam.id}" has no rounds yet: start its first round` },
    ]);
  }
  // The superseded reading is included only so the reference resolves; it was checked when it was stored.
  const target = superseded ? [withoutSupersedes(superseded)] : [];
  const file = fileOf(seam, rounds.map(toPlainRound), [...target, reading]);
  const parsed = parseSeamFile(file, { allowNoReadings: true });
  if (parsed.ok) return;
  const own = `readings[${target.length}]`;
  const problems = parsed.problems
    .filter((p) => !p.path.startsWith('readings[') || p.path.startsWith(own))
    .map((p) => ({
      path: p.path.replace(own, 'reading'),
      message: p.message
        .replaceAll(own, 'this reading')
        .replace("is not among the file's rounds", 'is not a round of this seam'),
    }));
  if (problems.length) throw invalid('Reading', problems);
}

/** The superseded reading stands alone in the check: its own link back (if any) is not followed. */
function withoutSupersedes(reading: Reading): Reading {
  const copy = { ...reading };
  delete copy.supersedes;
  delete copy.withdrawn;
  return copy;
}

const toPlainRound = (r: RoundRecord): Round => ({ number: r.number, kind: r.kind, checklist: r.checklist });

/** A checklist answer: a known item, a well-formed answer, and a position when something is present. */
export function checkChecklistAnswer(item: ChecklistItem, answer: ChecklistAnswer): ChecklistAnswer {
  if (!(CHECKLIST_ITEMS as readonly string[]).includes(item)) {
    throw new StoreError(
      'invalid',
      `Checklist answer not saved: "${String(item)}" is not a checklist item; items are ${CHECKLIST_ITEMS.join(', ')}`,
    );
  }
  const parsed = v.safeParse(roundSchema, { number: 1, kind: 'first', checklist: { [item]: answer } });
  if (!parsed.success) {
    throw invalid(
      'Checklist answer',
      parsed.issues.map((i) => ({ path: `answer${pathOf(i.path?.slice(2))}`, message: i.message })),
    );
  }
  if (answer.answer === 'present' && answer.position === undefined) {
    throw invalid('Checklist answer', [
      { path: 'answer.position', message: 'is needed when the item is "present": where along the seam (mm)' },
    ]);
  }
  return cleanAnswer(answer);
}

/** A round's examiner, when given. */
export function checkExaminer(examiner: RoundRecord['examiner']): RoundRecord['examiner'] {
  if (examiner === undefined) return undefined;
  const parsed = v.safeParse(roundSchema, { number: 1, kind: 'first', checklist: {}, examiner });
  if (!parsed.success) {
    throw invalid(
      'Round',
      parsed.issues.map((i) => ({ path: pathOf(i.path).slice(1), message: i.message })),
    );
  }
  return cleanExaminer(examiner);
}
