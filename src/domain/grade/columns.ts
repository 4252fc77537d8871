import { toMicrometre } from '../criteria/limit.js';
import { readingSide } from '../model/joint.js';
import { LEVELS } from '../model/levels.js';
import { PARAMETER_NAMES, type ParameterName } from '../model/parameters.js';
import type { Reading } from '../model/seam-file.js';
import { limitSetFor, measuredQuantity, thicknessFor, type RowInfo, type SeamContext } from './context.js';

/** Level met as a rank: 3 = B, 2 = C, 1 = D, 0 = below D (same order as levelRank). */
export const RANK_NONE = 255;
export const FLAG_BORDERLINE = 1;
export const FLAG_NO_RESOLUTION = 2;
export const FLAG_NOMINAL_THROAT = 4;

/**
 * Grades of many readings in columns: one entry per (reading, imperfection row), the entries of a reading
 * contiguous. Typed arrays keep a 100,000-reading import cheap to grade and to send across the worker boundary;
 * objects for display are made per reading on demand (materialiseReading).
 */
export interface GradeColumns {
  readonly size: number;
  readonly reading: Uint32Array;
  readonly limitSet: Uint32Array;
  readonly measured: Float64Array;
  /** Distance inside the governing limit (negative outside); NaN when the limit is "unlimited". */
  readonly margin: Float64Array;
  readonly rank: Uint8Array;
  /** Bit i set when the value passes the limit at LEVELS[i]. */
  readonly mask: Uint8Array;
  readonly flags: Uint8Array;
  readonly thickness: Float64Array;
  /** Per reading: worst rank over its entries (RANK_NONE when nothing was graded), first entry and count. */
  readonly readingRank: Uint8Array;
  readonly readingFirst: Uint32Array;
  readonly readingCount: Uint32Array;
  /** Per reading: bit masks (by PARAMETER_NAMES index) of values present and values that entered a grade. */
  readonly readingPresent: Uint32Array;
  readonly readingGraded: Uint32Array;
}

export const PARAM_BIT = Object.fromEntries(PARAMETER_NAMES.map((n, i) => [n, 1 << i])) as Record<
  ParameterName,
  number
>;

type Mutable = { -readonly [K in keyof GradeColumns]: GradeColumns[K] };

/**
 * All columns as views of one buffer, the 8-byte ones first so every view is aligned: one large allocation instead
 * of thirteen, which the allocator can hand back from the last grade instead of mapping fresh memory each time.
 */
function allocate(capacity: number, n: number): Omit<Mutable, 'size'> {
  const buffer = new ArrayBuffer(capacity * (3 * 8 + 2 * 4 + 3) + n * (4 * 4 + 1));
  let at = 0;
  const take = <T>(
    make: { new (b: ArrayBuffer, offset: number, length: number): T; readonly BYTES_PER_ELEMENT: number },
    length: number,
  ) => {
    const view = new make(buffer, at, length);
    at += length * make.BYTES_PER_ELEMENT;
    return view;
  };
  const measured = take(Float64Array, capacity);
  const margin = take(Float64Array, capacity);
  const thickness = take(Float64Array, capacity);
  const reading = take(Uint32Array, capacity);
  const limitSet = take(Uint32Array, capacity);
  const readingFirst = take(Uint32Array, n);
  const readingCount = take(Uint32Array, n);
  const readingPresent = take(Uint32Array, n);
  const readingGraded = take(Uint32Array, n);
  const rank = take(Uint8Array, capacity);
  const mask = take(Uint8Array, capacity);
  const flags = take(Uint8Array, capacity);
  const readingRank = take(Uint8Array, n);
  // Fields in the order the interface lists them.
  return {
    reading,
    limitSet,
    measured,
    margin,
    rank,
    mask,
    flags,
    thickness,
    readingRank,
    readingFirst,
    readingCount,
    readingPresent,
    readingGraded,
  };
}

function grow(c: Mutable, capacity: number): void {
  const next = allocate(capacity, c.readingRank.length);
  for (const key of Object.keys(next) as (keyof typeof next)[]) {
    (next[key] as { set(a: ArrayLike<number>): void }).set(c[key]);
    (c as Record<typeof key, unknown>)[key] = next[key];
  }
}

/** Parameter names by name, for reading a reading's values in one pass over its own keys. */
const PARAM_INDEX = new Map<string, number>(PARAMETER_NAMES.map((n, i) => [n, i]));

