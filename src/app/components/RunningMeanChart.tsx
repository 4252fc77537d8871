// Lean hand-written SVG, reusing the strip chart's scales: one line and a band.
import type { SamplingRow } from './assessment-view.js';
import { fmtNumber, fmtValue } from './format.js';
import { layoutRunningMean } from './running-mean-layout.js';
import { useWidth } from './use-width.js';

/** The summary a screen reader hears in place of the line. */
export function describeRunningMean(row: SamplingRow): string {
  const last = row.means[row.means.length - 1];
  if (last === undefined) return `${row.label}: no positions at the pitch yet.`;
  return (
    `${row.label}: running mean over ${row.means.length} position${row.means.length === 1 ? '' : 's'} along the seam, ` +
    `ending at ${fmtValue(last, row.unit)}; band ±${fmtValue(row.target, row.unit)} around it; ` +
    `${row.settled ? 'settled' : 'not settled yet'}.`
  );
}

export function RunningMeanChart({
  row,
  seamLength,
}: {
  readonly row: SamplingRow;
  readonly seamLength: number;
}) {
  const [ref, width] = useWidth();
  const l = layoutRunningMean(row.positions, row.means, row.target, seamLength, width);
  const path = l.points.map((p, i) => `${i ? 'L' : 'M'}${p.x.toFixed(1)},${p.y.toFixed(1)}`).join(' ');
  return (
    <figure class="running" ref={ref}>
      <svg
        role="img"
        aria-label={describeRunningMean(row)}
        class="running-svg"
        width={l.width}
        height={l.height}
        viewBox={`0 0 ${l.width} ${l.height}`}
      >
        <rect
          class="band"
          x={l.plotLeft}
          y={l.band.top}
          width={l.plotRight - l.plotLeft}
          height={Math.max(1, l.band.bottom - l.band.top)}
        />
        <line class="band-edge" x1={l.plotLeft} x2={l.plotRight} y1={l.band.top} y2={l.band.top} />
        <line class="band-edge" x1={l.plotLeft} x2={l.plotRight} y1={l.band.bottom} y2={l.band.bottom} />
        {l.yTicks.map((t) => (
          <text key={t.value} class="tick" x={l.plotLeft - 6} y={t.y + 4} text-anchor="end">
            {fmtNumber(t.value, 2)}
          </text>
        ))}
        <path class="mean-line" d={path} />
        {l.points.map((p, i) => (
          <circle key={i} class="pt pt-ok" cx={p.x} cy={p.y} r={4.5} />
        ))}
        <line class="axis" x1={l.plotLeft} x2={l.plotRight} y1={l.plotBottom} y2={l.plotBottom} />
        {l.xTicks.map((t) => (
          <text key={t.mm} class="tick" x={t.x} y={l.plotBottom + 18} text-anchor="middle">
            {fmtNumber(t.mm)}
          </text>
        ))}
        <text
          class="axis-title"
          x={(l.plotLeft + l.plotRight) / 2}
          y={l.plotBottom + 38}
          text-anchor="middle"
        >
          mm from the start mark
        </text>
      </svg>
      <figcaption class="strip-legend">
        <span>line and dots: mean of the positions so far ({row.unit === 'deg' ? '°' : 'mm'})</span>
        <span>shaded band between dashed lines: final mean ± {fmtValue(row.target, row.unit)}</span>
      </figcaption>
    </figure>
  );
}
