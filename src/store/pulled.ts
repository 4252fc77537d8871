// What the device pulls from the server — review decisions and assignments, each verified by the sync client
// before it gets here — kept with the cursor in one transaction, so a pull is stored whole or not at all and the
// next pull starts after exactly what was kept. Items are kept by id: pulling one again changes nothing. The store
// loads this module on first use, outside the first paint.
import type {
  AssignmentRecord,
  DecisionRecord,
  PullApplied,
  PulledItem,
  RoundRecord,
  SeamRecord,
} from './api.js';
import type { StoreContext } from './context.js';
import type { OutboxEntry } from './api.js';

const MAX_ROUND = 999;

// The round record the outbox carries, and one seam's rounds as a key range: the same as records.ts, written out
// here so this module (loaded later) does not split the store's first-paint chunk.
const roundEntry = (round: RoundRecord, recordId: string, now: string): OutboxEntry =>
  ({
    recordId,
    kind: 'round',
    seamId: round.seamId,
    body: { seamId: round.seamId, number: round.number, kind: round.kind, startedAt: round.startedAt },
    createdAt: now,
  }) as OutboxEntry;
const roundsOf = (seamId: string) => IDBKeyRange.bound([seamId, -Infinity], [seamId, Infinity]);

export async function receivePulled(
  ctx: StoreContext,
  items: readonly PulledItem[],
  cursor: string,
): Promise<PullApplied> {
  const now = ctx.now();
  // Ids made before the transaction: nothing but IndexedDB requests may be awaited inside it. The seams need no
  // check here: the puller kept only items the server signed and the protocol's schema (the seam schema) passed.
  const prepared = items.map((item) => ({ item, roundId: ctx.newId() }));
  return ctx.conn.run(
    ['meta', 'seams', 'rounds', 'outbox', 'decisions', 'assignments'],
    'readwrite',
    async (tx) => {
      const seams = tx.objectStore('seams');
      const rounds = tx.objectStore('rounds');
      const outbox = tx.objectStore('outbox');
      const applied = { decisions: 0, assignments: 0, seamsAdded: 0, roundsOpened: 0 };
      for (const p of prepared) {
        if (p.item.type === 'assignment') {
          const a = p.item;
          if (await tx.objectStore('assignments').getKey(a.id)) continue;
          let seamAdded = false;
          if ((await seams.getKey(a.seamId)) === undefined) {
            const record: SeamRecord = {
              id: a.seamId,
              namespace: 'live',
              seam: a.seam,
              revision: 1,
              createdAt: now,
              updatedAt: now,
            };
            const first: RoundRecord = {
              seamId: a.seamId,
              number: 1,
              kind: 'first',
              startedAt: now,
              checklist: {},
            };
            await seams.add(record);
            await rounds.add(first);
            // The set-up came from the server; the round started here is this device's record to send.
            await outbox.add(roundEntry(first, p.roundId, now));
            seamAdded = true;
            applied.seamsAdded += 1;
          }
          const kept: AssignmentRecord = {
            id: a.id,
            seamId: a.seamId,
            ...(a.note !== undefined ? { note: a.note } : {}),
            assignedBy: a.assignedBy,
            assignedAt: a.assignedAt,
            receivedAt: now,
            seamAdded,
            signed: a.signed,
          };
          await tx.objectStore('assignments').add(kept);
          applied.assignments += 1;
          continue;
        }
        const d = p.item;
        if (await tx.objectStore('decisions').getKey(d.id)) continue;
        let roundOpened: number | undefined;
        const seam = await seams.get(d.seamId);
        if (d.outcome === 'rework' && seam) {
          // Rework opens the next round, once: only when the decision is on the device's latest round.
          const last = await rounds.openCursor(roundsOf(d.seamId), 'prev');
          const latest = last?.value.number ?? 0;
          if (latest === d.round && latest < MAX_ROUND) {
            const round: RoundRecord = {
              seamId: d.seamId,
              number: latest + 1,
              kind: 'afterRepair',
              startedAt: now,
              checklist: {},
            };
            await rounds.add(round);
            if (seam.namespace === 'live') await outbox.add(roundEntry(round, p.roundId, now));
            roundOpened = round.number;
            applied.roundsOpened += 1;
          }
        }
        const kept: DecisionRecord = {
          id: d.id,
          seamId: d.seamId,
          round: d.round,
          outcome: d.outcome,
          ...(d.comment !== undefined ? { comment: d.comment } : {}),
          decidedBy: d.decidedBy,
          decidedAt: d.decidedAt,
          receivedAt: now,
          ...(roundOpened !== undefined ? { roundOpened } : {}),
          signed: d.signed,
        };
        await tx.objectStore('decisions').add(kept);
        applied.decisions += 1;
      }
      await tx.objectStore('meta').put({ key: 'pullCursor', value: cursor });
      return applied;
    },
  );
}

export async function pullCursor(ctx: StoreContext): Promise<string | null> {
  const row = await ctx.conn.run(['meta'], 'readonly', (tx) => tx.store.get('pullCursor'));
  return row?.key === 'pullCursor' ? row.value : null;
}

const byDecidedAt = (a: DecisionRecord, b: DecisionRecord) =>
  a.decidedAt.localeCompare(b.decidedAt) || a.id.localeCompare(b.id);

export async function listDecisions(ctx: StoreContext, seamId: string): Promise<DecisionRecord[]> {
  const all = await ctx.conn.run(['decisions'], 'readonly', (tx) => tx.store.index('bySeam').getAll(seamId));
  return all.sort(byDecidedAt);
}

export async function unseenDecisions(ctx: StoreContext): Promise<Map<string, DecisionRecord>> {
  const all = await ctx.conn.run(['decisions'], 'readonly', (tx) => tx.store.getAll());
  const out = new Map<string, DecisionRecord>();
  for (const d of all.sort(byDecidedAt)) if (d.seenAt === undefined) out.set(d.seamId, d);
  return out;
}

export async function markDecisionsSeen(ctx: StoreContext, seamId: string): Promise<void> {
  const now = ctx.now();
  await ctx.conn.run(['decisions'], 'readwrite', async (tx) => {
    for (const d of await tx.store.index('bySeam').getAll(seamId)) {
      if (d.seenAt === undefined) await tx.store.put({ ...d, seenAt: now });
    }
  });
}

export const listAssignments = (ctx: StoreContext, seamId: string): Promise<AssignmentRecord[]> =>
  ctx.conn.run(['assignments'], 'readonly', (tx) => tx.store.index('bySeam').getAll(seamId));
