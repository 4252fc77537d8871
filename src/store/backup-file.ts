// The backup file as a whole, and its lists checked record by record. A file that is not a backup is refused
// before any record is looked at; a bad record is refused alone, with its reason.
import { BACKUP_FORMAT } from './backup-export.js';
import type { Checked } from './backup-schema.js';
import { StoreError } from './errors.js';

const LISTS = ['seams', 'rounds', 'readings', 'outbox'] as const;

const notBackup = (why: string) =>
  new StoreError(
    'notBackup',
    `${why} Nothing was imported. Choose a file made with "Export backup" in Beadbook.`,
  );

/** The file as a whole: anything that is not a Beadbook backup is refused before a record is looked at. */
export function readEnvelope(data: unknown): Record<(typeof LISTS)[number] | 'tagLinks', unknown[]> {
  let file = data;
  if (typeof file === 'string') {
    try {
      file = JSON.parse(file) as unknown;
    } catch {
      throw notBackup('This file is not a Beadbook backup: it is not JSON.');
    }
  }
  if (file === null || typeof file !== 'object' || Array.isArray(file)) {
    throw notBackup('This file is not a Beadbook backup: a backup is one JSON object.');
  }
  const format = (file as { format?: unknown }).format;
  if (format !== BACKUP_FORMAT) {
    if (format === 'beadbook.seam/1') {
      throw notBackup('This is a seam file (one seam for the grader), not a backup.');
    }
    if (typeof format === 'string' && format.startsWith('beadbook.backup/')) {
      throw new StoreError(
        'notBackup',
        `This backup has format "${format}", made by a newer version of Beadbook. Update the app, then import it again; nothing was imported.`,
      );
    }
    throw notBackup(`This file is not a Beadbook backup: it has no "format": "${BACKUP_FORMAT}".`);
  }
  const lists = {} as Record<(typeof LISTS)[number] | 'tagLinks', unknown[]>;
  for (const key of LISTS) {
    const list = (file as Record<string, unknown>)[key];
    if (!Array.isArray(list)) throw notBackup(`This backup is damaged: "${key}" is missing or not a list.`);
    lists[key] = list;
  }
  // Backups made before tag links (store version 4) have none.
  const tagLinks = (file as Record<string, unknown>)['tagLinks'] ?? [];
  if (!Array.isArray(tagLinks)) throw notBackup('This backup is damaged: "tagLinks" is not a list.');
  lists.tagLinks = tagLinks;
  return lists;
}

export interface Indexed<T> {
  readonly path: string;
  readonly value: T;
}

/** Checks every record of one list; bad records are refused with their reason, the rest go on. */
export function checkAll<T>(
  key: string,
  list: readonly unknown[],
  check: (input: unknown) => Checked<T>,
  refused: { path: string; reason: string }[],
): Indexed<T>[] {
  const good: Indexed<T>[] = [];
  list.forEach((input, i) => {
    const path = `${key}[${i}]`;
    const checked = check(input);
    if (checked.ok) good.push({ path, value: checked.value });
    else refused.push({ path, reason: checked.reason });
  });
  return good;
}
