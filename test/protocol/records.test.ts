// Judging records on their own: valid ones typed, newer schemas parked, faulty ones rejected with reasons; and
// the device store's outbox bodies are what the protocol carries (checked by the compiler).
import { describe, expect, expectTypeOf, it } from 'vitest';
import {
  judgeRecord,
  nestsDeeperThan,
  PARKED_MAX_DEPTH,
  recordFromOutbox,
  RECORD_SCHEMA_VERSION,
  type RecordBodies,
  type RecordKind,
} from '../../src/protocol/index.js';
import type { OutboxBodies, OutboxKind } from '../../src/store/api.js';
import { buttSeam } from '../support/seam-builder.js';

const T = '2026-12-01T08:00:00Z';
const seam = buttSeam({ id: 'seam-1' });
const reading = {
  id: 'r-1',
  round: 1,
  position: 100,
  sampling: 'atPitch' as const,
  toe: { plate: 1 as const, side: 'face' as const },
  values: { toeAngle: 150 },
  instrument: { id: 'TG-1' },
  source: { kind: 'gauge' as const },
  recordedAt: T,
};

const record = (kind: string, id: string, body: unknown, over: Record<string, unknown> = {}) => ({
  id,
  kind,
  schemaVersion: 1,
  seq: 1,
  seamId: 'seam-1',
  createdAt: T,
  body,
  ...over,
});

const reason = (input: unknown): string => {
  const v = judgeRecord(input);
  if (v.status !== 'rejected') throw new Error(`expected a rejection, got ${v.status}`);
  return v.reason;
};

