// Page-side steps shared by the browser tests of the app.
import type { Page } from 'playwright-core';

/** Waits until a service worker controls the page (installed, activated and claimed it). */
export async function waitForController(page: Page): Promise<string> {
  await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
  return page.evaluate(() => navigator.serviceWorker.controller?.scriptURL ?? '');
}

/** The module script index.html loads: which build the page runs. */
export function entryScript(page: Page): Promise<string | null> {
  return page.evaluate(() => document.querySelector('script[type="module"]')?.getAttribute('src') ?? null);
}

/** The shell's header, visible: the app rendered. */
export function appHeader(page: Page) {
  return page.getByRole('banner').getByText('Beadbook', { exact: true });
}

const PROBE_DB = 'beadbook-e2e-probe';

/** Writes a value straight into IndexedDB (a database of its own, apart from the app's store). */
export function writeProbe(page: Page, value: string): Promise<void> {
  return page.evaluate(
    ([name, text]) =>
      new Promise<void>((resolve, reject) => {
        const open = indexedDB.open(name, 1);
        open.onupgradeneeded = () => open.result.createObjectStore('kv');
        open.onerror = () => reject(open.error ?? new Error('open failed'));
        open.onsuccess = () => {
          const db = open.result;
          const tx = db.transaction('kv', 'readwrite');
          tx.objectStore('kv').put(text, 'probe');
          tx.oncomplete = () => {
            db.close();
            resolve();
          };
          tx.onerror = () => reject(tx.error ?? new Error('write failed'));
        };
      }),
    [PROBE_DB, value] as const,
  );
}

/** Reads the value back; undefined when the database or the value is missing. */
export function readProbe(page: Page): Promise<string | undefined> {
  return page.evaluate(
    (name) =>
      new Promise<string | undefined>((resolve, reject) => {
        const open = indexedDB.open(name);
        open.onerror = () => reject(open.error ?? new Error('open failed'));
        open.onsuccess = () => {
          const db = open.result;
          if (!db.objectStoreNames.contains('kv')) {
            db.close();
            resolve(undefined);
            return;
          }
          const get = db.transaction('kv', 'readonly').objectStore('kv').get('probe');
          get.onsuccess = () => {
            db.close();
            resolve(typeof get.result === 'string' ? get.result : undefined);
          };
          get.onerror = () => reject(get.error ?? new Error('read failed'));
        };
      }),
    PROBE_DB,
  );
}
