// A database as version 1 of the store left it on devices, written out by hand (not by the store's own
// migration code), so a change to shipped migration steps cannot go unnoticed.
import { openDB, type IDBPDatabase } from 'idb';
import { butt, undercut } from './support.js';

/** Three live readings (one acknowledged, two waiting), one demo reading; left open for the caller. */
export async function makeVersion1(name: string): Promise<IDBPDatabase> {
  const db = await openDB(name, 1, {
    upgrade(v1) {
      v1.createObjectStore('meta', { keyPath: 'key' });
      v1.createObjectStore('seams', { keyPath: 'id' }).createIndex('byNamespace', 'namespace');
      v1.createObjectStore('rounds', { keyPath: ['seamId', 'number'] });
      v1.createObjectStore('readings', { keyPath: 'reading.id' }).createIndex('bySeam', 'seamId');
      v1.createObjectStore('outbox', { keyPath: 'seq', autoIncrement: true }).createIndex(
        'byRecord',
        'recordId',
        {
          unique: true,
        },
      );
    },
  });
  const at = '2026-11-30T07:00:00.000Z';
  const tx = db.transaction(['meta', 'seams', 'rounds', 'readings', 'outbox'], 'readwrite');
  await tx.objectStore('meta').put({ key: 'created', createdAt: at });
  for (const [id, namespace] of [
    ['s-1', 'live'],
    ['d-1', 'demo'],
  ] as const) {
    await tx
      .objectStore('seams')
      .put({ id, namespace, seam: butt(id), revision: 1, createdAt: at, updatedAt: at });
    await tx
      .objectStore('rounds')
      .put({ seamId: id, number: 1, kind: 'first', startedAt: at, checklist: {} });
  }
  const reading = (seamId: string, namespace: string, id: string, time: string) =>
    tx.objectStore('readings').put({
      seamId,
      namespace,
      reading: undercut(id, 0.2, { recordedAt: `2026-11-30T${time}:00Z` }),
    });
  await reading('s-1', 'live', 'r-acknowledged', '07:00'); // already sent: no longer in the outbox
  await reading('d-1', 'demo', 'd-r1', '08:00');
  await reading('s-1', 'live', 'r-a', '08:20');
  await reading('s-1', 'live', 'r-z', '08:30');
  const entry = (kind: string, recordId: string) =>
    tx.objectStore('outbox').add({ recordId, kind, seamId: 's-1', body: { seamId: 's-1' }, createdAt: at });
  await entry('seamSetup', 'setup-1');
  await entry('round', 'round-1');
  // Entered r-z before r-a, though r-a's clock time is earlier: the outbox order is the evidence kept.
  await entry('reading', 'r-z');
  await entry('reading', 'r-a');
  await tx.done;
  return db;
}
