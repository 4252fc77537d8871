// One-off icon generator: writes public/icon.svg and rasterises the same shapes to
// public/icon-192.png and public/icon-512.png. Node built-ins only (zlib for PNG).
// Run: node scripts/make-icons.mjs
import { writeFileSync } from 'node:fs';
import { Buffer } from 'node:buffer';
import process from 'node:process';
import { URL } from 'node:url';
import { deflateSync } from 'node:zlib';

// Cross-section of a single-V butt weld on a 512 x 512 grid. Everything but the
// background stays inside the central 80 % circle so the PNGs also work as maskable icons.
const BG = '#1d2b36';
const PLATE = '#c5d0d8';
const BEAD = '#ffb81c';
const TOP = 243;
const BOTTOM = 307;
const leftPlate = [
  [88, TOP],
  [228, TOP],
  [251, BOTTOM],
  [88, BOTTOM],
];
const rightPlate = leftPlate.map(([x, y]) => [512 - x, y]).reverse();
const groove = [leftPlate[1], rightPlate[2], rightPlate[1], leftPlate[2]];
const cap = { cx: 256, cy: TOP, rx: 100, ry: 48, up: true };
const root = { cx: 256, cy: BOTTOM, rx: 22, ry: 14, up: false };

const pts = (poly) => poly.map(([x, y]) => `${x},${y}`).join(' ');
const halfEllipsePath = (e) =>
  `M${e.cx - e.rx} ${e.cy}A${e.rx} ${e.ry} 0 0 ${e.up ? 1 : 0} ${e.cx + e.rx} ${e.cy}Z`;

const svg = `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 512 512" role="img" aria-label="Beadbook">
  <rect width="512" height="512" fill="${BG}"/>
  <g fill="${PLATE}">
    <polygon points="${pts(leftPlate)}"/>
    <polygon points="${pts(rightPlate)}"/>
  </g>
  <g fill="${BEAD}">
    <polygon points="${pts(groove)}"/>
    <path d="${halfEllipsePath(cap)}"/>
    <path d="${halfEllipsePath(root)}"/>
  </g>
</svg>
`;

function inPolygon(poly, x, y) {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i];
    const [xj, yj] = poly[j];
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

const inHalfEllipse = (e, x, y) =>
  (e.up ? y <= e.cy : y >= e.cy) && ((x - e.cx) / e.rx) ** 2 + ((y - e.cy) / e.ry) ** 2 <= 1;

/** Colour of the topmost shape at a point in 512-space (same paint order as the SVG). */
function colourAt(x, y) {
  if (inPolygon(groove, x, y) || inHalfEllipse(cap, x, y) || inHalfEllipse(root, x, y)) return BEAD;
  if (inPolygon(leftPlate, x, y) || inPolygon(rightPlate, x, y)) return PLATE;
  return BG;
}

const rgb = (hex) => [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16));

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(buf) {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type, data) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}

/** Render at `size` px with 4 x 4 supersampling, as an 8-bit RGB PNG. */
function png(size) {
  const SS = 4;
  const scale = 512 / size;
  const raw = Buffer.alloc(size * (size * 3 + 1));
  let o = 0;
  for (let py = 0; py < size; py++) {
    raw[o++] = 0; // filter: none
    for (let px = 0; px < size; px++) {
      const acc = [0, 0, 0];
      for (let sy = 0; sy < SS; sy++) {
        for (let sx = 0; sx < SS; sx++) {
          const c = rgb(colourAt((px + (sx + 0.5) / SS) * scale, (py + (sy + 0.5) / SS) * scale));
          for (let i = 0; i < 3; i++) acc[i] += c[i];
        }
      }
      for (let i = 0; i < 3; i++) raw[o++] = Math.round(acc[i] / (SS * SS));
    }
  }
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 2; // colour type: RGB
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

const out = new URL('../public/', import.meta.url);
writeFileSync(new URL('icon.svg', out), svg);
for (const size of [192, 512]) writeFileSync(new URL(`icon-${size}.png`, out), png(size));
process.stdout.write('wrote public/icon.svg, public/icon-192.png, public/icon-512.png\n');
