// Scanning tags in real Chromium with a fake rear camera playing a video the test makes (a QR tag on a plain
// grey background, written as Y4M): the decoder worker is fetched only on the first scan; a scanned tag is
// linked to a seam, then opens it from the Seams screen; scanning it from another seam shows both seams and
// changes nothing until the move is confirmed. Tag text with markup and script renders as text.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { describe, expect, inject, it } from 'vitest';
import type { Page } from 'playwright-core';
import { drawSymbol, onBackground } from '../support/barcode-images.js';
import { bmpOf } from '../support/bmp.js';
import { writeY4m } from '../support/y4m.js';
import { eagerChunks, readBuildManifest } from './support/build-app.js';
import { appHeader } from './support/vitest/app-page.js';
import { createSeam, textbox } from './support/vitest/app-flows.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');
const TAG = 'KP-E2E-0417';

const e2e = useBrowser();

/** A 1280 × 720 video of the tag as a QR code (8 px modules, 4-module quiet zone) on a plain grey ground. */
async function tagVideo(): Promise<string> {
  const file = join(await e2e.scratchDir('beadbook-camera-'), 'tag.y4m');
  await writeY4m(file, onBackground(drawSymbol('qr', TAG, 8), 1280, 720, 170));
  return file;
}

async function openApp(options: {
  camera: boolean;
}): Promise<{ origin: string; page: Page; errors: string[]; decoderRequests: string[] }> {
  const server = await e2e.serveStatic(current.dir);
  const { page, errors } = await e2e.launch(options.camera ? { fakeCameraFile: await tagVideo() } : {});
  const decoderRequests: string[] = [];
  // The page's own requests (the worker script included), not the service worker's precache downloads.
  page.on('request', (r) => {
    if (r.url().includes('tag-decode.worker')) decoderRequests.push(r.url());
  });
  await page.goto(server.origin);
  await appHeader(page).waitFor();
  return { origin: server.origin, page, errors, decoderRequests };
}

const seamHeading = (page: Page, label: string) => page.getByRole('heading', { level: 1, name: label });

