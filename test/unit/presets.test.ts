// EN 1090-2 execution classes mapped to ISO 5817 levels, as the limits reference gives them (§2, "EN 1090-2
// mapping", S9 for the 2014 text and S6 rev 2013; 2008-era wording, §7 doubt 10): EXC1 → D; EXC2 → C except D for
// 5011/5012 undercut, 506 overlap, 601 stray arc and 2025 end crater pipe; EXC3 → B; EXC4 → "B+" (B plus EN
// 1090-2 Table 17, not graded here).
import { describe, expect, it } from 'vitest';
import type { ExecutionClass, Reading, Round, Seam } from '../../src/domain/index.js';
import { buttSeam, completeChecklist, reading, seamFile } from '../support/seam-builder.js';
import { gradeValid } from '../support/grade-one.js';

const SRC = 'EN 1090-2 execution-class mapping to ISO 5817 levels (limits reference §2, S9; S6)';

const withPreset = (preset: ExecutionClass, over: Partial<Seam['acceptance']> = {}): Seam =>
  buttSeam({ acceptance: { edition: 'ISO 5817:2014', preset, ...over } });

// One reading per row of interest on a 10 mm butt seam, each comfortably within B, so only the required
// levels are compared.
const readings = (): Reading[] => [
  reading({ undercutDepth: 0.1 }, { toe: { plate: 1, side: 'face' } }), // 1.7 (5011/5012)
  reading({ overlap: 0, reinforcementWidth: 10 }, { toe: { plate: 1, side: 'face' } }), // 1.13 (506)
  reading({ endCraterDepth: 0 }), // 1.4 (2025)
  reading({ reinforcementHeight: 1, reinforcementWidth: 10 }, { side: 'face' }), // 1.9 (502)
  reading({ shrinkageGroove: 0 }, { side: 'root' }), // 1.8 (5013)
];

function requiredByRow(seam: Seam, checklist: Round['checklist'] = completeChecklist()) {
  const g = gradeValid(seamFile(seam, readings(), [{ number: 1, kind: 'first', checklist }]));
  const round = g.rounds[0];
  const byRow = Object.fromEntries((round?.imperfections ?? []).map((s) => [s.rowId, s.required]));
  const byItem = Object.fromEntries((round?.checklist.items ?? []).map((i) => [i.item, i.required]));
  return { g, byRow, byItem };
}

describe('execution-class presets', () => {
  it(`${SRC}: EXC1 requires D everywhere`, () => {
    const { g, byRow, byItem } = requiredByRow(withPreset('EXC1'));
    expect(g.requiredLevel).toBe('D');
    expect(new Set([...Object.values(byRow), ...Object.values(byItem)])).toEqual(new Set(['D']));
  });

  it(`${SRC}: EXC2 requires C, with D for 5011/5012 (row 1.7), 506 (row 1.13), 2025 (row 1.4) and 601 (stray arc)`, () => {
    const { g, byRow, byItem } = requiredByRow(withPreset('EXC2'));
    expect(g.requiredLevel).toBe('C');
    expect(byRow).toEqual({ '1.4': 'D', '1.7': 'D', '1.8': 'C', '1.9': 'C', '1.13': 'D' });
    expect(byItem.strayArc).toBe('D');
    expect(byItem.crack).toBe('C');
    expect(byItem.porosity).toBe('C');
    expect(g.notes.some((n) => n.includes('EXC4'))).toBe(false);
  });

  it(`${SRC}: EXC3 requires B everywhere, with no note`, () => {
    const { g, byRow, byItem } = requiredByRow(withPreset('EXC3'));
    expect(g.requiredLevel).toBe('B');
    expect(new Set([...Object.values(byRow), ...Object.values(byItem)])).toEqual(new Set(['B']));
    expect(g.notes.some((n) => n.includes('EN 1090-2'))).toBe(false);
  });

  it(`${SRC}: EXC4 requires B everywhere and notes that the additional EN 1090-2 requirements are not graded`, () => {
    const { g, byRow } = requiredByRow(withPreset('EXC4'));
    expect(g.requiredLevel).toBe('B');
    expect(new Set(Object.values(byRow))).toEqual(new Set(['B']));
    expect(g.notes).toContain(
      'EXC4 asks level B plus the additional requirements of EN 1090-2, which are not graded here.',
    );
  });

  it(`${SRC}: an explicit override wins over the preset (EXC2 with 5011 set back to C)`, () => {
    const { byRow } = requiredByRow(withPreset('EXC2', { overrides: { '5011': 'C' } }));
    expect(byRow['1.7']).toBe('C');
    expect(byRow['1.13']).toBe('D');
  });

  // ISO 5817:2014 Table 1 row 1.7, t = 10: C h ≤ 0.1·t → max 0.5, D h ≤ 0.2·t → max 1 (limits reference §2, P: S2).
  it(`${SRC} with ISO 5817:2014 Table 1 row 1.7, t > 3, D max 1 (limits reference §2, P: S2, S6): under EXC2 an undercut of 0.8 (level D) is accepted; under EXC3 it is not`, () => {
    const r = () => [reading({ undercutDepth: 0.8 }, { toe: { plate: 1, side: 'face' } })];
    const exc2 = gradeValid(seamFile(withPreset('EXC2'), r()));
    expect(exc2.levelMet).toBe('D');
    expect(exc2.meetsRequired).toBe(true);
    const exc3 = gradeValid(seamFile(withPreset('EXC3'), r()));
    expect(exc3.meetsRequired).toBe(false);
  });
});
