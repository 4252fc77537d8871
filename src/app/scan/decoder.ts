// Reading a tag from an image, off the main thread: the browser's own barcode detector where it has one, and the
// zxing worker otherwise (or when the detector finds nothing). The worker starts on the first image, so its code
// is neither downloaded nor parsed before the user scans.
import { transfer, wrap, type Remote } from 'comlink';
import type { DecodedTag, DecodeOptions, TagDecodeApi, TagSymbol } from '../../../workers/tag-decode-api.js';

export type { DecodedTag, TagSymbol };

let worker: Remote<TagDecodeApi<ImageBitmap>> | null = null;

function decoderWorker(): Remote<TagDecodeApi<ImageBitmap>> {
  worker ??= wrap<TagDecodeApi<ImageBitmap>>(
    new Worker(new URL('../../../workers/tag-decode.worker.ts', import.meta.url), { type: 'module' }),
  );
  return worker;
}

interface DetectedBarcode {
  readonly rawValue: string;
  readonly format: string;
}
interface BarcodeDetectorLike {
  detect(image: ImageBitmapSource): Promise<DetectedBarcode[]>;
}
interface BarcodeDetectorClass {
  new (options: { formats: string[] }): BarcodeDetectorLike;
  getSupportedFormats(): Promise<string[]>;
}

const NATIVE_FORMATS: Record<string, TagSymbol> = {
  qr_code: 'qr',
  data_matrix: 'dataMatrix',
  code_128: 'code128',
  code_39: 'code39',
};

let native: Promise<BarcodeDetectorLike | null> | null = null;

/** The browser's detector for our symbols, or null where there is none (desktop Chromium on Linux, Firefox). */
function nativeDetector(): Promise<BarcodeDetectorLike | null> {
  native ??= (async () => {
    const Detector = (globalThis as { BarcodeDetector?: BarcodeDetectorClass }).BarcodeDetector;
    if (!Detector) return null;
    try {
      const formats = (await Detector.getSupportedFormats()).filter((f) => f in NATIVE_FORMATS);
      return formats.length ? new Detector({ formats }) : null;
    } catch {
      return null;
    }
  })();
  return native;
}

/**
 * Reads a tag from the bitmap, which is handed over (transferred or closed) in every case. `maxSide` scales a
 * large photo down before zxing reads it.
 */
export async function decodeBitmap(
  bitmap: ImageBitmap,
  maxSide?: number,
  options?: DecodeOptions,
): Promise<DecodedTag | null> {
  const detector = await nativeDetector();
  if (detector) {
    try {
      const [found] = await detector.detect(bitmap);
      const symbol = found ? NATIVE_FORMATS[found.format] : undefined;
      if (found && symbol) {
        bitmap.close();
        return { text: found.rawValue, symbol, inverted: false };
      }
    } catch {
      // The native detector failed on this image: zxing reads it instead.
    }
  }
  return decoderWorker().decodeImage(transfer(bitmap, [bitmap]), maxSide, options);
}

/** Whether the zxing worker has been started (for diagnostics and tests). */
export const decoderStarted = (): boolean => worker !== null;