describe('tag scanning with the camera', () => {
  it('links a scanned tag, opens its seam from the Seams screen, and loads the decoder only on the first scan', async () => {
    const { origin, page, errors, decoderRequests } = await openApp({ camera: true });
    const seamA = await createSeam(page, { label: 'Deck seam A', thickness: 12, length: 800 });
    await createSeam(page, { label: 'Deck seam B', thickness: 12, length: 800 });
    // Nothing has scanned yet: the decoder is not fetched.
    expect(decoderRequests).toEqual([]);

    await page.goto(`${origin}/#/seam/${encodeURIComponent(seamA)}`);
    await page.getByRole('link', { name: 'Scan a tag for this seam' }).click();
    await page.getByRole('heading', { name: 'New tag' }).waitFor();
    expect(decoderRequests.length).toBeGreaterThan(0);
    expect(await page.locator('.tag-result .tag-text').textContent()).toBe(TAG);
    await page.getByRole('button', { name: 'Add this tag to Deck seam A' }).click();
    await seamHeading(page, 'Deck seam A').waitFor();
    expect(await page.locator('.linked-tag-list .tag-text').allTextContents()).toEqual([TAG]);

    // From the Seams screen, the camera reads the tag and its seam opens.
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Seams' }).click();
    await page.getByRole('link', { name: 'Scan tag' }).click();
    await seamHeading(page, 'Deck seam A').waitFor();
    expect(decodeURIComponent(new URL(page.url()).hash)).toBe(`#/seam/${seamA}`);

    // The worker file is fetched by the page only now, and is no part of what the first paint loads.
    const eager = eagerChunks(readBuildManifest(current.dir)).map((c) => c.file);
    const workerFile = new URL(decoderRequests[0] ?? '').pathname.slice(1);
    expect(eager).not.toContain(workerFile);
    const gzip = gzipSync(readFileSync(join(current.dir, workerFile)), { level: 9 }).length;
    console.log(`decoder worker ${workerFile}: ${gzip} bytes gzipped`);
    expect(gzip).toBeGreaterThan(0);
    expect(errors).toEqual([]);
  });

  it('shows both seams for a tag of another seam and moves it only on confirmation', async () => {
    const { origin, page, errors } = await openApp({ camera: true });
    const seamA = await createSeam(page, { label: 'Tank shell A', thickness: 10, length: 600 });
    const seamB = await createSeam(page, { label: 'Tank shell B', thickness: 10, length: 600 });

    // Seam A gets the tag (typed: the screen stops the camera for typed input).
    await page.goto(`${origin}/#/tag/${encodeURIComponent(seamA)}`);
    await textbox(page, 'Or type the tag').fill(TAG);
    await page.getByRole('button', { name: 'Find tag' }).click();
    await page.getByRole('button', { name: 'Add this tag to Tank shell A' }).click();
    await seamHeading(page, 'Tank shell A').waitFor();

    // From seam B the camera reads the same tag: both seams are named, nothing moves.
    await page.goto(`${origin}/#/seam/${encodeURIComponent(seamB)}`);
    await page.getByRole('link', { name: 'Scan a tag for this seam' }).click();
    const conflict = page.locator('.tag-conflict');
    await conflict.waitFor();
    expect(await conflict.getByRole('heading').textContent()).toBe('This tag belongs to another seam');
    const text = (await conflict.textContent()) ?? '';
    expect(text).toContain('Tank shell A');
    expect(text).toContain('Tank shell B');
    expect(text).toContain('Nothing has been changed');
    // Still on the Tag screen for seam B, and seam A still holds the tag.
    expect(decodeURIComponent(new URL(page.url()).hash)).toBe(`#/tag/${seamB}`);
    await page.goto(`${origin}/#/seam/${encodeURIComponent(seamA)}`);
    await seamHeading(page, 'Tank shell A').waitFor();
    await expect.poll(() => page.locator('.linked-tag-list .tag-text').allTextContents()).toEqual([TAG]);

    // Confirmed: the tag moves from A to B.
    await page.goto(`${origin}/#/tag/${encodeURIComponent(seamB)}`);
    await page.getByRole('button', { name: 'Move the tag from Tank shell A to Tank shell B' }).click();
    await seamHeading(page, 'Tank shell B').waitFor();
    await expect.poll(() => page.locator('.linked-tag-list .tag-text').allTextContents()).toEqual([TAG]);
    await page.goto(`${origin}/#/seam/${encodeURIComponent(seamA)}`);
    await seamHeading(page, 'Tank shell A').waitFor();
    await page.getByText('Linked tags: none').waitFor();
    expect(errors).toEqual([]);
  });
});

describe('a photo of the tag', () => {
  it('reads a Data Matrix from a chosen photo when there is no camera, and opens its seam', async () => {
    const { origin, page, errors } = await openApp({ camera: false });
    const seam = await createSeam(page, { label: 'Bracket seam P', thickness: 8, length: 300 });
    await page.goto(`${origin}/#/tag/${encodeURIComponent(seam)}`);
    await textbox(page, 'Or type the tag').fill('Naht-ä-7');
    await page.getByRole('button', { name: 'Find tag' }).click();
    await page.getByRole('button', { name: 'Add this tag to Bracket seam P' }).click();
    await seamHeading(page, 'Bracket seam P').waitFor();

    // A 1600 × 1200 "photo": the tag as a Data Matrix (UTF-8 bytes), light on dark.
    const symbol = drawSymbol('dataMatrix', 'Naht-ä-7', 12);
    const photo = onBackground(symbol, 1600, 1200, 255);
    for (let i = 0; i < photo.data.length; i++) photo.data[i] = 255 - (photo.data[i] as number);
    await page.goto(`${origin}/#/tag`);
    await page.getByLabel('Read a photo of the tag').setInputFiles({
      name: 'tag.bmp',
      mimeType: 'image/bmp',
      buffer: bmpOf(photo),
    });
    await seamHeading(page, 'Bracket seam P').waitFor();
    expect(errors).toEqual([]);
  });
});

