/** ISO 5817 quality levels, most stringent first; a weld meeting B meets C and D (common practice). */
export const LEVELS = ['B', 'C', 'D'] as const;
export type Level = (typeof LEVELS)[number];

/** A level met, or none of them. */
export type LevelMet = Level | 'belowD';

const RANK: Record<LevelMet, number> = { B: 3, C: 2, D: 1, belowD: 0 };

export const levelRank = (l: LevelMet): number => RANK[l];

/** The worse (less stringent) of two results. */
export const worseLevel = (a: LevelMet, b: LevelMet): LevelMet => (RANK[a] <= RANK[b] ? a : b);

export const meets = (met: LevelMet, required: Level): boolean => RANK[met] >= RANK[required];

export const levelText = (l: LevelMet): string => (l === 'belowD' ? 'below D' : l);
