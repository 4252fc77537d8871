// The built app is installable: Chromium finds a valid manifest with the icons it needs, and a service worker
// controls the page.
import { beforeAll, describe, expect, inject, it } from 'vitest';
import { appHeader, waitForController } from './support/vitest/app-page.js';
import { useSharedBrowser } from './support/vitest/browser-test.js';

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
const shared = useSharedBrowser(current.dir);

beforeAll(async () => {
  await shared.page.goto(shared.server.origin);
  await appHeader(shared.page).waitFor();
});

describe('installability', () => {
  it('links a manifest with name, start_url, standalone display and 192, 512 and maskable icons', async () => {
    const href = await shared.page.evaluate(() =>
      document.querySelector('link[rel="manifest"]')?.getAttribute('href'),
    );
    expect(href).toBe('/manifest.webmanifest');
    const response = await shared.page.request.get(new URL(href ?? '', shared.server.origin).href);
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
      await shared.page.request.get(`${shared.server.origin}/manifest.webmanifest`)
    ).json()) as WebManifest;
    for (const icon of manifest.icons ?? []) {
      const response = await shared.page.request.get(new URL(icon.src, shared.server.origin).href);
      expect(response.status(), icon.src).toBe(200);
      expect(response.headers()['content-type'], icon.src).toBe(icon.type);
      expect((await response.body()).length, icon.src).toBeGreaterThan(0);
    }
  });

  it('is controlled by an activated service worker (sw.js)', async () => {
    const scriptUrl = await waitForController(shared.page);
    expect(scriptUrl).toBe(`${shared.server.origin}/sw.js`);
    // The worker claims the page during its activate event, so control comes a moment before 'activated'.
    const registration = () =>
      shared.page.evaluate(async () => {
        const reg = await navigator.serviceWorker.ready;
        return { scope: reg.scope, active: reg.active?.state ?? null, waiting: reg.waiting !== null };
      });
    await expect
      .poll(registration)
      .toEqual({ scope: `${shared.server.origin}/`, active: 'activated', waiting: false });
  });

  it('has no installability errors in Chromium’s own check', async () => {
    await waitForController(shared.page);
    const cdp = await shared.context.newCDPSession(shared.page);
    const { installabilityErrors } = (await cdp.send('Page.getInstallabilityErrors')) as {
      installabilityErrors: { errorId: string }[];
    };
    expect(installabilityErrors).toEqual([]);
    await cdp.detach();
  });

  it('raised no uncaught error in the shared.page', () => {
    expect(shared.errors).toEqual([]);
  });
});
