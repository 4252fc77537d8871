// parseSeamFileWithCheckedReadings (the server's re-grade of stored readings) must answer exactly as
// parseSeamFile does for the same file whenever every reading passes the reading schema: same verdict, same
// problems in the same order, same value.
import { describe, expect, it } from 'vitest';
import { kestrelPointYard } from '../../src/demo/kestrel-point-yard.js';
import {
  parseSeamFile,
  parseSeamFileWithCheckedReadings,
  type Reading,
  type SeamFile,
} from '../../src/domain/index.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';

function both(file: SeamFile, allowNoReadings = false) {
  const { readings, ...rest } = file;
  return {
    whole: parseSeamFile(file, { allowNoReadings }),
    checked: parseSeamFileWithCheckedReadings(rest, readings, { allowNoReadings }),
  };
}

const seam = buttSeam({ id: 'S-1', length: 500 });
const toe = (angle: number, over: Partial<Reading> = {}) =>
  reading({ toeAngle: angle }, { toe: { plate: 1, side: 'face' }, ...over });

const cases: [string, SeamFile][] = [
  ['a throat on a butt seam', seamFile(seam, [toe(150), reading({ throat: 4 }, { side: 'face' })])],
  ['a position beyond the seam', seamFile(seam, [toe(150, { position: 501 })])],
  ['two readings with one id', seamFile(seam, [toe(150, { id: 'same' }), toe(140, { id: 'same' })])],
  ['a round the file lacks', seamFile(seam, [toe(150, { round: 2 })])],
  ['a correction of an unknown reading', seamFile(seam, [toe(150, { supersedes: 'nowhere' })])],
  ['a height without its width', seamFile(seam, [reading({ reinforcementHeight: 2 }, { side: 'face' })])],
  ['one leg without the other', seamFile(filletSeam({ id: 'F-1' }), [reading({ leg1: 5 })])],
  [
    'a seam with neither level nor preset',
    seamFile({ ...seam, acceptance: { edition: 'ISO 5817:2014' } }, [toe(150)]),
  ],
  ['a seam that fails its schema', seamFile({ ...seam, length: -1 }, [toe(150, { position: 600 })])],
  ['no readings', seamFile(seam, [])],
  // Values in another order than the parameters' (stored bodies have their keys sorted): problems keep theirs.
  [
    'several values that do not apply, listed out of order',
    seamFile(seam, [reading({ throat: 4, leg2: 3, toeAngle: 150, leg1: 2, convexity: 1 }, { side: 'face' })]),
  ],
  [
    'many faulty readings',
    seamFile(
      seam,
      Array.from({ length: 80 }, (_, i) => toe(150, { position: 1000 + i })),
    ),
  ],
];

describe('parsing a seam file whose readings passed their schema already', () => {
  it('accepts every demo yard file with the value parseSeamFile gives', () => {
    for (const file of kestrelPointYard()) {
      const { whole, checked } = both(file);
      expect(whole.ok).toBe(true);
      expect(checked).toEqual(whole);
    }
  });

  it.each(cases)('answers %s as parseSeamFile does', (_name, file) => {
    const { whole, checked } = both(file);
    expect(whole.ok).toBe(false);
    expect(checked).toEqual(whole);
  });

  it('accepts a seam without readings when asked to, as parseSeamFile does', () => {
    const { whole, checked } = both(seamFile(seam, []), true);
    expect(whole.ok).toBe(true);
    expect(checked).toEqual(whole);
  });
});
