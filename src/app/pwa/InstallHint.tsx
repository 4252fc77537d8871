// Offers to install Beadbook. Browsers that offer an install event get a button; the others a short text on
// where their own install command is. Nothing shows when the app already runs installed.
import { useEffect, useState } from 'preact/hooks';
import { installState, promptInstall, subscribeInstall, type InstallState } from './install-prompt.js';
import './pwa.css';

export function InstallHint() {
  const [state, setState] = useState<InstallState>(installState);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    const update = (): void => setState(installState());
    update();
    return subscribeInstall(update);
  }, []);

  const install = async (): Promise<void> => {
    setBusy(true);
    try {
      await promptInstall();
    } finally {
      setBusy(false);
    }
  };

  if (state === 'running-installed') return null;

  return (
    <section class="pwa-panel" aria-labelledby="pwa-install-title">
      <h2 id="pwa-install-title">Install</h2>
      {state === 'just-installed' && (
        <p role="status">Beadbook is installed. Open it from the home screen or the app list.</p>
      )}
      {state === 'can-prompt' && (
        <>
          <p>Installed, Beadbook opens full screen and works with no signal.</p>
          <button type="button" disabled={busy} onClick={() => void install()}>
            Install Beadbook on this tablet
          </button>
        </>
      )}
      {state === 'manual' && (
        <p>
          To install Beadbook on this tablet, open the browser menu and choose <strong>Install app</strong> or{' '}
          <strong>Add to Home screen</strong>. On an iPad, tap <strong>Share</strong>, then{' '}
          <strong>Add to Home Screen</strong>.
        </p>
      )}
    </section>
  );
}
