import { GRADE_CAUTION } from '../caution.js';
import { BUILT_IN_CRITERIA } from '../criteria/registry.js';
import { ISO5817_2023_NOT_HANDLED } from '../criteria/iso5817-2023.js';
import type { CriteriaSet, LimitStatus } from '../criteria/types.js';
import { LEVELS, meets, worseLevel, levelRank, type Level, type LevelMet } from '../model/levels.js';
import type { Reading, SeamFile } from '../model/seam-file.js';
import { gradeChecklist, type ChecklistGrade } from './checklist.js';
import { FLAG_BORDERLINE, gradeColumns, type GradeColumns } from './columns.js';
import { seamContext, type LimitSet, type RowInfo, type SeamContext } from './context.js';
import { materialiseEntry, materialiseReading, RANK_LEVEL, type ReadingGrade } from './reading.js';
import { requiredLevels } from './required.js';
import { checkShortRule, type ShortRuleCheck, type Stretch } from './short-rule.js';

export interface ImperfectionSummary {
  readonly rowId: string;
  readonly row: string;
  readonly refs: readonly string[];
  readonly title: string;
  readonly unit: 'mm' | 'deg';
  readonly levelMet: LevelMet;
  readonly required: Level;
  readonly meetsRequired: boolean;
  readonly readings: number;
  /** The reading closest to, or furthest past, its governing limit. */
  readonly worst: WorstSpot;
  /** Short-imperfection rule per level where the row permits short imperfections only. */
  readonly shortRule: readonly (ShortRuleCheck & { readonly level: Level; readonly pointReadings: number })[];
  readonly unverifiedLevels: readonly Level[];
  /** The weakest status among the limits in play: unverified, transcribed, or verified when all were loaded checked. */
  readonly limitStatus: LimitStatus;
}

export interface WorstSpot {
  readonly readingId: string;
  readonly position: number;
  readonly rowId: string;
  readonly title: string;
  readonly measured: number;
  readonly unit: 'mm' | 'deg';
  readonly levelMet: LevelMet;
  readonly governingLimit: number | null;
  readonly margin: number | null;
  readonly borderline: boolean;
}

export interface RoundGrade {
  readonly round: number;
  readonly kind: string;
  readonly complete: boolean;
  /** Level met over readings and checklist; an incomplete round is provisional, never a pass. */
  readonly levelMet: LevelMet | null;
  readonly meetsRequired: boolean | null;
  readonly imperfections: readonly ImperfectionSummary[];
  readonly checklist: ChecklistGrade;
  readonly worst: WorstSpot | null;
  readonly borderlineCount: number;
  readonly readingCount: number;
  /** Per-reading grades as objects; empty when the grade was asked for in columns. */
  readonly readings: readonly ReadingGrade[];
  /** Per-reading grades in columns, with the reading ids in column order (only with `readings: 'columns'`). */
  readonly columns?: GradeColumns;
  readonly readingIds?: readonly string[];
  readonly supersededReadings: readonly string[];
}

export interface GradeOptions {
  /** 'objects' (default): per-reading grades as objects; 'columns': typed-array columns for bulk imports. */
  readonly readings?: 'objects' | 'columns';
}

export interface SeamGrade {
  readonly seamId: string;
  readonly label: string;
  readonly edition: string;
  readonly verifiedTable: CriteriaSet['verifiedTable'] | null;
  /** Row ids whose limits in play rest on recalled values. */
  readonly unverifiedRows: readonly string[];
  readonly state: 'graded' | 'incomplete';
  /** The round the seam's grade comes from: its latest complete round. */
  readonly gradedRound: number | null;
  readonly levelMet: LevelMet | null;
  readonly requiredLevel: Level;
  readonly meetsRequired: boolean | null;
  readonly rounds: readonly RoundGrade[];
  readonly notes: readonly string[];
  readonly caution: string;
}

/** Ordering of spots, worst first: lower level met, then the smaller margin relative to its limit, then position. */
interface SpotKey {
  readonly rank: number;
  readonly rel: number;
  readonly position: number;
  readonly readingId: string;
}

function isWorse(a: SpotKey, b: SpotKey): boolean {
  if (a.rank !== b.rank) return a.rank < b.rank;
  if (a.rel !== b.rel) return a.rel < b.rel;
  if (a.position !== b.position) return a.position < b.position;
  return a.readingId < b.readingId;
}

