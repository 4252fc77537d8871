// The supervisor's review in real Chromium against the real yard server: a tablet enrols and sends a seam; the
// supervisor signs in, filters the queue, opens the seam and sends it back for rework; the tablet pulls the
// decision, shows it on the Seams list and on the seam (with round 2 opened) until seen; the readings export
// holds the tablet's values; and the printed report, saved as PDF by Chromium, carries the seam's level, the
// decision and the caution in the text poppler's pdftotext extracts from it.
import { execFile } from 'node:child_process';
import { readFile } from 'node:fs/promises';
import { join } from 'node:path';
import { promisify } from 'node:util';
import Papa from 'papaparse';
import type { Page } from 'playwright-core';
import { describe, expect, inject, it } from 'vitest';
import { INDICATIVE_CAUTION } from '../../src/domain/index.js';
import { uuidv7 } from '../../src/store/ids.js';
import { bodies, testSeam, toeReading } from '../server/records.js';
import { SimDevice } from '../server/sim-device.js';
import { completeChecklist } from '../support/seam-builder.js';
import { collectPageErrors } from './support/chromium.js';
import { waitForController } from './support/vitest/app-page.js';
import { createSeam, openGaugeWithToeGauge, saveToeAngle, textbox } from './support/vitest/app-flows.js';
import type { YardServer } from './support/vitest/yard-server.js';
import { useBrowser } from './support/vitest/browser-test.js';
import { signInAsSupervisor } from './support/vitest/supervisor-flows.js';

const { current } = inject('e2eBuilds');
const run = promisify(execFile);

const e2e = useBrowser();

const nav = (page: Page, name: string) =>
  page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name }).click();

async function enrol(page: Page, yard: YardServer): Promise<void> {
  const { code } = (await (await yard.admin('POST', '/enrolment-codes')).json()) as { code: string };
  await nav(page, 'Outbox');
  await textbox(page, 'Enrolment code').fill(code);
  await textbox(page, 'Name for this tablet (optional)').fill('Bay 5 tablet');
  await page.getByRole('button', { name: 'Enrol this tablet' }).click();
  await page.locator('[data-enrolled="yes"]').waitFor();
}

/** A simulated tablet sends a complete seam at level D (C required) over real HTTP. */
async function seedGradedSeam(yard: YardServer): Promise<string> {
  const http = { request: (path: string, init?: RequestInit) => fetch(`${yard.origin}${path}`, init) };
  const { code } = (await (await yard.admin('POST', '/enrolment-codes')).json()) as { code: string };
  const device = await SimDevice.create();
  expect((await device.enrol(http, code, 'Sim tablet')).status).toBe(201);
  const seam = testSeam(uuidv7(), { label: 'Report splice', welder: 'W-77', drawing: 'D-77' });
  device.add('seamSetup', uuidv7(), bodies.seamSetup(seam));
  device.add('round', uuidv7(), {
    ...bodies.round(seam.id),
    examiner: { name: 'R. Ode', qualification: 'VT 2' },
  });
  for (const item of Object.keys(completeChecklist()))
    device.add('checklistAnswer', uuidv7(), bodies.answer(seam.id, item, 'noneFound'));
  // ISO 5817:2014 row 1.12: 100° meets D (≥ 90°), not C (≥ 110°).
  const r = toeReading(seam.id, 100, { examiner: { name: 'R. Ode', qualification: 'VT 2' } });
  device.add('reading', r.id, bodies.reading(r));
  expect((await device.send(http, await device.seal())).status).toBe(200);
  return seam.id;
}

