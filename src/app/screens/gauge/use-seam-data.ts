import { useCallback, useEffect, useRef, useState } from 'preact/hooks';
import { SEAM_FILE_FORMAT, type Reading, type SeamFile } from '../../../domain/index.js';
import type { ReadingRecord, RoundRecord, SeamRecord, Store } from '../../../store/api.js';
import { addToContext, entryContext, type EntryContext } from '../../../../workers/entry-check-api.js';
import { getStore } from '../../services/store.js';

export interface SeamData {
  readonly store: Store;
  readonly record: SeamRecord;
  /** The seam as the grader takes it (readings may be empty); its readings are `entryOrder`. */
  readonly file: SeamFile;
  /** Readings in the order they were entered on this device. */
  readonly entryOrder: readonly Reading[];
  /** What a new reading is checked against; it grows with the seam (readings are never removed). */
  readonly context: EntryContext;
  /** The device sequence number of the latest reading held, so a refresh reads only what is newer. */
  readonly lastSeq: number;
}

export type SeamDataState =
  | { readonly status: 'loading' }
  | { readonly status: 'missing' }
  | { readonly status: 'error'; readonly message: string }
  | { readonly status: 'ready'; readonly data: SeamData };

const message = (e: unknown): string => (e instanceof Error ? e.message : String(e));

const bySeq = (a: ReadingRecord, b: ReadingRecord) => a.localSeq - b.localSeq;

function fileOf(record: SeamRecord, rounds: readonly RoundRecord[], readings: Reading[]): SeamFile {
  return {
    format: SEAM_FILE_FORMAT,
    units: { length: 'mm', angle: 'deg' },
    seam: record.seam,
    rounds: [...rounds]
      .sort((a, b) => a.number - b.number)
      .map((r) => ({
        number: r.number,
        kind: r.kind,
        startedAt: r.startedAt,
        ...(r.examiner ? { examiner: r.examiner } : {}),
        checklist: r.checklist,
      })),
    readings,
  };
}

async function load(id: string): Promise<SeamData | null> {
  const store = await getStore();
  const [record, rounds, records] = await Promise.all([
    store.getSeam(id),
    store.listRounds(id),
    store.listReadings(id),
  ]);
  if (!record) return null;
  const sorted = [...records].sort(bySeq);
  const entryOrder = sorted.map((r) => r.reading);
  const file = fileOf(record, rounds, entryOrder);
  return {
    store,
    record,
    file,
    entryOrder,
    context: entryContext(file),
    lastSeq: sorted[sorted.length - 1]?.localSeq ?? 0,
  };
}

/**
 * The seam after a save: its set-up and rounds read again (a handful of records) and only the readings entered
 * since `prev` (this save's, and any another tab added), so a save costs the same however many readings the
 * seam has.
 */
async function loadNewer(prev: SeamData): Promise<SeamData | null> {
  const { store } = prev;
  const id = prev.record.id;
  const [record, rounds, records] = await Promise.all([
    store.getSeam(id),
    store.listRounds(id),
    store.listReadings(id, prev.lastSeq),
  ]);
  if (!record) return null;
  const sorted = [...records].sort(bySeq);
  const added = sorted.map((r) => r.reading);
  for (const r of added) addToContext(prev.context, r);
  // The same set-up revision keeps the same seam object, so what depends only on the set-up is not worked out again.
  const kept = record.revision === prev.record.revision ? { ...record, seam: prev.record.seam } : record;
  const file = fileOf(kept, rounds, added.length ? [...prev.file.readings, ...added] : prev.file.readings);
  prev.context.seam = file.seam;
  prev.context.rounds = file.rounds;
  return {
    store,
    record: kept,
    file,
    entryOrder: file.readings,
    context: prev.context,
    lastSeq: sorted[sorted.length - 1]?.localSeq ?? prev.lastSeq,
  };
}

/**
 * The seam, its rounds and readings from the store. `reload` reads it all again; `refresh` (after an append)
 * reads only what changed since. Both return what they read.
 */
export function useSeamData(id: string): {
  state: SeamDataState;
  reload: () => Promise<SeamData | null>;
  refresh: () => Promise<SeamData | null>;
} {
  const [state, setState] = useState<SeamDataState>({ status: 'loading' });
  const live = useRef(true);
  const current = useRef<SeamData | null>(null);
  const run = useCallback(async (read: () => Promise<SeamData | null>) => {
    try {
      const data = await read();
      if (live.current) {
        current.current = data;
        setState(data ? { status: 'ready', data } : { status: 'missing' });
      }
      return data;
    } catch (e) {
      if (live.current) setState({ status: 'error', message: message(e) });
      return null;
    }
  }, []);
  const reload = useCallback(() => run(() => load(id)), [id, run]);
  const refresh = useCallback(
    () =>
      run(() => {
        const prev = current.current;
        return prev && prev.record.id === id ? loadNewer(prev) : load(id);
      }),
    [id, run],
  );
  useEffect(() => {
    live.current = true;
    current.current = null;
    setState({ status: 'loading' });
    void reload();
    return () => {
      live.current = false;
    };
  }, [reload]);
  return { state, reload, refresh };
}
