// A new version deployed while the app is open: the page notices it and offers it, keeps running the old
// version (its lazy chunks still load although the server no longer has them) until the user accepts, and then
// reloads into the new version. With two windows open, accepting in one tells the other to reload.
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import { lazyChunks, readBuildManifest } from './support/build-app.js';
import { collectPageErrors } from './support/chromium.js';
import type { StaticServer } from './support/static-server.js';
import { appHeader, entryScript, waitForController } from './support/vitest/app-page.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current, next } = inject('e2eBuilds');

const e2e = useBrowser();

function entryOf(dir: string): string {
  const match = /<script type="module"[^>]*src="([^"]+)"/.exec(readFileSync(join(dir, 'index.html'), 'utf8'));
  if (!match?.[1]) throw new Error(`no entry script in ${dir}/index.html`);
  return match[1];
}

let oldEntry: string;
let newEntry: string;
/** Every lazily imported chunk of the running version. */
let oldLazy: string[];
/** Those the new deploy no longer has (their content changed): what a swap under the page would break. */
let oldOnlyLazy: string[];

beforeAll(() => {
  oldEntry = entryOf(current.dir);
  newEntry = entryOf(next.dir);
  oldLazy = lazyChunks(readBuildManifest(current.dir)).map((chunk) => `/${chunk.file}`);
  oldOnlyLazy = oldLazy.filter((chunk) => !existsSync(join(next.dir, chunk)));
});

/** The browser's periodic update check (the app also runs one hourly, on reconnect and when shown). */
function checkForUpdate(page: Page): Promise<void> {
  return page.evaluate(async () => {
    const registration = await navigator.serviceWorker.getRegistration();
    await registration?.update();
  });
}

function workerStates(page: Page) {
  return page.evaluate(async () => {
    const registration = await navigator.serviceWorker.getRegistration();
    return {
      controller: navigator.serviceWorker.controller?.state ?? null,
      active: registration?.active?.state ?? null,
      waiting: registration?.waiting?.state ?? null,
    };
  });
}

/** The version the controlling service worker reports (GET_VERSION in src/sw-protocol.ts). */
function controllerVersion(page: Page): Promise<string | undefined> {
  return page.evaluate(
    () =>
      new Promise<string | undefined>((resolve) => {
        const controller = navigator.serviceWorker.controller;
        if (!controller) return resolve(undefined);
        const channel = new MessageChannel();
        channel.port1.onmessage = (event: MessageEvent<{ version?: string }>) => resolve(event.data.version);
        controller.postMessage({ type: 'GET_VERSION' }, [channel.port2]);
      }),
  );
}

interface Opened {
  readonly server: StaticServer;
  readonly context: BrowserContext;
  readonly page: Page;
  readonly errors: string[];
}

/** Serves the build, opens it in a fresh Chromium profile and waits until the service worker controls it. */
async function openOn(dir: string): Promise<Opened> {
  const server = await e2e.serveStatic(dir);
  const { context, page, errors } = await e2e.launch();
  await page.goto(server.origin);
  await waitForController(page);
  return { server, context, page, errors };
}

describe('update while a page is open', () => {
  it('the two builds really differ: another entry chunk, and lazy chunks the new server does not have', () => {
    expect(newEntry).not.toBe(oldEntry);
    // If this fails, no lazy chunk depends on the version any more: make one (e.g. show the version in it).
    expect(oldOnlyLazy.length).toBeGreaterThan(0);
  });

  it('offers the new version, keeps the old one working until accepted, then reloads into the new one', async () => {
    const { server, page, errors } = await openOn(current.dir);
    expect(await entryScript(page)).toBe(oldEntry);
    expect(await controllerVersion(page)).toBe(current.version);

    server.root = next.dir; // deploy
    await checkForUpdate(page);

    const prompt = page.getByRole('region', { name: 'A new version of Beadbook is ready' });
    await prompt.waitFor({ state: 'visible' });
    await prompt.getByText(`Version ${next.version} is downloaded; this is ${current.version}.`).waitFor();

    // Nothing swapped yet: the old worker still controls the page, the new one waits.
    expect(await workerStates(page)).toEqual({
      controller: 'activated',
      active: 'activated',
      waiting: 'installed',
    });
    expect(await controllerVersion(page)).toBe(current.version);
    expect(await entryScript(page)).toBe(oldEntry);

    // The old page's lazy imports still load, from the old precache, although the server has none of the
    // changed ones any more.
    for (const chunk of oldOnlyLazy)
      expect((await fetch(`${server.origin}${chunk}`)).status, chunk).toBe(404);
    for (const chunk of oldLazy) {
      // As a string: vitest would rewrite an import() written in this file before Playwright sends it.
      const exports = await page.evaluate<number>(
        `import(${JSON.stringify(chunk)}).then((m) => Object.keys(m).length)`,
      );
      expect(exports, chunk).toBeGreaterThan(0);
    }

    // A reload without accepting keeps the old version and asks again.
    await page.reload();
    expect(await entryScript(page)).toBe(oldEntry);
    await prompt.waitFor({ state: 'visible' });
    expect(await workerStates(page)).toEqual({
      controller: 'activated',
      active: 'activated',
      waiting: 'installed',
    });

    // Accept: the new worker takes over and the page reloads into the new version.
    const reloaded = page.waitForEvent('load');
    await prompt.getByRole('button', { name: 'Update now' }).click();
    await reloaded;
    await appHeader(page).waitFor({ state: 'visible' });
    expect(await entryScript(page)).toBe(newEntry);
    expect(await controllerVersion(page)).toBe(next.version);
    expect(await workerStates(page)).toEqual({ controller: 'activated', active: 'activated', waiting: null });
    expect(await prompt.count()).toBe(0);
    expect(errors).toEqual([]);
  });

  it('"Later" hides the offer and changes nothing', async () => {
    const { server, page, errors } = await openOn(current.dir);
    server.root = next.dir;
    await checkForUpdate(page);
    const prompt = page.getByRole('region', { name: 'A new version of Beadbook is ready' });
    await prompt.waitFor({ state: 'visible' });
    await prompt.getByRole('button', { name: 'Later' }).click();
    await prompt.waitFor({ state: 'detached' });
    expect(await workerStates(page)).toEqual({
      controller: 'activated',
      active: 'activated',
      waiting: 'installed',
    });
    expect(await entryScript(page)).toBe(oldEntry);
    expect(errors).toEqual([]);
  });

  it('accepting in one window tells the other window to reload', async () => {
    const { server, context, page: first, errors } = await openOn(current.dir);
    const second = await context.newPage();
    const secondErrors = collectPageErrors(second);
    await second.goto(server.origin);
    await waitForController(second);

    server.root = next.dir;
    await checkForUpdate(first);
    const offer = (page: Page) => page.getByRole('region', { name: 'A new version of Beadbook is ready' });
    await offer(first).waitFor({ state: 'visible' });
    await offer(second).waitFor({ state: 'visible' });

    const reloaded = first.waitForEvent('load');
    await offer(first).getByRole('button', { name: 'Update now' }).click();
    await reloaded;
    expect(await entryScript(first)).toBe(newEntry);

    const notice = second.getByRole('region', { name: 'Beadbook was updated in another window' });
    await notice.waitFor({ state: 'visible' });
    expect(await entryScript(second)).toBe(oldEntry);
    const secondReloaded = second.waitForEvent('load');
    await notice.getByRole('button', { name: 'Reload now' }).click();
    await secondReloaded;
    expect(await entryScript(second)).toBe(newEntry);
    expect([...errors, ...secondErrors]).toEqual([]);
  });
});
