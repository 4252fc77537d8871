// A small yard for the review tests: two tablets send five seams that differ in every way the queue filters on
// (welder, procedure, drawing, area, device, inspector, day, level, fatigue flag, sampling, borderline), plus one
// seam set up on the server and never inspected.
import type { Reading, Seam } from '../../src/domain/index.js';
import type { DeviceGrade } from '../../src/protocol/index.js';
import { uuidv7 } from '../../src/store/ids.js';
import { completeChecklist } from '../support/seam-builder.js';
import { bodies, testSeam, toeReading } from './records.js';
import type { SimDevice } from './sim-device.js';
import { jsonOf, ORIGIN, type TestServer } from './support.js';

export interface SeededYard {
  readonly tabletA: SimDevice;
  readonly tabletB: SimDevice;
  readonly seams: {
    /** B met, C required, four steady toe angles (sampling adequate), Ann, tablet A, 2026-11-10. */
    readonly alpha: Seam;
    /** Toe angle 100°: level D, C required (below), Bo, tablet B, 2026-11-12. */
    readonly bravo: Seam;
    /** Loaded butt seam, misalignment 1 and 2 mm: fatigue class below the required FAT 80, Bo, tablet A. */
    readonly charlie: Seam;
    /** Toe angle 110.5° read at 1° resolution: borderline to C's 110°, Ann, tablet B, 2026-11-20. */
    readonly delta: Seam;
    /** Corrected reading: the first toe angle (95°) superseded by 150°; tablet A reported level D (mismatch). */
    readonly echo: Seam;
    /** Set up on the server only: no record. */
    readonly foxtrot: Seam;
  };
  /** Every reading sent, by seam key. */
  readonly readings: Readonly<Record<string, readonly Reading[]>>;
}

const at = (day: string, minute = 0) => `${day}T08:${String(minute).padStart(2, '0')}:00.000Z`;

/** Queues a seam's set-up, round 1, a complete checklist and the readings on a tablet. */
function queueSeam(
  device: SimDevice,
  seam: Seam,
  readings: readonly Reading[],
  day: string,
  examiner: string,
) {
  device.add('seamSetup', uuidv7(), bodies.seamSetup(seam, 1, at(day)), at(day));
  device.add(
    'round',
    uuidv7(),
    { ...bodies.round(seam.id, 1, at(day)), examiner: { name: examiner, qualification: 'VT level 2' } },
    at(day),
  );
  for (const item of Object.keys(completeChecklist()))
    device.add(
      'checklistAnswer',
      uuidv7(),
      bodies.answer(seam.id, item, 'noneFound', 1, at(day, 1)),
      at(day, 1),
    );
  for (const r of readings) device.add('reading', r.id, bodies.reading(r), r.recordedAt);
}

const toe = (
  seamId: string,
  angle: number,
  position: number,
  day: string,
  examiner: string,
  over: Partial<Reading> = {},
) =>
  toeReading(seamId, angle, {
    position,
    recordedAt: at(day, 5),
    examiner: { name: examiner, qualification: 'VT level 2' },
    ...over,
  });

/** A mid-plane linear misalignment reading (no toe). */
function mis(seamId: string, e: number, position: number, minute: number): Reading {
  const withoutToe = ({ toe: _toe, ...rest }: Reading): Reading => rest;
  return {
    ...withoutToe(
      toeReading(seamId, 0, { position, recordedAt: at('2026-11-14', minute), examiner: { name: 'Bo' } }),
    ),
    values: { linearMisalignment: e },
    misalignmentBasis: 'midPlane',
  };
}

