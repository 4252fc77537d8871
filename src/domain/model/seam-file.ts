import * as v from 'valibot';
import { CHECKLIST_ANSWERS, CHECKLIST_ITEMS } from './checklist.js';
import { PARAMETER_NAMES, PARAMETERS, type ParameterName } from './parameters.js';
import { LEVELS } from './levels.js';
import { DETAIL_IDS } from '../fatigue/detail-ids.js';
import { choice, count, isoDate, isoTimestamp, list, obj, quantity, text } from './schema-kit.js';

export const SEAM_FILE_FORMAT = 'beadbook.seam/1';
export const EDITIONS = ['ISO 5817:2014', 'ISO 5817:2023'] as const;
export const EXECUTION_CLASSES = ['EXC1', 'EXC2', 'EXC3', 'EXC4'] as const;
export const JOINT_TYPES = ['butt', 'filletT', 'cruciform', 'lap'] as const;
export const PREPARATIONS = [
  'square',
  'singleV',
  'doubleV',
  'singleBevel',
  'doubleBevel',
  'singleU',
  'doubleU',
  'singleJ',
  'doubleJ',
  'fillet',
] as const;
export const SURFACE_CONDITIONS = ['asWelded', 'groundFlush', 'toeGround', 'treated'] as const;
export const MAX_READINGS = 200_000;

const positionMm = quantity('mm', { min: 0, max: 1_000_000 }, 'position along the seam from its start mark');
const level = choice(LEVELS);

const plate = obj('a plate', {
  thickness: quantity('mm', { min: 0.5, max: 500 }, 'ISO 5817 covers 0.5 mm and thicker'),
});

const joint = obj('joint', {
  type: choice(JOINT_TYPES),
  preparation: v.optional(choice(PREPARATIONS)),
  sides: choice(['one', 'two']),
  setting: choice(['shopFlat', 'site']),
  /** For a two-sided weld, which physical side was marked as the face at set-up. */
  faceSideNote: v.optional(text(200)),
});

const material = obj('material', {
  name: text(80),
  group: v.optional(
    v.pipe(text(8), v.regex(/^\d{1,2}(\.\d{1,2})?$/, 'must be an ISO/TR 15608 group such as "1.2" or "22"')),
  ),
  kind: choice(['steel', 'aluminium']),
});

const acceptance = obj('acceptance', {
  edition: choice(EDITIONS),
  level: v.optional(level),
  preset: v.optional(choice(EXECUTION_CLASSES)),
  /** Per-imperfection required levels, keyed by ISO 6520-1 reference number. */
  overrides: v.optional(
    v.record(
      v.pipe(v.string(), v.regex(/^\d{3,4}$/, 'keys must be ISO 6520-1 numbers such as "5011"')),
      level,
    ),
  ),
});

const fatigue = obj('fatigue', {
  loaded: v.boolean('must be true or false'),
  detailClass: v.optional(text(40)),
  requiredFat: v.optional(quantity('MPa', { min: 1, max: 1000 })),
  designStressRange: v.optional(quantity('MPa', { min: 0, max: 2000 })),
  cycles: v.optional(quantity('cycles', { min: 1, max: 1e12 })),
  membraneStress: v.optional(quantity('MPa', { min: -2000, max: 2000 })),
  youngsModulus: v.optional(quantity('MPa', { min: 1000, max: 500_000 })),
  restraint: v.optional(choice(['clamped', 'pinned'])),
  freeLength1: v.optional(quantity('mm', { min: 0, max: 100_000, minExclusive: true })),
  freeLength2: v.optional(quantity('mm', { min: 0, max: 100_000, minExclusive: true })),
  /** Whether the weld was examined by NDT as the fatigue classes ask (decides e.g. a one-sided weld's class). */
  ndt: v.optional(v.boolean('must be true or false')),
  /** Backing of a butt weld made from one side. */
  backing: v.optional(choice(['none', 'temporary', 'permanent'])),
  /** Whether the fillet welds of a T or cruciform joint carry the load (decides toe/root classes). */
  loadCarrying: v.optional(v.boolean('must be true or false')),
  /** A catalogue detail chosen by an engineer instead of the one the measured seam earns. */
  detailOverride: v.optional(choice(DETAIL_IDS)),
  /** A FAT chosen by an engineer instead of the catalogue's, in MPa at 2·10⁶ cycles. */
  fatOverride: v.optional(quantity('MPa', { min: 1, max: 1000 })),
});

export const seamSchema = obj('seam', {
  id: text(64, 'an id'),
  label: text(120, 'a label'),
  tags: v.optional(list(text(256, 'a tag'), 0, 20, 'tags')),
  organisation: v.optional(text(120)),
  area: v.optional(text(120)),
  drawing: v.optional(text(120)),
  drawingPosition: v.optional(text(120)),
  joint,
  plate1: plate,
  plate2: plate,
  material,
  /** Nominal butt-weld thickness s for partial penetration; full penetration uses the thinner plate. */
  buttThickness: v.optional(quantity('mm', { min: 0.5, max: 500 })),
  nominalThroat: v.optional(quantity('mm', { min: 0, max: 200, minExclusive: true })),
  nominalLegs: v.optional(
    obj('nominalLegs', {
      leg1: quantity('mm', { min: 0, max: 300, minExclusive: true }),
      leg2: quantity('mm', { min: 0, max: 300, minExclusive: true }),
    }),
  ),
  length: quantity('mm', { min: 0, max: 1_000_000, minExclusive: true }, 'seam length'),
  circumferential: v.boolean('must be true or false'),
  surface: choice(SURFACE_CONDITIONS),
  process: v.optional(
    v.pipe(text(3), v.regex(/^\d{1,3}$/, 'must be an ISO 4063 process number such as "135"')),
  ),
  welder: v.optional(text(80)),
  procedure: v.optional(text(80)),
  weldedAt: v.optional(isoTimestamp()),
  acceptance,
  fatigue: v.optional(fatigue),
});

