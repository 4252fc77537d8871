import {
  atLeastOne,
  confidenceHalfWidth,
  meanAndSd,
  pitchOf,
  positionsForHalfWidth,
  predictiveBelow,
  runningMeans,
  settling,
} from './statistics.js';

export interface SamplePoint {
  readonly readingId: string;
  readonly position: number;
  readonly value: number;
  /** Distance inside the governing limit at the required level (negative outside); null when not graded. */
  readonly margin: number | null;
  readonly resolution: number | null;
}

/**
 * The same points as parallel columns, in reading-id order (what the seam assessment builds, without an object
 * per point), with the coarsest instrument resolution among them.
 */
export interface SampleColumns {
  readonly positions: readonly number[];
  readonly values: readonly number[];
  readonly margins: readonly (number | null)[];
  readonly coarsestResolution: number | null;
}

export interface AdequacyInput {
  readonly label: string;
  readonly unit: 'mm' | 'deg';
  readonly points: readonly SamplePoint[] | SampleColumns;
  readonly seamLength: number;
  readonly circumferential: boolean;
  /** Target half-width of the 95 % interval; default: the coarsest instrument resolution among the readings. */
  readonly target?: number;
  readonly defaultResolution: number;
  readonly requiredLevel: string | null;
  /** Why the risk cannot be estimated from margins (no graded limit, or a grade in columns only). */
  readonly riskUnavailable?: string;
}

/** The running mean as positions are added in order along the seam: after positions[i], the mean is means[i]. */
export interface RunningMean {
  readonly positions: readonly number[];
  readonly means: readonly number[];
  /** Present when a long series was thinned to MAX_SERIES entries: how many positions each entry stands for. */
  readonly counts?: readonly number[];
}

export interface Risk {
  readonly distribution: string;
  readonly requiredLevel: string | null;
  /** Probability that one unmeasured position falls outside the required level's limit. */
  readonly onePosition: number;
  readonly pitchMm: number | null;
  readonly unmeasuredPositions: number;
  /** Probability that at least one of the unmeasured positions does (positions assumed independent). */
  readonly anyUnmeasured: number;
  readonly meanMargin: number;
  readonly sdMargin: number;
}

export interface Adequacy {
  readonly label: string;
  readonly unit: 'mm' | 'deg';
  readonly count: number;
  readonly mean: number;
  readonly sd: number | null;
  readonly ci95: { readonly low: number; readonly high: number; readonly halfWidth: number } | null;
  readonly target: { readonly value: number; readonly basis: string };
  readonly runningMean: RunningMean;
  readonly settled: boolean;
  /** Positions after which the running mean stayed within ±target of the final mean. */
  readonly settledAfter: number | null;
  readonly positionsNeeded: number | null;
  readonly morePositions: number | null;
  readonly risk: Risk | { readonly notAssessed: string };
  readonly advice: string;
}

const MAX_SERIES = 200;

/** A number to `digits` significant figures, without trailing zeros (plain arithmetic: cheaper than toPrecision). */
function fmt(x: number, digits = 3): string {
  if (x === 0 || !Number.isFinite(x)) return String(x);
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(Math.abs(x))));
  const f = 10 ** decimals;
  return String(Math.round(x * f) / f);
}
// Targets and pitches repeat across parameters and seams (a few resolutions, one pitch), so their text is kept;
// the bound stops a stream of odd values from growing it without end.
const repeated = new Map<number, string>();
function fmtRepeated(x: number): string {
  let s = repeated.get(x);
  if (s === undefined) {
    s = fmt(x);
    if (repeated.size < 1000) repeated.set(x, s);
  }
  return s;
}
const pct = (p: number): string =>
  p < 0.001 ? 'under 0.1 %' : p > 0.999 ? 'over 99.9 %' : `${fmt(100 * p, 2)} %`;

function series(positions: readonly number[], means: readonly number[]): RunningMean {
  const n = means.length;
  if (n <= MAX_SERIES) return { positions, means };
  const step = (n - 1) / (MAX_SERIES - 1);
  const out = { positions: [] as number[], means: [] as number[], counts: [] as number[] };
  for (let k = 0; k < MAX_SERIES; k++) {
    const i = Math.round(k * step);
    out.positions.push(positions[i] as number);
    out.means.push(means[i] as number);
    out.counts.push(i + 1);
  }
  return out;
}

/** Points as columns in order along the seam: by position, ties in reading-id order (a stable sort). */
function columnsOf(points: readonly SamplePoint[] | SampleColumns): SampleColumns {
  let c: SampleColumns;
  if (Array.isArray(points)) {
    const byId = [...(points as readonly SamplePoint[])].sort((a, b) =>
      a.readingId < b.readingId ? -1 : a.readingId > b.readingId ? 1 : 0,
    );
    let coarsest: number | null = null;
    for (const p of byId)
      if (p.resolution !== null && (coarsest === null || p.resolution > coarsest)) coarsest = p.resolution;
    c = {
      positions: byId.map((p) => p.position),
      values: byId.map((p) => p.value),
      margins: byId.map((p) => p.margin),
      coarsestResolution: coarsest,
    };
  } else {
    c = points as SampleColumns;
  }
  const pos = c.positions;
  let ordered = true;
  for (let i = 1; i < pos.length && ordered; i++) ordered = (pos[i] as number) >= (pos[i - 1] as number);
  if (ordered) return c;
  // Readings are usually taken walking along the seam; otherwise order an index and every column by it.
  const order = pos.map((_, i) => i).sort((a, b) => (pos[a] as number) - (pos[b] as number));
  const pick = <T>(xs: readonly T[]): T[] => order.map((i) => xs[i] as T);
  return {
    positions: pick(c.positions),
    values: pick(c.values),
    margins: pick(c.margins),
    coarsestResolution: c.coarsestResolution,
  };
}

