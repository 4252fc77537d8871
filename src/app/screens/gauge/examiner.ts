import { storageHelpers, type KeyValueStore } from './instrument-settings.js';

/**
 * Where the Settings screen keeps who is inspecting on this device. Read tolerantly: `beadbook.examiner` as
 * {name, qualification?} or a plain name, or an `examiner` entry inside `beadbook.settings`.
 */
export const EXAMINER_KEYS = ['beadbook.examiner', 'beadbook.settings'] as const;

/** Fits both the reading's examiner and the round's (which has no explicit `undefined` qualification). */
export interface Examiner {
  readonly name: string;
  readonly qualification?: string;
}

function examinerFrom(data: unknown): Examiner | undefined {
  if (typeof data === 'string') {
    const name = data.trim().slice(0, 80);
    return name ? { name } : undefined;
  }
  if (typeof data !== 'object' || data === null) return undefined;
  const rec = data as Record<string, unknown>;
  if (rec['examiner'] !== undefined) return examinerFrom(rec['examiner']);
  const name = typeof rec['name'] === 'string' ? rec['name'].trim().slice(0, 80) : '';
  if (!name) return undefined;
  const q = typeof rec['qualification'] === 'string' ? rec['qualification'].trim().slice(0, 120) : '';
  return q ? { name, qualification: q } : { name };
}

/** The examiner to put on readings made here, when Settings names one. */
export function readExaminer(store: KeyValueStore): Examiner | undefined {
  for (const key of EXAMINER_KEYS) {
    const raw = storageHelpers.safeGet(store, key);
    if (!raw) continue;
    let data: unknown = raw;
    try {
      data = JSON.parse(raw);
    } catch {
      // A plain name stored without JSON quoting.
    }
    const found = examinerFrom(data);
    if (found) return found;
  }
  return undefined;
}
