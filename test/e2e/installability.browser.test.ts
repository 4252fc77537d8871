// The built app is installable: Chromium finds a valid manifest with the icons it needs, and a service worker
// controls the page.
import { beforeAll, describe, expect, inject, it } from 'vitest';
import type { BrowserContext, Page } from 'playwright-core';
import type { StaticServer } from './support/static-server.js';
import { appHeader, waitForController } from './support/vitest/app-page.js';
import { useBrowser } from './support/vitest/browser-test.js';

interface ManifestIcon {
  readonly src: string;
  readonly sizes?: string;
  readonly type?: string;
  readonly purpose?: string;
}
interface WebManifest {
  readonly name?: string;
  readonly short_name?: string;
  readonly start_url?: string;
  readonly scope?: string;
  readonly display?: string;
  readonly icons?: readonly ManifestIcon[];
}

const { current } = inject('e2eBuilds');
const e2e = useBrowser({ per: 'file' });
let server: StaticServer;
let context: BrowserContext;
let page: Page;
let errors: string[];

beforeAll(async () => {
  server = await e2e.serveStatic(current.dir);
  ({ context, page, errors } = await e2e.launch());
  await page.goto(server.origin);
  await appHeader(page).waitFor();
});

describe('installability', () => {
  it('links a manifest with name, start_url, standalone display and 192, 512 and maskable icons', async () => {
    const href = await page.evaluate(() =>
      document.querySelector('link[rel="manifest"]')?.getAttribute('href'),
    );
    expect(href).toBe('/manifest.webmanifest');
    const response = await page.request.get(new URL(href ?? '', server.origin).href);
    expect(response.status()).toBe(200);
    const manifest = (await response.json()) as WebManifest;
    expect(manifest.name).toBe('Beadbook');
    expect(manifest.short_name).toBe('Beadbook');
    expect(manifest.start_url).toBe('/');
    expect(manifest.display).toBe('standalone');
    const icons = manifest.icons ?? [];
    const purposes = (icon: ManifestIcon) => (icon.purpose ?? 'any').split(' ');
    expect(icons.some((icon) => icon.sizes === '192x192' && purposes(icon).includes('any'))).toBe(true);
    expect(icons.some((icon) => icon.sizes === '512x512' && purposes(icon).includes('any'))).toBe(true);
    expect(icons.some((icon) => purposes(icon).includes('maskable'))).toBe(true);
  });

  it('serves every manifest icon with status 200 and its declared type', async () => {
    const manifest = (await (
      await page.request.get(`${server.origin}/manifest.webmanifest`)
    ).json()) as WebManifest;
    for (const icon of manifest.icons ?? []) {
      const response = await page.request.get(new URL(icon.src, server.origin).href);
      expect(response.status(), icon.src).toBe(200);
      expect(response.headers()['content-type'], icon.src).toBe(icon.type);
      expect((await response.body()).length, icon.src).toBeGreaterThan(0);
    }
  });

  it('is controlled by an activated service worker (sw.js)', async () => {
    const scriptUrl = await waitForController(page);
    expect(scriptUrl).toBe(`${server.origin}/sw.js`);
    // The worker claims the page during its activate event, so control comes a moment before 'activated'.
    const registration = () =>
      page.evaluate(async () => {
        const reg = await navigator.serviceWorker.ready;
        return { scope: reg.scope, active: reg.active?.state ?? null, waiting: reg.waiting !== null };
      });
    await expect
      .poll(registration)
      .toEqual({ scope: `${server.origin}/`, active: 'activated', waiting: false });
  });

  it('has no installability errors in Chromium’s own check', async () => {
    await waitForController(page);
    const cdp = await context.newCDPSession(page);
    const { installabilityErrors } = (await cdp.send('Page.getInstallabilityErrors')) as {
      installabilityErrors: { errorId: string }[];
    };
    expect(installabilityErrors).toEqual([]);
    await cdp.detach();
  });

  it('raised no uncaught error in the page', () => {
    expect(errors).toEqual([]);
  });
});
