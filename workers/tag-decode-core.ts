// Reading a tag from one image's luminance with zxing, only the readers the yard uses: QR, Data Matrix, Code 128
// and Code 39. The zxing classes come in as a kit so the worker (tree-shaken ES modules) and Node (the package's
// CommonJS entry, for tests and the bench) run this same code.

/** One grey image: a byte of luminance per pixel, row by row. */
export interface LumaFrame {
  readonly data: Uint8ClampedArray;
  readonly width: number;
  readonly height: number;
}

export type TagSymbol = 'qr' | 'dataMatrix' | 'code128' | 'code39';

export interface DecodedTag {
  readonly text: string;
  readonly symbol: TagSymbol;
  /** The image was read inverted (light code on a dark ground). */
  readonly inverted: boolean;
}

interface ZxResult {
  getText(): string;
  getBarcodeFormat(): number;
}
interface ZxReader {
  decode(image: unknown, hints?: Map<number, unknown>): ZxResult;
  reset(): void;
}
type Ctor<T> = new (...args: never[]) => T;

/** The zxing classes and constants this module uses (structural, so both builds of zxing fit). */
export interface ZxingKit {
  readonly RGBLuminanceSource: new (data: Uint8ClampedArray, width: number, height: number) => object;
  readonly HybridBinarizer: new (source: never) => unknown;
  readonly BinaryBitmap: new (binarizer: never) => unknown;
  readonly QRCodeReader: Ctor<ZxReader>;
  readonly DataMatrixReader: Ctor<ZxReader>;
  readonly Code128Reader: Ctor<ZxReader>;
  readonly Code39Reader: Ctor<ZxReader>;
  readonly DecodeHintType: {
    readonly TRY_HARDER: number;
    readonly CHARACTER_SET: number;
    readonly POSSIBLE_FORMATS: number;
  };
  readonly BarcodeFormat: {
    readonly QR_CODE: number;
    readonly DATA_MATRIX: number;
    readonly CODE_128: number;
    readonly CODE_39: number;
  };
}

export interface DecodeOptions {
  /**
   * Which way round to read: dark on light, light on dark (inverted), or both (the default). A camera spreads
   * the two over alternate frames, so no single frame pays for both.
   */
  readonly polarity?: 'normal' | 'inverted' | 'both';
  /** zxing's TRY_HARDER: every row and finder candidate, slower on frames with no tag. Default true. */
  readonly tryHarder?: boolean;
}

export type TagDecoder = (frame: LumaFrame, options?: DecodeOptions) => DecodedTag | null;

export function createTagDecoder(kit: ZxingKit): TagDecoder {
  // Byte-mode QR without an ECI is read as UTF-8 (what our sheets and phones write), not ISO-8859-1.
  const quick = new Map<number, unknown>([[kit.DecodeHintType.CHARACTER_SET, 'UTF-8']]);
  const harder = new Map<number, unknown>([...quick, [kit.DecodeHintType.TRY_HARDER, true]]);
  const symbols = new Map<number, TagSymbol>([
    [kit.BarcodeFormat.QR_CODE, 'qr'],
    [kit.BarcodeFormat.DATA_MATRIX, 'dataMatrix'],
    [kit.BarcodeFormat.CODE_128, 'code128'],
    [kit.BarcodeFormat.CODE_39, 'code39'],
  ]);
  // 2D first: they are what our sheets print; the 1D readers scan rows and cost more when nothing is there.
  const readers = [
    new kit.QRCodeReader(),
    new kit.DataMatrixReader(),
    new kit.Code128Reader(),
    new kit.Code39Reader(),
  ];

  const attempt = (source: unknown, inverted: boolean, hints: Map<number, unknown>): DecodedTag | null => {
    const bitmap = new kit.BinaryBitmap(new kit.HybridBinarizer(source as never) as never);
    for (const reader of readers) {
      try {
        const result = reader.decode(bitmap, hints);
        const symbol = symbols.get(result.getBarcodeFormat());
        if (symbol) return { text: utf8Repaired(result.getText()), symbol, inverted };
      } catch {
        // NotFound, Checksum or Format: this reader found nothing it could read; try the next.
      } finally {
        reader.reset();
      }
    }
    return null;
  };

  // zxing's own inverted source recomputes every row it is asked for; one inverted copy is several times faster.
  const inverted = (frame: LumaFrame) => {
    const data = new Uint8ClampedArray(frame.width * frame.height);
    for (let i = 0; i < data.length; i++) data[i] = 255 - (frame.data[i] as number);
    return new kit.RGBLuminanceSource(data, frame.width, frame.height);
  };

  return (frame, options = {}) => {
    if (frame.data.length < frame.width * frame.height)
      throw new Error('frame data is shorter than its size');
    const once = (image: LumaFrame) => {
      const source = new kit.RGBLuminanceSource(image.data, image.width, image.height);
      return (
        (polarity !== 'inverted' ? attempt(source, false, hints) : null) ??
        (polarity !== 'normal' ? attempt(inverted(image), true, hints) : null)
      );
    };
    const hints = options.tryHarder === false ? quick : harder;
    const polarity = options.polarity ?? 'both';
    // A small image whose modules are about two pixels, blurred across pixel edges, reads after a 2× upscale;
    // only when trying harder (photos), since a camera frame is large and comes again a moment later.
    const small = Math.max(frame.width, frame.height) <= MAX_UPSCALED_SIDE;
    return once(frame) ?? (small && options.tryHarder !== false ? once(upscaled2x(frame)) : null);
  };
}

