// Steps through the app's screens shared by the app-*.browser tests: by keyboard (Tab until a control has the
// focus) or, where a test is not about the keyboard, with fill and click.
import type { Locator, Page } from 'playwright-core';

/** The control with focus, described for a failure message. */
function focusedText(page: Page): Promise<string> {
  return page.evaluate(() => {
    const el = document.activeElement;
    if (!el || el === document.body) return '(nothing)';
    const name = el.getAttribute('aria-label') ?? el.textContent?.trim().slice(0, 60) ?? '';
    return `<${el.tagName.toLowerCase()}> ${name}`;
  });
}

/**
 * Presses Tab (or Shift+Tab) until `target` has the focus, as a keyboard user moves through the page. Fails,
 * naming where the focus went, when the control is not reached within `max` presses.
 */
export async function tabTo(
  page: Page,
  target: Locator,
  { backwards = false, max = 150 }: { backwards?: boolean; max?: number } = {},
): Promise<void> {
  await target.waitFor({ state: 'visible' });
  for (let i = 0; i <= max; i++) {
    if (await target.evaluate((el) => el === document.activeElement)) return;
    await page.keyboard.press(backwards ? 'Shift+Tab' : 'Tab');
  }
  throw new Error(
    `${max} presses of ${backwards ? 'Shift+Tab' : 'Tab'} did not reach the control; focus is on ${await focusedText(page)}`,
  );
}

/** A text box by its label, exactly as written (number fields add their unit: "Length (mm)"). */
export const textbox = (page: Page, name: string): Locator =>
  page.getByRole('textbox', { name, exact: true });

export interface NewSeam {
  readonly label: string;
  readonly thickness: number;
  readonly length: number;
}

/** Sets up a butt seam through the New seam form (required level C, as the form starts); returns its id. */
export async function createSeam(page: Page, seam: NewSeam): Promise<string> {
  await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'New seam' }).click();
  await textbox(page, 'Label').fill(seam.label);
  await textbox(page, 'Plate 1 thickness t1 (mm)').fill(String(seam.thickness));
  await textbox(page, 'Plate 2 thickness t2 (mm)').fill(String(seam.thickness));
  await textbox(page, 'Length (mm)').fill(String(seam.length));
  await textbox(page, 'Material').fill('S355J2');
  await page.getByRole('button', { name: 'Save seam' }).click();
  await page.getByRole('heading', { level: 1, name: seam.label }).waitFor();
  return decodeURIComponent(new URL(page.url()).hash.replace('#/seam/', ''));
}

/** From the seam screen to its Gauge screen, with the toe gauge set and confirmed for the session. */
export async function openGaugeWithToeGauge(page: Page): Promise<void> {
  await page.getByRole('link', { name: 'Gauge readings' }).click();
  const id = textbox(page, 'Toe gauge id');
  const confirmed = page.getByRole('button', { name: 'Change toe gauge' });
  await id.or(confirmed).first().waitFor();
  if (await id.isVisible()) {
    await id.fill('TG-7');
    await page.getByRole('button', { name: 'Use this toe gauge' }).click();
  }
  await textbox(page, 'Toe angle α (°)').waitFor();
}

/** The status line under the reading form. */
export const gaugeStatus = (page: Page): Locator => page.locator('form.gauge-form p.gauge-status');

/** Saves a toe angle at the chosen toe and waits until the screen shows the level this reading met. */
export async function saveToeAngle(page: Page, degrees: number): Promise<string> {
  await textbox(page, 'Toe angle α (°)').fill(String(degrees));
  await page.getByRole('button', { name: /^Save reading/ }).click();
  const status = gaugeStatus(page);
  await status
    .filter({ hasText: `toe angle ${degrees}°` })
    .filter({ hasText: 'level met by this reading' })
    .waitFor();
  return (await status.textContent()) ?? '';
}

/** The grade panel's level badge on the seam screen. */
export const seamBadge = (page: Page): Locator => page.locator('section.grade .grade-badge .badge');
