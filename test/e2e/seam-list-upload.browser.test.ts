// A seam list uploaded from a file in real Chromium: the supervisor chooses the file, keeps the guessed mapping,
// sees every row checked with its line before anything is kept, decides to leave the bad row out, and the sound
// seams are imported and assigned to an inspector.
import { describe, expect, inject, it } from 'vitest';
import { useBrowser } from './support/vitest/browser-test.js';
import { signInAsSupervisor } from './support/vitest/supervisor-flows.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

const LIST = [
  'id,label,jointType,t1,length,material,tags',
  'UP-1,Upload splice 1,butt,12,900,S355,UP-T1',
  'UP-2,Upload splice 2,butt,-3,900,S355,UP-T2',
  'UP-3,Upload splice 3,filletT,8,400,S275,UP-T3',
].join('\n');

describe('seam list upload in Chromium', () => {
  it('maps, checks every row, keeps nothing until told, then imports the sound rows for an inspector', async () => {
    const yard = await e2e.startYardServer(current.dir);
    const made = await yard.admin('POST', '/accounts', {
      username: 'ines',
      password: 'inspector-pass-1',
      role: 'inspector',
    });
    expect(made.status).toBe(201);
    const { page: desk, errors } = await e2e.launch();
    await signInAsSupervisor(desk, yard.origin);

    await desk.goto(`${yard.origin}/supervisor/seams`);
    await desk.getByLabel('Seam list file (CSV)').setInputFiles({
      name: 'bay-3.csv',
      mimeType: 'text/csv',
      buffer: Buffer.from(LIST, 'utf8'),
    });
    await desk.getByRole('button', { name: 'Next: map the columns' }).click();
    await desk.getByRole('heading', { level: 1, name: "Map the seam list's columns" }).waitFor();
    await desk.getByText('3 rows read.').waitFor();
    await desk
      .getByRole('group', { name: 'Assign every imported seam to (optional)' })
      .getByLabel('or inspector')
      .selectOption('ines');
    await desk.getByRole('button', { name: 'Next: check every row' }).click();
    await desk.getByRole('heading', { level: 1, name: 'Check the seam list' }).waitFor();
    await desk.getByText('3 rows: 2 sound, 1 with a problem.').waitFor();
    const bad = desk.locator('table.import-check tr.row-bad');
    expect(await bad.count()).toBe(1);
    expect((await bad.textContent())?.replace(/\s+/g, ' ')).toMatch(
      /^ ?3 ✗ not imported .*plate1\.thickness/,
    );
    expect((await yard.storage.listSeamIds()).length).toBe(0);

    await desk.getByLabel(/Leave out the 1\s+row with a problem \(lines 3\)/).check();
    await desk.getByRole('button', { name: 'Import only the sound rows' }).click();
    await desk.getByText('2 seams imported and assigned. 1 row left out (line 3).').waitFor();
    expect(await yard.storage.listSeamIds()).toEqual(['UP-1', 'UP-3']);
    const inspector = await yard.storage.findAccount('ines');
    expect(await yard.storage.assignedSeams({ inspectorId: inspector?.id ?? -1 })).toEqual(['UP-1', 'UP-3']);
    expect(errors).toEqual([]);
  });
});
