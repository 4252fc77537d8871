import { PARAMETERS, type ParameterName, type Reading, type Seam, type Side } from '../../../domain/index.js';
import { signAngular, signLinear, type AngularEntry, type LinearEntry } from './misalignment-entry.js';

/** Where on the cross-section the gauge sits: a toe is a plate and a side; side-only values use the side. */
export interface Where {
  readonly plate: 1 | 2;
  readonly side: Side;
}

/** What the form holds when the inspector saves. */
export interface EntryDraft {
  /** The fields on screen; values of fields not shown are never recorded. */
  readonly fields: readonly ParameterName[];
  readonly values: Readonly<Partial<Record<ParameterName, number>>>;
  readonly linear: LinearEntry;
  readonly angular: AngularEntry;
  readonly where: Where;
  readonly runsAlong: boolean;
  readonly position: number | undefined;
  readonly start: number | undefined;
  readonly end: number | undefined;
  readonly sampling: Reading['sampling'];
}

type Examiner = NonNullable<Reading['examiner']>;

export interface BuildContext {
  /** A fresh id (the screen uses crypto.randomUUID()). */
  readonly id: string;
  readonly round: number;
  readonly seam: Seam;
  readonly instrument: Reading['instrument'];
  readonly recordedAt: string;
  readonly examiner?: Examiner | undefined;
  /** Set for a correction: the reading this one replaces. */
  readonly supersedes?: string | undefined;
  readonly source?: Reading['source'];
}

/** Where a problem is shown: next to a value field, a position field, the toe picker, or above the form. */
export type FieldKey =
  ParameterName | 'position' | 'start' | 'end' | 'where' | 'misalignmentBasis' | 'instrument' | 'form';

export type FieldProblems = Partial<Record<FieldKey, string>>;

export type Built =
  { readonly ok: true; readonly reading: Reading } | { readonly ok: false; readonly problems: FieldProblems };

type MutableReading = { -readonly [K in keyof Reading]: Reading[K] };

/**
 * Turns the form into a Reading: only the values on screen, the misalignment signed from the inspector's words,
 * the toe when a toe value is present, the side when a side value is present, a position or a start and end.
 * What only the whole seam file can judge (ranges, lengths, companions) is left to parseSeamFile.
 */
export function buildReading(d: EntryDraft, ctx: BuildContext): Built {
  const problems: FieldProblems = {};
  const values: Partial<Record<ParameterName, number>> = {};
  let basis: Reading['misalignmentBasis'];
  for (const name of d.fields) {
    if (name === 'linearMisalignment') {
      const s = signLinear(d.linear, ctx.seam.plate1.thickness, ctx.seam.plate2.thickness);
      if (s.ok === true) {
        values.linearMisalignment = s.value.value;
        basis = s.value.basis;
      } else if (s.ok === false) {
        problems[s.field === 'surface' ? 'misalignmentBasis' : 'linearMisalignment'] = s.message;
      }
      continue;
    }
    if (name === 'angularMisalignment') {
      const s = signAngular(d.angular);
      if (s.ok === true) values.angularMisalignment = s.value;
      else if (s.ok === false) problems.angularMisalignment = s.message;
      continue;
    }
    const v = d.values[name];
    if (v !== undefined) values[name] = v;
  }
  const present = Object.keys(values) as ParameterName[];
  if (!present.length && !Object.keys(problems).length) {
    problems.form = 'enter at least one value before saving';
  }
  if (d.runsAlong) {
    if (d.start === undefined) problems.start = 'enter where it starts (mm from the start mark)';
    if (d.end === undefined) problems.end = 'enter where it ends (mm from the start mark)';
    for (const name of present) {
      if (!PARAMETERS[name].hasLength)
        problems[name] = 'is read at a position: turn off "runs along the seam"';
    }
  } else if (d.position === undefined) {
    problems.position = 'enter the position along the seam (mm from the start mark)';
  }
  if (Object.keys(problems).length) return { ok: false, problems };

  const r: MutableReading = {
    id: ctx.id,
    seamId: ctx.seam.id,
    round: ctx.round,
    sampling: d.sampling,
    values,
    instrument: ctx.instrument,
    source: ctx.source ?? { kind: 'gauge' },
    recordedAt: ctx.recordedAt,
  };
  if (d.runsAlong) {
    r.start = d.start as number;
    r.end = d.end as number;
  } else {
    r.position = d.position as number;
  }
  if (present.some((n) => PARAMETERS[n].per === 'toe')) r.toe = { plate: d.where.plate, side: d.where.side };
  if (present.some((n) => PARAMETERS[n].per === 'side')) r.side = d.where.side;
  if (basis !== undefined) r.misalignmentBasis = basis;
  if (ctx.examiner) r.examiner = ctx.examiner;
  if (ctx.supersedes !== undefined) r.supersedes = ctx.supersedes;
  return { ok: true, reading: r };
}

export interface StampContext {
  readonly id: string;
  readonly recordedAt: string;
  readonly examiner?: Examiner | undefined;
}

/** An undo: a new record that withdraws `target` and carries no values. The target stays in the record. */
export function buildWithdrawal(target: Reading, ctx: StampContext): Reading {
  const r: MutableReading = {
    id: ctx.id,
    round: target.round,
    sampling: target.sampling,
    values: {},
    instrument: target.instrument,
    source: { kind: 'gauge' },
    recordedAt: ctx.recordedAt,
    supersedes: target.id,
    withdrawn: true,
  };
  if (target.seamId !== undefined) r.seamId = target.seamId;
  // Where the withdrawn entry was, so the record reads on its own.
  if (target.position !== undefined) r.position = target.position;
  if (target.start !== undefined) r.start = target.start;
  if (target.end !== undefined) r.end = target.end;
  if (ctx.examiner) r.examiner = ctx.examiner;
  return r;
}

/** Undo of a correction: the corrected reading's content again, as a new reading that supersedes the correction. */
export function buildRestore(original: Reading, correction: Reading, ctx: StampContext): Reading {
  const r: MutableReading = {
    ...original,
    id: ctx.id,
    recordedAt: ctx.recordedAt,
    supersedes: correction.id,
  };
  delete r.withdrawn;
  delete r.device;
  if (ctx.examiner) r.examiner = ctx.examiner;
  else delete r.examiner;
  return r;
}

/** The form contents that reproduce a stored reading, for correcting it. */
export function draftValuesOf(r: Reading): Partial<Record<ParameterName, number>> {
  const out: Partial<Record<ParameterName, number>> = {};
  for (const [name, v] of Object.entries(r.values) as [ParameterName, number | undefined][]) {
    if (v !== undefined && name !== 'linearMisalignment' && name !== 'angularMisalignment') out[name] = v;
  }
  return out;
}

/** A fresh reading id: random, so two tablets offline at the same seam never collide. */
export function newReadingId(randomUUID: () => string): string {
  return `rd-${randomUUID()}`;
}
