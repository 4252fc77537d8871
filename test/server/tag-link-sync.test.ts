// Tag link records travel like readings: accepted and stored as sent, answered as duplicates when resent, refused
// with a reason when the tag is not clean text, and never left out of (or counted in) the seam's grade.
import { describe, expect, it } from 'vitest';
import { judgeRecord, type BatchReply } from '../../src/protocol/index.js';
import { uuidv7 } from '../../src/store/ids.js';
import { allNoneFound, bodies, T0, testSeam, toeReading } from './records.js';
import { jsonOf, testServer } from './support.js';

const tagBody = (seamId: string, tag: string, action: 'link' | 'unlink' = 'link') => ({
  seamId,
  action,
  tag,
  via: 'camera',
  at: T0,
});

describe('tag link records', () => {
  it('are accepted, stored with their body and kept out of the grade without being left out', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const seam = testSeam();
    device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
    device.add('round', uuidv7(), bodies.round(seam.id));
    for (const [item, answer] of allNoneFound())
      device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, item, answer));
    const reading = toeReading(seam.id, 160);
    device.add('reading', reading.id, bodies.reading(reading));
    const payload = `<img src=x onerror=alert(1)>"'; DROP TABLE records;--`;
    const linkId = uuidv7();
    device.add('tagLink', linkId, tagBody(seam.id, payload));
    const unlinkId = uuidv7();
    device.add('tagLink', unlinkId, tagBody(seam.id, payload, 'unlink'));
    const batch = await device.seal();
    const sent = await device.send(server, batch);
    expect(sent.status).toBe(200);
    expect((sent.body as BatchReply).results.every((r) => r.status === 'accepted')).toBe(true);

    const stored = await server.storage.listRecords({ seamId: seam.id });
    const links = stored.filter((r) => r.kind === 'tagLink');
    expect(links.map((r) => r.id)).toEqual([linkId, unlinkId]);
    expect(JSON.parse(links[0]?.body ?? '{}')).toEqual(tagBody(seam.id, payload));

    await server.settle();
    const view = await jsonOf<{ serverGrade: { state: string; summary: { leftOut: unknown[] } } }>(
      await server.admin('GET', `/seams/${seam.id}`),
    );
    expect(view.serverGrade.state).toBe('graded');
    expect(view.serverGrade.summary.leftOut).toEqual([]);

    // Sent again byte for byte: answered as duplicates, stored once.
    const again = await device.post(server, '/api/sync/batches', batch.body);
    const statuses = (again.body as BatchReply).results.map((r) => r.status);
    expect(new Set(statuses)).toEqual(new Set(['duplicate']));
    expect(
      (await server.storage.listRecords({ seamId: seam.id })).filter((r) => r.kind === 'tagLink'),
    ).toHaveLength(2);
  });

  it('refuses a tag that is not clean text, or empty, naming the field', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const seamId = uuidv7();
    device.add('tagLink', uuidv7(), tagBody(seamId, '  padded '));
    device.add('tagLink', uuidv7(), tagBody(seamId, ''));
    device.add('tagLink', uuidv7(), { ...tagBody(seamId, 'KP-1'), action: 'move' });
    const sent = await device.send(server, await device.seal());
    const results = (sent.body as BatchReply).results;
    expect(results.map((r) => r.status)).toEqual(['rejected', 'rejected', 'rejected']);
    expect(results[0]?.reason).toMatch(/^body\.tag: must be clean tag text/);
    expect(results[1]?.reason).toMatch(/^body\.tag: /);
    expect(results[2]?.reason).toMatch(/^body\.action: must be one of "link", "unlink"/);
    expect(await server.storage.listRecords({ seamId })).toEqual([]);
  });
});

describe('judgeRecord for tag links', () => {
  it('takes control characters inside a tag as data', () => {
    const seamId = 'seam-1';
    const verdict = judgeRecord({
      id: 't-1',
      kind: 'tagLink',
      schemaVersion: 1,
      seq: 1,
      seamId,
      createdAt: T0,
      body: tagBody(seamId, 'A\u001DB'),
    });
    expect(verdict.status).toBe('valid');
  });
});
