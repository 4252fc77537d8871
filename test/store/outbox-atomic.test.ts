// Every live change and its outbox entry are written in one transaction; demo records never enter the outbox.
import { describe, expect, it } from 'vitest';
import type { OutboxBodies } from '../../src/store/api.js';
import { butt, freshStore, rejection, undercut } from './support.js';

describe('outbox', () => {
  it('queues one entry per live change, in the order the changes were made', async () => {
    let n = 0;
    const store = await freshStore({ newId: () => `id-${++n}` });
    await store.saveSeam(butt('s-1'));
    await store.saveSeam(butt('s-1', { length: 900 }));
    await store.startRound('s-1', 'afterRepair');
    await store.answerChecklist('s-1', 2, 'crack', { answer: 'noneFound' });
    await store.appendReading('s-1', undercut('r-1', 0.2, { round: 2 }));
    const entries = await store.outboxEntries();
    expect(entries.map((e) => [e.seq, e.kind, e.recordId, e.seamId])).toEqual([
      [1, 'seamSetup', 'id-1', 's-1'],
      [2, 'round', 'id-2', 's-1'],
      [3, 'seamSetup', 'id-3', 's-1'],
      [4, 'round', 'id-5', 's-1'],
      [5, 'checklistAnswer', 'id-6', 's-1'],
      [6, 'reading', 'r-1', 's-1'],
    ]);
    expect((entries[2]?.body as OutboxBodies['seamSetup']).revision).toBe(2);
    expect((entries[2]?.body as OutboxBodies['seamSetup']).seam.length).toBe(900);
    expect(entries[4]?.body).toMatchObject({
      seamId: 's-1',
      round: 2,
      item: 'crack',
      answer: { answer: 'noneFound' },
    });
    expect((entries[5]?.body as OutboxBodies['reading']).reading.id).toBe('r-1');
    expect(await store.outboxCount()).toBe(6);
    expect((await store.outboxEntries(2)).map((e) => e.seq)).toEqual([1, 2]);
  });

  it('queues nothing for changes that change nothing or are refused', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.answerChecklist('s-1', 1, 'crack', { answer: 'noneFound' });
    const before = await store.outboxCount();
    await store.saveSeam(butt('s-1'));
    await store.answerChecklist('s-1', 1, 'crack', { answer: 'noneFound' });
    await store.setSummary('s-1', {
      state: 'noReadings',
      levelMet: null,
      meetsRequired: null,
      readingCount: 0,
      gradedAt: '2026-12-01T10:00:00Z',
    });
    await rejection(store.appendReading('s-1', undercut('r-1', 0.2, { round: 5 })));
    expect(await store.outboxCount()).toBe(before);
  });

  it('saves neither the record nor its entry when the entry cannot be written', async () => {
    // Every outbox record id is the same here, so a new seam's round entry collides with its set-up entry (the
    // outbox allows one entry per record id) and the whole transaction must roll back: no seam, no round.
    const store = await freshStore({ newId: () => 'always-the-same' });
    const error = await rejection(store.saveSeam(butt('s-1')));
    expect(error.code).toBe('notSaved');
    expect(await store.getSeam('s-1')).toBeUndefined();
    expect(await store.listRounds('s-1')).toEqual([]);
    expect(await store.outboxCount()).toBe(0);
  });

  it('keeps neither a reading nor its order number when its entry cannot be queued', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    // Plant an outbox entry for record "r-x" (as a restored backup could), so the reading's own entry collides.
    const planted = {
      seq: 99,
      recordId: 'r-x',
      kind: 'reading',
      seamId: 's-1',
      body: { seamId: 's-1' },
      createdAt: '2026-12-01T08:00:00Z',
    };
    const report = await store.importBackup({
      format: 'beadbook.backup/1',
      exportedAt: '2026-12-01T08:00:00Z',
      seams: [],
      rounds: [],
      readings: [],
      outbox: [planted],
    });
    expect(report.outboxAdded).toBe(1);
    const error = await rejection(store.appendReading('s-1', undercut('r-x', 0.2)));
    expect(error.code).toBe('notSaved');
    expect(await store.listReadings('s-1')).toEqual([]);
    const next = await store.appendReading('s-1', undercut('r-y', 0.2));
    expect(next.localSeq).toBe(1);
  });

  it('rolls back a new revision whose entry collides, keeping the earlier revision', async () => {
    let n = 0;
    const ids = ['a', 'b', 'a'];
    const store = await freshStore({ newId: () => ids[n++ % ids.length] ?? 'x' });
    await store.saveSeam(butt('s-1')); // entries a (set-up), b (round 1)
    const error = await rejection(store.saveSeam(butt('s-1', { length: 700 }))); // set-up entry "a" again
    expect(error.code).toBe('notSaved');
    expect(error.message).toMatch(/^Not saved: /);
    const seam = await store.getSeam('s-1');
    expect(seam?.revision).toBe(1);
    expect(seam?.seam.length).toBe(1000);
    expect(await store.outboxCount()).toBe(2);
  });

  it('never queues demo records', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('d-1'), 'demo');
    await store.saveSeam(butt('d-1', { length: 800 })); // an existing seam keeps its namespace
    await store.startRound('d-1', 'afterRepair');
    await store.answerChecklist('d-1', 2, 'crack', { answer: 'noneFound' });
    const reading = await store.appendReading('d-1', undercut('d-r1', 0.2, { round: 2 }));
    expect(reading.namespace).toBe('demo');
    expect(await store.loadDemo()).toBeGreaterThan(0);
    expect(await store.outboxCount()).toBe(0);
    expect((await store.getSeam('d-1'))?.revision).toBe(2);
  });
});
