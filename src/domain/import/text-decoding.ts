// Bytes become text here, at the boundary: the encoding is told by a byte-order mark or by the pattern of zero
// bytes (UTF-16 without a mark), UTF-8 is decoded strictly, and a file that is not UTF-8 falls back to
// Windows-1252 (what spreadsheet programs on Windows write). Binary files are refused before any parsing.

export type TextEncodingName = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

interface Decoder {
  decode(bytes?: Uint8Array, options?: { readonly stream: boolean }): string;
}
type DecoderClass = new (
  label: TextEncodingName,
  options: { readonly fatal: boolean; readonly ignoreBOM?: boolean },
) => Decoder;
const TextDecoderClass = (globalThis as unknown as { readonly TextDecoder: DecoderClass }).TextDecoder;

/** Which encoding the file's first bytes show. */
export function detectEncoding(head: Uint8Array): { encoding: TextEncodingName; bom: boolean } {
  const [a, b, c] = [head[0], head[1], head[2]];
  if (a === 0xef && b === 0xbb && c === 0xbf) return { encoding: 'utf-8', bom: true };
  if (a === 0xff && b === 0xfe) return { encoding: 'utf-16le', bom: true };
  if (a === 0xfe && b === 0xff) return { encoding: 'utf-16be', bom: true };
  // Without a mark, UTF-16 text of ASCII characters has a zero byte in every other place.
  const n = Math.min(head.length, 4096) & ~1;
  let evenZeros = 0;
  let oddZeros = 0;
  for (let i = 0; i < n; i += 2) {
    if (head[i] === 0) evenZeros++;
    if (head[i + 1] === 0) oddZeros++;
  }
  const pairs = n / 2;
  if (pairs >= 2 && oddZeros > pairs * 0.4 && evenZeros < pairs * 0.05)
    return { encoding: 'utf-16le', bom: false };
  if (pairs >= 2 && evenZeros > pairs * 0.4 && oddZeros < pairs * 0.05)
    return { encoding: 'utf-16be', bom: false };
  return { encoding: 'utf-8', bom: false };
}

/**
 * Where the text shows it is not text: a NUL or another control character that no table holds. Returns the
 * offending character's index in the decoded sample, or -1.
 */
export function binaryAt(text: string): number {
  let controls = 0;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0) return i;
    if ((c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12) || c === 0xfffd) {
      controls++;
      // A stray control character may be noise in a text file; many of them are not.
      if (controls > 8 && controls * 50 > i) return i;
    }
  }
  return -1;
}

/** A streaming decoder that picks its encoding from the first bytes it sees. */
export class ByteDecoder {
  private decoder: Decoder | null = null;
  /**
   * UTF-8 is first decoded with a strict decoder: on well-formed text it gives the same characters as the lenient
   * one and runs several times faster. At the first malformed chunk the lenient decoder takes over from the bytes
   * the strict one still held, so a bad byte still becomes U+FFFD exactly as before.
   */
  private strict = false;
  private held: Uint8Array = new Uint8Array(0);
  /** Bytes the strict decoder has turned into text (or a dropped mark), the held ones not counted. */
  private consumed = 0;
  encoding: TextEncodingName = 'utf-8';
  bom = false;

  /** Decodes the next chunk; the first chunk decides the encoding, so it should hold a few kilobytes. */
  push(bytes: Uint8Array): string {
    if (!this.decoder) {
      const found = detectEncoding(bytes);
      this.bom = found.bom;
      this.encoding = found.encoding;
      if (found.encoding === 'utf-8' && !isUtf8(bytes)) this.encoding = 'windows-1252';
      this.strict = this.encoding === 'utf-8';
      // The mark itself is dropped by the decoder (ignoreBOM is false by default).
      this.decoder = new TextDecoderClass(this.encoding, { fatal: this.strict });
    }
    if (!this.strict) return this.decoder.decode(bytes, { stream: true });
    try {
      const text = this.decoder.decode(bytes, { stream: true });
      const before = this.held.length;
      this.hold(bytes);
      this.consumed += before + bytes.length - this.held.length;
      return text;
    } catch {
      return this.lenient().decode(this.withHeld(bytes), { stream: true });
    }
  }

  end(): string {
    if (!this.decoder) return '';
    if (!this.strict) return this.decoder.decode();
    try {
      return this.decoder.decode();
    } catch {
      return this.lenient().decode(this.withHeld(new Uint8Array(0)));
    }
  }

  /** Switches to the lenient decoder for the rest of the file. */
  private lenient(): Decoder {
    this.strict = false;
    // Past the file's first bytes a mark is a character of the text, not one to drop.
    this.decoder = new TextDecoderClass('utf-8', { fatal: false, ignoreBOM: this.consumed > 0 });
    return this.decoder;
  }

  /** Keeps the unfinished sequence at the end of well-formed text: the strict decoder holds the same bytes. */
  private hold(bytes: Uint8Array): void {
    // Only the last three bytes can start an unfinished sequence.
    const tail = bytes.length >= 3 ? bytes.subarray(bytes.length - 3) : this.withHeld(bytes).slice(-3);
    let start = tail.length;
    for (let k = 1; k <= tail.length; k++) {
      const c = tail[tail.length - k] as number;
      if (c < 0x80) break;
      if (c >= 0xc0) {
        const len = c >= 0xf0 ? 4 : c >= 0xe0 ? 3 : 2;
        if (len > k) start = tail.length - k;
        break;
      }
    }
    this.held = tail.slice(start);
  }

  private withHeld(bytes: Uint8Array): Uint8Array {
    if (this.held.length === 0) return bytes;
    const all = new Uint8Array(this.held.length + bytes.length);
    all.set(this.held);
    all.set(bytes, this.held.length);
    return all;
  }
}

/** Whether the bytes are well-formed UTF-8 (a sequence cut at the end of the sample counts as well-formed). */
function isUtf8(bytes: Uint8Array): boolean {
  let i = 0;
  const n = bytes.length;
  while (i < n) {
    const c = bytes[i] as number;
    if (c < 0x80) {
      i++;
      continue;
    }
    const len = c >= 0xf0 && c <= 0xf4 ? 4 : c >= 0xe0 ? 3 : c >= 0xc2 && c < 0xe0 ? 2 : 0;
    if (len === 0 || c > 0xf4) return false;
    for (let k = 1; k < len; k++) {
      if (i + k >= n) return true;
      if (((bytes[i + k] as number) & 0xc0) !== 0x80) return false;
    }
    i += len;
  }
  return true;
}
