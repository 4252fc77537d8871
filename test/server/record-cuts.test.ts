// Batch payloads kept without the records the batch added: a record's text is written back from its row, so
// putting the rows back always gives the payload bytes as received; a record is cut only where its exact text
// stands.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { canonicalJson, recordFromOutbox, recordSchemaVersionOf } from '../../src/protocol/index.js';
import {
  cutRecords,
  parseRecordCuts,
  recordCutsText,
  recordText,
  restoreRecords,
  type RecordColumns,
} from '../../src/server/storage/sqlite/record-cuts.js';

const KINDS = ['reading', 'seamSetup', 'round', 'viewing', 'checkAnswer'] as const;

const bodyArb = fc.record({
  seamId: fc.string({ maxLength: 12 }),
  reading: fc.record({
    id: fc.uuid(),
    note: fc.string({ maxLength: 20 }),
    values: fc.dictionary(fc.string({ maxLength: 6 }), fc.double({ noNaN: true, noDefaultInfinity: true })),
  }),
});

const entryArb = fc.record({
  seq: fc.integer({ min: 1, max: 2 ** 40 }),
  recordId: fc.uuid(),
  kind: fc.constantFrom(...KINDS),
  seamId: fc.string({ maxLength: 40 }),
  body: bodyArb,
  createdAt: fc.string({ maxLength: 30 }),
});

/** The columns the server keeps for an entry it received (canonical body, as planRecords makes it). */
type Entry = typeof entryArb extends fc.Arbitrary<infer T> ? T : never;

const columnsOf = (e: Entry): RecordColumns => ({
  id: e.recordId,
  kind: e.kind,
  schemaVersion: recordSchemaVersionOf(e.kind),
  seamId: e.seamId,
  seq: e.seq,
  body: canonicalJson(e.body),
  createdAt: e.createdAt,
});

/** A device's canonical payload for the entries, ASCII as nearly every one is (others are kept whole). */
const batchArb = fc
  .array(entryArb, { minLength: 1, maxLength: 10 })
  .map((entries) => ({
    payload: canonicalJson({ batchId: 'b', records: entries.map(recordFromOutbox), type: 'batch' }),
    rows: entries.map((e, i) => ({ receiveSeq: 100 + 3 * i, columns: columnsOf(e) })),
  }))
  .filter(({ payload }) => Buffer.from(payload, 'utf8').every((b) => b < 0x80));

function roundTrip(ascii: string, rows: readonly { receiveSeq: number; columns: RecordColumns }[]) {
  const cut = cutRecords(ascii, rows);
  if (!cut) return { cut, back: Buffer.from(ascii, 'latin1') };
  const bySeq = new Map(rows.map((r) => [r.receiveSeq, r.columns]));
  const cuts = parseRecordCuts(recordCutsText(cut.cuts));
  return { cut, back: restoreRecords(Buffer.from(cut.rest, 'latin1'), cuts, (seq) => bySeq.get(seq)) };
}

const ONE: RecordColumns = {
  id: 'r1',
  kind: 'reading',
  schemaVersion: 1,
  seamId: 's',
  seq: 1,
  body: '{"n":1}',
  createdAt: 't',
};

describe('cutting the records a batch added out of its payload', () => {
  it('writes a record as a canonical payload holds it (canonicalJson of the record an outbox entry travels as)', () => {
    fc.assert(
      fc.property(entryArb, (e) => {
        expect(recordText(columnsOf(e))).toBe(canonicalJson(recordFromOutbox(e)));
      }),
    );
  });

  it('cuts every record of a canonical payload and puts them back byte for byte', () => {
    fc.assert(
      fc.property(batchArb, ({ payload, rows }) => {
        const { cut, back } = roundTrip(payload, rows);
        expect(cut?.cuts.map(([, seq]) => seq)).toEqual(rows.map((r) => r.receiveSeq));
        expect(cut?.rest.length).toBe(
          payload.length - rows.reduce((n, r) => n + recordText(r.columns).length, 0),
        );
        expect(back.toString('latin1')).toBe(payload);
      }),
    );
  });

  it('gives the payload back exactly when rows are missing, changed, reordered or the bytes are damaged', () => {
    fc.assert(
      fc.property(
        batchArb,
        fc.array(fc.nat(), { maxLength: 3 }),
        fc.boolean(),
        fc.integer({ min: 0x20, max: 0x7e }),
        ({ payload, rows }, damageAt, reorder, noise) => {
          const bytes = Buffer.from(payload, 'latin1');
          for (const at of damageAt) bytes[at % bytes.length] = noise;
          const damaged = bytes.toString('latin1');
          const changed = rows.map((r, i) =>
            i === damageAt.length ? { ...r, columns: { ...r.columns, seq: r.columns.seq + 1 } } : r,
          );
          const claimed = reorder ? [...changed].reverse() : changed;
          const { cut, back } = roundTrip(damaged, claimed);
          expect(back.toString('latin1')).toBe(damaged);
          // Only texts that stood there were cut.
          for (const [, seq] of cut?.cuts ?? []) {
            const row = claimed.find((r) => r.receiveSeq === seq);
            expect(row && damaged.includes(recordText(row.columns))).toBe(true);
          }
        },
      ),
    );
  });

  it('keeps cuts in a short column text and reads them back', () => {
    const cuts = [
      [12, 7001],
      [13, 7002],
      [13, 6990],
    ] as const;
    const text = recordCutsText(cuts);
    expect(text).toBe('R:c.5eh,1.1,0.-c');
    expect(parseRecordCuts(text)).toEqual(cuts);
    expect(() => parseRecordCuts('R:1.x.2')).toThrow(/offset.row/);
    expect(() => parseRecordCuts('[[1,"r1"]]')).toThrow(/must start with "R:"/);
  });

  it('cuts nothing from a payload whose records are not written canonically', () => {
    const spaced = `{"records":[{"body": {"n":1},"createdAt":"t","id":"r1","kind":"reading","schemaVersion":1,"seamId":"s","seq":1}]}`;
    expect(cutRecords(spaced, [{ receiveSeq: 1, columns: ONE }])).toBe(null);
  });

  it('refuses to restore when a row it names is not stored', () => {
    const cut = cutRecords(`[${recordText(ONE)}]`, [{ receiveSeq: 42, columns: ONE }]);
    expect(cut?.rest).toBe('[]');
    if (cut) {
      expect(() => restoreRecords(Buffer.from(cut.rest, 'latin1'), cut.cuts, () => undefined)).toThrow(
        /row 42, which is not stored/,
      );
    }
  });
});
