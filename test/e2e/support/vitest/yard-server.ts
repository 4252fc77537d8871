// The yard server for browser tests: the real application (createApp) over real HTTP on 127.0.0.1, serving a
// built app and the API from one origin, with an in-memory database and a signed-in supervisor's helper.
import { serve, type ServerType } from '@hono/node-server';
import type { Server as HttpServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createApp } from '../../../../src/server/app.js';
import { ensureSupervisor } from '../../../../src/server/bootstrap.js';
import { testConfig } from '../../../../src/server/config.js';
import { memoryLogger } from '../../../../src/server/log.js';
import { SqliteStorage } from '../../../../src/server/storage/sqlite/sqlite-storage.js';

export const SUPERVISOR = { username: 'supervisor', password: 'e2e supervisor password' };

export interface YardServer {
  readonly origin: string;
  readonly storage: SqliteStorage;
  /** A JSON request to the supervisor API, signed in. */
  admin(method: string, path: string, body?: unknown): Promise<Response>;
  close(): Promise<void>;
}

export async function startYardServer(appDir: string): Promise<YardServer> {
  const config = testConfig({ appDir, host: '127.0.0.1', port: 0 });
  const storage = SqliteStorage.open(':memory:');
  const log = memoryLogger();
  await ensureSupervisor(
    storage,
    { ...config, supervisorPassword: SUPERVISOR.password },
    log,
    new Date(),
    () => {},
  );
  const { app, deps } = await createApp({ config, storage, log });
  const server: ServerType = await new Promise((resolve) => {
    const s = serve({ fetch: app.fetch, port: 0, hostname: '127.0.0.1' }, () => resolve(s));
  });
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  let cookie: string | null = null;
  const signIn = async (): Promise<string> => {
    if (cookie) return cookie;
    const res = await fetch(`${origin}/api/session`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin },
      body: JSON.stringify(SUPERVISOR),
    });
    if (res.status !== 200) throw new Error(`supervisor sign-in failed: ${res.status} ${await res.text()}`);
    cookie = (res.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    return cookie;
  };
  return {
    origin,
    storage,
    async admin(method, path, body) {
      return fetch(`${origin}/api/admin${path}`, {
        method,
        headers: {
          cookie: await signIn(),
          origin,
          ...(body === undefined ? {} : { 'content-type': 'application/json' }),
        },
        ...(body === undefined ? {} : { body: JSON.stringify(body) }),
      });
    },
    async close() {
      // Plain HTTP here (no TLS): the Node http server, which can drop its keep-alive connections.
      (server as HttpServer).closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await deps.regrader.idle();
      await deps.reviewIndexer.idle();
      await storage.close();
    },
  };
}
