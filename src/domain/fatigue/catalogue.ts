import type { CoveredRow } from '../misalignment/covered.js';
import type { DetailId } from './detail-ids.js';

export interface FatigueDetail {
  readonly id: DetailId;
  readonly title: string;
  /** FAT (MPa at 2·10⁶ cycles, nominal stress, normal stress) for steel and aluminium. */
  readonly fat: { readonly steel: number; readonly aluminium: number };
  /** Which row of the km-already-covered table applies; 'bySetting' for butt welds (shop/flat or other). */
  readonly covered: CoveredRow | 'bySetting' | 'byJoint';
  /** Exponent n of the thickness correction (25/t_eff)^n; 0 where the stress is on a weld throat. */
  readonly thicknessExponent: number;
  readonly crackAt: 'toe' | 'root' | 'throat' | 'attachment end';
  readonly conditions: string;
  readonly confidence: string;
}

const RECALLED = 'IIW 2008 table as recalled (medium confidence); check against the 2016 edition';

/** Details an inspector meets, from the IIW Recommendations' nominal-stress catalogue (recalled values). */
export const DETAILS: Readonly<Record<DetailId, FatigueDetail>> = {
  '211': {
    id: '211',
    title: 'transverse butt weld, ground flush, NDT',
    fat: { steel: 112, aluminium: 45 },
    covered: 'bySetting',
    thicknessExponent: 0.1,
    crackAt: 'toe',
    conditions: 'ground flush parallel to the stress; run-on/off plates used and removed; NDT',
    confidence: `${RECALLED}; matches EN 1993-1-9 category 112`,
  },
  '212': {
    id: '212',
    title: 'transverse butt weld made in shop, flat position, NDT',
    fat: { steel: 90, aluminium: 36 },
    covered: 'bySetting',
    thicknessExponent: 0.2,
    crackAt: 'toe',
    conditions:
      'toe angle ≥ 150° (flank ≤ 30°); small reinforcement with smooth transitions (EN 1993-1-9: convexity ≤ 10 % of the weld width); NDT',
    confidence: `${RECALLED}; matches EN 1993-1-9 category 90`,
  },
  '213': {
    id: '213',
    title: 'transverse butt weld not meeting 212, NDT',
    fat: { steel: 80, aluminium: 32 },
    covered: 'bySetting',
    thicknessExponent: 0.2,
    crackAt: 'toe',
    conditions: 'NDT; aluminium only with toe angle ≥ 130° (flank ≤ 50°)',
    confidence: `${RECALLED}; matches EN 1993-1-9 category 80`,
  },
  '214': {
    id: '214',
    title: 'transverse butt weld on non-fusible temporary backing, root crack',
    fat: { steel: 80, aluminium: 28 },
    covered: 'bySetting',
    thicknessExponent: 0.2,
    crackAt: 'root',
    conditions: 'backing removed',
    confidence: RECALLED,
  },
  '215': {
    id: '215',
    title: 'transverse butt weld on permanent backing bar',
    fat: { steel: 71, aluminium: 25 },
    covered: 'bySetting',
    thicknessExponent: 0.2,
    crackAt: 'root',
    conditions: 'backing ends more than 10 mm from the plate edges',
    confidence: RECALLED,
  },
  '215-edge': {
    id: '215-edge',
    title: 'transverse butt weld on permanent backing bar ending within 10 mm of a plate edge',
    fat: { steel: 50, aluminium: 18 },
    covered: 'bySetting',
    thicknessExponent: 0.2,
    crackAt: 'root',
    conditions: 'backing ends 10 mm or less from the plate edges',
    confidence: RECALLED,
  },
  '216': {
    id: '216',
    title: 'transverse butt weld from one side, no backing, full penetration, root checked by NDT',
    fat: { steel: 71, aluminium: 28 },
    covered: 'bySetting',
    thicknessExponent: 0.2,
    crackAt: 'root',
    conditions: 'root checked by NDT',
    confidence: RECALLED,
  },
  '216-noNDT': {
    id: '216-noNDT',
    title: 'transverse butt weld from one side, no backing, root not checked by NDT',
    fat: { steel: 36, aluminium: 12 },
    covered: 'bySetting',
    thicknessExponent: 0.2,
    crackAt: 'root',
    conditions: 'no NDT of the root',
    confidence: RECALLED,
  },
  '217': {
    id: '217',
    title: 'transverse partial-penetration butt weld, stress on the throat',
    fat: { steel: 36, aluminium: 12 },
    covered: 'bySetting',
    thicknessExponent: 0,
    crackAt: 'throat',
    conditions: 'not recommended under fatigue; assess the root by fracture mechanics',
    confidence: `${RECALLED} (low confidence on the advice)`,
  },
  '411': {
    id: '411',
    title: 'cruciform or T joint, full-penetration K-butt, toes ground, toe crack',
    fat: { steel: 80, aluminium: 28 },
    covered: 'byJoint',
    thicknessExponent: 0.2,
    crackAt: 'toe',
    conditions: 'e ≤ 0.15·t; no lamellar tearing',
    confidence: RECALLED,
  },
  '412': {
    id: '412',
    title: 'cruciform or T joint, full-penetration K-butt, as welded, toe crack',
    fat: { steel: 71, aluminium: 25 },
    covered: 'byJoint',
    thicknessExponent: 0.3,
    crackAt: 'toe',
    conditions: 'e ≤ 0.15·t',
    confidence: RECALLED,
  },
  '413': {
    id: '413',
    title: 'cruciform or T joint, fillet or partial-penetration welds, toe crack',
    fat: { steel: 63, aluminium: 22 },
    covered: 'byJoint',
    thicknessExponent: 0.3,
    crackAt: 'toe',
    conditions: 'e ≤ 0.15·t',
    confidence: RECALLED,
  },
  '414': {
    id: '414',
    title:
      'cruciform or T joint, load-carrying fillet or partial-penetration welds, root crack, stress on the throat',
    fat: { steel: 36, aluminium: 12 },
    covered: 'byJoint',
    thicknessExponent: 0,
    crackAt: 'throat',
    conditions: 'stress on the weld throat; FAT 40 / 14 may apply when a/t ≥ 1/3 (low confidence)',
    confidence: RECALLED,
  },
  '511': {
    id: '511',
    title: 'transverse non-load-carrying attachment, not thicker than the main plate, as welded',
    fat: { steel: 80, aluminium: 28 },
    covered: 'byJoint',
    thicknessExponent: 0.3,
    crackAt: 'toe',
    conditions: 'attachment not thicker than the main plate',
    confidence: RECALLED,
  },
  '511-ground': {
    id: '511-ground',
    title: 'transverse non-load-carrying attachment, toe ground or K-butt',
    fat: { steel: 100, aluminium: 36 },
    covered: 'byJoint',
    thicknessExponent: 0.2,
    crackAt: 'toe',
    conditions: 'toe ground, or full-penetration K-butt',
    confidence: RECALLED,
  },
  '511-thick': {
    id: '511-thick',
    title: 'transverse non-load-carrying attachment thicker than the main plate',
    fat: { steel: 71, aluminium: 25 },
    covered: 'byJoint',
    thicknessExponent: 0.3,
    crackAt: 'toe',
    conditions: 'attachment thicker than the main plate',
    confidence: RECALLED,
  },
  '521-50': {
    id: '521-50',
    title: 'longitudinal fillet-welded gusset on a plate surface, l ≤ 50 mm',
    fat: { steel: 80, aluminium: 28 },
    covered: 'filletOneSurface',
    thicknessExponent: 0.1,
    crackAt: 'attachment end',
    conditions: 'gusset length l ≤ 50 mm',
    confidence: RECALLED,
  },
  '521-150': {
    id: '521-150',
    title: 'longitudinal fillet-welded gusset on a plate surface, l ≤ 150 mm',
    fat: { steel: 71, aluminium: 25 },
    covered: 'filletOneSurface',
    thicknessExponent: 0.1,
    crackAt: 'attachment end',
    conditions: '50 mm < l ≤ 150 mm',
    confidence: RECALLED,
  },
  '521-300': {
    id: '521-300',
    title: 'longitudinal fillet-welded gusset on a plate surface, l ≤ 300 mm',
    fat: { steel: 63, aluminium: 20 },
    covered: 'filletOneSurface',
    thicknessExponent: 0.1,
    crackAt: 'attachment end',
    conditions: '150 mm < l ≤ 300 mm',
    confidence: RECALLED,
  },
  '521-long': {
    id: '521-long',
    title: 'longitudinal fillet-welded gusset on a plate surface, l > 300 mm',
    fat: { steel: 50, aluminium: 18 },
    covered: 'filletOneSurface',
    thicknessExponent: 0.1,
    crackAt: 'attachment end',
    conditions: 'l > 300 mm',
    confidence: RECALLED,
  },
};
