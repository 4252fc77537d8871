// The column mapping: which column of a scanner's table holds which of our parameters, in which unit. Our own JSON
// format ("beadbook.import-mapping/1", documented in docs/import.md); saved per source so the next file from the
// same scanner maps itself.
import * as v from 'valibot';
import { PARAMETERS, type ParameterName } from '../model/parameters.js';
import { ANGLE_UNITS, LENGTH_UNITS, type ImportUnit } from './units.js';

export const MAPPING_FORMAT = 'beadbook.import-mapping/1';

/** Values measured at one toe: mapped per plate ("plate1.toeAngle") or, with a toe column, unprefixed. */
export const TOE_TARGETS = ['toeAngle', 'flankAngle', 'toeRadius', 'undercutDepth', 'overlap'] as const;
export type ToeTarget = (typeof TOE_TARGETS)[number];

/** Values of the cross-section or side, one per row. */
export const SECTION_TARGETS = [
  'reinforcementHeight',
  'reinforcementWidth',
  'convexity',
  'rootConcavity',
  'shrinkageGroove',
  'sagging',
  'incompleteRootPenetration',
  'throat',
  'leg1',
  'leg2',
  'rootGap',
  'linearMisalignment',
  'angularMisalignment',
  'poreDiameter',
  'endCraterDepth',
] as const satisfies readonly ParameterName[];
export type SectionTarget = (typeof SECTION_TARGETS)[number];

export type ValueTarget = ToeTarget | `plate1.${ToeTarget}` | `plate2.${ToeTarget}` | SectionTarget;
export type Target = 'position' | 'toe' | ValueTarget;

export const VALUE_TARGETS: readonly ValueTarget[] = [
  ...TOE_TARGETS,
  ...TOE_TARGETS.map((t) => `plate1.${t}` as const),
  ...TOE_TARGETS.map((t) => `plate2.${t}` as const),
  ...SECTION_TARGETS,
];
export const TARGETS: readonly Target[] = ['position', 'toe', ...VALUE_TARGETS];

/** The parameter a value target fills (a flank angle is stored as the toe angle α = 180° − θ). */
export function parameterOf(target: ValueTarget): ParameterName {
  const base = target.replace(/^plate[12]\./, '') as ToeTarget | SectionTarget;
  return base === 'flankAngle' ? 'toeAngle' : base;
}

export const isAngleTarget = (t: Target): boolean =>
  t !== 'position' && t !== 'toe' && PARAMETERS[parameterOf(t)].unit === 'deg';

const unit = v.picklist(
  [...LENGTH_UNITS, ...ANGLE_UNITS],
  `must be one of ${[...LENGTH_UNITS, ...ANGLE_UNITS].join(', ')}`,
);
const columnRef = v.union(
  [
    v.pipe(v.string(), v.minLength(1)),
    v.pipe(v.number(), v.integer(), v.minValue(1)),
    v.strictObject({
      column: v.union([v.pipe(v.string(), v.minLength(1)), v.pipe(v.number(), v.integer(), v.minValue(1))]),
      unit: v.optional(unit),
    }),
  ],
  'must name a column: its header text, its number (1 = first), or {"column": …, "unit": …}',
);
const plate = v.picklist([1, 2], 'must be 1 or 2');

export const mappingSchema = v.strictObject(
  {
    format: v.literal(MAPPING_FORMAT, `must be "${MAPPING_FORMAT}"`),
    source: v.optional(v.pipe(v.string(), v.maxLength(120))),
    delimiter: v.optional(v.picklist([',', ';', '\t', '|'], 'must be ",", ";", "\\t" or "|"')),
    decimal: v.optional(v.picklist(['.', ','], 'must be "." or ","')),
    header: v.optional(v.boolean()),
    skipLines: v.optional(v.pipe(v.number(), v.integer(), v.minValue(0), v.maxValue(1000))),
    units: v.optional(
      v.strictObject({
        length: v.optional(v.picklist(LENGTH_UNITS, `must be one of ${LENGTH_UNITS.join(', ')}`)),
        angle: v.optional(v.picklist(ANGLE_UNITS, 'must be "deg" or "rad"')),
      }),
    ),
    side: v.optional(v.picklist(['face', 'root'], 'must be "face" or "root"')),
    toe: v.optional(v.strictObject({ plate })),
    toeCodes: v.optional(v.record(v.string(), plate)),
    positionOffset: v.optional(v.pipe(v.number(), v.finite())),
    misalignmentBasis: v.optional(v.picklist(['midPlane', 'faceSurface', 'rootSurface'])),
    sampling: v.optional(v.picklist(['atPitch', 'targeted'])),
    instrument: v.optional(
      v.strictObject({
        id: v.pipe(v.string(), v.minLength(1), v.maxLength(64)),
        resolutionMm: v.optional(v.pipe(v.number(), v.gtValue(0), v.maxValue(10))),
        resolutionDeg: v.optional(v.pipe(v.number(), v.gtValue(0), v.maxValue(10))),
      }),
    ),
    columns: v.record(
      v.picklist(TARGETS as Target[], `keys must be one of: ${TARGETS.join(', ')}`),
      columnRef,
    ),
  },
  (issue) =>
    issue.expected === 'never'
      ? `unknown field; a mapping allows only: format, source, delimiter, decimal, header, skipLines, units, side, toe, toeCodes, positionOffset, misalignmentBasis, sampling, instrument, columns`
      : `a mapping must be an object, got ${issue.received}`,
);

