import { describeLimit, limitValue, marginTo, missingInputs, passesLimit } from '../criteria/limit.js';
import { bandFor } from '../criteria/registry.js';
import { limitStatus, type CriterionRow, type LevelLimit, type LimitStatus } from '../criteria/types.js';
import { jointFamily, midPlaneOffset, readingSide, smallerThickness } from '../model/joint.js';
import { LEVELS, worseLevel, meets, type Level, type LevelMet } from '../model/levels.js';
import type { JointFamily, ParameterName } from '../model/parameters.js';
import { PARAMETER_NAMES } from '../model/parameters.js';
import type { Reading, Seam } from '../model/seam-file.js';
import type { RequiredLevels } from './required.js';

export interface LimitAtLevel {
  readonly level: Level;
  /** null when the row sets no limit at this level ("unlimited"). */
  readonly value: number | null;
  readonly text: string;
  readonly shortOnly: boolean;
  readonly passes: boolean;
  readonly status: LimitStatus;
  readonly source: string;
}

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

/** What every reading of one seam shares, computed once per seam. */
export interface SeamContext {
  readonly seam: Seam;
  readonly family: JointFamily;
  readonly tMin: number;
  readonly rowsByParameter: ReadonlyMap<ParameterName, readonly CriterionRow[]>;
  readonly required: RequiredLevels;
  readonly asymmetryPrescribed: boolean;
}

export function seamContext(
  seam: Seam,
  rows: readonly CriterionRow[],
  required: RequiredLevels,
): SeamContext {
  const family = jointFamily(seam.joint.type);
  const byParam = new Map<ParameterName, CriterionRow[]>();
  for (const row of rows) {
    if (row.applies.family !== 'any' && row.applies.family !== family) continue;
    if (row.applies.circumferential !== undefined && row.applies.circumferential !== seam.circumferential)
      continue;
    if (row.applies.singleSidedOnly && seam.joint.sides !== 'one') continue;
    const list = byParam.get(row.parameter) ?? [];
    list.push(row);
    byParam.set(row.parameter, list);
  }
  const legs = seam.nominalLegs;
  return {
    seam,
    family,
    tMin: smallerThickness(seam),
    rowsByParameter: byParam,
    required,
    asymmetryPrescribed: legs !== undefined && legs.leg1 !== legs.leg2,
  };
}

function measuredQuantity(row: CriterionRow, r: Reading, ctx: SeamContext): number | undefined {
  const v = r.values;
  const nominalA = ctx.seam.nominalThroat;
  switch (row.quantity) {
    case 'value':
      return v[row.parameter];
    case 'throatDeficit':
      return v.throat === undefined || nominalA === undefined ? undefined : Math.max(0, nominalA - v.throat);
    case 'throatExcess':
      return v.throat === undefined || nominalA === undefined ? undefined : Math.max(0, v.throat - nominalA);
    case 'legDifference':
      return v.leg1 === undefined || v.leg2 === undefined ? undefined : Math.abs(v.leg1 - v.leg2);
    case 'misalignment': {
      if (v.linearMisalignment === undefined) return undefined;
      const { plate1, plate2 } = ctx.seam;
      const e = midPlaneOffset(
        v.linearMisalignment,
        r.misalignmentBasis ?? 'midPlane',
        plate1.thickness,
        plate2.thickness,
      );
      return Math.abs(e);
    }
  }
}

const round6 = (x: number): number => Math.round(x * 1e6) / 1e6;

function thicknessFor(row: CriterionRow, r: Reading, ctx: SeamContext): number {
  if (row.thickness === 'toePlateElseSmaller' && r.toe) {
    return r.toe.plate === 1 ? ctx.seam.plate1.thickness : ctx.seam.plate2.thickness;
  }
  return ctx.tMin;
}