describe('supervisor review in Chromium', () => {
  it('signs in, filters, decides; the tablet pulls and shows the decision; CSV and a PDF report carry the results', async () => {
    const yard = await e2e.startYardServer(current.dir);
    const scratch = await e2e.scratchDir('beadbook-review-');
    const { context, page: tablet, errors: tabletErrors } = await e2e.launch();
    await tablet.goto(yard.origin);
    await waitForController(tablet);
    await enrol(tablet, yard);
    await createSeam(tablet, { label: 'Review splice', thickness: 10, length: 1000 });
    await openGaugeWithToeGauge(tablet);
    await saveToeAngle(tablet, 120);
    await saveToeAngle(tablet, 155);
    await nav(tablet, 'Outbox');
    await tablet.getByRole('button', { name: 'Send now' }).click();
    await expect.poll(() => tablet.locator('.outbox-count').textContent(), { timeout: 30_000 }).toBe('0');
    const graded = await seedGradedSeam(yard);
    await yard.admin('POST', '/regrade/wait');

    // The supervisor signs in, filters the queue and opens the tablet's seam.
    const desk = await context.newPage();
    const deskErrors = collectPageErrors(desk);
    await signInAsSupervisor(desk, yard.origin);
    expect(await desk.locator('[data-flag="unreviewed"]').textContent()).toBe('(2)');
    await desk.getByLabel('Welder').selectOption('W-77');
    await desk.getByRole('button', { name: 'Apply' }).click();
    await expect.poll(() => desk.locator('table.queue tbody tr').count()).toBe(1);
    expect(await desk.locator('table.queue tbody').textContent()).toContain('Report splice');
    await desk.getByRole('link', { name: 'Clear' }).click();
    await desk.getByRole('checkbox', { name: /Not yet reviewed/ }).check();
    await desk.getByLabel('Label, id or tag').fill('review splice');
    await desk.getByRole('button', { name: 'Apply' }).click();
    await desk.getByRole('link', { name: 'Review splice' }).click();
    await desk.getByRole('heading', { level: 1, name: 'Review splice' }).waitFor();
    expect(await desk.locator('table.batches').textContent()).toContain('✔ verified');
    expect(await desk.locator('table.batches').textContent()).toContain('Bay 5 tablet');
    await desk.getByRole('radio', { name: /Sent back for rework/ }).check();
    await desk.getByLabel(/Comment/).fill('Dress the toe at 100 mm, then gauge again');
    await desk.getByRole('button', { name: 'Record the decision' }).click();
    await desk.getByText('Recorded: Sent back for rework.').waitFor();

    // The tablet pulls after its next send pass and shows the decision until the inspector has seen it.
    await tablet.getByRole('button', { name: 'Send now' }).click();
    await nav(tablet, 'Seams');
    const row = tablet.locator('li.seam-row', { hasText: 'Review splice' });
    await row.locator('.seam-decision').waitFor({ timeout: 30_000 });
    expect(await row.locator('.seam-decision').textContent()).toContain('Sent back for rework (round 1)');
    await row.getByRole('link').click();
    await tablet.getByRole('heading', { level: 2, name: "Supervisor's decisions" }).waitFor();
    expect(await tablet.locator('section.decisions').textContent()).toContain(
      '“Dress the toe at 100 mm, then gauge again”',
    );
    await tablet.getByRole('button', { name: /Round 2 · After repair/ }).waitFor();
    await nav(tablet, 'Seams');
    await tablet.locator('li.seam-row', { hasText: 'Review splice' }).waitFor();
    expect(
      await tablet.locator('li.seam-row', { hasText: 'Review splice' }).locator('.seam-decision').count(),
    ).toBe(0);

    // The readings export holds the tablet's two toe angles, with units in the headers.
    const [download] = await Promise.all([
      desk.waitForEvent('download'),
      desk.getByRole('link', { name: 'Readings (CSV)' }).click(),
    ]);
    const csvPath = join(scratch, 'readings.csv');
    await download.saveAs(csvPath);
    const csv = Papa.parse<Record<string, string>>(await readFile(csvPath, 'utf8'), {
      header: true,
      skipEmptyLines: true,
    });
    expect(csv.meta.fields).toContain('toeAngle (deg)');
    expect(csv.data.map((r) => r['toeAngle (deg)']).sort()).toEqual(['120', '155']);
    expect(new Set(csv.data.map((r) => r['device name']))).toEqual(new Set(['Bay 5 tablet']));

    // The report of the graded seam, decided, printed to PDF by Chromium and read back with pdftotext.
    await yard.admin('POST', '/decisions', {
      seamId: graded,
      round: 1,
      outcome: 'accepted',
      comment: 'Accepted at D by concession',
    });
    await desk.goto(`${yard.origin}/supervisor/review/report?seam=${graded}`);
    await desk.locator('article.report').waitFor();
    const pdfPath = join(scratch, 'report.pdf');
    await desk.pdf({ path: pdfPath, format: 'A4', printBackground: true, preferCSSPageSize: true });
    const { stdout } = await run('pdftotext', ['-layout', pdfPath, '-']);
    // pdftotext breaks lines where the page did: join them again (a hyphen at a line end stays a hyphen).
    const norm = (t: string) => t.replace(/\s+/g, ' ').replace(/- /g, '-');
    const text = norm(stdout);
    expect(text).toContain('Report splice');
    expect(text).toMatch(/Quality level met: \S* ?D \(C required\)/);
    expect(text).toContain('Decision: Accepted on round 1 by supervisor');
    expect(text).toContain(norm(INDICATIVE_CAUTION));
    expect(text).toContain('Quality levels are graded against ISO 5817 limits');
    expect(text).toMatch(/Page 1 of \d+/);
    expect(tabletErrors).toEqual([]);
    expect(deskErrors).toEqual([]);
  });
});
