import { useCallback, useEffect, useRef, useState } from 'preact/hooks';
import type { Reading, SeamFile } from '../../../domain/index.js';
import type { ReadingRecord, SeamRecord, Store } from '../../../store/api.js';
import { getStore } from '../../services/store.js';

export interface SeamData {
  readonly store: Store;
  readonly record: SeamRecord;
  /** The seam as the grader takes it (readings may be empty). */
  readonly file: SeamFile;
  /** Readings in the order they were entered on this device. */
  readonly entryOrder: readonly Reading[];
}

export type SeamDataState =
  | { readonly status: 'loading' }
  | { readonly status: 'missing' }
  | { readonly status: 'error'; readonly message: string }
  | { readonly status: 'ready'; readonly data: SeamData };

const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

async function load(id: string): Promise<SeamData | null> {
  const store = await getStore();
  const [record, file, records] = await Promise.all([
    store.getSeam(id),
    store.seamFile(id),
    store.listReadings(id),
  ]);
  if (!record || !file) return null;
  const entryOrder = [...records]
    .sort((a: ReadingRecord, b: ReadingRecord) => a.localSeq - b.localSeq)
    .map((r) => r.reading);
  return { store, record, file, entryOrder };
}

/** The seam, its rounds and readings from the store; `reload` re-reads after an append and returns what it read. */
export function useSeamData(id: string): { state: SeamDataState; reload: () => Promise<SeamData | null> } {
  const [state, setState] = useState<SeamDataState>({ status: 'loading' });
  const live = useRef(true);
  const reload = useCallback(async () => {
    try {
      const data = await load(id);
      if (live.current) setState(data ? { status: 'ready', data } : { status: 'missing' });
      return data;
    } catch (e) {
      if (live.current) setState({ status: 'error', message: message(e) });
      return null;
    }
  }, [id]);
  useEffect(() => {
    live.current = true;
    setState({ status: 'loading' });
    void reload();
    return () => {
      live.current = false;
    };
  }, [reload]);
  return { state, reload };
}
