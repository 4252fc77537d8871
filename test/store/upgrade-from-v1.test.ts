// A database written by version 1 of the store (readings without localSeq, one index) is upgraded in place and
// keeps everything.
import { openDB } from 'idb';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { DB_VERSION } from '../../src/store/schema.js';
import { freshName, freshStore, rejection, undercut } from './support.js';
import { makeVersion1 } from './version-1-database.js';

afterEach(() => {
  vi.restoreAllMocks();
});

describe('upgrade from version 1', () => {
  it('keeps every record, back-fills the order of entry and builds the new indexes', async () => {
    const name = freshName();
    (await makeVersion1(name)).close();
    const store = await freshStore({ name });
    expect(DB_VERSION).toBeGreaterThanOrEqual(2);
    expect(await store.health()).toEqual({ state: 'ok', createdAt: '2026-11-30T07:00:00.000Z' });
    expect((await store.listSeams()).map((s) => s.id)).toEqual(['d-1', 's-1']);
    expect((await store.listReadings('s-1')).map((r) => [r.reading.id, r.localSeq])).toEqual([
      ['r-acknowledged', 1],
      ['r-z', 3],
      ['r-a', 4],
    ]);
    expect((await store.listReadings('d-1')).map((r) => [r.reading.id, r.localSeq])).toEqual([['d-r1', 2]]);
    expect((await store.outboxEntries()).map((e) => e.recordId)).toEqual([
      'setup-1',
      'round-1',
      'r-z',
      'r-a',
    ]);

    // The counter continues after the back-filled numbers.
    expect((await store.appendReading('s-1', undercut('r-new', 0.1))).localSeq).toBe(5);
    // The superseded-reading index covers migrated readings.
    await store.appendReading('s-1', undercut('r-fix', 0.1, { supersedes: 'r-a' }));
    const twice = await rejection(store.appendReading('s-1', undercut('r-fix2', 0.1, { supersedes: 'r-a' })));
    expect(twice.message).toContain('already superseded by "r-fix"');
    // The namespace index covers migrated readings: removing the demo takes d-r1 and leaves live readings.
    expect(await store.removeDemo()).toBe(1);
    expect(await store.listReadings('d-1')).toEqual([]);
    expect(await store.listReadings('s-1')).toHaveLength(5);
    const file = await store.seamFile('s-1');
    expect(file?.readings.map((r) => r.id)).toEqual(['r-acknowledged', 'r-z', 'r-a', 'r-new', 'r-fix']);
  });

  it('leaves a version 1 database untouched when the upgrade fails part-way', async () => {
    const name = freshName();
    (await makeVersion1(name)).close();
    // Fail the back-fill's first read, as a broken disk or a browser fault might.
    vi.spyOn(IDBObjectStore.prototype, 'getAll').mockImplementationOnce(() => {
      throw new DOMException('simulated read failure', 'UnknownError');
    });
    const error = await rejection(freshStore({ name }));
    expect(error.code).toBe('unavailable');
    expect(error.message).toContain('Bringing the stored records up to this version failed');
    const raw = await openDB(name);
    expect(raw.version).toBe(1);
    expect(await raw.count('readings')).toBe(4);
    expect([...raw.objectStoreNames].sort()).toEqual(['meta', 'outbox', 'readings', 'rounds', 'seams']);
    expect([...raw.transaction('readings').store.indexNames]).toEqual(['bySeam']);
    raw.close();
    // With the fault gone, the upgrade goes through.
    const store = await freshStore({ name });
    expect(await store.listReadings('s-1')).toHaveLength(3);
  });
});
