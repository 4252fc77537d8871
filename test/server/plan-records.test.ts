// What the ingest stores for each judged record: a reading's canonical body, written from the received value, is
// the canonical text of the value its schema judged, whatever optional fields the reading carries.
import { describe, expect, it } from 'vitest';
import { kestrelPointYard } from '../../src/demo/kestrel-point-yard.js';
import { canonicalJson, judgeRecord } from '../../src/protocol/index.js';
import { planRecords } from '../../src/server/sync/ingest.js';
import { toeReading } from './records.js';

const LIVE = 'live-seam-1';

function readingRecords() {
  const readings = [
    ...kestrelPointYard().flatMap((file) => file.readings),
    toeReading(LIVE, 140, {
      examiner: { name: 'R. Okafor', qualification: 'VT level 2' },
      device: 'tablet-3',
      instrument: { id: 'TG-2', kind: 'toeGauge', resolutionMm: 0.1, calibratedOn: '2026-06-02' },
      source: { kind: 'import', importId: 'imp-1' },
    }),
    toeReading(LIVE, 0, {
      toe: undefined,
      side: 'face',
      values: { linearMisalignment: 0.5 },
      misalignmentBasis: 'midPlane',
    }),
  ].map((r) => JSON.parse(JSON.stringify(r)) as typeof r);
  return readings.map((reading, i) => ({
    id: reading.id,
    kind: 'reading',
    schemaVersion: 1,
    seq: i + 1,
    seamId: LIVE,
    createdAt: '2026-12-01T08:00:00.000Z',
    body: { seamId: LIVE, reading: reading.seamId === undefined ? reading : { ...reading, seamId: LIVE } },
  }));
}

describe('planned reading records', () => {
  it('hold the canonical text of the judged body, for readings of every shape the demo yard has', () => {
    const records = readingRecords();
    const optional = new Set(records.flatMap((r) => Object.keys(r.body.reading)));
    // The yard's readings between them carry the optional fields that matter here.
    for (const field of [
      'examiner',
      'supersedes',
      'withdrawn',
      'start',
      'end',
      'side',
      'misalignmentBasis',
      'device',
    ])
      expect(optional).toContain(field);
    // Sent canonically (members in order) and as built (members in any order).
    for (const sent of [records.map((r) => JSON.parse(canonicalJson(r)) as unknown), records]) {
      const planned = planRecords(sent);
      expect(planned.map((p) => p.status)).toEqual(records.map(() => 'valid'));
      planned.forEach((p, i) => {
        const verdict = judgeRecord(sent[i]);
        if (p.status !== 'valid' || verdict.status !== 'valid') throw new Error('not valid');
        expect(p.body).toBe(canonicalJson(verdict.record.body));
      });
    }
  });
});
