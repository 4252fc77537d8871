// Position arithmetic for "Next position" and what happens after a save. Positions are mm from the seam's
// start mark and lie within its length (docs/seam-file.md: "positions must lie within it").
import { describe, expect, it } from 'vitest';
import {
  afterSave,
  checkPitch,
  clampToSeam,
  defaultRun,
  DEFAULT_PITCH,
  goNext,
  nextPosition,
  nextToe,
  resumePosition,
  setPosition,
  setSampling,
  toeOrder,
  type Cursor,
} from '../../src/app/screens/gauge/positions.js';
import { reading } from '../support/seam-builder.js';

const FACE1 = { plate: 1, side: 'face' } as const;
const cursor = (over: Partial<Cursor> = {}): Cursor => ({
  position: 0,
  pitchPosition: 0,
  sampling: 'atPitch',
  toe: FACE1,
  ...over,
});
const ALL = toeOrder(['face', 'root']);

describe('next position (clamped to the seam length)', () => {
  it('advances by the pitch, 50 mm unless set', () => {
    expect(DEFAULT_PITCH).toBe(50);
    expect(nextPosition(0, 50, 1200)).toEqual({ position: 50, atEnd: false, clamped: false });
  });

  it('stops at the end mark when the pitch would pass it, then reports the end', () => {
    expect(nextPosition(1180, 50, 1200)).toEqual({ position: 1200, atEnd: false, clamped: true });
    expect(nextPosition(1200, 50, 1200)).toEqual({ position: 1200, atEnd: true, clamped: false });
  });

  it('does not drift with decimal pitches (ten steps of 0.1 mm are 1 mm)', () => {
    let x = 0;
    for (let i = 0; i < 10; i++) x = nextPosition(x, 0.1, 1200).position;
    expect(x).toBe(1);
  });

  it('clamps positions typed outside the seam', () => {
    expect(clampToSeam(-5, 100)).toBe(0);
    expect(clampToSeam(150, 100)).toBe(100);
  });

  it('checks the pitch', () => {
    expect(checkPitch(50, 1200)).toBeNull();
    expect(checkPitch(0, 1200)).toMatch(/more than 0/);
    expect(checkPitch(undefined, 1200)).toMatch(/enter/);
    expect(checkPitch(2000, 1200)).toMatch(/longer than the seam/);
  });
});

describe('at pitch and targeted', () => {
  it('a targeted spot leaves the at-pitch series where it was; switching back returns to it', () => {
    const t = setSampling(cursor({ position: 150, pitchPosition: 150 }), 'targeted');
    const moved = setPosition(t, 137, 1200);
    expect(moved).toMatchObject({ position: 137, pitchPosition: 150 });
    expect(setSampling(moved, 'atPitch')).toMatchObject({ position: 150, pitchPosition: 150 });
  });

  it('a position typed at pitch moves the series', () => {
    expect(setPosition(cursor(), 75, 1200)).toMatchObject({ position: 75, pitchPosition: 75 });
  });

  it('"Next position" from a targeted spot continues the series, not the spot', () => {
    const c = cursor({ position: 137, pitchPosition: 150, sampling: 'targeted' });
    expect(goNext(c, 50, 1200)).toMatchObject({ position: 200, pitchPosition: 200, sampling: 'atPitch' });
  });
});

describe('after a save', () => {
  it('goes to the next position', () => {
    expect(
      afterSave(cursor({ position: 100, pitchPosition: 100 }), 'nextPosition', 50, 1200, ALL),
    ).toMatchObject({
      position: 150,
      pitchPosition: 150,
      toe: FACE1,
      atEnd: false,
    });
  });

  it('stays when asked to', () => {
    expect(afterSave(cursor({ position: 100 }), 'stay', 50, 1200, ALL)).toMatchObject({ position: 100 });
  });

  it('after a targeted reading, returns to the at-pitch series', () => {
    const c = cursor({ position: 137, pitchPosition: 150, sampling: 'targeted' });
    expect(afterSave(c, 'nextPosition', 50, 1200, ALL)).toMatchObject({ position: 150, sampling: 'atPitch' });
  });

  it('"next toe" works round the four toes of a butt joint, then moves on to plate 1 face side at the next position', () => {
    let c: Cursor = cursor({ position: 100, pitchPosition: 100 });
    const seen: string[] = [];
    for (let i = 0; i < 4; i++) {
      seen.push(`${c.position}:${c.toe.plate}${c.toe.side}`);
      c = afterSave(c, 'nextToe', 50, 1200, ALL);
    }
    expect(seen).toEqual(['100:1face', '100:2face', '100:1root', '100:2root']);
    expect(c).toMatchObject({ position: 150, toe: FACE1 });
  });

  it('reports the end of the seam', () => {
    expect(
      afterSave(cursor({ position: 1200, pitchPosition: 1200 }), 'nextPosition', 50, 1200, ALL).atEnd,
    ).toBe(true);
  });

  it('toe order: face side first, plate 1 before plate 2; a one-sided fillet has face toes only', () => {
    expect(toeOrder(['face']).map((t) => `${t.plate}${t.side}`)).toEqual(['1face', '2face']);
    expect(nextToe({ plate: 2, side: 'root' }, ALL)).toBeNull();
  });
});

describe('runs along the seam', () => {
  it('defaults to one pitch from the position, inside the seam', () => {
    expect(defaultRun(100, 50, 1200)).toEqual({ start: 100, end: 150 });
    expect(defaultRun(1190, 50, 1200)).toEqual({ start: 1190, end: 1200 });
    expect(defaultRun(1200, 50, 1200)).toEqual({ start: 1150, end: 1200 });
  });
});

describe('resuming on opening the screen', () => {
  it('resumes at the latest at-pitch reading of the round in entry order, ignoring targeted and withdrawals', () => {
    const list = [
      reading({ toeAngle: 150 }, { position: 100, toe: FACE1 }),
      reading({ toeAngle: 150 }, { position: 150, toe: FACE1 }),
      reading({ toeAngle: 140 }, { position: 137, sampling: 'targeted', toe: FACE1 }),
      reading({}, { position: 400, withdrawn: true, supersedes: 'x' }),
      reading({ toeAngle: 150 }, { position: 900, round: 2, toe: FACE1 }),
    ];
    expect(resumePosition(list, 1)).toBe(150);
    expect(resumePosition(list, 2)).toBe(900);
    expect(resumePosition([], 1)).toBe(0);
  });
});
