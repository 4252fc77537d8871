// The supervisor's tag sheet in real Chromium: the labels of the seams assigned to an inspector are drawn, and the
// QR code and Code 128 of a label, read back from the rendered page's pixels with the tablet's own zxing decoder,
// give the tag; printed, only the sheet shows, A4 wide.
import type { Page } from 'playwright-core';
import { describe, expect, inject, it } from 'vitest';
import { createTagDecoder, type LumaFrame } from '../../workers/tag-decode-core.js';
import { zxingKitNode } from '../../workers/zxing-kit-node.js';
import { testSeam } from '../server/records.js';
import { useBrowser } from './support/vitest/browser-test.js';
import { signInAsSupervisor } from './support/vitest/supervisor-flows.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

/** The image drawn on a white canvas at `scale` times its natural size, as one byte of luminance per pixel. */
async function luma(page: Page, selector: string, scale: number): Promise<LumaFrame> {
  const frame = await page.locator(selector).evaluate((el, k) => {
    const img = el as HTMLImageElement;
    const canvas = document.createElement('canvas');
    canvas.width = Math.round(img.naturalWidth * k);
    canvas.height = Math.round(img.naturalHeight * k);
    const g = canvas.getContext('2d') as CanvasRenderingContext2D;
    g.fillStyle = '#fff';
    g.fillRect(0, 0, canvas.width, canvas.height);
    g.imageSmoothingEnabled = false;
    g.drawImage(img, 0, 0, canvas.width, canvas.height);
    const rgba = g.getImageData(0, 0, canvas.width, canvas.height).data;
    const grey: number[] = [];
    for (let i = 0; i < rgba.length; i += 4)
      grey.push(Math.round(0.299 * (rgba[i] ?? 0) + 0.587 * (rgba[i + 1] ?? 0) + 0.114 * (rgba[i + 2] ?? 0)));
    return { width: canvas.width, height: canvas.height, grey };
  }, scale);
  return { width: frame.width, height: frame.height, data: Uint8ClampedArray.from(frame.grey) };
}

describe('supervisor tag sheet in Chromium', () => {
  it('draws the inspector’s seam labels, whose symbols read back as their tags, and prints only the sheet', async () => {
    const yard = await e2e.startYardServer(current.dir);
    for (const seam of [
      testSeam('SHEET-1', { label: 'Hatch coaming 1', tags: ['KP-Q41'] }),
      testSeam('SHEET-2', { label: 'Hatch coaming 2', tags: ['KP-Q42', 'KP-Q43'] }),
      testSeam('SHEET-3', { label: 'Not assigned', tags: ['KP-Q99'] }),
    ])
      expect((await yard.admin('PUT', `/seams/${seam.id}`, { seam })).status).toBe(201);
    const made = await yard.admin('POST', '/accounts', {
      username: 'ines',
      password: 'inspector-pass-1',
      role: 'inspector',
    });
    expect(made.status).toBe(201);
    for (const seamId of ['SHEET-1', 'SHEET-2'])
      expect((await yard.admin('POST', '/assignments', { seamId, inspector: 'ines' })).status).toBe(201);

    const { page: desk, errors } = await e2e.launch();
    await signInAsSupervisor(desk, yard.origin);

    // From the Seams page: the inspector chosen, the sheet of their seams.
    await desk.goto(`${yard.origin}/supervisor/seams`);
    await desk
      .getByRole('group', { name: 'Assign the ticked seams to' })
      .getByLabel('or inspector')
      .selectOption('ines');
    await desk.getByRole('button', { name: /Print the tag sheet/ }).click();
    await desk.getByRole('heading', { level: 1, name: 'Tag sheet' }).waitFor();
    const labels = desk.locator('.tag-label');
    expect(await labels.evaluateAll((els) => els.map((el) => el.getAttribute('data-tag')))).toEqual([
      'KP-Q41',
      'KP-Q42',
      'KP-Q43',
    ]);
    await expect
      .poll(() =>
        desk
          .locator('.tag-label img')
          .evaluateAll((els) => els.every((el) => (el as HTMLImageElement).naturalWidth > 0)),
      )
      .toBe(true);

    const decode = createTagDecoder(zxingKitNode);
    const second = '.tag-label[data-tag="KP-Q42"]';
    expect(decode(await luma(desk, `${second} .label-2d`, 4))).toMatchObject({
      text: 'KP-Q42',
      symbol: 'qr',
    });
    expect(decode(await luma(desk, `${second} .label-1d`, 3))).toMatchObject({
      text: 'KP-Q42',
      symbol: 'code128',
    });

    // On paper: no controls, only the sheet, 210 mm wide (793.7 CSS px).
    await desk.emulateMedia({ media: 'print' });
    expect(await desk.locator('header.site').isVisible()).toBe(false);
    expect(await desk.locator('.no-print').first().isVisible()).toBe(false);
    const width = await desk
      .locator('.sheet-page')
      .first()
      .evaluate((el) => el.getBoundingClientRect().width);
    expect(Math.abs(width - (210 / 25.4) * 96)).toBeLessThan(1);
    expect(errors).toEqual([]);
  });
});