function stretchOf(r: Reading, seamLength: number, circumferential: boolean): Stretch[] {
  if (r.start === undefined || r.end === undefined) {
    const p = r.position ?? 0;
    return [{ start: p, end: p }];
  }
  if (r.end >= r.start) return [{ start: r.start, end: r.end }];
  // Validation allows end < start only on a circumferential seam: the imperfection runs past the start mark.
  return circumferential
    ? [
        { start: r.start, end: seamLength },
        { start: 0, end: r.end },
      ]
    : [];
}

interface RowAccumulator {
  readonly info: RowInfo;
  rank: number;
  count: number;
  worstKey: SpotKey;
  worstEntry: number;
  lastSet: number;
  readonly unverified: Set<Level>;
  allVerified: boolean;
  /** Readings of present imperfections within a short-only limit, per level index. */
  readonly shortCounted: (number[] | undefined)[];
}

/** The margin relative to the governing limit (Infinity when unlimited): how close to failing an entry is. */
function relativeMargin(cols: GradeColumns, e: number, set: LimitSet, info: RowInfo): number {
  const margin = cols.margin[e] as number;
  const scale = Math.abs(set.values[info.governingIndex] as number);
  return Number.isNaN(margin) ? Infinity : scale > 0 && Number.isFinite(scale) ? margin / scale : margin;
}

function keyOf(cols: GradeColumns, e: number, r: Reading, ctx: SeamContext): SpotKey {
  const set = ctx.limitSets[cols.limitSet[e] as number] as LimitSet;
  const info = ctx.rows[set.rowIndex] as RowInfo;
  const rel = relativeMargin(cols, e, set, info);
  return { rank: cols.rank[e] as number, rel, position: r.position ?? r.start ?? 0, readingId: r.id };
}

function accumulate(
  readings: readonly Reading[],
  cols: GradeColumns,
  ctx: SeamContext,
): { rows: RowAccumulator[]; borderline: number } {
  // By row index, and in the order rows were first met (the order the summaries are built in).
  const byRow: (RowAccumulator | undefined)[] = new Array<RowAccumulator | undefined>(ctx.rows.length);
  const rows: RowAccumulator[] = [];
  let borderline = 0;
  for (let e = 0; e < cols.size; e++) {
    const ri = cols.reading[e] as number;
    const r = readings[ri] as Reading;
    const setIndex = cols.limitSet[e] as number;
    const set = ctx.limitSets[setIndex] as LimitSet;
    const rank = cols.rank[e] as number;
    if ((cols.flags[e] as number) & FLAG_BORDERLINE) borderline++;
    let acc = byRow[set.rowIndex];
    if (!acc) {
      acc = {
        info: ctx.rows[set.rowIndex] as RowInfo,
        rank,
        count: 0,
        worstKey: keyOf(cols, e, r, ctx),
        worstEntry: e,
        lastSet: -1,
        unverified: new Set(),
        allVerified: true,
        shortCounted: [],
      };
      byRow[set.rowIndex] = acc;
      rows.push(acc);
    }
    acc.count++;
    if (rank < acc.rank) acc.rank = rank;
    // Only an entry that could be the worst gets its key built, and only a worse one keeps it (isWorse, unrolled).
    const w = acc.worstKey;
    if (rank < w.rank) {
      acc.worstKey = keyOf(cols, e, r, ctx);
      acc.worstEntry = e;
    } else if (rank === w.rank) {
      const rel = relativeMargin(cols, e, set, acc.info);
      const position = r.position ?? r.start ?? 0;
      if (
        rel < w.rel ||
        (rel === w.rel && (position < w.position || (position === w.position && r.id < w.readingId)))
      ) {
        acc.worstKey = { rank, rel, position, readingId: r.id };
        acc.worstEntry = e;
      }
    }
    // Limit sets are shared between readings with the same inputs: inspect each distinct one once.
    // A plain loop: a callback here made a closure per entry, tens of megabytes on a large import.
    if (setIndex !== acc.lastSet) {
      acc.lastSet = setIndex;
      for (let i = 0; i < set.byLevel.length; i++) {
        const status = (set.byLevel[i] as (typeof set.byLevel)[number])[0].status;
        if (status === 'unverified') acc.unverified.add(LEVELS[i] as Level);
        if (status !== 'verified') acc.allVerified = false;
      }
    }
    if ((cols.measured[e] as number) > 0) {
      for (let i = 0; i < LEVELS.length; i++) {
        // Present and within a short-only limit at a level the reading meets: it counts toward that allowance.
        if (set.shortOnly[i] && rank >= LEVELS.length - i) (acc.shortCounted[i] ??= []).push(ri);
      }
    }
  }
  return { rows, borderline };
}

