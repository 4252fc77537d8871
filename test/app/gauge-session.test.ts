// "Undo the last entry" appends a record, never deletes (design.md §3: "Nothing is ever deleted"; store contract
// src/store/api.ts: corrections are new readings with `supersedes`, an undo a new reading with `withdrawn`).
import { describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile } from '../../src/domain/index.js';
import { buildRestore, buildWithdrawal } from '../../src/app/screens/gauge/reading-builder.js';
import {
  afterUndo,
  currentReadings,
  latestCurrent,
  loadSession,
  planUndo,
  planUndoIn,
  saveSession,
  SESSION_LIMIT,
  sessionKey,
  withEntry,
  type SessionEntry,
} from '../../src/app/screens/gauge/session.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';
import { addToContext, entryContext } from '../../workers/entry-check-api.js';

const toe = { plate: 1, side: 'face' } as const;
const a = reading({ undercutDepth: 0.3 }, { id: 'a', toe });
const b = reading({ undercutDepth: 0.4 }, { id: 'b', toe, position: 150 });
const fixB = reading({ undercutDepth: 0.1 }, { id: 'fixB', toe, position: 150, supersedes: 'b' });
const withdrawB = reading({}, { id: 'wB', supersedes: 'b', withdrawn: true });
const entry = (id: string, correction = false): SessionEntry => ({ id, correction });

describe('what undo acts on', () => {
  it("withdraws this session's latest reading that still counts", () => {
    expect(planUndo([entry('a'), entry('b')], [a, b])).toEqual({ kind: 'withdraw', target: b });
  });

  it('skips readings already withdrawn or corrected, and readings from before the session', () => {
    expect(planUndo([entry('a'), entry('b')], [a, b, withdrawB])).toEqual({ kind: 'withdraw', target: a });
    expect(planUndo([], [a, b]).kind).toBe('nothing');
  });

  it('undoing a correction restores the corrected reading rather than withdrawing both', () => {
    expect(planUndo([entry('fixB', true)], [a, b, fixB])).toEqual({
      kind: 'restore',
      target: fixB,
      original: b,
    });
  });

  it('lists the readings that count: no withdrawals, nothing superseded', () => {
    expect(currentReadings([a, b, fixB]).map((r) => r.id)).toEqual(['a', 'fixB']);
    expect(currentReadings([a, b, withdrawB]).map((r) => r.id)).toEqual(['a']);
  });

  it('finds the latest readings that count from the newest back, as the full list would', () => {
    const many = [a, b, fixB, ...Array.from({ length: 30 }, (_, i) => reading({}, { id: `n${i}` }))];
    const wN5 = reading({}, { id: 'wN5', supersedes: 'n5', withdrawn: true });
    const all = [...many, wN5];
    const ctx = entryContext(seamFile(buttSeam(), all));
    const full = currentReadings(all).reverse();
    expect(latestCurrent(all, ctx.supersededBy, 20)).toEqual(full.slice(0, 20));
    expect(latestCurrent(all, ctx.supersededBy, 100)).toEqual(full);
  });

  it('keeps the count of readings that count as readings arrive, without recounting', () => {
    const ctx = entryContext(seamFile(buttSeam(), [a, b]));
    expect(ctx.counting).toBe(2);
    addToContext(ctx, fixB);
    expect(ctx.counting).toBe(currentReadings([a, b, fixB]).length);
    addToContext(ctx, fixB);
    expect(ctx.counting).toBe(2);
    const withdrawFix = reading({}, { id: 'wFix', supersedes: 'fixB', withdrawn: true });
    addToContext(ctx, withdrawFix);
    expect(ctx.counting).toBe(currentReadings([a, b, fixB, withdrawFix]).length);
    expect(ctx.counting).toBe(1);
  });
});

describe('undo, step by step, on a real seam record', () => {
  it('entry b, its correction, undo (b counts again), undo (b withdrawn), undo (a withdrawn): every record kept', () => {
    const seam = buttSeam();
    let readings = [a, b, fixB];
    let session = [entry('a'), entry('b'), entry('fixB', true)];
    const steps: string[] = [];
    for (let i = 0; i < 3; i++) {
      const plan = planUndo(session, readings);
      if (plan.kind === 'nothing') throw new Error(plan.reason);
      const stamp = { id: `u${i}`, recordedAt: '2026-11-19T09:00:00Z' };
      const rec =
        plan.kind === 'withdraw'
          ? buildWithdrawal(plan.target, stamp)
          : buildRestore(plan.original, plan.target, stamp);
      readings = [...readings, rec];
      const parsed = parseSeamFile(seamFile(seam, readings));
      expect(parsed.ok).toBe(true);
      session = afterUndo(session, plan, rec.id);
      const counted = gradeSeam(seamFile(seam, readings)).rounds[0]?.readings.map(
        (r) => `${r.readingId}:${r.imperfections[0]?.measured}`,
      );
      steps.push(`${plan.kind} → ${counted?.join(',') || 'none'}`);
    }
    expect(steps).toEqual(['restore → a:0.3,u0:0.4', 'withdraw → a:0.3', 'withdraw → none']);
    expect(readings.map((r) => r.id)).toEqual(['a', 'b', 'fixB', 'u0', 'u1', 'u2']);
    expect(planUndo(session, readings).kind).toBe('nothing');
  });
});

describe('the session list survives a reload of the tab', () => {
  it('round-trips through session storage, per seam, and ignores junk', () => {
    const mem = new Map<string, string>();
    const store = {
      getItem: (k: string) => mem.get(k) ?? null,
      setItem: (k: string, v: string) => void mem.set(k, v),
    };
    saveSession(store, 'seam-1', [entry('a'), entry('b', true)]);
    expect(loadSession(store, 'seam-1')).toEqual([entry('a'), entry('b', true)]);
    expect(loadSession(store, 'seam-2')).toEqual([]);
    mem.set(sessionKey('seam-3'), '{not json');
    expect(loadSession(store, 'seam-3')).toEqual([]);
    mem.set(sessionKey('seam-4'), JSON.stringify(['old-style-id', { id: 7 }, { id: 'ok' }]));
    expect(loadSession(store, 'seam-4')).toEqual([entry('ok')]);
  });
});

describe('a long session', () => {
  it(`keeps the latest ${SESSION_LIMIT} entries, so saving it does not grow with the session`, () => {
    let session: SessionEntry[] = [];
    for (let i = 0; i < SESSION_LIMIT + 5; i++) session = withEntry(session, entry(`r${i}`));
    expect(session).toHaveLength(SESSION_LIMIT);
    expect(session[0]).toEqual(entry('r5'));
    expect(session[session.length - 1]).toEqual(entry(`r${SESSION_LIMIT + 4}`));
    const mem = new Map<string, string>();
    const store = {
      getItem: (k: string) => mem.get(k) ?? null,
      setItem: (k: string, v: string) => void mem.set(k, v),
    };
    saveSession(store, 'seam-1', [entry('old'), ...session]);
    expect(loadSession(store, 'seam-1')).toEqual(session);
  });

  it('plans the same undo from readings indexed by id as from the list of readings', () => {
    const readings = [a, b, fixB];
    const byId = new Map(readings.map((r) => [r.id, r]));
    const supersededBy = new Map([['b', 'fixB']]);
    const session = [entry('a'), entry('b'), entry('fixB', true)];
    expect(planUndoIn(session, { byId, supersededBy })).toEqual(planUndo(session, readings));
    expect(planUndoIn(session.slice(0, 2), { byId, supersededBy })).toEqual(
      planUndo(session.slice(0, 2), readings),
    );
  });
});
