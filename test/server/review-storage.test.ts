// The review's part of the storage module on its own: decisions (one transaction with the change devices pull,
// the previous-decision check, triggers that refuse change), review facts (newer never overwritten by older,
// stale ones found), the queue statement (filters bound as values, null keys last, counts) and batches of a seam.
import { describe, expect, it } from 'vitest';
import { SqliteStorage } from '../../src/server/storage/sqlite/sqlite-storage.js';
import type { NewDecision, ReviewFacts, ReviewQuery, Storage } from '../../src/server/storage/types.js';

const T = (minute: number) => new Date(Date.UTC(2026, 11, 2, 9, minute)).toISOString();
const KID = 'A'.repeat(43);

async function setUp(): Promise<{ s: SqliteStorage; accountId: number }> {
  const s = SqliteStorage.open(':memory:');
  const account = await s.createAccount({
    username: 'sup',
    role: 'supervisor',
    passwordHash: 'x',
    mustChangePassword: false,
    createdAt: T(0),
  });
  await s.createEnrolmentCode({ codeHash: 'c', createdBy: account.id, createdAt: T(0), expiresAt: T(10) });
  await s.enrolDevice({ codeHash: 'c', now: T(1), kid: KID, publicJwk: '{}', name: 'Tablet' });
  return { s, accountId: account.id };
}

function facts(seamId: string, over: Partial<ReviewFacts> = {}): ReviewFacts {
  return {
    seamId,
    namespace: 'live',
    label: `Seam ${seamId}`,
    tags: [],
    organisation: null,
    area: null,
    drawing: null,
    welder: null,
    procedure: null,
    requiredLevel: 'C',
    edition: 'ISO 5817:2014',
    state: 'graded',
    levelMet: 'C',
    levelRank: 2,
    meetsRequired: true,
    gradedRound: 1,
    latestRound: 1,
    readingCount: 1,
    borderlineCount: 0,
    fatFlag: null,
    samplingAdequate: null,
    unverifiedRows: 0,
    deviceLevelMet: null,
    gradeMismatch: false,
    inspectedFirst: '2026-11-10',
    inspectedLast: '2026-11-10',
    lastReceivedAt: T(3),
    basedOn: 1,
    gradedAt: T(4),
    computedAt: T(5),
    inspectors: [],
    ...over,
  };
}

const query = (over: Partial<ReviewQuery> = {}): ReviewQuery => ({
  flags: [],
  welder: null,
  procedure: null,
  drawing: null,
  area: null,
  deviceKid: null,
  inspector: null,
  from: null,
  to: null,
  text: null,
  sort: 'label',
  descending: false,
  offset: 0,
  limit: 50,
  ...over,
});

const decision = (
  accountId: number,
  id: string,
  previousId: string | null,
  over: Partial<NewDecision> = {},
): NewDecision => ({
  id,
  seamId: 'seam-1',
  round: 1,
  outcome: 'accepted',
  comment: null,
  decidedBy: accountId,
  decidedByName: 'sup',
  decidedAt: T(6),
  basedOn: 0,
  serverLevelMet: 'C',
  jws: `{"jws":"${id}"}`,
  previousId,
  item: `{"id":"${id}"}`,
  ...over,
});

const labels = async (s: Storage, q: Partial<ReviewQuery> = {}) =>
  (await s.reviewQueue(query(q))).rows.map((r) => r.seamId);

describe('decisions in storage', () => {
  it('records the decision and its change in one transaction, only while the previous one named is the newest', async () => {
    const { s, accountId } = await setUp();
    const first = await s.addDecision(decision(accountId, 'd1', null));
    expect(first.kind).toBe('added');
    if (first.kind !== 'added') return;
    expect(first.decision).toMatchObject({ id: 'd1', seamId: 'seam-1', changeSeq: first.change.seq });
    expect(first.change).toMatchObject({
      kind: 'decision',
      itemId: 'd1',
      deviceKid: null,
      item: '{"id":"d1"}',
    });
    // A second decision that does not name d1 as its previous one is not recorded.
    expect(await s.addDecision(decision(accountId, 'd2', null))).toEqual({ kind: 'stale', latestId: 'd1' });
    expect((await s.addDecision(decision(accountId, 'd2', 'd1', { outcome: 'rework' }))).kind).toBe('added');
    expect((await s.listDecisions('seam-1')).map((d) => [d.id, d.outcome])).toEqual([
      ['d1', 'accepted'],
      ['d2', 'rework'],
    ]);
    expect((await s.listChangesOfSeam('seam-1')).map((c) => c.itemId)).toEqual(['d1', 'd2']);
    expect(await s.getDecision('d1')).toMatchObject({ jws: '{"jws":"d1"}', decidedByName: 'sup' });
    await s.close();
  });

  it('refuses in the database itself to change or remove a decision or a change', async () => {
    const { s, accountId } = await setUp();
    await s.addDecision(decision(accountId, 'd1', null));
    const db = s.database;
    expect(() => db.prepare("UPDATE decisions SET comment = 'x'").run()).toThrow(/immutable/);
    expect(() => db.prepare('DELETE FROM decisions').run()).toThrow(/never removed/);
    expect(() => db.prepare("UPDATE changes SET item = 'x'").run()).toThrow(/immutable/);
    expect(() => db.prepare('DELETE FROM changes').run()).toThrow(/never removed/);
    expect(await s.getDecision('d1')).toMatchObject({ comment: null });
    await s.close();
  });

  it('gives the newest record number of a seam, and the batches that brought its records in order', async () => {
    const { s } = await setUp();
    expect(await s.latestRecordSeq('seam-1')).toBe(0);
    const rec = (index: number, id: string, seamId: string) => ({
      index,
      status: 'valid' as const,
      id,
      kind: 'reading',
      schemaVersion: 1,
      seamId,
      seq: index + 1,
      body: '{}',
      createdAt: T(2),
    });
    const batch = (batchId: string, seq: number, records: ReturnType<typeof rec>[]) => ({
      batchId,
      deviceKid: KID,
      deviceSeq: seq,
      payloadSha256: batchId,
      jws: `{"payload":"${batchId}"}`,
      receivedAt: T(3),
      records,
      deviceGrades: [],
    });
    await s.applyBatch(batch('b-late', 1, [rec(0, 'r1', 'seam-1'), rec(1, 'r2', 'seam-2')]));
    await s.applyBatch(batch('a-early', 2, [rec(0, 'r3', 'seam-2')]));
    await s.applyBatch(batch('c', 3, [rec(0, 'r4', 'seam-1')]));
    expect(await s.latestRecordSeq('seam-1')).toBe(4);
    expect((await s.batchesOfSeam('seam-1')).map((b) => [b.batchId, b.jws])).toEqual([
      ['b-late', '{"payload":"b-late"}'],
      ['c', '{"payload":"c"}'],
    ]);
    expect((await s.batchesOfSeam('seam-2')).map((b) => b.batchId)).toEqual(['b-late', 'a-early']);
    await s.close();
  });
});

