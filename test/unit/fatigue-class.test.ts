// Fatigue classes, the S-N curve, the thickness correction and the class a measured seam earns, checked against
// the misalignment-and-fatigue reference (§3, recalled IIW values) and the notch reference (§6).
import { describe, expect, it } from 'vitest';
import {
  assessSeam,
  cyclesToFailure,
  DETAILS,
  earnedDetails,
  gradeSeam,
  kneeStressRange,
  notchReference,
  thicknessFactor,
  type Seam,
} from '../../src/domain/index.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';
import { expectValid } from '../support/grade-one.js';

describe('S-N curve, IIW 2016 shape (reference §3.1)', () => {
  it('N = 2·10⁶ at Δσ = FAT (the definition of FAT)', () => {
    expect(cyclesToFailure(80, 80)).toBeCloseTo(2e6, 6);
  });
  it('slope 3 above the knee: half the stress range, eight times the life', () => {
    expect(cyclesToFailure(60, 90) / cyclesToFailure(120, 90)).toBeCloseTo(8, 10);
  });
  it('the knee at 10⁷ cycles lies at 0.5848·FAT (reference §3.1, derived)', () => {
    expect(kneeStressRange(100)).toBeCloseTo(58.48, 2);
    expect(cyclesToFailure(kneeStressRange(100), 100)).toBeCloseTo(1e7, 0);
  });
  it('slope 22 after the knee (2016 edition, steel, normal stress): 10 % lower stress → (1/0.9)^22 ≈ 10.1× life', () => {
    const knee = kneeStressRange(100);
    expect(cyclesToFailure(0.9 * knee, 100) / 1e7).toBeCloseTo((1 / 0.9) ** 22, 8);
  });
});

describe('thickness correction (reference §3.3, recalled)', () => {
  it('(25/t)^n above 25 mm: t = 50, n = 0.2 → 0.8706 (derived)', () => {
    expect(thicknessFactor(50, 0.2)).toBeCloseTo(0.5 ** 0.2, 12);
    expect(thicknessFactor(50, 0.2)).toBeCloseTo(0.8706, 4);
  });
  it('no bonus at or below 25 mm', () => {
    expect(thicknessFactor(25, 0.3)).toBe(1);
    expect(thicknessFactor(8, 0.3)).toBe(1);
  });
  it('t_eff = 0.5·L when L/t ≤ 2: t = 40, L = 60 → t_eff 30 → (25/30)^0.3', () => {
    expect(thicknessFactor(40, 0.3, 60)).toBeCloseTo((25 / 30) ** 0.3, 12);
    expect(thicknessFactor(40, 0.3, 100)).toBeCloseTo((25 / 40) ** 0.3, 12);
  });
});

describe('catalogue (reference §3.2 table, recalled; EN 1993-1-9 ladder 112/90/80 read)', () => {
  it.each([
    ['211', 112, 45],
    ['212', 90, 36],
    ['213', 80, 32],
    ['214', 80, 28],
    ['215', 71, 25],
    ['215-edge', 50, 18],
    ['216', 71, 28],
    ['216-noNDT', 36, 12],
    ['217', 36, 12],
    ['411', 80, 28],
    ['412', 71, 25],
    ['413', 63, 22],
    ['414', 36, 12],
    ['511', 80, 28],
    ['511-ground', 100, 36],
    ['511-thick', 71, 25],
    ['521-50', 80, 28],
    ['521-150', 71, 25],
    ['521-300', 63, 20],
    ['521-long', 50, 18],
  ] as const)('%s: FAT %i steel, %i aluminium', (id, steel, al) => {
    expect(DETAILS[id].fat).toEqual({ steel, aluminium: al });
  });
});

