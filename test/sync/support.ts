// A tablet for sync tests: the real store and device vault on an in-memory IndexedDB, its sender talking to the
// yard server application in process (app.request, no sockets), with a transport the test can break.
import { openDB } from 'idb';
import { afterEach } from 'vitest';
import { openDeviceVault, type DeviceVault } from '../../src/app/sync/device-vault.js';
import { enrolDevice } from '../../src/app/sync/enrol-device.js';
import { OutboxSender, type SenderOptions } from '../../src/app/sync/sender.js';
import type { Transport } from '../../src/app/sync/transport.js';
import type { Reading } from '../../src/domain/index.js';
import type { OutboxEntry, Store } from '../../src/store/api.js';
import { butt, freshStore, undercut } from '../store/support.js';
import type { TestServer } from '../server/support.js';

export const SERVER_ORIGIN = 'http://localhost';

const made: Tablet[] = [];
afterEach(() => {
  for (const t of made.splice(0)) {
    t.sender.stop();
    t.vault.close();
  }
});

/** Sits between the sender and the server: each request goes through `intercept` first. */
export interface Wire {
  readonly bodies: string[];
  /** Called with the path and how many requests to that path this one makes (1 for the first). Return a Response to answer instead of the server, 'lose' to deliver but lose the answer, or undefined. */
  intercept: (
    path: string,
    n: number,
  ) => Response | 'lose' | undefined | Promise<Response | 'lose' | undefined>;
  readonly transport: Transport;
}

export function wireTo(server: TestServer): Wire {
  const counts = new Map<string, number>();
  const wire: Wire = {
    bodies: [],
    intercept: () => undefined,
    transport: async (path, init) => {
      const count = (counts.get(path) ?? 0) + 1;
      counts.set(path, count);
      if (path === '/api/sync/batches') wire.bodies.push(String(init.body));
      const instead = await wire.intercept(path, count);
      if (instead === 'lose') {
        await server.request(path, init);
        throw new TypeError('Failed to fetch');
      }
      return instead ?? server.request(path, init);
    },
  };
  return wire;
}

export interface Tablet {
  readonly store: Store & { readonly name: string };
  readonly vault: DeviceVault;
  readonly wire: Wire;
  readonly sender: OutboxSender;
  /** Retries the sender scheduled, in order (the test runs them by calling sendNow). */
  readonly scheduled: number[];
}

export async function tablet(server: TestServer, options: Partial<SenderOptions> = {}): Promise<Tablet> {
  const store = await freshStore();
  const vault = openDeviceVault({ name: `device-${crypto.randomUUID()}` });
  const wire = wireTo(server);
  const scheduled: number[] = [];
  const sender = new OutboxSender({
    store,
    vault,
    transport: () => wire.transport,
    random: () => 0.5,
    setTimer: (_run, ms) => scheduled.push(ms),
    clearTimer: () => undefined,
    ...options,
  });
  const made1 = { store, vault, wire, sender, scheduled };
  made.push(made1);
  return made1;
}

export async function newCode(server: TestServer): Promise<{ code: string; ticket: string }> {
  const res = await server.admin('POST', '/enrolment-codes');
  if (res.status !== 201) throw new Error(`no enrolment code: ${res.status}`);
  return (await res.json()) as { code: string; ticket: string };
}

export async function enrol(server: TestServer, t: Tablet): Promise<string> {
  const outcome = await enrolDevice(
    { code: (await newCode(server)).code, label: 'Test tablet' },
    { vault: t.vault, transport: t.wire.transport, serverOrigin: SERVER_ORIGIN },
  );
  if (!outcome.ok) throw new Error(outcome.message);
  return outcome.enrolment.deviceKid;
}

/** A live seam with readings: 2 + n outbox records (set-up, first round, the readings). */
export async function seamWithReadings(store: Store, seamId: string, n: number): Promise<string[]> {
  await store.saveSeam(butt(seamId));
  const ids: string[] = [];
  for (let i = 1; i <= n; i++) {
    const id = `${seamId}-r${i}`;
    await store.appendReading(seamId, undercut(id, 0.1 * i, { position: 10 * i }));
    ids.push(id);
  }
  return ids;
}

export const outboxIds = async (store: Store): Promise<string[]> =>
  (await store.outboxEntries()).map((e) => e.recordId);

/** Record ids the server holds (from this device), read through its storage module. */
export async function serverRecordIds(server: TestServer, deviceKid?: string): Promise<string[]> {
  const records = await server.storage.listRecords(deviceKid === undefined ? {} : { deviceKid });
  return records.map((r) => r.id);
}

/**
 * Puts an entry into the outbox the way an older app version might have, bypassing the store's checks: the
 * only way to get a record the server refuses into a store that checks what it saves.
 */
export async function injectOutboxEntry(dbName: string, recordId: string, reading: Reading): Promise<void> {
  const db = await openDB(dbName);
  const entry: Omit<OutboxEntry, 'seq'> = {
    recordId,
    kind: 'reading',
    seamId: 's-1',
    body: { seamId: 's-1', reading },
    createdAt: '2026-12-01T08:30:00.000Z',
  };
  await db.add('outbox', entry);
  db.close();
}
