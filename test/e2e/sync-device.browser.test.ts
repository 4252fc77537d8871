// The device side of signed sync in real Chromium against the real yard server (which serves the built app and
// the API from one origin): the supervisor makes an enrolment code, the page enrols with it, readings are
// recorded offline, the browser is closed and started again on the same profile, and once online the app sends
// them by itself (F3 in ../shared/reliability.md). The server then holds exactly those records, each in a batch
// whose signature verifies with the key the device enrolled (design notes §4; RFC 7515 flattened JWS, ES256).
import { describe, expect, inject, it } from 'vitest';
import { parseFlattenedJws, toPublicJwk, verifyJws } from '../../src/protocol/index.js';
import { appHeader, waitForController } from './support/vitest/app-page.js';
import { createSeam, openGaugeWithToeGauge, saveToeAngle } from './support/vitest/app-flows.js';
import { enrol, localRecords, serverRecords } from './support/vitest/sync-flows.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');

const e2e = useBrowser();

describe('signed sync from the tablet', () => {
  it('enrols, records offline, survives a browser restart and sends exactly those records once online', async () => {
    const server = await e2e.startYardServer(current.dir);
    const { page, errors, context, profile } = await e2e.launch();
    await page.goto(server.origin);
    await waitForController(page);
    await enrol(page, server);
    const devices = (await (await server.admin('GET', '/devices')).json()) as {
      kid: string;
      name: string;
      publicJwk: string;
    }[];
    expect(devices.map((d) => d.name)).toEqual(['Bay 3 tablet']);
    const device = devices[0];
    if (!device) throw new Error('no device enrolled');

    await context.setOffline(true);
    await createSeam(page, { label: 'Sync seam 1', thickness: 10, length: 1000 });
    await openGaugeWithToeGauge(page);
    // ISO 5817:2014 Table 1 row 1.12: 155° meets B (≥ 150°), 120° meets C (≥ 110°).
    expect(await saveToeAngle(page, 155)).toContain('level met by this reading: B');
    expect(await saveToeAngle(page, 120)).toContain('level met by this reading: C');
    const local = await localRecords(page);
    expect(local.readings).toHaveLength(2);
    expect(local.outbox.map((e) => e.kind).sort()).toEqual(['reading', 'reading', 'round', 'seamSetup']);
    // Offline: nothing has reached the server, and the Outbox screen lists what waits.
    expect(await serverRecords(server)).toEqual([]);
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Outbox' }).click();
    await expect.poll(() => page.locator('.outbox-count').textContent()).toBe('4');
    expect(await page.locator('li.outbox-item').count()).toBe(4);
    expect(await page.locator('li.outbox-item', { hasText: 'Reading' }).count()).toBe(2);
    // Gloved hands: 48 px touch targets (common practice; the shell's own rule).
    for (const control of [
      page.getByRole('button', { name: 'Send now' }),
      page.getByRole('button', { name: 'Enrol again with a new code' }),
      page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Outbox' }),
    ]) {
      const box = await control.boundingBox();
      expect(box?.height ?? 0).toBeGreaterThanOrEqual(48);
    }
    expect(errors).toEqual([]);
    await context.close();

    // The browser starts again on the same profile, online: the app sends on start, with no user action.
    const { page: again, errors: againErrors } = await e2e.launch({ profile });
    await again.goto(server.origin);
    await appHeader(again).waitFor();
    const yard = server;
    await expect.poll(async () => (await serverRecords(yard)).length, { timeout: 60_000 }).toBe(4);

    const held = await serverRecords(server);
    expect(held.map((r) => r.id).sort()).toEqual(local.outbox.map((e) => e.recordId).sort());
    expect(
      held
        .filter((r) => r.kind === 'reading')
        .map((r) => r.id)
        .sort(),
    ).toEqual([...local.readings].sort());
    expect(new Set(held.map((r) => r.deviceKid))).toEqual(new Set([device.kid]));

    // Each batch as received verifies with the key the device enrolled, and carries exactly its records.
    const jwk = toPublicJwk(JSON.parse(device.publicJwk));
    const batchIds = [...new Set(held.map((r) => r.batchId))];
    const carried: string[] = [];
    for (const batchId of batchIds) {
      const batch = (await (await server.admin('GET', `/batches/${batchId}`)).json()) as { jws: string };
      const verified = await verifyJws(parseFlattenedJws(JSON.parse(batch.jws)), 'batch', { ...jwk });
      expect(verified.header.kid).toBe(device.kid);
      carried.push(...(verified.payload as { records: { id: string }[] }).records.map((r) => r.id));
    }
    expect(carried.sort()).toEqual(local.outbox.map((e) => e.recordId).sort());

    // The tablet's outbox is empty once acknowledged; its readings stay on the tablet.
    await expect.poll(async () => (await localRecords(again)).outbox.length).toBe(0);
    expect((await localRecords(again)).readings.sort()).toEqual([...local.readings].sort());
    await again.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Outbox' }).click();
    await expect.poll(() => again.locator('.outbox-count').textContent()).toBe('0');
    await again.getByText('Nothing waits to be sent.').waitFor();
    expect(againErrors).toEqual([]);
  });
});
