import { describeLimit, limitValue, missingInputs, type LimitInputs } from '../criteria/limit.js';
import { bandFor } from '../criteria/registry.js';
import {
  limitStatus,
  type CriterionRow,
  type LevelLimit,
  type LimitExpr,
  type LimitStatus,
} from '../criteria/types.js';
import { jointFamily, midPlaneOffset, smallerThickness } from '../model/joint.js';
import { LEVELS, type Level } from '../model/levels.js';
import type { JointFamily, ParameterName } from '../model/parameters.js';
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

/** The limits of one row for one set of formula inputs, shared by every reading that has those inputs. */
export interface LimitSet {
  readonly index: number;
  readonly rowIndex: number;
  /** [level][passes ? 1 : 0]: the limit at B, C, D as reported with a pass or a fail. */
  readonly byLevel: readonly (readonly [LimitAtLevel, LimitAtLevel])[];
  readonly values: readonly number[];
  readonly exprs: readonly LimitExpr[];
  readonly shortOnly: readonly boolean[];
  readonly anyUnverified: boolean;
  /** Bit i set when the limit at LEVELS[i] is a minimum (an angle to reach) rather than a maximum. */
  readonly atLeast: number;
  /** Bit i set when the row sets no limit at LEVELS[i]. */
  readonly unlimited: number;
  /** Reported arrays, one per pass pattern (bit i set when LEVELS[i] passes), built on first use. */
  readonly patterns: (readonly LimitAtLevel[] | undefined)[];
  readonly missing: string | null;
}

export interface RowInfo {
  readonly index: number;
  readonly row: CriterionRow;
  readonly required: Level;
  /** Index of the required level in LEVELS: the level whose limit governs acceptance. */
  readonly governingIndex: number;
  readonly usesWidth: boolean;
  readonly memo: Map<number, Map<number, Map<number, Map<number, LimitSet>>>>;
  /** The limit sets last asked for (keys as in memo): an import's readings mostly share a few of them. */
  readonly recent: RecentSets;
}

const RECENT = 16;

/** A small round-robin cache in front of the memo: a width-dependent limit takes a set per width in use. */
export interface RecentSets {
  readonly t: Float64Array;
  readonly a: Float64Array;
  readonly b: Float64Array;
  readonly sets: (LimitSet | null)[];
  size: number;
  /** The slot last hit, tried first; the slot to fill next once all are used. */
  last: number;
  next: number;
}

const recentSets = (): RecentSets => ({
  t: new Float64Array(RECENT),
  a: new Float64Array(RECENT),
  b: new Float64Array(RECENT),
  sets: new Array<LimitSet | null>(RECENT).fill(null),
  size: 0,
  last: 0,
  next: 0,
});

/** What every reading of one seam shares, computed once per seam. */
export interface SeamContext {
  readonly seam: Seam;
  readonly family: JointFamily;
  readonly tMin: number;
  readonly s: number;
  readonly rowsByParameter: ReadonlyMap<ParameterName, readonly RowInfo[]>;
  readonly rows: readonly RowInfo[];
  readonly limitSets: LimitSet[];
  readonly required: RequiredLevels;
  readonly asymmetryPrescribed: boolean;
}

const usesWidth = (row: CriterionRow): boolean =>
  row.bands.some((b) =>
    LEVELS.some((l) => {
      const e = b.levels[l].limit;
      return e.kind === 'max' && e.b !== undefined;
    }),
  );

export function seamContext(
  seam: Seam,
  rows: readonly CriterionRow[],
  required: RequiredLevels,
): SeamContext {
  const family = jointFamily(seam.joint.type);
  const byParam = new Map<ParameterName, RowInfo[]>();
  const infos: RowInfo[] = [];
  for (const row of rows) {
    if (row.applies.family !== 'any' && row.applies.family !== family) continue;
    if (row.applies.circumferential !== undefined && row.applies.circumferential !== seam.circumferential)
      continue;
    if (row.applies.singleSidedOnly && seam.joint.sides !== 'one') continue;
    const req = required.forRefs(row.refs);
    const info: RowInfo = {
      index: infos.length,
      row,
      required: req,
      governingIndex: LEVELS.indexOf(req),
      usesWidth: usesWidth(row),
      memo: new Map(),
      recent: recentSets(),
    };
    infos.push(info);
    const list = byParam.get(row.parameter) ?? [];
    list.push(info);
    byParam.set(row.parameter, list);
  }
  const legs = seam.nominalLegs;
  const tMin = smallerThickness(seam);
  return {
    seam,
    family,
    tMin,
    s: seam.buttThickness ?? tMin,
    rowsByParameter: byParam,
    rows: infos,
    limitSets: [],
    required,
    asymmetryPrescribed: legs !== undefined && legs.leg1 !== legs.leg2,
  };
}

