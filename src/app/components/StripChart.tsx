// Drawn by hand in SVG, no chart library: a few hundred lines of SVG are smaller than any chart library this
// offline app would have to precache, and the later charts (misalignment, fatigue) reuse this one.
import { levelText, type ReadingGrade } from '../../domain/index.js';
import { fmtNumber, fmtValue } from './format.js';
import {
  layoutStrip,
  lanesFromReadings,
  type PlacedLane,
  type PlacedPoint,
  type StripLane,
} from './strip-layout.js';
import { useWidth } from './use-width.js';

export interface StripChartProps {
  readonly readings: readonly ReadingGrade[];
  readonly seamLength: number;
  /** Said first in the summary, e.g. "Round 2". */
  readonly caption: string;
}

const unitText = (unit: 'mm' | 'deg') => (unit === 'deg' ? '°' : 'mm');
/** More rows than this and the hidden table lists only the values a reader must hear (below or borderline). */
export const TABLE_ROWS_ALL = 400;

/** The rows of the hidden table: every value on a short seam; on a long one, only those below or borderline. */
export function tableRows(lanes: readonly StripLane[]): {
  rows: { lane: StripLane; point: StripLane['points'][number] }[];
  left: number;
} {
  const all = lanes.flatMap((lane) => lane.points.map((point) => ({ lane, point })));
  if (all.length <= TABLE_ROWS_ALL) return { rows: all, left: 0 };
  const rows = all.filter((r) => !r.point.meetsRequired || r.point.borderline);
  return { rows, left: all.length - rows.length };
}

/** The summary a screen reader hears in place of the picture. */
export function describeStrip(lanes: readonly StripLane[], seamLength: number, caption: string): string {
  const count = lanes.reduce((n, l) => n + l.points.length, 0);
  if (!count) return `${caption}: no graded readings yet along the ${fmtNumber(seamLength)} mm seam.`;
  const below = lanes.flatMap((l) => l.points.filter((p) => !p.meetsRequired).map((p) => ({ l, p })));
  const parts = [
    `${caption}: ${count} graded value${count === 1 ? '' : 's'} in ${lanes.length} lane${lanes.length === 1 ? '' : 's'} along the ${fmtNumber(seamLength)} mm seam`,
  ];
  parts.push(
    below.length
      ? `${below.length} below the required level, first ${below[0]?.l.title} ${fmtValue(below[0]?.p.value, below[0]?.l.unit ?? 'mm')} at ${fmtNumber(below[0]?.p.at ?? 0)} mm`
      : 'none below the required level',
  );
  return `${parts.join('; ')}. ${count > TABLE_ROWS_ALL ? 'The table after the chart lists the values below the required level or borderline.' : 'The table after the chart lists every value.'}`;
}

function Marker({ p }: { readonly p: PlacedPoint }) {
  const cls = `pt ${p.point.meetsRequired ? 'pt-ok' : 'pt-below'}`;
  const s = 7;
  const shape =
    p.point.sampling === 'targeted' ? (
      <polygon
        class={cls}
        points={`${p.cx},${p.cy - s} ${p.cx + s},${p.cy} ${p.cx},${p.cy + s} ${p.cx - s},${p.cy}`}
      />
    ) : (
      <circle class={cls} cx={p.cx} cy={p.cy} r={s - 1.5} />
    );
  return (
    <g>
      {p.spans.map(([a, b], i) => (
        <line key={i} class="pt-span" x1={a} x2={b} y1={p.cy} y2={p.cy} />
      ))}
      {shape}
      {/* Below the required level: a ring around the marker, so the verdict does not hang on colour. */}
      {p.point.meetsRequired ? null : <circle class="pt-ring" cx={p.cx} cy={p.cy} r={s + 4} />}
    </g>
  );
}

/** SVG text does not wrap: a title longer than the chart is shortened, the full text kept in its tooltip. */
export function fitText(text: string, px: number, charPx = 7.8): string {
  const max = Math.max(8, Math.floor(px / charPx));
  return text.length <= max ? text : `${text.slice(0, max - 1).trimEnd()}…`;
}

function Lane({
  placed,
  left,
  right,
  width,
}: {
  readonly placed: PlacedLane;
  readonly left: number;
  readonly right: number;
  readonly width: number;
}) {
  const { lane } = placed;
  const varies = placed.varying.length
    ? ` — limit ${placed.varying.join(', ')} varies by reading: ticks`
    : '';
  const title = `${lane.row} ${lane.title} (${unitText(lane.unit)})${varies}`;
  const cmp = lane.atLeast ? '≥' : '≤';
  return (
    <g class="lane">
      <text class="lane-title" x={4} y={placed.top + 18}>
        <title>{title}</title>
        {fitText(title, width - 8)}
      </text>
      <rect
        class="lane-bg"
        x={left}
        y={placed.plotTop}
        width={right - left}
        height={placed.plotBottom - placed.plotTop}
      />
      {placed.yTicks.map((t) => (
        <g key={t.value}>
          <line class="gridline" x1={left} x2={right} y1={t.y} y2={t.y} />
          <text class="tick" x={left - 6} y={t.y + 4} text-anchor="end">
            {fmtNumber(t.value, 2)}
          </text>
        </g>
      ))}
      {placed.lines.map((l) => (
        <g key={l.value} class={`limit limit-${l.levels[0] ?? 'B'}`}>
          <line x1={left} x2={right} y1={l.y} y2={l.y} />
          <text x={right + 6} y={l.labelY}>
            {l.levels.join(' ')} {cmp}
            {fmtNumber(l.value, 2)}
          </text>
        </g>
      ))}
      {placed.ticks.map((t, i) => (
        <line key={i} class={`limit-tick limit-${t.level}`} x1={t.x - 9} x2={t.x + 9} y1={t.y} y2={t.y} />
      ))}
      {placed.points.map((p) => (
        <Marker key={p.point.readingId} p={p} />
      ))}
    </g>
  );
}

