// Serves the built app. Nothing is cached by the browser without asking (no-cache, with ETags for cheap
// revalidation): the service worker, not the HTTP cache, keeps the app available offline, and sw.js itself
// must always be fetched fresh so updates are seen.
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { extname, join, normalize, sep } from 'node:path';
import { Readable } from 'node:stream';
import type { Context } from 'hono';

const TYPES: Record<string, string> = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.mjs': 'text/javascript; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.json': 'application/json',
  '.webmanifest': 'application/manifest+json',
  '.png': 'image/png',
  '.svg': 'image/svg+xml',
  '.ico': 'image/x-icon',
  '.webp': 'image/webp',
  '.woff2': 'font/woff2',
  '.wasm': 'application/wasm',
  '.txt': 'text/plain; charset=utf-8',
};

async function fileFor(
  root: string,
  urlPath: string,
): Promise<{ file: string; size: number; mtimeMs: number } | undefined> {
  let path: string;
  try {
    path = decodeURIComponent(urlPath);
  } catch {
    return undefined;
  }
  if (path.includes('\0')) return undefined;
  if (path.endsWith('/')) path += 'index.html';
  const file = normalize(join(root, path));
  if (!file.startsWith(root.endsWith(sep) ? root : root + sep)) return undefined;
  try {
    const s = await stat(file);
    return s.isFile() ? { file, size: s.size, mtimeMs: s.mtimeMs } : undefined;
  } catch {
    return undefined;
  }
}

/** The app's file for a GET or HEAD, index.html for other page addresses (the app routes itself), or null. */
export async function serveApp(c: Context, root: string): Promise<Response | null> {
  const path = new URL(c.req.url).pathname;
  let found = await fileFor(root, path);
  if (!found && !extname(path) && (c.req.header('accept') ?? '').includes('text/html')) {
    found = await fileFor(root, '/index.html');
  }
  if (!found) return null;
  const etag = `W/"${found.size.toString(16)}-${Math.floor(found.mtimeMs).toString(16)}"`;
  const headers = new Headers({
    'Content-Type': TYPES[extname(found.file)] ?? 'application/octet-stream',
    'Cache-Control': 'no-cache',
    ETag: etag,
  });
  if (c.req.header('if-none-match') === etag) return new Response(null, { status: 304, headers });
  headers.set('Content-Length', String(found.size));
  if (c.req.method === 'HEAD') return new Response(null, { status: 200, headers });
  const body = Readable.toWeb(createReadStream(found.file)) as ReadableStream<Uint8Array>;
  return new Response(body, { status: 200, headers });
}
