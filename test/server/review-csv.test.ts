// The CSV exports as a spreadsheet reads them: text that would run as a formula is defused with a quote, numbers
// (negative misalignment included) and ids that start with a dash (base64url key ids) stay as they are.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { readingsCsv } from '../../src/server/review/csv.js';
import type { ReadingLine } from '../../src/server/review/seam-detail.js';
import { T0, toeReading } from './records.js';

const line = (over: Partial<ReadingLine> = {}): ReadingLine => ({
  recordId: 'r1',
  reading: { ...toeReading('s1', 150), id: 'r1', values: { linearMisalignment: -1.5 } },
  status: 'current',
  supersededBy: null,
  leftOutReason: null,
  deviceKid: '-sNQU_UPfpOfNjYE0rd4moJLL_ELu6n2BCl5YkzWruU',
  deviceName: '=HYPERLINK("http://x","click")',
  batchId: 'b1',
  receivedAt: '2026-12-01T08:00:00.000Z',
  receiveSeq: 1,
  ...over,
});

describe('CSV exports', () => {
  it('defuses formulas in text, keeps numbers and dash-led ids', () => {
    const csv = readingsCsv([{ id: 's1', label: '+cmd|calc', readings: [line()], viewing: [] }]);
    const [row] = Papa.parse<Record<string, string>>(csv, { header: true }).data;
    expect(row?.['device name']).toBe(`'=HYPERLINK("http://x","click")`);
    expect(row?.['seam label']).toBe("'+cmd|calc");
    expect(row?.['device kid']).toBe('-sNQU_UPfpOfNjYE0rd4moJLL_ELu6n2BCl5YkzWruU');
    expect(row?.['linearMisalignment (mm)']).toBe('-1.5');
    expect(row?.['toeAngle (deg)']).toBe('');
  });

  it('gives each reading the viewing conditions of its own round, with units in the headers and blanks where none', () => {
    const inRound = (id: string, round: number) =>
      line({ recordId: id, reading: { ...toeReading('s1', 150), id, round } });
    const csv = readingsCsv([
      {
        id: 's1',
        label: 'Coaming butt',
        readings: [inRound('r1', 1), inRound('r2', 2)],
        viewing: [
          {
            round: 1,
            conditions: {
              viewing: 'remote',
              illuminanceLx: 520,
              distanceMm: 300,
              angleDeg: 35,
              lighting: '=cmd|"/c calc"!A1',
              aids: 'borescope',
            },
            recordedAt: T0,
            recordId: 'v2',
            records: 2,
          },
        ],
      },
    ]);
    const parsed = Papa.parse<Record<string, string>>(csv, { header: true });
    const columns = [
      'viewing',
      'illuminance (lx)',
      'viewing distance (mm)',
      'viewing angle (deg)',
      'lighting',
      'viewing aids',
      'viewing corrected (times)',
      'viewing recorded at UTC (device clock)',
    ];
    expect(parsed.meta.fields).toEqual(expect.arrayContaining(columns));
    const cells = parsed.data.map((row) => [row['reading id'], ...columns.map((c) => row[c])]);
    expect(cells).toEqual([
      ['r1', 'remote', '520', '300', '35', `'=cmd|"/c calc"!A1`, 'borescope', '1', T0],
      ['r2', '', '', '', '', '', '', '', ''],
    ]);
  });
});
