import {
  levelText,
  PARAMETERS,
  type ImperfectionGrade,
  type ParameterName,
  type ReadingGrade,
  type RoundGrade,
  type SeamGrade,
} from '../../../domain/index.js';

// Words for a grade the worker computed. Nothing here compares a value with a limit: that is the grader's job.

const unitText = (u: 'mm' | 'deg'): string => (u === 'deg' ? '°' : ' mm');
const num = (x: number): string => String(Math.round(x * 1000) / 1000);

export function withUnit(x: number, unit: 'mm' | 'deg'): string {
  return `${num(x)}${unitText(unit)}`;
}

/** The grade of one reading and of its round, from the seam's grade. */
export function findReadingGrade(
  grade: SeamGrade,
  readingId: string,
): { readonly round: RoundGrade; readonly reading: ReadingGrade } | null {
  for (const round of grade.rounds) {
    const reading = round.readings.find((r) => r.readingId === readingId);
    if (reading) return { round, reading };
  }
  return null;
}

/** "governing limit at C: h ≤ 0.1·t, max 0.5 mm = 0.5 mm" */
export function governingText(g: ImperfectionGrade): string {
  const l = g.governing;
  const SHORT = ' (short imperfections only)';
  const text = l.text.replace(SHORT, '');
  // A formula (in t, a, b or s) is followed by its value for this reading; a plain number already is one.
  const formula = /[·\s][tabs]\b/.test(text);
  const value = l.value === null || !formula ? '' : ` = ${withUnit(l.value, g.unit)}`;
  const short = l.shortOnly || l.text.includes(SHORT) ? SHORT : '';
  return `limit at required ${l.level}: ${text}${value}${short}`;
}

/** How far inside (or past) the governing limit the value is. */
export function marginText(g: ImperfectionGrade): string {
  if (g.margin === null) return 'no limit at the required level';
  if (g.margin === 0) return 'exactly on the limit (equal passes)';
  const m = withUnit(Math.abs(g.margin), g.unit);
  return g.margin > 0 ? `${m} inside the limit` : `${m} past the limit`;
}

/** Whether a limit in play for this reading rests on recalled values. */
export const isUnverified = (g: ImperfectionGrade): boolean =>
  g.limits.some((l) => l.status === 'unverified');

// Rows that compare a quantity derived from the reading rather than the value typed.
const DERIVED: Readonly<Record<string, string>> = {
  '1.16': 'leg difference |z1 − z2|',
  '1.20': 'throat short of nominal a by',
  '1.21': 'throat over nominal a by',
  '3.1-plates': 'mid-plane offset |e|',
  '3.1-circumferential': 'mid-plane offset |e|',
};

/** The measured quantity, named the way its table row compares it. */
export function measuredText(g: ImperfectionGrade): string {
  return `${DERIVED[g.rowId] ?? 'measured'} ${withUnit(g.measured, g.unit)}`;
}

/** Values recorded that no quality-level row grades, in words. */
export function notGradedText(names: readonly ParameterName[]): string | null {
  if (!names.length) return null;
  return `${names.map((n) => PARAMETERS[n].meaning).join('; ')}: recorded, not graded against a quality level (kept for the fatigue checks)`;
}

export interface SoFar {
  readonly levelMet: RoundGrade['levelMet'];
  readonly state: 'graded' | 'incomplete' | 'noReadings';
  readonly text: string;
}

/** The current round's standing, in words: provisional while its checklist is open, never a pass. */
export function roundSoFar(grade: SeamGrade, roundNumber: number): SoFar {
  const round = grade.rounds.find((r) => r.round === roundNumber);
  if (!round) return { levelMet: null, state: 'noReadings', text: `round ${roundNumber} has no grade yet` };
  const open = round.checklist.unanswered.length;
  const readings = `${round.readingCount} reading${round.readingCount === 1 ? '' : 's'}`;
  if (round.levelMet === null) {
    return {
      levelMet: null,
      state: round.readingCount ? 'incomplete' : 'noReadings',
      text: `round ${roundNumber}: ${readings}, nothing graded yet`,
    };
  }
  if (!round.complete) {
    return {
      levelMet: round.levelMet,
      state: 'graded',
      text: `round ${roundNumber} so far (${readings}): ${levelText(round.levelMet)} — provisional, ${open} checklist item${open === 1 ? '' : 's'} still to answer`,
    };
  }
  return {
    levelMet: round.levelMet,
    state: 'graded',
    text: `round ${roundNumber} (${readings}, checklist complete): ${levelText(round.levelMet)}`,
  };
}
