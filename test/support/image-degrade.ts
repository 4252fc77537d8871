// Hand-written degradations of grey images, the ways a tag looks on the shop floor: turned, out of focus, noisy,
// faded, under a lamp's glare or a shadow, seen at a slant, far away, or printed light on dark. Deterministic
// (seeded noise), so a decode rate is the same on every run.
import type { LumaFrame } from '../../workers/tag-decode-core.js';

const frame = (width: number, height: number, fill = 0): LumaFrame => ({
  data: new Uint8ClampedArray(width * height).fill(fill),
  width,
  height,
});

/** Bilinear sample, `outside` beyond the edges. */
function sample(img: LumaFrame, x: number, y: number, outside: number): number {
  const x0 = Math.floor(x);
  const y0 = Math.floor(y);
  const at = (px: number, py: number) =>
    px < 0 || py < 0 || px >= img.width || py >= img.height
      ? outside
      : (img.data[py * img.width + px] as number);
  const fx = x - x0;
  const fy = y - y0;
  const top = at(x0, y0) * (1 - fx) + at(x0 + 1, y0) * fx;
  const bottom = at(x0, y0 + 1) * (1 - fx) + at(x0 + 1, y0 + 1) * fx;
  return top * (1 - fy) + bottom * fy;
}

/** Maps every output pixel back to a source point (inverse warp), same size as the source. */
function warp(img: LumaFrame, back: (x: number, y: number) => [number, number], outside: number): LumaFrame {
  const out = frame(img.width, img.height);
  for (let y = 0; y < img.height; y++) {
    for (let x = 0; x < img.width; x++) {
      const [sx, sy] = back(x, y);
      out.data[y * img.width + x] = sample(img, sx, sy, outside);
    }
  }
  return out;
}

/** Turned by `degrees` about the centre. */
export function rotate(img: LumaFrame, degrees: number, outside = 190): LumaFrame {
  const a = (-degrees * Math.PI) / 180;
  const cx = img.width / 2;
  const cy = img.height / 2;
  const cos = Math.cos(a);
  const sin = Math.sin(a);
  return warp(
    img,
    (x, y) => [cx + (x - cx) * cos - (y - cy) * sin, cy + (x - cx) * sin + (y - cy) * cos],
    outside,
  );
}

/** Out of focus: three passes of a box blur of `radius` (close to a Gaussian, common practice). */
export function blur(img: LumaFrame, radius: number): LumaFrame {
  let cur = img;
  for (let pass = 0; pass < 3; pass++) cur = boxBlur(boxBlur(cur, radius, true), radius, false);
  return cur;
}

function boxBlur(img: LumaFrame, r: number, horizontal: boolean): LumaFrame {
  const out = frame(img.width, img.height);
  const { width, height } = img;
  const n = 2 * r + 1;
  const lines = horizontal ? height : width;
  const length = horizontal ? width : height;
  const index = (line: number, i: number) => (horizontal ? line * width + i : i * width + line);
  for (let line = 0; line < lines; line++) {
    let sum = 0;
    const at = (i: number) => img.data[index(line, Math.min(length - 1, Math.max(0, i)))] as number;
    for (let i = -r; i <= r; i++) sum += at(i);
    for (let i = 0; i < length; i++) {
      out.data[index(line, i)] = sum / n;
      sum += at(i + r + 1) - at(i - r);
    }
  }
  return out;
}

/** A seeded generator (mulberry32), so noise is the same on every run. */
export function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Sensor noise: Gaussian (Box–Muller) with standard deviation `sigma` grey levels. */
export function noise(img: LumaFrame, sigma: number, seed: number): LumaFrame {
  const random = seeded(seed);
  const out = frame(img.width, img.height);
  for (let i = 0; i < img.data.length; i++) {
    const g = Math.sqrt(-2 * Math.log(random() || 1e-12)) * Math.cos(2 * Math.PI * random());
    out.data[i] = (img.data[i] as number) + g * sigma;
  }
  return out;
}

/** Faded print in dim light: the full range squeezed into [low, high]. */
export function lowContrast(img: LumaFrame, low: number, high: number): LumaFrame {
  const out = frame(img.width, img.height);
  for (let i = 0; i < img.data.length; i++)
    out.data[i] = low + ((img.data[i] as number) * (high - low)) / 255;
  return out;
}

/** A lamp's reflection: a bright disc (centre at fractions fx, fy; radius a fraction of the shorter side). */
export function glare(img: LumaFrame, fx: number, fy: number, radius: number): LumaFrame {
  const out = frame(img.width, img.height);
  const cx = fx * img.width;
  const cy = fy * img.height;
  const r = radius * Math.min(img.width, img.height);
  for (let y = 0; y < img.height; y++) {
    for (let x = 0; x < img.width; x++) {
      const d = Math.hypot(x - cx, y - cy) / r;
      const i = y * img.width + x;
      // Saturated at the centre, fading out to the rim.
      const lift = d < 0.6 ? 255 : d < 1 ? 255 * (1 - (d - 0.6) / 0.4) : 0;
      out.data[i] = (img.data[i] as number) + lift;
    }
  }
  return out;
}

/** A shadow across the tag: brightness falling linearly from 100 % at the left to `darkest` at the right. */
export function unevenLight(img: LumaFrame, darkest: number): LumaFrame {
  const out = frame(img.width, img.height);
  for (let y = 0; y < img.height; y++) {
    for (let x = 0; x < img.width; x++) {
      const k = 1 - ((1 - darkest) * x) / (img.width - 1);
      out.data[y * img.width + x] = (img.data[y * img.width + x] as number) * k;
    }
  }
  return out;
}

/**
 * Seen at a slant: the top edge shortened by `squeeze` (0.25 = a quarter) about the centre, as a tag on a plate
 * leaning away from the camera (a keystone projection).
 */
export function perspective(img: LumaFrame, squeeze: number, outside = 190): LumaFrame {
  const cx = img.width / 2;
  return warp(
    img,
    (x, y) => {
      const k = 1 - squeeze * (1 - y / (img.height - 1));
      return [cx + (x - cx) / k, y];
    },
    outside,
  );
}

/** Half the size (each output pixel the mean of 2 × 2), as from twice the distance. */
export function halfScale(img: LumaFrame): LumaFrame {
  const width = Math.floor(img.width / 2);
  const height = Math.floor(img.height / 2);
  const out = frame(width, height);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const at = (dx: number, dy: number) => img.data[(2 * y + dy) * img.width + 2 * x + dx] as number;
      out.data[y * width + x] = (at(0, 0) + at(1, 0) + at(0, 1) + at(1, 1)) / 4;
    }
  }
  return out;
}

/** Light on dark: every grey level inverted. */
export function invert(img: LumaFrame): LumaFrame {
  const out = frame(img.width, img.height);
  for (let i = 0; i < img.data.length; i++) out.data[i] = 255 - (img.data[i] as number);
  return out;
}
