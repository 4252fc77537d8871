// The decode-rate matrix shared by the decode test and its report: payloads per symbol, the conditions a tag is
// seen in, and the rate at which the decoder reads each back exactly.
import { createTagDecoder, type LumaFrame } from '../../workers/tag-decode-core.js';
import { zxingKitNode } from '../../workers/zxing-kit-node.js';
import { drawSymbol, onBackground, type TestSymbol } from './barcode-images.js';
import {
  blur,
  glare,
  halfScale,
  invert,
  lowContrast,
  noise,
  perspective,
  rotate,
  seeded,
  unevenLight,
} from './image-degrade.js';

export const decode = createTagDecoder(zxingKitNode);

const PRINTABLE = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-/._ :#+';

/** `count` seeded ASCII payloads of 4 to `maxLength` characters, starting with yard-like ones. */
export function asciiPayloads(count: number, maxLength: number, seed: number): string[] {
  const random = seeded(seed);
  const fixed = ['KP-014', 'B12/3-W07', 'SEAM 0001', '<script>alert(1)</script>', `O'Hare "x"; DROP`];
  const out = fixed.slice(0, count);
  while (out.length < count) {
    const length = 4 + Math.floor(random() * (maxLength - 3));
    let text = '';
    for (let i = 0; i < length; i++) text += PRINTABLE[Math.floor(random() * PRINTABLE.length)];
    out.push(text.trim() || 'X');
  }
  return out;
}

/** Payloads outside ASCII, written as UTF-8 bytes by the generator. */
export const NON_ASCII_PAYLOADS = [
  'Naht-Ø12-äöü',
  '焊缝-07',
  'Шов №3',
  'Spoina-ąęł',
  'Soudure é/ß',
  '⚙ T-9 🔥',
];

export interface Condition {
  readonly name: string;
  readonly apply: (img: LumaFrame, seed: number) => LumaFrame;
}

/** The symbol on a plain background with room around it (the margin a hand-held aim leaves). */
export function scene(symbol: TestSymbol, text: string): LumaFrame {
  const img = drawSymbol(symbol, text, symbol === 'code128' ? 2 : 4);
  const side = Math.ceil(Math.max(img.width, img.height) * 1.5);
  return symbol === 'code128'
    ? onBackground(img, img.width + 120, Math.ceil(img.height * 2.2))
    : onBackground(img, side, side);
}

export const CONDITIONS: readonly Condition[] = [
  { name: 'clean', apply: (img) => img },
  { name: 'rotation 10°', apply: (img) => rotate(img, 10) },
  { name: 'rotation 30°', apply: (img) => rotate(img, 30) },
  { name: 'blur (box r=1 ×3)', apply: (img) => blur(img, 1) },
  { name: 'noise σ=25', apply: (img, seed) => noise(img, 25, seed) },
  { name: 'low contrast 100–160', apply: (img) => lowContrast(img, 100, 160) },
  { name: 'partial glare', apply: (img, seed) => glare(img, 0.3 + seeded(seed)() * 0.4, 0.25, 0.12) },
  { name: 'uneven light 100→35 %', apply: (img) => unevenLight(img, 0.35) },
  { name: 'perspective 25 %', apply: (img) => perspective(img, 0.25) },
  { name: '50 % scale', apply: (img) => halfScale(img) },
  { name: 'light on dark', apply: (img) => invert(img) },
];

export interface RateRow {
  readonly symbol: TestSymbol;
  readonly condition: string;
  readonly read: number;
  readonly total: number;
  readonly misreads: number;
}

/**
 * How the image is read: 'thorough' as a photo is (both polarities, TRY_HARDER); 'camera' as two successive
 * camera frames are (one quick pass each, dark-on-light then light-on-dark).
 */
export type ReadMode = 'thorough' | 'camera';

const readAs = (img: LumaFrame, mode: ReadMode) =>
  mode === 'thorough'
    ? decode(img)
    : (decode(img, { tryHarder: false, polarity: 'normal' }) ??
      decode(img, { tryHarder: false, polarity: 'inverted' }));

/** Decodes every payload under every condition; a read counts only when the text comes back exactly. */
export function measureRates(
  symbol: TestSymbol,
  payloads: readonly string[],
  mode: ReadMode = 'thorough',
): RateRow[] {
  const scenes = payloads.map((p) => scene(symbol, p));
  return CONDITIONS.map((condition) => {
    let read = 0;
    let misreads = 0;
    payloads.forEach((payload, i) => {
      const found = readAs(condition.apply(scenes[i] as LumaFrame, 1000 + i), mode);
      if (found?.text === payload) read++;
      else if (found) misreads++;
    });
    return { symbol, condition: condition.name, read, total: payloads.length, misreads };
  });
}

export const pct = (row: RateRow): number => (100 * row.read) / row.total;

export function rateTable(rows: readonly RateRow[]): string {
  const lines = ['| symbol | condition | read | rate | misreads |', '| --- | --- | --- | --- | --- |'];
  for (const r of rows) {
    lines.push(
      `| ${r.symbol} | ${r.condition} | ${r.read}/${r.total} | ${pct(r).toFixed(0)} % | ${r.misreads} |`,
    );
  }
  return lines.join('\n');
}
