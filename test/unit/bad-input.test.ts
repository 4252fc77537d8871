// Malformed seam files: each one must be refused with the problems it has — where (path) and what (message) —
// and nothing else, never with a crash. Each case starts from a valid file and breaks one thing.
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { MAX_READINGS, parseSeamFile, type Problem, type SeamFile } from '../../src/domain/index.js';
import { buttSeam, filletSeam, reading, seamFile } from '../support/seam-builder.js';

// ---------------------------------------------------------------------------------------------------------
// A valid butt file (10 mm plates, single-sided, 1000 mm straight seam) and a valid fillet file to break.

const instrument = { id: 'G-1', resolutionMm: 0.1, resolutionDeg: 1 };

function validButt(): SeamFile {
  return seamFile(buttSeam(), [
    reading(
      { toeAngle: 150, undercutDepth: 0.2 },
      { id: 'r-a', position: 100, toe: { plate: 1, side: 'face' }, instrument },
    ),
    reading(
      { reinforcementHeight: 1.5, reinforcementWidth: 6 },
      { id: 'r-b', position: 200, side: 'root', instrument },
    ),
    reading(
      { undercutDepth: 0.3 },
      { id: 'r-c', position: undefined, start: 300, end: 320, toe: { plate: 2, side: 'face' }, instrument },
    ),
    reading({ linearMisalignment: 0.8 }, { id: 'r-d', position: 400, instrument }),
  ]);
}

function validFillet(): SeamFile {
  return seamFile(filletSeam(), [reading({ throat: 5.2 }, { id: 'f-a', position: 50, instrument })]);
}

type Key = string | number;

