// A small static server for a built app, as a deployment would serve it: no-cache everywhere (so the service
// worker, not the HTTP cache, is what keeps the app available offline), sw.js included. Tests stop it to go
// offline for real, start it again on the same port (same origin, same storage), and switch the directory it
// serves to deploy a new version under a running page.
import { createReadStream } from 'node:fs';
import { stat } from 'node:fs/promises';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { extname, join, normalize, sep } from 'node:path';

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

export interface StaticServer {
  /** e.g. http://127.0.0.1:41234 — stays the same across stop() and start(). */
  readonly origin: string;
  /** The directory served; change it to deploy another build. */
  root: string;
  /** Paths requested, in order (query strings dropped). */
  readonly requests: string[];
  readonly running: boolean;
  start(): Promise<void>;
  /** Closes the listener and every open connection: the next request fails as if the server were gone. */
  stop(): Promise<void>;
}

async function fileFor(root: string, urlPath: string): Promise<string | undefined> {
  let path: string;
  try {
    path = decodeURIComponent(urlPath);
  } catch {
    return undefined;
  }
  if (path.endsWith('/')) path += 'index.html';
  const file = normalize(join(root, path));
  if (file !== root && !file.startsWith(root.endsWith(sep) ? root : root + sep)) return undefined;
  try {
    return (await stat(file)).isFile() ? file : undefined;
  } catch {
    return undefined;
  }
}

export async function serveStatic(initialRoot: string): Promise<StaticServer> {
  let server: Server | undefined;
  let port = 0;
  const state = {
    root: normalize(initialRoot),
    requests: [] as string[],
  };

  const listen = async (): Promise<void> => {
    const next = createServer((req, res) => {
      const path = (req.url ?? '/').split('?')[0] ?? '/';
      state.requests.push(path);
      if (req.method !== 'GET' && req.method !== 'HEAD') {
        res.writeHead(405, { Allow: 'GET, HEAD' }).end();
        return;
      }
      void fileFor(state.root, path).then((file) => {
        if (!file) {
          res.writeHead(404, { 'Content-Type': 'text/plain; charset=utf-8', 'Cache-Control': 'no-cache' });
          res.end('not found\n');
          return;
        }
        res.writeHead(200, {
          'Content-Type': TYPES[extname(file)] ?? 'application/octet-stream',
          'Cache-Control': 'no-cache',
        });
        if (req.method === 'HEAD') res.end();
        else createReadStream(file).pipe(res);
      });
    });
    await new Promise<void>((resolve, reject) => {
      next.once('error', reject);
      next.listen(port, '127.0.0.1', () => {
        next.off('error', reject);
        resolve();
      });
    });
    port = (next.address() as AddressInfo).port;
    server = next;
  };

  await listen();

  return {
    get origin() {
      return `http://127.0.0.1:${port}`;
    },
    get root() {
      return state.root;
    },
    set root(dir: string) {
      state.root = normalize(dir);
    },
    requests: state.requests,
    get running() {
      return server !== undefined;
    },
    async start() {
      if (!server) await listen();
    },
    async stop() {
      const current = server;
      if (!current) return;
      server = undefined;
      current.closeAllConnections();
      await new Promise<void>((resolve, reject) =>
        current.close((error) => (error ? reject(error) : resolve())),
      );
    },
  };
}
