// Streaming: the hash is the file's SHA-256 however the bytes are chunked, rows split across chunks read the same,
// and a 200 MB file is refused by the stated limits without ever being held whole.
import { createHash } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import {
  importTable,
  MAPPING_FORMAT,
  MAX_IMPORT_READINGS,
  MAX_TABLE_BYTES,
  sha256,
  TableImport,
  type ImportMapping,
} from '../../../src/domain/import/index.js';
import { buttSeam } from '../../support/seam-builder.js';

const context = {
  importId: 'big',
  seam: buttSeam({ length: 1_000_000 }),
  recordedAt: '2026-11-20T08:00:00Z',
};
const MAPPING: ImportMapping = {
  format: MAPPING_FORMAT,
  columns: { position: 'Position', 'plate1.toeAngle': 'Angle L', 'plate2.toeAngle': 'Angle R' },
};

function rows(from: number, count: number): string {
  let s = '';
  for (let i = from; i < from + count; i++)
    s += `${(i * 0.01).toFixed(2).replace('.', ',')};${140 + (i % 30)},5;${141 + (i % 29)}\r\n`;
  return s;
}

describe('SHA-256', () => {
  it('matches node:crypto for empty, short, block-edge and chunked inputs (FIPS 180-4)', () => {
    const data = new TextEncoder().encode(rows(0, 3000));
    for (const len of [0, 1, 55, 56, 63, 64, 65, 119, 120, 1000, data.length]) {
      const slice = data.subarray(0, len);
      const want = createHash('sha256').update(slice).digest('hex');
      for (const chunk of [1, 7, 64, 4096]) {
        const h = sha256();
        for (let i = 0; i < slice.length; i += chunk) h.update(slice.subarray(i, i + chunk));
        expect(h.digest()).toBe(want);
      }
    }
  });
});

describe('streamed tables', () => {
  it('reads the same readings whatever the chunk size, and keeps the file hash', () => {
    const text = `Position [mm];Angle L [deg];Angle R [deg]\r\n${rows(0, 5000)}`;
    const bytes = new TextEncoder().encode(text);
    const whole = importTable(bytes, { mapping: MAPPING, context });
    expect(whole.kind).toBe('read');
    const want = createHash('sha256').update(bytes).digest('hex');
    for (const chunk of [1, 3, 977, 65536]) {
      const t = new TableImport({ mapping: MAPPING, context });
      for (let i = 0; i < bytes.length; i += chunk) t.push(bytes.subarray(i, i + chunk));
      const o = t.finish();
      expect(o.kind === 'read' && o.sha256).toBe(want);
      expect(o.kind === 'read' && o.readings).toEqual(whole.kind === 'read' ? whole.readings : null);
    }
    expect(whole.kind === 'read' && whole.readings.length).toBe(10_000);
  });

  it('refuses a 200 MB file by its size before reading it', () => {
    const t = new TableImport({ mapping: MAPPING, context, size: 200 * 1024 * 1024 });
    t.push(new Uint8Array(10));
    const o = t.finish();
    expect(o.kind).toBe('refused');
    expect(o.kind === 'refused' && o.refusal.message).toBe(
      `The file is 200.0 MiB; at most ${(MAX_TABLE_BYTES / 1024 / 1024).toFixed(1)} MiB is accepted (a seam holds at most 200,000 readings). Split the export by seam or by stretch.`,
    );
  });

  it('streams a 200 MB file of unknown size in 1 MiB chunks and refuses it at the stated reading limit', () => {
    const head = new TextEncoder().encode('Position [mm];Angle L [deg];Angle R [deg]\r\n');
    const t = new TableImport({ mapping: MAPPING, context });
    t.push(head);
    let sent = head.length;
    let refusedAt = -1;
    // One block of rows of about 1 MiB, sent 200 times: the file is never held whole, only one chunk at a time.
    const block = new TextEncoder().encode(rows(0, 30_000));
    while (sent < 200 * 1024 * 1024) {
      t.push(block);
      sent += block.length;
      if (t.refused && refusedAt < 0) refusedAt = sent;
    }
    const o = t.finish();
    expect(o.kind).toBe('refused');
    expect(o.kind === 'refused' && o.refusal.message).toMatch(
      new RegExp(
        `^The file makes more than ${MAX_IMPORT_READINGS.toLocaleString('en')} readings \\(the most one seam holds\\) by line \\d+\\. Split the export by seam or by stretch\\.$`,
      ),
    );
    expect(refusedAt).toBeGreaterThan(0);
    expect(refusedAt).toBeLessThan(10 * 1024 * 1024);
  });

  it('refuses a stream that passes the byte limit', () => {
    const t = new TableImport({ mapping: MAPPING, context, maxBytes: 1000 });
    t.push(new TextEncoder().encode(`Position;Angle L;Angle R\n${rows(0, 100)}`));
    const o = t.finish();
    expect(o.kind === 'refused' && o.refusal.message).toMatch(
      /^The file is larger than 0\.0 MiB; at most 0\.0 MiB/,
    );
  });
});
