import { BUILT_IN_CRITERIA } from '../criteria/registry.js';
import type { ReadingGrade } from '../grade/reading.js';
import type { SeamGrade } from '../grade/seam.js';
import { readingSide } from '../model/joint.js';
import { PARAMETER_NAMES, PARAMETERS, type ParameterName } from '../model/parameters.js';
import type { Edition, Reading } from '../model/seam-file.js';
import { adequacyOf } from '../sampling/adequacy.js';
import { DEFAULT_RESOLUTION, midPlaneE, positionOf } from './readings.js';
import type { AssessOptions, Setup } from './setup.js';
import type { SamplingAssessment } from './types.js';

export const SAMPLING_CAVEAT =
  'Only at-pitch readings are used (targeted readings were chosen as the worst spots and would bias the statistics). ' +
  'Positions are assumed independent; readings close together along a seam are often alike, which makes these ' +
  'figures optimistic.';

const LABEL: Readonly<Record<ParameterName, string>> = {
  toeAngle: 'toe angle',
  toeRadius: 'toe radius',
  reinforcementHeight: 'reinforcement height',
  reinforcementWidth: 'reinforcement width',
  convexity: 'convexity',
  undercutDepth: 'undercut depth',
  overlap: 'overlap',
  rootConcavity: 'root concavity',
  shrinkageGroove: 'shrinkage groove',
  sagging: 'sagging',
  incompleteRootPenetration: 'incomplete root penetration',
  throat: 'throat',
  leg1: 'leg z1',
  leg2: 'leg z2',
  rootGap: 'root gap',
  linearMisalignment: 'linear misalignment (mid-plane e)',
  angularMisalignment: 'angular misalignment',
  poreDiameter: 'pore diameter',
  endCraterDepth: 'end crater depth',
};

const rowParameters = new Map<Edition, Map<string, ParameterName>>();

function rowParameter(edition: Edition): Map<string, ParameterName> {
  let m = rowParameters.get(edition);
  if (!m) {
    m = new Map(BUILT_IN_CRITERIA[edition].rows.map((r) => [r.id, r.parameter]));
    rowParameters.set(edition, m);
  }
  return m;
}

const PLACES = [
  'plate 1 face-side toe',
  'plate 1 root-side toe',
  'plate 2 face-side toe',
  'plate 2 root-side toe',
  'face side',
  'root side',
  'toe not named',
  'side not named',
  '',
] as const;

/** Where on the joint a value belongs, as an index into PLACES (numbers keep the grouping cheap). */
function placeOf(name: ParameterName, r: Reading): number {
  const per = PARAMETERS[name].per;
  if (per === 'toe') return r.toe ? (r.toe.plate - 1) * 2 + (r.toe.side === 'root' ? 1 : 0) : 6;
  if (per === 'side') {
    const side = readingSide(r);
    return side === 'face' ? 4 : side === 'root' ? 5 : 7;
  }
  return 8;
}

const NONE: ReadingGrade['imperfections'] = [];

interface Group {
  readonly name: ParameterName;
  readonly place: string;
  readonly points: {
    readonly positions: number[];
    readonly values: number[];
    readonly margins: (number | null)[];
    coarsestResolution: number | null;
  };
  required: string | null;
}

const PARAMETER_INDEX = new Map(PARAMETER_NAMES.map((n, i) => [n, i]));

/** Sampling adequacy per measured parameter and place on the seam, from the round's at-pitch readings. */
export function samplingSection(
  setup: Setup,
  grade: SeamGrade,
  round: number | null,
  readings: readonly Reading[],
  options: AssessOptions,
): SamplingAssessment {
  const roundGrade = grade.rounds.find((r) => r.round === round);
  const gradedReadings = roundGrade?.readings ?? [];
  // The grade lists the round's readings in the same order (by id): use that, and a map only if it differs.
  const sameOrder =
    gradedReadings.length === readings.length &&
    gradedReadings.every((g, i) => g.readingId === readings[i]?.id);
  const graded = sameOrder ? null : new Map(gradedReadings.map((g) => [g.readingId, g]));
  const columnsOnly = !!roundGrade && roundGrade.readingCount > 0 && roundGrade.readings.length === 0;
  const rows = rowParameter(setup.seam.acceptance.edition);
  const groups = new Map<number, Group>();
  readings.forEach((r, index) => {
    if (r.sampling !== 'atPitch') return;
    const rg: ReadingGrade | undefined = graded ? graded.get(r.id) : gradedReadings[index];
    const imperfections = rg?.imperfections ?? NONE;
    const position = positionOf(r);
    const resMm = r.instrument.resolutionMm ?? null;
    const resDeg = r.instrument.resolutionDeg ?? null;
    const values = r.values;
    for (const field in values) {
      const name = field as ParameterName;
      const raw = values[name];
      if (raw === undefined) continue;
      const value = name === 'linearMisalignment' ? (midPlaneE(setup, r) as number) : raw;
      const place = placeOf(name, r);
      const key = (PARAMETER_INDEX.get(name) as number) * PLACES.length + place;
      let g = groups.get(key);
      if (!g) {
        g = {
          name,
          place: PLACES[place] as string,
          points: { positions: [], values: [], margins: [], coarsestResolution: null },
          required: null,
        };
        groups.set(key, g);
      }
      let margin: number | null = null;
      for (let k = 0; k < imperfections.length; k++) {
        const imp = imperfections[k] as ReadingGrade['imperfections'][number];
        if (imp.margin === null || rows.get(imp.rowId) !== name) continue;
        margin = margin === null ? imp.margin : Math.min(margin, imp.margin);
        g.required ??= imp.required;
      }
      const resolution = PARAMETERS[name].unit === 'mm' ? resMm : resDeg;
      const c = g.points;
      c.positions.push(position);
      c.values.push(value);
      c.margins.push(margin);
      if (resolution !== null && (c.coarsestResolution === null || resolution > c.coarsestResolution)) {
        c.coarsestResolution = resolution;
      }
    }
  });

  const gradedParameters = new Set(rows.values());
  const parameters = [...groups.values()].map((g) => {
    const unit = PARAMETERS[g.name].unit;
    const hasRow = gradedParameters.has(g.name);
    const riskUnavailable = columnsOnly
      ? 'the grade holds columns only: grade with reading objects to estimate the risk'
      : !hasRow || g.points.margins.every((m) => m === null)
        ? 'no ISO 5817 limit applies to this value here'
        : undefined;
    const target = options.samplingTargets?.[g.name];
    return adequacyOf({
      label: g.place ? `${LABEL[g.name]}, ${g.place}` : LABEL[g.name],
      unit,
      points: g.points,
      seamLength: setup.seam.length,
      circumferential: setup.seam.circumferential,
      defaultResolution: DEFAULT_RESOLUTION[unit],
      requiredLevel: g.required,
      ...(target === undefined ? {} : { target }),
      ...(riskUnavailable === undefined ? {} : { riskUnavailable }),
    });
  });
  return { caveat: SAMPLING_CAVEAT, round, parameters };
}
