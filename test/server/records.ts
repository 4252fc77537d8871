// Valid records of every kind for a seam, as a device store would queue them (bodies per OutboxBodies).
import type { Reading, Seam } from '../../src/domain/index.js';
import { uuidv7 } from '../../src/store/ids.js';
import { buttSeam, completeChecklist } from '../support/seam-builder.js';

export const T0 = '2026-12-01T08:00:00.000Z';

export function testSeam(id: string = uuidv7(), over: Partial<Seam> = {}): Seam {
  return buttSeam({
    id,
    label: `Seam ${id.slice(-6)}`,
    acceptance: { edition: 'ISO 5817:2014', level: 'C' },
    ...over,
  });
}

export function toeReading(seamId: string, toeAngle: number, over: Partial<Reading> = {}): Reading {
  return {
    id: uuidv7(),
    seamId,
    round: 1,
    position: 100,
    sampling: 'atPitch',
    toe: { plate: 1, side: 'face' },
    values: { toeAngle },
    instrument: { id: 'TG-7', resolutionMm: 0.1, resolutionDeg: 1 },
    source: { kind: 'gauge' },
    recordedAt: T0,
    ...over,
  };
}

export const bodies = {
  seamSetup: (seam: Seam, revision = 1, savedAt = T0) => ({ seamId: seam.id, revision, seam, savedAt }),
  round: (seamId: string, number = 1, startedAt = T0) => ({
    seamId,
    number,
    kind: number === 1 ? ('first' as const) : ('afterRepair' as const),
    startedAt,
  }),
  answer: (
    seamId: string,
    item: string,
    answer: 'noneFound' | 'present' | 'notAccessible',
    round = 1,
    answeredAt = T0,
  ) => ({
    seamId,
    round,
    item,
    answer: answer === 'present' ? { answer, position: 10 } : { answer },
    answeredAt,
  }),
  reading: (reading: Reading) => ({ seamId: reading.seamId as string, reading }),
};

/** Every checklist item answered "none found" (a complete round). */
export const allNoneFound = (): [string, 'noneFound'][] =>
  Object.keys(completeChecklist()).map((item) => [item, 'noneFound']);
