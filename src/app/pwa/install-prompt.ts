// Keeps the browser's install offer (beforeinstallprompt) from the moment the page starts: the event fires
// once, early, usually before the screen that shows the install button has loaded. start.tsx imports this.

/** Chromium's install event (not in the DOM typings). */
export interface BeforeInstallPromptEvent extends Event {
  prompt(): Promise<unknown>;
  readonly userChoice: Promise<{ readonly outcome: 'accepted' | 'dismissed' }>;
}

function isInstallPrompt(event: Event): event is BeforeInstallPromptEvent {
  return typeof (event as Partial<BeforeInstallPromptEvent>).prompt === 'function';
}

let offer: BeforeInstallPromptEvent | undefined;
let installedNow = false;
const listeners = new Set<() => void>();
const notify = (): void => listeners.forEach((listener) => listener());

if (typeof window !== 'undefined') {
  window.addEventListener('beforeinstallprompt', (event) => {
    if (!isInstallPrompt(event)) return;
    // Our button replaces the browser's own banner.
    event.preventDefault();
    offer = event;
    notify();
  });
  window.addEventListener('appinstalled', () => {
    installedNow = true;
    offer = undefined;
    notify();
  });
}

export type InstallState = 'running-installed' | 'just-installed' | 'can-prompt' | 'manual';

function runsInstalled(): boolean {
  const standalone = ['standalone', 'fullscreen', 'minimal-ui'].some(
    (mode) => window.matchMedia(`(display-mode: ${mode})`).matches,
  );
  // Safari on iPad and iPhone reports a home-screen app this way only.
  return standalone || (navigator as { standalone?: boolean }).standalone === true;
}

export function installState(): InstallState {
  if (runsInstalled()) return 'running-installed';
  if (installedNow) return 'just-installed';
  return offer ? 'can-prompt' : 'manual';
}

/** Calls the listener whenever installState() may have changed; returns the unsubscribe function. */
export function subscribeInstall(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** Shows the browser's install dialog. The offer can be used once; the browser makes a fresh one later. */
export async function promptInstall(): Promise<'accepted' | 'dismissed' | 'unavailable'> {
  const event = offer;
  if (!event) return 'unavailable';
  offer = undefined;
  try {
    await event.prompt();
    const { outcome } = await event.userChoice;
    if (outcome === 'accepted') installedNow = true;
    return outcome;
  } catch {
    return 'unavailable';
  } finally {
    notify();
  }
}
