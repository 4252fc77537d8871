// Loaded on demand: version, offline readiness and storage protection of this installation.
import { StorageStatus } from './StorageStatus.js';
import './pwa.css';

function offlineText(): string {
  if (!('serviceWorker' in navigator)) return 'Not available in this browser';
  return navigator.serviceWorker.controller ? 'Ready: opens and works with no signal' : 'Not ready yet';
}

export function AboutPanel() {
  return (
    <section class="pwa-panel" aria-labelledby="pwa-about-title">
      <h2 id="pwa-about-title">About this installation</h2>
      <dl>
        <dt>Version</dt>
        <dd data-testid="app-version">{__BEADBOOK_VERSION__}</dd>
        <dt>Offline</dt>
        <dd>{offlineText()}</dd>
      </dl>
      <StorageStatus />
    </section>
  );
}