/** Readings along the seam: x is the position from the start mark, one lane per graded imperfection row. */
export function StripChart({ readings, seamLength, caption }: StripChartProps) {
  const [ref, width] = useWidth();
  const lanes = lanesFromReadings(readings);
  const summary = describeStrip(lanes, seamLength, caption);
  if (!lanes.length) {
    return (
      <p class="strip-empty" ref={ref}>
        {summary}
      </p>
    );
  }
  const layout = layoutStrip(lanes, seamLength, width);
  const thinned = layout.lanes.reduce((n, l) => n + l.thinned, 0);
  const table = tableRows(lanes);
  return (
    <figure class="strip" ref={ref}>
      <svg
        role="img"
        aria-label={summary}
        width={layout.width}
        height={layout.height}
        viewBox={`0 0 ${layout.width} ${layout.height}`}
        class="strip-svg"
      >
        {layout.lanes.map((p) => (
          <Lane
            key={p.lane.rowId}
            placed={p}
            left={layout.plotLeft}
            right={layout.plotRight}
            width={layout.width}
          />
        ))}
        <line class="axis" x1={layout.plotLeft} x2={layout.plotRight} y1={layout.axisY} y2={layout.axisY} />
        {layout.xTicks.map((t) => (
          <g key={t.mm}>
            <line class="axis" x1={t.x} x2={t.x} y1={layout.axisY} y2={layout.axisY + 6} />
            <text class="tick" x={t.x} y={layout.axisY + 20} text-anchor="middle">
              {fmtNumber(t.mm)}
            </text>
          </g>
        ))}
        <text
          class="axis-title"
          x={(layout.plotLeft + layout.plotRight) / 2}
          y={layout.axisY + 40}
          text-anchor="middle"
        >
          {layout.width < 520 ? 'mm from the start mark' : 'position along the seam, mm from the start mark'}
        </text>
      </svg>
      <figcaption class="strip-legend">
        <span>
          <svg aria-hidden="true" width="18" height="18" viewBox="0 0 18 18">
            <circle class="pt pt-ok" cx="9" cy="9" r="5.5" />
          </svg>{' '}
          at pitch
        </span>
        <span>
          <svg aria-hidden="true" width="18" height="18" viewBox="0 0 18 18">
            <polygon class="pt pt-ok" points="9,2 16,9 9,16 2,9" />
          </svg>{' '}
          targeted
        </span>
        <span>
          <svg aria-hidden="true" width="26" height="26" viewBox="0 0 26 26">
            <circle class="pt pt-below" cx="13" cy="13" r="5.5" />
            <circle class="pt-ring" cx="13" cy="13" r="11" />
          </svg>{' '}
          ringed: below the required level
        </span>
        <span>lines: limits at B, C, D (solid, dashed, dotted)</span>
        {thinned ? (
          <span class="strip-thinned">
            {thinned} of {lanes.reduce((n, l) => n + l.points.length, 0)} values not drawn: where readings
            crowd, each column shows its highest, lowest, below-required and targeted ones
          </span>
        ) : null}
      </figcaption>
      {/* Wrapped: a table does not shrink to the 1 px of the hiding class and would widen the page. */}
      <div class="visually-hidden">
        <table>
          <caption>{caption}: values along the seam</caption>
          <thead>
            <tr>
              <th scope="col">Imperfection</th>
              <th scope="col">Position</th>
              <th scope="col">Sampling</th>
              <th scope="col">Value</th>
              <th scope="col">Limits B, C, D</th>
              <th scope="col">Level met</th>
            </tr>
          </thead>
          <tbody>
            {table.rows.map(({ lane: l, point: p }) => (
              <tr key={`${l.rowId}-${p.readingId}`}>
                <td>
                  {l.row} {l.title}
                </td>
                <td>
                  {fmtNumber(p.at)}
                  {p.end === undefined ? '' : `–${fmtNumber(p.end)}`} mm
                </td>
                <td>{p.sampling === 'targeted' ? 'targeted' : 'at pitch'}</td>
                <td>{fmtValue(p.value, l.unit)}</td>
                <td>
                  {(['B', 'C', 'D'] as const)
                    .map(
                      (lv) =>
                        `${lv} ${p.limits[lv] === null || p.limits[lv] === undefined ? 'none' : fmtValue(p.limits[lv], l.unit)}`,
                    )
                    .join(', ')}
                </td>
                <td>
                  {levelText(p.levelMet)}
                  {p.meetsRequired ? '' : ', below the required level'}
                  {p.borderline ? ', borderline' : ''}
                </td>
              </tr>
            ))}
          </tbody>
          {table.left ? (
            <tfoot>
              <tr>
                <td colSpan={6}>
                  {table.left} further values meet the required level and are not borderline; the reading list
                  below has every one.
                </td>
              </tr>
            </tfoot>
          ) : null}
        </table>
      </div>
    </figure>
  );
}
