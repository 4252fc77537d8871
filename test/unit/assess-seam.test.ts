// assessSeam end to end on small seams: signs of secondary bending per toe (design §3), km per surface, the toe
// ranking and crack site, the caution and assumptions on every part, and a plain serialisable result.
import { describe, expect, it } from 'vitest';
import {
  assessSeam,
  gradeSeam,
  INDICATIVE_CAUTION,
  kmAngular,
  kmAxialThicknessStep,
  type Reading,
  type Seam,
  type SeamAssessment,
  type SeamFile,
} from '../../src/domain/index.js';
import { expectValid } from '../support/grade-one.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';

const RAD = Math.PI / 180;

function assess(seam: Seam, readings: Reading[]): SeamAssessment {
  const file = seamFile(seam, readings);
  expectValid(file);
  return assessSeam(file, gradeSeam(file));
}

const surface = (a: SeamAssessment, plate: 1 | 2, side: 'face' | 'root'): number => {
  const s = a.misalignment.surfaces.find((x) => x.plate === plate && x.surface === side);
  if (!s) throw new Error(`no surface plate ${plate} ${side}`);
  return s.bendingRatio;
};

const toes = (angle = 140, radius = 1): Reading[] =>
  ([1, 2] as const).flatMap((plate) =>
    (['face', 'root'] as const).map((side) =>
      reading({ toeAngle: angle, toeRadius: radius }, { toe: { plate, side }, position: 100 }),
    ),
  );

describe('signs of secondary bending (design §3: e > 0 when plate 2 lies face-side; α > 0 when peaking face-side)', () => {
  const seam = buttSeam({ fatigue: { loaded: true } });
  it('e = +1 mm on 10 mm plates: plate 1 face and plate 2 root in tension by 3e/t = 0.3, the others in compression (statics, derived)', () => {
    const a = assess(seam, [reading({ linearMisalignment: 1 })]);
    expect(surface(a, 1, 'face')).toBeCloseTo(0.3, 12);
    expect(surface(a, 2, 'root')).toBeCloseTo(0.3, 12);
    expect(surface(a, 1, 'root')).toBeCloseTo(-0.3, 12);
    expect(surface(a, 2, 'face')).toBeCloseTo(-0.3, 12);
  });
  it('e = −1 mm mirrors it', () => {
    const a = assess(seam, [reading({ linearMisalignment: -1 })]);
    expect(surface(a, 1, 'root')).toBeCloseTo(0.3, 12);
    expect(surface(a, 2, 'face')).toBeCloseTo(0.3, 12);
  });
  it('α = +1° puts both root-side surfaces in tension (no straightening without σm, pinned by default: 3αl/t)', () => {
    const s = buttSeam({ fatigue: { loaded: true, freeLength1: 100, freeLength2: 100 } });
    const a = assess(s, [reading({ angularMisalignment: 1 })]);
    const expected = kmAngular(RAD, 10, 100, 100, 'pinned') - 1;
    expect(surface(a, 1, 'root')).toBeCloseTo(expected, 12);
    expect(surface(a, 2, 'root')).toBeCloseTo(expected, 12);
    expect(surface(a, 1, 'face')).toBeCloseTo(-expected, 12);
    expect(a.misalignment.assumptions.join(' ')).toContain('pinned ends');
  });
  it('linear and angular add at one surface for any combination of signs: km,calc = 1 + 3e/t + 3αl/t (reference §2.6)', () => {
    const s = buttSeam({ fatigue: { loaded: true, freeLength1: 100, freeLength2: 100 } });
    for (const [e, alpha] of [
      [1, 1],
      [1, -1],
      [-1, 1],
      [-1, -1],
    ] as const) {
      const a = assess(s, [reading({ linearMisalignment: e, angularMisalignment: alpha })]);
      expect(a.misalignment.kmCalc).toBeCloseTo(1.3 + (kmAngular(RAD, 10, 100, 100, 'pinned') - 1), 12);
    }
  });
});

describe('different thicknesses: the gauge reading is turned into the mid-plane offset first', () => {
  it('plates 10 and 12 mm, face-surface step 2.0 mm → e = 1.0 mm; km of the thinner plate by the t^1.5 split (§2.2)', () => {
    const seam = buttSeam({ plate2: { thickness: 12 }, fatigue: { loaded: true } });
    const a = assess(seam, [reading({ linearMisalignment: 2 }, { misalignmentBasis: 'faceSurface' })]);
    const lin = a.misalignment.linear;
    if (!lin || 'notAssessed' in lin) throw new Error('linear km missing');
    expect(lin.highest.value).toBeCloseTo(1, 12);
    expect(lin.kmByPlate[0]).toBeCloseTo(kmAxialThicknessStep(1, 10, 12), 12);
    expect(lin.kmByPlate[1]).toBeCloseTo(kmAxialThicknessStep(1, 12, 10), 12);
  });
});

