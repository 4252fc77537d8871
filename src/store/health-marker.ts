// A note kept outside IndexedDB that a database existed, so a database the browser removed can be told apart
// from a first visit. Under storage pressure a browser may evict IndexedDB without an error; this note survives
// whenever localStorage is kept while IndexedDB is not. A wipe of the whole origin removes the note too, and
// then the store can only report "new". Workers and tests have no localStorage: then there is no note at all.

const markerKey = (dbName: string) => `beadbook.store.${dbName}.createdAt`;

/** The part of localStorage used here; typed without the DOM library so the service worker can open the store. */
interface NoteStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
}

function storage(): NoteStorage | undefined {
  try {
    // Reading the property itself throws in some privacy modes, so it is inside the try.
    const g = globalThis as { localStorage?: NoteStorage };
    return 'localStorage' in g ? g.localStorage : undefined;
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
