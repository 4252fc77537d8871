import type { Level, LevelMet } from '../../domain/index.js';

export interface LevelBadgeProps {
  readonly levelMet: LevelMet | null;
  readonly required?: Level | undefined;
  readonly state?: 'graded' | 'incomplete' | 'noReadings' | undefined;
  /**
   * The grader's verdict against the required levels. Give it whenever known: per-imperfection overrides (an
   * execution class such as EXC2) can accept a seam whose overall level is below the base level.
   */
  readonly meets?: boolean | null | undefined;
}

/**
 * A level at a glance without relying on colour: the text says the level and the verdict, and the shape
 * differs too (solid square tick for "meets", open diamond cross for "below", dotted ring for incomplete).
 */
export function LevelBadge({ levelMet, required, state, meets: verdict }: LevelBadgeProps) {
  if (state === 'incomplete' || state === 'noReadings' || levelMet === null) {
    const text = state === 'noReadings' ? 'no readings' : 'incomplete';
    return (
      <span class="badge badge-open" data-verdict="incomplete">
        <span aria-hidden="true" class="badge-shape">
          ◌
        </span>{' '}
        {text}
      </span>
    );
  }
  const label = levelMet === 'belowD' ? 'below D' : levelMet;
  const rank = { B: 3, C: 2, D: 1, belowD: 0 } as const;
  const byRank = required === undefined ? levelMet !== 'belowD' : rank[levelMet] >= rank[required];
  const meets = typeof verdict === 'boolean' ? verdict : byRank;
  const allowance =
    meets && !byRank
      ? ' (with per-imperfection levels)'
      : !meets && byRank
        ? ' (a per-imperfection level is not met)'
        : '';
  return (
    <span class={meets ? 'badge badge-meets' : 'badge badge-below'} data-verdict={meets ? 'meets' : 'below'}>
      <span aria-hidden="true" class="badge-shape">
        {meets ? '■✓' : '◇✗'}
      </span>{' '}
      {required === undefined
        ? `level ${label}`
        : `${label} — ${meets ? 'meets' : 'below'} required ${required}${allowance}`}
    </span>
  );
}
