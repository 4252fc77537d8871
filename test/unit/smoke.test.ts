import { describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile } from '../../src/domain/index.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

describe('seam builder', () => {
  it('builds a file the validator accepts and the grader grades', () => {
    const file = seamFile(buttSeam(), [reading({ undercutDepth: 0.5 }, { toe: { plate: 1, side: 'face' } })]);
    const parsed = parseSeamFile(file);
    expect(parsed.ok).toBe(true);
    const g = gradeSeam(file);
    // ISO 5817:2014 Table 1 row 1.7, t > 3: B allows h ≤ 0.05 t, max 0.5 → 0.5 mm at t = 10 (equality passes).
    expect(g.levelMet).toBe('B');
  });
});
