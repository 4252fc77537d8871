import { useEffect, useState } from 'preact/hooks';
import type { StoreHealth } from '../store/api.js';
import { Lazy } from './components/Lazy.js';
import { hrefOf, useRoute } from './router.js';
import { SeamsScreen } from './screens/SeamsScreen.js';
import { getStore } from './services/store.js';

const loadSeam = () => import('./screens/SeamScreen.js');
const loadSetup = () => import('./screens/SeamSetupScreen.js');
const loadGauge = () => import('./screens/GaugeScreen.js');
const loadImport = () => import('./screens/ImportScreen.js');
const loadSettings = () => import('./screens/SettingsScreen.js');
const loadCaution = () => import('./screens/CautionScreen.js');
const loadOutbox = () => import('./screens/OutboxScreen.js');
const loadTag = () => import('./screens/TagScreen.js');
const loadTagSheet = () => import('./screens/TagSheetScreen.js');

function useOnline(): boolean {
  const [online, setOnline] = useState(() => navigator.onLine);
  useEffect(() => {
    const on = () => setOnline(true);
    const off = () => setOnline(false);
    addEventListener('online', on);
    addEventListener('offline', off);
    return () => {
      removeEventListener('online', on);
      removeEventListener('offline', off);
    };
  }, []);
  return online;
}

function HealthBanner() {
  const [health, setHealth] = useState<StoreHealth | null>(null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    getStore()
      .then((s) => s.health())
      .then(setHealth, (e: unknown) => setError(e instanceof Error ? e.message : String(e)));
  }, []);
  if (error) {
    return (
      <p role="alert" class="banner banner-bad">
        ⚠ This device's storage cannot be opened ({error}). Readings cannot be saved until it works: close
        other Beadbook tabs and reload.
      </p>
    );
  }
  if (health?.state === 'wiped') {
    return (
      <p role="alert" class="banner banner-bad">
        ⚠ The browser has removed this app's stored data since{' '}
        {new Date(health.previouslyCreatedAt).toLocaleString()}. Readings that were not synced or backed up
        are gone from this tablet. Restore a backup in Settings if you have one.
      </p>
    );
  }
  return null;
}

export function App() {
  const route = useRoute();
  const online = useOnline();
  useEffect(() => {
    document.getElementById('main')?.focus();
  }, [route]);
  return (
    <>
      <a class="skip" href="#main">
        Skip to content
      </a>
      <header class="bar">
        <a class="brand" href={hrefOf({ name: 'seams' })}>
          Beadbook
        </a>
        <span class="net" data-online={online ? 'yes' : 'no'}>
          {online ? '● online' : '○ offline — readings stay on this tablet'}
        </span>
        <nav aria-label="Screens">
          <a href={hrefOf({ name: 'seams' })} aria-current={route.name === 'seams' ? 'page' : undefined}>
            Seams
          </a>
          <a href={hrefOf({ name: 'seamNew' })} aria-current={route.name === 'seamNew' ? 'page' : undefined}>
            New seam
          </a>
          <a href={hrefOf({ name: 'outbox' })} aria-current={route.name === 'outbox' ? 'page' : undefined}>
            Outbox
          </a>
          <a
            href={hrefOf({ name: 'settings' })}
            aria-current={route.name === 'settings' ? 'page' : undefined}
          >
            Settings
          </a>
        </nav>
      </header>
      <HealthBanner />
      <main id="main" tabIndex={-1}>
        {route.name === 'seams' ? <SeamsScreen /> : null}
        {route.name === 'seam' ? <Lazy load={loadSeam} props={{ id: route.id }} /> : null}
        {route.name === 'seamNew' ? <Lazy load={loadSetup} props={{}} /> : null}
        {route.name === 'seamEdit' ? <Lazy load={loadSetup} props={{ id: route.id }} /> : null}
        {route.name === 'gauge' ? <Lazy load={loadGauge} props={{ id: route.id }} /> : null}
        {route.name === 'import' ? <Lazy load={loadImport} props={{ id: route.id }} /> : null}
        {route.name === 'settings' ? <Lazy load={loadSettings} props={{}} /> : null}
        {route.name === 'caution' ? <Lazy load={loadCaution} props={{}} /> : null}
        {route.name === 'outbox' ? <Lazy load={loadOutbox} props={{}} /> : null}
        {route.name === 'tag' ? <Lazy load={loadTag} props={{ seamId: route.seamId }} /> : null}
        {route.name === 'tagSheet' ? <Lazy load={loadTagSheet} props={{ seamIds: route.seamIds }} /> : null}
      </main>
      <footer>
        <a href={hrefOf({ name: 'caution' })}>Caution: what the grades mean and what they do not</a>
      </footer>
    </>
  );
}
