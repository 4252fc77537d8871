// Offline for real: the server is stopped and the browser is offline, so only the service worker's precache
// can bring the app up; data written to IndexedDB before going offline must read back after a reload and after
// the browser itself is closed and started again on the same profile.
import { randomUUID } from 'node:crypto';
import { afterEach, describe, expect, inject, it } from 'vitest';
import type { BrowserContext } from 'playwright-core';
import {
  collectPageErrors,
  firstPage,
  launchChromium,
  newProfileDir,
  removeProfileDir,
} from './support/chromium.js';
import { serveStatic, type StaticServer } from './support/static-server.js';
import { appHeader, readProbe, waitForController, writeProbe } from './support/vitest/app-page.js';

const { current } = inject('e2eBuilds');

let server: StaticServer | undefined;
let profile: string | undefined;
let context: BrowserContext | undefined;

afterEach(async () => {
  await context?.close();
  await server?.stop();
  if (profile) await removeProfileDir(profile);
  context = undefined;
  server = undefined;
  profile = undefined;
});

/** Proves the server is really gone: a request from Node fails to connect. */
async function expectServerDown(origin: string): Promise<void> {
  await expect(fetch(`${origin}/index.html`)).rejects.toThrow();
}

describe('offline', () => {
  it('reloads with no server and no network, and reads back IndexedDB data written online', async () => {
    server = await serveStatic(current.dir);
    profile = await newProfileDir();
    context = await launchChromium(profile);
    const page = await firstPage(context);
    const errors = collectPageErrors(page);
    await page.goto(server.origin);
    await waitForController(page);
    const token = randomUUID();
    await writeProbe(page, token);

    await server.stop();
    await expectServerDown(server.origin);
    await context.setOffline(true);
    await page.reload();

    await appHeader(page).waitFor({ state: 'visible' });
    expect(await readProbe(page)).toBe(token);
    expect(errors).toEqual([]);
  });

  it('opens offline after the browser is closed and started again, with the IndexedDB data kept', async () => {
    server = await serveStatic(current.dir);
    profile = await newProfileDir();
    context = await launchChromium(profile);
    const first = await firstPage(context);
    await first.goto(server.origin);
    await waitForController(first);
    const token = randomUUID();
    await writeProbe(first, token);
    await context.close();

    await server.stop();
    await expectServerDown(server.origin);
    context = await launchChromium(profile);
    await context.setOffline(true);
    const page = await firstPage(context);
    const errors = collectPageErrors(page);
    await page.goto(server.origin);

    await appHeader(page).waitFor({ state: 'visible' });
    expect(await page.evaluate(() => navigator.serviceWorker.controller?.scriptURL)).toBe(
      `${server.origin}/sw.js`,
    );
    expect(await readProbe(page)).toBe(token);
    expect(errors).toEqual([]);
  });
});