function spotOf(cols: GradeColumns, e: number, r: Reading, ctx: SeamContext): WorstSpot {
  const g = materialiseEntry(cols, e, r, ctx);
  return {
    readingId: r.id,
    position: r.position ?? r.start ?? 0,
    rowId: g.rowId,
    title: g.title,
    measured: g.measured,
    unit: g.unit,
    levelMet: g.levelMet,
    governingLimit: g.governing.value,
    margin: g.margin,
    borderline: g.borderline,
  };
}

function summarise(
  acc: RowAccumulator,
  readings: readonly Reading[],
  cols: GradeColumns,
  ctx: SeamContext,
): ImperfectionSummary {
  const shortRule: ImperfectionSummary['shortRule'][number][] = [];
  for (let i = LEVELS.length - 1; i >= 0; i--) {
    const counted = acc.shortCounted[i];
    if (!counted?.length) continue;
    const list = counted.map((ri) => readings[ri] as Reading);
    const stretches = list.flatMap((r) => stretchOf(r, ctx.seam.length, ctx.seam.circumferential));
    const check = checkShortRule(stretches, ctx.seam.length, ctx.seam.circumferential);
    const pointReadings = list.filter((r) => r.start === undefined).length;
    shortRule.push({ ...check, level: LEVELS[i] as Level, pointReadings });
  }
  let level = RANK_LEVEL[acc.rank] as LevelMet;
  // A level whose short rule fails is not met, and by nesting neither is any more stringent level.
  for (const check of shortRule) {
    if (!check.passes && levelRank(level) >= levelRank(check.level)) {
      level = check.level === 'D' ? 'belowD' : check.level === 'C' ? 'D' : 'C';
    }
  }
  const { row, required } = acc.info;
  return {
    rowId: row.id,
    row: row.row,
    refs: row.refs,
    title: row.title,
    unit: row.unit,
    levelMet: level,
    required,
    meetsRequired: meets(level, required),
    readings: acc.count,
    worst: spotOf(cols, acc.worstEntry, readings[cols.reading[acc.worstEntry] as number] as Reading, ctx),
    shortRule,
    unverifiedLevels: LEVELS.filter((l) => acc.unverified.has(l)),
    limitStatus: acc.unverified.size ? 'unverified' : acc.allVerified ? 'verified' : 'transcribed',
  };
}

/** Ids of readings replaced by a later correction; the file was validated, so chains end and never loop. */
export function supersededIds(readings: readonly Reading[]): Set<string> {
  const out = new Set<string>();
  // Index loops over the readings here and in gradeSeam: they run once per grade, before the engine optimises
  // them, and an iterator then makes an object per reading.
  for (let i = 0; i < readings.length; i++) {
    const replaced = (readings[i] as Reading).supersedes;
    if (replaced !== undefined) out.add(replaced);
  }
  return out;
}

function gradeRound(
  round: SeamFile['rounds'][number],
  readings: readonly Reading[],
  ctx: SeamContext,
  unverified: Set<string>,
  superseded: readonly string[],
  detail: GradeOptions['readings'],
): RoundGrade {
  const cols = gradeColumns(readings, ctx);
  const { rows, borderline } = accumulate(readings, cols, ctx);
  const imperfections: ImperfectionSummary[] = [];
  let worst: { key: SpotKey; spot: WorstSpot } | null = null;
  for (const acc of rows) {
    const summary = summarise(acc, readings, cols, ctx);
    imperfections.push(summary);
    if (summary.unverifiedLevels.length) unverified.add(summary.rowId);
    if (!worst || isWorse(acc.worstKey, worst.key)) worst = { key: acc.worstKey, spot: summary.worst };
  }
  imperfections.sort((a, b) => a.rowId.localeCompare(b.rowId, 'en', { numeric: true }));
  const checklist = gradeChecklist(round.checklist, ctx.tMin, ctx.required);
  let level: LevelMet | null = null;
  let ok = true;
  for (const s of imperfections) {
    level = level === null ? s.levelMet : worseLevel(level, s.levelMet);
    ok &&= s.meetsRequired;
  }
  for (const item of checklist.items) {
    if (item.levelMet === null) continue;
    level = level === null ? item.levelMet : worseLevel(level, item.levelMet);
    ok &&= item.meetsRequired === true;
  }
  const complete = checklist.state === 'complete';
  const grade: RoundGrade = {
    round: round.number,
    kind: round.kind,
    complete,
    levelMet: level,
    meetsRequired: complete ? ok : null,
    imperfections,
    checklist,
    worst: worst?.spot ?? null,
    borderlineCount: borderline,
    readingCount: readings.length,
    readings: detail === 'columns' ? [] : readings.map((r, i) => materialiseReading(cols, i, r, ctx)),
    supersededReadings: superseded,
  };
  return detail === 'columns' ? { ...grade, columns: cols, readingIds: readings.map((r) => r.id) } : grade;
}

