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
  const bytes = await readBytes(c, allowed, maxBytes);
  try {
    return decoder.decode(bytes);
  } catch {
    throw new HttpError(400, 'malformed', 'the body is not UTF-8 text');
  }
}

/** The body's bytes, of a media type the route takes and within its cap. */
export async function readBytes(
  c: Context,
  allowed: readonly string[],
  maxBytes: number,
): Promise<Uint8Array> {
  requireMediaType(c, allowed);
  const tooLarge = () =>
    new HttpError(413, 'tooLarge', `the body is larger than ${maxBytes} bytes, the most this request takes`);
  const declared = c.req.header('content-length');
  if (declared !== undefined && (!/^\d+$/.test(declared) || Number(declared) > maxBytes)) {
    if (!/^\d+$/.test(declared)) throw new HttpError(400, 'malformed', 'Content-Length must be a number');
    throw tooLarge();
  }
  const stream = c.req.raw.body;
  if (!stream) return new Uint8Array(0);
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
  return bytes;
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

/**
 * A form posted as multipart/form-data (a file upload) or url-encoded, within the cap. Files come back as File
 * objects; a malformed multipart body is a 400.
 */
export async function readFormData(c: Context, maxBytes: number): Promise<FormData> {
  const type = mediaType(c);
  const bytes = await readBytes(c, ['multipart/form-data', 'application/x-www-form-urlencoded'], maxBytes);
  try {
    return await new Response(bytes, {
      headers: { 'content-type': c.req.header('content-type') ?? '' },
    }).formData();
  } catch {
    throw new HttpError(
      400,
      'malformed',
      `the ${type === 'multipart/form-data' ? 'upload' : 'form'} could not be read`,
    );
  }
}
