// A backup holds every record on the device, read in one transaction so it is one consistent moment.
import type { BackupFile } from './api.js';
import type { StoreContext } from './context.js';

export const BACKUP_FORMAT = 'beadbook.backup/1';

export async function exportBackup(ctx: StoreContext): Promise<BackupFile> {
  const exportedAt = ctx.now();
  return ctx.conn.run(['seams', 'rounds', 'readings', 'outbox', 'tagLinks'], 'readonly', async (tx) => ({
    format: BACKUP_FORMAT,
    exportedAt,
    seams: await tx.objectStore('seams').getAll(),
    rounds: await tx.objectStore('rounds').getAll(),
    // In order of entry, so the file reads like the work was done.
    readings: (await tx.objectStore('readings').getAll()).sort((a, b) => a.localSeq - b.localSeq),
    outbox: await tx.objectStore('outbox').getAll(),
    tagLinks: await tx.objectStore('tagLinks').getAll(),
  }));
}
