// Geometry of the running-mean chart: the mean of the first k at-pitch positions against the position along
// the seam, with a band of ±target around the final mean; where the line stays inside the band it has settled.
import { niceStep } from './strip-layout.js';

export interface RunningMeanLayout {
  readonly width: number;
  readonly height: number;
  readonly plotLeft: number;
  readonly plotRight: number;
  readonly plotTop: number;
  readonly plotBottom: number;
  readonly points: readonly { readonly x: number; readonly y: number }[];
  readonly band: { readonly top: number; readonly bottom: number; readonly mean: number };
  readonly yTicks: readonly { readonly value: number; readonly y: number }[];
  readonly xTicks: readonly { readonly mm: number; readonly x: number }[];
}

const LEFT = 58;
const RIGHT = 16;
const TOP = 12;
const PLOT = 140;
const AXIS = 44;

function ticks(lo: number, hi: number, target: number): number[] {
  const step = niceStep(hi - lo, target);
  const out: number[] = [];
  for (let v = Math.ceil(lo / step) * step; v <= hi + step * 1e-9; v += step)
    out.push(Number(v.toFixed(9)) + 0);
  return out;
}

export function layoutRunningMean(
  positions: readonly number[],
  means: readonly number[],
  target: number,
  seamLength: number,
  width: number,
): RunningMeanLayout {
  const finalMean = means[means.length - 1] ?? 0;
  const lo0 = Math.min(finalMean - target, ...means);
  const hi0 = Math.max(finalMean + target, ...means);
  const pad = (hi0 - lo0) * 0.08 || Math.max(Math.abs(finalMean) * 0.05, 1);
  const lo = lo0 - pad;
  const hi = hi0 + pad;
  const plotLeft = LEFT;
  const plotRight = Math.max(LEFT + 60, width - RIGHT);
  const plotTop = TOP;
  const plotBottom = TOP + PLOT;
  const xMax = Math.max(seamLength, ...positions);
  const x = (mm: number): number => plotLeft + (mm / (xMax || 1)) * (plotRight - plotLeft);
  const y = (v: number): number => plotBottom - ((v - lo) / (hi - lo)) * (plotBottom - plotTop);
  return {
    width,
    height: plotBottom + AXIS,
    plotLeft,
    plotRight,
    plotTop,
    plotBottom,
    points: positions.map((p, i) => ({ x: x(p), y: y(means[i] as number) })),
    band: { top: y(finalMean + target), bottom: y(finalMean - target), mean: y(finalMean) },
    yTicks: ticks(lo, hi, 4).map((value) => ({ value, y: y(value) })),
    xTicks: ticks(0, xMax, Math.max(2, Math.floor((plotRight - plotLeft) / 90))).map((mm) => ({
      mm,
      x: x(mm),
    })),
  };
}
