// Instrument id, resolution and calibration date, set once per session and remembered on the device. The record
// allows resolutions above 0 and up to 10 mm or 10° and a date such as 2026-03-01 (src/domain/model/seam-file.ts
// `instrument`); the resolution decides "borderline" (design.md §7).
import { describe, expect, it } from 'vitest';
import {
  checkSetting,
  confirmKey,
  confirmedKeys,
  loadSettings,
  localDate,
  parseSettings,
  readingInstrument,
  saveSetting,
  settingFor,
} from '../../src/app/screens/gauge/instrument-settings.js';
import { readExaminer } from '../../src/app/screens/gauge/examiner.js';

const memory = () => {
  const mem = new Map<string, string>();
  return {
    mem,
    getItem: (k: string) => mem.get(k) ?? null,
    setItem: (k: string, v: string) => void mem.set(k, v),
  };
};

describe('instrument settings', () => {
  it('remembers per instrument and reads back', () => {
    const store = memory();
    saveSetting(store, 'toe', {
      id: 'TG-03',
      resolutionMm: 0.1,
      resolutionDeg: 1,
      calibratedOn: '2026-06-02',
    });
    expect(loadSettings(store).toe).toEqual({
      id: 'TG-03',
      resolutionMm: 0.1,
      resolutionDeg: 1,
      calibratedOn: '2026-06-02',
    });
    expect(loadSettings(store).depth).toBeUndefined();
  });

  it('drops malformed stored data instead of failing', () => {
    expect(parseSettings('{oops')).toEqual({});
    expect(
      parseSettings(
        JSON.stringify({ toe: { id: 7 }, depth: { id: 'D1', resolutionMm: -1, calibratedOn: 'soon' } }),
      ),
    ).toEqual({
      depth: { id: 'D1' },
    });
  });

  it('offers the usual resolutions for an instrument not yet set, only on its own scales', () => {
    expect(settingFor({}, 'depth')).toEqual({ id: '', resolutionMm: 0.1 });
    expect(settingFor({}, 'toe')).toEqual({ id: '', resolutionMm: 0.1, resolutionDeg: 1 });
  });

  it('checks id, resolution and calibration date in plain words', () => {
    const today = '2026-11-19';
    expect(
      checkSetting(
        'toe',
        { id: 'TG-03', resolutionMm: 0.1, resolutionDeg: 1, calibratedOn: '2026-06-02' },
        today,
      ),
    ).toEqual({});
    const bad = checkSetting('toe', { id: ' ', resolutionMm: 0, calibratedOn: '2027-01-01' }, today);
    expect(Object.keys(bad).sort()).toEqual(['calibratedOn', 'id', 'resolutionDeg', 'resolutionMm']);
    expect(bad.calibratedOn).toBe('the calibration date lies after today (2026-11-19)');
    expect(checkSetting('depth', { id: 'D', resolutionMm: 11 }, today).resolutionMm).toMatch(/at most 10 mm/);
  });

  it('the reading records the instrument kind and only the scales it has', () => {
    expect(readingInstrument('depth', { id: ' DG-7 ', resolutionMm: 0.05, resolutionDeg: 1 })).toEqual({
      id: 'DG-7',
      kind: 'depthGauge',
      resolutionMm: 0.05,
    });
  });

  it('asks once per session: confirmation lives in session storage', () => {
    const session = memory();
    expect(confirmedKeys(session).has('toe')).toBe(false);
    confirmKey(session, 'toe');
    expect([...confirmedKeys(session)]).toEqual(['toe']);
  });

  it('dates are the local calendar date', () => {
    expect(localDate(new Date(2026, 0, 5, 23, 59))).toBe('2026-01-05');
  });
});

describe('examiner from Settings', () => {
  it('reads {name, qualification}, a plain name, or an examiner inside the settings object', () => {
    const s1 = memory();
    s1.setItem('beadbook.examiner', JSON.stringify({ name: 'R. Okafor', qualification: 'VT level 2' }));
    expect(readExaminer(s1)).toEqual({ name: 'R. Okafor', qualification: 'VT level 2' });
    const s2 = memory();
    s2.setItem('beadbook.examiner', 'A. Lund');
    expect(readExaminer(s2)).toEqual({ name: 'A. Lund' });
    const s3 = memory();
    s3.setItem('beadbook.settings', JSON.stringify({ examiner: { name: 'K. Ito' } }));
    expect(readExaminer(s3)).toEqual({ name: 'K. Ito' });
    expect(readExaminer(memory())).toBeUndefined();
  });
});
