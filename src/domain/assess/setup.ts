import type { Ends } from '../misalignment/angular.js';
import type { JointType, Seam } from '../model/seam-file.js';

export interface AssessOptions {
  /**
   * Angular misalignment under a compressive membrane stress: 'amplify' (default) uses the beam-column
   * amplification tan(x)/x; 'noRelief' takes the kink's km without straightening or amplification.
   */
  readonly compression?: 'amplify' | 'noRelief';
  /** Target half-width of the 95 % interval per parameter, in its unit; default: the instrument resolution. */
  readonly samplingTargets?: Readonly<Record<string, number>>;
  /** Set false to leave out the sensitivity study (it re-evaluates the assessment twice per measured input). */
  readonly sensitivity?: boolean;
}

/** What the assessment takes from the seam's set-up, with the defaults it had to assume named. */
export interface Setup {
  readonly seam: Seam;
  readonly joint: JointType;
  readonly family: 'butt' | 'fillet';
  readonly material: 'steel' | 'aluminium';
  readonly t1: number;
  readonly t2: number;
  /** Free lengths from the weld to where each plate is held; equal when unknown (then `armsKnown` is false). */
  readonly l1: number;
  readonly l2: number;
  readonly armsKnown: boolean;
  readonly restraint: Ends;
  /** Membrane stress for the straightening correction (MPa, tension positive); null when not given. */
  readonly sigmaM: number | null;
  readonly E: number;
  readonly compression: 'amplify' | 'noRelief';
  readonly assumptions: readonly string[];
}

/** IIW and DNV default for steel; aluminium about 70 000 MPa (misalignment reference, symbols table). */
const E_DEFAULT = { steel: 210_000, aluminium: 70_000 } as const;

export function setupOf(seam: Seam, options: AssessOptions = {}): Setup {
  const f = seam.fatigue;
  const assumptions: string[] = [];
  const material = seam.material.kind;
  const E = f?.youngsModulus ?? E_DEFAULT[material];
  if (f?.youngsModulus === undefined) assumptions.push(`E = ${E} MPa (default for ${material})`);
  const restraint = f?.restraint ?? 'pinned';
  if (f?.restraint === undefined) assumptions.push('restraint not given: pinned ends (the larger km)');
  let l1 = f?.freeLength1;
  let l2 = f?.freeLength2;
  const armsKnown = l1 !== undefined || l2 !== undefined;
  if (l1 === undefined && l2 !== undefined) {
    l1 = l2;
    assumptions.push('free length l1 not given: taken equal to l2');
  } else if (l2 === undefined && l1 !== undefined) {
    l2 = l1;
    assumptions.push('free length l2 not given: taken equal to l1');
  } else if (!armsKnown) {
    assumptions.push('free lengths not given: equal arms (the remote case)');
  }
  const sigmaM = f?.membraneStress ?? null;
  if (sigmaM === null) assumptions.push('membrane stress not given: no straightening of an angular kink');
  const compression = options.compression ?? 'amplify';
  if (sigmaM !== null && sigmaM < 0) {
    assumptions.push(
      compression === 'amplify'
        ? 'compressive membrane stress: the kink is amplified, tan(x)/x (beam-column)'
        : 'compressive membrane stress: no relief and no amplification of the kink (option "noRelief")',
    );
  }
  return {
    seam,
    joint: seam.joint.type,
    family: seam.joint.type === 'butt' ? 'butt' : 'fillet',
    material,
    t1: seam.plate1.thickness,
    t2: seam.plate2.thickness,
    l1: l1 ?? 1,
    l2: l2 ?? 1,
    armsKnown,
    restraint,
    sigmaM,
    E,
    compression,
    assumptions,
  };
}
