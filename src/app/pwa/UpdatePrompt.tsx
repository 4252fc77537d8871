// Offers a downloaded new version; nothing changes until the user chooses "Update now".
import { useEffect, useState } from 'preact/hooks';
import type { AppUpdates, UpdateStatus } from './register.js';
import './pwa.css';

export function UpdatePrompt({ updates }: { readonly updates: AppUpdates }) {
  const [status, setStatus] = useState<UpdateStatus>(updates.status);
  const [later, setLater] = useState(false);

  useEffect(() => {
    setStatus(updates.status);
    return updates.subscribe(setStatus);
  }, [updates]);

  if (status.state === 'current' || (status.state === 'ready' && later)) return null;

  if (status.state === 'replaced') {
    return (
      <section class="pwa-banner" aria-labelledby="pwa-update-title">
        <h2 id="pwa-update-title">Beadbook was updated in another window</h2>
        <p>Reload this window to go on with the new version. Readings already saved stay on this device.</p>
        <button type="button" onClick={() => updates.reload()}>
          Reload now
        </button>
      </section>
    );
  }

  const applying = status.state === 'applying';
  return (
    <section class="pwa-banner" aria-labelledby="pwa-update-title">
      <h2 id="pwa-update-title">A new version of Beadbook is ready</h2>
      <p>
        {status.nextVersion
          ? `Version ${status.nextVersion} is downloaded; this is ${__BEADBOOK_VERSION__}. `
          : ''}
        This version keeps working, online or offline, until you update. Updating reloads the app; readings
        already saved stay on this device.
      </p>
      <p role="status">{applying ? 'Updating…' : ''}</p>
      <div class="pwa-actions">
        <button type="button" disabled={applying} onClick={() => updates.apply()}>
          Update now
        </button>
        <button type="button" disabled={applying} onClick={() => setLater(true)}>
          Later
        </button>
      </div>
    </section>
  );
}
