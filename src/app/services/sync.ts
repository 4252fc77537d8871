// The page's one sync client: the device vault, the outbox sender woken on app start, on the `online` event, from
// "Send now", and by a gentle check while the page is open (so readings saved in range go soon), and the puller,
// which follows every send pass (decisions and assignments come back the same way). Tabs share one sender at a
// time through Web Locks where the browser has them. The puller (signature checks of the server's items) loads
// after the first send pass, outside the first paint.
import type { Puller } from '../sync/puller.js';
import { openDeviceVault, type DeviceVault } from '../sync/device-vault.js';
import { exclusiveSend, OUTBOX_SYNC_TAG } from '../sync/background-send.js';
import { OutboxSender, type SenderStatus } from '../sync/sender.js';
import { fetchTransport } from '../sync/transport.js';
import { announcePull } from './pull-events.js';
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

interface SyncManagerLike {
  register(tag: string): Promise<void>;
}

/**
 * Asks the browser for a Background Sync (where it has one): once the device is online again it wakes the
 * service worker, which sends even when no Beadbook page is open. Failing to register only loses that wake-up;
 * the page still sends on start, on `online` and from "Send now".
 */
export function requestBackgroundSend(): void {
  if (!('serviceWorker' in navigator)) return;
  void navigator.serviceWorker.ready
    .then((registration) => {
      const sync = (registration as ServiceWorkerRegistration & { sync?: SyncManagerLike }).sync;
      return sync?.register(OUTBOX_SYNC_TAG);
    })
    .catch(() => undefined);
}

const stillWaiting = (status: SenderStatus) => status.state === 'waiting';

export function getSync(): Promise<SyncClient> {
  client ??= getStore().then((store) => {
    const vault = openDeviceVault();
    const sender = new OutboxSender({ store, vault, transport: fetchTransport, exclusive: exclusiveSend });
    let loading: Promise<Puller> | null = null;
    const puller = () =>
      (loading ??= import('../sync/puller.js').then(({ Puller }) => {
        const made = new Puller({ store, vault, transport: fetchTransport });
        made.subscribe(announcePull);
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
      // Records that could not go now wait for the browser's sync event too, in case every tab is closed first.
      sender.subscribe((status) => {
        if (stillWaiting(status)) requestBackgroundSend();
      });
      addEventListener('offline', requestBackgroundSend);
      if (!navigator.onLine) requestBackgroundSend();
      setInterval(() => {
        // A sender waiting out its backoff keeps waiting; an idle one looks for new records.
        if (sender.status.state === 'idle' && navigator.onLine) void sender.sendNow();
        // Offline: make sure the browser will wake the service worker once the network is back.
        else if (!navigator.onLine) requestBackgroundSend();
      }, CHECK_EVERY_MS);
    })
    .catch(() => {
      // The store could not be opened: the health banner says so; nothing can be sent until it opens.
    });
}
