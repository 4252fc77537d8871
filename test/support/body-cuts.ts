// The earlier server's writer of body cuts (storage/sqlite/payload-cuts.ts reads them back): tests make rows in that
// layout with it. Each body is cut only where the payload's bytes are exactly that body's stored text.
import type { Cut } from '../../src/server/storage/sqlite/payload-cuts.js';

export interface CutPayload {
  /** What is kept: the payload less the bodies, one character per byte as the payload was. */
  readonly rest: string;
  readonly cuts: readonly Cut[];
}

// In canonical JSON a record's members are sorted, so its body is its first member.
const BODY_START = '{"body":';
/** How many record starts a body is looked for at before it stays in the payload. */
const TRIES = 4;

/**
 * Cuts the bodies out of a payload given as its ASCII text (so a character's index is its byte's offset), looking
 * for them in order from where the last one ended: the search never goes back and costs one pass at most. Bodies
 * not found where expected simply stay. Null when nothing was cut.
 */
export function cutBodies(
  ascii: string,
  records: readonly { readonly id: string; readonly body: string }[],
): CutPayload | null {
  const pieces: string[] = [];
  const cuts: Cut[] = [];
  let kept = 0;
  let from = 0;
  let cursor = 0;
  for (const { id, body } of records) {
    for (let tries = 0; tries < TRIES && cursor < ascii.length; tries++) {
      const start = ascii.indexOf(BODY_START, cursor);
      if (start < 0) {
        cursor = ascii.length;
        break;
      }
      const at = start + BODY_START.length;
      cursor = at;
      if (ascii.startsWith(body, at)) {
        pieces.push(ascii.slice(from, at));
        kept += at - from;
        cuts.push([kept, id]);
        from = cursor = at + body.length;
        break;
      }
    }
    if (cursor >= ascii.length) break;
  }
  if (!cuts.length) return null;
  pieces.push(ascii.slice(from));
  return { rest: pieces.join(''), cuts };
}

/** The cuts as kept in their column. */
export const cutsText = (cuts: readonly Cut[]): string => JSON.stringify(cuts);
