// The inspector never types a sign for misalignment: they say which way plate 2 stands (or which way the joint
// peaks) and by how much; misalignment-entry.ts signs it. Sign convention: design.md §3 "Toes and signs" —
// "Linear misalignment e is signed: positive when plate 2's mid-plane lies on the face side of plate 1's.
// Angular misalignment is signed: positive when the joint peaks toward the face side."
import { describe, expect, it } from 'vitest';
import {
  angularEntryOf,
  describeOffset,
  linearEntryOf,
  offsetOf,
  signAngular,
  signLinear,
  type LinearEntry,
} from '../../src/app/screens/gauge/misalignment-entry.js';
import { buildReading } from '../../src/app/screens/gauge/reading-builder.js';
import { EMPTY_ANGULAR } from '../../src/app/screens/gauge/misalignment-entry.js';
import { buttSeam } from '../support/seam-builder.js';
import { rowGradeOf } from '../support/grade-one.js';

const SIGNS = 'design.md §3 "Toes and signs"';
const entry = (over: Partial<LinearEntry>): LinearEntry => ({
  direction: undefined,
  amount: undefined,
  surface: undefined,
  ...over,
});

describe(`linear misalignment on equal plates (${SIGNS})`, () => {
  it('plate 2 standing proud toward the face side is positive e, and no basis is recorded', () => {
    expect(signLinear(entry({ direction: 'towardFace', amount: 1.5 }), 10, 10)).toEqual({
      ok: true,
      value: { value: 1.5 },
    });
  });

  it('plate 2 standing proud toward the root side is negative e', () => {
    expect(signLinear(entry({ direction: 'towardRoot', amount: 1.5 }), 10, 10)).toEqual({
      ok: true,
      value: { value: -1.5 },
    });
  });

  it('flush is 0 (never −0), with or without an amount of 0', () => {
    const flush = signLinear(entry({ direction: 'flush' }), 10, 10);
    expect(flush).toEqual({ ok: true, value: { value: 0 } });
    const zero = signLinear(entry({ direction: 'towardRoot', amount: 0 }), 10, 10);
    expect(zero.ok === true && Object.is(zero.value.value, 0)).toBe(true);
  });

  it('asks for the direction when only an amount was typed, and takes nothing when nothing was entered', () => {
    expect(signLinear(entry({ amount: 2 }), 10, 10)).toMatchObject({ ok: false, field: 'direction' });
    expect(signLinear(entry({}), 10, 10)).toEqual({ ok: 'empty' });
  });

  it('refuses a negative amount (the direction carries the sign) and an amount with "flush"', () => {
    expect(signLinear(entry({ direction: 'towardFace', amount: -1 }), 10, 10)).toMatchObject({
      ok: false,
      field: 'amount',
    });
    expect(signLinear(entry({ direction: 'flush', amount: 1 }), 10, 10)).toMatchObject({
      ok: false,
      field: 'amount',
    });
    expect(signLinear(entry({ direction: 'towardFace' }), 10, 10)).toMatchObject({
      ok: false,
      field: 'amount',
    });
  });
});

