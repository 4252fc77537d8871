// fast-check arbitraries for valid seam files: butt and fillet seams with readings the validator accepts.
// Values sit on gauge-like grids (so readings often land exactly on a limit) mixed with arbitrary doubles.
import fc from 'fast-check';
import {
  CHECKLIST_ITEMS,
  EDITIONS,
  EXECUTION_CLASSES,
  LEVELS,
  PARAMETERS,
  type Checklist,
  type ParameterName,
  type Reading,
  type Round,
  type Seam,
  type SeamFile,
  type Toe,
  type Values,
} from '../../src/domain/index.js';

/** A value on a resolution grid, kept to the micrometre as an inspector would type it. */
export const gridValue = (min: number, max: number, step: number): fc.Arbitrary<number> =>
  fc
    .integer({ min: Math.ceil(min / step - 1e-9), max: Math.floor(max / step + 1e-9) })
    .map((n) => Math.round(n * step * 1e6) / 1e6);

/** Mostly grid values, sometimes any double in range. */
const value = (min: number, max: number, step: number): fc.Arbitrary<number> =>
  fc.oneof(
    { arbitrary: gridValue(min, max, step), weight: 4 },
    { arbitrary: fc.double({ min, max, noNaN: true, noDefaultInfinity: true }), weight: 1 },
  );

export const VALUE = {
  thickness: fc.oneof(fc.constantFrom(0.5, 2, 3, 3.5, 6, 8, 10, 12, 20, 40), value(0.5, 60, 0.5)),
  toeAngle: value(90, 180, 1),
  toeRadius: value(0.1, 10, 0.1),
  depth: value(0, 3, 0.05),
  height: value(0, 12, 0.1),
  width: value(0.5, 40, 0.5),
  pore: value(0, 5, 0.1),
  misalignment: value(-6, 6, 0.1),
  angular: value(-5, 5, 0.1),
  throatNominal: gridValue(2, 15, 0.5),
  leg: value(2, 20, 0.5),
} as const;

const acceptanceArb: fc.Arbitrary<Seam['acceptance']> = fc
  .record({
    edition: fc.constantFrom(...EDITIONS),
    pick: fc.oneof(
      fc.record({ level: fc.constantFrom(...LEVELS) }),
      fc.record({ preset: fc.constantFrom(...EXECUTION_CLASSES) }),
    ),
    overrides: fc.option(
      fc.dictionary(
        fc.constantFrom('5011', '502', '504', '505', '507', '2017', '4021', '5213', '617'),
        fc.constantFrom(...LEVELS),
        {
          minKeys: 1,
          maxKeys: 3,
        },
      ),
      { nil: undefined },
    ),
  })
  // 507 was split into 5071/5072 in the 2023 edition, so each edition accepts only its own number.
  .map(({ edition, pick, overrides }) => {
    const renamed =
      overrides && edition === 'ISO 5817:2023'
        ? Object.fromEntries(Object.entries(overrides).map(([k, v]) => [k === '507' ? '5071' : k, v]))
        : overrides;
    return { edition, ...pick, ...(renamed ? { overrides: renamed } : {}) };
  });

const commonSeam = {
  length: fc.oneof(fc.constantFrom(50, 100, 1000), gridValue(20, 3000, 10)),
  circumferential: fc.boolean(),
  surface: fc.constantFrom('asWelded', 'groundFlush', 'toeGround', 'treated'),
  acceptance: acceptanceArb,
  t1: VALUE.thickness,
  t2: fc.option(VALUE.thickness, { nil: undefined, freq: 2 }),
  sides: fc.constantFrom('one', 'two'),
};

export const buttSeamArb: fc.Arbitrary<Seam> = fc
  .record(commonSeam)
  .map(({ length, circumferential, surface, acceptance, t1, t2, sides }) => ({
    id: 'seam-p',
    label: 'Property butt seam',
    joint: { type: 'butt', preparation: 'singleV', sides, setting: 'shopFlat' },
    plate1: { thickness: t1 },
    plate2: { thickness: t2 ?? t1 },
    material: { name: 'S355', kind: 'steel' },
    length,
    circumferential,
    surface,
    acceptance,
  }));

export const filletSeamArb: fc.Arbitrary<Seam> = fc
  .record({
    ...commonSeam,
    type: fc.constantFrom('filletT', 'cruciform', 'lap'),
    nominalThroat: VALUE.throatNominal,
    legs: fc.option(fc.tuple(gridValue(3, 15, 0.5), gridValue(3, 15, 0.5)), { nil: undefined }),
  })
  .map(({ length, circumferential, surface, acceptance, t1, t2, sides, type, nominalThroat, legs }) => ({
    id: 'seam-p',
    label: 'Property fillet seam',
    joint: { type, preparation: 'fillet', sides, setting: 'site' },
    plate1: { thickness: t1 },
    plate2: { thickness: t2 ?? t1 },
    material: { name: 'EN AW-6082', kind: 'aluminium' },
    nominalThroat,
    ...(legs ? { nominalLegs: { leg1: legs[0], leg2: legs[1] } } : {}),
    length,
    circumferential,
    surface,
    acceptance,
  }));

