// Mapping profiles per source, kept in localStorage under the file's column layout: the next file from the same
// scanner maps itself. Losing them loses only convenience, never a reading.
import type { ImportMapping, SavedProfile } from '../../../domain/import/index.js';

const KEY = 'beadbook.import.mappings';

export function loadProfiles(): SavedProfile[] {
  try {
    const raw = localStorage.getItem(KEY);
    const list = raw ? (JSON.parse(raw) as unknown) : [];
    return Array.isArray(list) ? (list as SavedProfile[]) : [];
  } catch {
    return [];
  }
}

export function saveProfile(signature: string, mapping: ImportMapping): void {
  try {
    const others = loadProfiles().filter((p) => p.signature !== signature);
    localStorage.setItem(KEY, JSON.stringify([{ signature, mapping }, ...others].slice(0, 50)));
  } catch {
    // A full or disabled localStorage only means the next file is mapped by hand again.
  }
}
