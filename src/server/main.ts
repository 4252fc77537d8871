// `npm start` runs this after building: one process serving the built app, the sync API and the supervisor's
// pages, over https when a certificate and key are given.
import { serve } from '@hono/node-server';
import { readFileSync } from 'node:fs';
import { createServer as createHttpsServer } from 'node:https';
import type { AddressInfo } from 'node:net';
import { createApp } from './app.js';
import { ensureSupervisor } from './bootstrap.js';
import { ConfigError, readConfig } from './config.js';
import { loadDemoYard } from './demo.js';
import { createLogger } from './log.js';
import { SqliteStorage } from './storage/sqlite/sqlite-storage.js';

const log = createLogger((line) => process.stdout.write(line));

async function main(): Promise<void> {
  const config = readConfig(process.env, process.argv.slice(2));
  const pkg = JSON.parse(readFileSync(new URL('../../../../package.json', import.meta.url), 'utf8')) as {
    version: string;
  };
  const storage = SqliteStorage.open(config.dbFile);
  await ensureSupervisor(storage, config, log, new Date(), (text) => process.stderr.write(text));
  const { app, deps } = await createApp({ config, storage, log, version: pkg.version });
  if (config.demo) await loadDemoYard(deps);

  const tls = config.tls;
  const server = serve({
    fetch: app.fetch,
    port: config.port,
    hostname: config.host,
    ...(tls
      ? {
          createServer: createHttpsServer,
          serverOptions: { cert: readFileSync(tls.certFile), key: readFileSync(tls.keyFile) },
        }
      : {}),
  });
  server.on('listening', () => {
    const { port } = server.address() as AddressInfo;
    log.info('listening', {
      url: `${tls ? 'https' : 'http'}://${config.host === '0.0.0.0' ? 'localhost' : config.host}:${port}`,
      host: config.host,
      port,
      db: config.dbFile,
      app: config.appDir,
      demo: config.demo,
      serverKid: deps.serverKey.kid,
    });
    if (!tls)
      log.warn('plainHttp', {
        note: 'no TLS: session cookies are not marked Secure; tablets need https (README)',
      });
  });
  server.on('error', (error) => {
    log.error('serverError', { error });
    process.exitCode = 1;
  });

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    log.info('stopping', { signal });
    server.close(() => {
      void Promise.all([deps.regrader.idle(), deps.reviewIndexer.idle()]).finally(() => {
        void storage.close().then(() => process.exit(0));
      });
    });
    setTimeout(() => process.exit(0), 5000).unref();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((error: unknown) => {
  if (error instanceof ConfigError) {
    log.error('config', { message: error.message });
    process.stderr.write(`beadbook server: ${error.message}\n`);
  } else {
    log.error('startFailed', { error });
  }
  process.exit(1);
});
