// The examiner set in Settings: stored under beadbook.examiner as {name, qualification?}, read back by the
// Gauge screen's readExaminer, forgotten with an empty name, and refused beyond the record's limits.
import { describe, expect, it } from 'vitest';
import { parseSeamFile } from '../../src/domain/index.js';
import { checkExaminer, readExaminer, saveExaminer } from '../../src/app/screens/gauge/examiner.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

function memory() {
  const mem = new Map<string, string>();
  return {
    getItem: (k: string) => mem.get(k) ?? null,
    setItem: (k: string, v: string) => void mem.set(k, v),
    removeItem: (k: string) => void mem.delete(k),
    raw: (k: string) => mem.get(k),
  };
}

describe('saving the examiner', () => {
  it('stores {name, qualification} trimmed, and the Gauge screen reads the same back', () => {
    const store = memory();
    const saved = saveExaminer(store, { name: '  R. Okafor ', qualification: ' VT level 2 ' });
    expect(saved).toEqual({ name: 'R. Okafor', qualification: 'VT level 2' });
    expect(JSON.parse(store.raw('beadbook.examiner') ?? 'null')).toEqual({
      name: 'R. Okafor',
      qualification: 'VT level 2',
    });
    expect(readExaminer(store)).toEqual(saved);
  });

  it('leaves the qualification out when none is given', () => {
    const store = memory();
    expect(saveExaminer(store, { name: 'A. Lund', qualification: '  ' })).toEqual({ name: 'A. Lund' });
    expect(store.raw('beadbook.examiner')).toBe('{"name":"A. Lund"}');
  });

  it('forgets the examiner when the name is emptied', () => {
    const store = memory();
    saveExaminer(store, { name: 'A. Lund', qualification: '' });
    expect(saveExaminer(store, { name: ' ', qualification: '' })).toBeUndefined();
    expect(store.raw('beadbook.examiner')).toBeUndefined();
    expect(readExaminer(store)).toBeUndefined();
  });

  it('what it saves is an examiner the reading record accepts', () => {
    const store = memory();
    const examiner = saveExaminer(store, { name: 'x'.repeat(80), qualification: 'q'.repeat(120) });
    const file = seamFile(buttSeam(), [
      reading({ toeAngle: 150 }, { toe: { plate: 1, side: 'face' }, ...(examiner ? { examiner } : {}) }),
    ]);
    expect(parseSeamFile(file).ok).toBe(true);
  });
});

describe('checking what was typed', () => {
  it('accepts a name, with or without a qualification, and nothing at all', () => {
    expect(checkExaminer({ name: 'A. Lund', qualification: '' })).toEqual({});
    expect(checkExaminer({ name: 'A. Lund', qualification: 'VT level 2' })).toEqual({});
    expect(checkExaminer({ name: '', qualification: '' })).toEqual({});
  });

  it('refuses what the record cannot hold, and a qualification with no name', () => {
    expect(checkExaminer({ name: 'x'.repeat(81), qualification: '' })).toEqual({
      name: 'at most 80 characters',
    });
    expect(checkExaminer({ name: 'A', qualification: 'q'.repeat(121) })).toEqual({
      qualification: 'at most 120 characters',
    });
    expect(checkExaminer({ name: ' ', qualification: 'VT level 2' })).toEqual({
      name: 'enter the name the qualification belongs to',
    });
  });
});
