// The app's own data offline for real (server stopped, browser offline): seams and readings made online are
// listed and graded after a reload, a new reading is entered and graded with no network (both workers come from
// the precache), it survives another reload, and everything is still there after the browser itself is closed
// and started again on the same profile.
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appHeader, waitForController } from './support/vitest/app-page.js';
import {
  createSeam,
  gaugeStatus,
  openGaugeWithToeGauge,
  saveToeAngle,
  seamBadge,
} from './support/vitest/app-flows.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

async function expectServerDown(origin: string): Promise<void> {
  await expect(fetch(`${origin}/index.html`)).rejects.toThrow();
}

/** Two seams with a toe angle each, made online on a page the service worker controls. */
async function makeSeams(page: Page, origin: string): Promise<void> {
  await page.goto(origin);
  await waitForController(page);
  await createSeam(page, { label: 'Offline seam A', thickness: 10, length: 1000 });
  await openGaugeWithToeGauge(page);
  // ISO 5817:2014 Table 1 row 1.12 (butt weld toe): B needs α ≥ 150°, so 155° meets B.
  expect(await saveToeAngle(page, 155)).toContain('level met by this reading: B');
  await createSeam(page, { label: 'Offline seam B', thickness: 10, length: 1000 });
  await openGaugeWithToeGauge(page);
  // Row 1.12: D needs α ≥ 90°, C α ≥ 110°: 105° meets D only.
  expect(await saveToeAngle(page, 105)).toContain('level met by this reading: D');
}

const seamRow = (page: Page, label: string) => page.locator('li.seam-row', { hasText: label });

/** Opens a seam from the Seams list and waits for its grade. */
async function openSeam(page: Page, label: string): Promise<void> {
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Seams' }).click();
  await seamRow(page, label).getByRole('link').click();
  await page.getByRole('heading', { level: 1, name: label }).waitFor();
  await seamBadge(page).waitFor();
}

const readingsHeading = (page: Page) => page.locator('#readings-title');
const readingTexts = (page: Page) => page.locator('ol.readings > li').allTextContents();

describe('the app offline', () => {
  it('lists, opens, grades and takes new readings with no server and no network, across reloads', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { context, page, errors } = await e2e.launch();
    await makeSeams(page, server.origin);

    await server.stop();
    await expectServerDown(server.origin);
    await context.setOffline(true);
    await page.goto(`${server.origin}/#/seams`);
    await page.reload();
    await appHeader(page).waitFor();

    // The list comes from IndexedDB, the page from the precache.
    await seamRow(page, 'Offline seam A').waitFor();
    await seamRow(page, 'Offline seam B').waitFor();
    expect(await page.locator('li.seam-row').count()).toBe(2);

    // A seam opens with its reading and its grade (graded in the worker, offline): round 1 so far is B.
    await openSeam(page, 'Offline seam A');
    expect(await readingsHeading(page).textContent()).toBe('Readings (1)');
    expect((await readingTexts(page)).join('\n')).toContain('toe angle α 155°');
    await expect
      .poll(() => page.locator('section.grade').textContent())
      .toContain('Round 1 so far: B (provisional)');

    // A new reading entered offline is checked, stored and graded: row 1.12, 120° meets C (≥ 110°), not B (≥ 150°).
    await openGaugeWithToeGauge(page);
    expect(await saveToeAngle(page, 120)).toContain('level met by this reading: C');
    expect(await gaugeStatus(page).textContent()).toContain('round 1 so far (2 readings): C');

    // Still there after another reload, still offline.
    await page.reload();
    await appHeader(page).waitFor();
    await openSeam(page, 'Offline seam A');
    expect(await readingsHeading(page).textContent()).toBe('Readings (2)');
    const texts = (await readingTexts(page)).join('\n');
    expect(texts).toContain('toe angle α 155°');
    expect(texts).toContain('toe angle α 120°');
    await expect
      .poll(() => page.locator('section.grade').textContent())
      .toContain('Round 1 so far: C (provisional)');

    expect(errors).toEqual([]);
  });

  it('keeps the seams and readings when the browser is closed and started again offline', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { context: before, page: first, errors: firstErrors, profile } = await e2e.launch();
    await makeSeams(first, server.origin);
    expect(firstErrors).toEqual([]);
    await before.close();

    await server.stop();
    await expectServerDown(server.origin);
    const { context, page, errors } = await e2e.launch({ profile });
    await context.setOffline(true);
    await page.goto(server.origin);
    await appHeader(page).waitFor();

    await seamRow(page, 'Offline seam A').waitFor();
    await seamRow(page, 'Offline seam B').waitFor();
    await openSeam(page, 'Offline seam B');
    expect(await readingsHeading(page).textContent()).toBe('Readings (1)');
    expect((await readingTexts(page)).join('\n')).toContain('toe angle α 105°');
    await expect
      .poll(() => page.locator('section.grade').textContent())
      .toContain('Round 1 so far: D (provisional)');
    expect(errors).toEqual([]);
  });
});