/**
 * Grades a validated seam file: each round on its own, the seam by its latest complete round; earlier rounds
 * stay as history so a repaired seam can pass. Pure: the same input gives the same output in any order.
 */
export function gradeSeam(
  file: SeamFile,
  criteria: CriteriaSet = BUILT_IN_CRITERIA[file.seam.acceptance.edition],
  options: GradeOptions = {},
): SeamGrade {
  const required = requiredLevels(file.seam);
  const ctx = seamContext(file.seam, criteria.rows, required);
  const superseded = supersededIds(file.readings);
  const unverified = new Set<string>();
  const byRound = new Map<number, Reading[]>();
  const supersededByRound = new Map<number, string[]>();
  // A stable order makes the result independent of the order readings arrive in.
  const ordered = [...file.readings].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  // The common case, one round with nothing withdrawn or replaced, keeps the sorted list as it is.
  const first = ordered[0];
  let oneRound = first !== undefined && superseded.size === 0;
  for (let i = 0; oneRound && i < ordered.length; i++) {
    const r = ordered[i] as Reading;
    oneRound = r.round === first?.round && !r.withdrawn;
  }
  if (oneRound && first) byRound.set(first.round, ordered);
  for (let i = 0; !oneRound && i < ordered.length; i++) {
    const r = ordered[i] as Reading;
    if (r.withdrawn) continue;
    if (superseded.size > 0 && superseded.has(r.id)) {
      supersededByRound.set(r.round, [...(supersededByRound.get(r.round) ?? []), r.id]);
      continue;
    }
    const list = byRound.get(r.round) ?? [];
    list.push(r);
    byRound.set(r.round, list);
  }
  const rounds = [...file.rounds]
    .sort((a, b) => a.number - b.number)
    .map((round) =>
      gradeRound(
        round,
        byRound.get(round.number) ?? [],
        ctx,
        unverified,
        supersededByRound.get(round.number) ?? [],
        options.readings,
      ),
    );
  const latestComplete = [...rounds].reverse().find((r) => r.complete) ?? null;
  const notes: string[] = [];
  if (required.presetNote) notes.push(required.presetNote);
  if (criteria.edition === 'ISO 5817:2023') notes.push(...ISO5817_2023_NOT_HANDLED);
  for (const r of rounds) {
    if (r.readingCount === 0) notes.push(`round ${r.round} has no readings: only its checklist is graded`);
    const points = r.imperfections.reduce(
      (n, s) => n + Math.max(0, ...s.shortRule.map((c) => c.pointReadings)),
      0,
    );
    if (points)
      notes.push(
        `round ${r.round}: ${points} reading(s) of imperfections limited to short lengths have no start and end; they count as zero length in the short-imperfection rule`,
      );
  }
  if (!latestComplete) notes.push('no round has a complete checklist: the seam is incomplete, not passed');
  return {
    seamId: file.seam.id,
    label: file.seam.label,
    edition: criteria.edition,
    verifiedTable: criteria.verifiedTable ?? null,
    unverifiedRows: [...unverified].sort(),
    state: latestComplete ? 'graded' : 'incomplete',
    gradedRound: latestComplete?.round ?? null,
    levelMet: latestComplete?.levelMet ?? null,
    requiredLevel: required.base,
    meetsRequired: latestComplete?.meetsRequired ?? null,
    rounds,
    notes,
    caution: GRADE_CAUTION,
  };
}
