// The readings the ingest hands to the re-grade: the grade made from them is the one a re-grade from storage
// makes, and only readings stored just now, with the content they were stored with, are handed over.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { FreshReadings, parsesLikeItsCanonicalText } from '../../src/server/grading/fresh-readings.js';
import { canonicalJson, jwsBody, signJws, type BatchReply } from '../../src/protocol/index.js';
import { uuidv7 } from '../../src/store/ids.js';
import { allNoneFound, bodies, testSeam, toeReading } from './records.js';
import type { SimDevice } from './sim-device.js';

/** Equal as JSON values, telling -0 from 0 (which toEqual may not). */
function sameJson(a: unknown, b: unknown): boolean {
  if (typeof a === 'number' || typeof b === 'number') return Object.is(a, b);
  if (typeof a !== 'object' || a === null || typeof b !== 'object' || b === null) return a === b;
  const [ka, kb] = [Object.keys(a), Object.keys(b)];
  const ra = a as Record<string, unknown>;
  const rb = b as Record<string, unknown>;
  return (
    Array.isArray(a) === Array.isArray(b) &&
    ka.length === kb.length &&
    ka.every((k) => k in rb && sameJson(ra[k], rb[k]))
  );
}
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

describe('a batch whose text holds a negative number', () => {
  it('hands nothing over, so a -0 (stored as 0) is graded as stored', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const { seam } = queueSeam(device, 3);
    const sealed = await device.seal();
    const text = Buffer.from(sealed.jws.payload, 'base64url')
      .toString('utf8')
      .replace('"position":10,', '"position":-0,');
    expect(text).toContain('"position":-0,');
    const body = jwsBody(await signJws(text, 'batch', device.key.privateKey, device.kid));
    let held = -1;
    const take = server.deps.regrader.fresh.take.bind(server.deps.regrader.fresh);
    server.deps.regrader.fresh.take = (seamId) => {
      const readings = take(seamId);
      held = readings.size;
      return readings;
    };
    const sent = await device.post(server, '/api/sync/batches', body);
    expect((sent.body as BatchReply).results.every((r) => r.status === 'accepted')).toBe(true);
    await server.settle();
    expect(held).toBe(0);
    const fromIngest = await gradeOf(server, seam.id);
    await server.deps.regrader.regrade(seam.id);
    expect(fromIngest).toEqual(await gradeOf(server, seam.id));
  });
});

describe('parsesLikeItsCanonicalText', () => {
  it('says no to text with a value that could parse to -0, and to a minus where a value could start', () => {
    for (const text of ['{"a":-0}', '[1,-0.0]', '{"a": -1e-400}', '[ -0 ]', '{"note":"a:-b"}'])
      expect(parsesLikeItsCanonicalText(text)).toBe(false);
    expect(parsesLikeItsCanonicalText('{"a":"x-0","b":[0,1e-400],"c":"2026-12-01"}')).toBe(true);
  });

  it('says yes only when parsing the text gives what parsing its canonical text gives', () => {
    fc.assert(
      fc.property(fc.jsonValue(), fc.boolean(), (value, minusZeros) => {
        // JSON.stringify never writes -0, so some zeros are written as -0 by hand.
        const plain = JSON.stringify(value);
        const text = minusZeros ? plain.replace(/([:,[])0(?=[,\]}])/g, '$1-0') : plain;
        const parsed: unknown = JSON.parse(text);
        if (parsesLikeItsCanonicalText(text))
          expect(sameJson(parsed, JSON.parse(canonicalJson(parsed)))).toBe(true);
      }),
      { numRuns: 500, seed: 11 },
    );
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
});
