/** A stretch of seam [start, end] in mm from the start mark. */
export interface Stretch {
  readonly start: number;
  readonly end: number;
}

export interface ShortRuleCheck {
  /** Largest total length of the imperfections inside any one window. */
  readonly worstMm: number;
  readonly allowedMm: number;
  /** Start of the window where the worst total lies (mm from the start mark). */
  readonly worstWindowStart: number;
  readonly windowMm: number;
  readonly passes: boolean;
}

export const SHORT_WINDOW_MM = 100;
export const SHORT_ALLOWED_MM = 25;
export const SHORT_ALLOWED_FRACTION = 0.25;

function merge(stretches: readonly Stretch[]): Stretch[] {
  const sorted = [...stretches].sort((a, b) => a.start - b.start || a.end - b.end);
  const out: { start: number; end: number }[] = [];
  for (const s of sorted) {
    const last = out[out.length - 1];
    if (last && s.start <= last.end) last.end = Math.max(last.end, s.end);
    else out.push({ start: s.start, end: s.end });
  }
  return out;
}

/** Covered length of merged, sorted stretches in (−∞, y]. */
function coveredUpTo(merged: readonly Stretch[], prefix: readonly number[], y: number): number {
  let lo = 0;
  let hi = merged.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if ((merged[mid] as Stretch).end <= y) lo = mid + 1;
    else hi = mid;
  }
  const full = prefix[lo] as number;
  const partial = merged[lo];
  return partial && partial.start < y ? full + (y - partial.start) : full;
}

/**
 * ISO 5817 short-imperfection rule (clause 3, definition of "short imperfection", from memory: one or more
 * imperfections of total length ≤ 25 mm in any 100 mm of weld, or ≤ 25 % of a weld shorter than 100 mm).
 * The window slides along the seam and, on a circumferential seam, wraps past the start mark.
 */
export function checkShortRule(
  stretches: readonly Stretch[],
  seamLength: number,
  circumferential: boolean,
): ShortRuleCheck {
  if (seamLength < SHORT_WINDOW_MM) {
    const total = Math.round(merge(stretches).reduce((sum, s) => sum + (s.end - s.start), 0) * 1e6) / 1e6;
    const allowed = SHORT_ALLOWED_FRACTION * seamLength;
    return {
      worstMm: total,
      allowedMm: allowed,
      worstWindowStart: 0,
      windowMm: seamLength,
      passes: total <= allowed,
    };
  }
  const base = merge(stretches);
  const merged = circumferential
    ? merge([...base, ...base.map((s) => ({ start: s.start + seamLength, end: s.end + seamLength }))])
    : base;
  const prefix = [0];
  for (const s of merged) prefix.push((prefix[prefix.length - 1] as number) + (s.end - s.start));
  let worst = 0;
  let worstStart = 0;
  const consider = (x: number): void => {
    const covered = coveredUpTo(merged, prefix, x + SHORT_WINDOW_MM) - coveredUpTo(merged, prefix, x);
    if (covered > worst + 1e-9) {
      worst = covered;
      worstStart = x;
    }
  };
  // The covered length is piecewise linear in the window start; its maximum sits where a window edge meets a stretch edge.
  for (const s of merged) {
    consider(s.start);
    consider(s.end - SHORT_WINDOW_MM);
  }
  const round = (x: number) => Math.round(x * 1e6) / 1e6;
  const start = circumferential
    ? ((worstStart % seamLength) + seamLength) % seamLength
    : Math.max(0, worstStart);
  return {
    worstMm: round(worst),
    allowedMm: SHORT_ALLOWED_MM,
    worstWindowStart: round(start),
    windowMm: SHORT_WINDOW_MM,
    passes: round(worst) <= SHORT_ALLOWED_MM,
  };
}
