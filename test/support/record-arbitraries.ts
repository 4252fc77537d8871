// fast-check arbitraries for sync records as a device sends them: valid records of the kinds judged member by member
// (readings, rounds, checklist answers, tag links, viewing conditions), and the same records damaged one member at a time.
import fc from 'fast-check';
import { CHECKLIST_ANSWERS, CHECKLIST_ITEMS, PARAMETER_NAMES, PARAMETERS } from '../../src/domain/index.js';
import { TAG_ACTIONS, TAG_VIA } from '../../src/protocol/index.js';

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };

const idArb = fc.oneof(
  { weight: 4, arbitrary: fc.uuid() },
  { weight: 1, arbitrary: fc.string({ minLength: 1, maxLength: 64 }) },
);

/** Timestamps in the shapes ISO 8601 allows and a device might write (with or without fraction or offset). */
const timestampArb = fc
  .tuple(
    fc.date({ min: new Date('2000-01-01'), max: new Date('2099-12-31'), noInvalidDate: true }),
    fc.constantFrom('Z', '+02:00', '-0530', ' +01', ''),
    fc.boolean(),
  )
  .map(([d, zone, fraction]) => {
    const iso = d.toISOString();
    const base = fraction ? iso.slice(0, -1) : iso.slice(0, 19);
    return zone === '' ? `${base}Z` : `${base}${zone}`;
  });

const positionArb = fc.oneof(
  fc.integer({ min: 0, max: 12_000 }),
  fc.double({ min: 0, max: 1_000_000, noNaN: true }),
);

const valuesArb = fc.record(
  Object.fromEntries(
    PARAMETER_NAMES.map((name) => {
      const p = PARAMETERS[name];
      return [name, fc.double({ min: p.min, max: p.max, noNaN: true, minExcluded: p.minExclusive === true })];
    }),
  ),
  { requiredKeys: [] },
);

const examinerArb = fc.record(
  {
    name: fc.string({ minLength: 1, maxLength: 80 }),
    qualification: fc.string({ minLength: 1, maxLength: 120 }),
  },
  { requiredKeys: ['name'] },
);

export const readingArb = fc.record(
  {
    id: idArb,
    seamId: idArb,
    round: fc.integer({ min: 1, max: 999 }),
    position: positionArb,
    start: positionArb,
    end: positionArb,
    sampling: fc.constantFrom('atPitch', 'targeted'),
    toe: fc.record({ plate: fc.constantFrom(1, 2), side: fc.constantFrom('face', 'root') }),
    side: fc.constantFrom('face', 'root'),
    values: valuesArb,
    misalignmentBasis: fc.constantFrom('midPlane', 'faceSurface', 'rootSurface'),
    instrument: fc.record(
      {
        id: fc.string({ minLength: 1, maxLength: 64 }),
        kind: fc.constantFrom(
          'toeGauge',
          'misalignmentGauge',
          'filletGauge',
          'depthGauge',
          'rule',
          'scanner',
          'other',
        ),
        resolutionMm: fc.double({ min: 0, max: 10, noNaN: true, minExcluded: true }),
        resolutionDeg: fc.double({ min: 0, max: 10, noNaN: true, minExcluded: true }),
        calibratedOn: fc
          .date({ min: new Date('2000-01-01'), max: new Date('2099-12-31'), noInvalidDate: true })
          .map((d) => d.toISOString().slice(0, 10)),
      },
      { requiredKeys: ['id'] },
    ),
    source: fc.oneof(
      fc.constant({ kind: 'gauge' }),
      fc.record({ kind: fc.constant('import'), importId: fc.string({ minLength: 1, maxLength: 64 }) }),
    ),
    examiner: examinerArb,
    recordedAt: timestampArb,
    device: fc.string({ minLength: 1, maxLength: 64 }),
    supersedes: idArb,
    withdrawn: fc.constant(true),
  },
  { requiredKeys: ['id', 'round', 'sampling', 'values', 'instrument', 'source', 'recordedAt'] },
);

const answerArb = fc.record(
  {
    answer: fc.constantFrom(...CHECKLIST_ANSWERS),
    position: positionArb,
    note: fc.string({ minLength: 1, maxLength: 500 }),
  },
  { requiredKeys: ['answer'] },
);

