// The earlier way a batch payload was kept: without the record bodies the records table holds, the rest of each
// record left in place, and the cuts kept as a JSON list of [offset, record id]. Batches are now kept without their
// whole records (record-cuts.ts); rows stored this way are still read back. Records are never changed or removed,
// so putting the stored bodies back gives the received bytes again.

/** Where a body was cut: its offset in the kept bytes, and the id of the record whose stored body it is. */
export type Cut = readonly [at: number, recordId: string];

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
