// The viewing and lighting conditions of a round as CSV columns, shared by the readings and the seam exports:
// stated as recorded on the tablet, never judged (whether they suffice is for the governing specification).
import type { RoundViewing } from '../grading/fold.js';

export const VIEWING_HEADERS = [
  'viewing',
  'illuminance (lx)',
  'viewing distance (mm)',
  'viewing angle (deg)',
  'lighting',
  'viewing aids',
  'viewing corrected (times)',
  'viewing recorded at UTC (device clock)',
] as const;

/** Blank cells for a round whose conditions were not recorded, so the report's blanks are not filled by guess. */
export function viewingCells(v: RoundViewing | undefined): (string | number | null)[] {
  const c = v?.conditions;
  return [
    c?.viewing ?? null,
    c?.illuminanceLx ?? null,
    c?.distanceMm ?? null,
    c?.angleDeg ?? null,
    c?.lighting ?? null,
    c?.aids ?? null,
    v ? v.records - 1 : null,
    v?.recordedAt ?? null,
  ];
}

/** The conditions in force per round number. */
export const viewingByRound = (viewing: readonly RoundViewing[]): ReadonlyMap<number, RoundViewing> =>
  new Map(viewing.map((v) => [v.round, v]));