describe('the class the measured seam earns (reference §3.2 conditions; EN 1993-1-9 convexity ≤ 10 % for cat. 90)', () => {
  const twoSided = buttSeam({
    joint: { type: 'butt', preparation: 'doubleV', sides: 'two', setting: 'shopFlat' },
  });
  it('shop, flat, every toe angle ≥ 150°, reinforcement ≤ 10 % of its width → 212', () => {
    const e = earnedDetails(twoSided, {
      minToeAngle: { value: 150, where: 'x' },
      maxReinforcementRatio: { value: 0.1, where: 'y' },
    });
    expect(e.details).toEqual(['212']);
  });
  it('one toe angle of 149° → 213, and the reason names it', () => {
    const e = earnedDetails(twoSided, {
      minToeAngle: { value: 149, where: '300 mm (r-9)' },
      maxReinforcementRatio: { value: 0.05, where: 'y' },
    });
    expect(e.details).toEqual(['213']);
    expect(e.why.join(' ')).toContain('toe angle 149° at 300 mm (r-9) is below 150°');
  });
  it('made on site → 213 even with good geometry', () => {
    const site = { ...twoSided, joint: { ...twoSided.joint, setting: 'site' as const } };
    const e = earnedDetails(site, {
      minToeAngle: { value: 170, where: 'x' },
      maxReinforcementRatio: { value: 0.02, where: 'y' },
    });
    expect(e.details).toEqual(['213']);
  });
  it('aluminium 213 needs toe angles ≥ 130°: below that no class is earned', () => {
    const al: Seam = { ...twoSided, material: { name: 'EN AW-5083', kind: 'aluminium' } };
    expect(earnedDetails(al, { minToeAngle: { value: 125, where: 'x' } }).details).toEqual([]);
    expect(earnedDetails(al, { minToeAngle: { value: 135, where: 'x' } }).details).toEqual(['213']);
  });
  it('ground flush → 211', () => {
    expect(earnedDetails({ ...twoSided, surface: 'groundFlush' }, {}).details).toEqual(['211']);
  });
  it('one side: no backing → 216 (assuming NDT, said so); without NDT → 216-noNDT; backing bars → 215 / 214', () => {
    const one = buttSeam();
    const e = earnedDetails(one, {});
    expect(e.details).toEqual(['216']);
    expect(e.assumptions.join(' ')).toContain('NDT of the root not recorded');
    expect(earnedDetails({ ...one, fatigue: { loaded: true, ndt: false } }, {}).details).toEqual([
      '216-noNDT',
    ]);
    expect(earnedDetails({ ...one, fatigue: { loaded: true, backing: 'permanent' } }, {}).details).toEqual([
      '215',
    ]);
    expect(earnedDetails({ ...one, fatigue: { loaded: true, backing: 'temporary' } }, {}).details).toEqual([
      '214',
    ]);
  });
  it('fillet joints: non-load-carrying → 511 (thicker attachment 511-thick, toe ground 511-ground); load-carrying → 413 and 414', () => {
    const t = filletSeam({ fatigue: { loaded: true, loadCarrying: false } });
    expect(earnedDetails(t, {}).details).toEqual(['511']);
    expect(earnedDetails({ ...t, plate2: { thickness: 12 } }, {}).details).toEqual(['511-thick']);
    expect(earnedDetails({ ...t, surface: 'toeGround' }, {}).details).toEqual(['511-ground']);
    expect(earnedDetails(filletSeam({ fatigue: { loaded: true, loadCarrying: true } }), {}).details).toEqual([
      '413',
      '414',
    ]);
    const unknown = earnedDetails(filletSeam(), {});
    expect(unknown.details).toEqual(['413', '414']);
    expect(unknown.assumptions.join(' ')).toContain('taken as load-carrying');
  });
  it('lap joints earn nothing from the catalogue', () => {
    expect(
      earnedDetails(filletSeam({ joint: { type: 'lap', sides: 'one', setting: 'site' } }), {}).details,
    ).toEqual([]);
  });
});

describe('effective notch reference (notch reference §6, recalled)', () => {
  it('t ≥ 5 mm: r_ref = 1 mm, FAT 225 (steel); t < 5 mm: 0.05 mm, FAT 630', () => {
    expect(notchReference(5, 'steel')).toMatchObject({ radiusMm: 1, fat: 225 });
    expect(notchReference(4.9, 'steel')).toMatchObject({ radiusMm: 0.05, fat: 630 });
    expect(notchReference(10, 'aluminium')).toMatchObject({ radiusMm: 1, fat: 71 });
    expect(notchReference(3, 'aluminium')).toMatchObject({ radiusMm: 0.05, fat: 180 });
  });
});

