// Backups: a full export, and an import that adds what is missing, skips what is identical, refuses what
// conflicts (with a reason), and never deletes or doubles anything.
import { describe, expect, it } from 'vitest';
import type { BackupFile, Store } from '../../src/store/api.js';
import { butt, fillet, freshStore, rejection, undercut, withdrawal } from './support.js';

/** A device with live work of every kind, some of it already acknowledged, and the demo yard. */
async function deviceWithWork(): Promise<Store> {
  const store = await freshStore();
  await store.saveSeam(butt('s-1'));
  await store.saveSeam(butt('s-1', { length: 1400 }));
  await store.saveSeam(fillet('f-1'));
  await store.answerChecklist('s-1', 1, 'crack', { answer: 'noneFound' });
  await store.answerChecklist('s-1', 1, 'spatter', { answer: 'present', position: 300, note: 'light' });
  await store.appendReading('s-1', undercut('r-1', 0.8));
  await store.appendReading('s-1', undercut('r-2', 0.3, { supersedes: 'r-1' }));
  await store.appendReading('s-1', undercut('r-3', 0.4, { position: 900 }));
  await store.appendReading('s-1', withdrawal('r-4', 'r-3'));
  await store.startRound('s-1', 'afterRepair', { name: 'A. Tester' });
  await store.appendReading('s-1', undercut('r-5', 0.1, { round: 2 }));
  await store.appendReading(
    'f-1',
    undercut('f-r1', 0.2, { toe: undefined, side: 'face', values: { throat: 5 } }),
  );
  await store.setSummary('f-1', {
    state: 'incomplete',
    levelMet: 'B',
    meetsRequired: null,
    readingCount: 1,
    gradedAt: '2026-12-01T10:00:00.000Z',
  });
  await store.loadDemo();
  return store;
}

/** A backup through JSON, as it travels in a file. */
const throughFile = (backup: BackupFile): unknown => JSON.parse(JSON.stringify(backup));

const withoutTime = ({ exportedAt: _exportedAt, ...rest }: BackupFile) => rest;

const emptyBackup = (over: Partial<BackupFile> = {}): BackupFile => ({
  format: 'beadbook.backup/1',
  exportedAt: '2026-12-01T12:00:00.000Z',
  seams: [],
  rounds: [],
  readings: [],
  outbox: [],
  ...over,
});

