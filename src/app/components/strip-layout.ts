import { LEVELS, type Level, type LevelMet, type ReadingGrade } from '../../domain/index.js';

// Pure geometry of the strip chart, kept apart from the SVG so it can be tested without a browser.

export interface StripPoint {
  readonly readingId: string;
  /** Position along the seam (mm); a reading with length also has `end`. */
  readonly at: number;
  readonly end?: number;
  readonly value: number;
  readonly sampling: 'atPitch' | 'targeted';
  readonly levelMet: LevelMet;
  readonly meetsRequired: boolean;
  readonly borderline: boolean;
  /** The limit at each level for this reading (null: no limit at that level). */
  readonly limits: Readonly<Partial<Record<Level, number | null>>>;
}

export interface StripLane {
  readonly rowId: string;
  readonly row: string;
  readonly title: string;
  readonly unit: 'mm' | 'deg';
  /** true when the value must be at least the limit (toe angle), false when at most. */
  readonly atLeast: boolean;
  readonly points: readonly StripPoint[];
}

/** One lane per graded row of the round, points in position order. */
export function lanesFromReadings(readings: readonly ReadingGrade[]): StripLane[] {
  const lanes = new Map<string, { lane: Omit<StripLane, 'points'>; points: StripPoint[] }>();
  for (const r of readings) {
    for (const g of r.imperfections) {
      let entry = lanes.get(g.rowId);
      if (!entry) {
        entry = {
          lane: {
            rowId: g.rowId,
            row: g.row,
            title: g.title,
            unit: g.unit,
            atLeast: g.limits.some((l) => l.text.includes('≥')),
          },
          points: [],
        };
        lanes.set(g.rowId, entry);
      }
      const limits: Partial<Record<Level, number | null>> = {};
      for (const l of g.limits) limits[l.level] = l.value;
      const end = r.start !== undefined && r.end !== undefined ? { end: r.end } : {};
      entry.points.push({
        readingId: r.readingId,
        at: r.start ?? r.position,
        ...end,
        value: g.measured,
        sampling: r.sampling,
        levelMet: g.levelMet,
        meetsRequired: g.meetsRequired,
        borderline: g.borderline,
        limits,
      });
    }
  }
  return [...lanes.values()]
    .map(({ lane, points }) => ({ ...lane, points: points.sort((a, b) => a.at - b.at) }))
    .sort((a, b) => a.rowId.localeCompare(b.rowId, 'en', { numeric: true }));
}

export interface LimitLine {
  readonly levels: readonly Level[];
  readonly value: number;
  readonly y: number;
  /** y of the label after labels were pushed apart so they do not overlap. */
  readonly labelY: number;
}

export interface LimitTick {
  readonly level: Level;
  readonly x: number;
  readonly y: number;
}

export interface PlacedPoint {
  readonly point: StripPoint;
  readonly cx: number;
  readonly cy: number;
  /** Horizontal extents for a reading with length (two pieces when it runs past a circumferential start mark). */
  readonly spans: readonly (readonly [number, number])[];
}

export interface PlacedLane {
  readonly lane: StripLane;
  readonly top: number;
  readonly plotTop: number;
  readonly plotBottom: number;
  readonly yTicks: readonly { readonly y: number; readonly value: number }[];
  /** Limits that are the same for every reading of the lane: one line across. */
  readonly lines: readonly LimitLine[];
  /** Limits that differ between readings (they depend on the width b or the toe's plate): a tick per reading. */
  readonly ticks: readonly LimitTick[];
  /** Levels whose limit varies along the lane. */
  readonly varying: readonly Level[];
  readonly points: readonly PlacedPoint[];
  /** Points of the lane not drawn because another point of the same pixel column stands for them. */
  readonly thinned: number;
}

export interface StripLayout {
  readonly width: number;
  readonly height: number;
  readonly plotLeft: number;
  readonly plotRight: number;
  readonly axisY: number;
  readonly xTicks: readonly { readonly x: number; readonly mm: number }[];
  readonly lanes: readonly PlacedLane[];
}

