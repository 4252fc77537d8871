// Beadbook's service worker: serves the whole built app from the precache so every screen opens offline, and
// waits for the user's consent before a new version takes over (a swap under a running page breaks that
// page's next lazy import). The precache list is injected at build time by vite-plugin-pwa (injectManifest).
import {
  cleanupOutdatedCaches,
  createHandlerBoundToURL,
  precacheAndRoute,
  type PrecacheEntry,
} from 'workbox-precaching';
import { NavigationRoute, registerRoute } from 'workbox-routing';
import { OUTBOX_SYNC_TAG, sendOnceInBackground } from './app/sync/background-send.js';
import { isPageToWorker, type VersionReply } from './sw-protocol.js';

declare const self: ServiceWorkerGlobalScope & { readonly __WB_MANIFEST: (string | PrecacheEntry)[] };
/** Stamped by vite.config.ts; the update prompt shows it before the user accepts. */
declare const __BEADBOOK_VERSION__: string;

precacheAndRoute(self.__WB_MANIFEST);
// Caches left by older precache formats; entries of the previous version go on activate.
cleanupOutdatedCaches();

// Any in-app address (a bookmark, a link from a tag) gets the shell, which routes on the client.
// The supervisor's pages and the API are the server's own: never answer them with the app shell.
registerRoute(
  new NavigationRoute(createHandlerBoundToURL('index.html'), {
    denylist: [/^\/supervisor(\/|$)/, /^\/api\//],
  }),
);

self.addEventListener('message', (event) => {
  const message: unknown = event.data;
  if (!isPageToWorker(message)) return;
  switch (message.type) {
    case 'SKIP_WAITING':
      // Sent only after the user accepted the update; the page reloads when we take control.
      event.waitUntil(self.skipWaiting());
      break;
    case 'GET_VERSION': {
      const reply: VersionReply = { type: 'VERSION', version: __BEADBOOK_VERSION__ };
      event.ports[0]?.postMessage(reply);
      break;
    }
  }
});

// On first install, take control of the page that installed us so it works offline without a reload: it was
// loaded from the build we just precached, so its lazy chunks are ours. A later version activates only after
// skipWaiting (the user accepted) or once no page is open, so claiming never swaps files under a running page.
self.addEventListener('activate', (event) => {
  event.waitUntil(self.clients.claim());
});

/** Background Sync's event (not in TypeScript's WebWorker library). */
interface SyncEventLike extends ExtendableEvent {
  readonly tag: string;
}

// The page registers this when records wait (src/app/services/sync.ts); the browser fires it once online, even
// with no page open. A pass that leaves records waiting rejects, so the browser tries again later.
self.addEventListener('sync', (event) => {
  const sync = event as SyncEventLike;
  if (sync.tag !== OUTBOX_SYNC_TAG) return;
  sync.waitUntil(
    sendOnceInBackground().then(({ sent, status }) => {
      if (!sent) throw new Error(`records still wait: ${status.lastError ?? 'no answer'}`);
    }),
  );
});
