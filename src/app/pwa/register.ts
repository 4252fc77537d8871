// Registers the service worker and turns its life cycle into one small status for the update prompt.
// A new version is never forced on a running page: it waits until the user accepts, because swapping the
// precache under a page breaks that page's next lazy import. Accepting sends SKIP_WAITING to the waiting worker
// and reloads once it controls the page.
import { Workbox } from 'workbox-window';
import { isVersionReply, type PageToWorker } from '../../sw-protocol.js';

/**
 * - `current`: this page runs the newest version known.
 * - `ready`: a new version is installed and waits for the user's consent.
 * - `applying`: the user accepted; the new version is taking over and the page reloads.
 * - `replaced`: another window applied a new version; this page must reload before it loads anything more.
 */
export type UpdateState = 'current' | 'ready' | 'applying' | 'replaced';

export interface UpdateStatus {
  readonly state: UpdateState;
  /** The waiting version's own version string, when it answered. */
  readonly nextVersion?: string;
}

export interface AppUpdates {
  readonly status: UpdateStatus;
  /** Calls the listener on every change; returns the unsubscribe function. */
  subscribe(listener: (status: UpdateStatus) => void): () => void;
  /** Lets the waiting version take over, then reloads. Does nothing unless the state is `ready`. */
  apply(): void;
  reload(): void;
  /** Asks the server for a newer version now (also done hourly, on reconnect and when the app is shown). */
  check(): Promise<void>;
}

export interface RegisterOptions {
  readonly scriptUrl?: string;
  readonly checkEveryMs?: number;
  readonly reload?: () => void;
}

const HOUR_MS = 60 * 60 * 1000;
/** Showing the app again or reconnecting checks at most this often. */
const MIN_CHECK_GAP_MS = 60 * 1000;
const VERSION_REPLY_MS = 3000;

function createStatus() {
  let status: UpdateStatus = { state: 'current' };
  const listeners = new Set<(status: UpdateStatus) => void>();
  return {
    get: (): UpdateStatus => status,
    set(next: UpdateStatus): void {
      if (next.state === status.state && next.nextVersion === status.nextVersion) return;
      status = next;
      for (const listener of listeners) listener(next);
    },
    subscribe(listener: (status: UpdateStatus) => void): () => void {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

/** The waiting worker's version, or undefined if it does not answer in time. */
function askVersion(worker: ServiceWorker): Promise<string | undefined> {
  return new Promise((resolve) => {
    const channel = new MessageChannel();
    const timer = setTimeout(() => {
      channel.port1.close();
      resolve(undefined);
    }, VERSION_REPLY_MS);
    channel.port1.onmessage = (event: MessageEvent<unknown>) => {
      clearTimeout(timer);
      channel.port1.close();
      resolve(isVersionReply(event.data) ? event.data.version : undefined);
    };
    const message: PageToWorker = { type: 'GET_VERSION' };
    worker.postMessage(message, [channel.port2]);
  });
}

/** Registers sw.js in production builds; on the dev server or without service worker support it stays inert. */
export function registerAppUpdates(options: RegisterOptions = {}): AppUpdates {
  const status = createStatus();
  const reload = options.reload ?? (() => window.location.reload());
  if (!import.meta.env.PROD || !('serviceWorker' in navigator)) {
    return {
      get status() {
        return status.get();
      },
      subscribe: status.subscribe,
      apply: () => undefined,
      reload,
      check: () => Promise.resolve(),
    };
  }

  const container = navigator.serviceWorker;
  const wb = new Workbox(options.scriptUrl ?? `${import.meta.env.BASE_URL}sw.js`, {
    scope: import.meta.env.BASE_URL,
  });
  let registration: ServiceWorkerRegistration | undefined;
  let accepted = false;
  let lastCheck = 0;

  // A waiting worker is an update only when another version controls this page (on first install the new
  // worker activates at once and claims the page).
  let offered: ServiceWorker | undefined;
  const noteWaiting = (): void => {
    const waiting = registration?.waiting;
    const state = status.get().state;
    if (!waiting || !container.controller || waiting === offered) return;
    if (state !== 'current' && state !== 'ready') return;
    // A newer version may replace one already offered: offer that one instead.
    offered = waiting;
    status.set({ state: 'ready' });
    void askVersion(waiting).then((nextVersion) => {
      if (nextVersion !== undefined && status.get().state === 'ready' && offered === waiting) {
        status.set({ state: 'ready', nextVersion });
      }
    });
  };

  wb.addEventListener('waiting', noteWaiting);
  wb.addEventListener('controlling', (event) => {
    if (accepted) reload();
    // Another window accepted an update: the precache now holds the new version's files, not ours.
    else if (event.isUpdate) status.set({ state: 'replaced' });
  });

  const check = async (): Promise<void> => {
    if (!registration) return;
    lastCheck = Date.now();
    try {
      await registration.update();
    } catch {
      // Offline or the server is unreachable: the next check tries again.
    }
  };
  const checkIfDue = (): void => {
    if (Date.now() - lastCheck >= MIN_CHECK_GAP_MS) void check();
  };

  wb.register()
    .then((reg) => {
      if (!reg) return;
      registration = reg;
      lastCheck = Date.now();
      // workbox-window stops following updates it judges external (found a minute or more after
      // registration); watching the registration directly keeps every later version in view.
      reg.addEventListener('updatefound', () => {
        const installing = reg.installing;
        installing?.addEventListener('statechange', () => {
          if (installing.state === 'installed') noteWaiting();
        });
      });
      noteWaiting();
      setInterval(checkIfDue, options.checkEveryMs ?? HOUR_MS);
      window.addEventListener('online', checkIfDue);
      document.addEventListener('visibilitychange', () => {
        if (document.visibilityState === 'visible') checkIfDue();
      });
    })
    .catch((error: unknown) => {
      // The app still works online without a service worker; offline use needs it, so say why it failed.
      console.warn('Beadbook could not register its service worker; offline use is unavailable.', error);
    });

  return {
    get status() {
      return status.get();
    },
    subscribe: status.subscribe,
    apply(): void {
      if (status.get().state !== 'ready') return;
      accepted = true;
      status.set({ ...status.get(), state: 'applying' });
      // The waiting worker may be gone (superseded, or applied elsewhere): a reload then opens whatever
      // version is active.
      if (registration?.waiting) wb.messageSkipWaiting();
      else reload();
    },
    reload,
    check,
  };
}
