// A note kept outside IndexedDB that a database existed, so a database the browser removed can be told apart
// from a first visit. Under storage pressure a browser may evict IndexedDB without an error; this note survives
// whenever localStorage is kept while IndexedDB is not. A wipe of the whole origin removes the note too, and
// then the store can only report "new". Workers and tests have no localStorage: then there is no note at all.

const markerKey = (dbName: string) => `beadbook.store.${dbName}.createdAt`;

function storage(): Storage | undefined {
  try {
    // Reading the property itself throws in some privacy modes, so it is inside the try.
    return 'localStorage' in globalThis ? (globalThis.localStorage as Storage | undefined) : undefined;
  } catch {
    return undefined;
  }
}

/** When the database last known to this browser was created, or null when no note is kept. */
export function readMarker(dbName: string): string | null {
  try {
    return storage()?.getItem(markerKey(dbName)) ?? null;
  } catch {
    return null;
  }
}

export function writeMarker(dbName: string, createdAt: string): void {
  try {
    storage()?.setItem(markerKey(dbName), createdAt);
  } catch {
    // A full or disabled localStorage only loses the wipe warning; the records themselves are in IndexedDB.
  }
}
