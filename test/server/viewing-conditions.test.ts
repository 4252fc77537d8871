// Viewing and lighting conditions per round: sent by the tablet as version-2 records, judged on their own, folded
// (a later record for the round corrects an earlier one, by the device's own order) and printed in the report in
// place of the blanks, which stay only for a round without them.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import {
  judgeRecord,
  recordFromOutbox,
  RECORD_SCHEMA_VERSION,
  type PullReply,
} from '../../src/protocol/index.js';
import { foldSeam, foldViewing } from '../../src/server/grading/fold.js';
import { VIEWING_HEADERS } from '../../src/server/review/viewing-columns.js';
import { uuidv7 } from '../../src/store/ids.js';
import { bodies, T0, testSeam, toeReading } from './records.js';
import { testServer, type TestServer } from './support.js';

const DIRECT = {
  viewing: 'direct',
  illuminanceLx: 650,
  distanceMm: 400,
  angleDeg: 45,
  lighting: 'hall lighting and hand lamp',
  aids: 'magnifier ×2',
} as const;

const viewingBody = (seamId: string, round: number, conditions: Record<string, unknown>) => ({
  seamId,
  round,
  conditions,
  recordedAt: T0,
});

async function report(server: TestServer, seamId: string): Promise<string> {
  const res = await server.request(`/supervisor/review/report?seam=${seamId}`, {
    headers: { cookie: await server.supervisorCookie() },
  });
  expect(res.status).toBe(200);
  return (await res.text()).replace(/<[^>]+>/g, ' ').replace(/\s+/g, ' ');
}

describe('viewing records', () => {
  it('travel as schema version 2 while every other kind stays version 1', () => {
    const entry = (kind: string, body: object) =>
      recordFromOutbox({ seq: 1, recordId: 'r-1', kind, seamId: 's-1', body, createdAt: T0 });
    expect(entry('viewing', viewingBody('s-1', 1, DIRECT)).schemaVersion).toBe(2);
    expect(entry('round', bodies.round('s-1')).schemaVersion).toBe(1);
    expect(RECORD_SCHEMA_VERSION).toBe(2);
    expect(judgeRecord(entry('viewing', viewingBody('s-1', 1, DIRECT))).status).toBe('valid');
  });

  it('are refused with a reason when out of range, unknown in shape, or claiming version 1', () => {
    const record = (conditions: Record<string, unknown>, schemaVersion = 2) => ({
      id: uuidv7(),
      kind: 'viewing',
      schemaVersion,
      seq: 1,
      seamId: 's-1',
      createdAt: T0,
      body: viewingBody('s-1', 1, conditions),
    });
    const reason = (r: unknown) => {
      const v = judgeRecord(r);
      return v.status === 'rejected' ? v.reason : v.status;
    };
    expect(reason(record({ ...DIRECT, angleDeg: 120 }))).toMatch(/conditions\.angleDeg: must be at most 90/);
    expect(reason(record({ ...DIRECT, illuminanceLx: -5 }))).toMatch(/conditions\.illuminanceLx/);
    expect(reason(record({ ...DIRECT, viewing: 'sideways' }))).toMatch(/conditions\.viewing/);
    expect(reason(record({ ...DIRECT, lux: 500 }))).toMatch(/unknown field/);
    expect(reason(record(DIRECT, 1))).toMatch(/schemaVersion: a viewing record has schema version 2/);
    // A newer schema than this server knows is parked, as for any kind.
    expect(judgeRecord(record(DIRECT, RECORD_SCHEMA_VERSION + 1)).status).toBe('parked');
  });
});

/**
 * A seam whose round 1 conditions were given and then corrected (650 lx in force), with a reading in round 1 and
 * a round 2 with none, sent and graded.
 */
async function seamWithCorrectedViewing(server: TestServer) {
  const device = await server.enrolDevice('Bay 4 tablet');
  const seam = testSeam(undefined, { label: 'Hatch coaming butt' });
  device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
  device.add('round', uuidv7(), bodies.round(seam.id, 1));
  device.add('viewing', uuidv7(), viewingBody(seam.id, 1, { ...DIRECT, illuminanceLx: 300 }));
  const r = toeReading(seam.id, 160);
  device.add('reading', r.id, bodies.reading(r));
  // The correction comes later in the device's own order.
  device.add('viewing', uuidv7(), viewingBody(seam.id, 1, DIRECT));
  device.add('round', uuidv7(), bodies.round(seam.id, 2));
  const sent = await device.send(server, await device.seal());
  expect(sent.status).toBe(200);
  expect((sent.body as { results: { status: string }[] }).results.map((x) => x.status)).toEqual(
    Array(6).fill('accepted'),
  );
  await server.settle();
  return { device, seam };
}

