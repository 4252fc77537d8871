// Batch payloads (ASCII, as nearly all are) kept without the record bodies stored beside them: putting the stored
// bodies back always gives the payload bytes as received, whatever the payload holds; a body is cut only where its
// exact text stands.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { canonicalJson } from '../../src/protocol/index.js';
import { restoreBodies } from '../../src/server/storage/sqlite/payload-cuts.js';
import { cutBodies } from '../support/body-cuts.js';

const bodyArb = fc.record({
  seamId: fc.string({ maxLength: 12 }),
  reading: fc.record({
    id: fc.uuid(),
    values: fc.dictionary(fc.string({ maxLength: 6 }), fc.double({ noNaN: true, noDefaultInfinity: true })),
  }),
});

/** Records as a device sends them (canonical, so each begins with its body), and the bodies' stored texts. */
const batchArb = fc.array(fc.tuple(fc.uuid(), bodyArb), { minLength: 1, maxLength: 12 }).map((records) => {
  const sent = records.map(([id, body]) => ({ body, createdAt: 't', id, kind: 'reading' }));
  return {
    payload: Buffer.from(canonicalJson({ batchId: 'b', records: sent, type: 'batch' }), 'utf8'),
    stored: records.map(([id, body]) => ({ id, body: canonicalJson(body) })),
  };
});

function roundTrip(payload: Buffer, stored: readonly { id: string; body: string }[]) {
  const cut = cutBodies(payload.toString('latin1'), stored);
  if (!cut) return { cut, back: payload };
  const byId = new Map(stored.map((r) => [r.id, r.body]));
  return { cut, back: restoreBodies(Buffer.from(cut.rest, 'latin1'), cut.cuts, (id) => byId.get(id)) };
}

describe('cutting stored bodies out of a batch payload', () => {
  it('cuts every body of a canonical payload and puts them back byte for byte', () => {
    fc.assert(
      fc.property(batchArb, ({ payload, stored }) => {
        const { cut, back } = roundTrip(payload, stored);
        expect(cut?.cuts.map(([, id]) => id)).toEqual(stored.map((r) => r.id));
        expect(payload.every((byte) => byte < 0x80)).toBe(true);
        const bodyBytes = stored.reduce((n, r) => n + r.body.length, 0);
        expect(cut?.rest.length).toBe(payload.length - bodyBytes);
        expect(back.equals(payload)).toBe(true);
      }),
    );
  });

  it('gives the payload back exactly when bodies are missing, changed, reordered or the bytes are damaged', () => {
    fc.assert(
      fc.property(
        batchArb,
        fc.array(fc.nat(), { maxLength: 3 }),
        fc.boolean(),
        fc.uint8Array({ maxLength: 8 }),
        ({ payload, stored }, damageAt, reorder, noise) => {
          const damaged = Buffer.from(payload);
          for (const at of damageAt) damaged[at % damaged.length] = (noise[0] ?? 0x7b) & 0x7f;
          const changed = stored.map((r, i) => (i === damageAt.length ? { ...r, body: `${r.body} ` } : r));
          const claimed = reorder ? [...changed].reverse() : changed;
          const { cut, back } = roundTrip(damaged, claimed);
          expect(back.equals(damaged)).toBe(true);
          // Only texts that stood there were cut.
          for (const [, id] of cut?.cuts ?? []) {
            expect(damaged.includes(claimed.find((r) => r.id === id)?.body ?? '\u0000')).toBe(true);
          }
        },
      ),
    );
  });

  it('cuts nothing from a payload without records in the canonical form', () => {
    expect(cutBodies('{"records":[{"id":"r1","body":{"n":1}}]}', [{ id: 'r1', body: '{"n":1}' }])).toBe(null);
  });

  it('refuses to restore when a record it names is not stored', () => {
    const body = '{"n":1}';
    const cut = cutBodies(`[{"body":${body}}]`, [{ id: 'r1', body }]);
    expect(cut?.rest).toBe('[{"body":}]');
    if (cut) {
      const rest = Buffer.from(cut.rest, 'latin1');
      expect(() => restoreBodies(rest, cut.cuts, () => undefined)).toThrow(/"r1", which is not stored/);
    }
  });
});