export type ImportMapping = v.InferOutput<typeof mappingSchema>;
export type ColumnRef = NonNullable<ImportMapping['columns'][Target]>;

export interface MappingProblem {
  readonly path: string;
  readonly message: string;
}

export function parseMapping(
  input: unknown,
): { ok: true; mapping: ImportMapping } | { ok: false; problems: MappingProblem[] } {
  const r = v.safeParse(mappingSchema, input, { abortPipeEarly: true });
  if (r.success) return { ok: true, mapping: r.output };
  return {
    ok: false,
    problems: r.issues.map((i) => ({
      path: (i.path ?? []).map((p) => String(p.key)).join('.') || '(mapping)',
      message: i.message,
    })),
  };
}

const norm = (s: string) =>
  s
    .toLowerCase()
    .replace(/[[(].*?[\])]/g, ' ')
    .replace(/[^a-z0-9µ]+/g, ' ')
    .trim();

/** A file's column layout, to find the saved profile of the scanner that wrote it. */
export const headerSignature = (headers: readonly string[]): string => headers.map(norm).join('|');

// Common words in English scanner exports; anything else is mapped by hand once and then saved.
const WORDS: readonly [RegExp, ToeTarget | SectionTarget | 'position' | 'toe'][] = [
  [/^(pos|position|s|y|dist|distance|station|length|slice pos|slice position)$/, 'position'],
  [/^(toe|side|toe side)$/, 'toe'],
  [/flank/, 'flankAngle'],
  [/toe ?angle|^angle|^alpha|wetting/, 'toeAngle'],
  [/radius|^rho|^r$/, 'toeRadius'],
  [/undercut/, 'undercutDepth'],
  [/overlap/, 'overlap'],
  [/reinforcement width|bead width|cap width|^width|^b$/, 'reinforcementWidth'],
  [/reinforcement|excess|height|^h$|convexity/, 'reinforcementHeight'],
  [/throat/, 'throat'],
  [/angular|kink/, 'angularMisalignment'],
  [/misalign|offset|hi lo|^e$/, 'linearMisalignment'],
  [/gap/, 'rootGap'],
  [/pore/, 'poreDiameter'],
];

/** Which plate a header names, e.g. "Toe angle L", "radius right", "undercut 2". */
function plateIn(text: string): 1 | 2 | null {
  const t = ` ${norm(text)} `;
  if (/ (l|left|1|p1|plate 1|plate1) /.test(t)) return 1;
  if (/ (r|right|2|p2|plate 2|plate2) /.test(t)) return 2;
  return null;
}

/** A first guess at the mapping from the header texts; the user checks it in the mapping step. */
export function suggestColumns(headers: readonly string[]): Partial<Record<Target, number>> {
  const out: Partial<Record<Target, number>> = {};
  headers.forEach((h, i) => {
    const words = norm(h)
      .replace(/\b(l|left|r|right|p1|p2|plate ?[12]|1|2)\b/g, ' ')
      .replace(/\s+/g, ' ')
      .trim();
    const hit = WORDS.find(([re]) => re.test(words));
    if (!hit) return;
    let target: Target = hit[1];
    if ((TOE_TARGETS as readonly string[]).includes(target)) {
      const p = plateIn(h);
      if (p) target = `plate${p}.${target as ToeTarget}`;
    }
    if (out[target] === undefined) out[target] = i + 1;
  });
  return out;
}

export type { ImportUnit };
