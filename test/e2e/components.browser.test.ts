// The install hint and the storage status, mounted alone on a test page (test/e2e/fixtures/components) and
// driven in Chromium: with the browser's own answers, and with the answers other browsers give (an install
// event, a refused or missing persistent-storage API), which the tests stage before the page loads.
import { afterEach, beforeEach, describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { collectPageErrors } from './support/chromium.js';
import { useSharedBrowser } from './support/vitest/browser-test.js';

const { components } = inject('e2eBuilds');

const shared = useSharedBrowser(components.dir);
let page: Page;
let errors: string[];

beforeEach(async () => {
  page = await shared.context.newPage();
  errors = collectPageErrors(page);
});

afterEach(async () => {
  await page.close();
  expect(errors).toEqual([]);
});

const storageStatus = () => page.getByRole('region', { name: 'Storage on this device' }).getByRole('status');

describe('InstallHint', () => {
  it('tells how to install from the browser menu when the browser offers no install event', async () => {
    await page.goto(shared.server.origin);
    const install = page.getByRole('region', { name: 'Install' });
    await install.getByText('open the browser menu and choose Install app').waitFor();
    expect(await install.getByRole('button').count()).toBe(0);
  });

  it('turns the install event into a button that opens the browser’s install prompt', async () => {
    await page.goto(shared.server.origin);
    await page.evaluate(() => {
      const event = new Event('beforeinstallprompt', { cancelable: true });
      const calls: string[] = [];
      Object.assign(window, { installCalls: calls });
      Object.assign(event, {
        prompt: () => {
          calls.push('prompt');
          return Promise.resolve();
        },
        userChoice: Promise.resolve({ outcome: 'accepted' }),
      });
      window.dispatchEvent(event);
      calls.push(event.defaultPrevented ? 'default prevented' : 'browser banner left on');
    });
    const button = page.getByRole('button', { name: 'Install Beadbook on this tablet' });
    await button.click();
    await page.getByText('Beadbook is installed. Open it from the home screen or the app list.').waitFor();
    expect(await page.evaluate(() => (window as unknown as { installCalls: string[] }).installCalls)).toEqual(
      ['default prevented', 'prompt'],
    );
    expect(await button.count()).toBe(0);
  });

  it('falls back to the menu hint when the user dismisses the prompt', async () => {
    await page.goto(shared.server.origin);
    await page.evaluate(() => {
      const event = new Event('beforeinstallprompt', { cancelable: true });
      Object.assign(event, {
        prompt: () => Promise.resolve(),
        userChoice: Promise.resolve({ outcome: 'dismissed' }),
      });
      window.dispatchEvent(event);
    });
    await page.getByRole('button', { name: 'Install Beadbook on this tablet' }).click();
    await page.getByText('open the browser menu and choose Install app').waitFor();
  });
});

describe('StorageStatus', () => {
  it('reports Chromium’s own answer to persist() and the space used', async () => {
    await page.goto(shared.server.origin);
    const status = storageStatus();
    await page.waitForFunction(() =>
      document.querySelector('[data-protection]:not([data-protection="checking"])'),
    );
    const before = await status.getAttribute('data-protection');
    expect(['granted', 'not-asked']).toContain(before);
    await page.getByText(/^Using .+ of about .+ available to Beadbook\.$/).waitFor();

    if (before === 'not-asked')
      await page.getByRole('button', { name: 'Keep Beadbook’s data on this device' }).click();
    await page.waitForFunction(() => {
      const state = document.querySelector('[data-protection]')?.getAttribute('data-protection');
      return state === 'granted' || state === 'denied';
    });
    const persisted = await page.evaluate(() => navigator.storage.persisted());
    expect(await status.getAttribute('data-protection')).toBe(persisted ? 'granted' : 'denied');
  });

  it('says the data is not protected when the browser refuses', async () => {
    await page.addInitScript(() => {
      Object.defineProperty(StorageManager.prototype, 'persisted', { value: () => Promise.resolve(false) });
      Object.defineProperty(StorageManager.prototype, 'persist', { value: () => Promise.resolve(false) });
    });
    await page.goto(shared.server.origin);
    await storageStatus().getByText('Not yet protected').waitFor();
    await page.getByRole('button', { name: 'Keep Beadbook’s data on this device' }).click();
    await storageStatus().getByText('Not protected: the browser declined').waitFor();
    expect(await storageStatus().getAttribute('data-protection')).toBe('denied');
    // Asking again stays possible (Firefox, for one, asks the user each time until they decide).
    expect(await page.getByRole('button', { name: 'Keep Beadbook’s data on this device' }).count()).toBe(1);
  });

  it('says protection is granted, with no button, when the browser has granted it', async () => {
    await page.addInitScript(() => {
      Object.defineProperty(StorageManager.prototype, 'persisted', { value: () => Promise.resolve(true) });
    });
    await page.goto(shared.server.origin);
    await storageStatus().getByText('Protected: the browser keeps Beadbook’s data').waitFor();
    expect(await page.getByRole('button', { name: 'Keep Beadbook’s data on this device' }).count()).toBe(0);
  });

  it('says the browser cannot protect data when it has no storage API', async () => {
    await page.addInitScript(() => {
      Object.defineProperty(Navigator.prototype, 'storage', { get: () => undefined });
    });
    await page.goto(shared.server.origin);
    await storageStatus().getByText('This browser cannot protect stored data').waitFor();
    expect(await storageStatus().getAttribute('data-protection')).toBe('unsupported');
    expect(await page.getByRole('button', { name: 'Keep Beadbook’s data on this device' }).count()).toBe(0);
  });
});
