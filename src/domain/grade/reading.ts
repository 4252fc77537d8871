import { LEVELS, type Level, type LevelMet } from '../model/levels.js';
import { PARAMETER_NAMES, type ParameterName } from '../model/parameters.js';
import type { Reading } from '../model/seam-file.js';
import {
  FLAG_BORDERLINE,
  FLAG_NO_RESOLUTION,
  FLAG_NOMINAL_THROAT,
  gradeColumns,
  PARAM_BIT,
  RANK_NONE,
  type GradeColumns,
} from './columns.js';
import { limitsFor, type LimitAtLevel, type SeamContext } from './context.js';

export type { LimitAtLevel, SeamContext } from './context.js';
export { seamContext } from './context.js';

export interface ImperfectionGrade {
  readonly rowId: string;
  readonly row: string;
  readonly refs: readonly string[];
  readonly title: string;
  readonly unit: 'mm' | 'deg';
  readonly measured: number;
  /** Best level whose limit the value meets, before the seam-wide short-imperfection rule. */
  readonly levelMet: LevelMet;
  readonly required: Level;
  readonly meetsRequired: boolean;
  readonly limits: readonly LimitAtLevel[];
  /** The limit at the required level: the one that decides acceptance. */
  readonly governing: LimitAtLevel;
  /** Distance inside the governing limit in the row's unit (negative outside); null when unlimited. */
  readonly margin: number | null;
  readonly borderline: boolean;
  readonly resolution: number | null;
  readonly thicknessMm: number;
  readonly notes: readonly string[];
}

export interface ReadingGrade {
  readonly readingId: string;
  readonly round: number;
  readonly position: number;
  readonly start?: number;
  readonly end?: number;
  readonly sampling: Reading['sampling'];
  readonly toe?: Reading['toe'];
  readonly side?: 'face' | 'root';
  readonly levelMet: LevelMet | null;
  readonly imperfections: readonly ImperfectionGrade[];
  /** Values recorded on the reading that no ISO 5817 row grades (kept for the fatigue checks). */
  readonly notGraded: readonly ParameterName[];
}

export const RANK_LEVEL: readonly LevelMet[] = ['belowD', 'D', 'C', 'B'];

const NOTE_NO_RESOLUTION = 'instrument resolution not given: borderline not assessed';
const NOTE_NOMINAL_THROAT = 'actual throat aA not measured in this reading: nominal a used';
const NO_NOTES: readonly string[] = Object.freeze([]);
// Notes are shared, frozen lists: readings with the same flags carry the same list.
const NOTES: Readonly<Record<number, readonly string[]>> = {
  [FLAG_NO_RESOLUTION]: Object.freeze([NOTE_NO_RESOLUTION]),
  [FLAG_NOMINAL_THROAT]: Object.freeze([NOTE_NOMINAL_THROAT]),
  [FLAG_NO_RESOLUTION | FLAG_NOMINAL_THROAT]: Object.freeze([NOTE_NO_RESOLUTION, NOTE_NOMINAL_THROAT]),
};

/** The display objects of one imperfection entry of the columns. */
export function materialiseEntry(
  cols: GradeColumns,
  e: number,
  r: Reading,
  ctx: SeamContext,
): ImperfectionGrade {
  const set = ctx.limitSets[cols.limitSet[e] as number];
  if (!set) throw new Error(`grade columns refer to an unknown limit set at entry ${e}`);
  const info = ctx.rows[set.rowIndex];
  if (!info) throw new Error(`grade columns refer to an unknown row at entry ${e}`);
  const { row } = info;
  const limits = limitsFor(set, cols.mask[e] as number);
  const levelMet = RANK_LEVEL[cols.rank[e] as number] as LevelMet;
  const flags = cols.flags[e] as number;
  const margin = cols.margin[e] as number;
  const notes = NOTES[flags & (FLAG_NO_RESOLUTION | FLAG_NOMINAL_THROAT)] ?? NO_NOTES;
  return {
    rowId: row.id,
    row: row.row,
    refs: row.refs,
    title: row.title,
    unit: row.unit,
    measured: cols.measured[e] as number,
    levelMet,
    required: info.required,
    meetsRequired: (cols.rank[e] as number) >= LEVELS.length - info.governingIndex,
    limits,
    governing: limits[info.governingIndex] as LimitAtLevel,
    margin: Number.isNaN(margin) ? null : margin,
    borderline: (flags & FLAG_BORDERLINE) !== 0,
    resolution: (row.unit === 'deg' ? r.instrument.resolutionDeg : r.instrument.resolutionMm) ?? null,
    thicknessMm: cols.thickness[e] as number,
    notes,
  };
}

export function materialiseReading(
  cols: GradeColumns,
  ri: number,
  r: Reading,
  ctx: SeamContext,
): ReadingGrade {
  const first = cols.readingFirst[ri] as number;
  const count = cols.readingCount[ri] as number;
  const imperfections: ImperfectionGrade[] = [];
  for (let e = first; e < first + count; e++) imperfections.push(materialiseEntry(cols, e, r, ctx));
  const rank = cols.readingRank[ri] as number;
  const ungraded = (cols.readingPresent[ri] as number) & ~(cols.readingGraded[ri] as number);
  const side = r.toe?.side ?? r.side;
  const grade: { -readonly [K in keyof ReadingGrade]: ReadingGrade[K] } = {
    readingId: r.id,
    round: r.round,
    position: r.position ?? r.start ?? 0,
    sampling: r.sampling,
    levelMet: rank === RANK_NONE ? null : (RANK_LEVEL[rank] as LevelMet),
    imperfections,
    notGraded: PARAMETER_NAMES.filter((n) => (ungraded & PARAM_BIT[n]) !== 0),
  };
  if (r.start !== undefined) grade.start = r.start;
  if (r.end !== undefined) grade.end = r.end;
  if (r.toe) grade.toe = r.toe;
  if (side) grade.side = side;
  return grade;
}

/** Grades one reading against its seam (the same evaluation the seam grade uses, for one reading). */
export function gradeReading(r: Reading, ctx: SeamContext): ReadingGrade {
  return materialiseReading(gradeColumns([r], ctx), 0, r, ctx);
}
