// A seam set up and gauged with the keyboard alone (Tab, Shift+Tab, Enter, Space and typing; no pointer): the
// examiner named in Settings, the New seam form, the instrument confirmed, a toe angle and an undercut at a chosen toe saved, each reading's
// level shown, then the checklist answered on the seam screen, which takes the seam from "incomplete" to its
// level. Expected levels are worked out from ISO 5817:2014 Table 1 beside each assertion.
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { appHeader } from './support/vitest/app-page.js';
import { gaugeStatus, seamBadge, tabTo, textbox } from './support/vitest/app-flows.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

const CHECKLIST = [
  'Cracks',
  'Crater cracks',
  'Lack of fusion (visible)',
  'Burn-through',
  'Surface pores or porosity',
  'Root porosity',
  'Poor restart',
  'Stray arc strikes',
  'Spatter',
  'Temper colour',
];

/** Tabs to a text box and types into it, as a keyboard user fills a form. */
async function typeInto(page: Page, label: string, text: string): Promise<void> {
  await tabTo(page, textbox(page, label));
  await page.keyboard.type(text);
}

describe('gauging by keyboard only', () => {
  it('sets up a seam, saves a toe angle and an undercut, answers the checklist and shows the levels', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { page, errors } = await e2e.launch();
    await page.goto(server.origin);
    await appHeader(page).waitFor();
    await page.getByRole('heading', { name: 'Welcome to Beadbook' }).waitFor();

    // Settings: who inspects on this device, signed on every reading from now on.
    await tabTo(
      page,
      page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Settings' }),
    );
    await page.keyboard.press('Enter');
    await typeInto(page, 'Name (optional)', 'R. Okafor');
    await typeInto(page, 'Qualification (optional)', 'VT level 2');
    await page.keyboard.press('Enter');
    await page.getByText('Saved: readings from now on are signed R. Okafor (VT level 2).').waitFor();

    // The New seam form: a butt joint of 10 mm plates, 1000 mm long; the form asks level C by default.
    await tabTo(
      page,
      page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'New seam' }),
    );
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: 'Set up a seam' }).waitFor();
    await typeInto(page, 'Label', 'Keyboard seam K1');
    await typeInto(page, 'Plate 1 thickness t1 (mm)', '10');
    await typeInto(page, 'Plate 2 thickness t2 (mm)', '10');
    await typeInto(page, 'Length (mm)', '1000');
    await typeInto(page, 'Material', 'S355J2');
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: 'Keyboard seam K1' }).waitFor();

    // To the Gauge screen, and the toe gauge confirmed for the session (Enter in its id field confirms it).
    await tabTo(page, page.getByRole('link', { name: 'Gauge readings' }));
    await page.keyboard.press('Enter');
    await typeInto(page, 'Toe gauge id', 'TG-7');
    await page.keyboard.press('Enter');
    await expect
      .poll(() => page.locator('.gauge-instrument-summary').textContent())
      .toContain('Toe gauge TG-7');

    // A toe angle of 105° at the toe the screen starts on (plate 1, face side), saved with Enter.
    const toeAngle = textbox(page, 'Toe angle α (°)');
    await tabTo(page, toeAngle);
    await page.keyboard.type('105');
    await page.keyboard.press('Enter');
    const status = gaugeStatus(page);
    await status.filter({ hasText: 'level met by this reading' }).waitFor();
    // ISO 5817:2014 Table 1 row 1.12 (incorrect weld toe, butt weld): D needs α ≥ 90°, C needs α ≥ 110°, so
    // 105° meets D and not C; the seam asks C.
    expect(await status.textContent()).toContain('toe angle 105°');
    expect(await status.textContent()).toContain('level met by this reading: D');
    const result = page.locator('section.gauge-result');
    const toeRow = result.locator('li.gauge-imperfection', { hasText: 'row 1.12' });
    expect(await toeRow.locator('.badge').textContent()).toContain('D — below required C');
    expect(await page.locator('p.gauge-last .badge').textContent()).toContain('D — below required C');

    // The depth gauge for an undercut: chosen with Space, confirmed with Enter.
    await tabTo(page, page.getByRole('button', { name: /^Depth gauge/ }), { backwards: true });
    await page.keyboard.press('Space');
    await typeInto(page, 'Depth gauge id', 'DG-2');
    await page.keyboard.press('Enter');
    const undercut = textbox(page, 'Undercut depth h (mm)');
    await undercut.waitFor();
    // The undercut sits at the toe on plate 2, face side: picked on the drawing's buttons with Space.
    await tabTo(page, page.getByRole('button', { name: 'Plate 2, face side' }), { backwards: true });
    await page.keyboard.press('Space');
    expect(await page.getByRole('button', { name: 'Plate 2, face side' }).getAttribute('aria-pressed')).toBe(
      'true',
    );
    await tabTo(page, undercut);
    await page.keyboard.type('0.7');
    await page.keyboard.press('Enter');
    await status
      .filter({ hasText: 'undercut depth 0.7 mm' })
      .filter({ hasText: 'level met by this reading' })
      .waitFor();
    // ISO 5817:2014 Table 1 row 1.7 (undercut), t = 10 mm > 3 mm: C allows h ≤ 0.1·t, max 0.5 mm (= 0.5 mm);
    // D allows h ≤ 0.2·t, max 1 mm (= 1 mm); so 0.7 mm meets D and not C.
    expect(await status.textContent()).toContain('plate 2, face side');
    expect(await status.textContent()).toContain('level met by this reading: D');
    const undercutRow = result.locator('li.gauge-imperfection', { hasText: 'row 1.7' });
    expect(await undercutRow.locator('.badge').textContent()).toContain('D — below required C');

    // The seam screen: graded D so far, but incomplete while the checklist is open.
    await tabTo(page, page.getByRole('link', { name: '← Back to the seam' }), { backwards: true });
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { level: 1, name: 'Keyboard seam K1' }).waitFor();
    await expect.poll(() => seamBadge(page).textContent()).toContain('incomplete');
    expect(await page.locator('section.grade p.incomplete').textContent()).toContain(
      'Round 1 so far: D (provisional), 10 checklist items still to answer',
    );

    // Every checklist item answered "None found", each with Space on its button.
    for (const label of CHECKLIST) {
      const item = page.getByRole('listitem', { name: new RegExp(`^${label.replace(/[()]/g, '\\$&')}`) });
      await tabTo(page, item.getByRole('button', { name: 'None found' }));
      await page.keyboard.press('Space');
      await expect.poll(() => item.locator('.cl-answer').textContent()).toContain('None found');
    }

    // Complete: the seam meets D, the worse of its two readings (both D above), below the required C.
    await expect.poll(() => seamBadge(page).textContent()).toContain('D — below required C');
    expect(await page.locator('section.grade').textContent()).toContain(
      'Graded from round 1: level met D, required C — does not meet it.',
    );
    expect(await page.locator('#round-tab-1 .tab-state').textContent()).toBe(
      'complete, level D, below required',
    );

    // Both readings are listed with the examiner named in Settings.
    const listed = await page.locator('ol.readings > li').allTextContents();
    expect(listed).toHaveLength(2);
    for (const text of listed) expect(text).toContain('R. Okafor');

    // And the Seams list shows the same level.
    await tabTo(page, page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Seams' }));
    await page.keyboard.press('Enter');
    const row = page.locator('li.seam-row', { hasText: 'Keyboard seam K1' });
    await expect.poll(() => row.locator('.badge').textContent()).toContain('D — below required C');

    expect(errors).toEqual([]);
  });
});