describe('viewing conditions in the report', () => {
  it('prints each round’s latest conditions and leaves blanks only for a round without them', async () => {
    const server = await testServer();
    const { device, seam } = await seamWithCorrectedViewing(server);

    const text = await report(server, seam.id);
    expect(text).toContain(
      'Round 1: First inspection: direct viewing; 650 lx; distance 400 mm; angle 45°; lighting: hall lighting and hand lamp; aids: magnifier ×2.',
    );
    expect(text).toContain('corrected 1 time(s)');
    expect(text).not.toContain('300 lx');
    expect(text).toMatch(
      /Round 2: After repair: not recorded on the tablet — state them here\. [^.]*illuminance ______ lx/,
    );
    // The seam page says the same beside each round.
    const detail = await server.request(`/supervisor/review/seams/${seam.id}`, {
      headers: { cookie: await server.supervisorCookie() },
    });
    expect(await detail.text()).toMatch(/Viewing and lighting:\s*direct viewing; 650 lx/);
    // The viewing records are not graded and are left out of nothing: the grade counts the reading.
    const grade = await server.storage.getServerGrade(seam.id);
    expect(JSON.parse(grade?.summary ?? '{}')).toMatchObject({ readingCount: 1 });
    expect(((await device.pull(server, null)).body as PullReply).items).toEqual([]);
  });
});

describe('viewing conditions in the CSV exports', () => {
  it('give each reading its round’s conditions and each seam line those of the round its level comes from', async () => {
    const server = await testServer();
    const { device, seam } = await seamWithCorrectedViewing(server);
    const csv = async (path: string) => {
      const res = await server.request(`/supervisor/review/export/${path}?seam=${seam.id}`, {
        headers: { cookie: await server.supervisorCookie() },
      });
      expect(res.status).toBe(200);
      return Papa.parse<Record<string, string>>(await res.text(), { header: true, skipEmptyLines: true });
    };
    const columns = [...VIEWING_HEADERS];
    const inForce = ['direct', '650', '400', '45', 'hall lighting and hand lamp', 'magnifier ×2', '1', T0];

    const readings = await csv('readings.csv');
    expect(readings.meta.fields).toEqual(expect.arrayContaining(columns));
    expect(readings.data.map((row) => [row['round'], ...columns.map((c) => row[c])])).toEqual([
      ['1', ...inForce],
    ]);

    // The seam's line takes the round its level comes from: with the checklist open no round is graded, so the
    // latest, round 2, whose conditions are not recorded yet and stay blank.
    const before = await csv('seams.csv');
    expect(before.meta.fields).toEqual(expect.arrayContaining(['viewing of round', ...columns]));
    expect(before.data).toHaveLength(1);
    const seamLine = (row: Record<string, string> | undefined) => [
      row?.['graded round'],
      row?.['viewing of round'],
      ...columns.map((c) => row?.[c]),
    ];
    expect(seamLine(before.data[0])).toEqual(['', '2', ...columns.map(() => '')]);

    device.add('viewing', uuidv7(), viewingBody(seam.id, 2, { viewing: 'remote', illuminanceLx: 1200 }));
    expect((await device.send(server, await device.seal())).status).toBe(200);
    await server.settle();
    const after = await csv('seams.csv');
    expect(seamLine(after.data[0])).toEqual(['', '2', 'remote', '1200', '', '', '', '', '0', T0]);
  });
  it('come from the seam’s viewing records alone, the same as folding every record of the seam', async () => {
    const server = await testServer();
    const { seam } = await seamWithCorrectedViewing(server);
    const only = await server.storage.viewingRecordsOf(seam.id);
    const all = await server.storage.seamMaterial(seam.id);
    expect(only.length).toBeGreaterThan(1);
    expect(only.every((r) => r.kind === 'viewing')).toBe(true);
    expect(only.map((r) => r.id)).toEqual(all.records.filter((r) => r.kind === 'viewing').map((r) => r.id));
    expect(all.records.length).toBeGreaterThan(only.length);
    expect(foldViewing(only)).toEqual(foldSeam(all).viewing);
    expect(foldViewing(only)[0]).toMatchObject({ round: 1, records: 2 });
  });
});
