// Pull on the tablet against the yard server in process: assignments set the seam up on the tablet, decisions are
// kept with their signed items, a rework decision opens the next round (once), a repeated pull changes nothing,
// and an item that does not verify with the server key learnt at enrolment keeps the whole page out.
import { describe, expect, it } from 'vitest';
import { Puller } from '../../src/app/sync/puller.js';
import { testSeam } from '../server/records.js';
import { testServer } from '../server/support.js';
import { enrol, seamWithReadings, tablet, type Tablet } from './support.js';

const pullerOf = (t: Tablet) =>
  new Puller({ store: t.store, vault: t.vault, transport: () => t.wire.transport });

describe('pull on the tablet', () => {
  it('sets up assigned seams, keeps decisions, opens a round on rework once, and resumes from its cursor', async () => {
    const server = await testServer();
    const t = await tablet(server);
    expect(await pullerOf(t).pullNow()).toEqual({ kind: 'notEnrolled' });
    const kid = await enrol(server, t);
    // A seam of the tablet's own, sent, then sent back for rework by the supervisor.
    await seamWithReadings(t.store, 'own-seam', 2);
    await t.sender.sendNow();
    await server.settle();
    const assigned = testSeam('assigned-seam', { label: 'Assigned splice' });
    await server.admin('PUT', `/seams/${assigned.id}`, { seam: assigned });
    await server.admin('POST', '/assignments', { seamId: assigned.id, deviceKid: kid, note: 'Start aft' });
    await server.admin('POST', '/decisions', {
      seamId: 'own-seam',
      round: 1,
      outcome: 'rework',
      comment: 'Grind the undercut at 20 mm',
    });
    const puller = pullerOf(t);
    const seen: unknown[] = [];
    puller.subscribe((o) => seen.push(o));
    const outcome = await puller.pullNow();
    expect(outcome).toEqual({
      kind: 'pulled',
      applied: { decisions: 1, assignments: 1, seamsAdded: 1, roundsOpened: 1 },
    });
    expect(seen).toEqual([outcome]);
    expect((await t.store.getSeam('assigned-seam'))?.seam.label).toBe('Assigned splice');
    expect((await t.store.listAssignments('assigned-seam'))[0]).toMatchObject({
      note: 'Start aft',
      seamAdded: true,
    });
    const [decision] = await t.store.listDecisions('own-seam');
    expect(decision).toMatchObject({
      outcome: 'rework',
      round: 1,
      roundOpened: 2,
      comment: 'Grind the undercut at 20 mm',
    });
    expect(decision?.seenAt).toBeUndefined();
    expect((await t.store.listRounds('own-seam')).map((r) => [r.number, r.kind])).toEqual([
      [1, 'first'],
      [2, 'afterRepair'],
    ]);
    // The new rounds are the tablet's records: the assigned seam's first round and round 2 wait to be sent.
    const waiting = (await t.store.outboxEntries()).map((e) => [e.kind, e.seamId]);
    expect(waiting).toEqual([
      ['round', 'assigned-seam'],
      ['round', 'own-seam'],
    ]);
    expect([...(await t.store.unseenDecisions()).keys()]).toEqual(['own-seam']);
    await t.store.markDecisionsSeen('own-seam');
    expect((await t.store.unseenDecisions()).size).toBe(0);
    // Nothing new: the next pull starts after the cursor and brings nothing, and no second round opens.
    expect(await puller.pullNow()).toEqual({
      kind: 'pulled',
      applied: { decisions: 0, assignments: 0, seamsAdded: 0, roundsOpened: 0 },
    });
    expect(await t.store.listRounds('own-seam')).toHaveLength(2);
  });

  it('keeps nothing of a page holding an item the server key does not verify', async () => {
    const server = await testServer();
    const t = await tablet(server);
    const kid = await enrol(server, t);
    const seam = testSeam('s-1');
    await server.admin('PUT', `/seams/${seam.id}`, { seam });
    await server.admin('POST', '/assignments', { seamId: seam.id, deviceKid: kid });
    const original = t.wire.transport;
    const tampering = async (path: string, init: RequestInit) => {
      const res = await original(path, init);
      if (path !== '/api/sync/pull') return res;
      const body = (await res.json()) as { items: { payload: string }[] };
      const first = body.items[0];
      if (first)
        first.payload = first.payload.slice(0, -4) + (first.payload.endsWith('AAAA') ? 'BBBB' : 'AAAA');
      return new Response(JSON.stringify(body), {
        status: 200,
        headers: { 'content-type': 'application/json' },
      });
    };
    const puller = new Puller({ store: t.store, vault: t.vault, transport: () => tampering });
    const outcome = await puller.pullNow();
    expect(outcome.kind).toBe('failed');
    expect(await t.store.getSeam('s-1')).toBeUndefined();
    expect(await t.store.pullCursor()).toBeNull();
    // The true page, untouched, is kept.
    expect((await pullerOf(t).pullNow()).kind).toBe('pulled');
    expect(await t.store.getSeam('s-1')).toBeDefined();
  });
});