function riskOf(input: AdequacyInput, c: SampleColumns): Risk | { notAssessed: string } {
  if (input.riskUnavailable) return { notAssessed: input.riskUnavailable };
  const m = meanAndSd(c.margins);
  if (m.n < 2) return { notAssessed: 'needs at least 2 graded at-pitch positions' };
  const one = predictiveBelow(0, m.mean, m.sd, m.n);
  const positions = c.positions;
  const pitch = pitchOf(positions);
  let distinct = positions.length ? 1 : 0;
  for (let i = 1; i < positions.length; i++) if (positions[i] !== positions[i - 1]) distinct++;
  const slots =
    pitch && pitch > 0 ? Math.floor(input.seamLength / pitch) + (input.circumferential ? 0 : 1) : distinct;
  const unmeasured = Math.max(0, slots - distinct);
  return {
    distribution: RISK_DISTRIBUTION,
    requiredLevel: input.requiredLevel,
    onePosition: one,
    pitchMm: pitch,
    unmeasuredPositions: unmeasured,
    anyUnmeasured: atLeastOne(one, unmeasured),
    meanMargin: m.mean,
    sdMargin: m.sd,
  };
}

const RISK_DISTRIBUTION =
  'normal margins to the limit, fitted by mean and sample standard deviation; a new position follows the Student t predictive distribution';
const ASKED = 'asked for';
const RESOLUTION = 'instrument resolution';
const DEFAULT = 'default resolution (instrument resolution not recorded)';

/** Sampling adequacy of one measured parameter at one place on the seam, from its at-pitch readings. */
export function adequacyOf(input: AdequacyInput): Adequacy {
  const c = columnsOf(input.points);
  const { values, positions } = c;
  const coarsest = c.coarsestResolution ?? -Infinity;
  const stats = meanAndSd(values);
  const target =
    input.target !== undefined
      ? { value: input.target, basis: ASKED }
      : coarsest > -Infinity
        ? { value: coarsest, basis: RESOLUTION }
        : { value: input.defaultResolution, basis: DEFAULT };
  const half = stats.n >= 2 ? confidenceHalfWidth(stats.sd, stats.n) : null;
  const means = runningMeans(values);
  const settle = stats.n ? settling(means, target.value) : { after: 0, settled: false };
  const needed = stats.n >= 2 ? positionsForHalfWidth(stats.sd, target.value) : null;
  const more = needed === null ? null : Math.max(0, needed - stats.n);
  const risk = riskOf(input, c);
  const u = input.unit === 'deg' ? '°' : ' mm';
  const parts: string[] = [];
  if (stats.n < 2) {
    parts.push(
      `${input.label}: ${stats.n} at-pitch position; measure at least ${2 - stats.n} more to estimate the scatter`,
    );
  } else {
    parts.push(
      `${input.label}: ${stats.n} positions, mean ${fmt(stats.mean)}${u}, 95 % interval ±${fmt(half as number, 2)}${u}`,
    );
    if (more === null)
      parts.push(
        `the scatter is too large to bring the interval within ±${fmtRepeated(target.value)}${u} by measuring more`,
      );
    else if (more === 0) parts.push(`within ±${fmtRepeated(target.value)}${u}: enough positions`);
    else
      parts.push(
        `measure about ${more} more position${more === 1 ? '' : 's'} to bring it within ±${fmtRepeated(target.value)}${u}`,
      );
    if (!settle.settled) parts.push('the running mean has not settled yet');
  }
  if ('onePosition' in risk) {
    const level = `level ${risk.requiredLevel ?? 'required'}`;
    parts.push(
      risk.unmeasuredPositions > 0
        ? `chance that one unmeasured position misses ${level}: ${pct(risk.onePosition)}; that at least one of the ${risk.unmeasuredPositions} unmeasured positions at the ${fmtRepeated(risk.pitchMm ?? 0)} mm pitch does: ${pct(risk.anyUnmeasured)} (positions assumed independent)`
        : `every position at the pitch was measured; chance that another position would miss ${level}: ${pct(risk.onePosition)}`,
    );
  }
  return {
    label: input.label,
    unit: input.unit,
    count: stats.n,
    mean: stats.mean,
    sd: stats.n >= 2 ? stats.sd : null,
    ci95: half === null ? null : { low: stats.mean - half, high: stats.mean + half, halfWidth: half },
    target,
    runningMean: series(positions, means),
    settled: settle.settled,
    settledAfter: stats.n ? settle.after : null,
    positionsNeeded: needed,
    morePositions: more,
    risk,
    advice: `${parts.join('; ')}.`,
  };
}
