// IndexedDB commits a transaction as soon as it has no pending request, so code that awaits anything else
// inside one (a timer, a fetch, crypto) loses its transaction. The store prepares everything first; these tests
// show that many overlapping calls all land, each exactly once.
import { describe, expect, it } from 'vitest';
import { butt, fillet, freshStore, undercut } from './support.js';

const tick = () => new Promise((resolve) => setTimeout(resolve, 0));

describe('transactions and concurrency', () => {
  it('lands 50 parallel appends, each with its own order number and one outbox entry', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const ids = Array.from({ length: 50 }, (_, i) => `r-${String(i).padStart(2, '0')}`);
    const records = await Promise.all(
      ids.map((id, i) => store.appendReading('s-1', undercut(id, 0.1, { position: i * 10 }))),
    );
    const seqs = records.map((r) => r.localSeq);
    expect(new Set(seqs).size).toBe(50);
    expect([...seqs].sort((a, b) => a - b)).toEqual(Array.from({ length: 50 }, (_, i) => i + 1));
    const listed = await store.listReadings('s-1');
    expect(listed.map((r) => r.reading.id).sort()).toEqual(ids);
    expect(listed.map((r) => r.localSeq)).toEqual(Array.from({ length: 50 }, (_, i) => i + 1));
    // The outbox holds the readings in the same order as their order numbers.
    const queued = (await store.outboxEntries()).filter((e) => e.kind === 'reading').map((e) => e.recordId);
    expect(queued).toEqual(listed.map((r) => r.reading.id));
  });

  it('lands every one of many mixed calls on several seams while timers keep the event loop busy', async () => {
    const store = await freshStore();
    await Promise.all([store.saveSeam(butt('s-1')), store.saveSeam(fillet('f-1'))]);
    const busy = Array.from({ length: 20 }, tick);
    const work = [
      ...Array.from({ length: 20 }, (_, i) => store.appendReading('s-1', undercut(`s-${i}`, 0.1))),
      ...Array.from({ length: 20 }, (_, i) => store.appendReading('f-1', undercut(`f-${i}`, 0.1))),
      store.startRound('s-1', 'additional'),
      store.startRound('f-1', 'additional'),
      store.answerChecklist('s-1', 1, 'crack', { answer: 'noneFound' }),
      store.answerChecklist('f-1', 1, 'spatter', { answer: 'present', position: 20 }),
      store.saveSeam(butt('s-1', { length: 1100 })),
      store.loadDemo(),
    ];
    const results = await Promise.allSettled([...work, ...busy]);
    expect(results.filter((r) => r.status === 'rejected')).toEqual([]);
    expect(await store.listReadings('s-1')).toHaveLength(20);
    expect(await store.listReadings('f-1')).toHaveLength(20);
    const kinds = (await store.outboxEntries()).map((e) => e.kind);
    expect(kinds.filter((k) => k === 'reading')).toHaveLength(40);
    expect(kinds.filter((k) => k === 'round')).toHaveLength(2 + 2);
    expect(kinds.filter((k) => k === 'checklistAnswer')).toHaveLength(2);
    expect(kinds.filter((k) => k === 'seamSetup')).toHaveLength(2 + 1);
    const all = [...(await store.listReadings('s-1')), ...(await store.listReadings('f-1'))].map(
      (r) => r.localSeq,
    );
    expect(new Set(all).size).toBe(40);
  });

  it('refuses all but one of the same reading appended in parallel', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const results = await Promise.allSettled(
      Array.from({ length: 10 }, () => store.appendReading('s-1', undercut('r-1', 0.2))),
    );
    expect(results.filter((r) => r.status === 'fulfilled')).toHaveLength(1);
    expect(await store.listReadings('s-1')).toHaveLength(1);
    expect((await store.outboxEntries()).filter((e) => e.kind === 'reading')).toHaveLength(1);
  });
});
