// Problems from the validator (the seam plus the new reading, by parseSeamFile's rules) placed next to the right field,
// in the inspector's words. Messages and rules: src/domain/validate.ts and docs/seam-file.md "Errors".
import { describe, expect, it } from 'vitest';
import { checkNewReading, fieldOfPath } from '../../src/app/screens/gauge/problems.js';
import { entryContext } from '../../workers/entry-check-api.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';

const seam = buttSeam(); // length 1000
const file = seamFile(seam, [reading({ toeAngle: 150 }, { id: 'old', toe: { plate: 1, side: 'face' } })]);

describe('mapping validator paths to form fields', () => {
  it('points at values, positions, the toe picker and the misalignment basis of the new reading only', () => {
    expect(fieldOfPath('readings[1].values.toeAngle', 1)).toBe('toeAngle');
    expect(fieldOfPath('readings[1].position', 1)).toBe('position');
    expect(fieldOfPath('readings[1].end', 1)).toBe('end');
    expect(fieldOfPath('readings[1].toe', 1)).toBe('where');
    expect(fieldOfPath('readings[1].misalignmentBasis', 1)).toBe('misalignmentBasis');
    expect(fieldOfPath('readings[1]', 1)).toBe('position');
    expect(fieldOfPath('readings[0].values.toeAngle', 1)).toBeNull();
  });
});

describe('checking the new reading against the seam', () => {
  it('a valid reading has no problems', () => {
    expect(
      checkNewReading(
        entryContext(file),
        reading({ toeAngle: 160 }, { id: 'n', toe: { plate: 2, side: 'face' } }),
      ),
    ).toEqual({});
  });

  it('a toe angle below 90° is reported at the toe angle field (vocabulary range 90–180)', () => {
    const p = checkNewReading(
      entryContext(file),
      reading({ toeAngle: 75 }, { id: 'n', toe: { plate: 2, side: 'face' } }),
    );
    expect(Object.keys(p)).toEqual(['toeAngle']);
    expect(p.toeAngle).toMatch(/^must be at least 90°.*got 75$/);
  });

  it('a position past the seam length is reported at the position field', () => {
    const p = checkNewReading(
      entryContext(file),
      reading({ toeAngle: 160 }, { id: 'n', position: 1200, toe: { plate: 2, side: 'face' } }),
    );
    expect(p.position).toBe("lies beyond the seam's length of 1000 mm; got 1200");
  });

  it('a cap height without its width asks for the width in field words, not record names', () => {
    const p = checkNewReading(
      entryContext(file),
      reading({ reinforcementHeight: 2 }, { id: 'n', side: 'face' }),
    );
    expect(p.reinforcementWidth).toBe(
      'is needed with cap height: the limit is 1 mm + k·b, with b the width in the same cross-section',
    );
  });

  it('a toe value without a toe asks to choose the toe', () => {
    const p = checkNewReading(entryContext(file), reading({ undercutDepth: 0.2 }, { id: 'n' }));
    expect(p.undercutDepth).toBe('is read at a toe: choose the toe on the drawing');
  });

  it('a fillet seam set up without a nominal throat: the form says to add it on the seam first', () => {
    const noThroat = filletSeam();
    delete (noThroat as { nominalThroat?: number }).nominalThroat;
    const f = seamFile(noThroat, []);
    const p = checkNewReading(entryContext(f), reading({ throat: 4 }, { id: 'n' }));
    expect(p.form).toMatch(/no nominal throat a set up/);
  });

  it('a reused id is reported above the form', () => {
    const p = checkNewReading(
      entryContext(file),
      reading({ toeAngle: 160 }, { id: 'old', toe: { plate: 2, side: 'face' } }),
    );
    expect(p.form).toMatch(/"old" is used by another reading/);
  });
});