describe('FAT flag and life through assessSeam', () => {
  const seam = (fatigue: NonNullable<Seam['fatigue']>): Seam =>
    buttSeam({
      joint: { type: 'butt', preparation: 'doubleV', sides: 'two', setting: 'site' },
      plate1: { thickness: 10 },
      plate2: { thickness: 10 },
      fatigue,
    });
  // e = 1 mm on t = 10 mm: km = 1 + 3e/t = 1.30 (reference §2.1); a site butt weld covers 1.30 (§1.1) → km,eff = 1.
  const e1 = reading({ linearMisalignment: 1 }, { misalignmentBasis: 'midPlane' });
  const e2 = reading({ linearMisalignment: 2 }, { misalignmentBasis: 'midPlane', position: 200 });

  it('km,eff 1 at the covered km: FAT equivalent = FAT 80 (213), meets a required 80', () => {
    const file = seamFile(seam({ loaded: true, requiredFat: 80 }), [e1]);
    expectValid(file);
    const a = assessSeam(file, gradeSeam(file));
    expect(a.misalignment.kmCalc).toBeCloseTo(1.3, 10);
    expect(a.misalignment.kmEff).toBe(1);
    expect(a.fatigue.governing?.id).toBe('213');
    expect(a.fatigue.fatEquivalent).toBeCloseTo(80, 10);
    expect(a.fatigue.flag).toBe('meets');
  });

  it('e = 2 mm: km 1.6, km,eff 1.6/1.3, FAT equivalent 80·1.3/1.6 = 65, below 80 (derived)', () => {
    const file = seamFile(seam({ loaded: true, requiredFat: 80, designStressRange: 50, cycles: 1e6 }), [
      e1,
      e2,
    ]);
    const a = assessSeam(file, gradeSeam(file));
    expect(a.misalignment.kmCalc).toBeCloseTo(1.6, 10);
    expect(a.fatigue.fatEquivalent).toBeCloseTo(65, 10);
    expect(a.fatigue.flag).toBe('below');
    const life = a.fatigue.life;
    if ('notAssessed' in life) throw new Error(life.notAssessed);
    expect(life.cycles).toBeCloseTo(2e6 * (65 / 50) ** 3, 0);
    expect(life.meets).toBe(true);
    expect(a.fatigue.edition).toContain('2016 edition');
  });

  it('not assessable, naming what is missing: no required FAT, and no misalignment reading', () => {
    const file = seamFile(seam({ loaded: true }), [
      reading({ toeAngle: 150 }, { toe: { plate: 1, side: 'face' } }),
    ]);
    const a = assessSeam(file, gradeSeam(file));
    expect(a.fatigue.flag).toBe('notAssessable');
    expect(a.fatigue.missing.join(' | ')).toContain('fatigue.requiredFat');
    expect(a.fatigue.missing.join(' | ')).toContain('linearMisalignment or angularMisalignment readings');
    expect(a.fatigue.life).toEqual({ notAssessed: 'needs fatigue.designStressRange and a FAT equivalent' });
  });

  it('the drawing’s catalogue detail is the required FAT when none is given, and a better class than earned is pointed out', () => {
    const file = seamFile(seam({ loaded: true, detailClass: 'IIW 212' }), [
      e1,
      reading({ toeAngle: 140 }, { toe: { plate: 1, side: 'face' } }),
    ]);
    const a = assessSeam(file, gradeSeam(file));
    expect(a.fatigue.requiredFat).toEqual({ value: 90, basis: "the drawing's detail class 212" });
    expect(a.fatigue.designDetail?.note).toContain('the measured seam earns 213');
    expect(a.fatigue.flag).toBe('below');
  });

  it('an engineer’s override replaces the earned class or its FAT, and says so', () => {
    const file = seamFile(seam({ loaded: true, requiredFat: 80, detailOverride: '212', fatOverride: 100 }), [
      e1,
    ]);
    const a = assessSeam(file, gradeSeam(file));
    expect(a.fatigue.governing?.id).toBe('212');
    expect(a.fatigue.governing?.fat).toBe(100);
    expect(a.fatigue.assumptions.join(' ')).toContain('fatigue.fatOverride');
  });

  it('a seam marked not fatigue-loaded gets no flag', () => {
    const file = seamFile(seam({ loaded: false, requiredFat: 80 }), [e1]);
    const a = assessSeam(file, gradeSeam(file));
    expect(a.fatigue.flag).toBe('notAssessable');
    expect(a.fatigue.missing).toContain('the seam is marked not fatigue-loaded');
  });
});
