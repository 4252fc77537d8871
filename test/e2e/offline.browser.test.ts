// Offline for real: the server is stopped and the browser is offline, so only the service worker's precache
// can bring the app up; data written to IndexedDB before going offline must read back after a reload and after
// the browser itself is closed and started again on the same profile.
import { randomUUID } from 'node:crypto';
import { describe, expect, inject, it } from 'vitest';
import { appHeader, readProbe, waitForController, writeProbe } from './support/vitest/app-page.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

/** Proves the server is really gone: a request from Node fails to connect. */
async function expectServerDown(origin: string): Promise<void> {
  await expect(fetch(`${origin}/index.html`)).rejects.toThrow();
}

describe('offline', () => {
  it('reloads with no server and no network, and reads back IndexedDB data written online', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { context, page, errors } = await e2e.launch();
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
    const server = await e2e.serveStatic(current.dir);
    const { context: before, page: first, profile } = await e2e.launch();
    await first.goto(server.origin);
    await waitForController(first);
    const token = randomUUID();
    await writeProbe(first, token);
    await before.close();

    await server.stop();
    await expectServerDown(server.origin);
    const { context, page, errors } = await e2e.launch({ profile });
    await context.setOffline(true);
    await page.goto(server.origin);

    await appHeader(page).waitFor({ state: 'visible' });
    expect(await page.evaluate(() => navigator.serviceWorker.controller?.scriptURL)).toBe(
      `${server.origin}/sw.js`,
    );
    expect(await readProbe(page)).toBe(token);
    expect(errors).toEqual([]);
  });
});
