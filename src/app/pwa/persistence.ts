// Persistent storage: until the browser grants it, Beadbook's IndexedDB is "best effort" and may be wiped
// under storage pressure without any error. Ask after the user has engaged (first saved reading or the
// button in Settings); browsers weigh engagement, and Firefox asks the user, so never at page load.

/**
 * - `granted`: the browser will not evict Beadbook's data to free space.
 * - `denied`: we asked and the browser (or the user) declined.
 * - `not-asked`: supported, not granted, not asked in this session.
 * - `unsupported`: the browser has no persistent storage API.
 */
export type Protection = 'granted' | 'denied' | 'not-asked' | 'unsupported';

export interface StorageReport {
  readonly protection: Protection;
  /** From navigator.storage.estimate(); null when the browser gives no figure. */
  readonly usageBytes: number | null;
  readonly quotaBytes: number | null;
}

type StorageApi = Pick<StorageManager, 'persisted' | 'persist' | 'estimate'>;

function storageApi(): StorageApi | undefined {
  const storage = (globalThis.navigator as Navigator | undefined)?.storage as StorageManager | undefined;
  return storage && typeof storage.persist === 'function' && typeof storage.persisted === 'function'
    ? storage
    : undefined;
}

let asked: boolean | undefined; // the answer to our last persist() call in this session
let engagementRequest: Promise<StorageReport> | undefined;
const listeners = new Set<(report: StorageReport) => void>();

async function estimate(
  api: StorageApi | undefined,
): Promise<Pick<StorageReport, 'usageBytes' | 'quotaBytes'>> {
  try {
    const figures = api && typeof api.estimate === 'function' ? await api.estimate() : undefined;
    return { usageBytes: figures?.usage ?? null, quotaBytes: figures?.quota ?? null };
  } catch {
    return { usageBytes: null, quotaBytes: null };
  }
}

async function report(api: StorageApi | undefined, protection: Protection): Promise<StorageReport> {
  const result = { protection, ...(await estimate(api)) };
  for (const listener of listeners) listener(result);
  return result;
}

/** The current state without asking the browser for anything. */
export async function readStorage(): Promise<StorageReport> {
  const api = storageApi();
  if (!api) return report(undefined, 'unsupported');
  let persisted = false;
  try {
    persisted = await api.persisted();
  } catch {
    // Treated as not granted.
  }
  if (persisted) return report(api, 'granted');
  return report(api, asked === false ? 'denied' : 'not-asked');
}

/** Asks the browser to keep Beadbook's data. Call it from a user action (a button). */
export async function requestPersistence(): Promise<StorageReport> {
  const api = storageApi();
  if (!api) return report(undefined, 'unsupported');
  let granted = false;
  try {
    granted = (await api.persisted()) || (await api.persist());
  } catch {
    // A browser that throws here has refused.
  }
  asked = granted;
  return report(api, granted ? 'granted' : 'denied');
}

/** Call after the user's first real work (first saved reading): asks once per session, quietly. */
export function noteEngagement(): Promise<StorageReport> {
  engagementRequest ??= requestPersistence();
  return engagementRequest;
}

/** Every new report (from any of the calls above) goes to the listener; returns the unsubscribe function. */
export function subscribeStorage(listener: (report: StorageReport) => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

/** "1.3 MB", "12 GB": decimal units, as storage is sold. */
export function formatBytes(bytes: number): string {
  const units = ['bytes', 'kB', 'MB', 'GB', 'TB'];
  let value = bytes;
  let unit = 0;
  while (value >= 1000 && unit < units.length - 1) {
    value /= 1000;
    unit += 1;
  }
  const digits = unit === 0 || value >= 10 ? 0 : 1;
  return `${value.toFixed(digits)} ${units[unit] ?? 'bytes'}`;
}
