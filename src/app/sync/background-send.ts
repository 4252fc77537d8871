// One sending pass with no page open: what the service worker runs when the browser fires a Background Sync
// event (Chromium fires it once the device is back online, even after every tab was closed). The pass is the
// page's own sender, under the same Web Lock, so a page that opens meanwhile never sends the same batch at once.
import { openSendStore } from '../../store/open-send-store.js';
import { openDeviceVault } from './device-vault.js';
import { OutboxSender, type SenderStatus } from './sender.js';
import { fetchTransport } from './transport.js';

/** The tag the page registers and the service worker answers. */
export const OUTBOX_SYNC_TAG = 'beadbook-outbox';

interface LockManagerLike {
  request<T>(name: string, callback: () => Promise<T>): Promise<T>;
}

/** The lock the page's sender takes too (src/app/services/sync.ts). */
export const SENDER_LOCK = 'beadbook-outbox-sender';

export function exclusiveSend<T>(pass: () => Promise<T>): Promise<T> {
  const locks = (globalThis.navigator as { locks?: LockManagerLike } | undefined)?.locks;
  return locks ? locks.request(SENDER_LOCK, pass) : pass();
}

/**
 * Sends what waits, once, and reports how it went. Resolves false when records are still waiting for a reason
 * worth retrying (no network, 5xx), so the browser schedules the sync again with its own backoff.
 */
export async function sendOnceInBackground(): Promise<{ sent: boolean; status: SenderStatus }> {
  const store = await openSendStore({
    // A page is upgrading the database: this short-lived connection simply closes.
    onBlocking: () => undefined,
  });
  const sender = new OutboxSender({
    store,
    vault: openDeviceVault(),
    transport: fetchTransport,
    exclusive: exclusiveSend,
    // No timers in a service worker pass: the browser's own sync retry replaces the sender's backoff.
    setTimer: () => null,
    clearTimer: () => undefined,
  });
  try {
    const status = await sender.sendNow();
    return { sent: status.state !== 'waiting', status };
  } finally {
    sender.stop();
    store.close();
  }
}
