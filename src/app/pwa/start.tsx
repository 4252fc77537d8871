// One call from main.tsx starts everything the page needs as an installed app: the service worker, the update
// notice (its own render root above #app, so screens never mount it) and the catch of the browser's install
// offer (which fires before a lazily loaded screen could listen for it).
import { render } from 'preact';
import './install-prompt.js';
import { registerAppUpdates, type AppUpdates, type RegisterOptions } from './register.js';
import { UpdatePrompt } from './UpdatePrompt.js';

export function startPwa(options: RegisterOptions = {}): AppUpdates {
  const updates = registerAppUpdates(options);
  const host = document.createElement('div');
  host.id = 'pwa-notices';
  document.body.prepend(host);
  render(<UpdatePrompt updates={updates} />, host);
  return updates;
}
