// The readings the ingest hands to the re-grade: the grade made from them is the one a re-grade from storage
// makes, and only readings stored just now, with the content they were stored with, are handed over.
import { describe, expect, it } from 'vitest';
import { FreshReadings } from '../../src/server/grading/fresh-readings.js';
import type { BatchReply } from '../../src/protocol/index.js';
import { uuidv7 } from '../../src/store/ids.js';
import { allNoneFound, bodies, testSeam, toeReading } from './records.js';
import type { SimDevice } from './sim-device.js';
import { testServer, type TestServer } from './support.js';

function queueSeam(device: SimDevice, n: number) {
  const seam = testSeam(uuidv7());
  device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
  device.add('round', uuidv7(), bodies.round(seam.id));
  for (const [item, answer] of allNoneFound())
    device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, item, answer));
  const readings = Array.from({ length: n }, (_, i) =>
    toeReading(seam.id, 95 + ((i * 7) % 80), { position: 10 + i }),
  );
  for (const r of readings) device.add('reading', r.id, bodies.reading(r));
  return { seam, readings };
}

async function gradeOf(server: TestServer, seamId: string) {
  const g = await server.storage.getServerGrade(seamId);
  if (!g) throw new Error(`seam ${seamId} was not graded`);
  return {
    basedOn: g.basedOn,
    state: g.state,
    levelMet: g.levelMet,
    summary: JSON.parse(g.summary) as unknown,
  };
}

describe('readings handed from the ingest to the re-grade', () => {
  it('grade the seam exactly as the same readings read back from storage do', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 40);
    // Valid on its own but not on this butt seam: left out of the grade, with its reason, either way.
    const misfit = { ...toeReading(seam.id, 150), side: 'face' as const, values: { throat: 4 } };
    delete (misfit as { toe?: unknown }).toe;
    device.add('reading', misfit.id, bodies.reading(misfit));
    const sent = await device.send(server, await device.seal());
    expect((sent.body as BatchReply).results.every((r) => r.status === 'accepted')).toBe(true);
    await server.settle();
    const fromIngest = await gradeOf(server, seam.id);
    expect(server.deps.regrader.fresh.size).toBe(0);

    await server.deps.regrader.regrade(seam.id);
    const fromStorage = await gradeOf(server, seam.id);
    expect(fromIngest).toEqual(fromStorage);
    expect(fromStorage.summary).toMatchObject({ readingCount: 40, leftOut: [{ recordId: misfit.id }] });
  });

  it('are only those stored just now: never a duplicate, nor a record whose id holds other content', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { readings } = queueSeam(device, 3);
    const batch = await device.seal();
    await device.send(server, batch);
    await server.settle();

    const again = await device.post(server, '/api/sync/batches', batch.body);
    expect((again.body as BatchReply).results.every((r) => r.status === 'duplicate')).toBe(true);
    const original = readings[0] as (typeof readings)[number];
    device.add('reading', original.id, bodies.reading({ ...original, values: { toeAngle: 91 } }));
    const conflict = await device.send(server, await device.seal());
    expect((conflict.body as BatchReply).results.map((r) => r.status)).toEqual(['rejected']);
    expect(server.deps.regrader.fresh.size).toBe(0);
  });
});

describe('FreshReadings', () => {
  const reading = (toeAngle: number) => toeReading('seam-1', toeAngle);

  it('holds readings per seam until their seam is taken', () => {
    const fresh = new FreshReadings();
    const [a, b, c] = [reading(120), reading(130), reading(140)];
    fresh.add('seam-1', a.id, a);
    fresh.add('seam-1', b.id, b);
    fresh.add('seam-2', c.id, c);
    expect(fresh.size).toBe(3);
    expect([...fresh.take('seam-1').keys()]).toEqual([a.id, b.id]);
    expect(fresh.size).toBe(1);
    expect(fresh.take('seam-1').size).toBe(0);
    expect(fresh.take('seam-2').get(c.id)).toBe(c);
    expect(fresh.size).toBe(0);
  });

  it('leaves a reading holding -0 to be read back, since its stored body says 0', () => {
    const fresh = new FreshReadings();
    const r = { ...reading(120), position: -0 };
    fresh.add('seam-1', r.id, r);
    expect(fresh.size).toBe(0);
  });
});
