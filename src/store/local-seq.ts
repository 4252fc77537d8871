// The device-local order of entry. Kept as a counter in `meta` and taken inside the transaction that writes the
// readings, so concurrent appends (serialised by IndexedDB) never share a number and a failed write uses none.
import type { IDBPObjectStore, StoreNames } from 'idb';
import type { BeadbookDB } from './schema.js';

type MetaStore = IDBPObjectStore<BeadbookDB, ArrayLike<StoreNames<BeadbookDB>>, 'meta', 'readwrite'>;

/** The last number handed out (0 when none). */
export async function lastLocalSeq(meta: MetaStore): Promise<number> {
  const stored = await meta.get('localSeq');
  return stored?.key === 'localSeq' ? stored.value : 0;
}

/** Reserves `count` numbers and returns the first. */
export async function takeLocalSeqs(meta: MetaStore, count: number): Promise<number> {
  const first = (await lastLocalSeq(meta)) + 1;
  if (count > 0) await meta.put({ key: 'localSeq', value: first + count - 1 });
  return first;
}