describe('backup', () => {
  it('exports everything and restores it onto an empty device exactly', async () => {
    const source = await deviceWithWork();
    const backup = await source.exportBackup();
    expect(backup.format).toBe('beadbook.backup/1');
    expect(backup.seams.length).toBe(2 + 6);
    expect(backup.readings.map((r) => r.localSeq)).toEqual(
      [...backup.readings.map((r) => r.localSeq)].sort((a, b) => a - b),
    );
    const target = await freshStore();
    const report = await target.importBackup(throughFile(backup));
    expect(report.refused).toEqual([]);
    expect(report).toMatchObject({
      seamsAdded: backup.seams.length,
      seamsUpdated: 0,
      roundsAdded: backup.rounds.length,
      readingsAdded: backup.readings.length,
      outboxAdded: backup.outbox.length,
      duplicatesSkipped: 0,
    });
    expect(withoutTime(await target.exportBackup())).toEqual(withoutTime(backup));
    expect(await target.seamFile('s-1')).toEqual(await source.seamFile('s-1'));
    // New work on the restored device continues the order of entry.
    const next = await target.appendReading('s-1', undercut('r-6', 0.2, { round: 2, position: 500 }));
    expect(next.localSeq).toBe(Math.max(...backup.readings.map((r) => r.localSeq)) + 1);
  });

  it('adds nothing when the same backup is imported twice, or onto the device it came from', async () => {
    const source = await deviceWithWork();
    const backup = throughFile(await source.exportBackup());
    const before = withoutTime(await source.exportBackup());
    const total = (b: BackupFile) => b.seams.length + b.rounds.length + b.readings.length + b.outbox.length;
    const onSource = await source.importBackup(backup);
    expect(onSource).toMatchObject({
      seamsAdded: 0,
      seamsUpdated: 0,
      roundsAdded: 0,
      roundsUpdated: 0,
      readingsAdded: 0,
      outboxAdded: 0,
      duplicatesSkipped: total(backup as BackupFile),
      refused: [],
    });
    expect(withoutTime(await source.exportBackup())).toEqual(before);
    const target = await freshStore();
    await target.importBackup(backup);
    const second = await target.importBackup(backup);
    expect(second.duplicatesSkipped).toBe(total(backup as BackupFile));
    expect(second.readingsAdded + second.seamsAdded + second.roundsAdded + second.outboxAdded).toBe(0);
    expect(withoutTime(await target.exportBackup())).toEqual(before);
  });

  it('refuses a reading whose id is stored here with other content, says why, and imports the rest', async () => {
    const source = await deviceWithWork();
    const backup = (await source.exportBackup()) as BackupFile;
    const target = await freshStore();
    await target.saveSeam(butt('s-1'));
    await target.appendReading('s-1', undercut('r-1', 0.6)); // same id as the source's r-1, other depth
    const report = await target.importBackup(throughFile(backup));
    const index = backup.readings.findIndex((r) => r.reading.id === 'r-1');
    expect(report.refused).toContainEqual({
      path: `readings[${index}]`,
      reason:
        'conflict: reading "r-1" is stored here with other content; readings are never overwritten, so the one here was kept',
    });
    // The one here is unchanged; r-2 (its correction in the file) is imported and supersedes it.
    const readings = await target.listReadings('s-1');
    expect(readings.find((r) => r.reading.id === 'r-1')?.reading.values.undercutDepth).toBe(0.6);
    expect(readings.map((r) => r.reading.id)).toEqual(['r-1', 'r-2', 'r-3', 'r-4', 'r-5']);
    // The file's set-up is a newer revision (2) of s-1 than the one here (1): it is taken.
    expect(report.seamsUpdated).toBe(1);
    expect((await target.getSeam('s-1'))?.seam.length).toBe(1400);
  });

  it('refuses an older set-up, a round answered differently and a demo outbox entry; merges new answers', async () => {
    const target = await freshStore();
    await target.saveSeam(butt('s-1'));
    await target.saveSeam(butt('s-1', { length: 1200 }));
    await target.answerChecklist('s-1', 1, 'crack', { answer: 'noneFound' });
    const here = await target.exportBackup();
    const seam = here.seams[0];
    const round = here.rounds[0];
    if (!seam || !round) throw new Error('set-up missing');
    const file = emptyBackup({
      seams: [{ ...seam, revision: 1, seam: { ...seam.seam, length: 1000 } }],
      rounds: [
        { ...round, checklist: { crack: { answer: 'noneFound' }, spatter: { answer: 'noneFound' } } },
        { ...round, checklist: { crack: { answer: 'present', position: 10 } } },
      ],
      outbox: [
        {
          seq: 1,
          recordId: 'x',
          kind: 'reading',
          seamId: 'demo-kp-014',
          body: {},
          createdAt: seam.createdAt,
        },
      ],
    });
    await target.loadDemo();
    const report = await target.importBackup(throughFile(file));
    expect(report.roundsUpdated).toBe(1);
    expect(report.refused).toEqual([
      {
        path: 'seams[0]',
        reason:
          'older set-up: the file has revision 1 of seam "s-1", this device has revision 2; the newer one was kept',
      },
      {
        path: 'rounds[1]',
        reason: 'conflict: round 1 of seam "s-1" answers crack differently here; the answers here were kept',
      },
      {
        path: 'outbox[0]',
        reason: 'belongs to demo seam "demo-kp-014"; demo records never go to the server',
      },
    ]);
    expect((await target.listRounds('s-1'))[0]?.checklist).toEqual({
      crack: { answer: 'noneFound' },
      spatter: { answer: 'noneFound' },
    });
    expect((await target.getSeam('s-1'))?.seam.length).toBe(1200);
  });

  it('refuses records that fail validation, naming the field, and keeps the rest', async () => {
    const target = await freshStore();
    const source = await freshStore();
    await source.saveSeam(butt('s-1'));
    await source.appendReading('s-1', undercut('r-1', 0.2));
    const backup = throughFile(await source.exportBackup()) as {
      readings: { reading: { values: Record<string, unknown> } }[];
      seams: unknown[];
    };
    backup.readings.push(JSON.parse(JSON.stringify(backup.readings[0])) as (typeof backup.readings)[0]);
    const bad = backup.readings[1] as { reading: { id: string; values: Record<string, unknown> } };
    bad.reading.id = 'r-bad';
    bad.reading.values = { toeAngle: 75 };
    backup.seams.push({ id: 'broken' });
    const report = await target.importBackup(backup);
    expect(report.readingsAdded).toBe(1);
    expect(report.refused.map((r) => r.path)).toEqual(['seams[1]', 'readings[1]']);
    expect(report.refused[1]?.reason).toContain('toeAngle');
    expect((await target.listReadings('s-1')).map((r) => r.reading.id)).toEqual(['r-1']);
  });

  it('refuses a seam whose set-up the grader would refuse', async () => {
    const source = await freshStore();
    const record = await source.saveSeam(butt('s-1'));
    const target = await freshStore();
    const noLevel = { ...record, seam: { ...record.seam, acceptance: { edition: 'ISO 5817:2014' } } };
    const report = await target.importBackup(throughFile(emptyBackup({ seams: [noLevel as never] })));
    expect(report.seamsAdded).toBe(0);
    expect(report.refused).toHaveLength(1);
    expect(report.refused[0]?.reason).toContain('seam.acceptance: needs a required level');
  });

  it('restores a seam without its rounds; readings wait until its first round is started', async () => {
    const source = await freshStore();
    const record = await source.saveSeam(butt('s-1'));
    const target = await freshStore();
    await target.importBackup(throughFile(emptyBackup({ seams: [record] })));
    const error = await rejection(target.appendReading('s-1', undercut('r-1', 0.2)));
    expect(error.message).toContain('reading.round: seam "s-1" has no rounds yet: start its first round');
    expect((await target.startRound('s-1', 'first')).number).toBe(1);
    expect((await target.appendReading('s-1', undercut('r-1', 0.2))).localSeq).toBe(1);
  });

  it('refuses a file that is not a backup at all, with a message a person can act on, and changes nothing', async () => {
    const store = await freshStore();
    await store.saveSeam(butt('s-1'));
    const before = withoutTime(await store.exportBackup());
    const cases: [unknown, string][] = [
      [null, 'a backup is one JSON object'],
      [[1, 2], 'a backup is one JSON object'],
      ['{not json', 'it is not JSON'],
      [{ hello: 'world' }, 'it has no "format": "beadbook.backup/1"'],
      [{ format: 'beadbook.seam/1', seam: {} }, 'This is a seam file'],
      [{ format: 'beadbook.backup/7' }, 'made by a newer version of Beadbook'],
      [{ format: 'beadbook.backup/1', seams: 'lots' }, '"seams" is missing or not a list'],
    ];
    for (const [input, words] of cases) {
      const error = await rejection(store.importBackup(input));
      expect(error.code).toBe('notBackup');
      expect(error.message).toContain(words);
      expect(error.message).toContain('imported');
    }
    expect(withoutTime(await store.exportBackup())).toEqual(before);
  });

  it('accepts the backup as JSON text too', async () => {
    const source = await freshStore();
    await source.saveSeam(butt('s-1'));
    const target = await freshStore();
    const report = await target.importBackup(JSON.stringify(await source.exportBackup()));
    expect(report.seamsAdded).toBe(1);
  });
});
