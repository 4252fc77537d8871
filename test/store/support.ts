// Shared set-up for the store tests: an in-memory IndexedDB, a fresh database per test, a clock that ticks, and
// small builders for seams and readings that the grader accepts.
import 'fake-indexeddb/auto';
import { afterEach } from 'vitest';
import type { Reading, Seam } from '../../src/domain/index.js';
import { openStore, type OpenStoreOptions } from '../../src/store/index.js';
import type { Store } from '../../src/store/api.js';
import { buttSeam, filletSeam } from '../support/seam-builder.js';

export const freshName = (): string => `beadbook-test-${crypto.randomUUID()}`;

/** ISO times one second apart, so every record's time is distinct and predictable. */
export function tickingClock(start = Date.UTC(2026, 11, 1, 8, 0, 0)): () => string {
  let t = start;
  return () => new Date((t += 1000)).toISOString();
}

const opened: Store[] = [];

/** A store on its own new database; closed after the test. */
export async function freshStore(options: OpenStoreOptions = {}): Promise<Store & { readonly name: string }> {
  const name = options.name ?? freshName();
  const store = await openStore({ now: tickingClock(), ...options, name });
  opened.push(store);
  return Object.assign(store, { name });
}

afterEach(() => {
  for (const store of opened.splice(0)) store.close();
});

export const butt = (id: string, over: Partial<Seam> = {}): Seam =>
  buttSeam({ id, label: `Butt seam ${id}`, ...over });

export const fillet = (id: string, over: Partial<Seam> = {}): Seam =>
  filletSeam({ id, label: `Fillet seam ${id}`, ...over });

/** An undercut reading at the face toe of plate 1 (butt or fillet). */
export function undercut(id: string, depth: number, over: Partial<Reading> = {}): Reading {
  return {
    id,
    round: 1,
    position: 100,
    sampling: 'atPitch',
    toe: { plate: 1, side: 'face' },
    values: { undercutDepth: depth },
    instrument: { id: 'G-1', resolutionMm: 0.1, resolutionDeg: 1 },
    source: { kind: 'gauge' },
    recordedAt: '2026-12-01T09:00:00Z',
    ...over,
  };
}

/** A withdrawal (undo) of a reading: no values, supersedes it. */
export const withdrawal = (id: string, of: string, round = 1): Reading => ({
  id,
  round,
  position: 100,
  sampling: 'atPitch',
  values: {},
  instrument: { id: 'G-1' },
  source: { kind: 'gauge' },
  recordedAt: '2026-12-01T09:05:00Z',
  supersedes: of,
  withdrawn: true,
});

/** Resolves to the StoreError a promise rejects with, failing the test when it resolves instead. */
export async function rejection(promise: Promise<unknown>): Promise<{ code: string; message: string }> {
  try {
    await promise;
  } catch (error) {
    return error as { code: string; message: string };
  }
  throw new Error('expected the call to be refused, but it succeeded');
}
