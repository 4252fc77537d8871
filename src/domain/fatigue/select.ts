import type { CoveredRow } from '../misalignment/covered.js';
import type { Seam } from '../model/seam-file.js';
import { DETAILS } from './catalogue.js';
import type { DetailId } from './detail-ids.js';

/** What the measured seam shows about the geometry a class asks for. */
export interface MeasuredForClass {
  /** The smallest ISO toe angle measured on the seam, and where. */
  readonly minToeAngle?: { readonly value: number; readonly where: string };
  /** The largest reinforcement height over its width, h/b, and where. */
  readonly maxReinforcementRatio?: { readonly value: number; readonly where: string };
}

export interface EarnedClass {
  /** The details the seam is assessed as (a load-carrying fillet joint: toe and root). Empty when none fits. */
  readonly details: readonly DetailId[];
  readonly why: readonly string[];
  readonly assumptions: readonly string[];
}

const K_BUTT = new Set(['doubleBevel', 'doubleJ']);

function butt(seam: Seam, m: MeasuredForClass): EarnedClass {
  const f = seam.fatigue;
  const why: string[] = [];
  const assumptions: string[] = [];
  const ndtUnknown = f?.ndt === undefined;
  if (seam.surface === 'groundFlush' && f?.ndt !== false) {
    if (ndtUnknown) assumptions.push('NDT not recorded: the weld is taken as examined as class 211 requires');
    return { details: ['211'], why: ['ground flush (surface "groundFlush")'], assumptions };
  }
  if (seam.joint.sides === 'one') {
    const backing = f?.backing;
    if (backing === 'permanent')
      return { details: ['215'], why: ['welded from one side on a permanent backing bar'], assumptions };
    if (backing === 'temporary')
      return { details: ['214'], why: ['welded from one side on temporary backing'], assumptions };
    if (backing === undefined) assumptions.push('backing not recorded: taken as none');
    if (f?.ndt === false)
      return { details: ['216-noNDT'], why: ['one side, no backing, root not checked by NDT'], assumptions };
    if (ndtUnknown) {
      assumptions.push(
        'NDT of the root not recorded: taken as done (216, FAT 71); without it the class is 36 MPa',
      );
    }
    return { details: ['216'], why: ['welded from one side without backing: the root governs'], assumptions };
  }
  if (f?.ndt === false) {
    return {
      details: [],
      why: ['a two-sided butt weld without NDT has no class in the catalogue'],
      assumptions,
    };
  }
  if (ndtUnknown)
    assumptions.push('NDT not recorded: the weld is taken as examined as classes 212/213 require');
  const fails: string[] = [];
  if (seam.joint.setting !== 'shopFlat') fails.push('not made in shop in flat position');
  if (!m.minToeAngle) fails.push('toe angle not measured, so a toe angle ≥ 150° cannot be shown');
  else if (m.minToeAngle.value < 150)
    fails.push(`toe angle ${m.minToeAngle.value}° at ${m.minToeAngle.where} is below 150° (flank above 30°)`);
  if (!m.maxReinforcementRatio) fails.push('reinforcement height and width not measured');
  else if (m.maxReinforcementRatio.value > 0.1) {
    fails.push(
      `reinforcement ${(100 * m.maxReinforcementRatio.value).toFixed(1)} % of its width at ${m.maxReinforcementRatio.where} exceeds 10 %`,
    );
  }
  if (!fails.length) {
    why.push('shop, flat position; every toe angle ≥ 150°; reinforcement ≤ 10 % of its width');
    return { details: ['212'], why, assumptions };
  }
  why.push(`not 212: ${fails.join('; ')}`);
  if (seam.material.kind === 'aluminium' && !(m.minToeAngle && m.minToeAngle.value >= 130)) {
    why.push('aluminium 213 needs every toe angle ≥ 130° (flank ≤ 50°), which is not shown');
    return { details: [], why, assumptions };
  }
  return { details: ['213'], why, assumptions };
}

function fillet(seam: Seam): EarnedClass {
  const f = seam.fatigue;
  const kButt = seam.joint.preparation !== undefined && K_BUTT.has(seam.joint.preparation);
  const ground = seam.surface === 'toeGround';
  const assumptions: string[] = [];
  if (f?.loadCarrying === false) {
    if (kButt || ground)
      return {
        details: ['511-ground'],
        why: [kButt ? 'non-load-carrying, K-butt' : 'non-load-carrying, toe ground'],
        assumptions,
      };
    if (seam.plate2.thickness > seam.plate1.thickness) {
      return {
        details: ['511-thick'],
        why: ['non-load-carrying attachment thicker than the main plate'],
        assumptions,
      };
    }
    return { details: ['511'], why: ['non-load-carrying transverse attachment, as welded'], assumptions };
  }
  if (f?.loadCarrying === undefined)
    assumptions.push('load-carrying not recorded: taken as load-carrying (the lower classes)');
  if (kButt)
    return {
      details: [ground ? '411' : '412'],
      why: [`full-penetration K-butt${ground ? ', toes ground' : ', as welded'}`],
      assumptions,
    };
  return {
    details: ['413', '414'],
    why: ['fillet welds: toe crack (413) and root crack through the throat (414)'],
    assumptions,
  };
}

/** The class the measured seam earns, and why. */
export function earnedDetails(seam: Seam, m: MeasuredForClass): EarnedClass {
  if (seam.joint.type === 'butt') return butt(seam, m);
  if (seam.joint.type === 'lap')
    return { details: [], why: ['lap joints are not in the catalogue'], assumptions: [] };
  return fillet(seam);
}

/** The km-already-covered row of a detail on this seam. */
export function coveredRowOf(id: DetailId, seam: Seam): CoveredRow {
  const c = DETAILS[id].covered;
  if (c === 'bySetting') return seam.joint.setting === 'shopFlat' ? 'buttShopFlat' : 'buttOther';
  if (c === 'byJoint') return seam.joint.type === 'cruciform' ? 'cruciform' : 'filletOneSurface';
  return c;
}
