import { midPlaneOffset, type Reading } from '../../../domain/index.js';

// Sign convention (design §3, "Toes and signs"): linear misalignment e is positive when plate 2's mid-plane lies
// on the face side of plate 1's; angular misalignment is positive when the joint peaks toward the face side.
// The inspector never types a sign: they say which way plate 2 stands and by how much, and this file signs it.

/** Which way plate 2 stands relative to plate 1 on the surface the gauge sat on. */
export type StepDirection = 'towardFace' | 'towardRoot' | 'flush';

/** Where the gauge sat: the same words as the record's `misalignmentBasis`. */
export type GaugeSurface = NonNullable<Reading['misalignmentBasis']>;

export interface LinearEntry {
  readonly direction: StepDirection | undefined;
  /** The step as read, a positive number in mm; the direction carries the sign. */
  readonly amount: number | undefined;
  /** Asked only when the plates differ in thickness: there the face step, root step and mid-plane offset differ. */
  readonly surface: GaugeSurface | undefined;
}

export type KinkDirection = 'peaksTowardFace' | 'peaksTowardRoot' | 'straight';

export interface AngularEntry {
  readonly direction: KinkDirection | undefined;
  /** Degrees, a positive number. */
  readonly amount: number | undefined;
}

export type EntryField = 'direction' | 'amount' | 'surface';

export type Signed<T> =
  | { readonly ok: true; readonly value: T }
  | { readonly ok: false; readonly field: EntryField; readonly message: string }
  /** Nothing was entered: no value goes into the reading. */
  | { readonly ok: 'empty' };

export const EMPTY_LINEAR: LinearEntry = { direction: undefined, amount: undefined, surface: undefined };
export const EMPTY_ANGULAR: AngularEntry = { direction: undefined, amount: undefined };

const plus0 = (x: number): number => x + 0; // turns −0 into 0

/**
 * The signed value as read on `surface` and the basis to record with it. The stored value is what the gauge
 * showed, signed; the grader turns a face or root step into the mid-plane offset with the plate thicknesses.
 * On the face surface a positive step means plate 2's face lies toward the face side of plate 1's face; on the
 * root surface a positive step means plate 2's root surface lies toward the face side of plate 1's root surface;
 * either way "toward the face side" is +, which is the convention of the record.
 */
export function signLinear(
  entry: LinearEntry,
  t1: number,
  t2: number,
): Signed<{ readonly value: number; readonly basis?: GaugeSurface }> {
  const { direction, amount, surface } = entry;
  if (direction === undefined) {
    if (amount === undefined) return { ok: 'empty' };
    return { ok: false, field: 'direction', message: 'choose which way plate 2 stands, or "flush"' };
  }
  const unequal = t1 !== t2;
  if (unequal && surface === undefined) {
    return {
      ok: false,
      field: 'surface',
      message: `the plates differ (${t1} mm and ${t2} mm): choose the surface the gauge sat on`,
    };
  }
  let value: number;
  if (direction === 'flush') {
    if (amount !== undefined && amount !== 0) {
      return {
        ok: false,
        field: 'amount',
        message: 'flush means no step: clear the amount or choose a side',
      };
    }
    value = 0;
  } else {
    if (amount === undefined) return { ok: false, field: 'amount', message: 'enter the step in mm' };
    if (amount < 0) {
      return {
        ok: false,
        field: 'amount',
        message: 'enter the step as a positive number; the choice above says which way',
      };
    }
    value = plus0(direction === 'towardFace' ? amount : -amount);
  }
  return { ok: true, value: unequal && surface ? { value, basis: surface } : { value } };
}

/** The mid-plane offset e the signed reading stands for: shown back to the inspector as a check. */
export function offsetOf(value: number, basis: GaugeSurface | undefined, t1: number, t2: number): number {
  return plus0(Math.round(midPlaneOffset(value, basis ?? 'midPlane', t1, t2) * 1e6) / 1e6);
}

/** The entry a stored value came from, for correcting it on the same controls. */
export function linearEntryOf(
  value: number,
  basis: GaugeSurface | undefined,
  t1: number,
  t2: number,
): LinearEntry {
  const surface = t1 !== t2 ? (basis ?? 'midPlane') : undefined;
  if (value === 0) return { direction: 'flush', amount: undefined, surface };
  return { direction: value > 0 ? 'towardFace' : 'towardRoot', amount: Math.abs(value), surface };
}

/** Angular misalignment β, positive when the joint peaks toward the face side. */
export function signAngular(entry: AngularEntry): Signed<number> {
  const { direction, amount } = entry;
  if (direction === undefined) {
    if (amount === undefined) return { ok: 'empty' };
    return { ok: false, field: 'direction', message: 'choose which way the joint peaks, or "straight"' };
  }
  if (direction === 'straight') {
    if (amount !== undefined && amount !== 0) {
      return {
        ok: false,
        field: 'amount',
        message: 'straight means no kink: clear the angle or choose a side',
      };
    }
    return { ok: true, value: 0 };
  }
  if (amount === undefined) return { ok: false, field: 'amount', message: 'enter the kink in degrees' };
  if (amount < 0) {
    return {
      ok: false,
      field: 'amount',
      message: 'enter the angle as a positive number; the choice above says which way',
    };
  }
  return { ok: true, value: plus0(direction === 'peaksTowardFace' ? amount : -amount) };
}

export function angularEntryOf(value: number): AngularEntry {
  if (value === 0) return { direction: 'straight', amount: undefined };
  return { direction: value > 0 ? 'peaksTowardFace' : 'peaksTowardRoot', amount: Math.abs(value) };
}

/** The offset in words, e.g. "plate 2's mid-plane lies 0.8 mm toward the face side of plate 1's (e = +0.8 mm)". */
export function describeOffset(e: number): string {
  if (e === 0) return "the plates' mid-planes line up (e = 0 mm)";
  const side = e > 0 ? 'face' : 'root';
  const sign = e > 0 ? '+' : '−';
  return `plate 2's mid-plane lies ${fmt(Math.abs(e))} mm toward the ${side} side of plate 1's (e = ${sign}${fmt(Math.abs(e))} mm)`;
}

// The same notation as the number fields show after a step, so the check reads like the field.
const fmt = (x: number): string => String(Math.round(x * 1000) / 1000);
