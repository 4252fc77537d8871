// listReadings(seamId, afterLocalSeq): what a screen holding the earlier readings reads after a save.
import { describe, expect, it } from 'vitest';
import { butt, freshStore, undercut } from './support.js';

describe('reading only what is new', () => {
  it('returns the seam readings entered after the given local sequence number, in order of entry', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.saveSeam(butt('s-2'));
    const first = await store.appendReading('s-1', undercut('r-1', 0.1));
    await store.appendReading('s-2', undercut('other', 0.1, { seamId: 's-2' }));
    await store.appendReading('s-1', undercut('r-2', 0.2));
    await store.appendReading('s-1', undercut('r-3', 0.3));

    const after = await store.listReadings('s-1', first.localSeq);
    expect(after.map((r) => r.reading.id)).toEqual(['r-2', 'r-3']);
    expect(after.every((r) => r.localSeq > first.localSeq)).toBe(true);
    const last = after[after.length - 1]?.localSeq ?? 0;
    expect(await store.listReadings('s-1', last)).toEqual([]);
    expect((await store.listReadings('s-1')).map((r) => r.reading.id)).toEqual(['r-1', 'r-2', 'r-3']);
  });
});