/** "readings[0].values.toeAngle" → ["readings", 0, "values", "toeAngle"]. */
const keysOf = (path: string): Key[] =>
  path
    .split(/\.|(?=\[)/)
    .filter(Boolean)
    .map((k) => (k.startsWith('[') ? Number(k.slice(1, -1)) : k));

type Tree = Record<Key, unknown>;

function parentOf(root: unknown, path: string): { node: Tree; key: Key } {
  const keys = keysOf(path);
  let node = root as Tree;
  for (const k of keys.slice(0, -1)) {
    const next = node[k];
    if (next === null || typeof next !== 'object') throw new Error(`test path ${path} does not exist`);
    node = next as Tree;
  }
  return { node, key: keys[keys.length - 1] as Key };
}

type Edit = (root: unknown) => void;

const set =
  (path: string, value: unknown): Edit =>
  (root) => {
    const { node, key } = parentOf(root, path);
    node[key] = value;
  };

const del =
  (path: string): Edit =>
  (root) => {
    const { node, key } = parentOf(root, path);
    if (!(key in node)) throw new Error(`test path ${path} does not exist`);
    Reflect.deleteProperty(node, key);
  };

const broken =
  (base: () => SeamFile, ...edits: Edit[]) =>
  (): unknown => {
    const file: unknown = structuredClone(base());
    edits.forEach((e) => e(file));
    return file;
  };

/** The file must be refused with exactly these problems, in this order: [path, a distinctive part of the message]. */
type Expected = readonly (readonly [string, string])[];

interface Case {
  readonly name: string;
  readonly input: () => unknown;
  readonly expected: Expected;
}

function expectProblems(input: unknown, expected: Expected): void {
  const parsed = parseSeamFile(input);
  if (parsed.ok) throw new Error('the file was accepted');
  const got = parsed.problems.map((p: Problem) => [p.path, p.message] as const);
  expect(got.map(([path]) => path)).toEqual(expected.map(([path]) => path));
  got.forEach(([, message], i) => expect(message).toContain((expected[i] as readonly [string, string])[1]));
}

const THICKNESS_SCOPE = 'ISO 5817 covers 0.5 mm and thicker';

const cases: readonly Case[] = [
  // Missing required fields.
  {
    name: 'no seam',
    input: broken(validButt, del('seam')),
    expected: [['seam', 'required field of seam file is missing']],
  },
  {
    name: 'no seam.length',
    input: broken(validButt, del('seam.length')),
    expected: [['seam.length', 'required field of seam is missing']],
  },
  {
    name: 'no readings[0].recordedAt',
    input: broken(validButt, del('readings[0].recordedAt')),
    expected: [['readings[0].recordedAt', 'required field of reading is missing']],
  },
  {
    name: 'no checklist in a round',
    input: broken(validButt, del('rounds[0].checklist')),
    expected: [['rounds[0].checklist', 'required field of round is missing']],
  },
  {
    name: 'no format',
    input: broken(validButt, del('format')),
    expected: [['format', 'required field of seam file is missing']],
  },
  {
    name: 'another format version',
    input: broken(validButt, set('format', 'beadbook.seam/2')),
    expected: [['format', 'must be "beadbook.seam/1"']],
  },
  {
    name: 'an import source without its import id',
    input: broken(validButt, set('readings[0].source', { kind: 'import' })),
    expected: [['readings[0].source.importId', 'required field of source is missing']],
  },

  // Wrong types.
  {
    name: 'thickness written "12 mm"',
    input: broken(validButt, set('seam.plate1.thickness', '12 mm')),
    expected: [['seam.plate1.thickness', 'must be a number in mm (write 12, not "12 mm"); got "12 mm"']],
  },
  {
    name: 'a boolean for a depth',
    input: broken(validButt, set('readings[0].values.undercutDepth', true)),
    expected: [
      ['readings[0].values.undercutDepth', 'must be a number in mm (write 12, not "12 mm"); got true'],
    ],
  },
  {
    name: 'a string for a boolean',
    input: broken(validButt, set('seam.circumferential', 'yes')),
    expected: [['seam.circumferential', 'must be true or false']],
  },
  {
    name: 'a round number written as text',
    input: broken(validButt, set('readings[0].round', '1')),
    expected: [['readings[0].round', 'must be a whole number; got "1"']],
  },
  {
    name: 'a fractional round number',
    input: broken(validButt, set('readings[0].round', 1.5)),
    expected: [['readings[0].round', 'must be a whole number; got 1.5']],
  },
  {
    name: 'a timestamp that is not ISO 8601',
    input: broken(validButt, set('readings[1].recordedAt', 'yesterday')),
    expected: [['readings[1].recordedAt', 'must be an ISO 8601 timestamp']],
  },
  {
    name: 'an id longer than 64 characters',
    input: broken(validButt, set('readings[0].id', 'x'.repeat(65))),
    expected: [['readings[0].id', 'is too long: at most 64 characters']],
  },
  {
    name: 'a material group in the wrong form',
    input: broken(validButt, set('seam.material.group', '1,2')),
    expected: [['seam.material.group', 'must be an ISO/TR 15608 group such as "1.2"']],
  },

  // NaN and Infinity, as JavaScript values (JSON cannot carry them).
  {
    name: 'NaN toe angle',
    input: broken(validButt, set('readings[0].values.toeAngle', NaN)),
    expected: [
      ['readings[0].values.toeAngle', 'must be a number in degrees (write 12, not "12 deg"); got NaN'],
    ],
  },
  {
    name: 'Infinity depth: reported once, as not finite',
    input: broken(validButt, set('readings[0].values.undercutDepth', Infinity)),
    expected: [['readings[0].values.undercutDepth', 'must be a finite number; got Infinity']],
  },
  {
    name: '-Infinity seam length',
    input: broken(validButt, set('seam.length', -Infinity)),
    expected: [['seam.length', 'must be a finite number; got -Infinity']],
  },

  // Outside the physical or the standard's range.
  {
    name: 'negative depth',
    input: broken(validButt, set('readings[0].values.undercutDepth', -0.2)),
    expected: [
      ['readings[0].values.undercutDepth', 'must be at least 0 mm (undercut depth h at a toe); got -0.2'],
    ],
  },
  {
    name: 'toe angle 75°',
    input: broken(validButt, set('readings[0].values.toeAngle', 75)),
    expected: [['readings[0].values.toeAngle', 'must be at least 90°']],
  },
  {
    name: 'toe angle 181°',
    input: broken(validButt, set('readings[0].values.toeAngle', 181)),
    expected: [['readings[0].values.toeAngle', 'must be at most 180°; got 181']],
  },
  {
    // ISO 5817:2014 clause 1 (scope): 0.5 mm and thicker.
    name: 'thickness 0.3 mm, below the scope of ISO 5817',
    input: broken(validButt, set('seam.plate2.thickness', 0.3)),
    expected: [['seam.plate2.thickness', `must be at least 0.5 mm (${THICKNESS_SCOPE}); got 0.3`]],
  },
  {
    name: 'zero seam length',
    input: broken(validButt, set('seam.length', 0)),
    expected: [['seam.length', 'must be greater than 0 mm (seam length); got 0']],
  },

  // Units.
  {
    name: 'lengths in inches',
    input: broken(validButt, set('units', { length: 'inch', angle: 'deg' })),
    expected: [['units.length', 'only "mm" is accepted: convert lengths to millimetres']],
  },
  {
    name: 'angles in radians',
    input: broken(validButt, set('units.angle', 'rad')),
    expected: [['units.angle', 'only "deg" is accepted: convert angles to degrees']],
  },

  // Unknown or misspelt fields and values.
  {
    name: 'misspelt field toeAngleRad',
    input: broken(validButt, del('readings[0].values.toeAngle'), set('readings[0].values.toeAngleRad', 2.6)),
    expected: [['readings[0].values.toeAngleRad', 'unknown field; values allows only: toeAngle, toeRadius']],
  },
  {
    name: 'unknown top-level field',
    input: broken(validButt, set('seams', [])),
    expected: [['seams', 'unknown field; seam file allows only: format, units, seam, rounds, readings']],
  },
  {
    name: 'a field named like an Object method',
    input: broken(validButt, set('seam.constructor', 'x')),
    expected: [['seam.constructor', 'unknown field; seam allows only: id, label']],
  },
  {
    name: 'a field with an empty name',
    input: broken(validButt, (f) => {
      ((f as SeamFile).readings[0]?.values as Record<string, unknown>)[''] = 1;
    }),
    expected: [['readings[0].values[""]', 'unknown field; values allows only']],
  },
  {
    name: 'unknown joint type',
    input: broken(validButt, set('seam.joint.type', 'tee')),
    expected: [['seam.joint.type', 'must be one of "butt", "filletT", "cruciform", "lap"; got "tee"']],
  },
  {
    name: 'unknown edition',
    input: broken(validButt, set('seam.acceptance.edition', 'ISO 5817:2003')),
    expected: [['seam.acceptance.edition', 'must be one of "ISO 5817:2014", "ISO 5817:2023"']],
  },
  {
    name: 'unknown source kind',
    input: broken(validButt, set('readings[0].source', { kind: 'scan' })),
    expected: [['readings[0].source.kind', 'source.kind must be "gauge" or "import"']],
  },

  // Lists.
  {
    name: 'no readings',
    input: broken(validButt, set('readings', [])),
    expected: [['readings', 'readings must hold at least 1 item']],
  },
  {
    name: 'no rounds',
    input: broken(validButt, set('rounds', [])),
    expected: [['rounds', 'rounds must hold at least 1 item']],
  },
  {
    name: 'readings that are not a list',
    input: broken(validButt, set('readings', { 'r-a': {} })),
    expected: [['readings', 'readings must be a list; got Object']],
  },

  // References between readings and rounds.
  {
    name: 'unknown round number',
    input: broken(validButt, set('readings[1].round', 7)),
    expected: [['readings[1].round', "round 7 is not among the file's rounds (1)"]],
  },
  {
    name: 'a round number used twice',
    input: (() => {
      const f = validButt();
      return { ...f, rounds: [...f.rounds, ...f.rounds] };
    }) as () => unknown,
    expected: [['rounds[1].number', 'round 1 appears twice']],
  },
  {
    name: 'duplicate reading ids',
    input: broken(validButt, set('readings[2].id', 'r-a')),
    expected: [['readings[2].id', '"r-a" is used by another reading; ids must be unique']],
  },
  {
    name: 'supersedes a missing id',
    input: broken(validButt, set('readings[1].supersedes', 'r-zz')),
    expected: [['readings[1].supersedes', 'names reading "r-zz", which is not in the file']],
  },
  {
    name: 'supersedes loop',
    input: broken(validButt, set('readings[0].supersedes', 'r-b'), set('readings[1].supersedes', 'r-a')),
    expected: [
      ['readings[1].supersedes', 'corrections form a loop'],
      ['readings[0].supersedes', 'corrections form a loop'],
    ],
  },
  {
    name: 'a reading that supersedes itself',
    input: broken(validButt, set('readings[0].supersedes', 'r-a')),
    expected: [['readings[0].supersedes', 'a reading cannot supersede itself']],
  },
  {
    name: 'a correction in another round',
    input: broken(
      validButt,
      (f) => {
        const file = f as SeamFile;
        file.rounds.push({ ...structuredClone(file.rounds[0] as SeamFile['rounds'][number]), number: 2 });
      },
      set('readings[1].round', 2),
      set('readings[1].supersedes', 'r-a'),
    ),
    expected: [['readings[1].supersedes', 'a correction stays in its round: "r-a" is in round 1']],
  },
  {
    name: 'two corrections of one reading',
    input: broken(validButt, set('readings[1].supersedes', 'r-a'), set('readings[2].supersedes', 'r-a')),
    expected: [['readings[2].supersedes', '"r-a" is already superseded by "r-b"']],
  },
  {
    name: 'a reading of another seam',
    input: broken(validButt, set('readings[0].seamId', 'seam-9')),
    expected: [['readings[0].seamId', 'belongs to seam "seam-9", not to this file\'s seam "seam-1"']],
  },

  // Where along the seam.
  {
    name: 'start after end on a straight seam',
    input: broken(validButt, set('readings[2].start', 330)),
    expected: [['readings[2].end', 'must be greater than start (330 mm); only a circumferential seam']],
  },
  {
    name: 'start equal to end on a straight seam',
    input: broken(validButt, set('readings[2].end', 300)),
    expected: [['readings[2].end', 'must be greater than start (300 mm)']],
  },
  {
    name: 'position beyond the seam length',
    input: broken(validButt, set('readings[0].position', 1200)),
    expected: [['readings[0].position', "lies beyond the seam's length of 1000 mm; got 1200"]],
  },
  {
    name: 'end beyond the seam length',
    input: broken(validButt, set('readings[2].end', 1000.5)),
    expected: [['readings[2].end', "lies beyond the seam's length of 1000 mm; got 1000.5"]],
  },
  {
    name: 'position and start together',
    input: broken(validButt, set('readings[2].position', 310)),
    expected: [['readings[2]', 'give either position, or start and end']],
  },
  {
    name: 'no position at all',
    input: broken(validButt, del('readings[0].position')),
    expected: [['readings[0]', 'needs a position (mm from the start mark), or start and end']],
  },
  {
    name: 'start without end',
    input: broken(validButt, del('readings[2].end')),
    expected: [['readings[2]', 'start and end go together']],
  },
  {
    name: 'a toe angle along a length',
    input: broken(validButt, set('readings[2].values.toeAngle', 140)),
    expected: [['readings[2].values', 'toeAngle is measured at a position, not along a length']],
  },

  // What a value needs from its reading.
  {
    name: 'toe parameters without a toe',
    input: broken(validButt, del('readings[0].toe')),
    expected: [
      ['readings[0].values.toeAngle', 'is measured at a toe: the reading needs toe {plate: 1 or 2'],
      ['readings[0].values.undercutDepth', 'is measured at a toe'],
    ],
  },
  {
    name: 'reinforcementHeight without reinforcementWidth',
    input: broken(validButt, del('readings[1].values.reinforcementWidth')),
    expected: [
      [
        'readings[1].values.reinforcementWidth',
        'is needed with reinforcementHeight: the limit is 1 mm + k·b',
      ],
    ],
  },
  {
    name: 'a face-or-root value without a side',
    input: broken(validButt, del('readings[1].side')),
    expected: [
      ['readings[1].values.reinforcementHeight', 'belongs to the face or the root: the reading needs side'],
      ['readings[1].values.reinforcementWidth', 'belongs to the face or the root'],
    ],
  },
  {
    name: 'side disagreeing with the toe',
    input: broken(validButt, set('readings[0].side', 'root')),
    expected: [['readings[0].side', 'disagrees with toe.side ("face")']],
  },
  {
    name: 'no value in a reading',
    input: broken(validButt, set('readings[3].values', {})),
    expected: [['readings[3].values', 'holds no measured value; give at least one of: toeAngle']],
  },

  // What a value needs from its joint.
  {
    name: 'fillet convexity on a butt joint',
    input: broken(validButt, set('readings[1].values.convexity', 1)),
    expected: [
      ['readings[1].values.convexity', 'does not apply to a butt joint (it belongs to fillet welds)'],
    ],
  },
  {
    name: 'fillet throat on a butt joint: one problem, not also "nominalThroat is needed"',
    input: broken(validButt, set('readings[3].values.throat', 5)),
    expected: [['readings[3].values.throat', 'does not apply to a butt joint']],
  },
  {
    name: 'butt reinforcement on a fillet joint',
    input: broken(
      validFillet,
      set('readings[0].side', 'face'),
      set('readings[0].values', { reinforcementHeight: 2, reinforcementWidth: 8 }),
    ),
    expected: [
      [
        'readings[0].values.reinforcementHeight',
        'does not apply to a filletT joint (it belongs to butt welds)',
      ],
    ],
  },
  {
    name: 'incompleteRootPenetration on a two-sided weld',
    input: broken(
      validButt,
      set('seam.joint.sides', 'two'),
      set('readings[1].values', { incompleteRootPenetration: 0.5 }),
    ),
    expected: [['readings[1].values.incompleteRootPenetration', 'applies to single-sided butt welds only']],
  },
  {
    name: 'misalignment on unequal plates without misalignmentBasis',
    input: broken(validButt, set('seam.plate2.thickness', 12)),
    expected: [['readings[3].misalignmentBasis', 'is needed when the plates differ in thickness']],
  },
  {
    name: 'a fillet throat without the nominal throat',
    input: broken(validFillet, del('seam.nominalThroat')),
    expected: [['seam.nominalThroat', 'is needed to grade readings[0]']],
  },
  {
    name: 'leg1 without leg2',
    input: broken(validFillet, set('readings[0].values', { leg1: 6 })),
    expected: [['readings[0].values.leg2', 'leg1 and leg2 go together']],
  },
  {
    name: 'a fillet throat on a butt seam',
    input: broken(validButt, set('seam.nominalThroat', 5)),
    expected: [['seam.nominalThroat', 'a butt joint has no fillet throat or legs']],
  },
  {
    name: 'butt-weld thickness on a fillet seam',
    input: broken(validFillet, set('seam.buttThickness', 8)),
    expected: [['seam.buttThickness', 'butt-weld thickness s applies to butt joints only']],
  },

  // Acceptance.
  {
    name: 'preset and level that disagree',
    input: broken(
      validButt,
      set('seam.acceptance', { edition: 'ISO 5817:2014', preset: 'EXC2', level: 'B' }),
    ),
    expected: [['seam.acceptance.level', 'EXC2 asks level C but level says B']],
  },
  {
    name: 'neither level nor preset',
    input: broken(validButt, del('seam.acceptance.level')),
    expected: [['seam.acceptance', 'needs a required level ("B", "C" or "D") or an execution-class preset']],
  },
  {
    name: 'unknown override key',
    input: broken(validButt, set('seam.acceptance.overrides', { '9999': 'D' })),
    expected: [
      ['seam.acceptance.overrides.9999', 'not an ISO 6520-1 number ISO 5817:2014 grades; known: 100, 104'],
    ],
  },
  {
    name: 'an override naming a number of another edition (5071 is the 2023 number for plate misalignment)',
    input: broken(validButt, set('seam.acceptance.overrides', { '5071': 'D' })),
    expected: [['seam.acceptance.overrides.5071', 'not an ISO 6520-1 number ISO 5817:2014 grades']],
  },
  {
    name: 'an override key that is not an ISO 6520-1 number',
    input: broken(validButt, set('seam.acceptance.overrides', { undercut: 'D' })),
    expected: [['seam.acceptance.overrides.undercut', 'keys must be ISO 6520-1 numbers such as "5011"']],
  },
  {
    name: 'an override to a level that does not exist',
    input: broken(validButt, set('seam.acceptance.overrides', { '5011': 'E' })),
    expected: [['seam.acceptance.overrides.5011', 'must be one of "B", "C", "D"; got "E"']],
  },

  // Checklist.
  {
    name: '"present" checklist answer without a position',
    input: broken(validButt, set('rounds[0].checklist.crack', { answer: 'present' })),
    expected: [
      ['rounds[0].checklist.crack.position', 'is needed when the item is "present": where along the seam'],
    ],
  },
  {
    name: 'unknown checklist item',
    input: broken(validButt, set('rounds[0].checklist.cracks', { answer: 'noneFound' })),
    expected: [['rounds[0].checklist.cracks', 'unknown field; checklist allows only: crack, craterCrack']],
  },
  {
    name: 'unknown checklist answer',
    input: broken(validButt, set('rounds[0].checklist.crack.answer', 'no')),
    expected: [
      [
        'rounds[0].checklist.crack.answer',
        'must be one of "noneFound", "present", "notAccessible"; got "no"',
      ],
    ],
  },

  // Not a seam file at all.
  {
    name: 'null as the whole file',
    input: () => null,
    expected: [['(file)', 'seam file must be an object, got null']],
  },
  {
    name: 'an array as the whole file',
    input: () => [validButt()],
    expected: [['(file)', 'seam file must be an object, got a list']],
  },
  { name: 'a string as the whole file', input: () => 'seam', expected: [['(file)', 'got "seam"']] },
  { name: 'a number as the whole file', input: () => 42, expected: [['(file)', 'got 42']] },
  { name: 'nothing', input: () => undefined, expected: [['(file)', 'got undefined']] },
];

describe('malformed seam files are refused with specific problems', () => {
  it('starts from files the validator accepts', () => {
    expect(parseSeamFile(validButt()).ok).toBe(true);
    expect(parseSeamFile(validFillet()).ok).toBe(true);
  });

  it.each(cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    expectProblems(c.input(), c.expected);
  });
});

