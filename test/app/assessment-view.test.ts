// The seam screen's assessment panel, as words and chart geometry, from real assessments: the invented demo
// yard's deck splice and small seams built to meet, miss or lack what the fatigue flag needs.
import { describe, expect, it } from 'vitest';
import {
  assessSeam,
  gradeSeam,
  INDICATIVE_CAUTION,
  type Seam,
  type SeamFile,
} from '../../src/domain/index.js';
import { kestrelPointYard } from '../../src/demo/kestrel-point-yard.js';
import { assessmentView } from '../../src/app/components/assessment-view.js';
import { layoutBars } from '../../src/app/components/bar-layout.js';
import { layoutRunningMean } from '../../src/app/components/running-mean-layout.js';
import { describeBars } from '../../src/app/components/RankedBars.js';
import { buttSeam, reading, seamFile } from '../support/seam-builder.js';

const viewOf = (file: SeamFile, canOverride = false) =>
  assessmentView(assessSeam(file, gradeSeam(file)), canOverride);

function deckSplice(): SeamFile {
  const file = kestrelPointYard().find((f) => f.seam.id === 'demo-kp-014');
  if (!file) throw new Error('the demo yard has no deck splice');
  return file;
}

const siteButt = (fatigue: NonNullable<Seam['fatigue']>): Seam =>
  buttSeam({
    joint: { type: 'butt', preparation: 'doubleV', sides: 'two', setting: 'site' },
    fatigue,
  });
const midPlane = (e: number, position: number) =>
  reading({ linearMisalignment: e }, { misalignmentBasis: 'midPlane', position });

describe('km in the panel (misalignment reference §2.1, §1.1)', () => {
  const v = viewOf(deckSplice());
  const value = (label: string) => v.km.facts.find((f) => f.label === label)?.value;

  it('the demo deck splice: e = 0.6 mm on 12 mm plates gives km linear 1 + 3e/t = 1.15 (§2.1)', () => {
    expect(value('km linear')).toBe('1.15');
    expect(value('km combined')).toBe('1.15');
  });

  it('sets it beside the km a shop butt weld’s class covers (1.15, §1.1 table, recalled): km,eff 1', () => {
    expect(value('km covered by the class')).toBe('1.15');
    expect(value('km,eff')).toBe('1');
    expect(v.km.summary).toBe('km 1.15; after what the class already covers, km,eff 1.');
  });

  it('shows the DNV form as a second estimate and lists the assumptions used', () => {
    expect(v.km.facts.map((f) => f.label)).toContain('DNV form (second estimate)');
    expect(v.km.assumptions.length).toBeGreaterThan(0);
  });

  it('a seam without misalignment readings says so instead of a number', () => {
    const file = seamFile(buttSeam(), [reading({ toeAngle: 150 }, { toe: { plate: 1, side: 'face' } })]);
    const km = viewOf(file).km;
    expect(km.facts.find((f) => f.label === 'km combined')).toBeUndefined();
    expect(km.summary).toMatch(/^No misalignment measured yet\. Missing: .*linearMisalignment/);
  });
});

