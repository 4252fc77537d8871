// Shows whether the browser protects Beadbook's data from eviction, how much space it uses, and offers to
// ask for protection. Meant for Settings.
import { useEffect, useState } from 'preact/hooks';
import {
  formatBytes,
  readStorage,
  requestPersistence,
  subscribeStorage,
  type StorageReport,
} from './persistence.js';
import './pwa.css';

const MESSAGES: Record<StorageReport['protection'], string> = {
  granted: 'Protected: the browser keeps Beadbook’s data even when the device runs low on space.',
  denied:
    'Not protected: the browser declined, so it may delete Beadbook’s data when space runs low. Installing the app often changes that; until readings are sent, keep a backup.',
  'not-asked': 'Not yet protected: the browser may delete Beadbook’s data when space runs low.',
  unsupported:
    'This browser cannot protect stored data: it may delete Beadbook’s data when space runs low. Keep a backup until readings are sent.',
};

export function StorageStatus() {
  const [storage, setStorage] = useState<StorageReport | undefined>(undefined);
  const [busy, setBusy] = useState(false);

  useEffect(() => {
    const unsubscribe = subscribeStorage(setStorage);
    void readStorage();
    return unsubscribe;
  }, []);

  const ask = async (): Promise<void> => {
    setBusy(true);
    try {
      await requestPersistence();
    } finally {
      setBusy(false);
    }
  };

  return (
    <section class="pwa-panel" aria-labelledby="pwa-storage-title">
      <h3 id="pwa-storage-title">Storage on this device</h3>
      <p role="status" data-protection={storage?.protection ?? 'checking'}>
        {storage ? MESSAGES[storage.protection] : 'Checking…'}
      </p>
      {storage?.usageBytes != null && storage.quotaBytes != null && (
        <p>
          Using {formatBytes(storage.usageBytes)} of about {formatBytes(storage.quotaBytes)} available to
          Beadbook.
        </p>
      )}
      {(storage?.protection === 'not-asked' || storage?.protection === 'denied') && (
        <button type="button" disabled={busy} onClick={() => void ask()}>
          Keep Beadbook’s data on this device
        </button>
      )}
    </section>
  );
}
