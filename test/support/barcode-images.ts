// Test images of tags: symbols made by bwip-js (a different library from the reader under test), drawn as grey
// images with the quiet zones their standards ask for: QR 4 modules (ISO/IEC 18004), Data Matrix 1 module
// (ISO/IEC 16022; we draw 2, common practice for reliable reading), 1D 10 modules (ISO/IEC 15417).
import bwipjs from 'bwip-js/node';
import type { LumaFrame } from '../../workers/tag-decode-core.js';

export type TestSymbol = 'qr' | 'dataMatrix' | 'code128' | 'code39';

export const QUIET_ZONE_MODULES: Record<TestSymbol, number> = {
  qr: 4,
  dataMatrix: 2,
  code128: 10,
  code39: 10,
};

const BCID: Record<TestSymbol, string> = {
  qr: 'qrcode',
  dataMatrix: 'datamatrix',
  code128: 'code128',
  code39: 'code39',
};

type Raw2D = { pixs: number[]; pixx: number; pixy: number };
type Raw1D = { sbs: number[] };

/** The symbol as modules: true is dark. 1D symbols are one row of modules. */
export function symbolModules(symbol: TestSymbol, text: string): { rows: boolean[][]; oneD: boolean } {
  const [raw] = bwipjs.raw(BCID[symbol], text, symbol === 'qr' ? 'eclevel=M' : '') as (Raw2D | Raw1D)[];
  if (!raw) throw new Error(`bwip-js made no ${symbol}`);
  if ('sbs' in raw) {
    const row: boolean[] = [];
    raw.sbs.forEach((width, i) => {
      for (let k = 0; k < Math.round(width); k++) row.push(i % 2 === 0);
    });
    return { rows: [row], oneD: true };
  }
  const rows = Array.from({ length: raw.pixy }, (_, y) =>
    Array.from({ length: raw.pixx }, (_, x) => raw.pixs[y * raw.pixx + x] === 1),
  );
  return { rows, oneD: false };
}

/**
 * The symbol drawn dark on white with its quiet zone, `module` pixels per module; a 1D symbol is drawn as tall
 * as 40 % of its width (a common label proportion).
 */
export function drawSymbol(symbol: TestSymbol, text: string, module: number): LumaFrame {
  const { rows, oneD } = symbolModules(symbol, text);
  const quiet = QUIET_ZONE_MODULES[symbol];
  const cols = (rows[0]?.length ?? 0) + 2 * quiet;
  const width = cols * module;
  const barRows = oneD ? Math.round(cols * 0.4) : rows.length;
  const height = (oneD ? barRows : rows.length + 2 * quiet) * module;
  const data = new Uint8ClampedArray(width * height).fill(255);
  for (let y = 0; y < height; y++) {
    const my = oneD ? 0 : Math.floor(y / module) - quiet;
    const row = rows[my];
    if (!row) continue;
    for (let x = 0; x < width; x++) {
      const mx = Math.floor(x / module) - quiet;
      if (row[mx]) data[y * width + x] = 0;
    }
  }
  return { data, width, height };
}

/** The image centred on a plain background of the given grey. */
export function onBackground(image: LumaFrame, width: number, height: number, grey = 190): LumaFrame {
  const data = new Uint8ClampedArray(width * height).fill(grey);
  const left = Math.floor((width - image.width) / 2);
  const top = Math.floor((height - image.height) / 2);
  for (let y = 0; y < image.height; y++) {
    const ty = top + y;
    if (ty < 0 || ty >= height) continue;
    for (let x = 0; x < image.width; x++) {
      const tx = left + x;
      if (tx >= 0 && tx < width) data[ty * width + tx] = image.data[y * image.width + x] as number;
    }
  }
  return { data, width, height };
}
