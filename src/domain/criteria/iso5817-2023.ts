import { ISO5817_2014_ROWS } from './iso5817-2014.js';
import type { Band, CriteriaSet, CriterionRow } from './types.js';

// ISO 5817:2023 as far as the limits reference knows it (acceptance-limits.md §3): the gauge rows are assumed
// unchanged from 2014; rows 1.3 (fillet), 1.16 and 3.2 use the actual throat aA; 507 splits into 5071/5072.
// Rows whose 2023 form was not seen in a public text are marked recalled, so they show as unverified.

const recalled = (bands: readonly Band[], source: string): Band[] =>
  bands.map((b) => ({
    ...b,
    levels: {
      B: { ...b.levels.B, confidence: 'M-med', source },
      C: { ...b.levels.C, confidence: 'M-med', source },
      D: { ...b.levels.D, confidence: 'M-med', source },
    },
  }));

const CHANGES: Readonly<Record<string, (row: CriterionRow) => CriterionRow>> = {
  '1.3-fillet': (r) => ({
    ...r,
    throat: 'actual',
    bands: recalled(r.bands, '2023 uses aA (S7); formula assumed as 2014 with aA'),
  }),
  '1.16': (r) => ({
    ...r,
    throat: 'actual',
    bands: recalled(r.bands, '2023 uses aA (S7); formula assumed as 2014 with aA'),
  }),
  '3.2': (r) => ({ ...r, throat: 'actual', bands: recalled(r.bands, '2023 text seen only in S8') }),
  '3.1-plates': (r) => ({ ...r, refs: ['5071'], bands: recalled(r.bands, '2023 text seen only in S8') }),
  '3.1-circumferential': (r) => ({
    ...r,
    refs: ['5072'],
    bands: recalled(r.bands, '2023 text seen only in S8'),
  }),
};

export const ISO5817_2023_ROWS: readonly CriterionRow[] = ISO5817_2014_ROWS.map((row) => {
  const change = CHANGES[row.id];
  return change ? change(row) : row;
});

export const ISO5817_2023: CriteriaSet = { edition: 'ISO 5817:2023', rows: ISO5817_2023_ROWS };

/** What this edition does not handle yet, shown with every 2023 grade. */
export const ISO5817_2023_NOT_HANDLED = [
  'Row 1.4 (end crater pipe) in its 2023 fillet form with aA: graded with the 2014 form in t.',
  'Row 4.1 (multiple imperfections in a cross-section): changed in 2023 and not implemented.',
  'Row numbering of 2023 is not verified; 2014 row numbers are shown.',
] as const;
