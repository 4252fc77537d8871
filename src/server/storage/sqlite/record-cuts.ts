// A batch payload kept without the records the batch added to the records table. A record in a device's canonical
// payload is written from exactly the columns the records table keeps (its members sorted: body, createdAt, id,
// kind, schemaVersion, seamId, seq), so its whole text can be cut and written back from its row: what stays of a
// 500-reading payload is little more than the commas between records. A record is cut only where the payload's
// bytes are exactly the text its row writes, and records are never changed or removed, so putting the rows' texts
// back gives the received bytes again. (Batches stored before this kept whole records and cut bodies only; see
// payload-cuts.ts, which still reads them.)

import type { PlannedRecord } from '../types.js';
import { putBack } from './payload-cuts.js';

const RECORD_START = '{"body":';

/** The columns of a stored record that its text in a payload is written from. */
export type RecordColumns = Pick<
  Extract<PlannedRecord, { status: 'valid' }>,
  'id' | 'kind' | 'schemaVersion' | 'seamId' | 'seq' | 'body' | 'createdAt'
>;

/** Where a record was cut: its offset in the kept bytes, and its row (receive_seq). */
export type RecordCut = readonly [at: number, receiveSeq: number];

export interface CutRecordsPayload {
  /** What is kept: the payload less the records' texts, one character per byte as the payload was. */
  readonly rest: string;
  readonly cuts: readonly RecordCut[];
}

/** The text of a record in a canonical payload (canonicalJson of recordFromOutbox), written from its columns. */
export function recordText(r: RecordColumns): string {
  return RECORD_START + r.body + recordTail(r);
}

/** What follows the body in a record's text. */
const recordTail = (r: RecordColumns): string =>
  `,"createdAt":${JSON.stringify(r.createdAt)},"id":${JSON.stringify(r.id)},"kind":${JSON.stringify(r.kind)},` +
  `"schemaVersion":${r.schemaVersion},"seamId":${JSON.stringify(r.seamId)},"seq":${r.seq}}`;

/** Whether the record's text stands at `at` (compared in its parts: the body is most of it and need not be copied). */
function standsAt(ascii: string, at: number, r: RecordColumns, tail: string): boolean {
  return (
    ascii.startsWith(r.body, at + RECORD_START.length) &&
    ascii.startsWith(tail, at + RECORD_START.length + r.body.length)
  );
}

/** How many record starts a record is looked for at before it stays in the payload. */
const TRIES = 4;

/**
 * Cuts the given records (in payload order, each with its row) out of a payload given as its ASCII text (so a
 * character's index is its byte's offset), looking for each from where the last one ended: the search never goes
 * back and costs one pass at most. Records not found where expected simply stay. Null when nothing was cut.
 */
export function cutRecords(
  ascii: string,
  records: readonly { readonly receiveSeq: number; readonly columns: RecordColumns }[],
): CutRecordsPayload | null {
  const pieces: string[] = [];
  const cuts: RecordCut[] = [];
  let kept = 0;
  let from = 0;
  let cursor = 0;
  for (const { receiveSeq, columns } of records) {
    const tail = recordTail(columns);
    for (let tries = 0; tries < TRIES && cursor < ascii.length; tries++) {
      const at = ascii.indexOf(RECORD_START, cursor);
      if (at < 0) {
        cursor = ascii.length;
        break;
      }
      cursor = at + 1;
      if (standsAt(ascii, at, columns, tail)) {
        pieces.push(ascii.slice(from, at));
        kept += at - from;
        cuts.push([kept, receiveSeq]);
        from = cursor = at + RECORD_START.length + columns.body.length + tail.length;
        break;
      }
    }
    if (cursor >= ascii.length) break;
  }
  if (!cuts.length) return null;
  pieces.push(ascii.slice(from));
  return { rest: pieces.join(''), cuts };
}

/** The payload as received: the kept bytes with each cut record's text, written from its row, put back. */
export function restoreRecords(
  rest: Uint8Array,
  cuts: readonly RecordCut[],
  rowOf: (receiveSeq: number) => RecordColumns | undefined,
): Buffer {
  return putBack(
    rest,
    cuts,
    (seq) => {
      const row = rowOf(seq);
      return row && recordText(row);
    },
    (seq) => `record row ${seq}`,
  );
}

/** Marks the column text of record cuts apart from body cuts (a JSON list, so it starts with "["). */
const PREFIX = 'R:';

/** The cuts as kept in their column: offsets and rows as differences from the cut before, in base 36. */
export function recordCutsText(cuts: readonly RecordCut[]): string {
  let at = 0;
  let seq = 0;
  const parts: string[] = [];
  for (const [a, s] of cuts) {
    parts.push(`${(a - at).toString(36)}.${(s - seq).toString(36)}`);
    at = a;
    seq = s;
  }
  return PREFIX + parts.join(',');
}

export const isRecordCutsText = (text: string): boolean => text.startsWith(PREFIX);

const DELTA = /^(-?[0-9a-z]+)\.(-?[0-9a-z]+)$/;

export function parseRecordCuts(text: string): RecordCut[] {
  if (!isRecordCutsText(text)) throw new Error('a batch payload record cut list must start with "R:"');
  const cuts: RecordCut[] = [];
  let at = 0;
  let seq = 0;
  for (const part of text.slice(PREFIX.length).split(',')) {
    const m = DELTA.exec(part);
    if (!m) throw new Error(`a batch payload record cut "${part}" is not in the form offset.row (base 36)`);
    at += parseInt(m[1] as string, 36);
    seq += parseInt(m[2] as string, 36);
    cuts.push([at, seq]);
  }
  return cuts;
}
