// The store's records: seams with revisions, rounds, checklist answers and append-only readings.
import { describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile } from '../../src/domain/index.js';
import { butt, fillet, freshStore, rejection, undercut, withdrawal } from './support.js';

describe('seams', () => {
  it('creates a seam with revision 1 and its first round, and lists it', async () => {
    const store = await freshStore();
    const record = await store.saveSeam(butt('s-1'));
    expect(record).toMatchObject({ id: 's-1', namespace: 'live', revision: 1 });
    expect(record.createdAt).toBe(record.updatedAt);
    expect(await store.getSeam('s-1')).toEqual(record);
    expect((await store.listSeams()).map((s) => s.id)).toEqual(['s-1']);
    const rounds = await store.listRounds('s-1');
    expect(rounds).toEqual([
      { seamId: 's-1', number: 1, kind: 'first', startedAt: record.createdAt, checklist: {} },
    ]);
  });

  it('saves a changed set-up as a new revision and an unchanged one as nothing new', async () => {
    const store = await freshStore();
    const first = await store.saveSeam(butt('s-1'));
    const same = await store.saveSeam(butt('s-1'));
    expect(same).toEqual(first);
    const changed = await store.saveSeam(butt('s-1', { length: 1500 }));
    expect(changed.revision).toBe(2);
    expect(changed.createdAt).toBe(first.createdAt);
    expect(changed.updatedAt > first.updatedAt).toBe(true);
    expect((await store.getSeam('s-1'))?.seam.length).toBe(1500);
    // Still one round: a revision of the set-up does not start a round.
    expect(await store.listRounds('s-1')).toHaveLength(1);
  });

  it('refuses a seam the grader would refuse, naming the field', async () => {
    const store = await freshStore();
    const error = await rejection(store.saveSeam(butt('s-1', { plate1: { thickness: 0.1 } })));
    expect(error.code).toBe('invalid');
    expect(error.message).toContain('seam.plate1.thickness: must be at least 0.5 mm');
    const noLevel = await rejection(
      store.saveSeam(butt('s-2', { acceptance: { edition: 'ISO 5817:2014' } })),
    );
    expect(noLevel.message).toContain('seam.acceptance: needs a required level');
    expect(await store.listSeams()).toEqual([]);
  });

  it('keeps live and demo seams apart: a live seam cannot be saved as demo', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const error = await rejection(store.saveSeam(butt('s-1', { length: 900 }), 'demo'));
    expect(error.code).toBe('invalid');
    expect((await store.getSeam('s-1'))?.revision).toBe(1);
  });

  it('stores the cached grade summary without changing the revision', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const summary = {
      state: 'graded',
      levelMet: 'C',
      meetsRequired: false,
      readingCount: 3,
      gradedAt: '2026-12-01T10:00:00.000Z',
    } as const;
    await store.setSummary('s-1', summary);
    expect(await store.getSeam('s-1')).toMatchObject({ revision: 1, summary });
    expect((await rejection(store.setSummary('nope', summary))).code).toBe('notFound');
  });
});

describe('rounds and checklist', () => {
  it('numbers rounds in order and refuses a second "first" round', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const r2 = await store.startRound('s-1', 'afterRepair', { name: 'A. Tester', qualification: 'VT 2' });
    expect(r2).toMatchObject({
      number: 2,
      kind: 'afterRepair',
      examiner: { name: 'A. Tester', qualification: 'VT 2' },
    });
    expect((await store.startRound('s-1', 'additional')).number).toBe(3);
    expect((await rejection(store.startRound('s-1', 'first'))).code).toBe('invalid');
    expect((await rejection(store.startRound('nope', 'additional'))).code).toBe('notFound');
    expect((await store.listRounds('s-1')).map((r) => r.number)).toEqual([1, 2, 3]);
  });

  it('stores checklist answers and refuses "present" without a position or beyond the seam', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1', { length: 500 }));
    await store.answerChecklist('s-1', 1, 'crack', { answer: 'noneFound' });
    const round = await store.answerChecklist('s-1', 1, 'spatter', {
      answer: 'present',
      position: 40,
      note: 'light',
    });
    expect(round.checklist).toEqual({
      crack: { answer: 'noneFound' },
      spatter: { answer: 'present', position: 40, note: 'light' },
    });
    const noPosition = await rejection(store.answerChecklist('s-1', 1, 'strayArc', { answer: 'present' }));
    expect(noPosition.message).toContain('answer.position: is needed when the item is "present"');
    const beyond = await rejection(
      store.answerChecklist('s-1', 1, 'strayArc', { answer: 'present', position: 501 }),
    );
    expect(beyond.message).toContain("beyond the seam's length of 500 mm");
    expect((await rejection(store.answerChecklist('s-1', 2, 'crack', { answer: 'noneFound' }))).code).toBe(
      'notFound',
    );
    expect((await store.listRounds('s-1'))[0]?.checklist).toEqual(round.checklist);
  });
});

