import { BUILT_IN_CRITERIA } from '../criteria/registry.js';
import type { ReadingGrade } from '../grade/reading.js';
import type { SeamGrade } from '../grade/seam.js';
import { readingSide } from '../model/joint.js';
import { PARAMETERS, type ParameterName } from '../model/parameters.js';
import type { Edition, Reading } from '../model/seam-file.js';
import { adequacyOf, type SamplePoint } from '../sampling/adequacy.js';
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

function placeOf(name: ParameterName, r: Reading): string {
  const per = PARAMETERS[name].per;
  if (per === 'toe') return r.toe ? `plate ${r.toe.plate} ${r.toe.side}-side toe` : 'toe not named';
  if (per === 'side') return readingSide(r) ? `${readingSide(r)} side` : 'side not named';
  return '';
}

/** Sampling adequacy per measured parameter and place on the seam, from the round's at-pitch readings. */
export function samplingSection(
  setup: Setup,
  grade: SeamGrade,
  round: number | null,
  readings: readonly Reading[],
  options: AssessOptions,
): SamplingAssessment {
  const graded = new Map<string, ReadingGrade>();
  const roundGrade = grade.rounds.find((r) => r.round === round);
  for (const rg of roundGrade?.readings ?? []) graded.set(rg.readingId, rg);
  const columnsOnly = !!roundGrade && roundGrade.readingCount > 0 && roundGrade.readings.length === 0;
  const rows = rowParameter(setup.seam.acceptance.edition);
  const groups = new Map<
    string,
    { name: ParameterName; place: string; points: SamplePoint[]; required: string | null }
  >();
  for (const r of readings) {
    if (r.sampling !== 'atPitch') continue;
    for (const field of Object.keys(r.values)) {
      const name = field as ParameterName;
      const raw = r.values[name];
      if (raw === undefined) continue;
      const value = name === 'linearMisalignment' ? (midPlaneE(setup, r) as number) : raw;
      const place = placeOf(name, r);
      const key = `${name}|${place}`;
      let g = groups.get(key);
      if (!g) {
        g = { name, place, points: [], required: null };
        groups.set(key, g);
      }
      let margin: number | null = null;
      for (const imp of graded.get(r.id)?.imperfections ?? []) {
        if (rows.get(imp.rowId) !== name || imp.margin === null) continue;
        margin = margin === null ? imp.margin : Math.min(margin, imp.margin);
        g.required ??= imp.required;
      }
      const unit = PARAMETERS[name].unit;
      const res = unit === 'mm' ? r.instrument.resolutionMm : r.instrument.resolutionDeg;
      g.points.push({ readingId: r.id, position: positionOf(r), value, margin, resolution: res ?? null });
    }
  }
  const parameters = [...groups.values()].map((g) => {
    const unit = PARAMETERS[g.name].unit;
    const hasRow = [...rows.values()].includes(g.name);
    const riskUnavailable = columnsOnly
      ? 'the grade holds columns only: grade with reading objects to estimate the risk'
      : !hasRow || g.points.every((p) => p.margin === null)
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
