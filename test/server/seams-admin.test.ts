// Seams set up by the supervisor: one by the form, a list imported from CSV with a column mapping (all rows or
// none), assigned to a tablet, which pulls them signed by the server key it enrolled with.
import { describe, expect, it } from 'vitest';
import { verifyServerItem, type Assignment, type PullReply } from '../../src/protocol/index.js';
import { guessMapping, parseSeamList } from '../../src/server/seams/seam-fields.js';
import { inspectorCookie } from './review-seed.js';
import { postForm, REQUIRED_MAPPING } from './seam-list-forms.js';
import { testServer } from './support.js';

const LIST = [
  'Seam No;Description;Type;T1 (mm);Len;Grade;Quality;Welder;Dwg',
  'S-100;Deck splice 1;butt;12;1200;S355;C;W-1;D-7',
  'S-101;Deck splice 2;butt;12;900;S355;B;W-2;D-7',
].join('\n');

const MAPPING: Record<string, string> = {
  ...REQUIRED_MAPPING,
  'map.level': 'Quality',
  'map.welder': 'Welder',
  'map.drawing': 'Dwg',
};

describe('seam lists', () => {
  it('reads a list with papaparse and guesses the columns named like the fields', () => {
    const list = parseSeamList(
      '\uFEFFid,label,jointType,t1,length,material,Welder\r\nA,"Splice, aft",butt,10,500,S355,W-1\r\n',
    );
    expect(list.headers).toEqual(['id', 'label', 'jointType', 't1', 'length', 'material', 'Welder']);
    expect(list.rows).toEqual([
      {
        id: 'A',
        label: 'Splice, aft',
        jointType: 'butt',
        t1: '10',
        length: '500',
        material: 'S355',
        Welder: 'W-1',
      },
    ]);
    expect(guessMapping(list.headers)).toEqual({
      id: 'id',
      label: 'label',
      jointType: 'jointType',
      t1: 't1',
      length: 'length',
      material: 'material',
      welder: 'Welder',
    });
  });

  it('imports every row with the mapping and assigns them; a faulty row keeps nothing and names the row', async () => {
    const server = await testServer();
    const tablet = await server.enrolDevice('Bay 7 tablet');
    const map = await postForm(server, '/supervisor/seams/import/map', new URLSearchParams({ csv: LIST }));
    expect(map.status).toBe(200);
    const mapHtml = await map.text();
    expect(mapHtml).toContain('2 rows read.');
    expect(mapHtml).toMatch(/<option value="Welder"\s+selected\s*>\s*Welder\s*<\/option>/);

    const bad = LIST.replace('S-101;Deck splice 2;butt;12;900', 'S-101;Deck splice 2;buttt;x;900');
    const refused = await postForm(
      server,
      '/supervisor/seams/import',
      new URLSearchParams({ csv: bad, ...MAPPING, device: tablet.kid }),
    );
    expect(refused.status).toBe(400);
    const refusedHtml = await refused.text();
    expect(refusedHtml).toContain('Nothing was kept.');
    expect(refusedHtml).toMatch(/Line 3: [^<]*joint\.type/);
    expect(refusedHtml).toMatch(/Line 3: [^<]*plate1\.thickness/);
    expect(await server.storage.getSeam('S-100')).toBeUndefined();

    const done = await postForm(
      server,
      '/supervisor/seams/import',
      new URLSearchParams({ csv: LIST, ...MAPPING, device: tablet.kid, note: 'Bow end first' }),
    );
    expect(done.status).toBe(303);
    expect(decodeURIComponent(done.headers.get('location') ?? '')).toContain(
      '2 seams imported and assigned.',
    );
    const setup = JSON.parse((await server.storage.getSeam('S-101'))?.setup ?? '{}') as Record<
      string,
      unknown
    >;
    expect(setup).toMatchObject({
      id: 'S-101',
      label: 'Deck splice 2',
      joint: { type: 'butt', sides: 'one', setting: 'shopFlat' },
      plate1: { thickness: 12 },
      plate2: { thickness: 12 },
      length: 900,
      material: { name: 'S355', kind: 'steel' },
      acceptance: { edition: 'ISO 5817:2014', level: 'B' },
      welder: 'W-2',
      drawing: 'D-7',
    });
    // The same list again: the ids exist, nothing is changed.
    const again = await postForm(
      server,
      '/supervisor/seams/import',
      new URLSearchParams({ csv: LIST, ...MAPPING }),
    );
    expect(again.status).toBe(400);
    expect(await again.text()).toContain('exists already');

    const reply = (await tablet.pull(server, null)).body as PullReply;
    const server_ = { kid: server.deps.serverKey.kid, jwk: server.deps.serverKey.publicJwk };
    const items = (await Promise.all(
      reply.items.map((i) => verifyServerItem(i, server_, tablet.kid)),
    )) as Assignment[];
    expect(items.map((i) => [i.type, i.seamId, i.note])).toEqual([
      ['assignment', 'S-100', 'Bow end first'],
      ['assignment', 'S-101', 'Bow end first'],
    ]);
    expect(items[0]?.seam.label).toBe('Deck splice 1');
  });

  it('sets up one seam with the form and assigns seams ticked on the Seams page', async () => {
    const server = await testServer();
    const tablet = await server.enrolDevice('Bay 2 tablet');
    const made = await postForm(
      server,
      '/supervisor/seams',
      new URLSearchParams({
        label: 'Web stiffener 4',
        jointType: 'filletT',
        preparation: 'fillet',
        sides: 'two',
        t1: '10',
        t2: '8',
        nominalThroat: '4',
        length: '600',
        material: 'S275',
      }),
    );
    expect(made.status).toBe(303);
    const list = await (
      await server.request('/supervisor/seams', { headers: { cookie: await server.supervisorCookie() } })
    ).text();
    const id = /name="seam"\s+value="([^"]+)"\s+aria-label="Assign Web stiffener 4"/.exec(list)?.[1] ?? '';
    expect(id).not.toBe('');
    const none = await postForm(server, '/supervisor/seams/assign', new URLSearchParams({ seam: id }));
    expect(none.status).toBe(400);
    const assigned = await postForm(
      server,
      '/supervisor/seams/assign',
      new URLSearchParams({ seam: id, device: tablet.kid }),
    );
    expect(assigned.status).toBe(303);
    const reply = (await tablet.pull(server, null)).body as PullReply;
    expect(reply.items).toHaveLength(1);
    // An inspector cannot set up, import or assign.
    const inspector = await inspectorCookie(server);
    for (const path of [
      '/supervisor/seams',
      '/supervisor/seams/import/map',
      '/supervisor/seams/import',
      '/supervisor/seams/assign',
    ])
      expect(
        (await postForm(server, path, new URLSearchParams({ label: 'x' }), inspector)).status,
        path,
      ).toBe(403);
  });
});