describe('tag text is data', () => {
  const PAYLOADS = [
    `<img src=x onerror="window.__xss=1">`,
    `"><script>window.__xss=2</script>`,
    `javascript:window.__xss=3`,
    `'; DROP TABLE seams;--`,
    `<svg onload=window.__xss=4>`,
  ];

  it('renders injection payloads as text on the Tag screen, the seam and in search', async () => {
    // No camera here: the screen says so and typing still works.
    const { origin, page, errors } = await openApp({ camera: false });
    const seam = await createSeam(page, { label: 'Frame seam X', thickness: 8, length: 400 });
    await page.goto(`${origin}/#/tag/${encodeURIComponent(seam)}`);
    await page
      .locator('.scan-status')
      .filter({ hasText: /camera/i })
      .waitFor();
    for (const payload of PAYLOADS) {
      await textbox(page, 'Or type the tag').fill(payload);
      await page.getByRole('button', { name: 'Find tag' }).click();
      const shown = page.locator('.tag-result .tag-text');
      await expect.poll(() => shown.textContent()).toBe(payload);
      expect(await page.locator('.tag-result img, .tag-result script, .tag-result svg').count()).toBe(0);
    }
    const last = PAYLOADS[PAYLOADS.length - 1] ?? '';
    await page.getByRole('button', { name: 'Add this tag to Frame seam X' }).click();
    await seamHeading(page, 'Frame seam X').waitFor();
    expect(await page.locator('.linked-tag-list .tag-text').allTextContents()).toEqual([last]);
    expect(await page.locator('.linked-tags svg, .linked-tags img, .linked-tags script').count()).toBe(0);

    // The Seams search finds the seam by the linked tag, and the row shows no markup from it.
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Seams' }).click();
    await page.getByLabel('Search by label, tag, drawing or welder').fill('onload=window');
    await expect
      .poll(() => page.locator('li.seam-row .seam-label').allTextContents())
      .toEqual(['Frame seam X']);

    // Over-long and empty tags get a clear message.
    await page.goto(`${origin}/#/tag`);
    await textbox(page, 'Or type the tag').fill('x'.repeat(300));
    await page.getByRole('button', { name: 'Find tag' }).click();
    await page.getByText(/The tag is 300 characters long; a tag may hold at most 256/).waitFor();
    await textbox(page, 'Or type the tag').fill('   ');
    await page.getByRole('button', { name: 'Find tag' }).click();
    await page.getByText(/The tag is empty/).waitFor();

    expect(await page.evaluate(() => (window as { __xss?: number }).__xss)).toBeUndefined();
    expect(errors).toEqual([]);
  });
});

describe('tag labels', () => {
  it('draws labels for the chosen seam with the generator loaded only there, and prints only the sheet', async () => {
    const { origin, page, errors } = await openApp({ camera: false });
    const generator: string[] = [];
    page.on('request', (r) => {
      if (r.url().includes('label-codes')) generator.push(r.url());
    });
    const seam = await createSeam(page, { label: 'Stiffener seam L', thickness: 10, length: 500 });
    await page.goto(`${origin}/#/tag/${encodeURIComponent(seam)}`);
    await textbox(page, 'Or type the tag').fill('KP-LBL-7');
    await page.getByRole('button', { name: 'Find tag' }).click();
    await page.getByRole('button', { name: 'Add this tag to Stiffener seam L' }).click();
    await seamHeading(page, 'Stiffener seam L').waitFor();
    expect(generator).toEqual([]);

    await page.getByRole('link', { name: 'Print a tag label' }).click();
    const label = page.locator('.tag-label');
    await label.first().waitFor();
    expect(generator.length).toBeGreaterThan(0);
    expect(await label.count()).toBe(1);
    expect(await label.locator('.label-tag').textContent()).toBe('KP-LBL-7');
    expect(await label.locator('.label-seam').textContent()).toBe('Stiffener seam L');
    // Both symbols are images made from SVG data, loaded and drawn.
    const images = label.locator('img');
    expect(await images.count()).toBe(2);
    await expect
      .poll(() => images.evaluateAll((els) => els.every((el) => (el as HTMLImageElement).naturalWidth > 0)))
      .toBe(true);
    expect(await page.getByRole('button', { name: 'Print 1 label' }).isEnabled()).toBe(true);

    // On paper: no app bar, no controls; the page is A4 wide (210 mm = 793.7 CSS px).
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('header.bar').isVisible()).toBe(false);
    expect(await page.locator('.sheet-controls').isVisible()).toBe(false);
    const width = await page.locator('.sheet-page').evaluate((el) => el.getBoundingClientRect().width);
    expect(Math.abs(width - (210 / 25.4) * 96)).toBeLessThan(1);
    expect(errors).toEqual([]);
  });
});
