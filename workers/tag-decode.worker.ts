// The tag decoder: started by the page on the first scan, so zxing is neither downloaded nor parsed before then.
import { expose } from 'comlink';
import { zxingKit } from './zxing-kit.js';
import { createTagDecoder, lumaFromRgba, type DecodedTag } from './tag-decode-core.js';
import type { TagDecodeApi } from './tag-decode-api.js';

const decode = createTagDecoder(zxingKit);

function luma(image: ImageBitmap, scale: number) {
  const width = Math.max(1, Math.round(image.width * scale));
  const height = Math.max(1, Math.round(image.height * scale));
  const ctx = new OffscreenCanvas(width, height).getContext('2d', { willReadFrequently: true });
  if (!ctx) throw new Error('this browser gives workers no 2D canvas');
  ctx.drawImage(image, 0, 0, width, height);
  return lumaFromRgba(ctx.getImageData(0, 0, width, height).data, width, height);
}

const api: TagDecodeApi<ImageBitmap> = {
  decodeImage(image, maxSide = 4096, options = {}): DecodedTag | null {
    try {
      const first = Math.min(1, maxSide / Math.max(image.width, image.height));
      // A photo whose tag fills much of the frame reads better smaller still.
      const scales = first < 1 ? [first, first / 2] : [1];
      for (const scale of scales) {
        const found = decode(luma(image, scale), options);
        if (found) return found;
      }
      return null;
    } finally {
      image.close();
    }
  },
};

expose(api);
