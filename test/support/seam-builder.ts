// Builds valid seam files for tests; each test overrides only what it is about.
import type { Reading, Round, Seam, SeamFile } from '../../src/domain/index.js';

type DeepPartial<T> = { [K in keyof T]?: T[K] extends object ? DeepPartial<T[K]> : T[K] };

export const completeChecklist = (): Round['checklist'] => ({
  crack: { answer: 'noneFound' },
  craterCrack: { answer: 'noneFound' },
  lackOfFusion: { answer: 'noneFound' },
  burnThrough: { answer: 'noneFound' },
  porosity: { answer: 'noneFound' },
  rootPorosity: { answer: 'noneFound' },
  poorRestart: { answer: 'noneFound' },
  strayArc: { answer: 'noneFound' },
  spatter: { answer: 'noneFound' },
  temperColour: { answer: 'noneFound' },
});

export function buttSeam(over: Partial<Seam> = {}): Seam {
  return {
    id: 'seam-1',
    label: 'Test butt seam',
    joint: { type: 'butt', preparation: 'singleV', sides: 'one', setting: 'shopFlat' },
    plate1: { thickness: 10 },
    plate2: { thickness: 10 },
    material: { name: 'S355', group: '1.2', kind: 'steel' },
    length: 1000,
    circumferential: false,
    surface: 'asWelded',
    acceptance: { edition: 'ISO 5817:2014', level: 'B' },
    ...over,
  };
}

export function filletSeam(over: Partial<Seam> = {}): Seam {
  return buttSeam({
    label: 'Test fillet seam',
    joint: { type: 'filletT', preparation: 'fillet', sides: 'two', setting: 'shopFlat' },
    nominalThroat: 5,
    ...over,
  });
}

let counter = 0;

/** A gauge reading at a position; pass `start`/`end` and `position: undefined` for one with length. */
export function reading(values: Reading['values'], over: Partial<Reading> = {}): Reading {
  counter += 1;
  const base: Reading = {
    id: `r-${String(counter).padStart(6, '0')}`,
    round: 1,
    position: 100,
    sampling: 'atPitch',
    values,
    instrument: { id: 'G-1', resolutionMm: 0.1, resolutionDeg: 1 },
    source: { kind: 'gauge' },
    recordedAt: '2026-11-19T08:00:00Z',
  };
  const merged = { ...base, ...over } as Reading & { position?: number };
  if ('position' in over && over.position === undefined) delete merged.position;
  return merged;
}

export function seamFile(seam: Seam, readings: Reading[], rounds?: Round[]): SeamFile {
  return {
    format: 'beadbook.seam/1',
    units: { length: 'mm', angle: 'deg' },
    seam,
    rounds: rounds ?? [{ number: 1, kind: 'first', checklist: completeChecklist() }],
    readings,
  };
}

export type { DeepPartial };
