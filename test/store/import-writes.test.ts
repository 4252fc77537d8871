// A scanner import is stored whole or not at all, traced by its record (file hash) and graded like any readings.
import { describe, expect, it } from 'vitest';
import { gradeSeam } from '../../src/domain/index.js';
import { importTable, MAPPING_FORMAT } from '../../src/domain/import/index.js';
import type { ImportRecord } from '../../src/store/api.js';
import { butt, freshStore } from './support.js';

const CSV = 'Position;Angle L;Angle R;Height;Width\n10;150,5;148;2,1;14\n20;151;149;2;14\n30;abc;149;2;14\n';

function read(importId: string) {
  const o = importTable(new TextEncoder().encode(CSV), {
    mapping: {
      format: MAPPING_FORMAT,
      columns: {
        position: 'Position',
        'plate1.toeAngle': 'Angle L',
        'plate2.toeAngle': 'Angle R',
        reinforcementHeight: 'Height',
        reinforcementWidth: 'Width',
      },
    },
    context: { importId, seam: butt('s-1'), recordedAt: '2026-12-01T08:00:00Z' },
  });
  if (o.kind !== 'read') throw new Error(o.refusal.message);
  const record: ImportRecord = {
    importId,
    seamId: 's-1',
    kind: 'table',
    fileName: 'scan.csv',
    bytes: o.bytes,
    sha256: o.sha256,
    readingCount: o.readings.length,
    quarantined: o.quarantinedRows,
    quarantineSample: o.quarantine.map(({ line, reason }) => ({ line, reason })),
    importedAt: '',
  };
  return { o, record };
}

describe('appendImport', () => {
  it('stores every reading with the import record and its hash, each reading also waiting in the outbox', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const { o, record } = read('imp-a');
    const saved = await store.appendImport('s-1', record, o.readings);
    expect(saved.readingCount).toBe(6);
    expect(await store.listImports('s-1')).toEqual([saved]);
    expect(saved.sha256).toBe(o.sha256);
    expect(saved.quarantineSample).toEqual([
      { line: 4, reason: '"Angle L": holds "abc", which is not a number' },
    ]);
    const readings = await store.listReadings('s-1');
    expect(readings.map((r) => r.reading.source)).toEqual(
      Array(6).fill({ kind: 'import', importId: 'imp-a' }),
    );
    expect(await store.outboxCount()).toBe(1 + 1 + 6);
    const file = await store.seamFile('s-1');
    expect(file && gradeSeam({ ...file }).rounds[0]?.readingCount).toBe(6);
  });

  it('stores nothing when one reading cannot be stored, and refuses the same import twice', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1', { length: 15 }));
    const { o, record } = read('imp-b');
    // Positions 20 lie beyond a 15 mm seam: the grader's rule refuses them, and with them the whole import.
    await expect(store.appendImport('s-1', record, o.readings)).rejects.toThrow(/nothing was stored/);
    expect(await store.listReadings('s-1')).toEqual([]);
    expect(await store.listImports('s-1')).toEqual([]);
    const ok = read('imp-c');
    await store.saveSeam(butt('s-1'));
    await store.appendImport('s-1', ok.record, ok.o.readings);
    await expect(store.appendImport('s-1', ok.record, ok.o.readings)).rejects.toThrow(/already stored/);
    expect((await store.listReadings('s-1')).length).toBe(6);
  });

  it('refuses readings that do not name the import as their source', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const { o, record } = read('imp-d');
    await expect(store.appendImport('s-1', { ...record, importId: 'other' }, o.readings)).rejects.toThrow(
      /does not name import "other"/,
    );
  });
});
