// Background Sync: readings recorded offline go to the yard server even when every Beadbook page was closed
// before the tablet came back in range. The page asks the browser for a sync when records are left waiting; the
// browser wakes the service worker, which sends them with the same signed batches (design notes §4). The test
// fires the sync event through the DevTools protocol (ServiceWorker.dispatchSyncEvent), as Chromium itself
// does once it sees the network again, so the outcome does not hang on the browser's own connectivity probe.
import { describe, expect, inject, it } from 'vitest';
import type { CDPSession } from 'playwright-core';
import { waitForController } from './support/vitest/app-page.js';
import { createSeam, openGaugeWithToeGauge, saveToeAngle } from './support/vitest/app-flows.js';
import { enrol, localRecords, serverRecords } from './support/vitest/sync-flows.js';
import { useBrowser } from './support/vitest/browser-test.js';

const { current } = inject('e2eBuilds');
const OUTBOX_SYNC_TAG = 'beadbook-outbox';

const e2e = useBrowser();

interface Registration {
  readonly registrationId: string;
  readonly scopeURL: string;
  readonly isDeleted: boolean;
}

/** The service worker registration of `origin`, as the DevTools protocol names it. */
async function registrationOf(cdp: CDPSession, origin: string): Promise<string> {
  const found = new Promise<string>((resolve) => {
    cdp.on('ServiceWorker.workerRegistrationUpdated', (event: { registrations: Registration[] }) => {
      const mine = event.registrations.find((r) => !r.isDeleted && r.scopeURL.startsWith(origin));
      if (mine) resolve(mine.registrationId);
    });
  });
  await cdp.send('ServiceWorker.enable');
  return found;
}

describe('Background Sync', () => {
  it('sends what was recorded offline once online, with no Beadbook page open', async () => {
    const server = await e2e.startYardServer(current.dir);
    const { page, errors, context } = await e2e.launch();
    await page.goto(server.origin);
    await waitForController(page);
    await enrol(page, server);

    await context.setOffline(true);
    await createSeam(page, { label: 'Background seam', thickness: 10, length: 1000 });
    await openGaugeWithToeGauge(page);
    // ISO 5817:2014 Table 1 row 1.12: 155° meets B (≥ 150°).
    expect(await saveToeAngle(page, 155)).toContain('level met by this reading: B');
    const local = await localRecords(page);
    expect(local.outbox).toHaveLength(3);
    expect(await serverRecords(server)).toEqual([]);
    // Offline, the page asked the browser for a sync (on the 'offline' event, or its next check within 30 s).
    await expect
      .poll(
        () =>
          page.evaluate(async () => {
            const registration = await navigator.serviceWorker.ready;
            const sync = (registration as unknown as { sync: { getTags(): Promise<string[]> } }).sync;
            return sync.getTags();
          }),
        { timeout: 45_000 },
      )
      .toContain(OUTBOX_SYNC_TAG);
    expect(errors).toEqual([]);

    // Every Beadbook page closes; only a blank page keeps the browser running.
    const blank = await context.newPage();
    await blank.goto('about:blank');
    await page.close();
    await context.setOffline(false);
    expect(await serverRecords(server)).toEqual([]);

    const cdp = await context.newCDPSession(blank);
    const registrationId = await registrationOf(cdp, server.origin);
    await cdp.send('ServiceWorker.dispatchSyncEvent', {
      origin: server.origin,
      registrationId,
      tag: OUTBOX_SYNC_TAG,
      lastChance: false,
    });
    const yard = server;
    await expect.poll(async () => (await serverRecords(yard)).length, { timeout: 60_000 }).toBe(3);
    const held = await serverRecords(server);
    expect(held.map((r) => r.id).sort()).toEqual(local.outbox.map((e) => e.recordId).sort());
    expect(context.pages().map((p) => p.url())).toEqual(['about:blank']);

    // The next page finds the outbox emptied by the service worker's pass: acknowledged records left it.
    const again = await context.newPage();
    await again.goto(server.origin);
    await expect.poll(async () => (await localRecords(again)).outbox.length).toBe(0);
    expect((await localRecords(again)).readings).toEqual(local.readings);
  });
});
