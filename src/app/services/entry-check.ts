import { wrap, type Remote } from 'comlink';
import type { EntryCheckApi } from '../../../workers/entry-check-api.js';

// The Gauge screen's copy of its seam and the Seams list's standings live in this worker, started on first use.
let api: Remote<EntryCheckApi> | null = null;

export function entryCheckWorker(): Remote<EntryCheckApi> {
  if (!api) {
    const w = new Worker(new URL('../../../workers/entry-check.worker.ts', import.meta.url), {
      type: 'module',
    });
    api = wrap<EntryCheckApi>(w);
  }
  return api;
}
