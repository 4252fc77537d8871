// Lean hand-written SVG like the strip chart: a ranked bar chart is a few rectangles, far smaller than a chart
// library the offline app would have to precache.
import type { Bar } from './assessment-view.js';
import { layoutBars } from './bar-layout.js';
import { fitText } from './StripChart.js';
import { useWidth } from './use-width.js';

/** What a screen reader hears in place of the bars: every bar in rank order, in words. */
export function describeBars(title: string, bars: readonly Bar[]): string {
  if (!bars.length) return `${title}: no measured input changes it.`;
  return `${title}, largest first: ${bars.map((b, i) => `${i + 1}. ${b.label}: ${b.text}`).join('; ')}.`;
}

/** Inputs ranked by how much their measurement uncertainty moves the result, largest first. */
export function RankedBars({ title, bars }: { readonly title: string; readonly bars: readonly Bar[] }) {
  const [ref, width] = useWidth();
  const summary = describeBars(title, bars);
  if (!bars.length) return <p ref={ref}>{summary}</p>;
  const layout = layoutBars(
    bars.map((b) => b.magnitude),
    width,
  );
  return (
    <figure class="bars" ref={ref}>
      <figcaption>{title}</figcaption>
      <svg
        role="img"
        aria-label={summary}
        class="bars-svg"
        width={layout.width}
        height={layout.height}
        viewBox={`0 0 ${layout.width} ${layout.height}`}
      >
        {bars.map((b, i) => {
          const p = layout.bars[i];
          if (!p) return null;
          return (
            <g key={b.label}>
              <text class="bar-label" x={layout.left} y={p.labelY}>
                <title>{b.label}</title>
                {fitText(`${i + 1}. ${b.label}`, layout.width - 8)}
              </text>
              <rect class="bar" x={layout.left} y={p.barY} width={p.barWidth} height={layout.barHeight} />
              <text
                class={p.textInside ? 'bar-value bar-value-inside' : 'bar-value'}
                x={p.textX}
                y={p.barY + layout.barHeight - 4}
                text-anchor={p.textInside ? 'end' : 'start'}
              >
                {b.text}
              </text>
            </g>
          );
        })}
      </svg>
    </figure>
  );
}
