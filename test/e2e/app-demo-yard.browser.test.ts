// The demo yard: loaded from the empty first screen, listed with a demo marker on every seam and levels B, C,
// D and below D in words, and removed again from Settings, which leaves the first screen empty.
import { describe, expect, inject, it } from 'vitest';
import { appHeader } from './support/vitest/app-page.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

describe('the demo yard', () => {
  it('loads from the empty first screen, shows marked seams at every level, and is removed in Settings', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { page, errors } = await e2e.launch();
    await page.goto(server.origin);
    await appHeader(page).waitFor();

    await page.getByRole('heading', { name: 'Welcome to Beadbook' }).waitFor();
    await page.getByRole('button', { name: 'Load the demo yard' }).click();
    const rows = page.locator('li.seam-row');
    await rows.first().waitFor();
    const count = await rows.count();
    expect(count).toBeGreaterThanOrEqual(4);
    // Every demo seam carries the marker, in text.
    expect(await page.locator('li.seam-row .tag-demo').allTextContents()).toEqual(Array(count).fill('demo'));

    // Each seam is graded in the worker; wait until none is still "grading…".
    await expect
      .poll(() => page.locator('li.seam-row .badge').allTextContents())
      .not.toContainEqual(expect.stringContaining('grading'));
    const badges = (await page.locator('li.seam-row .badge').allTextContents()).map((t) =>
      t.replace(/\s+/g, ' '),
    );
    // The level is said in words (shape and colour only repeat it): "■✓ B — meets required C".
    const levels = new Set(badges.map((text) => /^\S* ?(B|C|D|below D) — /.exec(text)?.[1] ?? text));
    for (const level of ['B', 'C', 'D', 'below D']) expect(levels).toContain(level);
    expect(badges.some((text) => text.includes('below D — below required'))).toBe(true);

    // Settings: remove the demo data, confirmed.
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Settings' }).click();
    await page.getByRole('button', { name: 'Remove demo data' }).click();
    await page.getByRole('button', { name: 'Yes, remove demo data' }).click();
    await expect
      .poll(() => page.getByText(/^Removed \d+ demo seams\.$/).textContent())
      .toBe(`Removed ${count} demo seams.`);

    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Seams' }).click();
    await page.getByRole('heading', { name: 'Welcome to Beadbook' }).waitFor();
    expect(await rows.count()).toBe(0);
    expect(errors).toEqual([]);
  });
});