describe('readings are append-only', () => {
  it('appends readings in order of entry and assembles a seam file the grader accepts', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.appendReading('s-1', undercut('r-b', 0.3, { position: 300 }));
    await store.appendReading('s-1', undercut('r-a', 0.2, { position: 100 }));
    const listed = await store.listReadings('s-1');
    // Order of entry, not id order.
    expect(listed.map((r) => [r.reading.id, r.localSeq, r.namespace])).toEqual([
      ['r-b', 1, 'live'],
      ['r-a', 2, 'live'],
    ]);
    const file = await store.seamFile('s-1');
    expect(file?.readings.map((r) => r.id)).toEqual(['r-b', 'r-a']);
    expect(file?.rounds.map((r) => r.number)).toEqual([1]);
    expect(parseSeamFile(file).ok).toBe(true);
    expect(await store.seamFile('nope')).toBeUndefined();
  });

  it('refuses a reading id that is stored already, and leaves the stored reading as it was', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.appendReading('s-1', undercut('r-1', 0.3));
    const again = await rejection(store.appendReading('s-1', undercut('r-1', 0.3)));
    expect(again.code).toBe('exists');
    expect(again.message).toContain('already stored (with the same content)');
    const other = await rejection(store.appendReading('s-1', undercut('r-1', 0.9)));
    expect(other.code).toBe('exists');
    expect(other.message).toContain('record a correction with a new id');
    const listed = await store.listReadings('s-1');
    expect(listed.map((r) => r.reading.values.undercutDepth)).toEqual([0.3]);
  });

  it('records a correction and a withdrawal as new readings; the original stays stored', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    // ISO 5817:2014 Table 1 row 1.7, t = 10 > 3: B h ≤ 0.05·t max 0.5, D h ≤ 0.2·t max 1; so 0.8 meets D only.
    await store.appendReading('s-1', undercut('r-1', 0.8));
    await store.appendReading('s-1', undercut('r-2', 0.3, { supersedes: 'r-1' }));
    await store.appendReading('s-1', undercut('r-3', 0.9, { position: 400 }));
    await store.appendReading('s-1', withdrawal('r-4', 'r-3'));
    await store.answerChecklist('s-1', 1, 'crack', { answer: 'noneFound' });
    const ids = (await store.listReadings('s-1')).map((r) => r.reading.id);
    expect(ids).toEqual(['r-1', 'r-2', 'r-3', 'r-4']);
    const file = await store.seamFile('s-1');
    const parsed = parseSeamFile(file);
    expect(parsed.ok).toBe(true);
    if (!parsed.ok) return;
    const round = gradeSeam(parsed.value).rounds[0];
    expect(round?.supersededReadings).toEqual(['r-1', 'r-3']);
    expect(round?.readings.map((r) => r.readingId)).toEqual(['r-2']);
  });

  it('refuses a second correction of the same reading, and corrections of readings it does not have', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    await store.saveSeam(butt('s-2'));
    await store.appendReading('s-1', undercut('r-1', 0.8));
    await store.appendReading('s-2', undercut('other', 0.8));
    await store.appendReading('s-1', undercut('r-2', 0.3, { supersedes: 'r-1' }));
    const twice = await rejection(store.appendReading('s-1', undercut('r-3', 0.4, { supersedes: 'r-1' })));
    expect(twice.message).toContain(
      '"r-1" is already superseded by "r-2"; correct the latest reading instead',
    );
    const unknown = await rejection(
      store.appendReading('s-1', undercut('r-4', 0.4, { supersedes: 'ghost' })),
    );
    expect(unknown.message).toContain('names reading "ghost", which is not stored for this seam');
    const foreign = await rejection(
      store.appendReading('s-1', undercut('r-5', 0.4, { supersedes: 'other' })),
    );
    expect(foreign.message).toContain('names reading "other", which is not stored for this seam');
    expect((await store.listReadings('s-1')).map((r) => r.reading.id)).toEqual(['r-1', 'r-2']);
  });

  it('refuses readings the grader would refuse, with the field and what is allowed', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1', { length: 500 }));
    await store.saveSeam(fillet('f-1'));
    const angle = await rejection(
      store.appendReading('s-1', undercut('r-1', 0.2, { values: { toeAngle: 75 } })),
    );
    expect(angle.code).toBe('invalid');
    expect(angle.message).toContain('reading.values.toeAngle');
    const beyond = await rejection(store.appendReading('s-1', undercut('r-2', 0.2, { position: 600 })));
    expect(beyond.message).toContain("reading.position: lies beyond the seam's length of 500 mm");
    const noRound = await rejection(store.appendReading('s-1', undercut('r-3', 0.2, { round: 3 })));
    expect(noRound.message).toContain('round 3 is not a round of this seam');
    // A throat belongs to fillet welds (ISO 5817 row 1.20 applies to fillet welds only).
    const throat = await rejection(
      store.appendReading(
        's-1',
        undercut('r-4', 0.2, { toe: undefined, side: 'face', values: { throat: 5 } }),
      ),
    );
    expect(throat.message).toContain('does not apply to a butt joint');
    const shape = await rejection(store.appendReading('s-1', { id: 'r-5' } as never));
    expect(shape.message).toContain('reading.round');
    expect((await rejection(store.appendReading('nope', undercut('r-6', 0.2)))).code).toBe('notFound');
    expect(await store.listReadings('s-1')).toEqual([]);
    await store.appendReading(
      'f-1',
      undercut('f-r1', 0.2, { toe: undefined, side: 'face', values: { throat: 5 } }),
    );
    expect(await store.listReadings('f-1')).toHaveLength(1);
  });

  it('opens the same database again with everything in it', async () => {
    const first = await freshStore();
    await first.saveSeam(butt('s-1'));
    await first.appendReading('s-1', undercut('r-1', 0.3));
    first.close();
    const again = await freshStore({ name: first.name });
    expect((await again.listReadings('s-1')).map((r) => r.reading.id)).toEqual(['r-1']);
    expect(await again.health()).toMatchObject({ state: 'ok' });
  });
});
