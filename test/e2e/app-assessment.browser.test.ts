// The seam screen's fatigue assessment, from the worker's reply to the page: the invented demo yard's deck
// splice shows km, the crack-site ranking, the fatigue-class flag with the caution, the charts and the advice on
// how many positions to measure; an engineer's choice of detail is saved and graded again.
import { describe, expect, inject, it } from 'vitest';
import { INDICATIVE_CAUTION } from '../../src/domain/caution.js';
import { appHeader } from './support/vitest/app-page.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

describe('the fatigue assessment on the seam screen', () => {
  it('shows km, the crack-site ranking, the flag with the caution and the sampling advice; saves a chosen detail', async () => {
    const server = await e2e.serveStatic(current.dir);
    const { page, errors } = await e2e.launch();
    await page.goto(server.origin);
    await appHeader(page).waitFor();

    await page.getByRole('button', { name: 'Load the demo yard' }).click();
    await page.getByRole('link', { name: /Deck splice 14/ }).click();
    const panel = page.getByRole('region', { name: 'Fatigue assessment (indicative)' });
    await panel.waitFor();

    // km: 1 + 3e/t with e = 0.6 mm on 12 mm plates (misalignment reference §2.1), beside what the class covers.
    await panel.getByText('km 1.15; after what the class already covers, km,eff 1.').waitFor();
    await panel.getByText(/^Most likely crack site: plate 1 face-side toe at \d+ mm/).waitFor();
    const ranking = await panel.locator('ol.toe-ranking > li').allTextContents();
    expect(ranking[0]).toMatch(/^plate 1 face-side toe at .*secondary bending in tension/);

    const flag = panel.locator('p.fat-flag');
    expect(await flag.textContent()).toMatch(
      /✓\s*Meets the required fatigue class \(indicative\)\. FAT equivalent/,
    );
    expect(await panel.getByRole('complementary', { name: 'Caution' }).textContent()).toContain(
      INDICATIVE_CAUTION,
    );
    await panel.getByText(/^About [\d.]+ million cycles at a stress range of 45 MPa/).waitFor();

    // The charts are drawn and described in words.
    const bars = panel.getByRole('img', {
      name: /^What drives the life, largest first: 1\. linear misalignment/,
    });
    await bars.waitFor();
    await panel
      .getByRole('img', { name: /^toe angle, plate 1 face-side toe: running mean over 6 positions/ })
      .waitFor();
    await panel
      .getByText(/toe angle, plate 1 face-side toe: 6 positions, .*measure about \d+ more positions/)
      .waitFor();

    // An engineer's choice of detail is saved with the set-up and the seam graded again.
    await panel.getByLabel(/^Detail class/).selectOption('215');
    await panel.getByText(/^Detail 215: /).waitFor();
    await panel.getByText('Why: detail 215 chosen by an engineer').waitFor();
    await page.reload();
    await page
      .getByRole('region', { name: 'Fatigue assessment (indicative)' })
      .getByText(/^Detail 215: /)
      .waitFor();
    expect(errors).toEqual([]);
  });
});
