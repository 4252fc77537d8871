// Which fields each instrument shows on which joint. Sources: the measured-parameter vocabulary
// (src/domain/model/parameters.ts, design.md §3 table "Measured parameters": unit, where measured, joint
// families, length) and docs/seam-file.md ("incompleteRootPenetration: root, single-sided butt").
import { describe, expect, it } from 'vitest';
import {
  appliesToSeam,
  canRunAlong,
  fieldsFor,
  fieldsOfReading,
  instrumentOfReading,
  instrumentsFor,
  needsSide,
  needsToe,
} from '../../src/app/screens/gauge/instruments.js';
import { buttSeam, filletSeam, reading } from '../support/seam-builder.js';

const oneSidedButt = buttSeam(); // single V, one side
const twoSidedButt = buttSeam({
  joint: { type: 'butt', preparation: 'doubleV', sides: 'two', setting: 'shopFlat' },
});
const filletT = filletSeam();
const lap = filletSeam({ joint: { type: 'lap', preparation: 'fillet', sides: 'one', setting: 'site' } });

describe('fields per instrument and joint (parameter vocabulary, design.md §3)', () => {
  it('toe gauge: toe angle and radius on every joint', () => {
    for (const seam of [oneSidedButt, twoSidedButt, filletT, lap]) {
      expect(fieldsFor('toe', seam)).toEqual(['toeAngle', 'toeRadius']);
    }
  });

  it('depth gauge on a single-sided butt weld: everything it reads, incomplete root penetration included', () => {
    expect(fieldsFor('depth', oneSidedButt)).toEqual([
      'undercutDepth',
      'rootConcavity',
      'shrinkageGroove',
      'sagging',
      'incompleteRootPenetration',
      'poreDiameter',
      'endCraterDepth',
    ]);
  });

  it('depth gauge on a two-sided butt weld: no incomplete root penetration (single-sided butt only)', () => {
    expect(fieldsFor('depth', twoSidedButt)).not.toContain('incompleteRootPenetration');
    expect(fieldsFor('depth', twoSidedButt)).toContain('rootConcavity');
  });

  it('depth gauge on a fillet weld: the butt-only root values are gone', () => {
    expect(fieldsFor('depth', filletT)).toEqual(['undercutDepth', 'poreDiameter', 'endCraterDepth']);
  });

  it('height gauge: cap or bead height on butt welds, convexity on fillets; width and overlap on both', () => {
    expect(fieldsFor('height', oneSidedButt)).toEqual([
      'reinforcementHeight',
      'reinforcementWidth',
      'overlap',
    ]);
    expect(fieldsFor('height', filletT)).toEqual(['convexity', 'reinforcementWidth', 'overlap']);
  });

  it('fillet gauge: throat, legs and root gap on fillet joints, nothing on a butt joint', () => {
    expect(fieldsFor('fillet', filletT)).toEqual(['throat', 'leg1', 'leg2', 'rootGap']);
    expect(fieldsFor('fillet', oneSidedButt)).toEqual([]);
  });

  it('offset gauge: both misalignments on butt joints only (the §3 sign is defined between two plates in line)', () => {
    expect(fieldsFor('offset', oneSidedButt)).toEqual(['linearMisalignment', 'angularMisalignment']);
    expect(fieldsFor('offset', filletT)).toEqual([]);
    expect(appliesToSeam('linearMisalignment', lap)).toBe(false);
  });

  it('the picker offers only instruments with a field on the joint', () => {
    expect(instrumentsFor(oneSidedButt).map((d) => d.key)).toEqual(['toe', 'depth', 'height', 'offset']);
    expect(instrumentsFor(filletT).map((d) => d.key)).toEqual(['toe', 'depth', 'height', 'fillet']);
  });
});

describe('"runs along the seam" (vocabulary: values that may have a start and an end)', () => {
  it('depth gauge keeps the long imperfections and drops pores and craters', () => {
    expect(fieldsFor('depth', oneSidedButt, true)).toEqual([
      'undercutDepth',
      'rootConcavity',
      'shrinkageGroove',
      'sagging',
      'incompleteRootPenetration',
    ]);
  });

  it('fillet gauge keeps the throat only', () => {
    expect(fieldsFor('fillet', filletT, true)).toEqual(['throat']);
  });

  it('overlap cannot run along: it needs the face width, which is read at a position (docs/seam-file.md)', () => {
    expect(canRunAlong('overlap')).toBe(false);
    expect(fieldsFor('height', oneSidedButt, true)).toEqual([]);
  });

  it('toe values never run along', () => {
    expect(fieldsFor('toe', oneSidedButt, true)).toEqual([]);
  });
});

describe('where a field is read', () => {
  it('toe values need a toe, side values a side, fillet and cross-section values neither', () => {
    expect(needsToe(['toeAngle'])).toBe(true);
    expect(needsSide(['toeAngle'])).toBe(false);
    expect(needsSide(['rootConcavity'])).toBe(true);
    expect(needsToe(['throat', 'leg1']) || needsSide(['throat', 'leg1'])).toBe(false);
    expect(needsToe(['linearMisalignment']) || needsSide(['linearMisalignment'])).toBe(false);
  });
});

describe('correcting a stored reading', () => {
  it('edits the values it holds plus the companions validation asks for', () => {
    const r = reading({ reinforcementHeight: 2 }, { side: 'face' });
    expect(fieldsOfReading(r)).toEqual(['reinforcementHeight', 'reinforcementWidth']);
    expect(fieldsOfReading(reading({ leg1: 5 }))).toEqual(['leg1', 'leg2']);
  });

  it('opens on the instrument it was read with, by kind or else by its values', () => {
    expect(
      instrumentOfReading(reading({ toeAngle: 150 }, { instrument: { id: 'x', kind: 'toeGauge' } })),
    ).toBe('toe');
    expect(instrumentOfReading(reading({ throat: 4 }, { instrument: { id: 'x' } }))).toBe('fillet');
    expect(
      instrumentOfReading(reading({ toeAngle: 150, undercutDepth: 0.1 }, { instrument: { id: 'x' } })),
    ).toBe(null);
  });
});
