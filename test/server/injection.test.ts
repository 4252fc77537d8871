// F13: quotes, SQL, HTML and script in field names, tag text, labels and device names are stored and returned
// as data, and shown escaped.
import { describe, expect, it } from 'vitest';
import { uuidv7 } from '../../src/store/ids.js';
import type { BatchReply } from '../../src/protocol/index.js';
import { bodies, testSeam, toeReading } from './records.js';
import { jsonOf, ORIGIN, recordCounts, testServer } from './support.js';

const NASTY = [
  `Robert'); DROP TABLE records;--`,
  `" OR 1=1 --`,
  `<script>alert("seam")</script>`,
  `<img src=x onerror=alert(1)>`,
  `%s %d \\u0000 \u202e reversed`,
  `'; UPDATE devices SET revoked_at = NULL; --`,
];

describe('F13: hostile text is data', () => {
  it('stores labels, tags and notes with quotes, SQL and markup byte for byte, and returns them unchanged', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const seam = testSeam(uuidv7(), {
      label: NASTY[0] as string,
      tags: NASTY.slice(1, 5),
      drawing: NASTY[5] as string,
    });
    device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
    device.add('round', uuidv7(), {
      ...bodies.round(seam.id),
      examiner: { name: NASTY[2] as string, qualification: NASTY[1] as string },
    });
    const note = {
      ...bodies.answer(seam.id, 'spatter', 'present'),
      answer: { answer: 'present' as const, position: 5, note: NASTY.join(' | ') },
    };
    device.add('checklistAnswer', uuidv7(), note);
    const r = toeReading(seam.id, 150, { instrument: { id: NASTY[1] as string } });
    device.add('reading', r.id, bodies.reading(r));
    const sent = await device.send(server, await device.seal());
    expect((sent.body as BatchReply).results.every((x) => x.status === 'accepted')).toBe(true);
    const records = await jsonOf<{ kind: string; body: Record<string, unknown> }[]>(
      await server.admin('GET', `/records?seamId=${encodeURIComponent(seam.id)}`),
    );
    expect(records.find((x) => x.kind === 'seamSetup')?.body['seam']).toEqual(seam);
    expect(records.find((x) => x.kind === 'checklistAnswer')?.body).toEqual(note);
    expect(records.find((x) => x.kind === 'reading')?.body).toEqual(bodies.reading(r));
    const counts = await recordCounts(server.storage);
    expect(counts['records']).toBe(4);
    expect((await server.storage.listDevices()).every((d) => d.revokedAt === null)).toBe(true);
  });

  it('rejects unknown field names with hostile text as data, quoted in the reason, and stores nothing of them', async () => {
    const server = await testServer();
    const device = await server.enrolDevice();
    const seam = testSeam();
    const r = toeReading(seam.id, 150);
    const hostile = { ...r, values: { ...r.values, [`toeAngle"); DROP TABLE records;--`]: 1 } };
    device.add('reading', r.id, bodies.reading(hostile as typeof r));
    const r2 = toeReading(seam.id, 150);
    device.add('reading', r2.id, { ...bodies.reading(r2), '<script>x</script>': 2 } as never);
    const sent = await device.send(server, await device.seal());
    const [first, second] = (sent.body as BatchReply).results;
    expect(first?.status).toBe('rejected');
    expect(first?.reason).toContain('DROP TABLE records');
    expect(first?.reason).toContain('unknown field');
    expect(second?.status).toBe('rejected');
    expect(second?.reason).toContain('body.<script>x</script>: unknown field');
    expect((await recordCounts(server.storage))['records']).toBe(0);
    expect((await server.storage.listSecurityEvents(5)).length).toBe(0);
  });

  it('shows hostile device names and seam labels escaped on the supervisor pages', async () => {
    const server = await testServer();
    const device = await server.enrolDevice(NASTY[2]);
    const seam = testSeam(uuidv7(), { label: NASTY[3] as string });
    expect((await server.admin('PUT', `/seams/${seam.id}`, { seam })).status).toBe(201);
    await server.settle();
    const cookie = await server.supervisorCookie();
    const devices = await (await server.request('/supervisor/devices', { headers: { cookie } })).text();
    expect(devices).not.toContain('<script>alert');
    expect(devices).toContain('&lt;script&gt;alert(&quot;seam&quot;)&lt;/script&gt;');
    const seams = await (await server.request('/supervisor/seams', { headers: { cookie } })).text();
    expect(seams).not.toContain('<img src=x');
    expect(seams).toContain('&lt;img src=x onerror=alert(1)&gt;');
    // Renaming to markup through the form is data too.
    await server.request(`/supervisor/devices/${device.kid}/name`, {
      method: 'POST',
      headers: { cookie, origin: ORIGIN, 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ name: `"><b>bold</b>` }).toString(),
    });
    expect((await server.storage.getDevice(device.kid))?.name).toBe(`"><b>bold</b>`);
    const after = await (await server.request('/supervisor/devices', { headers: { cookie } })).text();
    expect(after).not.toContain('<b>bold</b>');
  });
});
