// A grey picture as a BMP file (BITMAPINFOHEADER, 24 bits a pixel, rows bottom-up and padded to 4 bytes): the
// simplest image file a browser decodes, for "a photo of the tag" in browser tests.
import type { LumaFrame } from '../../workers/tag-decode-core.js';

export function bmpOf(picture: LumaFrame): Buffer {
  const { width, height } = picture;
  const rowBytes = Math.ceil((width * 3) / 4) * 4;
  const size = 54 + rowBytes * height;
  const out = Buffer.alloc(size);
  out.write('BM', 0, 'ascii');
  out.writeUInt32LE(size, 2);
  out.writeUInt32LE(54, 10);
  out.writeUInt32LE(40, 14);
  out.writeInt32LE(width, 18);
  out.writeInt32LE(height, 22);
  out.writeUInt16LE(1, 26);
  out.writeUInt16LE(24, 28);
  out.writeUInt32LE(rowBytes * height, 34);
  for (let y = 0; y < height; y++) {
    const row = 54 + (height - 1 - y) * rowBytes;
    for (let x = 0; x < width; x++) {
      const g = picture.data[y * width + x] as number;
      out[row + x * 3] = g;
      out[row + x * 3 + 1] = g;
      out[row + x * 3 + 2] = g;
    }
  }
  return out;
}
