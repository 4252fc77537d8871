// The readings along the seam with their limit lines, drawn on the server as SVG: the page's own strip-chart
// geometry (app/components/strip-layout.ts, pure), written out as markup with every text escaped. No script and
// no style attribute (the CSP allows neither): classes from the supervisor stylesheet, shapes and words carry the
// verdict as well as colour (ringed markers are below the required level).
import { levelText, type ReadingGrade } from '../../../domain/index.js';
import { fmtNumber, fmtValue } from '../../../app/components/format.js';
import {
  lanesFromReadings,
  layoutStrip,
  type PlacedLane,
  type PlacedPoint,
} from '../../../app/components/strip-layout.js';
import { html, type Html } from '../html.js';

const unitText = (unit: 'mm' | 'deg') => (unit === 'deg' ? '°' : 'mm');
const n = (x: number) => Math.round(x * 10) / 10;

function marker(p: PlacedPoint): Html {
  const cls = `pt ${p.point.meetsRequired ? 'pt-ok' : 'pt-below'}`;
  const s = 6;
  const title = `${fmtNumber(p.point.at)} mm: ${fmtNumber(p.point.value)}, level ${levelText(p.point.levelMet)}${p.point.meetsRequired ? '' : ', below the required level'}${p.point.borderline ? ', borderline' : ''}`;
  const shape =
    p.point.sampling === 'targeted'
      ? html`<polygon
          class="${cls}"
          points="${n(p.cx)},${n(p.cy - s)} ${n(p.cx + s)},${n(p.cy)} ${n(p.cx)},${n(p.cy + s)} ${n(p.cx - s)},${n(p.cy)}"
        />`
      : html`<circle class="${cls}" cx="${n(p.cx)}" cy="${n(p.cy)}" r="${s - 1}" />`;
  return html`<g>
    <title>${title}</title>
    ${p.spans.map(([a, b]) => html`<line class="pt-span" x1="${n(a)}" x2="${n(b)}" y1="${n(p.cy)}" y2="${n(p.cy)}" />`)}
    ${shape}
    ${p.point.meetsRequired ? '' : html`<circle class="pt-ring" cx="${n(p.cx)}" cy="${n(p.cy)}" r="${s + 4}" />`}
  </g>`;
}

function lane(placed: PlacedLane, left: number, right: number): Html {
  const l = placed.lane;
  const varies = placed.varying.length
    ? ` — limit ${placed.varying.join(', ')} varies by reading: ticks`
    : '';
  const cmp = l.atLeast ? '≥' : '≤';
  return html`<g class="lane">
    <text class="lane-title" x="4" y="${placed.top + 18}"
      >${l.row} ${l.title} (${unitText(l.unit)})${varies}</text
    >
    <rect
      class="lane-bg"
      x="${left}"
      y="${placed.plotTop}"
      width="${right - left}"
      height="${placed.plotBottom - placed.plotTop}"
    />
    ${placed.yTicks.map(
      (t) =>
        html`<line class="gridline" x1="${left}" x2="${right}" y1="${n(t.y)}" y2="${n(t.y)}" />
          <text class="tick" x="${left - 6}" y="${n(t.y + 4)}" text-anchor="end"
            >${fmtNumber(t.value, 2)}</text
          >`,
    )}
    ${placed.lines.map(
      (line) =>
        html`<g class="limit limit-${line.levels[0] ?? 'B'}">
          <line x1="${left}" x2="${right}" y1="${n(line.y)}" y2="${n(line.y)}" />
          <text x="${right + 6}" y="${n(line.labelY)}"
            >${line.levels.join(' ')} ${cmp}${fmtNumber(line.value, 2)}</text
          >
        </g>`,
    )}
    ${placed.ticks.map(
      (t) =>
        html`<line
          class="limit-tick limit-${t.level}"
          x1="${n(t.x - 8)}"
          x2="${n(t.x + 8)}"
          y1="${n(t.y)}"
          y2="${n(t.y)}"
        />`,
    )}
    ${placed.points.map(marker)}
  </g>`;
}

/** The strip chart of one round's graded readings, with a text summary for readers who do not see it. */
export function stripSvg(
  readings: readonly ReadingGrade[],
  seamLength: number,
  caption: string,
  width = 900,
): Html {
  const lanes = lanesFromReadings(readings);
  const count = lanes.reduce((k, l) => k + l.points.length, 0);
  const below = lanes.flatMap((l) => l.points.filter((p) => !p.meetsRequired).map((p) => ({ l, p })));
  const first = below[0];
  const summary = count
    ? `${caption}: ${count} graded value${count === 1 ? '' : 's'} along the ${fmtNumber(seamLength)} mm seam; ${
        first
          ? `${below.length} below the required level, first ${first.l.title} ${fmtValue(first.p.value, first.l.unit)} at ${fmtNumber(first.p.at)} mm`
          : 'none below the required level'
      }.`
    : `${caption}: no graded readings along the ${fmtNumber(seamLength)} mm seam.`;
  if (!count) return html`<p class="strip-empty">${summary}</p>`;
  const layout = layoutStrip(lanes, seamLength, width);
  const thinned = layout.lanes.reduce((k, l) => k + l.thinned, 0);
  return html`<figure class="strip">
    <svg
      xmlns="http://www.w3.org/2000/svg"
      role="img"
      aria-label="${summary}"
      class="strip-svg"
      width="${layout.width}"
      height="${layout.height}"
      viewBox="0 0 ${layout.width} ${layout.height}"
    >
      ${layout.lanes.map((p) => lane(p, layout.plotLeft, layout.plotRight))}
      <line
        class="axis"
        x1="${layout.plotLeft}"
        x2="${layout.plotRight}"
        y1="${layout.axisY}"
        y2="${layout.axisY}"
      />
      ${layout.xTicks.map(
        (t) =>
          html`<line
              class="axis"
              x1="${n(t.x)}"
              x2="${n(t.x)}"
              y1="${layout.axisY}"
              y2="${layout.axisY + 6}"
            />
            <text class="tick" x="${n(t.x)}" y="${layout.axisY + 20}" text-anchor="middle"
              >${fmtNumber(t.mm)}</text
            >`,
      )}
      <text
        class="axis-title"
        x="${(layout.plotLeft + layout.plotRight) / 2}"
        y="${layout.axisY + 40}"
        text-anchor="middle"
      >
        position along the seam, mm from the start mark
      </text>
    </svg>
    <figcaption>
      ${summary} Circles: at pitch; diamonds: targeted; ringed: below the required level; lines: limits at B,
      C, D (solid, dashed,
      dotted).${thinned ? ` ${thinned} crowded values are not drawn (each column keeps its extremes, below-required and targeted values); the reading table has every one.` : ''}
    </figcaption>
  </figure>`;
}
