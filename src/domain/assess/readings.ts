import { supersededIds, type SeamGrade } from '../grade/seam.js';
import { midPlaneOffset, readingSide } from '../model/joint.js';
import type { Reading, SeamFile } from '../model/seam-file.js';
import type { Measured, MisalignmentInputs } from './bending.js';
import type { Setup } from './setup.js';

/** Uncertainty used when an instrument's resolution is not recorded. */
export const DEFAULT_RESOLUTION = { mm: 0.1, deg: 1 } as const;

export interface RoundReadings {
  readonly round: number | null;
  readonly readings: readonly Reading[];
  readonly note: string | null;
}

/** The readings in force in the round the seam is graded on (its latest complete round, else its latest round). */
export function roundReadings(file: SeamFile, grade: SeamGrade): RoundReadings {
  const superseded = supersededIds(file.readings);
  const live = file.readings.filter((r) => !r.withdrawn && !superseded.has(r.id));
  let round = grade.gradedRound;
  let note: string | null = null;
  if (round === null) {
    const withReadings = grade.rounds.filter((r) => r.readingCount > 0);
    round = withReadings[withReadings.length - 1]?.round ?? null;
    if (round !== null) note = `no round is complete: round ${round}'s readings are assessed, provisionally`;
  }
  const readings = round === null ? [] : live.filter((r) => r.round === round);
  readings.sort((a, b) => (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
  return { round, readings, note };
}

export const positionOf = (r: Reading): number => r.position ?? r.start ?? 0;

const resolutionBases = new Map<string, string>();

/** "instrument X resolution", made once per instrument id. */
function instrumentBasis(id: string): string {
  let basis = resolutionBases.get(id);
  if (basis === undefined) {
    basis = `instrument ${id} resolution`;
    if (resolutionBases.size < 10_000) resolutionBases.set(id, basis);
  }
  return basis;
}

const DEFAULT_BASIS = {
  mm: `default ${DEFAULT_RESOLUTION.mm} mm (resolution not recorded)`,
  deg: `default ${DEFAULT_RESOLUTION.deg} ° (resolution not recorded)`,
} as const;

export function resolutionOf(r: Reading, unit: 'mm' | 'deg'): { value: number; basis: string } {
  const v = unit === 'mm' ? r.instrument.resolutionMm : r.instrument.resolutionDeg;
  return v === undefined
    ? { value: DEFAULT_RESOLUTION[unit], basis: DEFAULT_BASIS[unit] }
    : { value: v, basis: instrumentBasis(r.instrument.id) };
}

/** The mid-plane offset e a reading gives (the gauge may read a surface step), or undefined. */
export function midPlaneE(setup: Setup, r: Reading): number | undefined {
  const read = r.values.linearMisalignment;
  if (read === undefined) return undefined;
  return midPlaneOffset(read, r.misalignmentBasis ?? 'midPlane', setup.t1, setup.t2);
}

function measured(r: Reading, value: number, unit: 'mm' | 'deg'): Measured {
  const res = resolutionOf(r, unit);
  return {
    readingId: r.id,
    position: positionOf(r),
    value,
    resolution: res.value,
    resolutionBasis: res.basis,
  };
}

/** The most positive and most negative linear and angular misalignments of the round (targeted readings included). */
export function misalignmentInputs(setup: Setup, readings: readonly Reading[]): MisalignmentInputs {
  let eHi: Measured | null = null;
  let eLo: Measured | null = null;
  let aHi: Measured | null = null;
  let aLo: Measured | null = null;
  for (const r of readings) {
    const e = midPlaneE(setup, r);
    if (e !== undefined) {
      if (!eHi || e > eHi.value) eHi = measured(r, e, 'mm');
      if (!eLo || e < eLo.value) eLo = measured(r, e, 'mm');
    }
    const a = r.values.angularMisalignment;
    if (a !== undefined) {
      if (!aHi || a > aHi.value) aHi = measured(r, a, 'deg');
      if (!aLo || a < aLo.value) aLo = measured(r, a, 'deg');
    }
  }
  return { eHi, eLo, aHi, aLo };
}

type SideKey = 'reinforcementHeight' | 'convexity' | 'throat';

/** A side value paired with a toe reading: where it came from is told in words only when asked (basisOf). */
export interface SideValue {
  readonly value: number;
  readonly from: Reading | null;
  readonly how: 'same reading' | 'same position' | 'largest';
  readonly side: string;
}

export function sideBasis(v: SideValue): string {
  if (v.how === 'same reading' || !v.from) return 'same reading';
  return v.how === 'same position'
    ? `reading ${v.from.id} at the same position`
    : `largest on the ${v.side === 'any' ? 'seam' : `${v.side} side`} (reading ${v.from.id})`;
}

interface SideEntry {
  readonly atPosition: Map<number, SideValue>;
  largest: SideValue | undefined;
}

/**
 * Values measured on one side of the weld, to pair with a toe reading that lacks them: the same reading first,
 * then a reading on that side at the same position, then the side's largest (conservative for Kt). The answers
 * are made once per side reading, so pairing many toe readings allocates next to nothing.
 */
export class SideValues {
  private readonly index = new Map<string, SideEntry>();

  constructor(readings: readonly Reading[]) {
    for (const x of readings) {
      for (const key of ['reinforcementHeight', 'convexity', 'throat'] as const) {
        const v = x.values[key];
        if (v === undefined) continue;
        // A throat belongs to the fillet, not to a side.
        const side = key === 'throat' ? 'any' : (readingSide(x) ?? 'none');
        const id = `${key}|${side}`;
        let entry = this.index.get(id);
        if (!entry) {
          entry = { atPosition: new Map(), largest: undefined };
          this.index.set(id, entry);
        }
        const pos = positionOf(x);
        if (!entry.atPosition.has(pos))
          entry.atPosition.set(pos, { value: v, from: x, how: 'same position', side });
        if (!entry.largest || v > entry.largest.value)
          entry.largest = { value: v, from: x, how: 'largest', side };
      }
    }
  }

  get(r: Reading, side: 'face' | 'root', key: SideKey): SideValue | undefined {
    const own = r.values[key];
    if (own !== undefined) return { value: own, from: r, how: 'same reading', side };
    const entry = this.index.get(key === 'throat' ? 'throat|any' : `${key}|${side}`);
    if (!entry) return undefined;
    return entry.atPosition.get(positionOf(r)) ?? entry.largest;
  }
}
