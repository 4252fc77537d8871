// A database at version 3 is upgraded in place to version 4 (tag links): every record and waiting entry stays,
// and tags can be linked at once.
import { openDB } from 'idb';
import { describe, expect, it } from 'vitest';
import { MIGRATIONS, type BeadbookDB } from '../../src/store/schema.js';
import { freshName, freshStore } from './support.js';
import { makeVersion1 } from './version-1-database.js';

async function makeVersion3(name: string): Promise<void> {
  (await makeVersion1(name)).close();
  for (const version of [2, 3]) {
    const step = MIGRATIONS[version - 1];
    if (!step) throw new Error(`no version ${version} step`);
    const db = await openDB<BeadbookDB>(name, version, {
      upgrade: (database, _old, _new, tx) => {
        void step(database, tx);
      },
    });
    db.close();
  }
}

describe('upgrade from version 3', () => {
  it('adds the tag-link store and keeps seams, readings and the outbox', async () => {
    const name = freshName();
    await makeVersion3(name);
    const before = await openDB<BeadbookDB>(name, 3);
    expect([...before.objectStoreNames]).not.toContain('tagLinks');
    const seams = await before.getAll('seams');
    const readings = await before.getAll('readings');
    const outbox = await before.getAll('outbox');
    before.close();
    expect(readings.length).toBeGreaterThan(0);

    const store = await freshStore({ name });
    expect(await store.listSeams()).toEqual(seams);
    expect(await store.outboxEntries()).toEqual(outbox);
    expect(await store.listReadings('s-1')).toHaveLength(readings.filter((r) => r.seamId === 's-1').length);
    expect(await store.listTagLinks()).toEqual([]);
    await store.linkTag('s-1', 'KP-UP', 'typed');
    expect((await store.lookupTag('KP-UP')).link?.seamId).toBe('s-1');
    expect((await store.outboxEntries()).length).toBe(outbox.length + 1);
  });
});