describe('judging a record', () => {
  it('accepts every kind the device store queues', () => {
    const valid = [
      record('seamSetup', 'a', { seamId: 'seam-1', revision: 1, seam, savedAt: T }),
      record('round', 'b', {
        seamId: 'seam-1',
        number: 1,
        kind: 'first',
        startedAt: T,
        examiner: { name: 'A. Inspector' },
      }),
      record('checklistAnswer', 'c', {
        seamId: 'seam-1',
        round: 1,
        item: 'crack',
        answer: { answer: 'present', position: 4, note: 'at the stop' },
        answeredAt: T,
      }),
      record('reading', 'r-1', { seamId: 'seam-1', reading }),
    ];
    expect(valid.map((r) => judgeRecord(r).status)).toEqual(['valid', 'valid', 'valid', 'valid']);
  });

  it('parks a record of a newer schema, of any kind or shape, keeping it as sent', () => {
    const newer = record(
      'photo',
      'p',
      { sha256: 'ab' },
      { schemaVersion: RECORD_SCHEMA_VERSION + 1, extra: [1, 2] },
    );
    const v = judgeRecord(newer);
    expect(v).toMatchObject({
      status: 'parked',
      id: 'p',
      kind: 'photo',
      schemaVersion: RECORD_SCHEMA_VERSION + 1,
      seamId: 'seam-1',
    });
    expect(v.status === 'parked' && v.raw).toEqual(newer);
    expect(judgeRecord(record('reading', 'q', 'not even an object', { schemaVersion: 9 })).status).toBe(
      'parked',
    );
  });

  it('refuses, with a reason, a newer-schema record nested too deep to write back out (it would overflow the stack)', () => {
    let deep: unknown = 'core';
    for (let i = 0; i < 20_000; i++) deep = { d: deep };
    const v = judgeRecord(record('photo', 'deep', deep, { schemaVersion: RECORD_SCHEMA_VERSION + 1 }));
    expect(v.status).toBe('rejected');
    expect(reason(record('photo', 'deep', deep, { schemaVersion: RECORD_SCHEMA_VERSION + 1 }))).toContain(
      `nests deeper than ${PARKED_MAX_DEPTH} levels`,
    );
    // Just inside the bound it is parked as before.
    let shallow: unknown = 1;
    for (let i = 0; i < PARKED_MAX_DEPTH - 2; i++) shallow = [shallow];
    expect(
      judgeRecord(record('photo', 'ok', shallow, { schemaVersion: RECORD_SCHEMA_VERSION + 1 })).status,
    ).toBe('parked');
    expect(nestsDeeperThan([[1]], 2)).toBe(false);
    expect(nestsDeeperThan([[[1]]], 2)).toBe(true);
  });

  it('rejects faulty records of a known schema with the field and the fault', () => {
    expect(reason(record('photo', 'x', {}))).toMatch(/^kind: must be one of/);
    expect(reason({ ...record('round', 'x', {}), schemaVersion: undefined })).toContain('schemaVersion');
    expect(
      reason(record('round', 'x', { seamId: 'seam-1', number: 2, kind: 'first', startedAt: T })),
    ).toContain('round 1 is the "first" round');
    expect(
      reason(record('round', 'x', { seamId: 'seam-2', number: 1, kind: 'first', startedAt: T })),
    ).toContain('body.seamId');
    expect(
      reason(
        record('seamSetup', 'x', {
          seamId: 'seam-1',
          revision: 1,
          seam: { ...seam, id: 'other' },
          savedAt: T,
        }),
      ),
    ).toContain('body.seam.id');
    expect(
      reason(
        record('checklistAnswer', 'x', {
          seamId: 'seam-1',
          round: 1,
          item: 'crack',
          answer: { answer: 'present' },
          answeredAt: T,
        }),
      ),
    ).toContain('body.answer.position');
    expect(
      reason(
        record('checklistAnswer', 'x', {
          seamId: 'seam-1',
          round: 1,
          item: 'gremlins',
          answer: { answer: 'present' },
          answeredAt: T,
        }),
      ),
    ).toContain('body.item');
    expect(reason(record('reading', 'other-id', { seamId: 'seam-1', reading }))).toContain('body.reading.id');
    expect(
      reason(
        record('reading', 'r-1', { seamId: 'seam-1', reading: { ...reading, values: { toeAngle: 75 } } }),
      ),
    ).toContain('at least 90');
    expect(
      reason(record('reading', 'r-1', { seamId: 'seam-1', reading: { ...reading, values: {} } })),
    ).toContain('holds no measured value');
    expect(
      reason(record('reading', 'r-1', { seamId: 'seam-1', reading: { ...reading, start: 1, end: 5 } })),
    ).toContain('either a position');
    expect(
      reason(record('reading', 'r-1', { seamId: 'seam-1', reading: { ...reading, withdrawn: true } })),
    ).toContain('withdrawal');
    expect(
      reason(record('reading', 'r-1', { seamId: 'seam-1', reading }, { createdAt: 'yesterday' })),
    ).toContain('createdAt');
    expect(judgeRecord(null)).toMatchObject({ status: 'rejected', id: null });
    expect(judgeRecord(record('round', 'x'.repeat(65), {}))).toMatchObject({ status: 'rejected', id: null });
  });

  it('builds the record from an outbox entry', () => {
    const entry = {
      seq: 7,
      recordId: 'r-1',
      kind: 'reading',
      seamId: 'seam-1',
      body: { seamId: 'seam-1', reading },
      createdAt: T,
    };
    const made = recordFromOutbox(entry);
    expect(made).toEqual({
      id: 'r-1',
      kind: 'reading',
      schemaVersion: 1,
      seq: 7,
      seamId: 'seam-1',
      createdAt: T,
      body: entry.body,
    });
    expect(judgeRecord(made).status).toBe('valid');
  });

  it("carries the store's outbox bodies unchanged (type level)", () => {
    expectTypeOf<OutboxKind>().toEqualTypeOf<RecordKind>();
    expectTypeOf<OutboxBodies['reading']>().toMatchTypeOf<RecordBodies['reading']>();
    expectTypeOf<OutboxBodies['round']>().toMatchTypeOf<RecordBodies['round']>();
    expectTypeOf<OutboxBodies['seamSetup']>().toMatchTypeOf<RecordBodies['seamSetup']>();
    expectTypeOf<OutboxBodies['checklistAnswer']>().toMatchTypeOf<RecordBodies['checklistAnswer']>();
    expectTypeOf<OutboxBodies['tagLink']>().toMatchTypeOf<RecordBodies['tagLink']>();
  });
});
