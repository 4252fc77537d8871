import { GRADE_CAUTION } from '../caution.js';
import { BUILT_IN_CRITERIA } from '../criteria/registry.js';
import { ISO5817_2023_NOT_HANDLED } from '../criteria/iso5817-2023.js';
import type { CriteriaSet } from '../criteria/types.js';
import { meets, worseLevel, levelRank, type Level, type LevelMet } from '../model/levels.js';
import type { Reading, SeamFile } from '../model/seam-file.js';
import { gradeChecklist, type ChecklistGrade } from './checklist.js';
import {
  gradeReading,
  seamContext,
  type ImperfectionGrade,
  type ReadingGrade,
  type SeamContext,
} from './reading.js';
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
  readonly readings: readonly ReadingGrade[];
  readonly supersededReadings: readonly string[];
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

const relativeMargin = (g: ImperfectionGrade): number => {
  if (g.margin === null) return Infinity;
  const scale = Math.abs(g.governing.value ?? 0);
  return scale > 0 ? g.margin / scale : g.margin;
};

/** Worse spot first: lower level met, then the smaller margin relative to its limit, then position. */
function worseSpot(a: WorstSpot & { rel: number }, b: WorstSpot & { rel: number }): boolean {
  const ra = levelRank(a.levelMet);
  const rb = levelRank(b.levelMet);
  if (ra !== rb) return ra < rb;
  if (a.rel !== b.rel) return a.rel < b.rel;
  if (a.position !== b.position) return a.position < b.position;
  return a.readingId < b.readingId;
}

function spot(r: ReadingGrade, g: ImperfectionGrade): WorstSpot & { rel: number } {
  return {
    readingId: r.readingId,
    position: r.position,
    rowId: g.rowId,
    title: g.title,
    measured: g.measured,
    unit: g.unit,
    levelMet: g.levelMet,
    governingLimit: g.governing.value,
    margin: g.margin,
    borderline: g.borderline,
    rel: relativeMargin(g),
  };
}

const strip = ({ rel: _rel, ...s }: WorstSpot & { rel: number }): WorstSpot => s;

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

function summarise(
  readings: readonly Reading[],
  grades: readonly ReadingGrade[],
  ctx: SeamContext,
  unverified: Set<string>,
): ImperfectionSummary[] {
  const byRow = new Map<string, { g: ImperfectionGrade; r: Reading; rg: ReadingGrade }[]>();
  grades.forEach((rg, i) => {
    for (const g of rg.imperfections) {
      const list = byRow.get(g.rowId) ?? [];
      list.push({ g, r: readings[i] as Reading, rg });
      byRow.set(g.rowId, list);
    }
  });
  const out: ImperfectionSummary[] = [];
  for (const [rowId, entries] of byRow) {
    const first = (entries[0] as (typeof entries)[number]).g;
    let level: LevelMet = 'B';
    let worst: (WorstSpot & { rel: number }) | null = null;
    const unverifiedLevels = new Set<Level>();
    for (const { g, rg } of entries) {
      level = worseLevel(level, g.levelMet);
      const s = spot(rg, g);
      if (!worst || worseSpot(s, worst)) worst = s;
      for (const l of g.limits) if (l.status === 'unverified') unverifiedLevels.add(l.level);
    }
    if (unverifiedLevels.size) unverified.add(rowId);
    // Short-imperfection rule: at each level whose limit permits short imperfections only, the present ones
    // (h > 0 and within the limit) may not add up beyond the allowance in any window.
    const shortRule: ImperfectionSummary['shortRule'][number][] = [];
    for (const level of ['D', 'C', 'B'] as const) {
      const counted = entries.filter(({ g }) => {
        const l = g.limits.find((x) => x.level === level);
        return l !== undefined && l.shortOnly && l.passes && g.measured > 0;
      });
      if (!counted.length) continue;
      const stretches = counted.flatMap(({ r }) => stretchOf(r, ctx.seam.length, ctx.seam.circumferential));
      const check = checkShortRule(stretches, ctx.seam.length, ctx.seam.circumferential);
      const pointReadings = counted.filter(({ r }) => r.start === undefined).length;
      shortRule.push({ ...check, level, pointReadings });
    }
    // A level whose short rule fails is not met, and by nesting neither is any more stringent level.
    for (const check of shortRule) {
      if (!check.passes && levelRank(level) >= levelRank(check.level)) {
        level = check.level === 'D' ? 'belowD' : check.level === 'C' ? 'D' : 'C';
      }
    }
    out.push({
      rowId,
      row: first.row,
      refs: first.refs,
      title: first.title,
      unit: first.unit,
      levelMet: level,
      required: first.required,
      meetsRequired: meets(level, first.required),
      readings: entries.length,
      worst: strip(worst as WorstSpot & { rel: number }),
      shortRule,
      unverifiedLevels: [...unverifiedLevels],
    });
  }
  return out.sort((a, b) => a.rowId.localeCompare(b.rowId, 'en', { numeric: true }));
}

/** Ids of readings replaced by a later correction; the file was validated, so chains end and never loop. */
export function supersededIds(readings: readonly Reading[]): Set<string> {
  const out = new Set<string>();
  for (const r of readings) if (r.supersedes !== undefined) out.add(r.supersedes);
  return out;
}

function gradeRound(
  round: SeamFile['rounds'][number],
  readings: readonly Reading[],
  ctx: SeamContext,
  unverified: Set<string>,
  superseded: readonly string[],
): RoundGrade {
  const grades = readings.map((r) => gradeReading(r, ctx));
  const imperfections = summarise(readings, grades, ctx, unverified);
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
  let worst: (WorstSpot & { rel: number }) | null = null;
  let borderlineCount = 0;
  for (const rg of grades) {
    for (const g of rg.imperfections) {
      if (g.borderline) borderlineCount++;
      const s = spot(rg, g);
      if (!worst || worseSpot(s, worst)) worst = s;
    }
  }
  const complete = checklist.state === 'complete';
  return {
    round: round.number,
    kind: round.kind,
    complete,
    levelMet: level,
    meetsRequired: complete ? ok : null,
    imperfections,
    checklist,
    worst: worst ? strip(worst) : null,
    borderlineCount,
    readings: grades,
    supersededReadings: superseded,
  };
}

/**
 * Grades a validated seam file: each round on its own, the seam by its latest complete round; earlier rounds
 * stay as history so a repaired seam can pass. Pure: the same input gives the same output in any order.
 */
export function gradeSeam(
  file: SeamFile,
  criteria: CriteriaSet = BUILT_IN_CRITERIA[file.seam.acceptance.edition],
): SeamGrade {
  const required = requiredLevels(file.seam);
  const ctx = seamContext(file.seam, criteria.rows, required);
  const superseded = supersededIds(file.readings);
  const unverified = new Set<string>();
  const byRound = new Map<number, Reading[]>();
  const supersededByRound = new Map<number, string[]>();
  // A stable order makes the result independent of the order readings arrive in.
  const ordered = [...file.readings].sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  for (const r of ordered) {
    if (superseded.has(r.id)) {
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
      ),
    );
  const latestComplete = [...rounds].reverse().find((r) => r.complete) ?? null;
  const notes: string[] = [];
  if (required.presetNote) notes.push(required.presetNote);
  if (criteria.edition === 'ISO 5817:2023') notes.push(...ISO5817_2023_NOT_HANDLED);
  for (const r of rounds) {
    if (r.readings.length === 0) notes.push(`round ${r.round} has no readings: only its checklist is graded`);
    const points = r.imperfections.reduce(
      (n, s) => n + s.shortRule.reduce((m, c) => m + c.pointReadings, 0),
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
