// A JWS payload member with the bytes it decodes to. Decoding is the only way to make one, so the bytes are always
// what the text says; and whether encoding those bytes writes the very same text is settled here, from the text's
// length, last character and two characters it must not hold, without encoding a few hundred kilobytes back.
import { isAscii } from 'node:buffer';

const ALPHABET = 'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_';

export class PayloadBytes {
  #ascii: string | null | undefined;

  private constructor(
    readonly text: string,
    readonly bytes: Buffer,
    /** Whether bytes.toString('base64url') === text, so the text can be kept as its bytes and written back. */
    readonly encodesBack: boolean,
  ) {}

  /**
   * The bytes as a string when every one is ASCII (then it is also their UTF-8 text, and each character's index is
   * its byte's offset); null otherwise. Decoded once.
   */
  ascii(): string | null {
    if (this.#ascii === undefined) this.#ascii = isAscii(this.bytes) ? this.bytes.toString('latin1') : null;
    return this.#ascii;
  }

  static decode(text: string): PayloadBytes {
    const bytes = Buffer.from(text, 'base64url');
    return new PayloadBytes(text, bytes, encodesBack(text, bytes.length));
  }
}

/**
 * Node decodes base64url leniently: it also reads "+" and "/", skips characters outside the alphabet, stops at "=",
 * ignores a lone last character and drops the unused low bits of the last one. So the text is exactly what encoding
 * its bytes writes when it holds no "+" or "/", every character counted (the bytes are as many as the text's length
 * says), and the last character's unused bits are zero. test/server/payload-bytes.test.ts checks this against
 * encoding; it saves a scan of the text with a pattern.
 */
function encodesBack(text: string, byteLength: number): boolean {
  const rest = text.length % 4;
  if (rest === 1 || byteLength !== Math.floor((text.length * 3) / 4)) return false;
  if (rest !== 0) {
    const last = ALPHABET.indexOf(text.charAt(text.length - 1));
    // Of the last character's six bits, a 2-character tail uses 2 and a 3-character tail uses 4.
    if (last < 0 || (last & (rest === 2 ? 0b1111 : 0b11)) !== 0) return false;
  }
  return !text.includes('+') && !text.includes('/');
}
