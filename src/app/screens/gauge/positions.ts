import type { Reading, Side, Toe } from '../../../domain/index.js';

/** The spacing of at-pitch readings when the inspector has not set one (common practice for a first pass). */
export const DEFAULT_PITCH = 50;

// Positions are kept to the micrometre so 0.1-mm pitches add up without floating-point drift.
const um = (x: number): number => Math.round(x * 1e6) / 1e6 + 0;

/** A position held within the seam, from its start mark (0) to its length. */
export const clampToSeam = (x: number, length: number): number => um(Math.min(Math.max(x, 0), length));

export interface Advance {
  readonly position: number;
  /** The position was already at the seam's end mark: nothing further to advance to. */
  readonly atEnd: boolean;
  /** The pitch would have passed the end mark, so the position stopped at it. */
  readonly clamped: boolean;
}

/** One tap of "Next position": advance by the pitch, stopping at the seam's end mark. */
export function nextPosition(current: number, pitch: number, length: number): Advance {
  const from = clampToSeam(current, length);
  if (from >= length) return { position: length, atEnd: true, clamped: false };
  const raw = um(from + pitch);
  return raw > length
    ? { position: length, atEnd: false, clamped: true }
    : { position: clampToSeam(raw, length), atEnd: false, clamped: false };
}

/** A sensible run for a "runs along the seam" entry starting here: one pitch long, within the seam. */
export function defaultRun(position: number, pitch: number, length: number): { start: number; end: number } {
  const start = clampToSeam(position, length);
  const end = clampToSeam(start + pitch, length);
  return end > start ? { start, end } : { start: clampToSeam(start - pitch, length), end: start };
}

/** The pitch is a positive length no longer than the seam; anything else is refused with a reason. */
export function checkPitch(pitch: number | undefined, length: number): string | null {
  if (pitch === undefined) return 'enter the spacing between at-pitch readings in mm';
  if (!(pitch > 0)) return 'the pitch must be more than 0 mm';
  if (pitch > length) return `the pitch cannot be longer than the seam (${length} mm)`;
  return null;
}

export type AfterSave = 'nextPosition' | 'nextToe' | 'stay';

export interface Cursor {
  /** Where the next reading is taken. */
  readonly position: number;
  /** Where the at-pitch series stands; a targeted reading leaves it untouched. */
  readonly pitchPosition: number;
  readonly sampling: Reading['sampling'];
  readonly toe: Toe;
}

/** The toes in the order an inspector works round a cross-section: face side first, plate 1 before plate 2. */
export function toeOrder(sides: readonly Side[]): Toe[] {
  return sides.flatMap((side) => [1, 2].map((plate) => ({ plate: plate as 1 | 2, side })));
}

/** The next toe at this position, or null after the last one. */
export function nextToe(toe: Toe, order: readonly Toe[]): Toe | null {
  const i = order.findIndex((t) => t.plate === toe.plate && t.side === toe.side);
  return i >= 0 && i + 1 < order.length ? (order[i + 1] ?? null) : null;
}

/**
 * Where the form goes after a save. At pitch: on to the next position (or the next toe first). After a targeted
 * reading the inspector returns to the at-pitch series where it left off, since the spot was an aside.
 */
export function afterSave(
  c: Cursor,
  mode: AfterSave,
  pitch: number,
  length: number,
  toes: readonly Toe[],
): Cursor & { readonly atEnd: boolean } {
  if (mode === 'stay') return { ...c, atEnd: false };
  if (c.sampling === 'targeted') {
    return {
      position: c.pitchPosition,
      pitchPosition: c.pitchPosition,
      sampling: 'atPitch',
      toe: c.toe,
      atEnd: false,
    };
  }
  if (mode === 'nextToe') {
    const t = nextToe(c.toe, toes);
    if (t) return { ...c, toe: t, atEnd: false };
  }
  const first = toes[0] ?? c.toe;
  const step = nextPosition(c.position, pitch, length);
  return {
    position: step.position,
    pitchPosition: step.position,
    sampling: 'atPitch',
    toe: mode === 'nextToe' ? first : c.toe,
    atEnd: step.atEnd,
  };
}

/**
 * Where to resume on opening the screen: the position of the latest at-pitch reading of the round (entry order),
 * so an interrupted position is finished rather than skipped; the start mark when there is none.
 */
export function resumePosition(readingsInEntryOrder: readonly Reading[], round: number): number {
  for (let i = readingsInEntryOrder.length - 1; i >= 0; i--) {
    const r = readingsInEntryOrder[i];
    if (!r || r.round !== round || r.withdrawn || r.sampling !== 'atPitch') continue;
    const at = r.position ?? r.start;
    if (at !== undefined) return at;
  }
  return 0;
}

/** A position typed or stepped by hand: at pitch it moves the series; a targeted spot leaves the series where it is. */
export function setPosition(c: Cursor, x: number, length: number): Cursor {
  const position = clampToSeam(x, length);
  return c.sampling === 'atPitch' ? { ...c, position, pitchPosition: position } : { ...c, position };
}

/** Switching to targeted keeps the spot under the gauge; switching back returns to the at-pitch series. */
export function setSampling(c: Cursor, sampling: Reading['sampling']): Cursor {
  if (sampling === c.sampling) return c;
  return sampling === 'targeted' ? { ...c, sampling } : { ...c, sampling, position: c.pitchPosition };
}

/** "Next position": one pitch on from where the gauge is, back in the at-pitch series. */
export function goNext(c: Cursor, pitch: number, length: number): Cursor & Advance {
  const from = c.sampling === 'atPitch' ? c.position : c.pitchPosition;
  const step = nextPosition(from, pitch, length);
  return { ...c, ...step, pitchPosition: step.position, sampling: 'atPitch' };
}
