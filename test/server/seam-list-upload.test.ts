// A seam list uploaded as a CSV file: read in its own encoding, its columns mapped, every row checked and shown
// with the line it starts on and its reason before anything is kept; a list with a bad row is kept only in full,
// or — by the supervisor's ticked decision — without the rows named.
import { describe, expect, it } from 'vitest';
import { parseSeamList } from '../../src/server/seams/seam-fields.js';
import { postForm, REQUIRED_MAPPING } from './seam-list-forms.js';
import { ORIGIN, testServer, type TestServer } from './support.js';

// Line 3 holds a label quoted over two lines, so the row after it starts on line 5, and a blank line is skipped.
const LIST = [
  'Seam No,Description,Type,T1 (mm),Len,Grade',
  'U-1,Träger Stoß 1,butt,12,1200,S355',
  'U-2,"Bracket,',
  'lower flange",butt,10,800,S275',
  'U-3,Bad plate,butt,twelve,900,S355',
  '',
  'U-4,Last one,filletT,8,300,S355',
].join('\r\n');

/** The list as a spreadsheet on Windows saves it: Windows-1252, so "ä" and "ß" are single bytes. */
function windows1252(text: string): Uint8Array<ArrayBuffer> {
  return Uint8Array.from([...text].map((ch) => ({ ä: 0xe4, ß: 0xdf })[ch] ?? ch.charCodeAt(0)));
}

async function upload(server: TestServer, bytes: Uint8Array<ArrayBuffer>, name: string): Promise<Response> {
  const form = new FormData();
  form.set('file', new File([bytes], name, { type: 'text/csv' }));
  form.set('csv', '');
  return server.request('/supervisor/seams/import/map', {
    method: 'POST',
    headers: { cookie: await server.supervisorCookie(), origin: ORIGIN },
    body: form,
  });
}

/** The text of an HTML page with the tags taken out and the spaces closed up. */
const words = async (res: Response) =>
  (await res.text())
    .replace(/<[^>]+>/g, ' ')
    .replace(/&#39;/g, "'")
    .replace(/&quot;/g, '"')
    .replace(/\s+/g, ' ');

describe('seam list files', () => {
  it('numbers each row by the line of the file it starts on', () => {
    const list = parseSeamList(LIST);
    expect(list.headers).toEqual(['Seam No', 'Description', 'Type', 'T1 (mm)', 'Len', 'Grade']);
    expect(list.lines).toEqual([2, 3, 5, 7]);
    expect(list.rows[1]?.['Description']).toBe('Bracket,\r\nlower flange');
    const ragged = parseSeamList('a,b\n1,2\n3,4,5\n');
    expect(ragged.problems).toEqual([{ line: 3, message: '3 values where the header names 2 columns' }]);
    expect(parseSeamList('a,b,a\n1,2,3\n').problems).toEqual([
      { line: 1, message: 'the column "a" is named twice' },
    ]);
  });

  it('reads an uploaded file, shows every row checked, keeps nothing until told, then only the sound rows', async () => {
    const server = await testServer();
    const mapped = await upload(server, windows1252(LIST), 'yard-list.csv');
    expect(mapped.status).toBe(200);
    const mapText = await words(mapped);
    expect(mapText).toContain('yard-list.csv : 4 rows read.');
    expect(mapText).toContain('Träger Stoß 1');

    const checked = await postForm(server, '/supervisor/seams/import/check', {
      csv: LIST,
      fileName: 'yard-list.csv',
      ...REQUIRED_MAPPING,
    });
    expect(checked.status).toBe(200);
    const checkText = await words(checked);
    expect(checkText).toContain('4 rows: 3 sound, 1 with a problem. Nothing has been kept yet.');
    expect(checkText).toMatch(/ 5 ✗ not imported [^✓✗]*plate1\.thickness/);
    expect(checkText).toContain('Leave out the 1 row with a problem (lines 5)');
    expect(await server.storage.listSeamIds()).toEqual([]);

    // Without the supervisor's decision, a list with a bad row keeps nothing.
    const refused = await postForm(server, '/supervisor/seams/import', { csv: LIST, ...REQUIRED_MAPPING });
    expect(refused.status).toBe(400);
    expect(await words(refused)).toMatch(/Nothing was kept\. [^]*Line 5: [^]*plate1\.thickness/);
    expect(await server.storage.listSeamIds()).toEqual([]);

    const kept = await postForm(server, '/supervisor/seams/import', {
      csv: LIST,
      ...REQUIRED_MAPPING,
      soundOnly: 'yes',
    });
    expect(kept.status).toBe(303);
    expect(decodeURIComponent(kept.headers.get('location') ?? '')).toContain(
      '3 seams imported. 1 row left out (line 5).',
    );
    expect(await server.storage.listSeamIds()).toEqual(['U-1', 'U-2', 'U-4']);
    const label = JSON.parse((await server.storage.getSeam('U-2'))?.setup ?? '{}') as { label: string };
    expect(label.label).toBe('Bracket,\r\nlower flange');
  });

  it('refuses a file that is not text, a list without rows and a mapping without a required column', async () => {
    const server = await testServer();
    const png = Uint8Array.from([
      0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13, 0x49, 0x48, 0x44, 0x52,
    ]);
    const binary = await upload(server, png, 'photo.png');
    expect(binary.status).toBe(400);
    expect(await words(binary)).toContain('the file is not a text (CSV) file');

    const headerOnly = await upload(server, new TextEncoder().encode('id,label\n'), 'empty.csv');
    expect(headerOnly.status).toBe(400);
    expect(await words(headerOnly)).toContain('the list needs a header row and at least one seam row');

    const withoutLabel = Object.fromEntries(
      Object.entries(REQUIRED_MAPPING).filter(([k]) => k !== 'map.label'),
    );
    const unmapped = await postForm(server, '/supervisor/seams/import/check', { csv: LIST, ...withoutLabel });
    expect(unmapped.status).toBe(400);
    expect(await words(unmapped)).toContain('choose the column that holds “Label”');
    const forced = await postForm(server, '/supervisor/seams/import', {
      csv: LIST,
      ...withoutLabel,
      soundOnly: 'yes',
    });
    expect(forced.status).toBe(400);
    expect(await server.storage.listSeamIds()).toEqual([]);
  });
});
