// The quick predicates beside valibot: on any record, valid or damaged, judgeRecord gives exactly the verdict, id,
// reasons and record that valibot alone gives; a predicate never calls valid what its schema refuses, and when it
// says the members are in order, JSON.stringify writes the canonical text.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import * as v from 'valibot';
import {
  canonicalJson,
  judgeRecord,
  judgeRecordBySchema,
  recordBodySchemas,
  RECORD_KINDS,
  type RecordVerdict,
} from '../../src/protocol/index.js';
import { compilePredicate, NOT_SHOWN, VALID_IN_ORDER } from '../../src/protocol/schema-predicate.js';
import { recordArb, sentRecordArb } from '../support/record-arbitraries.js';

/** The verdict without the order hint, which only the predicates give. */
const plain = (verdict: RecordVerdict) => {
  if (verdict.status !== 'valid') return verdict;
  return { status: verdict.status, record: verdict.record };
};

describe('the quick record predicates', () => {
  it('exist for readings, rounds, checklist answers, tag links and viewing conditions; set-ups are left to valibot', () => {
    const compiled = RECORD_KINDS.filter((kind) => compilePredicate(recordBodySchemas[kind]) !== null);
    expect(compiled).toEqual(['round', 'checklistAnswer', 'reading', 'tagLink', 'viewing']);
  });

  it('give the same verdict, id, reasons and record as valibot alone, on valid and damaged records', () => {
    const seen = { valid: 0, rejected: 0 };
    fc.assert(
      fc.property(sentRecordArb, (sent) => {
        const quick = judgeRecord(sent);
        const reference = judgeRecordBySchema(sent);
        expect(plain(quick)).toStrictEqual(reference);
        if (quick.status === 'valid' || quick.status === 'rejected') seen[quick.status] += 1;
      }),
      { numRuns: 4000 },
    );
    // Both outcomes were exercised, many times over.
    expect(seen.valid).toBeGreaterThan(400);
    expect(seen.rejected).toBeGreaterThan(400);
  });

  it('never call a body valid that its schema refuses, and vouch for member order only when it holds', () => {
    const checks = RECORD_KINDS.map((kind) => [kind, compilePredicate(recordBodySchemas[kind])] as const);
    fc.assert(
      fc.property(sentRecordArb, (sent) => {
        const body = (sent as { body?: unknown } | null)?.body;
        for (const [kind, check] of checks) {
          const shown = check ? check(body) : NOT_SHOWN;
          if (shown === NOT_SHOWN) continue;
          const parsed = v.safeParse(recordBodySchemas[kind], body);
          expect(parsed.success).toBe(true);
          expect(parsed.output).toStrictEqual(body);
          if (shown === VALID_IN_ORDER) expect(JSON.stringify(body)).toBe(canonicalJson(body));
        }
      }),
      { numRuns: 3000 },
    );
  });

  it('judge canonically sent valid records themselves, saying their bodies are in order', () => {
    fc.assert(
      fc.property(recordArb, (record) => {
        const sent = JSON.parse(canonicalJson(record)) as unknown;
        const reference = judgeRecordBySchema(sent);
        const quick = judgeRecord(sent);
        if (reference.status !== 'valid' || quick.status !== 'valid') return;
        expect(quick.bodyInOrder).toBe(true);
        // The record is the one received, not a copy valibot made.
        expect(quick.record.body).toBe((sent as { body: unknown }).body);
      }),
      { numRuns: 1000 },
    );
  });

  it('say a body with members out of order is valid but not in order', () => {
    const body = { tag: 'TAG-0001', seamId: 's-1', action: 'link', via: 'typed', at: '2026-12-01T08:00:00Z' };
    const check = compilePredicate(recordBodySchemas.tagLink);
    expect(check?.(body)).toBe(1);
    expect(check?.(JSON.parse(canonicalJson(body)))).toBe(VALID_IN_ORDER);
    expect(check?.({ ...body, tag: '' })).toBe(NOT_SHOWN);
    expect(check?.({ ...body, extra: 1 })).toBe(NOT_SHOWN);
  });
});
