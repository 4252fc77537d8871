// What the tag decoder worker offers the page. Images travel as transferable bitmaps (the page never reads pixels);
// `Image` is ImageBitmap in the browser, left open here because this file is shared by every context.
import type { DecodedTag, DecodeOptions } from './tag-decode-core.js';

export type { DecodedTag, DecodeOptions, TagSymbol } from './tag-decode-core.js';

export interface TagDecodeApi<Image> {
  /**
   * Reads a tag from a camera frame (already cropped to the aim box) or a photo, or null when none is found.
   * Photos larger than `maxSide` pixels on their longer side are scaled down first (and tried smaller again),
   * since a phone photo is far larger than a tag needs. `options` trade thoroughness for time (camera frames).
   */
  decodeImage(image: Image, maxSide?: number, options?: DecodeOptions): DecodedTag | null;
}
