// The Import screen's long-file controls and its memory: a 40 MB table shows its progress and is cancelled
// mid-read with nothing stored; a mapping changed by hand is saved for that column layout, so the next file from
// the same scanner maps itself.
import { readFileSync, statSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { ROOT } from './support/paths.js';
import { waitForController } from './support/vitest/app-page.js';
import { createSeam, seamBadge } from './support/vitest/app-flows.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');
const TABLE = readFileSync(join(ROOT, 'test/fixtures/import/line3-scan.csv'));

const e2e = useBrowser();

async function openImport(page: Page): Promise<void> {
  await page.getByRole('link', { name: 'Import scanner file' }).click();
  await page.getByRole('heading', { level: 1, name: 'Import a scanner file' }).waitFor();
}

const holds = (page: Page, n: number, name: string) =>
  page.getByRole('combobox', { name: `Column ${n} (${name}) holds` });

describe('Import screen: cancel and saved mappings', () => {
  it('cancels a long read with nothing stored, and maps the next file from the saved profile', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { page, errors } = await e2e.launch();
    await page.goto(server.origin);
    await waitForController(page);
    await createSeam(page, { label: 'Long seam', thickness: 10, length: 1000 });

    // 40 MB of rows, each beyond the 1000 mm seam: every row is read and set aside, so the read takes a while.
    const big = join(await e2e.scratchDir('beadbook-e2e-import-'), 'long.csv');
    const row = '5000;150,0;149,0;1,0;1,0;2,0;14,0;0,0;0,4\n';
    writeFileSync(
      big,
      `Position [mm];Angle L [deg];Angle R [deg];Radius L [mm];Radius R [mm];Height [mm];Width [mm];Undercut L [mm];Offset [mm]\n${row.repeat(Math.ceil(40e6 / row.length))}`,
    );
    await openImport(page);
    await page.locator('input[type=file]').setInputFiles(big);
    await page.getByRole('heading', { name: 'Columns of long.csv' }).waitFor();
    await page.getByRole('button', { name: 'Read the file' }).click();
    await page.getByRole('heading', { name: 'Reading long.csv…' }).waitFor();
    expect(await page.getByRole('progressbar', { name: 'Read so far' }).getAttribute('max')).toBe(
      String(statSync(big).size),
    );
    await page.getByRole('button', { name: 'Cancel' }).click();
    await page.locator('input[type=file]').waitFor();
    expect(await page.getByRole('heading', { name: 'Reading long.csv…' }).count()).toBe(0);

    // The small table, with the offset column left out by hand; imported.
    await page
      .locator('input[type=file]')
      .setInputFiles({ name: 'a.csv', mimeType: 'text/csv', buffer: TABLE });
    await page.getByRole('heading', { name: 'Columns of a.csv' }).waitFor();
    expect(await page.getByText('Mapped from the column names').count()).toBe(1);
    await holds(page, 9, 'Offset [mm]').selectOption('');
    await page.getByRole('button', { name: 'Read the file' }).click();
    await page.getByRole('button', { name: 'Import 9 readings, leave 2 rows out' }).click();
    await page.getByRole('heading', { name: 'Imported 9 readings' }).waitFor();
    await page.getByRole('button', { name: 'See the graded seam' }).click();
    await seamBadge(page).waitFor();
    // Only the small file's readings: the cancelled read stored nothing.
    expect(await page.locator('#readings-title').textContent()).toBe('Readings (9)');

    // The next file with the same columns maps itself from the saved profile, the hand change included.
    await openImport(page);
    await page
      .locator('input[type=file]')
      .setInputFiles({ name: 'b.csv', mimeType: 'text/csv', buffer: TABLE });
    await page.getByRole('heading', { name: 'Columns of b.csv' }).waitFor();
    expect(await page.getByText('Mapped from the profile saved for this scanner’s columns.').count()).toBe(1);
    expect(await holds(page, 9, 'Offset [mm]').inputValue()).toBe('');
    expect(await holds(page, 2, 'Angle L [deg]').inputValue()).toBe('plate1.toeAngle');

    expect(errors).toEqual([]);
  });
});