describe('fillet joints', () => {
  it('a T joint: linear misalignment puts no bending in the continuous main plate; angular does, on the attachment side for α < 0', () => {
    const seam = filletSeam({ fatigue: { loaded: true, freeLength1: 200, freeLength2: 200 } });
    const a = assess(seam, [
      reading({ linearMisalignment: 1 }, { position: 100 }),
      reading({ angularMisalignment: -1 }, { position: 200 }),
      reading({ toeAngle: 135, toeRadius: 1 }, { toe: { plate: 1, side: 'face' } }),
    ]);
    expect(a.misalignment.linear).toEqual({
      notAssessed:
        'the main plate of a T joint is continuous: linear misalignment puts no secondary bending in it',
    });
    expect(surface(a, 1, 'face')).toBeCloseTo(kmAngular(RAD, 10, 200, 200, 'pinned') - 1, 12);
    expect(a.toes.toes[0]?.secondaryBending).toBe('tension');
  });
  it('attachment toes are listed as not ranked, with the reason', () => {
    const a = assess(filletSeam({ fatigue: { loaded: true } }), [
      reading({ toeAngle: 135, toeRadius: 1 }, { toe: { plate: 2, side: 'face' } }),
    ]);
    expect(a.toes.toes).toEqual([]);
    expect(a.toes.notRanked[0]?.reason).toContain('attachment');
  });
});

describe('toe ranking and crack site', () => {
  it('with equal toes and α = +2°, the root-side toes (tension) rank first; the crack site names one of them', () => {
    const seam = buttSeam({ fatigue: { loaded: true, freeLength1: 150, freeLength2: 150 } });
    const a = assess(seam, [...toes(), reading({ angularMisalignment: 2 }, { position: 100 })]);
    expect(a.toes.toes.slice(0, 2).map((t) => t.toe.side)).toEqual(['root', 'root']);
    expect(a.toes.crackSite?.toe.side).toBe('root');
    expect(a.toes.toes.map((t) => t.rank)).toEqual([1, 2, 3, 4]);
  });
  it('a toe without a measured radius is assessed at the reference radius, and the result says so', () => {
    const a = assess(buttSeam(), [reading({ toeAngle: 140 }, { toe: { plate: 1, side: 'face' } })]);
    expect(a.toes.toes[0]?.governing.toeRadius).toBe(1);
    expect(a.toes.toes[0]?.governing.radiusBasis).toContain('reference radius');
  });
});

describe('the result object', () => {
  const seam = buttSeam({
    plate2: { thickness: 12 },
    fatigue: {
      loaded: true,
      requiredFat: 71,
      designStressRange: 50,
      cycles: 2e6,
      membraneStress: 80,
      freeLength1: 300,
      freeLength2: 300,
    },
  });
  const file: SeamFile = seamFile(seam, [
    ...toes(),
    reading({ linearMisalignment: 1.5, angularMisalignment: 0.5 }, { misalignmentBasis: 'faceSurface' }),
    reading({ reinforcementHeight: 2, reinforcementWidth: 14 }, { side: 'face' }),
  ]);
  const a = assessSeam(file, gradeSeam(file));

  it('every part carries the indicative caution and names its assumptions', () => {
    for (const part of [a, a.misalignment, a.toes, a.fatigue, a.effectiveNotch, a.sensitivity]) {
      expect(part.caution).toBe(INDICATIVE_CAUTION);
    }
    for (const part of [a.misalignment, a.toes, a.fatigue, a.effectiveNotch, a.sensitivity]) {
      expect(part.assumptions.length).toBeGreaterThan(0);
    }
    expect(a.misalignment.assumptions.join(' ')).toContain('E = 210000 MPa');
    expect(a.sampling.caveat).toContain('assumed independent');
  });
  it('is plain data: it survives JSON and structured cloning unchanged', () => {
    expect(JSON.parse(JSON.stringify(a))).toEqual(a);
    expect(structuredClone(a)).toEqual(a);
  });
  it('is pure: the same input gives the same output', () => {
    expect(assessSeam(file, gradeSeam(file))).toEqual(a);
  });
  it('ranks the sensitivity rows by their effect on life, largest first', () => {
    expect(a.sensitivity.rankedBy).toBe('life');
    const m = a.sensitivity.rows.map((r) => r.magnitude);
    expect([...m].sort((x, y) => y - x)).toEqual(m);
    expect(a.sensitivity.rows.map((r) => r.input)).toContain('toe angle');
    expect(a.sensitivity.rows[0]?.input).toMatch(/misalignment/);
  });
  it('names the S-N edition with the life', () => {
    const life = a.fatigue.life;
    if ('notAssessed' in life) throw new Error(life.notAssessed);
    expect(life.curve).toContain('2016 edition');
  });
});

describe('a seam set up but not yet measured', () => {
  it('assesses nothing and says why, without failing', () => {
    const file = seamFile(buttSeam({ fatigue: { loaded: true, requiredFat: 80 } }), []);
    const a = assessSeam(file, gradeSeam(file));
    expect(a.round).toBe(1);
    expect(a.toes.toes).toEqual([]);
    expect(a.misalignment.state).toBe('notMeasured');
    expect(a.fatigue.flag).toBe('notAssessable');
    expect(a.sampling.parameters).toEqual([]);
  });
});
