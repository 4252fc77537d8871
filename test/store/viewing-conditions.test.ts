// A round's viewing and lighting conditions on the tablet: kept on the round and queued for the server in one
// transaction; a correction queues a new record and keeps the earlier one in the outbox; bad values change nothing.
import { describe, expect, it } from 'vitest';
import { judgeRecord, recordFromOutbox } from '../../src/protocol/index.js';
import { butt, freshStore, rejection } from './support.js';

const DIRECT = {
  viewing: 'direct',
  illuminanceLx: 500,
  distanceMm: 300,
  angleDeg: 60,
  aids: 'mirror',
} as const;

describe('viewing conditions', () => {
  it('keeps them on the round, queues each change as a viewing record the server accepts, and nothing for a repeat', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const round = await store.recordViewing('s-1', 1, DIRECT);
    expect(round.viewing).toEqual(DIRECT);
    expect((await store.recordViewing('s-1', 1, { ...DIRECT })).viewing).toEqual(DIRECT);
    await store.recordViewing('s-1', 1, { viewing: 'remote', illuminanceLx: 800, aids: 'borescope' });
    const [kept] = await store.listRounds('s-1');
    expect(kept?.viewing).toEqual({ viewing: 'remote', illuminanceLx: 800, aids: 'borescope' });
    const queued = (await store.outboxEntries()).filter((e) => e.kind === 'viewing');
    expect(queued.map((e) => (e.body as { conditions: { viewing: string } }).conditions.viewing)).toEqual([
      'direct',
      'remote',
    ]);
    for (const e of queued) expect(judgeRecord(recordFromOutbox(e)).status).toBe('valid');
  });

  it('refuses values out of range or a round not started, changing nothing', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const before = await store.outboxEntries();
    const bad = await rejection(store.recordViewing('s-1', 1, { ...DIRECT, angleDeg: 95 }));
    expect(bad.code).toBe('invalid');
    expect(bad.message).toMatch(/angleDeg: must be at most 90 degrees/);
    const missing = await rejection(store.recordViewing('s-1', 2, DIRECT));
    expect(missing.code).toBe('notFound');
    expect((await store.listRounds('s-1'))[0]?.viewing).toBeUndefined();
    expect(await store.outboxEntries()).toEqual(before);
  });

  it('keeps a demo seam’s conditions on the tablet only', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('d-1'), 'demo');
    await store.recordViewing('d-1', 1, DIRECT);
    expect((await store.listRounds('d-1'))[0]?.viewing).toEqual(DIRECT);
    expect((await store.outboxEntries()).filter((e) => e.kind === 'viewing')).toEqual([]);
  });

  it('survives a backup and its restore onto a fresh tablet', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.recordViewing('s-1', 1, DIRECT);
    const backup = await store.exportBackup();
    const other = await freshStore();
    await other.importBackup(JSON.parse(JSON.stringify(backup)) as unknown);
    expect((await other.listRounds('s-1'))[0]?.viewing).toEqual(DIRECT);
  });
});