describe('crack-site ranking (design §3 signs: e > 0 puts plate 1 face in tension)', () => {
  const v = viewOf(deckSplice());

  it('ranks the toe in secondary-bending tension first and names it as the most likely crack site', () => {
    expect(v.toes.rows[0]?.label).toBe('plate 1 face-side toe');
    expect(v.toes.rows[0]?.bending).toMatch(/^secondary bending in tension \(b = \+0\.15\)$/);
    expect(v.toes.rows[1]?.bending).toMatch(/compression/);
    expect(v.toes.crackSite).toMatch(/^Most likely crack site: plate 1 face-side toe at \d+ mm \(Kt,eff /);
  });

  it('says when a toe radius was not measured', () => {
    expect(v.toes.rows.every((t) => t.flags.includes('radius not measured here'))).toBe(true);
  });
});

describe('fatigue-class flag (misalignment reference §3: FAT equivalent = FAT · f(t) / km,eff)', () => {
  it('meets: the demo deck splice earns 216 (one side, no backing) and meets the required FAT 71, with a ✓', () => {
    const fat = viewOf(deckSplice()).fat;
    expect(fat.flag).toBe('meets');
    expect(fat.symbol).toBe('✓');
    expect(fat.verdict).toBe('Meets the required fatigue class');
    expect(fat.chosenId).toBe('216');
    expect(fat.chosen).toMatch(/^Detail 216: .*FAT 71 MPa/);
    expect(fat.why.join(' ')).toMatch(/one side without backing/);
  });

  it('below: e = 2 mm on 10 mm plates, km 1.6 against 1.3 covered → 80·1.3/1.6 = 65 MPa < 80, with a ✗ (derived)', () => {
    const fat = viewOf(seamFile(siteButt({ loaded: true, requiredFat: 80 }), [midPlane(2, 100)])).fat;
    expect(fat.flag).toBe('below');
    expect(fat.symbol).toBe('✗');
    expect(fat.numbers).toBe(
      'FAT equivalent 65 MPa against the required 80 MPa (the required class in the seam set-up)',
    );
  });

  it('not assessable: names the missing input and still shows the class the seam earns, with a ?', () => {
    const fat = viewOf(seamFile(buttSeam(), [midPlane(1, 100)])).fat;
    expect(fat.flag).toBe('notAssessable');
    expect(fat.symbol).toBe('?');
    expect(fat.missing.join(' ')).toMatch(/seam\.fatigue/);
    expect(fat.chosenId).not.toBeNull();
    expect(fat.canOverride).toBe(false);
  });

  it('an engineer’s chosen detail is shown as the reason and preselected', () => {
    const file = seamFile(siteButt({ loaded: true, requiredFat: 80, detailOverride: '215' }), [
      midPlane(1, 100),
    ]);
    const fat = viewOf(file, true).fat;
    expect(fat.canOverride).toBe(true);
    expect(fat.overrideId).toBe('215');
    expect(fat.chosenId).toBe('215');
    expect(fat.why[0]).toBe('detail 215 chosen by an engineer');
  });
});

describe('indicative life (IIW 2016 S-N curve, slope 3 above the knee)', () => {
  it('the deck splice: 2·10⁶·(71/45)³ cycles at 45 MPa, against 2 million required', () => {
    const fat = viewOf(deckSplice()).fat;
    const expected = Number(((2e6 * (71 / 45) ** 3) / 1e6).toPrecision(3));
    expect(fat.life).toBe(
      `About ${expected} million cycles at a stress range of 45 MPa, against 2 million required — meets it (indicative).`,
    );
    expect(fat.lifeCurve).toMatch(/2016/);
  });

  it('without a design stress range it says what is missing', () => {
    const fat = viewOf(seamFile(siteButt({ loaded: true, requiredFat: 80 }), [midPlane(1, 100)])).fat;
    expect(fat.life).toMatch(/^Life not estimated: needs fatigue\.designStressRange/);
    expect(fat.lifeCurve).toBeNull();
  });
});

describe('what drives it (one-at-a-time sensitivity over each instrument’s resolution)', () => {
  const d = viewOf(deckSplice()).drivers;

  it('ranks the bars largest first, the misalignment reading leading the life', () => {
    expect(d.title).toBe('What drives the life');
    expect(d.bars[0]?.label).toMatch(/^linear misalignment/);
    for (const bars of [d.bars, d.toeBars])
      for (let i = 1; i < bars.length; i++)
        expect(bars[i - 1]?.magnitude).toBeGreaterThanOrEqual(bars[i]?.magnitude ?? Infinity);
  });

  it('toe-angle readings move the toe factors though not the nominal life', () => {
    expect(d.toeBars.some((b) => b.label.startsWith('toe angle'))).toBe(true);
    expect(d.bars.some((b) => b.label.startsWith('toe angle'))).toBe(false);
  });

  it('the chart is described in words, in rank order', () => {
    expect(describeBars(d.title, d.bars)).toMatch(
      /^What drives the life, largest first: 1\. linear misalignment/,
    );
    expect(describeBars('x', [])).toBe('x: no measured input changes it.');
  });
});

describe('sampling adequacy in plain words (Student t interval, common practice)', () => {
  const s = viewOf(deckSplice()).sampling;
  const toe = s.rows.find((r) => r.label === 'toe angle, plate 1 face-side toe');

  it('the deck splice’s six at-pitch toe angles: advice to measure more, the running mean in seam order', () => {
    expect(toe?.positions).toEqual([150, 300, 450, 750, 900, 1050]);
    expect(toe?.advice).toMatch(
      /^toe angle, plate 1 face-side toe: 6 positions, .*measure about \d+ more positions/,
    );
    expect(toe?.target).toBe(1);
    expect(s.caveat).toMatch(/independent/);
  });
});

describe('chart geometry', () => {
  it('bars scale to the largest, which spans the drawing', () => {
    const l = layoutBars([0.5, 1, 0.25], 400);
    expect(l.bars.map((b) => b.barWidth)).toEqual([194, 388, 97]);
    expect(l.bars[1]?.textInside).toBe(true);
    expect(l.bars[2]?.textInside).toBe(false);
  });

  it('the running mean band is the final mean ± target, and positions run left to right', () => {
    const l = layoutRunningMean([0, 500, 1000], [10, 12, 11], 1, 1000, 600);
    expect(l.points.map((p) => p.x)).toEqual([l.plotLeft, (l.plotLeft + l.plotRight) / 2, l.plotRight]);
    expect(l.band.mean).toBeCloseTo(l.points[2]?.y ?? NaN, 9);
    // 12 lies exactly on the band's upper edge (11 + 1); SVG y grows downwards.
    expect(l.points[1]?.y).toBeCloseTo(l.band.top, 9);
    expect(l.band.bottom).toBeGreaterThan(l.band.mean);
  });
});

describe('the caution', () => {
  it('the panel carries the indicative caution', () => {
    expect(viewOf(deckSplice()).caution).toBe(INDICATIVE_CAUTION);
  });
});
