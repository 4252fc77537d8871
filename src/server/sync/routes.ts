// The device API. Every request but the nonce and the server key is a flattened JWS signed by the device.
import { Hono } from 'hono';
import { JOSE_JSON, PROTOCOL_VERSION } from '../../protocol/index.js';
import type { AppDeps, AppEnv } from '../deps.js';
import { readText } from '../http/body.js';
import { rateLimit } from '../http/rate-limit.js';
import { enrol } from './enrol.js';
import { ingestBatch, type SyncDeps } from './ingest.js';
import { issueNonce, pull } from './pull.js';

export function syncRoutes(deps: AppDeps): Hono<AppEnv> {
  const sync: AppDeps & SyncDeps = {
    ...deps,
    regrade: (ids) => deps.regrader.schedule(ids),
    fresh: deps.regrader.fresh,
  };
  const app = new Hono<AppEnv>();
  app.use('*', rateLimit(deps.limiters.sync, 'sync', deps.config.trustProxy));
  app.use('*', async (c, next) => {
    await next();
    c.header('Cache-Control', 'no-store');
  });

  app.get('/server-key', (c) =>
    c.json({ protocol: PROTOCOL_VERSION, kid: deps.serverKey.kid, jwk: deps.serverKey.publicJwk }),
  );

  app.post('/enrol', async (c) => {
    const body = await readText(c, [JOSE_JSON], deps.config.limits.otherBytes);
    const { created, reply } = await enrol(deps, body);
    return c.json(reply, created ? 201 : 200);
  });

  app.post('/batches', async (c) => {
    const body = await readText(c, [JOSE_JSON], deps.config.limits.batchBytes);
    return c.json(await ingestBatch(sync, body));
  });

  app.post('/nonce', async (c) => c.json(await issueNonce(deps)));

  app.post('/pull', async (c) => {
    const body = await readText(c, [JOSE_JSON], deps.config.limits.otherBytes);
    return c.json(await pull(sync, body));
  });

  return app;
}
