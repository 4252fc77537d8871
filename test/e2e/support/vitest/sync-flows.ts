// What the sync browser tests share: enrolling the page with a code the supervisor made, and reading what the
// tablet holds (IndexedDB) and what the yard server holds (supervisor API).
import { expect } from 'vitest';
import type { Page } from 'playwright-core';
import { textbox } from './app-flows.js';
import type { YardServer } from './yard-server.js';

export interface LocalRecord {
  readonly recordId: string;
  readonly kind: string;
}

/** The app's outbox and reading ids straight from IndexedDB. */
export function localRecords(page: Page): Promise<{ outbox: LocalRecord[]; readings: string[] }> {
  return page.evaluate(
    () =>
      new Promise<{ outbox: LocalRecord[]; readings: string[] }>((resolve, reject) => {
        const open = indexedDB.open('beadbook');
        open.onerror = () => reject(open.error ?? new Error('open failed'));
        open.onsuccess = () => {
          const db = open.result;
          const tx = db.transaction(['outbox', 'readings'], 'readonly');
          const outbox = tx.objectStore('outbox').getAll();
          const readings = tx.objectStore('readings').getAllKeys();
          tx.oncomplete = () => {
            db.close();
            resolve({
              outbox: (outbox.result as LocalRecord[]).map((e) => ({ recordId: e.recordId, kind: e.kind })),
              readings: readings.result.map(String),
            });
          };
          tx.onerror = () => reject(tx.error ?? new Error('read failed'));
        };
      }),
  );
}

export interface ServerRecord {
  readonly id: string;
  readonly kind: string;
  readonly deviceKid: string | null;
  readonly batchId: string | null;
}

export const serverRecords = async (yard: YardServer): Promise<ServerRecord[]> =>
  (await (await yard.admin('GET', '/records')).json()) as ServerRecord[];

export async function enrol(page: Page, yard: YardServer): Promise<void> {
  const res = await yard.admin('POST', '/enrolment-codes');
  expect(res.status).toBe(201);
  const { code } = (await res.json()) as { code: string };
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Outbox' }).click();
  await page.getByRole('heading', { level: 1, name: 'Outbox' }).waitFor();
  await textbox(page, 'Enrolment code').fill(code.toLowerCase());
  await textbox(page, 'Name for this tablet (optional)').fill('Bay 3 tablet');
  await page.getByRole('button', { name: 'Enrol this tablet' }).click();
  await page.locator('[data-enrolled="yes"]').waitFor();
}