export const seamArb: fc.Arbitrary<Seam> = fc.oneof(buttSeamArb, filletSeamArb);

/** What a reading says apart from its id, round and place. */
export interface ReadingBody {
  readonly toe?: Toe;
  readonly side?: 'face' | 'root';
  readonly values: Values;
  readonly misalignmentBasis?: 'midPlane' | 'faceSurface' | 'rootSurface';
}

export type Placement = { readonly position: number } | { readonly start: number; readonly end: number };

const toeArb: fc.Arbitrary<Toe> = fc.record({
  plate: fc.constantFrom(1, 2),
  side: fc.constantFrom('face', 'root'),
});

const someOf = <T extends object>(arb: fc.Arbitrary<T>): fc.Arbitrary<T> =>
  arb.filter((o) => Object.keys(o).length > 0);

const optional = { requiredKeys: [] as [] };

const unequal = (seam: Seam): boolean => seam.plate1.thickness !== seam.plate2.thickness;

const misalignmentArb = (seam: Seam): fc.Arbitrary<ReadingBody> =>
  fc
    .record({
      values: someOf(
        fc.record({ linearMisalignment: VALUE.misalignment, angularMisalignment: VALUE.angular }, optional),
      ),
      basis: fc.constantFrom('midPlane', 'faceSurface', 'rootSurface'),
      giveBasis: fc.boolean(),
    })
    .map(({ values, basis, giveBasis }) =>
      // A basis is required for linear misalignment on unequal plates, optional otherwise.
      giveBasis || (unequal(seam) && values.linearMisalignment !== undefined)
        ? { values, misalignmentBasis: basis }
        : { values },
    );

const spotArb: fc.Arbitrary<ReadingBody> = fc.record({
  values: someOf(fc.record({ poreDiameter: VALUE.pore, endCraterDepth: VALUE.depth }, optional)),
});

const toeReadingArb: fc.Arbitrary<ReadingBody> = fc.oneof(
  fc.record({
    toe: toeArb,
    values: someOf(
      fc.record(
        { toeAngle: VALUE.toeAngle, toeRadius: VALUE.toeRadius, undercutDepth: VALUE.depth },
        optional,
      ),
    ),
  }),
  fc.record({ toe: toeArb, values: fc.record({ overlap: VALUE.depth, reinforcementWidth: VALUE.width }) }),
);

function buttBodyArb(seam: Seam): fc.Arbitrary<ReadingBody> {
  const rootValues = someOf(
    fc.record(
      {
        rootConcavity: VALUE.depth,
        shrinkageGroove: VALUE.depth,
        sagging: VALUE.depth,
        ...(seam.joint.sides === 'one' ? { incompleteRootPenetration: VALUE.depth } : {}),
      },
      optional,
    ),
  );
  return fc.oneof(
    toeReadingArb,
    fc.record({
      side: fc.constantFrom('face', 'root'),
      values: fc.record({ reinforcementHeight: VALUE.height, reinforcementWidth: VALUE.width }),
    }),
    fc.record({ side: fc.constant('root' as const), values: rootValues }),
    fc.record({ side: fc.constant('face' as const), values: fc.record({ sagging: VALUE.depth }) }),
    misalignmentArb(seam),
    spotArb,
  );
}

function filletBodyArb(seam: Seam): fc.Arbitrary<ReadingBody> {
  const a = seam.nominalThroat ?? 5;
  return fc.oneof(
    toeReadingArb,
    fc.record({
      side: fc.constantFrom('face', 'root'),
      values: fc.record({ convexity: VALUE.height, reinforcementWidth: VALUE.width }),
    }),
    fc.record({
      values: someOf(
        fc.record({ throat: value(Math.max(0.5, a - 3), a + 5, 0.1), rootGap: VALUE.depth }, optional),
      ),
    }),
    fc.record({ values: fc.record({ leg1: VALUE.leg, leg2: VALUE.leg }) }),
    misalignmentArb(seam),
    spotArb,
  );
}

export const bodyArb = (seam: Seam): fc.Arbitrary<ReadingBody> =>
  seam.joint.type === 'butt' ? buttBodyArb(seam) : filletBodyArb(seam);

