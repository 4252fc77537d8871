import type { Edition } from '../model/seam-file.js';
import { ISO5817_2014 } from './iso5817-2014.js';
import { ISO5817_2023 } from './iso5817-2023.js';
import type { Band, CriteriaSet, CriterionRow } from './types.js';

export const BUILT_IN_CRITERIA: Readonly<Record<Edition, CriteriaSet>> = {
  'ISO 5817:2014': ISO5817_2014,
  'ISO 5817:2023': ISO5817_2023,
};

/** The band whose thickness range holds t (bands are "0.5 to 3" inclusive, then "> 3"). */
export function bandFor(row: CriterionRow, t: number): Band {
  for (const band of row.bands) {
    if (band.tMax === undefined || t <= band.tMax) return band;
  }
  // A well-formed row always ends with an open band; the last band is the safe fallback.
  return row.bands[row.bands.length - 1] as Band;
}