export const LANE_TITLE = 26;
export const LANE_PLOT = 96;
export const LANE_GAP = 14;
const AXIS = 46;
const LEFT = 52;
const RIGHT = 86;
const LABEL_GAP = 15;
/** Width of a column in which only the extremes are drawn once a lane holds more points than it can show. */
const COLUMN_PX = 2;

/**
 * The points worth drawing when a lane holds more than its width can show (a seam with thousands of readings):
 * per 2 px column, the highest and the lowest value, the first below the required level and the first targeted
 * reading. What a reader must see survives — extremes and every column with a failing mark — and the SVG stays a
 * few hundred elements, so the chart renders in one frame instead of blocking the page.
 */
export function thinPoints(points: readonly PlacedPoint[], plotWidth: number): PlacedPoint[] {
  if (points.length <= plotWidth / COLUMN_PX) return [...points];
  const columns = new Map<number, PlacedPoint[]>();
  for (const p of points) {
    const key = Math.floor(p.cx / COLUMN_PX);
    const kept = columns.get(key);
    if (kept) kept.push(p);
    else columns.set(key, [p]);
  }
  const out = new Set<PlacedPoint>();
  for (const col of columns.values()) {
    let hi = col[0] as PlacedPoint;
    let lo = hi;
    for (const p of col) {
      if (p.point.value > hi.point.value) hi = p;
      if (p.point.value < lo.point.value) lo = p;
    }
    out.add(hi).add(lo);
    const below = col.find((p) => !p.point.meetsRequired);
    if (below) out.add(below);
    const targeted = col.find((p) => p.point.sampling === 'targeted');
    if (targeted) out.add(targeted);
  }
  return points.filter((p) => out.has(p));
}

/** Per-reading limit ticks thinned the same way: one tick per level and pixel column at each distinct height. */
function thinTicks(ticks: readonly LimitTick[]): LimitTick[] {
  const seen = new Set<string>();
  return ticks.filter((t) => {
    const key = `${t.level}:${Math.floor(t.x / COLUMN_PX)}:${Math.round(t.y)}`;
    if (seen.has(key)) return false;
    seen.add(key);
    return true;
  });
}

/** Round steps of 1, 2 or 5 × 10^n giving about `target` intervals. */
export function niceStep(span: number, target: number): number {
  if (!(span > 0)) return 1;
  const raw = span / Math.max(1, target);
  const mag = 10 ** Math.floor(Math.log10(raw));
  const f = raw / mag;
  return (f <= 1 ? 1 : f <= 2 ? 2 : f <= 5 ? 5 : 10) * mag;
}

function ticksFor(lo: number, hi: number, target: number): number[] {
  const step = niceStep(hi - lo, target);
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step)
    out.push(Number(v.toFixed(9)) + 0);
  return out;
}

/** Pushes label positions apart to at least `gap`, keeping them inside [min, max] where possible. */
export function spreadLabels(ys: readonly number[], gap: number, min: number, max: number): number[] {
  const order = ys.map((y, i) => ({ y, i })).sort((a, b) => a.y - b.y);
  const out = new Array<number>(ys.length);
  let prev = -Infinity;
  for (const { y, i } of order) {
    const placed = Math.max(y, prev + gap, min);
    out[i] = placed;
    prev = placed;
  }
  // If the last label ran past the bottom, shift the whole stack up.
  const last = order[order.length - 1];
  const over = last ? (out[last.i] as number) - max : 0;
  if (over > 0) for (let k = 0; k < out.length; k++) out[k] = Math.max(min, (out[k] as number) - over);
  return out;
}

function sameLimit(points: readonly StripPoint[], level: Level): { same: boolean; value: number | null } {
  const first = points[0]?.limits[level];
  const value = first === undefined ? null : first;
  for (const p of points) if ((p.limits[level] ?? null) !== value) return { same: false, value: null };
  return { same: true, value };
}

