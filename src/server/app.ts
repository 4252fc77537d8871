// The yard server's HTTP application: the device sync API, the session and supervisor API, the supervisor's
// pages and the built app, behind security headers, structured request logs and one error handler that never
// sends a stack trace.
import { Hono } from 'hono';
import { adminRoutes } from './admin/routes.js';
import { sessionRoutes } from './auth/routes.js';
import { loadSession } from './auth/session.js';
import type { ServerConfig } from './config.js';
import type { AppDeps, AppEnv } from './deps.js';
import { Regrader } from './grading/regrade.js';
import { HttpError, fromProtocolError } from './http/errors.js';
import { RateLimiter } from './http/rate-limit.js';
import { ReviewIndexer } from './review/indexer.js';
import { securityHeaders } from './http/security-headers.js';
import { serveApp } from './http/static.js';
import type { Logger } from './log.js';
import type { Storage } from './storage/types.js';
import { DeviceKeyCache } from './sync/device-keys.js';
import { syncRoutes } from './sync/routes.js';
import { loadServerKey } from './sync/server-key.js';
import { isProtocolError, PROTOCOL_VERSION } from '../protocol/index.js';
import { errorPage } from './web/pages.js';
import { webRoutes } from './web/routes.js';
import { newToken } from './auth/tokens.js';

export interface AppOptions {
  readonly config: ServerConfig;
  readonly storage: Storage;
  readonly log: Logger;
  readonly now?: () => Date;
  readonly version?: string;
}

export interface BeadbookApp {
  readonly app: Hono<AppEnv>;
  readonly deps: AppDeps;
}

export async function createApp(options: AppOptions): Promise<BeadbookApp> {
  const now = options.now ?? (() => new Date());
  const { config, storage, log } = options;
  const deps: AppDeps = {
    config,
    storage,
    log,
    now,
    serverKey: await loadServerKey(storage, now()),
    regrader: new Regrader(storage, now, log),
    reviewIndexer: new ReviewIndexer(storage, now, log),
    deviceKeys: new DeviceKeyCache(),
    limiters: {
      login: new RateLimiter(config.limits.login, () => now().getTime()),
      sync: new RateLimiter(config.limits.sync, () => now().getTime()),
    },
    secure: config.tls !== null,
  };

  // Records stored before a stop whose re-grade had not run yet: grade them now; review facts follow each grade.
  deps.regrader.onGraded((seamId) => deps.reviewIndexer.schedule([seamId]));
  deps.regrader.schedule(await storage.staleSeams());
  deps.reviewIndexer.schedule(await storage.staleReviewFacts());

  const app = new Hono<AppEnv>();
  // Request ids only tie a client's error message to the log lines: unique per process run is enough.
  const runId = newToken(3);
  let requests = 0;
  app.use('*', async (c, next) => {
    const requestId = `${runId}-${(++requests).toString(36)}`;
    c.set('requestId', requestId);
    const started = performance.now();
    await next();
    log.info('http', {
      id: requestId,
      method: c.req.method,
      path: new URL(c.req.url).pathname,
      status: c.res.status,
      ms: Math.round((performance.now() - started) * 10) / 10,
    });
  });
  app.use('*', securityHeaders(deps.secure));
  app.use('*', loadSession(deps));

  app.get('/healthz', (c) =>
    c.json({ ok: true, protocol: PROTOCOL_VERSION, version: options.version ?? null }),
  );
  app.route('/api/sync', syncRoutes(deps));
  app.route('/api/session', sessionRoutes(deps));
  app.route('/api/admin', adminRoutes(deps));
  app.route('/supervisor', webRoutes(deps));
  app.all('/api/*', () => {
    throw new HttpError(404, 'notFound', 'no such API address');
  });
  app.on(['GET', 'HEAD'], '*', async (c, next) => {
    const res = await serveApp(c, config.appDir);
    if (res) return res;
    await next();
    return undefined;
  });

  app.notFound((c) => {
    if (wantsHtml(c.req.path, c.req.header('accept')))
      return c.html(errorPage(404, 'There is nothing at this address.'), 404);
    return c.json({ error: 'notFound', message: 'nothing at this address' }, 404);
  });

  app.onError((error, c) => {
    const e = isProtocolError(error) ? fromProtocolError(error) : error instanceof HttpError ? error : null;
    if (e) {
      for (const [k, v] of Object.entries(e.headers)) c.header(k, v);
      if (wantsHtml(c.req.path, c.req.header('accept')))
        return c.html(errorPage(e.status, e.message), e.status);
      return c.json({ error: e.code, message: e.message }, e.status);
    }
    const ref = c.get('requestId');
    log.error('unhandled', { id: ref, method: c.req.method, path: c.req.path, error });
    const message = `the server could not handle this request (reference ${ref}); the details are in its log`;
    if (wantsHtml(c.req.path, c.req.header('accept'))) return c.html(errorPage(500, message), 500);
    return c.json({ error: 'internal', message }, 500);
  });

  return { app, deps };
}

function wantsHtml(path: string, accept: string | undefined): boolean {
  return !path.startsWith('/api/') && (accept ?? '').includes('text/html');
}
