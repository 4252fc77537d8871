import { wrap, type Remote } from 'comlink';
import type { ImportApi } from '../../../workers/import-api.js';

/**
 * One worker per import, started when a file is picked: cancelling ends it at once (whatever it was reading), and
 * it is ended when the import is done, so a large file's memory goes with it.
 */
export interface ImportWorker {
  readonly api: Remote<ImportApi>;
  end(): void;
}

export function startImportWorker(): ImportWorker {
  const w = new Worker(new URL('../../../workers/import.worker.ts', import.meta.url), { type: 'module' });
  return { api: wrap<ImportApi>(w), end: () => w.terminate() };
}
