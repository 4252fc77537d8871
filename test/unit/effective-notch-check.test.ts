// The effective-notch cross-check beside the nominal FAT: each toe's factor at the reference radius against the
// notch FAT (notch reference §6, recalled: 1 mm and FAT 225 for t ≥ 5 mm, 0.05 mm and FAT 630 below), and a
// plain statement instead of a number where the formula is outside its validity.
import { describe, expect, it } from 'vitest';
import { assessSeam, gradeSeam, type Reading, type Seam } from '../../src/domain/index.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';

const assess = (seam: Seam, readings: Reading[]) => {
  const file = seamFile(seam, readings);
  return assessSeam(file, gradeSeam(file)).effectiveNotch;
};
const face1 = { toe: { plate: 1, side: 'face' } } as const;

describe('effective-notch cross-check (notch reference §6)', () => {
  it('t = 10 mm butt, flank 45°, no secondary bending: FAT 225 / Lawrence Kt,m 1.8538 (α_L 0.27, t = 10, ρ = 1, notch reference §2 table)', () => {
    const en = assess(buttSeam({ fatigue: { loaded: true, requiredFat: 80 } }), [
      reading({ toeAngle: 135 }, face1),
    ]);
    expect(en.fat).toBe(225);
    expect(en.governing?.referenceRadiusMm).toBe(1);
    expect(en.fatEquivalent).toBeCloseTo(225 / 1.8538, 2);
    // 225/1.8538 = 121.4 MPa against the 80 MPa asked of the nominal detail.
    expect(en.flag).toBe('meets');
  });

  it('thin sheet, t = 4 mm: the 0.05 mm reference radius and FAT 630', () => {
    const en = assess(
      buttSeam({
        plate1: { thickness: 4 },
        plate2: { thickness: 4 },
        fatigue: { loaded: true, requiredFat: 80 },
      }),
      [reading({ toeAngle: 150 }, face1)],
    );
    expect(en.fat).toBe(630);
    expect(en.governing?.referenceRadiusMm).toBe(0.05);
  });

  it('a T joint of 10 mm under secondary bending: the cruciform formula needs t/ρ ≥ 15, so at ρ = 1 mm it says so instead of a number', () => {
    const en = assess(
      filletSeam({ fatigue: { loaded: true, requiredFat: 80, freeLength1: 200, freeLength2: 200 } }),
      [reading({ angularMisalignment: -1 }, { position: 200 }), reading({ toeAngle: 135 }, face1)],
    );
    const toe = en.toes[0];
    expect(toe?.outside.join(' ')).toMatch(/t\/ρ/);
    expect(toe?.fatEquivalent).toBeNull();
    expect(en.flag).toBe('notAssessable');
    expect(en.missing.join(' ')).toMatch(/validity/);
  });
});
