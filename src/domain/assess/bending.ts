import {
  kmAngular,
  kmAngularLongArms,
  straighteningBeta,
  straighteningFactor,
} from '../misalignment/angular.js';
import { armShare, kmAxialCruciform, kmAxialFlat, kmAxialThicknessStep } from '../misalignment/axial.js';
import type { JointType } from '../model/seam-file.js';
import type { Setup } from './setup.js';
import type { ToeRef } from './types.js';

const RAD = Math.PI / 180;

/** A measured misalignment value that enters km, with the uncertainty of its instrument. */
export interface Measured {
  readonly readingId: string;
  readonly position: number;
  readonly value: number;
  readonly resolution: number;
  readonly resolutionBasis: string;
}

/** The extreme signed misalignments of the round: the most positive and the most negative of each kind. */
export interface MisalignmentInputs {
  readonly eHi: Measured | null;
  readonly eLo: Measured | null;
  readonly aHi: Measured | null;
  readonly aLo: Measured | null;
}

export interface Surface {
  readonly plate: 1 | 2;
  readonly surface: 'face' | 'root';
}

/** The surfaces of the loaded plate(s) at the weld whose secondary bending the assessment tracks. */
const BUTT_SURFACES: readonly Surface[] = Object.freeze([
  { plate: 1, surface: 'face' },
  { plate: 2, surface: 'face' },
  { plate: 1, surface: 'root' },
  { plate: 2, surface: 'root' },
] as const);
const MAIN_PLATE_SURFACES: readonly Surface[] = Object.freeze([
  { plate: 1, surface: 'face' },
  { plate: 1, surface: 'root' },
] as const);
const NO_SURFACES: readonly Surface[] = Object.freeze([]);

export function surfacesOf(joint: JointType): readonly Surface[] {
  if (joint === 'butt') return BUTT_SURFACES;
  return joint === 'lap' ? NO_SURFACES : MAIN_PLATE_SURFACES;
}

/**
 * The main-plate surface a toe lies on. Butt: the toe's own plate and side. Cruciform: plate 1, the toe's side
 * (the attachments stand on both surfaces). T joint: both fillets' toes lie on the attachment side of the main
 * plate, taken as its face side. Toes on the attachment (plate 2 of a fillet joint) carry no nominal stress here.
 */
export function toeSurface(joint: JointType, toe: ToeRef): Surface | null {
  if (joint === 'butt') return { plate: toe.plate, surface: toe.side };
  if (joint === 'lap' || toe.plate === 2) return null;
  return joint === 'cruciform' ? { plate: 1, surface: toe.side } : { plate: 1, surface: 'face' };
}

/**
 * Sign of the secondary bending on a surface for e > 0 (+1 tension). With e > 0 plate 2's mid-plane lies on the
 * face side of plate 1's: the line of the load passes face-side of plate 1's mid-plane and root-side of plate 2's,
 * so plate 1's face and plate 2's root are in tension. In a cruciform joint the two halves of the loaded plate are
 * not told apart, so both surfaces are taken in tension. A T joint's main plate is continuous: no linear term.
 */
function linearSign(joint: JointType, s: Surface, e: number): number {
  if (joint === 'cruciform') return 1;
  if (joint !== 'butt') return 0;
  const plus = (s.plate === 1) === (s.surface === 'face') ? 1 : -1;
  return e >= 0 ? plus : -plus;
}

/** Sign for α > 0 (the joint peaks toward the face side): the load line passes root-side, so the root surface is in tension. */
function angularSign(joint: JointType, s: Surface, alpha: number): number {
  if (joint === 'lap') return 0;
  const plus = s.surface === 'root' ? 1 : -1;
  return alpha >= 0 ? plus : -plus;
}

const plateT = (setup: Setup, plate: 1 | 2): number => (plate === 1 ? setup.t1 : setup.t2);

/** km − 1 from a mid-plane offset |e| on a plate's surface; 0 where the joint has no linear term. */
export function deltaAxial(setup: Setup, plate: 1 | 2, absE: number): number {
  const { joint, l1, l2, restraint } = setup;
  if (joint === 'butt') {
    const ti = plateT(setup, plate);
    const tOther = plateT(setup, plate === 1 ? 2 : 1);
    if (Math.abs(ti - tOther) > 1e-9) return kmAxialThicknessStep(absE, ti, tOther) - 1;
    const li = plate === 1 ? l1 : l2;
    return kmAxialFlat(absE, ti, armShare(li, l1, l2, restraint) * (l1 + l2), l1, l2) - 1;
  }
  if (joint === 'cruciform') {
    const share = armShare(Math.max(l1, l2), l1, l2, restraint);
    return kmAxialCruciform(absE, setup.t1, share * (l1 + l2), l1, l2) - 1;
  }
  return 0;
}

export interface AngularDelta {
  readonly delta: number;
  readonly factor: number | null;
  readonly formula: string;
}

