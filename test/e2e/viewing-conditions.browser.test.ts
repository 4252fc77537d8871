// Viewing and lighting conditions from the tablet to the printed report, in real Chromium against the real yard
// server: the inspector records them for the round on the Seam screen (a value out of range is refused with its
// reason and nothing kept), corrects them, sends, and the supervisor's report prints the corrected ones.
import type { Page } from 'playwright-core';
import { describe, expect, inject, it } from 'vitest';
import { waitForController } from './support/vitest/app-page.js';
import { createSeam, textbox } from './support/vitest/app-flows.js';
import { useBrowser } from './support/vitest/browser-test.js';
import { signInAsSupervisor } from './support/vitest/supervisor-flows.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

const nav = (page: Page, name: string) =>
  page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name }).click();

describe('viewing conditions in Chromium', () => {
  it('are recorded and corrected on the tablet, sent, and printed in the supervisor’s report', async () => {
    const yard = await e2e.startYardServer(current.dir);
    const { page, errors, context } = await e2e.launch();
    await page.goto(yard.origin);
    await waitForController(page);
    const { code } = (await (await yard.admin('POST', '/enrolment-codes')).json()) as { code: string };
    await nav(page, 'Outbox');
    await textbox(page, 'Enrolment code').fill(code);
    await page.getByRole('button', { name: 'Enrol this tablet' }).click();
    await page.locator('[data-enrolled="yes"]').waitFor();

    const seamId = await createSeam(page, { label: 'Viewing splice', thickness: 10, length: 800 });
    await page.getByText('Not recorded yet.').waitFor();
    await page.getByRole('button', { name: 'Record the viewing conditions' }).click();
    await page.getByText('Remote (borescope, camera)').click();
    await textbox(page, 'Illuminance on the surface (lx)').fill('400');
    await textbox(page, 'Viewing angle to the surface (°)').fill('120');
    await page.getByRole('button', { name: 'Save the viewing conditions' }).click();
    await page
      .getByRole('alert')
      .getByText(/angleDeg: must be at most 90 degrees/)
      .waitFor();
    await textbox(page, 'Viewing angle to the surface (°)').fill('60');
    await textbox(page, 'Aids (optional)').fill('borescope 6 mm');
    await page.getByRole('button', { name: 'Save the viewing conditions' }).click();
    await page.getByText('remote viewing; 400 lx; angle 60°; aids: borescope 6 mm').waitFor();
    // Corrected: direct viewing after all, in better light.
    await page.getByRole('button', { name: 'Correct the viewing conditions' }).click();
    await page.getByText('Direct (eye on the surface)').click();
    await textbox(page, 'Illuminance on the surface (lx)').fill('700');
    await textbox(page, 'Viewing distance (mm)').fill('350');
    await textbox(page, 'Lighting (optional)').fill('hand lamp');
    await page.getByRole('button', { name: 'Save the viewing conditions' }).click();
    const corrected =
      'direct viewing; 700 lx; distance 350 mm; angle 60°; lighting: hand lamp; aids: borescope 6 mm';
    await page.getByText(corrected).waitFor();

    await nav(page, 'Outbox');
    // The Outbox screen shows "Loading…" until it has read the outbox: count once the list is there (the seam
    // set-up, its first round and the two viewing records).
    await expect.poll(() => page.locator('.outbox-count').textContent()).toBe('4');
    expect(await page.getByText('Viewing conditions').count()).toBe(2);
    await page.getByRole('button', { name: 'Send now' }).click();
    await expect.poll(() => page.locator('.outbox-count').textContent(), { timeout: 30_000 }).toBe('0');
    await yard.admin('POST', '/regrade/wait');

    expect(errors).toEqual([]);

    const desk = await context.newPage();
    await signInAsSupervisor(desk, yard.origin);
    await desk.goto(`${yard.origin}/supervisor/review/report?seam=${encodeURIComponent(seamId)}`);
    const viewing = desk.locator('ul.viewing li');
    expect(await viewing.count()).toBe(1);
    expect((await viewing.first().textContent())?.replace(/\s+/g, ' ')).toContain(
      `Round 1: First inspection: ${corrected}.`,
    );
    expect((await viewing.first().textContent())?.replace(/\s+/g, ' ')).toContain('corrected 1 time(s)');
  });
});