/** Whether every value of the reading may run along the seam (start and end instead of a position). */
export const mayHaveLength = (values: Values): boolean =>
  (Object.keys(values) as ParameterName[]).every((n) => PARAMETERS[n].hasLength);

export function placementArb(seam: Seam, withLength: boolean): fc.Arbitrary<Placement> {
  const L = seam.length;
  const position = value(0, L, 1).map((p) => ({ position: p }));
  if (!withLength) return position;
  const stretch = fc
    .tuple(gridValue(0, L, 1), gridValue(0, L, 1))
    .filter(([x, y]) => x !== y)
    .map(([x, y]) =>
      // A straight seam needs start < end; a circumferential one may run past its start mark.
      seam.circumferential ? { start: x, end: y } : { start: Math.min(x, y), end: Math.max(x, y) },
    );
  return fc.oneof(position, stretch);
}

export const placedBodyArb = (seam: Seam): fc.Arbitrary<ReadingBody & { placement: Placement }> =>
  bodyArb(seam).chain((body) =>
    placementArb(seam, mayHaveLength(body.values)).map((placement) => ({ ...body, placement })),
  );

const INSTRUMENT = { id: 'G-P', resolutionMm: 0.1, resolutionDeg: 1 } as const;

export function makeReading(
  id: string,
  round: number,
  body: ReadingBody,
  placement: Placement,
  supersedes?: string,
): Reading {
  return {
    id,
    round,
    ...placement,
    sampling: 'position' in placement ? 'atPitch' : 'targeted',
    ...(body.toe ? { toe: body.toe } : {}),
    ...(body.side ? { side: body.side } : {}),
    values: body.values,
    ...(body.misalignmentBasis ? { misalignmentBasis: body.misalignmentBasis } : {}),
    instrument: INSTRUMENT,
    source: { kind: 'gauge' },
    recordedAt: '2026-11-19T08:00:00Z',
    ...(supersedes === undefined ? {} : { supersedes }),
  };
}

type Answer = NonNullable<Checklist['crack']> | null;

const answerArb = (length: number): fc.Arbitrary<Answer> =>
  fc.oneof(
    { arbitrary: fc.constant<Answer>({ answer: 'noneFound' }), weight: 12 },
    {
      arbitrary: gridValue(0, length, 1).map((position): Answer => ({ answer: 'present', position })),
      weight: 1,
    },
    { arbitrary: fc.constant<Answer>({ answer: 'notAccessible' }), weight: 1 },
    // Unanswered: the round stays incomplete.
    { arbitrary: fc.constant<Answer>(null), weight: 1 },
  );

const checklistArb = (length: number): fc.Arbitrary<Checklist> =>
  fc.tuple(...CHECKLIST_ITEMS.map(() => answerArb(length))).map((answers) => {
    const out: Record<string, NonNullable<Answer>> = {};
    CHECKLIST_ITEMS.forEach((item, i) => {
      const a = answers[i];
      if (a) out[item] = a;
    });
    return out as Checklist;
  });

/** A valid seam file for the seam: 1 to 3 rounds, 1 to 10 readings, some of them corrections. */
export const fileForSeamArb = (seam: Seam, maxReadings = 10): fc.Arbitrary<SeamFile> =>
  fc
    .record({
      checklists: fc.array(checklistArb(seam.length), { minLength: 1, maxLength: 3 }),
      readings: fc.array(
        fc.record({
          body: placedBodyArb(seam),
          roundPick: fc.nat(),
        }),
        { minLength: 1, maxLength: maxReadings },
      ),
      correctionRate: fc.integer({ min: 0, max: 3 }),
    })
    .map(({ checklists, readings, correctionRate }) => {
      const rounds: Round[] = checklists.map((checklist, i) => ({
        number: i + 1,
        kind: i === 0 ? 'first' : 'afterRepair',
        checklist,
      }));
      const out: Reading[] = [];
      readings.forEach(({ body, roundPick }, i) => {
        const prev = out[i - 1];
        // A correction replaces the reading before it, in the same round.
        const corrects = prev !== undefined && correctionRate > 0 && roundPick % (4 - correctionRate) === 0;
        const round = corrects ? prev.round : (rounds[roundPick % rounds.length] as Round).number;
        const { placement, ...rest } = body;
        out.push(makeReading(`r-${i}`, round, rest, placement, corrects ? prev.id : undefined));
      });
      return {
        format: 'beadbook.seam/1',
        units: { length: 'mm', angle: 'deg' },
        seam,
        rounds,
        readings: out,
      } satisfies SeamFile;
    });

export const seamFileArb: fc.Arbitrary<SeamFile> = seamArb.chain((seam) => fileForSeamArb(seam));