export function gradeColumns(readings: readonly Reading[], ctx: SeamContext): GradeColumns {
  const n = readings.length;
  const initial = Math.max(16, n * 4);
  const c: Mutable = { size: 0, ...allocate(initial, n) };
  const levels = LEVELS.length;
  // The graded rows in PARAMETER_NAMES order, so a reading's entries come out in that order.
  const graded = PARAMETER_NAMES.map((name) => ctx.rowsByParameter.get(name) ?? []);
  const lastKeys: string[] = [];
  const lastIndex: (number | undefined)[] = [];
  for (let ri = 0; ri < n; ri++) {
    const r = readings[ri] as Reading;
    const values = r.values;
    const side = readingSide(r);
    const resolutionMm = r.instrument.resolutionMm;
    const resolutionDeg = r.instrument.resolutionDeg;
    // One pass over the reading's own keys instead of a look-up per known parameter. Readings of one import
    // list the same keys in the same order, so a key equal to the last reading's at that place skips the look-up.
    let present = 0;
    let j = 0;
    for (const key in values) {
      let p: number | undefined;
      if (j < lastKeys.length && lastKeys[j] === key) p = lastIndex[j];
      else {
        p = PARAM_INDEX.get(key);
        lastKeys[j] = key;
        lastIndex[j] = p;
      }
      j++;
      if (p !== undefined && values[key as ParameterName] !== undefined) present |= 1 << p;
    }
    let gradedBits = 0;
    let worst = RANK_NONE;
    c.readingFirst[ri] = c.size;
    for (let p = 0; present >> p !== 0; p++) {
      if (((present >> p) & 1) === 0) continue;
      const infos = graded[p] as readonly RowInfo[];
      for (let k = 0; k < infos.length; k++) {
        const info = infos[k] as RowInfo;
        const row = info.row;
        if (row.applies.side !== undefined && row.applies.side !== side) continue;
        if (row.quantity === 'legDifference' && ctx.asymmetryPrescribed) continue;
        const raw = measuredQuantity(row, r, ctx);
        if (raw === undefined) continue;
        // Derived quantities (3 − 2.8) are kept to the micrometre, like the limits, so equality passes.
        const measured = Math.round(raw * 1e6) / 1e6;
        const t = thicknessFor(row, r, ctx);
        let a = ctx.seam.nominalThroat;
        let flags = 0;
        if (row.throat === 'actual') {
          if (values.throat !== undefined) a = values.throat;
          else flags |= FLAG_NOMINAL_THROAT;
        }
        const set = limitSetFor(ctx, info, t, a, values.reinforcementWidth);
        if (set.missing !== null) continue;
        // passesLimit and marginTo (criteria/limit.ts) inlined over the set's precomputed kinds.
        let mask = 0;
        for (let i = 0; i < levels; i++) {
          const limit = set.values[i] as number;
          if ((set.atLeast >> i) & 1 ? measured >= limit : measured <= limit) mask |= 1 << i;
        }
        // Nested levels: a level is met only when every less stringent level is met too.
        let rank = 0;
        for (let i = levels - 1; i >= 0 && (mask >> i) & 1; i--) rank = levels - i;
        const gi = info.governingIndex;
        const gLimit = set.values[gi] as number;
        const margin =
          (set.unlimited >> gi) & 1
            ? NaN
            : toMicrometre((set.atLeast >> gi) & 1 ? measured - gLimit : gLimit - measured);
        const resolution = row.unit === 'deg' ? resolutionDeg : resolutionMm;
        if (resolution === undefined) flags |= FLAG_NO_RESOLUTION;
        else if (margin === margin && Math.abs(margin) <= resolution + 1e-9) flags |= FLAG_BORDERLINE;
        if (c.size === c.reading.length) grow(c, c.reading.length * 2);
        const e = c.size++;
        c.reading[e] = ri;
        c.limitSet[e] = set.index;
        c.measured[e] = measured;
        c.margin[e] = margin;
        c.rank[e] = rank;
        c.mask[e] = mask;
        c.flags[e] = flags;
        c.thickness[e] = t;
        if (worst === RANK_NONE || rank < worst) worst = rank;
        gradedBits |= 1 << p;
        if (row.quantity === 'legDifference') gradedBits |= PARAM_BIT.leg2;
        if (info.usesWidth) gradedBits |= PARAM_BIT.reinforcementWidth;
      }
    }
    c.readingRank[ri] = worst;
    c.readingCount[ri] = c.size - (c.readingFirst[ri] as number);
    c.readingPresent[ri] = present;
    c.readingGraded[ri] = gradedBits;
  }
  return c;
}
