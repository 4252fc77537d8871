// The strip chart's geometry, from a real grade: one lane per graded row, limits as lines or per-reading ticks,
// targeted readings kept apart from at-pitch ones.
import { describe, expect, it } from 'vitest';
import { gradeSeam } from '../../src/domain/index.js';
import {
  layoutStrip,
  lanesFromReadings,
  niceStep,
  spreadLabels,
} from '../../src/app/components/strip-layout.js';
import { describeStrip, tableRows, TABLE_ROWS_ALL } from '../../src/app/components/StripChart.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

const toe = { plate: 1, side: 'face' } as const;

// ISO 5817:2014 row 1.7 undercut, t = 10 > 3: B 0.5, C 0.5 (0.1·t capped), D 1 (limits reference §2).
// Row 1.9 excess weld metal: h ≤ 1 mm + k·b, so its limit depends on each reading's width b.
function grade() {
  return gradeSeam(
    seamFile(buttSeam({ length: 1000 }), [
      reading({ undercutDepth: 0.3 }, { position: 100, toe }),
      reading({ undercutDepth: 0.8 }, { position: 600, toe, sampling: 'targeted' }),
      reading({ undercutDepth: 0.2 }, { position: undefined, start: 300, end: 350, toe }),
      reading({ reinforcementHeight: 2, reinforcementWidth: 10 }, { position: 200, side: 'face' }),
      reading({ reinforcementHeight: 2, reinforcementWidth: 20 }, { position: 400, side: 'face' }),
    ]),
  );
}

describe('strip chart layout', () => {
  const round = grade().rounds[0];
  if (!round) throw new Error('no round');
  const lanes = lanesFromReadings(round.readings);

  it('makes one lane per graded row, readings in position order, with sampling and verdict', () => {
    expect(lanes.map((l) => l.row)).toEqual(['1.7', '1.9']);
    const undercut = lanes[0];
    expect(undercut?.points.map((p) => [p.at, p.value, p.sampling, p.meetsRequired])).toEqual([
      [100, 0.3, 'atPitch', true],
      [300, 0.2, 'atPitch', true],
      [600, 0.8, 'targeted', false],
    ]);
    expect(undercut?.points[1]?.end).toBe(350);
  });

  it('draws a shared limit once for the levels that share it, and ticks where the limit varies by reading', () => {
    const layout = layoutStrip(lanes, 1000, 800);
    const undercut = layout.lanes[0];
    expect(undercut?.lines.map((l) => [l.levels, l.value])).toEqual([
      [['B', 'C'], 0.5],
      [['D'], 1],
    ]);
    expect(undercut?.ticks).toEqual([]);
    const excess = layout.lanes[1];
    expect(excess?.varying).toEqual(['B', 'C', 'D']);
    expect(excess?.ticks).toHaveLength(6);
    expect(excess?.lines).toEqual([]);
  });

  it('places x by position along the seam and y by value, higher values higher up', () => {
    const layout = layoutStrip(lanes, 1000, 800);
    const pts = layout.lanes[0]?.points ?? [];
    const [a, b, c] = pts;
    if (!a || !b || !c) throw new Error('points missing');
    expect(a.cx).toBeCloseTo(layout.plotLeft + 0.1 * (layout.plotRight - layout.plotLeft));
    expect(c.cx).toBeCloseTo(layout.plotLeft + 0.6 * (layout.plotRight - layout.plotLeft));
    expect(c.cy).toBeLessThan(a.cy);
    expect(b.spans).toHaveLength(1);
    expect(layout.width).toBe(800);
    expect(layout.xTicks[0]?.mm).toBe(0);
    expect(layout.xTicks[layout.xTicks.length - 1]?.mm).toBe(1000);
  });

  it('a circumferential reading past the start mark is drawn in two pieces', () => {
    const g = gradeSeam(
      seamFile(buttSeam({ length: 1000, circumferential: true }), [
        reading({ undercutDepth: 0.2 }, { position: undefined, start: 950, end: 50, toe }),
      ]),
    );
    const layout = layoutStrip(lanesFromReadings(g.rounds[0]?.readings ?? []), 1000, 600);
    expect(layout.lanes[0]?.points[0]?.spans).toHaveLength(2);
  });

  it('says in words what the picture shows', () => {
    expect(describeStrip(lanes, 1000, 'Round 1')).toBe(
      'Round 1: 5 graded values in 2 lanes along the 1000 mm seam; 1 below the required level, first Undercut (continuous or intermittent) 0.8 mm at 600 mm. The table after the chart lists every value.',
    );
    expect(describeStrip([], 500, 'Round 2')).toBe('Round 2: no graded readings yet along the 500 mm seam.');
  });

  it('keeps labels apart and steps round', () => {
    expect(spreadLabels([10, 12, 13], 10, 0, 100)).toEqual([10, 20, 30]);
    expect(spreadLabels([95, 96], 10, 0, 100)).toEqual([90, 100]);
    expect(niceStep(1000, 5)).toBe(200);
    expect(niceStep(3, 3)).toBe(1);
  });
});

