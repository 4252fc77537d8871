/**
 * Cuts the text at the given fractions of its length, in order: pieces (chunks) that may be empty, split a row or a
 * CRLF pair. With `distinct`, repeated cut points make one cut, so no piece is empty between them.
 */
export function cutText(text: string, cuts: readonly number[], distinct = false): string[] {
  const points = cuts.map((f) => Math.floor(f * text.length));
  const at = (distinct ? [...new Set(points)] : points).sort((a, b) => a - b);
  const out: string[] = [];
  let prev = 0;
  for (const c of at) {
    out.push(text.slice(prev, c));
    prev = c;
  }
  out.push(text.slice(prev));
  return out;
}
