// The supervisor's tag sheet: a label per tag of the chosen seams — tags from the set-up and those the tablets
// linked, less those they unlinked — drawn by the tablet's own label module, for ticked seams or for the seams
// assigned to an inspector; a seam without a tag is named, not printed.
import { describe, expect, it } from 'vitest';
import { labelCodes, svgDataUrl } from '../../src/app/tags/label-codes.js';
import { escapeHtml } from '../../src/server/web/html.js';
import { uuidv7 } from '../../src/store/ids.js';
import { T0, testSeam } from './records.js';
import { testServer, type TestServer } from './support.js';

async function sheet(server: TestServer, query: string): Promise<{ status: number; html: string }> {
  const res = await server.request(`/supervisor/seams/tags?${query}`, {
    headers: { cookie: await server.supervisorCookie() },
  });
  return { status: res.status, html: (await res.text()).replace(/\s+/g, ' ') };
}

const labelTags = (html: string) =>
  [...html.matchAll(/class="tag-label" data-tag="([^"]*)"/g)].map((m) => m[1]);

async function seed(server: TestServer) {
  const a = testSeam('SEAM-A', { label: 'Deck splice A', tags: ['KP-T1', 'KP-T2'] });
  const b = testSeam('SEAM-B', { label: 'Bracket B', tags: ['Naht-ä-3'] });
  const c = testSeam('SEAM-C', { label: 'Stiffener C' });
  for (const seam of [a, b, c])
    expect((await server.admin('PUT', `/seams/${seam.id}`, { seam })).status).toBe(201);
  const made = await server.admin('POST', '/accounts', {
    username: 'ines',
    password: 'inspector-pass-1',
    role: 'inspector',
  });
  expect(made.status).toBe(201);
  await server.admin('POST', '/assignments', { seamId: a.id, inspector: 'ines' });
  // A tablet links a tag to B; a link then unlink leaves nothing of another.
  const device = await server.enrolDevice();
  const link = (tag: string, action: 'link' | 'unlink') =>
    device.add('tagLink', uuidv7(), { seamId: b.id, action, tag, via: 'camera', at: T0 });
  link('KP-L9', 'link');
  link('KP-GONE', 'link');
  link('KP-GONE', 'unlink');
  expect((await device.send(server, await device.seal())).status).toBe(200);
  return { a, b, c };
}

describe('tag sheet', () => {
  it('lays out a label per tag of the ticked seams, with the same symbols the tablet prints', async () => {
    const server = await testServer();
    await seed(server);
    const { status, html } = await sheet(server, 'seam=SEAM-A&seam=SEAM-B&seam=SEAM-C');
    expect(status).toBe(200);
    expect(labelTags(html)).toEqual(['KP-T1', 'KP-T2', 'Naht-ä-3', 'KP-L9']);
    expect(html).toContain('4 labels for 3 seams, on 1 sheet.');
    expect(html).toContain('No label for Stiffener C: it has no tag yet.');
    // The QR and the Code 128 are the tablet module's own drawings of the tag.
    const codes = labelCodes('KP-T1', 'qr');
    expect(html).toContain(`src="${escapeHtml(svgDataUrl(codes.twoD))}" alt="QR code of KP-T1"`);
    expect(html).toContain(`src="${escapeHtml(svgDataUrl(codes.oneD ?? ''))}" alt="Code 128 of KP-T1"`);
    // A non-ASCII tag gets no Code 128, and the label says why.
    expect(html).toContain('no barcode: the tag holds characters beyond plain ASCII');
    expect(html).toContain('class="sheet-page sheet-a4-3x8" data-page="A4"');

    const dm = await sheet(server, 'seam=SEAM-A&layout=letter-3x10&symbol=dataMatrix');
    expect(labelTags(dm.html)).toEqual(['KP-T1', 'KP-T2']);
    expect(dm.html).toContain(`src="${escapeHtml(svgDataUrl(labelCodes('KP-T2', 'dataMatrix').twoD))}"`);
    expect(dm.html).toContain('class="sheet-page sheet-letter-3x10" data-page="letter"');
    // The sheet's layout classes come with the supervisor's stylesheet (the CSP allows no inline style).
    const css = await (await server.request('/supervisor/style.css')).text();
    expect(css).toContain(
      '.sheet-letter-3x10 { grid-template-columns: repeat(3, 66.7mm); grid-auto-rows: 25.4mm;',
    );
  });

  it('prints the seams assigned to an inspector, splits long runs into sheets, and asks for a choice when none is made', async () => {
    const server = await testServer();
    await seed(server);
    const mine = await sheet(server, 'inspector=ines');
    expect(mine.status).toBe(200);
    expect(labelTags(mine.html)).toEqual(['KP-T1', 'KP-T2']);
    // 26 labels: more than the 24 of one A4 sheet.
    for (const part of ['1', '2']) {
      const seam = testSeam(`SEAM-G${part}`, {
        label: `Long girder ${part}`,
        tags: Array.from({ length: 13 }, (_, i) => `G${part}-${String(i + 1).padStart(2, '0')}`),
      });
      const put = await server.admin('PUT', `/seams/${seam.id}`, { seam });
      expect(put.status, await put.text()).toBe(201);
    }
    const long = await sheet(server, 'seam=SEAM-G1&seam=SEAM-G2');
    expect(long.html.match(/class="sheet-page /g)).toHaveLength(2);
    expect(long.html).toContain('26 labels for 2 seams, on 2 sheets.');
    expect(labelTags(long.html).slice(23, 26)).toEqual(['G2-11', 'G2-12', 'G2-13']);
    const none = await sheet(server, '');
    expect(none.status).toBe(400);
    expect(none.html).toContain('Tick at least one seam');
  });
});