const examiner = obj('examiner', { name: text(80), qualification: v.optional(text(120)) });

const checklistAnswer = obj('a checklist answer', {
  answer: choice(CHECKLIST_ANSWERS),
  position: v.optional(positionMm),
  note: v.optional(text(500)),
});

const checklist = obj(
  'checklist',
  Object.fromEntries(CHECKLIST_ITEMS.map((k) => [k, v.optional(checklistAnswer)])) as Record<
    (typeof CHECKLIST_ITEMS)[number],
    v.OptionalSchema<typeof checklistAnswer, undefined>
  >,
);

export const roundSchema = obj('round', {
  number: count(1, 999),
  kind: choice(['first', 'afterRepair', 'additional']),
  startedAt: v.optional(isoTimestamp()),
  examiner: v.optional(examiner),
  checklist,
});

const valueEntries = Object.fromEntries(
  PARAMETER_NAMES.map((name) => {
    const p = PARAMETERS[name];
    const range = p.minExclusive
      ? { min: p.min, max: p.max, minExclusive: true }
      : { min: p.min, max: p.max };
    return [name, v.optional(quantity(p.unit, range, p.meaning))];
  }),
) as Record<ParameterName, v.OptionalSchema<ReturnType<typeof quantity>, undefined>>;

const instrument = obj('instrument', {
  id: text(64, 'an instrument id'),
  kind: v.optional(
    choice(['toeGauge', 'misalignmentGauge', 'filletGauge', 'depthGauge', 'rule', 'scanner', 'other']),
  ),
  resolutionMm: v.optional(quantity('mm', { min: 0, max: 10, minExclusive: true })),
  resolutionDeg: v.optional(quantity('deg', { min: 0, max: 10, minExclusive: true })),
  calibratedOn: v.optional(isoDate()),
});

const source = v.variant(
  'kind',
  [
    obj('source', { kind: v.literal('gauge') }),
    obj('source', { kind: v.literal('import'), importId: text(64) }),
  ],
  'source.kind must be "gauge" or "import"',
);

export const readingSchema = obj('reading', {
  id: text(64, 'an id'),
  seamId: v.optional(text(64, 'an id')),
  round: count(1, 999),
  /** A single position, or start and end for an imperfection that runs along the seam. */
  position: v.optional(positionMm),
  start: v.optional(positionMm),
  end: v.optional(positionMm),
  sampling: choice(['atPitch', 'targeted']),
  toe: v.optional(obj('toe', { plate: choice([1, 2]), side: choice(['face', 'root']) })),
  side: v.optional(choice(['face', 'root'])),
  values: obj('values', valueEntries),
  /** What the misalignment gauge read: the mid-plane offset, or the step on the face or root surface. */
  misalignmentBasis: v.optional(choice(['midPlane', 'faceSurface', 'rootSurface'])),
  instrument,
  source,
  examiner: v.optional(examiner),
  recordedAt: isoTimestamp(),
  device: v.optional(text(64)),
  supersedes: v.optional(text(64, 'an id')),
  /** Withdraws the reading it supersedes (an undo) without replacing it; carries no values. Nothing is deleted. */
  withdrawn: v.optional(
    v.literal(true, 'must be true when present (a withdrawal of the superseded reading)'),
  ),
});

const seamFileEntries = (minReadings: number) => ({
  format: v.literal(SEAM_FILE_FORMAT, `must be "${SEAM_FILE_FORMAT}"`),
  units: obj('units', {
    length: v.literal('mm', 'only "mm" is accepted: convert lengths to millimetres before grading'),
    angle: v.literal('deg', 'only "deg" is accepted: convert angles to degrees before grading'),
  }),
  seam: seamSchema,
  rounds: list(roundSchema, 1, 999, 'rounds'),
  readings: list(readingSchema, minReadings, MAX_READINGS, 'readings'),
});

/** A seam file handed over for grading: it must hold at least one reading. */
export const seamFileSchema = obj('seam file', seamFileEntries(1));

/** A seam as the app keeps it: a seam just set up may have no readings yet (its checklist still grades). */
export const seamRecordSchema = obj('seam record', seamFileEntries(0));

export type SeamFile = v.InferOutput<typeof seamFileSchema>;
export type Seam = v.InferOutput<typeof seamSchema>;
export type Round = v.InferOutput<typeof roundSchema>;
export type Reading = v.InferOutput<typeof readingSchema>;
export type Values = Reading['values'];
export type Toe = NonNullable<Reading['toe']>;
export type Side = 'face' | 'root';
export type JointType = (typeof JOINT_TYPES)[number];
export type Edition = (typeof EDITIONS)[number];
export type ExecutionClass = (typeof EXECUTION_CLASSES)[number];
export type Checklist = Round['checklist'];
