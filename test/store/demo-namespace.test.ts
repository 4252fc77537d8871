// The demo yard in the store: loaded once however often it is asked for, never queued for the server, and
// removed without touching live work.
import { describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile } from '../../src/domain/index.js';
import { kestrelPointYard } from '../../src/demo/kestrel-point-yard.js';
import { butt, freshStore, undercut } from './support.js';

describe('demo namespace', () => {
  it('loads the yard as demo records, once, with nothing in the outbox', async () => {
    const store = await freshStore();
    const yard = kestrelPointYard();
    expect(await store.loadDemo()).toBe(yard.length);
    expect(await store.loadDemo()).toBe(0);
    const seams = await store.listSeams();
    expect(seams).toHaveLength(yard.length);
    expect(seams.every((s) => s.namespace === 'demo')).toBe(true);
    const readings = await Promise.all(yard.map((f) => store.listReadings(f.seam.id)));
    expect(readings.flat()).toHaveLength(yard.reduce((n, f) => n + f.readings.length, 0));
    expect(readings.flat().every((r) => r.namespace === 'demo')).toBe(true);
    expect(await store.outboxCount()).toBe(0);
  });

  it('gives back each demo seam as the same seam file, with the same grade', async () => {
    const store = await freshStore();
    await store.loadDemo();
    for (const original of kestrelPointYard()) {
      const file = await store.seamFile(original.seam.id);
      expect(file).toEqual(original);
      const parsed = parseSeamFile(file);
      expect(parsed.ok).toBe(true);
      if (parsed.ok) expect(gradeSeam(parsed.value)).toEqual(gradeSeam(original));
    }
  });

  it('removes only demo records, including readings added to demo seams, and can load again', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.appendReading('s-1', undercut('r-1', 0.2));
    const yard = kestrelPointYard();
    await store.loadDemo();
    const demoSeam = yard[0]?.seam.id ?? '';
    await store.appendReading(
      demoSeam,
      undercut('extra-demo-reading', 0.2, { toe: { plate: 1, side: 'face' } }),
    );
    const outboxBefore = await store.outboxEntries();
    expect(await store.removeDemo()).toBe(yard.length);
    expect((await store.listSeams()).map((s) => s.id)).toEqual(['s-1']);
    expect(await store.listReadings(demoSeam)).toEqual([]);
    expect(await store.listRounds(demoSeam)).toEqual([]);
    expect((await store.listReadings('s-1')).map((r) => r.reading.id)).toEqual(['r-1']);
    expect(await store.listRounds('s-1')).toHaveLength(1);
    expect(await store.outboxEntries()).toEqual(outboxBefore);
    expect(await store.removeDemo()).toBe(0);
    expect(await store.loadDemo()).toBe(yard.length);
  });
});
