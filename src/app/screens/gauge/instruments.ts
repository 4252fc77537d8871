import {
  jointFamily,
  PARAMETERS,
  type ParameterName,
  type Reading,
  type Seam,
} from '../../../domain/index.js';

/** The instruments an inspector picks up at the seam. The screen is organised around the one in the hand. */
export type InstrumentKey = 'toe' | 'depth' | 'height' | 'fillet' | 'offset';

export interface InstrumentDef {
  readonly key: InstrumentKey;
  readonly name: string;
  /** What the instrument reads, in words, for the picker. */
  readonly reads: string;
  readonly kind: NonNullable<Reading['instrument']['kind']>;
  /** Which resolutions it has: a length scale, an angle scale or both. */
  readonly scales: { readonly mm: boolean; readonly deg: boolean };
  readonly defaultResolution: { readonly mm?: number; readonly deg?: number };
  /** The measured values it reads, in the order the fields are shown. */
  readonly parameters: readonly ParameterName[];
}

export const INSTRUMENTS: readonly InstrumentDef[] = [
  {
    key: 'toe',
    name: 'Toe gauge',
    reads: 'toe angle, toe radius',
    kind: 'toeGauge',
    scales: { mm: true, deg: true },
    defaultResolution: { mm: 0.1, deg: 1 },
    parameters: ['toeAngle', 'toeRadius'],
  },
  {
    key: 'depth',
    name: 'Depth gauge',
    reads: 'undercut, grooves, sagging, root, pores, craters',
    kind: 'depthGauge',
    scales: { mm: true, deg: false },
    defaultResolution: { mm: 0.1 },
    parameters: [
      'undercutDepth',
      'rootConcavity',
      'shrinkageGroove',
      'sagging',
      'incompleteRootPenetration',
      'poreDiameter',
      'endCraterDepth',
    ],
  },
  {
    key: 'height',
    name: 'Height gauge',
    reads: 'cap or bead height and width, convexity, overlap',
    kind: 'other',
    scales: { mm: true, deg: false },
    defaultResolution: { mm: 0.1 },
    parameters: ['reinforcementHeight', 'convexity', 'reinforcementWidth', 'overlap'],
  },
  {
    key: 'fillet',
    name: 'Fillet gauge',
    reads: 'throat, legs, root gap',
    kind: 'filletGauge',
    scales: { mm: true, deg: false },
    defaultResolution: { mm: 0.5 },
    parameters: ['throat', 'leg1', 'leg2', 'rootGap'],
  },
  {
    key: 'offset',
    name: 'Offset gauge',
    reads: 'linear and angular misalignment',
    kind: 'misalignmentGauge',
    scales: { mm: true, deg: true },
    defaultResolution: { mm: 0.1, deg: 0.5 },
    parameters: ['linearMisalignment', 'angularMisalignment'],
  },
];

export function instrumentDef(key: InstrumentKey): InstrumentDef {
  const def = INSTRUMENTS.find((d) => d.key === key);
  if (!def) throw new Error(`unknown instrument ${key}`);
  return def;
}

export const isInstrumentKey = (x: unknown): x is InstrumentKey => INSTRUMENTS.some((d) => d.key === x);

/**
 * Whether a measured value belongs on this seam's joint: the vocabulary's joint families, incomplete root
 * penetration on single-sided butt welds only, and misalignment on butt joints only — the sign convention
 * (design §3, "Toes and signs") is defined between the mid-planes of two plates in line, which a T, cruciform
 * or lap joint does not have.
 */
export function appliesToSeam(name: ParameterName, seam: Seam): boolean {
  const family = jointFamily(seam.joint.type);
  if (!PARAMETERS[name].joints.includes(family)) return false;
  if (name === 'incompleteRootPenetration') return family === 'butt' && seam.joint.sides === 'one';
  if (name === 'linearMisalignment' || name === 'angularMisalignment') return seam.joint.type === 'butt';
  return true;
}

/** Values that are only graded together with another value of the same cross-section (validation asks for them). */
export const COMPANIONS: Readonly<Partial<Record<ParameterName, readonly ParameterName[]>>> = {
  reinforcementHeight: ['reinforcementWidth'],
  convexity: ['reinforcementWidth'],
  overlap: ['reinforcementWidth'],
  leg1: ['leg2'],
  leg2: ['leg1'],
};

/**
 * Values that can be recorded with a start and an end: the vocabulary's values with length whose companions
 * have length too. Overlap needs the face width, which is read at a position, so it stays at a position.
 */
export function canRunAlong(name: ParameterName): boolean {
  return PARAMETERS[name].hasLength && (COMPANIONS[name] ?? []).every((c) => PARAMETERS[c].hasLength);
}

/** The fields shown for an instrument on a seam; with `runsAlong`, only those that may have a start and an end. */
export function fieldsFor(key: InstrumentKey, seam: Seam, runsAlong = false): ParameterName[] {
  return instrumentDef(key).parameters.filter(
    (n) => appliesToSeam(n, seam) && (!runsAlong || canRunAlong(n)),
  );
}

/** The instruments that have at least one field on this seam. */
export function instrumentsFor(seam: Seam): InstrumentDef[] {
  return INSTRUMENTS.filter((d) => fieldsFor(d.key, seam).length > 0);
}

/** The instrument a stored reading was most likely taken with, for opening a correction on the right scales. */
export function instrumentOfReading(r: Reading): InstrumentKey | null {
  const byKind = INSTRUMENTS.find((d) => d.kind === r.instrument.kind && d.kind !== 'other');
  if (byKind) return byKind.key;
  const present = Object.keys(r.values) as ParameterName[];
  const byValues = INSTRUMENTS.find(
    (d) => present.length > 0 && present.every((n) => d.parameters.includes(n)),
  );
  return byValues?.key ?? null;
}

/** The fields a correction edits: the values the reading holds and the companions they need. */
export function fieldsOfReading(r: Reading): ParameterName[] {
  const present = new Set<ParameterName>();
  for (const [name, value] of Object.entries(r.values) as [ParameterName, number | undefined][]) {
    if (value === undefined) continue;
    present.add(name);
    for (const c of COMPANIONS[name] ?? []) present.add(c);
  }
  const order = INSTRUMENTS.flatMap((d) => d.parameters);
  return order.filter((n) => present.has(n));
}

export const needsToe = (fields: readonly ParameterName[]): boolean =>
  fields.some((n) => PARAMETERS[n].per === 'toe');

export const needsSide = (fields: readonly ParameterName[]): boolean =>
  fields.some((n) => PARAMETERS[n].per === 'side');
