import type { Unit } from '../units.js';

/**
 * The one vocabulary of measured parameters shared by gauge entry, imports, the grader and sync.
 * `per` says where on the joint the value belongs, which decides what the reading must name.
 */
export const PARAMETER_NAMES = [
  'toeAngle',
  'toeRadius',
  'reinforcementHeight',
  'reinforcementWidth',
  'convexity',
  'undercutDepth',
  'overlap',
  'rootConcavity',
  'shrinkageGroove',
  'sagging',
  'incompleteRootPenetration',
  'throat',
  'leg1',
  'leg2',
  'rootGap',
  'linearMisalignment',
  'angularMisalignment',
  'poreDiameter',
  'endCraterDepth',
] as const;

export type ParameterName = (typeof PARAMETER_NAMES)[number];

export type ParameterPer = 'toe' | 'side' | 'fillet' | 'crossSection' | 'spot';

export type JointFamily = 'butt' | 'fillet';

export interface ParameterSpec {
  readonly unit: Unit;
  readonly per: ParameterPer;
  /** Inclusive physical range; `minExclusive` marks a strict lower bound. */
  readonly min: number;
  readonly max: number;
  readonly minExclusive?: boolean;
  /** Joint families the parameter belongs to. */
  readonly joints: readonly JointFamily[];
  /** May run along the seam with a start and an end. */
  readonly hasLength: boolean;
  readonly meaning: string;
}

const BOTH: readonly JointFamily[] = ['butt', 'fillet'];

export const PARAMETERS: Readonly<Record<ParameterName, ParameterSpec>> = {
  toeAngle: {
    unit: 'deg',
    per: 'toe',
    min: 90,
    max: 180,
    joints: BOTH,
    hasLength: false,
    meaning: 'ISO 5817 toe angle α through the weld (flush = 180°)',
  },
  toeRadius: {
    unit: 'mm',
    per: 'toe',
    min: 0,
    max: 100,
    minExclusive: true,
    joints: BOTH,
    hasLength: false,
    meaning: 'radius of the toe transition',
  },
  reinforcementHeight: {
    unit: 'mm',
    per: 'side',
    min: 0,
    max: 100,
    joints: ['butt'],
    hasLength: false,
    meaning: 'excess weld metal (face) or excess penetration (root) height h',
  },
  reinforcementWidth: {
    unit: 'mm',
    per: 'side',
    min: 0,
    max: 1000,
    minExclusive: true,
    joints: BOTH,
    hasLength: false,
    meaning: 'width b of the cap, root bead or fillet face in the same cross-section',
  },
  convexity: {
    unit: 'mm',
    per: 'side',
    min: 0,
    max: 100,
    joints: ['fillet'],
    hasLength: false,
    meaning: 'excess convexity h of a fillet face',
  },
  undercutDepth: {
    unit: 'mm',
    per: 'toe',
    min: 0,
    max: 100,
    joints: BOTH,
    hasLength: true,
    meaning: 'undercut depth h at a toe',
  },
  overlap: {
    unit: 'mm',
    per: 'toe',
    min: 0,
    max: 100,
    joints: BOTH,
    hasLength: true,
    meaning: 'width h of weld metal lying on the parent metal unfused at a toe',
  },
  rootConcavity: {
    unit: 'mm',
    per: 'side',
    min: 0,
    max: 100,
    joints: ['butt'],
    hasLength: true,
    meaning: 'root concavity depth h',
  },
  shrinkageGroove: {
    unit: 'mm',
    per: 'side',
    min: 0,
    max: 100,
    joints: ['butt'],
    hasLength: true,
    meaning: 'shrinkage groove depth h at the root',
  },
  sagging: {
    unit: 'mm',
    per: 'side',
    min: 0,
    max: 100,
    joints: ['butt'],
    hasLength: true,
    meaning: 'sagging or incompletely filled groove depth h',
  },
  incompleteRootPenetration: {
    unit: 'mm',
    per: 'side',
    min: 0,
    max: 100,
    joints: ['butt'],
    hasLength: true,
    meaning: 'incomplete root penetration h of a single-sided butt weld',
  },
  throat: {
    unit: 'mm',
    per: 'fillet',
    min: 0,
    max: 200,
    minExclusive: true,
    joints: ['fillet'],
    hasLength: true,
    meaning: 'actual throat thickness aA of a fillet weld',
  },
  leg1: {
    unit: 'mm',
    per: 'fillet',
    min: 0,
    max: 300,
    minExclusive: true,
    joints: ['fillet'],
    hasLength: false,
    meaning: 'leg length z1 on plate 1',
  },
  leg2: {
    unit: 'mm',
    per: 'fillet',
    min: 0,
    max: 300,
    minExclusive: true,
    joints: ['fillet'],
    hasLength: false,
    meaning: 'leg length z2 on plate 2',
  },
  rootGap: {
    unit: 'mm',
    per: 'fillet',
    min: 0,
    max: 100,
    joints: ['fillet'],
    hasLength: false,
    meaning: 'fit-up gap h between the plates of a fillet weld',
  },
  linearMisalignment: {
    unit: 'mm',
    per: 'crossSection',
    min: -100,
    max: 100,
    joints: BOTH,
    hasLength: false,
    meaning: "signed offset e, positive when plate 2's mid-plane lies on the face side of plate 1's",
  },
  angularMisalignment: {
    unit: 'deg',
    per: 'crossSection',
    min: -45,
    max: 45,
    joints: BOTH,
    hasLength: false,
    meaning: 'signed kink β between the plate mid-planes, positive when the joint peaks toward the face side',
  },
  poreDiameter: {
    unit: 'mm',
    per: 'spot',
    min: 0,
    max: 100,
    joints: BOTH,
    hasLength: false,
    meaning: 'largest dimension d of a surface pore',
  },
  endCraterDepth: {
    unit: 'mm',
    per: 'spot',
    min: 0,
    max: 100,
    joints: BOTH,
    hasLength: false,
    meaning: 'depth h of an end crater pipe',
  },
};

/** Flank angle θ used by fatigue papers, from the ISO 5817 toe angle α (θ = 180° − α). */
export const flankAngle = (toeAngle: number): number => 180 - toeAngle;