/** A record of one of the member-by-member kinds, its envelope agreeing with its body most of the time. */
export const recordArb: fc.Arbitrary<Json> = fc
  .tuple(idArb, idArb, fc.integer({ min: 1, max: 2 ** 40 }), timestampArb)
  .chain(([id, seamId, seq, createdAt]) => {
    const envelope = (kind: string, body: unknown) => ({
      id,
      kind,
      schemaVersion: 1,
      seq,
      seamId,
      createdAt,
      body,
    });
    return fc.oneof(
      { weight: 6, arbitrary: readingArb.map((r) => envelope('reading', { seamId, reading: { ...r, id } })) },
      { weight: 1, arbitrary: readingArb.map((r) => envelope('reading', { seamId, reading: r })) },
      {
        weight: 1,
        arbitrary: fc
          .record(
            {
              number: fc.integer({ min: 1, max: 999 }),
              kind: fc.constantFrom('first', 'afterRepair', 'additional'),
              startedAt: timestampArb,
              examiner: examinerArb,
            },
            { requiredKeys: ['number', 'kind', 'startedAt'] },
          )
          .map((b) => envelope('round', { seamId, ...b })),
      },
      {
        weight: 1,
        arbitrary: fc
          .record({
            round: fc.integer({ min: 1, max: 999 }),
            item: fc.constantFrom(...CHECKLIST_ITEMS),
            answer: answerArb,
            answeredAt: timestampArb,
          })
          .map((b) => envelope('checklistAnswer', { seamId, ...b })),
      },
      {
        weight: 1,
        arbitrary: fc
          .record({
            action: fc.constantFrom(...TAG_ACTIONS),
            tag: fc.oneof(fc.constantFrom('TAG-0001', 'B 12/3'), fc.string({ minLength: 1, maxLength: 40 })),
            via: fc.constantFrom(...TAG_VIA),
            at: timestampArb,
          })
          .map((b) => envelope('tagLink', { seamId, ...b })),
      },
      {
        weight: 1,
        arbitrary: fc
          .record({
            round: fc.integer({ min: 1, max: 999 }),
            conditions: fc.record(
              {
                viewing: fc.constantFrom('direct', 'remote'),
                illuminanceLx: fc.integer({ min: 0, max: 200_000 }),
                distanceMm: fc.double({ min: 0, max: 100_000, noNaN: true }),
                angleDeg: fc.double({ min: 0, max: 90, noNaN: true }),
                lighting: fc.string({ minLength: 1, maxLength: 200 }),
                aids: fc.string({ minLength: 1, maxLength: 200 }),
              },
              { requiredKeys: ['viewing'] },
            ),
            recordedAt: timestampArb,
          })
          .map((b) => ({ ...envelope('viewing', { seamId, ...b }), schemaVersion: 2 })),
      },
    ) as fc.Arbitrary<Json>;
  });

/** Values that sit just off what some member allows. */
const nearMiss = fc.constantFrom<Json>(
  '',
  'x'.repeat(65),
  'x'.repeat(501),
  '2026-13-01T00:00:00Z',
  '2026-02-30',
  '12 mm',
  -0,
  -1,
  0,
  1.5,
  89.999,
  180.001,
  1_000_001,
  2 ** 53,
  1e308,
  3,
  true,
  false,
  null,
  [],
  {},
  'gauge',
  'import',
  'face',
  'first',
);

type Op =
  | { readonly kind: 'delete'; readonly at: number }
  | { readonly kind: 'replace'; readonly at: number; readonly value: Json }
  | { readonly kind: 'add'; readonly at: number; readonly key: string; readonly value: Json }
  | { readonly kind: 'reverse'; readonly at: number };

const opArb: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ kind: fc.constant('delete' as const), at: fc.nat() }),
  fc.record({
    kind: fc.constant('replace' as const),
    at: fc.nat(),
    value: fc.oneof(nearMiss, fc.jsonValue({ maxDepth: 1 }) as fc.Arbitrary<Json>),
  }),
  fc.record({
    kind: fc.constant('add' as const),
    at: fc.nat(),
    key: fc.oneof(fc.constantFrom('__proto__', 'constructor', 'id', 'Values', 'extra'), fc.string()),
    value: nearMiss,
  }),
  fc.record({ kind: fc.constant('reverse' as const), at: fc.nat() }),
);

/** Every object in a JSON value with the path to it, the value itself first. */
function objects(value: Json): { [key: string]: Json }[] {
  const out: { [key: string]: Json }[] = [];
  const walk = (v: Json) => {
    if (v === null || typeof v !== 'object') return;
    if (!Array.isArray(v)) out.push(v);
    for (const child of Array.isArray(v) ? v : Object.values(v)) walk(child);
  };
  walk(value);
  return out;
}

/**
 * Sets an own member, "__proto__" included (plain assignment would change the prototype instead), to a copy of the
 * value: the generated values are shared, and one placed twice could end up inside itself.
 */
const put = (target: { [key: string]: Json }, key: string, value: Json) =>
  Object.defineProperty(target, key, {
    value: JSON.parse(JSON.stringify(value)) as Json,
    enumerable: true,
    writable: true,
    configurable: true,
  });

/** Applies damage to a copy. */
function damage(record: Json, ops: readonly Op[]): Json {
  const copy = JSON.parse(JSON.stringify(record)) as Json;
  for (const op of ops) {
    const targets = objects(copy);
    const target = targets[op.at % targets.length];
    if (!target) continue;
    const keys = Object.keys(target);
    const key = keys[op.at % Math.max(keys.length, 1)];
    if (op.kind === 'delete' && key !== undefined) Reflect.deleteProperty(target, key);
    if (op.kind === 'replace' && key !== undefined) put(target, key, op.value);
    if (op.kind === 'add') put(target, op.key, op.value);
    if (op.kind === 'reverse') {
      const entries = Object.entries(target).reverse();
      for (const k of keys) Reflect.deleteProperty(target, k);
      for (const [k, v] of entries) put(target, k, v);
    }
  }
  return copy;
}

/** A record as sent (members in canonical order or not), or the same record with one to three members damaged. */
export const sentRecordArb: fc.Arbitrary<Json> = fc.oneof(
  recordArb,
  fc.tuple(recordArb, fc.array(opArb, { minLength: 1, maxLength: 3 })).map(([r, ops]) => damage(r, ops)),
);
