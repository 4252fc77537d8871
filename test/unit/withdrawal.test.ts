import { describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile } from '../../src/domain/index.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

// Undo of an entry is a withdrawal: a record that supersedes the reading and carries no values. Nothing is deleted.
describe('withdrawing a reading (undo)', () => {
  const toe = { plate: 1, side: 'face' } as const;

  it('takes the withdrawn reading out of the grade and lists it as superseded', () => {
    // ISO 5817:2014 Table 1 row 1.7, t = 10 > 3: B 0.05·t max 0.5 → 0.5, C 0.1·t max 0.5 → 0.5, D 0.2·t max 1 → 1;
    // so 0.8 mm meets D only and 0.2 mm meets B (derived from the table).
    const bad = reading({ undercutDepth: 0.8 }, { id: 'bad', toe });
    const good = reading({ undercutDepth: 0.2 }, { id: 'good', toe, position: 300 });
    const before = gradeSeam(seamFile(buttSeam(), [bad, good]));
    expect(before.levelMet).toBe('D');
    const undo = reading({}, { id: 'undo', supersedes: 'bad', withdrawn: true });
    const file = seamFile(buttSeam(), [bad, good, undo]);
    expect(parseSeamFile(file).ok).toBe(true);
    const after = gradeSeam(file);
    expect(after.levelMet).toBe('B');
    expect(after.rounds[0]?.supersededReadings).toEqual(['bad']);
    expect(after.rounds[0]?.readings.map((r) => r.readingId)).toEqual(['good']);
  });

  it('is refused when it names no reading or carries values', () => {
    const lone = reading({}, { id: 'undo', withdrawn: true });
    const withValues = reading(
      { undercutDepth: 0.1 },
      { id: 'undo2', supersedes: 'x', withdrawn: true, toe },
    );
    const x = reading({ undercutDepth: 0.1 }, { id: 'x', toe });
    const parsed = parseSeamFile(seamFile(buttSeam(), [x, lone, withValues]));
    expect(parsed.ok).toBe(false);
    const messages = parsed.ok ? [] : parsed.problems.map((p) => `${p.path}: ${p.message}`);
    expect(messages).toContain('readings[1].supersedes: a withdrawal must name the reading it withdraws');
    expect(messages).toContain(
      'readings[2].values: a withdrawal carries no values: record a correction instead',
    );
  });
});
