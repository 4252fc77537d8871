// A batch payload kept without the record bodies the records table holds already. A 500-reading payload is mostly
// those bodies, so keeping them once takes nearly half the bytes off every batch's write. Each body is cut only
// where the payload's bytes are exactly that body's stored text, and records are never changed or removed, so
// putting the stored texts back gives the received bytes again.

/** Where a body was cut: its offset in the kept bytes, and the id of the record whose stored body it is. */
export type Cut = readonly [at: number, recordId: string];

export interface CutPayload {
  readonly rest: Buffer;
  readonly cuts: readonly Cut[];
}

// In canonical JSON a record's members are sorted, so its body is its first member.
const BODY_START = Buffer.from('{"body":');
/** How many record starts a body is looked for at before it stays in the payload. */
const TRIES = 4;

/**
 * Cuts the bodies out of the payload, looking for them in order from where the last one ended, so the search never
 * goes back and costs one pass at most. Bodies not found where expected simply stay. Null when nothing was cut.
 */
export function cutBodies(
  payload: Buffer,
  records: readonly { readonly id: string; readonly body: string }[],
): CutPayload | null {
  const parts: Buffer[] = [];
  const cuts: Cut[] = [];
  let kept = 0;
  let from = 0;
  let cursor = 0;
  for (const { id, body } of records) {
    const bytes = Buffer.from(body, 'utf8');
    for (let tries = 0; tries < TRIES && cursor < payload.length; tries++) {
      const start = payload.indexOf(BODY_START, cursor);
      if (start < 0) {
        cursor = payload.length;
        break;
      }
      const at = start + BODY_START.length;
      cursor = at;
      const end = at + bytes.length;
      if (end <= payload.length && payload.compare(bytes, 0, bytes.length, at, end) === 0) {
        parts.push(payload.subarray(from, at));
        kept += at - from;
        cuts.push([kept, id]);
        from = cursor = end;
        break;
      }
    }
    if (cursor >= payload.length) break;
  }
  if (!cuts.length) return null;
  parts.push(payload.subarray(from));
  return { rest: Buffer.concat(parts, kept + payload.length - from), cuts };
}

/** The payload as received: the kept bytes with each record's stored body put back where it was cut. */
export function restoreBodies(
  rest: Uint8Array,
  cuts: readonly Cut[],
  bodyOf: (recordId: string) => string | undefined,
): Buffer {
  const kept = Buffer.from(rest.buffer, rest.byteOffset, rest.byteLength);
  const parts: Buffer[] = [];
  let from = 0;
  for (const [at, id] of cuts) {
    const body = bodyOf(id);
    // Records are never removed: a missing one means the database was changed by hand.
    if (body === undefined) throw new Error(`batch payload names record "${id}", which is not stored`);
    parts.push(kept.subarray(from, at), Buffer.from(body, 'utf8'));
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
