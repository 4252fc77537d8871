// The earlier way a batch payload was kept: without the record bodies the records table holds, the rest of each
// record left in place. Batches are now kept without their whole records (record-cuts.ts); rows stored this way are
// still read back, and cutBodies stays to make such rows in tests. Each body is cut only where the payload's bytes
// are exactly that body's stored text, and records are never changed or removed, so putting the stored texts back
// gives the received bytes again.

/** Where a body was cut: its offset in the kept bytes, and the id of the record whose stored body it is. */
export type Cut = readonly [at: number, recordId: string];

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

/** The payload as received: the kept bytes with each record's stored body put back where it was cut. */
export function restoreBodies(
  rest: Uint8Array,
  cuts: readonly Cut[],
  bodyOf: (recordId: string) => string | undefined,
): Buffer {
  return putBack(rest, cuts, bodyOf, (id) => `record "${id}"`);
}

/**
 * The kept bytes with the text of each cut's key put back at its offset. Records are never removed, so a key
 * without a text means the database was changed by hand: an error that names it.
 */
export function putBack<K>(
  rest: Uint8Array,
  cuts: readonly (readonly [at: number, key: K])[],
  textOf: (key: K) => string | undefined,
  name: (key: K) => string,
): Buffer {
  const kept = Buffer.from(rest.buffer, rest.byteOffset, rest.byteLength);
  const parts: Buffer[] = [];
  let from = 0;
  for (const [at, key] of cuts) {
    const text = textOf(key);
    if (text === undefined) throw new Error(`batch payload names ${name(key)}, which is not stored`);
    parts.push(kept.subarray(from, at), Buffer.from(text, 'utf8'));
    from = at;
  }
  parts.push(kept.subarray(from));
  return Buffer.concat(parts);
}

/** The cuts as kept in their column. */
export const cutsText = (cuts: readonly Cut[]): string => JSON.stringify(cuts);

export function parseCuts(text: string): Cut[] {
  const parsed = JSON.parse(text) as unknown;
  if (
    !Array.isArray(parsed) ||
    !parsed.every(
      (c): c is Cut =>
        Array.isArray(c) && c.length === 2 && Number.isInteger(c[0]) && typeof c[1] === 'string',
    )
  ) {
    throw new Error('a batch payload cut list is not in the form [[offset, recordId], …]');
  }
  return parsed;
}