// Unequal plates: plate 1's mid-plane at y = 0, face side +y (design.md §3 sign; the conversion is the
// domain's midPlaneOffset, derived from the joint cross-section): face step f = e + (t2 − t1)/2, root step
// r = e − (t2 − t1)/2. Plates 8 | 12: (t2 − t1)/2 = 2.
describe(`linear misalignment on unequal plates (${SIGNS}; conversion from the cross-section geometry)`, () => {
  it('requires the surface the gauge sat on', () => {
    expect(signLinear(entry({ direction: 'towardFace', amount: 1 }), 8, 12)).toMatchObject({
      ok: false,
      field: 'surface',
    });
  });

  it.each([
    // [direction, amount, surface, signed read, e by hand]
    ['towardFace', 2.8, 'faceSurface', 2.8, 0.8], // face step +2.8 → e = 2.8 − 2
    ['towardRoot', 1.2, 'faceSurface', -1.2, -3.2], // plate 2's face 1.2 toward the root → e = −1.2 − 2
    ['towardRoot', 1.2, 'rootSurface', -1.2, 0.8], // root step −1.2 → e = −1.2 + 2
    ['towardFace', 0.5, 'rootSurface', 0.5, 2.5],
    ['flush', undefined, 'faceSurface', 0, -2], // flush faces on 8 | 12 leave plate 2's mid-plane 2 mm rootward
    ['flush', undefined, 'rootSurface', 0, 2],
    ['towardFace', 1, 'midPlane', 1, 1],
  ] as const)('%s %s mm on the %s: read %s, e = %s', (direction, amount, surface, read, e) => {
    const s = signLinear(entry({ direction, amount, surface }), 8, 12);
    expect(s).toEqual({ ok: true, value: { value: read, basis: surface } });
    expect(offsetOf(read, surface, 8, 12)).toBe(e);
  });

  it('the grader, given the recorded value and basis, compares the same |e| (ISO 5817:2014 row 3.1 reads the mid-plane offset; limits reference §2)', () => {
    const seam = buttSeam({ plate1: { thickness: 8 }, plate2: { thickness: 12 } });
    const built = buildReading(
      {
        fields: ['linearMisalignment'],
        values: {},
        linear: entry({ direction: 'towardRoot', amount: 1.2, surface: 'rootSurface' }),
        angular: EMPTY_ANGULAR,
        where: { plate: 1, side: 'face' },
        runsAlong: false,
        position: 100,
        start: undefined,
        end: undefined,
        sampling: 'atPitch',
      },
      {
        id: 'm1',
        round: 1,
        seam,
        instrument: { id: 'OG-1', kind: 'misalignmentGauge', resolutionMm: 0.1 },
        recordedAt: '2026-11-19T08:00:00Z',
      },
    );
    if (!built.ok) throw new Error(JSON.stringify(built.problems));
    expect(built.reading.values.linearMisalignment).toBe(-1.2);
    expect(built.reading.misalignmentBasis).toBe('rootSurface');
    expect(rowGradeOf(seam, built.reading, '3.1-plates').measured).toBe(0.8);
  });
});

describe('reading a stored value back into the controls (for a correction)', () => {
  it.each([
    [1.5, undefined, 10, 10, { direction: 'towardFace', amount: 1.5, surface: undefined }],
    [-0.7, undefined, 10, 10, { direction: 'towardRoot', amount: 0.7, surface: undefined }],
    [0, undefined, 10, 10, { direction: 'flush', amount: undefined, surface: undefined }],
    [-1.2, 'rootSurface', 8, 12, { direction: 'towardRoot', amount: 1.2, surface: 'rootSurface' }],
    // A record without a basis on unequal plates was a mid-plane reading (the grader treats it so).
    [2, undefined, 8, 12, { direction: 'towardFace', amount: 2, surface: 'midPlane' }],
  ] as const)(`value %s (basis %s, plates %s | %s) → entry (${SIGNS})`, (v, basis, t1, t2, expected) => {
    const e = linearEntryOf(v, basis, t1, t2);
    expect(e).toEqual(expected);
    const back = signLinear(e, t1, t2);
    expect(back.ok === true ? back.value.value : NaN).toBe(v);
  });
});

describe(`angular misalignment (${SIGNS})`, () => {
  it('peaking toward the face side is positive, toward the root side negative, straight 0', () => {
    expect(signAngular({ direction: 'peaksTowardFace', amount: 2 })).toEqual({ ok: true, value: 2 });
    expect(signAngular({ direction: 'peaksTowardRoot', amount: 2 })).toEqual({ ok: true, value: -2 });
    expect(signAngular({ direction: 'straight', amount: undefined })).toEqual({ ok: true, value: 0 });
  });

  it('asks for the missing half and refuses a negative angle', () => {
    expect(signAngular({ direction: undefined, amount: 1 })).toMatchObject({ ok: false, field: 'direction' });
    expect(signAngular({ direction: 'peaksTowardFace', amount: undefined })).toMatchObject({
      ok: false,
      field: 'amount',
    });
    expect(signAngular({ direction: 'peaksTowardRoot', amount: -1 })).toMatchObject({
      ok: false,
      field: 'amount',
    });
    expect(signAngular({ direction: undefined, amount: undefined })).toEqual({ ok: 'empty' });
  });

  it('round-trips through the stored value', () => {
    for (const v of [3, -1.5, 0]) {
      const back = signAngular(angularEntryOf(v));
      expect(back).toEqual({ ok: true, value: v });
    }
  });
});

describe('the check shown back to the inspector', () => {
  it(`names the side plate 2's mid-plane lies on (${SIGNS})`, () => {
    expect(describeOffset(0.8)).toBe(
      "plate 2's mid-plane lies 0.8 mm toward the face side of plate 1's (e = +0.8 mm)",
    );
    expect(describeOffset(-3.2)).toBe(
      "plate 2's mid-plane lies 3.2 mm toward the root side of plate 1's (e = −3.2 mm)",
    );
    expect(describeOffset(0)).toBe("the plates' mid-planes line up (e = 0 mm)");
  });
});
