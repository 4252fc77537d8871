// The few platform functions the protocol needs, present in browsers, workers and Node alike (WebCrypto, UTF-8
// codecs). They are typed here, narrowly, because this module compiles with the ES2022 library only: no DOM and
// no Node types, so nothing else of either platform can creep in.

interface Utf8Encoder {
  encode(text: string): Uint8Array;
}
interface Utf8Decoder {
  decode(bytes: Uint8Array): string;
}
interface SubtleDigest {
  digest(algorithm: 'SHA-256', data: Uint8Array): Promise<ArrayBuffer>;
}
interface Platform {
  readonly TextEncoder: new () => Utf8Encoder;
  readonly TextDecoder: new (label: 'utf-8', options: { readonly fatal: boolean }) => Utf8Decoder;
  readonly crypto: {
    getRandomValues<T extends Uint8Array>(array: T): T;
    randomUUID(): string;
    readonly subtle: SubtleDigest;
  };
}

const platform = globalThis as unknown as Platform;
const encoder = new platform.TextEncoder();
// Fatal: bytes that are not UTF-8 are an error, never silently replaced (a signed payload is taken as sent or not at all).
const decoder = new platform.TextDecoder('utf-8', { fatal: true });

export const utf8Encode = (text: string): Uint8Array => encoder.encode(text);

/** Throws a TypeError on bytes that are not well-formed UTF-8. */
export const utf8Decode = (bytes: Uint8Array): string => decoder.decode(bytes);

export function randomBytes(length: number): Uint8Array {
  return platform.crypto.getRandomValues(new Uint8Array(length));
}

export const randomUuid = (): string => platform.crypto.randomUUID();

export async function sha256Hex(bytes: Uint8Array): Promise<string> {
  const digest = new Uint8Array(await platform.crypto.subtle.digest('SHA-256', bytes));
  let hex = '';
  for (const b of digest) hex += b.toString(16).padStart(2, '0');
  return hex;
}
