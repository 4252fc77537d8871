// A Y4M (YUV4MPEG2) video for Chromium's fake camera: a text header, then per frame "FRAME\n" and the raw I420
// planes (full-size Y, quarter-size U and V). A grey picture needs only Y; U and V stay at the neutral 128.
import { writeFile } from 'node:fs/promises';
import type { LumaFrame } from '../../workers/tag-decode-core.js';

/** Writes `frames` copies of a grey picture (even width and height) at `fps` frames a second. */
export async function writeY4m(path: string, picture: LumaFrame, frames = 5, fps = 10): Promise<void> {
  const { width, height } = picture;
  if (width % 2 || height % 2) throw new Error('I420 needs an even width and height');
  const header = Buffer.from(`YUV4MPEG2 W${width} H${height} F${fps}:1 Ip A1:1 C420jpeg\n`, 'ascii');
  const frameHeader = Buffer.from('FRAME\n', 'ascii');
  const chroma = Buffer.alloc((width / 2) * (height / 2) * 2, 128);
  const luma = Buffer.from(picture.data.buffer, picture.data.byteOffset, width * height);
  const parts: Buffer[] = [header];
  for (let i = 0; i < frames; i++) parts.push(frameHeader, luma, chroma);
  await writeFile(path, Buffer.concat(parts));
}
