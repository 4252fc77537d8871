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

/** The limits the reading record puts on an examiner (src/domain/model/seam-file.ts). */
export const EXAMINER_NAME_MAX = 80;
export const EXAMINER_QUALIFICATION_MAX = 120;

export interface ExaminerDraft {
  readonly name: string;
  readonly qualification: string;
}

/** What is wrong with the examiner typed in Settings, per field; an empty name means "nobody named". */
export function checkExaminer(draft: ExaminerDraft): Partial<Record<keyof ExaminerDraft, string>> {
  const out: Partial<Record<keyof ExaminerDraft, string>> = {};
  const name = draft.name.trim();
  const qualification = draft.qualification.trim();
  if (name.length > EXAMINER_NAME_MAX) out.name = `at most ${EXAMINER_NAME_MAX} characters`;
  if (qualification.length > EXAMINER_QUALIFICATION_MAX)
    out.qualification = `at most ${EXAMINER_QUALIFICATION_MAX} characters`;
  if (!name && qualification) out.name = 'enter the name the qualification belongs to';
  return out;
}

/**
 * Saves who inspects on this device under `beadbook.examiner` as {name, qualification?}, where the Gauge screen
 * and new rounds read it; an empty name forgets it. Returns what readExaminer will read back.
 */
export function saveExaminer(
  store: KeyValueStore & { removeItem(key: string): void },
  draft: ExaminerDraft,
): Examiner | undefined {
  const name = draft.name.trim();
  const qualification = draft.qualification.trim();
  if (!name) {
    try {
      store.removeItem(EXAMINER_KEYS[0]);
    } catch {
      // Storage unavailable: nothing was kept to forget.
    }
    return readExaminer(store);
  }
  const examiner: Examiner = qualification ? { name, qualification } : { name };
  storageHelpers.safeSet(store, EXAMINER_KEYS[0], JSON.stringify(examiner));
  return readExaminer(store);
}
