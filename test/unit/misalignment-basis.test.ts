// Row 3.1 grades the offset h between the plates' centre lines ("reference = centrelines coincide", limits
// reference §2 row 3.1). A gauge on unequal plates often reads the step between the face surfaces, or between
// the root surfaces, instead. Converting by hand from the cross-section:
//
//   Put plate 1's mid-plane at y = 0, the face side toward +y. Plate 1 spans [−t1/2, +t1/2]; plate 2, whose
//   mid-plane is offset by e, spans [e − t2/2, e + t2/2].
//   Face step (plate 2's face minus plate 1's face):  f = (e + t2/2) − t1/2      ⇒ e = f − (t2 − t1)/2
//   Root step (plate 2's root minus plate 1's root):  r = (e − t2/2) − (−t1/2)   ⇒ e = r + (t2 − t1)/2
//
// Plates 8 and 12: (t2 − t1)/2 = 2, so e = f − 2 and e = r + 2; t = smaller plate = 8 (> 3 band).
// ISO 5817:2014 Table 1 row 3.1 (507), plates, t > 3: B h ≤ 0.1·t = 0.8, C 0.15·t = 1.2, D 0.25·t = 2
// (limits reference §2 — from memory (recalled, unverified)).
import { describe, expect, it } from 'vitest';
import { parseSeamFile, type Reading } from '../../src/domain/index.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';
import { rowGradeOf } from '../support/grade-one.js';

const SRC =
  'ISO 5817:2014 Table 1 row 3.1 (507), plates, t > 3, t = smaller plate 8: B 0.8, C 1.2, D 2 (limits reference §2, from memory (recalled, unverified)); conversion derived from the joint geometry';
const plates8and12 = buttSeam({ plate1: { thickness: 8 }, plate2: { thickness: 12 } });
const plates12and8 = buttSeam({ plate1: { thickness: 12 }, plate2: { thickness: 8 } });
const offset = (read: number, basis: NonNullable<Reading['misalignmentBasis']>): Reading =>
  reading({ linearMisalignment: read }, { misalignmentBasis: basis });

describe('conversion to the mid-plane offset before grading', () => {
  it.each([
    // [plates, read, basis, e by hand, level]
    ['8 | 12', 2.8, 'faceSurface', 0.8, 'B'], // e = 2.8 − 2 = 0.8: exactly on B
    ['8 | 12', 2.81, 'faceSurface', 0.81, 'C'], // e = 0.81: just past B
    ['8 | 12', -1.2, 'rootSurface', 0.8, 'B'], // e = −1.2 + 2 = 0.8
    ['8 | 12', 0, 'faceSurface', 2, 'D'], // flush faces still leave e = −2: on the D limit
    ['8 | 12', 0, 'rootSurface', 2, 'D'], // flush roots leave e = +2
    ['8 | 12', 2.8, 'midPlane', 2.8, 'belowD'], // read as the offset itself: 2.8 > 2
    ['12 | 8', -2.8, 'faceSurface', 0.8, 'B'], // (t2 − t1)/2 = −2: e = −2.8 + 2 = −0.8
    ['12 | 8', 1.2, 'rootSurface', 0.8, 'B'], // e = 1.2 − 2 = −0.8
  ] as const)(`${SRC}: plates %s, %s mm read on %s → |e| = %s → %s`, (plates, read, basis, e, level) => {
    const seam = plates === '8 | 12' ? plates8and12 : plates12and8;
    const g = rowGradeOf(seam, offset(read, basis), '3.1-plates');
    expect(g.thicknessMm).toBe(8);
    expect(g.measured).toBe(e);
    expect(g.levelMet).toBe(level);
  });

  it(`${SRC}: on equal plates the face step, the root step and the mid-plane offset are the same`, () => {
    const seam = buttSeam({ plate1: { thickness: 8 }, plate2: { thickness: 8 } });
    for (const basis of ['midPlane', 'faceSurface', 'rootSurface'] as const) {
      const g = rowGradeOf(seam, offset(0.9, basis), '3.1-plates');
      expect(g.measured).toBe(0.9);
      expect(g.levelMet).toBe('C');
    }
  });

  // Circumferential: h ≤ 0.5·t = 4 → D max 4, C max 3, B max 2; face step 4 on 8 | 12 → e = 2: on the B limit.
  it('ISO 5817:2014 Table 1 row 3.1 (507), circumferential welds, B h ≤ 0.5·t, max 2 (limits reference §2, from memory (recalled, unverified)); conversion derived from the joint geometry: a face step of 4 mm on plates 8 | 12 is e = 2 → B', () => {
    const seam = { ...plates8and12, circumferential: true };
    const g = rowGradeOf(seam, offset(4, 'faceSurface'), '3.1-circumferential');
    expect(g.measured).toBe(2);
    expect(g.levelMet).toBe('B');
  });

  it('unequal plates need the basis: a reading without one is refused rather than guessed', () => {
    const r = reading({ linearMisalignment: 0.8 });
    expect(parseSeamFile(seamFile(plates8and12, [r])).ok).toBe(false);
  });
});