describe('review facts and the queue in storage', () => {
  it('keeps newer facts over older ones, inspectors included, and finds facts that lag their grade', async () => {
    const { s } = await setUp();
    await s.saveReviewFacts(facts('s1', { basedOn: 5, inspectors: ['Ann', 'Bo'] }));
    await s.saveReviewFacts(facts('s1', { basedOn: 4, label: 'older', inspectors: ['Cy'] }));
    expect(await s.getReviewFacts('s1')).toMatchObject({
      basedOn: 5,
      label: 'Seam s1',
      inspectors: ['Ann', 'Bo'],
    });
    await s.saveReviewFacts(facts('s1', { basedOn: 5, gradedAt: T(9), welder: 'W-1', inspectors: ['Bo'] }));
    expect(await s.getReviewFacts('s1')).toMatchObject({ welder: 'W-1', inspectors: ['Bo'] });
    const grade = (seamId: string, basedOn: number, gradedAt: string) =>
      s.saveServerGrade({
        seamId,
        basedOn,
        gradedAt,
        state: 'graded',
        levelMet: 'C',
        meetsRequired: true,
        summary: '{}',
      });
    await grade('s1', 5, T(9));
    await grade('s2', 1, T(9));
    expect(await s.staleReviewFacts()).toEqual(['s2']);
    await grade('s1', 6, T(10));
    expect(await s.staleReviewFacts()).toEqual(['s1', 's2']);
    await s.close();
  });

  it('filters with values bound as data, sorts seams without the key last, and counts per flag', async () => {
    const { s, accountId } = await setUp();
    await s.saveReviewFacts(
      facts('seam-1', { welder: "O'Neil", levelRank: 1, levelMet: 'D', meetsRequired: false }),
    );
    await s.saveReviewFacts(
      facts('s2', { welder: 'W-2', levelRank: null, levelMet: null, state: 'incomplete' }),
    );
    await s.saveReviewFacts(
      facts('s3', { welder: null, levelRank: 3, levelMet: 'B', borderlineCount: 2, tags: ['T-1', 'x%'] }),
    );
    expect(await labels(s, { welder: "O'Neil" })).toEqual(['seam-1']);
    expect(await labels(s, { welder: "' OR 1=1 --" })).toEqual([]);
    expect(await labels(s, { text: '%' })).toEqual(['s3']);
    expect(await labels(s, { text: 't-1' })).toEqual(['s3']);
    expect(await labels(s, { sort: 'level' })).toEqual(['seam-1', 's3', 's2']);
    expect(await labels(s, { sort: 'level', descending: true })).toEqual(['s3', 'seam-1', 's2']);
    expect(await labels(s, { sort: 'welder' })).toEqual(['seam-1', 's2', 's3']);
    expect(await labels(s, { flags: ['borderline'] })).toEqual(['s3']);
    const page = await s.reviewQueue(query({ flags: ['belowRequired'] }));
    expect(page).toMatchObject({
      total: 1,
      scope: 3,
      counts: { belowRequired: 1, borderline: 1, unreviewed: 3, fatBelow: 0, samplingShort: 0 },
    });
    // A decision that saw every record makes the seam reviewed.
    await s.addDecision(decision(accountId, 'd1', null, { basedOn: 1 }));
    expect(await labels(s, { flags: ['unreviewed'] })).toEqual(['s2', 's3']);
    const row = (await s.reviewQueue(query({ text: 'seam-1' }))).rows[0];
    expect(row).toMatchObject({
      reviewed: true,
      decision: { id: 'd1', outcome: 'accepted', decidedByName: 'sup' },
    });
    expect(await s.reviewSelection(query({ sort: 'level' }), 2)).toEqual(['seam-1', 's3']);
    expect((await s.reviewChoices()).welders).toEqual([
      { value: "O'Neil", label: "O'Neil", count: 1 },
      { value: 'W-2', label: 'W-2', count: 1 },
    ]);
    await s.close();
  });
});