function gradeRow(
  row: CriterionRow,
  r: Reading,
  ctx: SeamContext,
  measured: number,
): ImperfectionGrade | null {
  const notes: string[] = [];
  const t = thicknessFor(row, r, ctx);
  let a = ctx.seam.nominalThroat;
  if (row.throat === 'actual') {
    if (r.values.throat !== undefined) a = r.values.throat;
    else notes.push('actual throat aA not measured in this reading: nominal a used');
  }
  const inputs = { t, a, b: r.values.reinforcementWidth, s: ctx.seam.buttThickness ?? ctx.tMin };
  const band = bandFor(row, t);
  const limits: LimitAtLevel[] = [];
  for (const level of LEVELS) {
    const l: LevelLimit = band.levels[level];
    const missing = missingInputs(l.limit, inputs);
    if (missing.length) {
      // Validation requires these; a replaced limit table could still ask for a variable the row never had.
      notes.push(`limit at ${level} needs ${missing.join(', ')}, which this reading lacks: not graded`);
      return null;
    }
    const value = limitValue(l.limit, inputs);
    limits.push({
      level,
      value: Number.isFinite(value) ? value : null,
      text: describeLimit(l.limit, row.unit),
      shortOnly: l.limit.kind === 'max' && l.limit.shortOnly === true,
      passes: passesLimit(l.limit, value, measured),
      status: limitStatus(l.confidence),
      source: l.source,
    });
  }
  // Nested levels: a level is met only when every less stringent level is met too.
  let levelMet: LevelMet = 'belowD';
  for (let i = LEVELS.length - 1; i >= 0; i--) {
    if (!(limits[i] as LimitAtLevel).passes) break;
    levelMet = LEVELS[i] as Level;
  }
  const required = ctx.required.forRefs(row.refs);
  const governing = limits[LEVELS.indexOf(required)] as LimitAtLevel;
  const governingExpr = band.levels[required].limit;
  const margin = marginTo(governingExpr, governing.value ?? Infinity, measured);
  const resolution = (row.unit === 'deg' ? r.instrument.resolutionDeg : r.instrument.resolutionMm) ?? null;
  const borderline = margin !== null && resolution !== null && Math.abs(margin) <= resolution + 1e-9;
  if (resolution === null) notes.push('instrument resolution not given: borderline not assessed');
  return {
    rowId: row.id,
    row: row.row,
    refs: row.refs,
    title: row.title,
    unit: row.unit,
    measured: round6(measured),
    levelMet,
    required,
    meetsRequired: meets(levelMet, required),
    limits,
    governing,
    margin,
    borderline,
    resolution,
    thicknessMm: t,
    notes,
  };
}

const usesWidth = (row: CriterionRow): boolean =>
  row.bands.some((b) =>
    LEVELS.some((l) => {
      const e = b.levels[l].limit;
      return e.kind === 'max' && e.b !== undefined;
    }),
  );

export function gradeReading(r: Reading, ctx: SeamContext): ReadingGrade {
  const side = readingSide(r);
  const imperfections: ImperfectionGrade[] = [];
  const graded = new Set<ParameterName>();
  for (const name of PARAMETER_NAMES) {
    if (r.values[name] === undefined) continue;
    const rows = ctx.rowsByParameter.get(name);
    if (!rows) continue;
    for (const row of rows) {
      if (row.applies.side !== undefined && row.applies.side !== side) continue;
      if (row.quantity === 'legDifference' && ctx.asymmetryPrescribed) continue;
      const measured = measuredQuantity(row, r, ctx);
      if (measured === undefined) continue;
      const g = gradeRow(row, r, ctx, measured);
      if (g) {
        imperfections.push(g);
        graded.add(name);
        if (row.quantity === 'legDifference') graded.add('leg2');
        if (usesWidth(row)) graded.add('reinforcementWidth');
      }
    }
  }
  let levelMet: LevelMet | null = null;
  for (const g of imperfections) levelMet = levelMet === null ? g.levelMet : worseLevel(levelMet, g.levelMet);
  const notGraded = PARAMETER_NAMES.filter((n) => r.values[n] !== undefined && !graded.has(n));
  const position = r.position ?? r.start ?? 0;
  return {
    readingId: r.id,
    round: r.round,
    position,
    ...(r.start !== undefined ? { start: r.start } : {}),
    ...(r.end !== undefined ? { end: r.end } : {}),
    sampling: r.sampling,
    ...(r.toe ? { toe: r.toe } : {}),
    ...(side ? { side } : {}),
    levelMet,
    imperfections,
    notGraded,
  };
}
