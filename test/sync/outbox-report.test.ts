// The tablet reports its outbox with every pull — how many records wait and when the oldest was made (device
// clock) — and the supervisor's Devices page shows it per tablet.
import { describe, expect, it } from 'vitest';
import { Puller } from '../../src/app/sync/puller.js';
import { testServer, type TestServer } from '../server/support.js';
import { enrol, seamWithReadings, tablet } from './support.js';

async function devicesPage(server: TestServer): Promise<string> {
  const res = await server.request('/supervisor/devices', {
    headers: { cookie: await server.supervisorCookie() },
  });
  return (await res.text()).replace(/<[^>]+>/g, ' ').replace(/\s+/g, ' ');
}

describe('outbox reported on the Devices page', () => {
  it('shows how many records wait on each tablet and since when, as of its last pull', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    expect(await devicesPage(server)).toContain('Test tablet');
    expect(await devicesPage(server)).toContain('not reported');

    // Records made but not sent (the sender is not run): the pull reports them.
    await seamWithReadings(t.store, 's-1', 3);
    const [oldest] = await t.store.outboxEntries(1);
    const puller = new Puller({ store: t.store, vault: t.vault, transport: () => t.wire.transport });
    expect((await puller.pullNow()).kind).toBe('pulled');
    const device = await server.storage.getDevice(kid);
    expect(device).toMatchObject({ reportedQueue: 5, reportedOldestAt: oldest?.createdAt });
    const shown = (oldest?.createdAt ?? '').replace('T', ' ').replace(/\.\d+Z$/, ' UTC');
    expect(await devicesPage(server)).toContain(`5 waiting oldest made ${shown} (device clock)`);

    // Sent, then pulled again: nothing waits.
    await t.sender.sendNow();
    await puller.pullNow();
    expect(await server.storage.getDevice(kid)).toMatchObject({ reportedQueue: 0, reportedOldestAt: null });
    expect(await devicesPage(server)).toMatch(/ 0 waiting reported /);
  });
});