export function layoutStrip(lanes: readonly StripLane[], seamLength: number, width: number): StripLayout {
  const w = Math.max(280, Math.round(width));
  const plotLeft = LEFT;
  const plotRight = w - RIGHT;
  const length = seamLength > 0 ? seamLength : 1;
  const xOf = (mm: number) =>
    plotLeft + (Math.min(Math.max(mm, 0), length) / length) * (plotRight - plotLeft);
  const placed: PlacedLane[] = [];
  let top = 0;
  for (const lane of lanes) {
    const plotTop = top + LANE_TITLE;
    const plotBottom = plotTop + LANE_PLOT;
    const values: number[] = lane.points.map((p) => p.value);
    const constant = LEVELS.map((level) => ({ level, ...sameLimit(lane.points, level) }));
    for (const p of lane.points)
      for (const l of LEVELS) {
        const v = p.limits[l];
        if (typeof v === 'number' && Number.isFinite(v)) values.push(v);
      }
    // A loop, not Math.min(...values): a long seam's values would overflow the argument list.
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of values) {
      if (v < lo) lo = v;
      if (v > hi) hi = v;
    }
    if (lane.unit === 'mm') lo = Math.min(0, lo);
    if (!(hi > lo)) {
      hi = lo + (lane.unit === 'deg' ? 10 : 1);
      if (lane.unit === 'deg') lo -= 10;
    }
    const pad = (hi - lo) * 0.1;
    const yLo = lane.unit === 'mm' && lo >= 0 ? lo : lo - pad;
    const yHi = hi + pad;
    const yOf = (v: number) => plotBottom - ((v - yLo) / (yHi - yLo)) * (plotBottom - plotTop);
    const yTicks = ticksFor(yLo, yHi, 3).map((value) => ({ value, y: yOf(value) }));
    // Levels with the same limit share one line and one label ("B C 0").
    const byValue = new Map<number, Level[]>();
    const varying: Level[] = [];
    for (const c of constant) {
      if (!c.same) varying.push(c.level);
      else if (c.value !== null) byValue.set(c.value, [...(byValue.get(c.value) ?? []), c.level]);
    }
    const raw = [...byValue.entries()].map(([value, levels]) => ({ value, levels, y: yOf(value) }));
    const labelYs = spreadLabels(
      raw.map((r) => r.y + 5),
      LABEL_GAP,
      plotTop + 4,
      plotBottom + 6,
    );
    const lines = raw.map((r, i) => ({ ...r, labelY: labelYs[i] as number }));
    const ticks: LimitTick[] = [];
    for (const level of varying) {
      for (const p of lane.points) {
        const v = p.limits[level];
        if (typeof v === 'number' && Number.isFinite(v)) ticks.push({ level, x: xOf(p.at), y: yOf(v) });
      }
    }
    const all = lane.points.map((p) => {
      const cx = xOf(p.at);
      const spans: (readonly [number, number])[] = [];
      if (p.end !== undefined) {
        if (p.end >= p.at) spans.push([cx, xOf(p.end)]);
        else spans.push([cx, xOf(length)], [xOf(0), xOf(p.end)]);
      }
      return { point: p, cx, cy: yOf(p.value), spans };
    });
    const points = thinPoints(all, plotRight - plotLeft);
    placed.push({
      lane,
      top,
      plotTop,
      plotBottom,
      yTicks,
      lines,
      ticks: thinTicks(ticks),
      varying,
      points,
      thinned: all.length - points.length,
    });
    top = plotBottom + LANE_GAP;
  }
  const axisY = top + 4;
  const xTicks = ticksFor(0, length, Math.max(2, Math.floor((plotRight - plotLeft) / 90))).map((mm) => ({
    mm,
    x: xOf(mm),
  }));
  return { width: w, height: axisY + AXIS, plotLeft, plotRight, axisY, xTicks, lanes: placed };
}
