// The seam set-up form: what it builds is what the grader accepts, and each problem lands on its own field.
import { describe, expect, it } from 'vitest';
import {
  checkSetup,
  emptyForm,
  fieldOfPath,
  formFromSeam,
  parseTags,
  seamFromForm,
  type SetupForm,
} from '../../src/app/components/setup-form.js';
import { buttSeam, filletSeam } from '../support/seam-builder.js';

const filled = (over: Partial<SetupForm> = {}): SetupForm => ({
  ...emptyForm(),
  label: 'B-12 north',
  t1: 10,
  t2: 12,
  length: 1200,
  materialName: 'S355J2',
  materialGroup: '1.2',
  ...over,
});

describe('set-up form', () => {
  it('a filled butt form gives a valid seam with the typed values', () => {
    const check = checkSetup(filled({ tags: 'T-1, T-2,, T-1', level: 'B' }), 'seam-a');
    expect(check.ok).toBe(true);
    if (!check.ok) return;
    expect(check.seam).toMatchObject({
      id: 'seam-a',
      label: 'B-12 north',
      tags: ['T-1', 'T-2'],
      plate1: { thickness: 10 },
      plate2: { thickness: 12 },
      length: 1200,
      material: { name: 'S355J2', group: '1.2', kind: 'steel' },
      acceptance: { edition: 'ISO 5817:2014', level: 'B' },
    });
    expect(check.seam.acceptance.preset).toBeUndefined();
  });

  it('an empty form names each missing field in plain words, on that field', () => {
    const check = checkSetup(emptyForm(), 'seam-b');
    expect(check.ok).toBe(false);
    if (check.ok) return;
    expect(check.errors.label).toEqual(['give the seam a label, e.g. the mark painted next to it']);
    expect(check.errors.t1).toEqual(['enter the thickness of plate 1']);
    expect(check.errors.t2).toEqual(['enter the thickness of plate 2']);
    expect(check.errors.length).toEqual(['enter the seam length from the start mark to the end mark']);
    expect(check.errors.materialName).toEqual(['enter the material, e.g. S355J2']);
    expect(check.errors.form).toBeUndefined();
  });

  it('out-of-range values keep the validator message with the allowed range', () => {
    const check = checkSetup(filled({ t1: 0.2, materialGroup: 'steel' }), 'seam-c');
    expect(check.ok).toBe(false);
    if (check.ok) return;
    expect(check.errors.t1?.[0]).toMatch(/at least 0.5 mm/);
    expect(check.errors.materialGroup?.[0]).toMatch(/ISO\/TR 15608 group/);
  });

  it('an execution class is saved as a preset, and an unknown override number is refused on the overrides field', () => {
    const ok = checkSetup(filled({ acceptanceMode: 'preset', preset: 'EXC2' }), 'seam-d');
    expect(ok.ok && ok.seam.acceptance).toEqual({ edition: 'ISO 5817:2014', preset: 'EXC2' });
    const bad = checkSetup(filled({ overrides: [{ ref: '9999', level: 'D' }] }), 'seam-e');
    expect(bad.ok).toBe(false);
    if (bad.ok) return;
    expect(bad.errors.overrides?.[0]).toMatch(/^9999: not an ISO 6520-1 number/);
  });

  it('fillet sizes are kept only for fillet joints; switching to butt drops them', () => {
    const fillet = checkSetup(
      filled({ jointType: 'filletT', preparation: 'fillet', nominalThroat: 5, leg1: 7, leg2: 7 }),
      'seam-f',
    );
    expect(fillet.ok && [fillet.seam.nominalThroat, fillet.seam.nominalLegs]).toEqual([
      5,
      { leg1: 7, leg2: 7 },
    ]);
    const butt = seamFromForm(filled({ jointType: 'butt', nominalThroat: 5, leg1: 7, leg2: 7 }), 'seam-g');
    expect(butt['nominalThroat']).toBeUndefined();
    expect(butt['nominalLegs']).toBeUndefined();
  });

  it('one nominal leg without the other is refused on the legs', () => {
    const check = checkSetup(filled({ jointType: 'filletT', preparation: 'fillet', leg1: 7 }), 'seam-h');
    expect(check.ok).toBe(false);
    if (check.ok) return;
    expect(check.errors.leg2).toEqual(['enter both nominal legs, or neither']);
  });

  it('editing keeps what the form does not show (fatigue data, area, time welded)', () => {
    const seam = {
      ...filletSeam({ id: 'seam-i' }),
      area: 'Hall 3',
      weldedAt: '2026-03-01T09:30:00Z',
      fatigue: { loaded: true, requiredFat: 71 },
    };
    const form = formFromSeam(seam);
    const check = checkSetup({ ...form, welder: 'W-17' }, 'seam-i', seam);
    expect(check.ok).toBe(true);
    if (!check.ok) return;
    expect(check.seam).toEqual({ ...seam, welder: 'W-17' });
  });

  it('a seam read into the form and saved back unchanged is the same seam', () => {
    const seam = buttSeam({ id: 'seam-j', tags: ['A', 'B'], drawing: 'D-100', process: '135' });
    const check = checkSetup(formFromSeam(seam), 'seam-j', seam);
    expect(check.ok && check.seam).toEqual(seam);
  });

  it('paths land on fields by their longest prefix', () => {
    expect(fieldOfPath('seam.drawingPosition')).toBe('drawingPosition');
    expect(fieldOfPath('seam.drawing')).toBe('drawing');
    expect(fieldOfPath('seam.plate1.thickness')).toBe('t1');
    expect(fieldOfPath('seam.nominalLegs.leg2')).toBe('leg2');
    expect(fieldOfPath('seam.acceptance.overrides.5011')).toBe('overrides');
    expect(fieldOfPath('seam.tags[3]')).toBe('tags');
    expect(fieldOfPath('rounds[0]')).toBe('form');
  });

  it('tags split on commas and new lines, blanks and repeats dropped', () => {
    expect(parseTags(' A-1 ,\nB-2,,A-1 ')).toEqual(['A-1', 'B-2']);
  });
});