// A long seam: 6,000 undercut readings at 10 mm pitch on a 60 m seam, every 500th one over the C limit of 0.5 mm
// (ISO 5817:2014 row 1.7 at t = 10 mm, limits reference §2), so failing marks are sparse among thousands of passes.
describe('strip chart on a seam with thousands of readings', () => {
  const count = 6000;
  const readings = Array.from({ length: count }, (_, i) =>
    reading({ undercutDepth: i % 500 === 7 ? 0.9 : 0.05 + (i % 9) * 0.04 }, { position: i * 10, toe }),
  );
  const g = gradeSeam(seamFile(buttSeam({ length: count * 10 }), readings));
  const lanes = lanesFromReadings(g.rounds[0]?.readings ?? []);
  const layout = layoutStrip(lanes, count * 10, 800);
  const lane = layout.lanes[0];
  if (!lane) throw new Error('no lane');
  const plotWidth = layout.plotRight - layout.plotLeft;

  it('draws at most a few marks per 2 px column, and counts the rest as thinned', () => {
    expect(lane.points.length).toBeLessThanOrEqual(Math.ceil(plotWidth / 2 + 1) * 4);
    expect(lane.points.length).toBeLessThan(count / 2);
    expect(lane.thinned).toBe(count - lane.points.length);
  });

  it('keeps every below-required mark, the extremes of each column, and position order', () => {
    const failing = lanes[0]?.points.filter((p) => !p.meetsRequired) ?? [];
    expect(failing).toHaveLength(12);
    const drawnIds = new Set(lane.points.map((p) => p.point.readingId));
    for (const f of failing) expect(drawnIds.has(f.readingId)).toBe(true);
    const values = lane.points.map((p) => p.point.value);
    expect(Math.max(...values)).toBe(0.9);
    expect(Math.min(...values)).toBe(0.05);
    const xs = lane.points.map((p) => p.cx);
    expect(xs).toEqual([...xs].sort((a, b) => a - b));
  });

  it('a short seam is drawn whole', () => {
    const short = layoutStrip(lanesFromReadings(grade().rounds[0]?.readings ?? []), 1000, 800);
    expect(short.lanes.map((l) => l.thinned)).toEqual([0, 0]);
  });

  it('the hidden table lists every value on a short seam and only the ones that matter on a long one', () => {
    const long = tableRows(lanes);
    expect(count).toBeGreaterThan(TABLE_ROWS_ALL);
    expect(long.rows.every((r) => !r.point.meetsRequired || r.point.borderline)).toBe(true);
    expect(long.rows.length + long.left).toBe(count);
    const short = tableRows(lanesFromReadings(grade().rounds[0]?.readings ?? []));
    expect(short).toMatchObject({ left: 0 });
    expect(short.rows).toHaveLength(5);
    expect(describeStrip(lanes, count * 10, 'Round 1')).toContain(
      'lists the values below the required level',
    );
  });
});
