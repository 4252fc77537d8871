// health(): a first visit, an ordinary one, and a database the browser removed while a note of it was kept in
// localStorage.
import { deleteDB } from 'idb';
import { forceCloseDatabase } from 'fake-indexeddb';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { butt, freshName, freshStore, tickingClock } from './support.js';

function stubLocalStorage(): Map<string, string> {
  const map = new Map<string, string>();
  const stub: Storage = {
    get length() {
      return map.size;
    },
    clear: () => map.clear(),
    getItem: (key) => map.get(key) ?? null,
    key: (i) => [...map.keys()][i] ?? null,
    removeItem: (key) => void map.delete(key),
    setItem: (key, value) => void map.set(key, String(value)),
  };
  vi.stubGlobal('localStorage', stub);
  return map;
}

afterEach(() => {
  vi.unstubAllGlobals();
  vi.restoreAllMocks();
});

describe('health', () => {
  it('is "new" on first creation and "ok" after', async () => {
    stubLocalStorage();
    const first = await freshStore();
    const created = await first.health();
    expect(created.state).toBe('new');
    first.close();
    const again = await freshStore({ name: first.name });
    expect(await again.health()).toEqual({ state: 'ok', createdAt: created.createdAt });
  });

  it('is "wiped" when the database is gone but this browser noted it before; then "ok" again', async () => {
    const notes = stubLocalStorage();
    const now = tickingClock();
    const first = await freshStore({ now });
    await first.saveSeam(butt('s-1'));
    const { createdAt } = await first.health();
    expect([...notes.values()]).toEqual([createdAt]);
    first.close();
    await deleteDB(first.name); // what the browser does under storage pressure, without an error
    const after = await freshStore({ name: first.name, now });
    const health = await after.health();
    expect(health).toMatchObject({ state: 'wiped', previouslyCreatedAt: createdAt });
    expect(health.createdAt > createdAt).toBe(true);
    expect(await after.listSeams()).toEqual([]);
    after.close();
    expect((await freshStore({ name: first.name }).then((s) => s.health())).state).toBe('ok');
  });

  it('finds a wipe that happens while the app is open, after the connection was lost', async () => {
    stubLocalStorage();
    const connections: IDBDatabase[] = [];
    const open = indexedDB.open.bind(indexedDB);
    vi.spyOn(indexedDB, 'open').mockImplementation((name, version) => {
      const request = open(name, version);
      request.addEventListener('success', () => connections.push(request.result));
      return request;
    });
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    forceCloseDatabase(connections[0] as never);
    await deleteDB(store.name);
    expect(await store.listSeams()).toEqual([]);
    expect((await store.health()).state).toBe('wiped');
  });

  it('cannot tell a wipe from a first visit without localStorage, and says "new"', async () => {
    const name = freshName();
    (await freshStore({ name })).close();
    await deleteDB(name);
    expect((await (await freshStore({ name })).health()).state).toBe('new');
  });

  it('opens normally when localStorage refuses access', async () => {
    Object.defineProperty(globalThis, 'localStorage', {
      configurable: true,
      get() {
        throw new DOMException('The operation is insecure.', 'SecurityError');
      },
    });
    try {
      const store = await freshStore();
      expect((await store.health()).state).toBe('new');
    } finally {
      delete (globalThis as { localStorage?: unknown }).localStorage;
    }
  });
});
