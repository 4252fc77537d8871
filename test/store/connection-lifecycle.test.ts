// The four connection events: another tab blocked by us (blocking), us blocked by another tab (blocked), the
// browser closing the connection (terminated), and a failed request that must never be reported as saved.
import { openDB } from 'idb';
import { forceCloseDatabase } from 'fake-indexeddb';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { openStore } from '../../src/store/index.js';
import { DB_VERSION } from '../../src/store/schema.js';
import { butt, freshName, freshStore, rejection, undercut } from './support.js';
import { makeVersion1 } from './version-1-database.js';

/** Records every connection the code under test opens, so a test can close one as the browser would. */
function captureConnections(): IDBDatabase[] {
  const connections: IDBDatabase[] = [];
  const open = indexedDB.open.bind(indexedDB);
  vi.spyOn(indexedDB, 'open').mockImplementation((name, version) => {
    const request = open(name, version);
    request.addEventListener('success', () => connections.push(request.result));
    return request;
  });
  return connections;
}

/** A callback and a promise that settles when it is first called. */
function signal(): { fn: () => void; called: Promise<void> } {
  let resolve: () => void = () => undefined;
  const called = new Promise<void>((r) => {
    resolve = r;
  });
  return { fn: () => resolve(), called };
}

afterEach(() => {
  vi.restoreAllMocks();
});

describe('connection lifecycle', () => {
  it('steps aside for a newer version opened elsewhere, tells the app, and then asks for a reload', async () => {
    const blocking = signal();
    const store = await freshStore({ onBlocking: blocking.fn });
    await store.saveSeam(butt('s-1'));
    // A newer app version in another tab: its open waits until this store closes its connection.
    const newer = await openDB(store.name, DB_VERSION + 1, {
      upgrade(db) {
        db.createObjectStore('addedLater');
      },
    });
    await blocking.called;
    expect(newer.version).toBe(DB_VERSION + 1);
    expect(await newer.count('seams')).toBe(1);
    const error = await rejection(store.listSeams());
    expect(error.code).toBe('upgraded');
    expect(error.message).toContain('Reload this page');
    newer.close();
  });

  it('waits while another tab holds an older version open, says so, and opens once that tab lets go', async () => {
    const name = freshName();
    const older = await makeVersion1(name); // stays open and ignores the request to close
    const blocked = signal();
    const opening = openStore({ name, onBlocked: blocked.fn });
    await blocked.called;
    older.close();
    const store = await opening;
    expect((await store.listReadings('s-1')).map((r) => r.reading.id)).toEqual([
      'r-acknowledged',
      'r-z',
      'r-a',
    ]);
    store.close();
  });

  it('drops a connection the browser terminated and reopens on the next call', async () => {
    const connections = captureConnections();
    const terminated = signal();
    const store = await freshStore({ onTerminated: terminated.fn });
    await store.saveSeam(butt('s-1'));
    forceCloseDatabase(connections[0] as never);
    await terminated.called;
    const saved = await store.appendReading('s-1', undercut('r-1', 0.2));
    expect(saved.localSeq).toBe(1);
    expect(connections).toHaveLength(2);
    // Read back through a separate store: it is really on disk.
    const other = await openStore({ name: store.name });
    expect((await other.listReadings('s-1')).map((r) => r.reading.id)).toEqual(['r-1']);
    other.close();
  });

  it('reopens when the connection is found closed before its close event arrives', async () => {
    const connections = captureConnections();
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    connections[0]?.close(); // closed underneath the store, with no event
    await store.appendReading('s-1', undercut('r-1', 0.2));
    expect(connections).toHaveLength(2);
    expect(await store.listReadings('s-1')).toHaveLength(1);
  });

  it('reports a write that fails mid-transaction as not saved, keeps nothing of it, and reconnects', async () => {
    const connections = captureConnections();
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    // The browser's "connection lost" fault, on the request that stores the reading.
    vi.spyOn(IDBObjectStore.prototype, 'add').mockImplementationOnce(() => {
      throw new DOMException(
        'Connection to Indexed Database server lost. Refresh the page to try again',
        'UnknownError',
      );
    });
    const error = await rejection(store.appendReading('s-1', undercut('r-1', 0.2)));
    expect(error.code).toBe('notSaved');
    expect(error.message).toMatch(/^Not saved: .*UnknownError/);
    expect(await store.listReadings('s-1')).toEqual([]);
    expect(connections).toHaveLength(2); // the failing connection was dropped
    // Nothing was half-written: the retry gets the first order number and one outbox entry.
    expect((await store.appendReading('s-1', undercut('r-1', 0.2))).localSeq).toBe(1);
    expect((await store.outboxEntries()).filter((e) => e.kind === 'reading')).toHaveLength(1);
  });

  it('refuses every call after close()', async () => {
    const store = await freshStore();
    store.close();
    expect((await rejection(store.listSeams())).code).toBe('closed');
    expect((await rejection(store.saveSeam(butt('s-1')))).code).toBe('closed');
  });
});
