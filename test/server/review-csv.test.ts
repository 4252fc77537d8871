// The CSV exports as a spreadsheet reads them: text that would run as a formula is defused with a quote, numbers
// (negative misalignment included) and ids that start with a dash (base64url key ids) stay as they are.
import Papa from 'papaparse';
import { describe, expect, it } from 'vitest';
import { readingsCsv } from '../../src/server/review/csv.js';
import type { ReadingLine } from '../../src/server/review/seam-detail.js';
import { toeReading } from './records.js';

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
    const csv = readingsCsv([{ id: 's1', label: '+cmd|calc', readings: [line()] }]);
    const [row] = Papa.parse<Record<string, string>>(csv, { header: true }).data;
    expect(row?.['device name']).toBe(`'=HYPERLINK("http://x","click")`);
    expect(row?.['seam label']).toBe("'+cmd|calc");
    expect(row?.['device kid']).toBe('-sNQU_UPfpOfNjYE0rd4moJLL_ELu6n2BCl5YkzWruU');
    expect(row?.['linearMisalignment (mm)']).toBe('-1.5');
    expect(row?.['toeAngle (deg)']).toBe('');
  });
});
