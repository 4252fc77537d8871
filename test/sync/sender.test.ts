// The outbox sender against the yard server in process. Expected behaviour from the failure catalogue in
// ../shared/reliability.md (row numbers beside each test) and the design notes §4: records leave the outbox only
// when acknowledged by id, a sealed batch is resent byte for byte, nothing is stored twice.
import { describe, expect, it } from 'vitest';
import { testServer } from '../server/support.js';
import { undercut } from '../store/support.js';
import {
  enrol,
  injectOutboxEntry,
  newCode,
  outboxIds,
  seamWithReadings,
  serverRecordIds,
  SERVER_ORIGIN,
  tablet,
} from './support.js';
import { enrolDevice } from '../../src/app/sync/enrol-device.js';
import { OutboxSender } from '../../src/app/sync/sender.js';

const busy = () =>
  new Response(JSON.stringify({ error: 'unavailable', message: 'busy' }), {
    status: 503,
    headers: { 'content-type': 'application/json' },
  });

describe('outbox sender', () => {
  it('sends nothing before the device is enrolled', async () => {
    const server = await testServer();
    const t = await tablet(server);
    await seamWithReadings(t.store, 's-1', 2);
    expect((await t.sender.sendNow()).state).toBe('notEnrolled');
    expect(t.wire.bodies).toEqual([]);
    expect(await t.store.outboxCount()).toBe(4);
  });

  it('delivers every record once, in batches, and keeps the readings on the device', async () => {
    const server = await testServer();
    const t = await tablet(server, { batchSize: 3 });
    const kid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 5);
    const made = await outboxIds(t.store);
    expect(made).toHaveLength(7);

    const status = await t.sender.sendNow();
    expect(status).toMatchObject({ state: 'idle', failures: 0, lastError: null });
    expect(t.wire.bodies).toHaveLength(3);
    expect((await serverRecordIds(server, kid)).sort()).toEqual([...made].sort());
    expect(await t.store.outboxCount()).toBe(0);
    expect(await t.store.pendingBatches()).toEqual([]);
    expect(await t.store.listReadings('s-1')).toHaveLength(5);
    // Sending again has nothing to send.
    await t.sender.sendNow();
    expect(t.wire.bodies).toHaveLength(3);
  });

  it('never sends demo data', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    expect(await t.store.loadDemo()).toBeGreaterThan(0);
    await seamWithReadings(t.store, 's-1', 1);
    await t.sender.sendNow();
    const held = await serverRecordIds(server, kid);
    expect(held).toHaveLength(3);
    const demoSeams = (await t.store.listSeams()).filter((s) => s.namespace === 'demo').map((s) => s.id);
    const seamsHeld = new Set((await server.storage.listRecords({ deviceKid: kid })).map((r) => r.seamId));
    expect(demoSeams.filter((id) => seamsHeld.has(id))).toEqual([]);
    expect([...seamsHeld]).toEqual(['s-1']);
  });

  it('F1, F10: keeps records through 503s and lost connections, backs off, then delivers once', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 3);
    const made = await outboxIds(t.store);
    t.wire.intercept = (path, n) => {
      if (path !== '/api/sync/batches') return undefined;
      if (n <= 1) return busy();
      if (n === 2) throw new TypeError('Failed to fetch');
      return undefined;
    };

    let status = await t.sender.sendNow();
    expect(status).toMatchObject({ state: 'waiting', failures: 1 });
    expect(status.lastError).toContain('503');
    expect(await outboxIds(t.store)).toEqual(made);
    const [item] = await t.store.outboxItems();
    expect(item?.send).toMatchObject({ attempts: 1, lastError: 'the server answered 503: busy' });

    status = await t.sender.sendNow();
    expect(status).toMatchObject({ state: 'waiting', failures: 2 });
    expect(status.lastError).toContain('no answer from the server');
    expect(await outboxIds(t.store)).toEqual(made);
    // Equal jitter with random() = 0.5: 3/4 of min(max, base * 2^(n - 1)); base 2 s (backoff.ts).
    expect(t.scheduled).toEqual([1500, 3000]);

    status = await t.sender.sendNow();
    expect(status).toMatchObject({ state: 'idle', failures: 0, lastError: null });
    expect(await t.store.outboxCount()).toBe(0);
    expect((await serverRecordIds(server, kid)).sort()).toEqual([...made].sort());
    // One batch, sealed once, sent three times byte for byte.
    expect(t.wire.bodies).toHaveLength(3);
    expect(new Set(t.wire.bodies).size).toBe(1);
  });

  it('F9: a lost answer after the server committed leaves the records queued; the resend is a duplicate', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 2);
    const made = await outboxIds(t.store);
    t.wire.intercept = (path, n) => (path === '/api/sync/batches' && n <= 1 ? 'lose' : undefined);

    expect((await t.sender.sendNow()).state).toBe('waiting');
    expect(await outboxIds(t.store)).toEqual(made);
    expect((await serverRecordIds(server, kid)).sort()).toEqual([...made].sort());

    expect((await t.sender.sendNow()).state).toBe('idle');
    expect(await t.store.outboxCount()).toBe(0);
    const held = await serverRecordIds(server, kid);
    expect(held).toHaveLength(made.length);
    expect(t.wire.bodies[1]).toBe(t.wire.bodies[0]);
  });

  it('F4, F11: after a reload, and weeks later, the kept batch is resent byte for byte and stored once', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 2);
    const made = await outboxIds(t.store);
    t.wire.intercept = (path, n) => (path === '/api/sync/batches' && n === 1 ? 'lose' : undefined);
    expect((await t.sender.sendNow()).state).toBe('waiting');
    t.sender.stop();

    // The page is gone; 40 days on, a new page starts a new sender on the same store and key.
    server.clock.advance(40 * 24 * 3600 * 1000);
    const reloaded = new OutboxSender({
      store: t.store,
      vault: t.vault,
      transport: () => t.wire.transport,
      setTimer: () => undefined,
    });
    expect((await reloaded.sendNow()).state).toBe('idle');
    expect(t.wire.bodies).toHaveLength(2);
    expect(t.wire.bodies[1]).toBe(t.wire.bodies[0]);
    expect((await serverRecordIds(server, kid)).sort()).toEqual([...made].sort());
    expect(await t.store.outboxCount()).toBe(0);
  });

  it('F2: a record the server refuses stays with its reason; the rest are delivered', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 2);
    await injectOutboxEntry(t.store.name, 'bad-1', undercut('bad-1', 0.1, { values: {} }));
    const good = (await outboxIds(t.store)).filter((id) => id !== 'bad-1');

    const status = await t.sender.sendNow();
    expect(status.state).toBe('idle');
    expect((await serverRecordIds(server, kid)).sort()).toEqual([...good].sort());
    const items = await t.store.outboxItems();
    expect(items.map((i) => i.entry.recordId)).toEqual(['bad-1']);
    expect(items[0]?.send?.rejected?.reason).toContain('holds no measured value');
    // Not sent again by itself: it would be refused again.
    await t.sender.sendNow();
    expect(t.wire.bodies).toHaveLength(1);
  });

  it('F7: readings saved while a batch is in flight are delivered too', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 1);
    let added = false;
    t.wire.intercept = async (path) => {
      if (path === '/api/sync/batches' && !added) {
        added = true;
        await t.store.appendReading('s-1', undercut('late-1', 0.3, { position: 500 }));
      }
      return undefined;
    };
    await t.sender.sendNow();
    expect(await serverRecordIds(server, kid)).toContain('late-1');
    expect(await t.store.outboxCount()).toBe(0);
  });

  it('sendNow during a pass runs once more afterwards, and never two passes at once', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 1);
    const [a, b] = await Promise.all([t.sender.sendNow(), t.sender.sendNow()]);
    expect(a.state).toBe('idle');
    expect(b.state).toBe('idle');
    expect(t.wire.bodies).toHaveLength(1);
    expect(await serverRecordIds(server, kid)).toHaveLength(3);
  });

  it('a revoked device keeps its records; enrolled again, it sends them under its new key', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const oldKid = await enrol(server, t);
    await seamWithReadings(t.store, 's-1', 2);
    const made = await outboxIds(t.store);
    expect((await server.admin('POST', `/devices/${oldKid}/revoke`)).status).toBe(200);

    const refused = await t.sender.sendNow();
    expect(refused.state).toBe('keyRefused');
    expect(refused.lastError).toContain('403');
    expect(await outboxIds(t.store)).toEqual(made);

    const again = await enrolDevice(
      { code: (await newCode(server)).code },
      { vault: t.vault, transport: t.wire.transport, serverOrigin: SERVER_ORIGIN },
    );
    expect(again.ok).toBe(true);
    const newKid = (await t.vault.key()).kid;
    expect(newKid).not.toBe(oldKid);
    expect((await t.sender.sendNow()).state).toBe('idle');
    expect((await serverRecordIds(server, newKid)).sort()).toEqual([...made].sort());
    expect(await serverRecordIds(server, oldKid)).toEqual([]);
    expect(await t.store.outboxCount()).toBe(0);
  });
});