/** km − 1 from a kink |α| (degrees) on a plate, or why it cannot be given. */
const LONG_ARMS = 'long-arm limit 1 + 1.5·α/√(3σm/E) (free lengths unknown: the upper bound over l)';
const NO_ARMS = 'needs the free lengths (fatigue.freeLength1/2), or a tensile membrane stress';
const BUCKLED = 'the compressive membrane stress reaches the elastic buckling load of the kinked arm';

/** The straightening (or amplification) factor the seam's set-up gives an arm of plate thickness t; NaN past buckling. */
function angularFactor(setup: Setup, t: number): number {
  const { sigmaM } = setup;
  if (sigmaM === null || sigmaM === 0 || (sigmaM < 0 && setup.compression === 'noRelief')) return 1;
  // Unequal arms: β from the shorter arm, which relieves least (conservative).
  const beta = straighteningBeta(Math.min(setup.l1, setup.l2), t, sigmaM, setup.E);
  const f = straighteningFactor(beta, setup.restraint, sigmaM < 0);
  return Number.isFinite(f) ? f : NaN;
}

/** km − 1 from a kink |α| (degrees) on a plate; NaN when it cannot be given (see deltaAngular for why). */
export function angularDelta(setup: Setup, plate: 1 | 2, absAlphaDeg: number): number {
  const t = setup.family === 'butt' ? plateT(setup, plate) : setup.t1;
  const alpha = absAlphaDeg * RAD;
  const { sigmaM, E } = setup;
  if (!setup.armsKnown) return sigmaM !== null && sigmaM > 0 ? kmAngularLongArms(alpha, sigmaM, E) - 1 : NaN;
  const factor = angularFactor(setup, t);
  return Number.isNaN(factor) ? NaN : kmAngular(alpha, t, setup.l1, setup.l2, setup.restraint, factor) - 1;
}

/** km − 1 from a kink |α| (degrees) on a plate with the formula used, or why it cannot be given. */
export function deltaAngular(
  setup: Setup,
  plate: 1 | 2,
  absAlphaDeg: number,
): AngularDelta | { notAssessed: string } {
  const delta = angularDelta(setup, plate, absAlphaDeg);
  const { sigmaM, restraint: ends } = setup;
  if (!setup.armsKnown)
    return Number.isNaN(delta) ? { notAssessed: NO_ARMS } : { delta, factor: null, formula: LONG_ARMS };
  if (Number.isNaN(delta)) return { notAssessed: BUCKLED };
  const factor = angularFactor(setup, setup.family === 'butt' ? plateT(setup, plate) : setup.t1);
  const how =
    factor === 1
      ? 'no straightening'
      : sigmaM !== null && sigmaM > 0
        ? `straightening ${ends === 'clamped' ? 'tanh(β/2)/(β/2)' : 'tanh(β)/β'}`
        : `amplification ${ends === 'clamped' ? 'tan(β/2)/(β/2)' : 'tan(β)/β'}`;
  const lambda = ends === 'clamped' ? 3 : 6;
  return { delta, factor, formula: `1 + ${lambda}·α·l1·l2/(t·(l1 + l2))·factor, ${ends} ends, ${how}` };
}

export interface BendingState {
  /** Per surface (in surfacesOf order): the signed bending ratio b. */
  readonly b: readonly number[];
  readonly angularProblem: string | null;
}

/** The worst signed secondary bending per surface from the extreme misalignments (linear and angular added). */
function linearAt(setup: Setup, s: Surface, m: Measured | null): number {
  return m ? linearSign(setup.joint, s, m.value) * deltaAxial(setup, s.plate, Math.abs(m.value)) : -Infinity;
}

/** The signed angular term on a surface; NaN when the kink's km cannot be given. */
function angularAt(setup: Setup, s: Surface, m: Measured | null): number {
  if (!m) return -Infinity;
  const d = angularDelta(setup, s.plate, Math.abs(m.value));
  return Number.isNaN(d) ? NaN : angularSign(setup.joint, s, m.value) * d;
}

/** The largest of two terms, a missing one (−∞) or an unassessable one (NaN) counting as none. */
const larger = (a: number, b: number): number =>
  Math.max(Number.isNaN(a) ? -Infinity : a, Number.isNaN(b) ? -Infinity : b);

/** The worst signed secondary bending per surface from the extreme misalignments (linear and angular added). */
export function bendingOf(setup: Setup, mis: MisalignmentInputs): BendingState {
  let angularProblem: string | null = null;
  const b = surfacesOf(setup.joint).map((s) => {
    const lin = larger(linearAt(setup, s, mis.eHi), linearAt(setup, s, mis.eLo));
    const hi = angularAt(setup, s, mis.aHi);
    const lo = angularAt(setup, s, mis.aLo);
    if (Number.isNaN(hi) || Number.isNaN(lo)) angularProblem = setup.armsKnown ? BUCKLED : NO_ARMS;
    const an = larger(hi, lo);
    return (lin === -Infinity ? 0 : lin) + (an === -Infinity ? 0 : an);
  });
  return { b, angularProblem };
}

export const surfaceIndex = (joint: JointType, s: Surface): number =>
  surfacesOf(joint).findIndex((x) => x.plate === s.plate && x.surface === s.surface);
