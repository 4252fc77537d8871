// The page's one sync client: the device vault, the outbox sender woken on app start, on the `online` event, from
// "Send now", and by a gentle check while the page is open (so readings saved in range go soon), and the puller,
// which follows every send pass (decisions and assignments come back the same way). Tabs share one sender at a
// time through Web Locks where the browser has them. The puller (signature checks of the server's items) loads
// after the first send pass, outside the first paint.
import type { PullOutcome, Puller } from '../sync/puller.js';
import { openDeviceVault, type DeviceVault } from '../sync/device-vault.js';
import { OutboxSender } from '../sync/sender.js';
import { fetchTransport } from '../sync/transport.js';
import { getStore } from './store.js';

export interface SyncClient {
  readonly vault: DeviceVault;
  readonly sender: OutboxSender;
  /** The puller, loaded on first use. */
  puller(): Promise<Puller>;
}

/** How often an idle sender looks for new records while the page is open. */
const CHECK_EVERY_MS = 30_000;

let client: Promise<SyncClient> | null = null;
const pullListeners = new Set<(outcome: PullOutcome) => void>();

/** Called after every pull with what it brought (screens refresh on it); returns the unsubscribe. */
export function onPulled(listener: (outcome: PullOutcome) => void): () => void {
  pullListeners.add(listener);
  return () => pullListeners.delete(listener);
}

function exclusive<T>(pass: () => Promise<T>): Promise<T> {
  const locks = (navigator as Navigator & { locks?: LockManager }).locks;
  return locks ? (locks.request('beadbook-outbox-sender', pass) as Promise<T>) : pass();
}

export function getSync(): Promise<SyncClient> {
  client ??= getStore().then((store) => {
    const vault = openDeviceVault();
    const sender = new OutboxSender({ store, vault, transport: fetchTransport, exclusive });
    let loading: Promise<Puller> | null = null;
    const puller = () =>
      (loading ??= import('../sync/puller.js').then(({ Puller }) => {
        const made = new Puller({ store, vault, transport: fetchTransport });
        made.subscribe((outcome) => {
          for (const listener of pullListeners) listener(outcome);
        });
        return made;
      }));
    // After each send pass that reached its end (sent, or nothing to send), pull what the server has.
    let lastPass: number | null = null;
    sender.subscribe((status) => {
      if (status.state === 'sending' || status.lastPassAt === lastPass) return;
      lastPass = status.lastPassAt;
      if (status.state === 'idle') void puller().then((p) => p.pullNow());
    });
    return { vault, sender, puller };
  });
  return client;
}

/** Starts sending (and pulling after it) in the background; called once from main.tsx. Never throws. */
export function startSync(): void {
  getSync()
    .then(({ sender }) => {
      void sender.sendNow();
      addEventListener('online', () => void sender.sendNow());
      setInterval(() => {
        // A sender waiting out its backoff keeps waiting; an idle one looks for new records.
        if (sender.status.state === 'idle' && navigator.onLine) void sender.sendNow();
      }, CHECK_EVERY_MS);
    })
    .catch(() => {
      // The store could not be opened: the health banner says so; nothing can be sent until it opens.
    });
}
