// Bytes become text here, at the boundary: the encoding is told by a byte-order mark or by the pattern of zero
// bytes (UTF-16 without a mark), UTF-8 is decoded strictly, and a file that is not UTF-8 falls back to
// Windows-1252 (what spreadsheet programs on Windows write). Binary files are refused before any parsing.

export type TextEncodingName = 'utf-8' | 'utf-16le' | 'utf-16be' | 'windows-1252';

interface Decoder {
  decode(bytes?: Uint8Array, options?: { readonly stream: boolean }): string;
}
type DecoderClass = new (label: TextEncodingName, options: { readonly fatal: boolean }) => Decoder;
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
  return binaryAtAll([text]);
}

/** binaryAt of the texts joined, without joining them; the index is into the joined text. */
export function binaryAtAll(texts: readonly string[]): number {
  let controls = 0;
  let base = 0;
  for (const text of texts) {
    for (let k = 0; k < text.length; k++) {
      const c = text.charCodeAt(k);
      const i = base + k;
      if (c === 0) return i;
      if ((c < 32 && c !== 9 && c !== 10 && c !== 13 && c !== 12) || c === 0xfffd) {
        controls++;
        // A stray control character may be noise in a text file; many of them are not.
        if (controls > 8 && controls * 50 > i) return i;
      }
    }
    base += text.length;
  }
  return -1;
}

/** A streaming decoder that picks its encoding from the first bytes it sees. */
export class ByteDecoder {
  private decoder: Decoder | null = null;
  encoding: TextEncodingName = 'utf-8';
  bom = false;

  /**
   * Decodes the next chunk; the first chunk decides the encoding, so it should hold a few kilobytes. `head`, when
   * given with the first chunk, is what decides instead: the file's first bytes, of which the chunk is the start.
   */
  push(bytes: Uint8Array, head: Uint8Array = bytes): string {
    if (!this.decoder) {
      const found = detectEncoding(head);
      this.bom = found.bom;
      this.encoding = found.encoding;
      if (found.encoding === 'utf-8' && !isUtf8(head)) this.encoding = 'windows-1252';
      // The mark itself is dropped by the decoder (ignoreBOM is false by default).
      this.decoder = new TextDecoderClass(this.encoding, { fatal: false });
    }
    return this.decoder.decode(bytes, { stream: true });
  }

  end(): string {
    return this.decoder ? this.decoder.decode() : '';
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
