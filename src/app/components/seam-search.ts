import type { SeamRecord } from '../../store/api.js';

/** Lower case without accents, so a gloved "e" finds "é". */
function fold(s: string): string {
  return s.normalize('NFKD').replace(/\p{M}/gu, '').toLowerCase();
}

/**
 * The text one search box looks through: label, tags (listed in the set-up and linked by scanning), drawing and
 * position, welder, area.
 */
export function searchText(rec: SeamRecord, linkedTags: readonly string[] = []): string {
  const s = rec.seam;
  return fold(
    [s.label, ...(s.tags ?? []), ...linkedTags, s.drawing, s.drawingPosition, s.welder, s.area, s.procedure]
      .filter((x): x is string => typeof x === 'string')
      .join('\n'),
  );
}

/** Every word of the query must appear somewhere (in any field), so "B-12 Kovac" narrows to one seam. */
export function matchesSearch(rec: SeamRecord, query: string, linkedTags: readonly string[] = []): boolean {
  const words = fold(query).split(/\s+/).filter(Boolean);
  if (!words.length) return true;
  const hay = searchText(rec, linkedTags);
  return words.every((w) => hay.includes(w));
}

/** Newest work first, then by label: the seam being worked on is at the top. */
export function sortSeams(list: readonly SeamRecord[]): SeamRecord[] {
  return [...list].sort(
    (a, b) =>
      (b.updatedAt > a.updatedAt ? 1 : b.updatedAt < a.updatedAt ? -1 : 0) ||
      a.seam.label.localeCompare(b.seam.label, undefined, { numeric: true }),
  );
}