const MAX_UPSCALED_SIDE = 640;

/** The image at twice the size, bilinear (pixel centres kept in place). */
export function upscaled2x(img: LumaFrame): LumaFrame {
  const width = img.width * 2;
  const height = img.height * 2;
  const data = new Uint8ClampedArray(width * height);
  const at = (x: number, y: number) => img.data[y * img.width + x] as number;
  for (let y = 0; y < height; y++) {
    const sy = Math.min(img.height - 1, Math.max(0, (y - 0.5) / 2));
    const y0 = Math.floor(sy);
    const y1 = Math.min(img.height - 1, y0 + 1);
    const fy = sy - y0;
    for (let x = 0; x < width; x++) {
      const sx = Math.min(img.width - 1, Math.max(0, (x - 0.5) / 2));
      const x0 = Math.floor(sx);
      const x1 = Math.min(img.width - 1, x0 + 1);
      const fx = sx - x0;
      data[y * width + x] =
        (at(x0, y0) * (1 - fx) + at(x1, y0) * fx) * (1 - fy) + (at(x0, y1) * (1 - fx) + at(x1, y1) * fx) * fy;
    }
  }
  return { data, width, height };
}

/**
 * zxing gives Data Matrix bytes (and QR bytes with another ECI) as ISO-8859-1 characters. When every character
 * is a byte and the bytes form valid UTF-8 with at least one multi-byte sequence, the text was UTF-8 (RFC 3629):
 * decode it; otherwise keep the text as it came.
 */
export function utf8Repaired(text: string): string {
  let multiByte = false;
  const bytes: number[] = [];
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c > 0xff) return text;
    if (c >= 0x80) multiByte = true;
    bytes.push(c);
  }
  if (!multiByte) return text;
  return decodeUtf8(bytes) ?? text;
}

/** Strict UTF-8 (RFC 3629): null on any malformed, overlong or surrogate sequence. */
function decodeUtf8(bytes: readonly number[]): string | null {
  let out = '';
  for (let i = 0; i < bytes.length;) {
    const b = bytes[i] as number;
    const [length, min] =
      b < 0x80
        ? [1, 0]
        : b >= 0xc2 && b <= 0xdf
          ? [2, 0x80]
          : b >= 0xe0 && b <= 0xef
            ? [3, 0x800]
            : b >= 0xf0 && b <= 0xf4
              ? [4, 0x10000]
              : [0, 0];
    if (length === 0 || i + length > bytes.length) return null;
    let cp = length === 1 ? b : b & (0xff >> (length + 1));
    for (let k = 1; k < length; k++) {
      const next = bytes[i + k] as number;
      if ((next & 0xc0) !== 0x80) return null;
      cp = (cp << 6) | (next & 0x3f);
    }
    if (cp < min || cp > 0x10ffff || (cp >= 0xd800 && cp <= 0xdfff)) return null;
    out += String.fromCodePoint(cp);
    i += length;
  }
  return out;
}

/** Luminance from RGBA bytes (ITU-R BT.601 weights in integers, as common practice for barcode reading). */
export function lumaFromRgba(rgba: Uint8ClampedArray, width: number, height: number): LumaFrame {
  const data = new Uint8ClampedArray(width * height);
  for (let p = 0, q = 0; p < data.length; p++, q += 4) {
    data[p] = ((rgba[q] as number) * 77 + (rgba[q + 1] as number) * 150 + (rgba[q + 2] as number) * 29) >> 8;
  }
  return { data, width, height };
}
