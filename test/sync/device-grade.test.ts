// The grade the tablet showed travels with its batches (protocol 1's optional deviceGrades), so the review can set
// it beside the server's own: the sender takes it from the store's cache of the last grade shown, for live seams in
// the batch only, and the seam page highlights a difference.
import { describe, expect, it } from 'vitest';
import { parseBatchPayload } from '../../src/protocol/index.js';
import { testServer } from '../server/support.js';
import { butt } from '../store/support.js';
import { enrol, seamWithReadings, tablet } from './support.js';

const shown = (levelMet: 'B' | 'C' | 'D' | 'belowD', readingCount: number) => ({
  state: 'graded' as const,
  levelMet,
  meetsRequired: levelMet !== 'D' && levelMet !== 'belowD',
  readingCount,
  gradedAt: '2026-12-01T10:00:00.000Z',
});

const payloadOf = (body: string) =>
  parseBatchPayload(
    JSON.parse(Buffer.from((JSON.parse(body) as { payload: string }).payload, 'base64url').toString('utf8')),
  );

describe('device grades in batches', () => {
  it('sends the grade last shown for each live seam of the batch, and the server keeps it beside its own', async () => {
    const server = await testServer();
    const t = await tablet(server);
    await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 2);
    await t.store.setSummary('s-1', shown('belowD', 2));
    // Graded on the tablet too, but a demo seam: never sent, and neither is its grade.
    await t.store.saveSeam(butt('d-1'), 'demo');
    await t.store.setSummary('d-1', shown('B', 0));
    // A live seam never graded on the tablet: its records go, with no grade.
    await seamWithReadings(t.store, 's-2', 1);

    expect((await t.sender.sendNow()).state).toBe('idle');
    const payloads = t.wire.bodies.map(payloadOf);
    expect(payloads.flatMap((p) => p.deviceGrades ?? [])).toEqual([{ seamId: 's-1', ...shown('belowD', 2) }]);
    await server.settle();

    const [kept] = await server.storage.listDeviceGrades('s-1');
    expect(JSON.parse(kept?.grade ?? '{}')).toMatchObject({ levelMet: 'belowD', readingCount: 2 });
    expect(await server.storage.listDeviceGrades('s-2')).toEqual([]);

    // The server grades the same readings itself; the tablet's "below D" differs and is highlighted.
    const page = await server.request('/supervisor/review/seams/s-1', {
      headers: { cookie: await server.supervisorCookie() },
    });
    const html = await page.text();
    expect(html).toMatch(/<tr class="mismatch-row">\s*<th scope="row">Device Test tablet/);
    expect(html).toContain('⚠ The newest device grade differs from the server');
    const server1 = JSON.parse((await server.storage.getServerGrade('s-1'))?.summary ?? '{}') as {
      levelMet: string;
    };
    expect(server1.levelMet).not.toBe('belowD');
  });

  it('shows no difference when the tablet agrees, and a later batch replaces the tablet’s earlier grade', async () => {
    const server = await testServer();
    const t = await tablet(server);
    await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 1);
    await t.store.setSummary('s-1', shown('D', 1));
    await t.sender.sendNow();
    await server.settle();
    const serverLevel = (
      JSON.parse((await server.storage.getServerGrade('s-1'))?.summary ?? '{}') as {
        levelMet: 'B' | 'C' | 'D' | 'belowD';
      }
    ).levelMet;
    // The tablet graded again after a new reading, with the server's level this time.
    await t.store.appendReading('s-1', {
      id: 's-1-r9',
      round: 1,
      position: 500,
      sampling: 'atPitch',
      toe: { plate: 1, side: 'face' },
      values: { undercutDepth: 0.1 },
      instrument: { id: 'G-1', resolutionMm: 0.1, resolutionDeg: 1 },
      source: { kind: 'gauge' },
      recordedAt: '2026-12-01T11:00:00Z',
    });
    await t.store.setSummary('s-1', shown(serverLevel, 2));
    await t.sender.sendNow();
    await server.settle();
    const grades = await server.storage.listDeviceGrades('s-1');
    expect(grades).toHaveLength(1);
    expect(JSON.parse(grades[0]?.grade ?? '{}')).toMatchObject({ levelMet: serverLevel, readingCount: 2 });
    const html = await (
      await server.request('/supervisor/review/seams/s-1', {
        headers: { cookie: await server.supervisorCookie() },
      })
    ).text();
    expect(html).not.toContain('⚠ The newest device grade differs from the server');
  });
});
