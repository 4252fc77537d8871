import type { Level } from '../model/levels.js';
import type { ExecutionClass } from '../model/seam-file.js';

export interface AcceptancePreset {
  readonly level: Level;
  readonly overrides: Readonly<Record<string, Level>>;
  readonly note?: string;
}

/** EN 1090-2 execution classes mapped to ISO 5817 levels (2008-era wording, as in the limits reference). */
export const EXECUTION_CLASS_PRESETS: Readonly<Record<ExecutionClass, AcceptancePreset>> = {
  EXC1: { level: 'D', overrides: {} },
  EXC2: {
    level: 'C',
    // EXC2 relaxes undercut, overlap, stray arc and end crater pipe to level D.
    overrides: { '5011': 'D', '5012': 'D', '506': 'D', '601': 'D', '2025': 'D' },
  },
  EXC3: { level: 'B', overrides: {} },
  EXC4: {
    level: 'B',
    overrides: {},
    note: 'EXC4 asks level B plus the additional requirements of EN 1090-2, which are not graded here.',
  },
};