describe('huge inputs', () => {
  it(`refuses ${MAX_READINGS + 1} readings by their number`, () => {
    const one = validButt().readings[0];
    const file = { ...validButt(), readings: new Array<unknown>(MAX_READINGS + 1).fill(one) };
    expectProblems(file, [
      ['readings', `readings holds ${MAX_READINGS + 1} items; at most ${MAX_READINGS} are accepted`],
    ]);
  });

  it('reports at most 50 problems, the first ones first', () => {
    const one = validButt().readings[0];
    const file = { ...validButt(), readings: new Array<unknown>(1000).fill(one) };
    const parsed = parseSeamFile(file);
    if (parsed.ok) throw new Error('accepted');
    expect(parsed.problems).toHaveLength(50);
    expect(parsed.problems[0]).toEqual({
      path: 'readings[1].id',
      message: '"r-a" is used by another reading; ids must be unique',
    });
  });
});

describe('fixture files in test/fixtures/bad-seam-files', () => {
  const dir = new URL('../fixtures/bad-seam-files/', import.meta.url);
  const expectations: Readonly<Record<string, Expected>> = {
    'thickness-as-string.json': [['seam.plate1.thickness', 'write 12, not "12 mm"']],
    'toe-angle-75.json': [['readings[0].values.toeAngle', 'must be at least 90°']],
    'misspelt-field-toeAngleRad.json': [['readings[0].values.toeAngleRad', 'unknown field']],
    'supersedes-loop.json': [
      ['readings[1].supersedes', 'corrections form a loop'],
      ['readings[0].supersedes', 'corrections form a loop'],
    ],
    'checklist-present-without-position.json': [['rounds[0].checklist.crack.position', 'is needed']],
    'units-inch.json': [['units.length', 'only "mm" is accepted']],
    'whole-file-null.json': [['(file)', 'got null']],
    'whole-file-array.json': [['(file)', 'got a list']],
  };

  it('has an expectation for every fixture', () => {
    expect(readdirSync(dir).sort()).toEqual(Object.keys(expectations).sort());
  });

  it.each(Object.entries(expectations))('%s', (name, expected) => {
    expectProblems(JSON.parse(readFileSync(new URL(name, dir), 'utf8')) as unknown, expected);
  });
});
