// Request bodies: the content type must be one the route takes (415 otherwise), the body must fit the route's
// cap (413, checked against Content-Length first and then while reading, so a lying or missing length is caught
// too), and it must be UTF-8 (400).
import type { Context } from 'hono';
import { HttpError } from './errors.js';

export function mediaType(c: Context): string | null {
  const header = c.req.header('content-type');
  if (!header) return null;
  return (header.split(';')[0] ?? '').trim().toLowerCase();
}

export function requireMediaType(c: Context, allowed: readonly string[]): string {
  const type = mediaType(c);
  if (type === null || !allowed.includes(type)) {
    throw new HttpError(
      415,
      'unsupportedMediaType',
      `send the body as ${allowed.join(' or ')}; got ${type === null ? 'no Content-Type' : `"${type}"`}`,
    );
  }
  return type;
}

const decoder = new TextDecoder('utf-8', { fatal: true });

export async function readText(c: Context, allowed: readonly string[], maxBytes: number): Promise<string> {
  requireMediaType(c, allowed);
  const tooLarge = () =>
    new HttpError(413, 'tooLarge', `the body is larger than ${maxBytes} bytes, the most this request takes`);
  const declared = c.req.header('content-length');
  if (declared !== undefined && (!/^\d+$/.test(declared) || Number(declared) > maxBytes)) {
    if (!/^\d+$/.test(declared)) throw new HttpError(400, 'malformed', 'Content-Length must be a number');
    throw tooLarge();
  }
  const stream = c.req.raw.body;
  if (!stream) return '';
  const chunks: Uint8Array[] = [];
  let size = 0;
  const reader = stream.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    size += value.byteLength;
    if (size > maxBytes) {
      await reader.cancel();
      throw tooLarge();
    }
    chunks.push(value);
  }
  const bytes = new Uint8Array(size);
  let at = 0;
  for (const chunk of chunks) {
    bytes.set(chunk, at);
    at += chunk.byteLength;
  }
  try {
    return decoder.decode(bytes);
  } catch {
    throw new HttpError(400, 'malformed', 'the body is not UTF-8 text');
  }
}

export async function readJson(c: Context, maxBytes: number): Promise<unknown> {
  const text = await readText(c, ['application/json'], maxBytes);
  try {
    return JSON.parse(text) as unknown;
  } catch {
    throw new HttpError(400, 'malformed', 'the body is not JSON');
  }
}

export async function readForm(c: Context, maxBytes: number): Promise<URLSearchParams> {
  return new URLSearchParams(await readText(c, ['application/x-www-form-urlencoded'], maxBytes));
}
