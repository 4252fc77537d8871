import type { Reading } from '../../../domain/index.js';
import { storageHelpers, type KeyValueStore } from './instrument-settings.js';

/** One entry made on this screen in this session: a new reading, or a correction of an earlier one. */
export interface SessionEntry {
  readonly id: string;
  readonly correction: boolean;
}

/** The entries made on this screen in this session, newest last; kept in session storage so a reload keeps undo. */
export const sessionKey = (seamId: string): string => `beadbook.gauge.session.${seamId}`;

export function loadSession(store: KeyValueStore, seamId: string): SessionEntry[] {
  const raw = storageHelpers.safeGet(store, sessionKey(seamId));
  try {
    const list: unknown = raw ? JSON.parse(raw) : [];
    if (!Array.isArray(list)) return [];
    return list.flatMap((x: unknown) => {
      if (typeof x !== 'object' || x === null) return [];
      const e = x as Record<string, unknown>;
      return typeof e['id'] === 'string' ? [{ id: e['id'], correction: e['correction'] === true }] : [];
    });
  } catch {
    return [];
  }
}

/**
 * How many of a session's latest entries undo can reach back through, one undo at a time. The session is written
 * to session storage on every save, so it is kept to a size whose writing does not grow with a long session.
 */
export const SESSION_LIMIT = 200;

/** The session with one more entry, the oldest dropped past SESSION_LIMIT. */
export function withEntry(session: readonly SessionEntry[], entry: SessionEntry): SessionEntry[] {
  return [...session.slice(Math.max(0, session.length + 1 - SESSION_LIMIT)), entry];
}

export function saveSession(store: KeyValueStore, seamId: string, entries: readonly SessionEntry[]): void {
  storageHelpers.safeSet(store, sessionKey(seamId), JSON.stringify(entries.slice(-SESSION_LIMIT)));
}

/** Ids of readings that a later reading supersedes (corrected or withdrawn). */
export function replacedIds(readings: readonly Reading[]): Set<string> {
  const out = new Set<string>();
  for (const r of readings) if (r.supersedes !== undefined) out.add(r.supersedes);
  return out;
}

/** Readings that count now: not withdrawals and not replaced by a later correction or withdrawal. */
export function currentReadings(readings: readonly Reading[]): Reading[] {
  const replaced = replacedIds(readings);
  return readings.filter((r) => !r.withdrawn && !replaced.has(r.id));
}

/**
 * The latest `limit` readings that count now, newest first, found by walking back from the newest: a save on a
 * seam with thousands of readings does not filter them all again.
 */
export function latestCurrent(
  readings: readonly Reading[],
  supersededBy: ReadonlyMap<string, string>,
  limit: number,
): Reading[] {
  const out: Reading[] = [];
  for (let i = readings.length - 1; i >= 0 && out.length < limit; i--) {
    const r = readings[i];
    if (r && !r.withdrawn && !supersededBy.has(r.id)) out.push(r);
  }
  return out;
}

export type UndoPlan =
  | { readonly kind: 'withdraw'; readonly target: Reading }
  /** The last entry corrected an earlier reading: undo puts the earlier values back as a new correction. */
  | { readonly kind: 'restore'; readonly target: Reading; readonly original: Reading }
  | { readonly kind: 'nothing'; readonly reason: string };

/**
 * What "Undo the last entry" does: the latest reading of this session that still counts. A plain entry is
 * withdrawn. A correction is not withdrawn, because a withdrawal of a correction would leave neither the
 * correction nor the reading it corrected; instead the corrected values are recorded again, superseding it.
 * Nothing is deleted either way.
 */
export function planUndo(session: readonly SessionEntry[], readings: readonly Reading[]): UndoPlan {
  const replaced = replacedIds(readings);
  return planUndoIn(session, {
    byId: new Map(readings.map((r) => [r.id, r])),
    supersededBy: new Map([...replaced].map((id) => [id, ''])),
  });
}

/** planUndo over readings already indexed by id and by what supersedes them (the Gauge screen keeps both). */
export function planUndoIn(
  session: readonly SessionEntry[],
  readings: {
    readonly byId: ReadonlyMap<string, Reading>;
    readonly supersededBy: ReadonlyMap<string, string>;
  },
): UndoPlan {
  const { byId } = readings;
  const replaced = readings.supersededBy;
  for (let i = session.length - 1; i >= 0; i--) {
    const entry = session[i];
    const target = entry ? byId.get(entry.id) : undefined;
    if (!entry || !target || target.withdrawn || replaced.has(target.id)) continue;
    if (entry.correction && target.supersedes !== undefined) {
      const original = byId.get(target.supersedes);
      if (original && !original.withdrawn) return { kind: 'restore', target, original };
    }
    return { kind: 'withdraw', target };
  }
  return { kind: 'nothing', reason: 'nothing entered in this session is left to undo' };
}

/**
 * The session after an undo: the undone entry leaves it; a restored reading takes the place of the reading it
 * restores, as a plain entry, so the next undo withdraws it like the entry it stands for.
 */
export function afterUndo(
  session: readonly SessionEntry[],
  plan: UndoPlan,
  appendedId: string,
): SessionEntry[] {
  if (plan.kind === 'nothing') return [...session];
  return session
    .filter((e) => e.id !== plan.target.id)
    .map((e) =>
      plan.kind === 'restore' && e.id === plan.original.id ? { id: appendedId, correction: false } : e,
    );
}