export async function seedYard(server: TestServer): Promise<SeededYard> {
  const tabletA = await server.enrolDevice('Tablet A');
  const tabletB = await server.enrolDevice('Tablet B');
  const common = (key: string, welder: string, procedure: string, drawing: string, area: string) =>
    testSeam(uuidv7(), { label: `Seam ${key}`, welder, procedure, drawing, area, tags: [`TAG-${key}`] });
  const alpha = common('alpha', 'W-1', 'WPS-A', 'D-1', 'Bay 1');
  const bravo = common('bravo', 'W-2', 'WPS-B', 'D-2', 'Bay 2');
  const charlie: Seam = {
    ...common('charlie', 'W-1', 'WPS-A', 'D-3', 'Bay 1'),
    joint: { type: 'butt', preparation: 'doubleV', sides: 'two', setting: 'site' },
    acceptance: { edition: 'ISO 5817:2014', level: 'D' },
    fatigue: { loaded: true, requiredFat: 80 },
  };
  const delta = common('delta', 'W-3', 'WPS-B', 'D-1', 'Bay 2');
  const echo = common('echo', 'W-3', 'WPS-A', 'D-2', 'Bay 3');
  const foxtrot = common('foxtrot', 'W-9', 'WPS-Z', 'D-9', 'Bay 9');

  const readings: Record<string, Reading[]> = {
    alpha: [150, 151, 150, 151].map((a, i) => toe(alpha.id, a, 100 + 100 * i, '2026-11-10', 'Ann')),
    bravo: [toe(bravo.id, 100, 100, '2026-11-12', 'Bo')],
    charlie: [mis(charlie.id, 1, 100, 5), mis(charlie.id, 2, 200, 6)],
    delta: [toe(delta.id, 110.5, 300, '2026-11-20', 'Ann')],
  };
  const wrong = toe(echo.id, 95, 100, '2026-11-16', 'Ann');
  readings['echo'] = [wrong, toe(echo.id, 150, 100, '2026-11-16', 'Ann', { supersedes: wrong.id })];

  queueSeam(tabletA, alpha, readings['alpha'] ?? [], '2026-11-10', 'Ann');
  queueSeam(tabletA, charlie, readings['charlie'] ?? [], '2026-11-14', 'Bo');
  queueSeam(tabletA, echo, readings['echo'] ?? [], '2026-11-16', 'Ann');
  queueSeam(tabletB, bravo, readings['bravo'] ?? [], '2026-11-12', 'Bo');
  queueSeam(tabletB, delta, readings['delta'] ?? [], '2026-11-20', 'Ann');
  // Tablet A graded echo before the correction reached it: it reports level D (the server grades B).
  const echoGrade: DeviceGrade = {
    seamId: echo.id,
    state: 'graded',
    levelMet: 'D',
    meetsRequired: false,
    readingCount: 1,
    gradedAt: at('2026-11-16', 10),
  };
  for (const [device, grades] of [
    [tabletA, [echoGrade]],
    [tabletB, undefined],
  ] as const) {
    const sent = await device.send(server, await device.seal(undefined, grades));
    if (sent.status !== 200) throw new Error(`seeding failed: ${sent.status} ${JSON.stringify(sent.body)}`);
  }
  const put = await server.admin('PUT', `/seams/${foxtrot.id}`, { seam: foxtrot });
  if (put.status !== 201) throw new Error(`seeding foxtrot failed: ${put.status}`);
  await server.settle();
  return { tabletA, tabletB, seams: { alpha, bravo, charlie, delta, echo, foxtrot }, readings };
}

/** An inspector account's session cookie. */
export async function inspectorCookie(server: TestServer): Promise<string> {
  const made = await server.admin('POST', '/accounts', {
    username: 'ines',
    password: 'inspector-pass-1',
    role: 'inspector',
  });
  if (made.status !== 201) throw new Error(`inspector not made: ${made.status}`);
  const res = await server.request('/api/session', {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: ORIGIN },
    body: JSON.stringify({ username: 'ines', password: 'inspector-pass-1' }),
  });
  return (res.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
}

export interface QueueReply {
  readonly rows: { readonly seamId: string; readonly label: string }[];
  readonly total: number;
  readonly scope: number;
  readonly counts: Record<string, number>;
}

/** The queue's seam labels (without "Seam ") for a query string, in the order given. */
export async function queue(server: TestServer, query = ''): Promise<QueueReply & { labels: string[] }> {
  const res = await server.admin('GET', `/review/queue?${query}`);
  if (res.status !== 200) throw new Error(`queue: ${res.status} ${await res.text()}`);
  const reply = await jsonOf<QueueReply>(res);
  return { ...reply, labels: reply.rows.map((r) => r.label.replace(/^Seam /, '')) };
}
