// Import in the browser, offline (server stopped, browser offline): a parameter table is picked, mapped from its
// column names, read in the import worker, its set-aside rows shown with their reasons before anything is stored,
// then imported and graded on the seam screen; then a raw profile file the same way.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { ROOT } from './support/paths.js';
import { appHeader, waitForController } from './support/vitest/app-page.js';
import { createSeam, seamBadge } from './support/vitest/app-flows.js';
import { weldProfile } from '../support/weld-profile.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

function profileFile(): Buffer {
  const lines = ['slice_mm,x_mm,z_mm'];
  for (const [position, shape] of [
    [200, { height: 2, flank: 30, toeRadius: 1, spacing: 0.05 }],
    [210, { height: 1.6, flank: 25, toeRadius: 1.5, spacing: 0.05 }],
  ] as const) {
    const { x, z } = weldProfile(shape);
    for (let i = 0; i < x.length; i++)
      lines.push(`${position},${(x[i] ?? 0).toFixed(4)},${(z[i] ?? 0).toFixed(5)}`);
  }
  return Buffer.from(`${lines.join('\n')}\n`);
}

async function openImport(page: Page): Promise<void> {
  await page.getByRole('link', { name: 'Import scanner file' }).click();
  await page.getByRole('heading', { level: 1, name: 'Import a scanner file' }).waitFor();
}

describe('scanner import in the browser', () => {
  it('imports a parameter table and a raw profile file offline, and the seam grades them', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { context, page, errors } = await e2e.launch();
    await page.goto(server.origin);
    await waitForController(page);
    await createSeam(page, { label: 'Scanned seam', thickness: 10, length: 1000 });
    const seamUrl = page.url();

    await server.stop();
    await context.setOffline(true);
    await page.goto(seamUrl);
    await page.reload();
    await appHeader(page).waitFor();
    await page.getByRole('heading', { level: 1, name: 'Scanned seam' }).waitFor();

    // The parameter table: five rows, one with NaN and one with a negative radius.
    await openImport(page);
    await page.locator('input[type=file]').setInputFiles({
      name: 'line3-scan.csv',
      mimeType: 'text/csv',
      buffer: readFileSync(join(ROOT, 'test/fixtures/import/line3-scan.csv')),
    });
    await page.getByRole('heading', { name: 'Columns of line3-scan.csv' }).waitFor();
    expect(await page.getByRole('combobox', { name: 'Column 2 (Angle L [deg]) holds' }).inputValue()).toBe(
      'plate1.toeAngle',
    );
    await page.getByRole('button', { name: 'Read the file' }).click();
    const summary = page.locator('p.read-summary');
    await summary.waitFor();
    expect(await summary.textContent()).toBe('9 readings ready from 5 rows; 2 rows set aside.');
    const reasons = await page.locator('ul.quarantine li').allTextContents();
    expect(reasons).toEqual([
      'Line 5: "Angle L [deg]": holds "NaN": the scanner found no value',
      'Line 6: "Radius R [mm]": toeRadius -0.2 mm must be greater than 0 mm',
    ]);
    await page.getByRole('button', { name: 'Import 9 readings, leave 2 rows out' }).click();
    await page.getByRole('heading', { name: 'Imported 9 readings' }).waitFor();
    await page.getByRole('button', { name: 'See the graded seam' }).click();
    await page.getByRole('heading', { level: 1, name: 'Scanned seam' }).waitFor();
    await seamBadge(page).waitFor();
    expect(await page.locator('#readings-title').textContent()).toBe('Readings (9)');
    expect((await page.locator('ol.readings > li').allTextContents()).join('\n')).toContain('imported');
    await expect
      .poll(() => page.locator('section.grade').textContent())
      .toMatch(/Round 1 so far: (B|C|D|below D)/);

    // The raw profiles: two slices, each two readings.
    await openImport(page);
    await page.getByRole('radio', { name: /Raw profiles/ }).check();
    await page
      .locator('input[type=file]')
      .setInputFiles({ name: 'profiles.csv', mimeType: 'text/csv', buffer: profileFile() });
    await summary.waitFor();
    expect(await summary.textContent()).toBe('4 readings ready from 2 slices; 0 slices set aside.');
    await page.getByRole('button', { name: 'Import 4 readings' }).click();
    await page.getByRole('heading', { name: 'Imported 4 readings' }).waitFor();
    await page.getByRole('button', { name: 'See the graded seam' }).click();
    await seamBadge(page).waitFor();
    await expect.poll(() => page.locator('#readings-title').textContent()).toBe('Readings (13)');

    expect(errors).toEqual([]);
  });
});