export function measuredQuantity(row: CriterionRow, r: Reading, ctx: SeamContext): number | undefined {
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
      const basis = r.misalignmentBasis ?? 'midPlane';
      return Math.abs(midPlaneOffset(v.linearMisalignment, basis, plate1.thickness, plate2.thickness));
    }
  }
}

export function thicknessFor(row: CriterionRow, r: Reading, ctx: SeamContext): number {
  if (row.thickness === 'toePlateElseSmaller' && r.toe) {
    return r.toe.plate === 1 ? ctx.seam.plate1.thickness : ctx.seam.plate2.thickness;
  }
  return ctx.tMin;
}

function buildLimitSet(info: RowInfo, inputs: LimitInputs, index: number): LimitSet {
  const { row } = info;
  const band = bandFor(row, inputs.t);
  const byLevel: [LimitAtLevel, LimitAtLevel][] = [];
  const values: number[] = [];
  const exprs: LimitExpr[] = [];
  const shortOnly: boolean[] = [];
  let anyUnverified = false;
  let atLeast = 0;
  let unlimited = 0;
  for (const level of LEVELS) {
    const l: LevelLimit = band.levels[level];
    const missing = missingInputs(l.limit, inputs);
    if (missing.length) {
      // Validation requires these; a replaced limit table could still ask for a variable the row never had.
      const why = `limit at ${level} needs ${missing.join(', ')}, which this reading lacks: not graded`;
      return {
        index,
        rowIndex: info.index,
        byLevel: [],
        values: [],
        exprs: [],
        shortOnly: [],
        anyUnverified,
        atLeast: 0,
        unlimited: 0,
        patterns: [],
        missing: why,
      };
    }
    const value = limitValue(l.limit, inputs);
    const status = limitStatus(l.confidence);
    const short = l.limit.kind === 'max' && l.limit.shortOnly === true;
    const base = {
      level,
      value: Number.isFinite(value) ? value : null,
      text: describeLimit(l.limit, row.unit),
      shortOnly: short,
      status,
      source: l.source,
    };
    byLevel.push([
      { ...base, passes: false },
      { ...base, passes: true },
    ]);
    if (l.limit.kind === 'minAngle') atLeast |= 1 << values.length;
    if (l.limit.kind === 'unlimited') unlimited |= 1 << values.length;
    values.push(value);
    exprs.push(l.limit);
    shortOnly.push(short);
    anyUnverified ||= status === 'unverified';
  }
  return {
    index,
    rowIndex: info.index,
    byLevel,
    values,
    exprs,
    shortOnly,
    anyUnverified,
    atLeast,
    unlimited,
    patterns: new Array(1 << LEVELS.length),
    missing: null,
  };
}

function child<V>(m: Map<number, V>, k: number, make: new () => V): V {
  let v = m.get(k);
  if (v === undefined) {
    v = new make();
    m.set(k, v);
  }
  return v;
}

/** Memoised by the formula inputs: most readings of a seam share t, a and s, so each limit is built once. */
export function limitSetFor(
  ctx: SeamContext,
  info: RowInfo,
  t: number,
  a: number | undefined,
  b: number | undefined,
): LimitSet {
  const aKey = a ?? -1;
  const bKey = info.usesWidth ? (b ?? -1) : -1;
  // ctx.s is fixed per seam, so t, a and b decide the set.
  const recent = info.recent;
  const last = recent.last;
  if (recent.t[last] === t && recent.a[last] === aKey && recent.b[last] === bKey && recent.sets[last])
    return recent.sets[last];
  for (let i = 0; i < recent.size; i++) {
    if (recent.t[i] === t && recent.a[i] === aKey && recent.b[i] === bKey) {
      recent.last = i;
      return recent.sets[i] as LimitSet;
    }
  }
  const byA = child(info.memo, t, Map<number, Map<number, Map<number, LimitSet>>>);
  const byB = child(byA, aKey, Map<number, Map<number, LimitSet>>);
  const byS = child(byB, bKey, Map<number, LimitSet>);
  let set = byS.get(ctx.s);
  if (set === undefined) {
    set = buildLimitSet(info, { t, a, b, s: ctx.s }, ctx.limitSets.length);
    ctx.limitSets.push(set);
    byS.set(ctx.s, set);
  }
  // Filled in turn, then the oldest slot is replaced.
  const slot = recent.size < RECENT ? recent.size++ : recent.next;
  recent.next = (slot + 1) % RECENT;
  recent.t[slot] = t;
  recent.a[slot] = aKey;
  recent.b[slot] = bKey;
  recent.sets[slot] = set;
  recent.last = slot;
  return set;
}

/** The reported limits for a pass pattern, shared between readings with the same limits and outcome. */
export function limitsFor(set: LimitSet, mask: number): readonly LimitAtLevel[] {
  let limits = set.patterns[mask];
  if (!limits) {
    limits = set.byLevel.map((pair, i) => pair[(mask >> i) & 1] as LimitAtLevel);
    set.patterns[mask] = limits;
  }
  return limits;
}
