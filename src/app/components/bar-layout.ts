// Geometry of the ranked bar chart ("what drives it"): one row per input, the label above its bar so long
// names fit a phone, bars scaled to the largest.

export interface PlacedBar {
  readonly labelY: number;
  readonly barY: number;
  readonly barWidth: number;
  readonly textX: number;
  /** The value text sits inside the bar's end when the bar is too long to leave room after it. */
  readonly textInside: boolean;
}

export interface BarLayout {
  readonly width: number;
  readonly height: number;
  readonly left: number;
  readonly barHeight: number;
  readonly bars: readonly PlacedBar[];
}

const ROW = 50;
const BAR = 18;
const LEFT = 4;
const TEXT_ROOM = 190;

export function layoutBars(magnitudes: readonly number[], width: number): BarLayout {
  const largest = Math.max(0, ...magnitudes.filter((m) => Number.isFinite(m)));
  const span = Math.max(40, width - LEFT - 8);
  const bars = magnitudes.map((m, i) => {
    const barWidth = largest > 0 && Number.isFinite(m) ? Math.max(2, (m / largest) * span) : 0;
    const textInside = barWidth > span - TEXT_ROOM;
    return {
      labelY: i * ROW + 16,
      barY: i * ROW + 24,
      barWidth,
      textX: textInside ? LEFT + barWidth - 6 : LEFT + barWidth + 6,
      textInside,
    };
  });
  return { width, height: magnitudes.length * ROW + 4, left: LEFT, barHeight: BAR, bars };
}
