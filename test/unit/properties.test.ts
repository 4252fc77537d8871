// Properties of the grading core that must hold for every valid seam file, checked on generated files.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  describeProblems,
  gradeSeam,
  levelRank,
  parseSeamFile,
  type LevelMet,
  type ReadingGrade,
  type SeamFile,
  type SeamGrade,
  type Seam,
} from '../../src/domain/index.js';
import {
  fileForSeamArb,
  gridValue,
  makeReading,
  placedBodyArb,
  placementArb,
  seamArb,
  seamFileArb,
  VALUE,
  type Placement,
  type ReadingBody,
} from '../support/seam-arbitraries.js';

const RUNS = { numRuns: 200 };

/** No level assessed ranks above B: adding or worsening something may only move a result down from there. */
const rank = (l: LevelMet | null): number => (l === null ? 4 : levelRank(l));

function expectValid(file: SeamFile): void {
  const parsed = parseSeamFile(file);
  expect(parsed.ok ? '' : describeProblems(parsed.problems)).toBe('');
}

function readingGrade(g: SeamGrade, id: string): ReadingGrade {
  for (const r of g.rounds) {
    const found = r.readings.find((x) => x.readingId === id);
    if (found) return found;
  }
  throw new Error(`reading ${id} was not graded`);
}

/** Ids that sort before, between and after the generated ones ("r-0" … "r-9"): the grader orders readings by id. */
const extraIdArb = fc.constantFrom('a-extra', 'r-1x', 'r-4x', 'z-extra');

const lastRound = (file: SeamFile): number => Math.max(...file.rounds.map((r) => r.number));

// ---------------------------------------------------------------------------------------------------------
// A probe: one measured quantity whose badness has a direction, with a better and a worse value of it.

interface Probe {
  readonly quantity: string;
  /** 'max': a larger value is worse (limits "h ≤ …"); 'min': a smaller value is worse (toe angle "α ≥ …"). */
  readonly direction: 'max' | 'min';
  readonly better: number;
  readonly worse: number;
  readonly withLength: boolean;
  readonly build: (x: number) => ReadingBody;
}

const ordered = (arb: fc.Arbitrary<number>, direction: 'max' | 'min') =>
  fc.tuple(arb, arb).map(([a, b]) => {
    const [lo, hi] = a <= b ? [a, b] : [b, a];
    return direction === 'max' ? { better: lo, worse: hi } : { better: hi, worse: lo };
  });

const toe = fc.record({ plate: fc.constantFrom(1, 2), side: fc.constantFrom('face', 'root') });
const anySide = fc.constantFrom('face', 'root');
const round6 = (x: number): number => Math.round(x * 1e6) / 1e6;

function probeArb(seam: Seam): fc.Arbitrary<Probe> {
  const maxProbe = (
    quantity: string,
    arb: fc.Arbitrary<number>,
    withLength: boolean,
    build: (x: number) => ReadingBody,
  ) => ordered(arb, 'max').map((p): Probe => ({ quantity, direction: 'max', withLength, build, ...p }));
  const both = [
    toe.chain((t) =>
      ordered(VALUE.toeAngle, 'min').map((p): Probe => ({
        quantity: 'toeAngle',
        direction: 'min',
        withLength: false,
        build: (x) => ({ toe: t, values: { toeAngle: x } }),
        ...p,
      })),
    ),
    toe.chain((t) =>
      maxProbe('undercutDepth', VALUE.depth, true, (x) => ({ toe: t, values: { undercutDepth: x } })),
    ),
    fc.tuple(toe, VALUE.width).chain(([t, b]) =>
      maxProbe('overlap', VALUE.depth, false, (x) => ({
        toe: t,
        values: { overlap: x, reinforcementWidth: b },
      })),
    ),
    maxProbe('poreDiameter', VALUE.pore, false, (x) => ({ values: { poreDiameter: x } })),
    maxProbe('endCraterDepth', VALUE.depth, false, (x) => ({ values: { endCraterDepth: x } })),
  ];
  if (seam.joint.type === 'butt') {
    const butt = [
      fc.tuple(anySide, VALUE.width).chain(([side, b]) =>
        maxProbe('reinforcementHeight', VALUE.height, false, (x) => ({
          side,
          values: { reinforcementHeight: x, reinforcementWidth: b },
        })),
      ),
      maxProbe('rootConcavity', VALUE.depth, true, (x) => ({ side: 'root', values: { rootConcavity: x } })),
      maxProbe('shrinkageGroove', VALUE.depth, true, (x) => ({
        side: 'root',
        values: { shrinkageGroove: x },
      })),
      anySide.chain((side) =>
        maxProbe('sagging', VALUE.depth, true, (x) => ({ side, values: { sagging: x } })),
      ),
      // The mid-plane offset is graded by its size, whichever way it points.
      fc.constantFrom(1, -1).chain((sign) =>
        maxProbe('linearMisalignment', gridValue(0, 6, 0.1), false, (x) => ({
          values: { linearMisalignment: sign * x },
          misalignmentBasis: 'midPlane',
        })),
      ),
      ...(seam.joint.sides === 'one'
        ? [
            maxProbe('incompleteRootPenetration', VALUE.depth, true, (x) => ({
              side: 'root',
              values: { incompleteRootPenetration: x },
            })),
          ]
        : []),
    ];
    return fc.oneof(...both, ...butt);
  }
  const a = seam.nominalThroat ?? 5;
  const fillet = [
    fc.tuple(anySide, VALUE.width).chain(([side, b]) =>
      maxProbe('convexity', VALUE.height, false, (x) => ({
        side,
        values: { convexity: x, reinforcementWidth: b },
      })),
    ),
    maxProbe('rootGap', VALUE.depth, false, (x) => ({ values: { rootGap: x } })),
    // Throat below nominal: the deficit a − aA grows as the measured throat shrinks.
    maxProbe('throat deficit', gridValue(0, a - 0.5, 0.1), true, (d) => ({
      values: { throat: round6(a - d) },
    })),
    // Leg asymmetry |z1 − z2|, assessed only where the drawing does not prescribe unequal legs.
    ...(seam.nominalLegs !== undefined && seam.nominalLegs.leg1 !== seam.nominalLegs.leg2
      ? []
      : [
          VALUE.leg.chain((z) =>
            maxProbe('leg difference', gridValue(0, 8, 0.1), false, (d) => ({
              values: { leg1: z, leg2: round6(z + d) },
            })),
          ),
        ]),
  ];
  return fc.oneof(...both, ...fillet);
}

const probeCaseArb = seamArb.chain((seam) =>
  fc
    .record({ file: fileForSeamArb(seam, 6), probe: probeArb(seam), id: extraIdArb })
    .chain(({ file, probe, id }) =>
      placementArb(seam, probe.withLength).map((placement: Placement) => ({ file, probe, placement, id })),
    ),
);

function withProbe(file: SeamFile, probe: Probe, placement: Placement, x: number, id: string): SeamFile {
  const r = makeReading(id, lastRound(file), probe.build(x), placement);
  return { ...file, readings: [...file.readings, r] };
}

describe('a worse measurement never earns a better level', () => {
  it('per parameter: larger h for "h ≤" limits, smaller α for the toe angle', () => {
    fc.assert(
      fc.property(probeCaseArb, ({ file, probe, placement, id }) => {
        const better = withProbe(file, probe, placement, probe.better, id);
        const worse = withProbe(file, probe, placement, probe.worse, id);
        expectValid(better);
        expectValid(worse);
        const gb = gradeSeam(better);
        const gw = gradeSeam(worse);
        const rb = readingGrade(gb, id);
        const rw = readingGrade(gw, id);
        // Every probed quantity has a table row for its joint, so the probe is graded, not skipped.
        expect(rb.imperfections.length).toBeGreaterThan(0);
        expect(rank(rw.levelMet)).toBeLessThanOrEqual(rank(rb.levelMet));
        const roundOf = (g: SeamGrade) => g.rounds.find((r) => r.round === lastRound(file));
        expect(rank(roundOf(gw)?.levelMet ?? null)).toBeLessThanOrEqual(rank(roundOf(gb)?.levelMet ?? null));
        expect(rank(gw.levelMet)).toBeLessThanOrEqual(rank(gb.levelMet));
      }),
      RUNS,
    );
  });
});

describe('the margin moves with the measured value', () => {
  it('is non-increasing in h for "h ≤" limits and non-decreasing in α for the toe angle', () => {
    fc.assert(
      fc.property(probeCaseArb, ({ file, probe, placement, id }) => {
        const rb = readingGrade(gradeSeam(withProbe(file, probe, placement, probe.better, id)), id);
        const rw = readingGrade(gradeSeam(withProbe(file, probe, placement, probe.worse, id)), id);
        expect(rw.imperfections.map((g) => g.rowId)).toEqual(rb.imperfections.map((g) => g.rowId));
        rb.imperfections.forEach((gb, i) => {
          const gw = rw.imperfections[i];
          if (!gw) throw new Error('row missing');
          // Same row, same governing limit: only the measured value moved.
          expect(gw.governing.value).toBe(gb.governing.value);
          if (gb.margin === null) {
            expect(gw.margin).toBeNull();
            return;
          }
          if (gw.margin === null) throw new Error(`row ${gw.rowId}: margin lost`);
          // better/worse are ordered by the probe's direction, so both cases read "worse ⇒ margin not larger".
          expect(gw.margin).toBeLessThanOrEqual(gb.margin);
        });
      }),
      RUNS,
    );
  });
});

describe('adding a reading never improves a level', () => {
  it('holds for the seam and for every round', () => {
    const caseArb = seamArb.chain((seam) =>
      fc.record({
        file: fileForSeamArb(seam, 8),
        extra: placedBodyArb(seam),
        roundPick: fc.nat(),
        id: extraIdArb,
      }),
    );
    fc.assert(
      fc.property(caseArb, ({ file, extra, roundPick, id }) => {
        const round = (file.rounds[roundPick % file.rounds.length] as SeamFile['rounds'][number]).number;
        const { placement, ...body } = extra;
        const added: SeamFile = {
          ...file,
          readings: [...file.readings, makeReading(id, round, body, placement)],
        };
        expectValid(file);
        expectValid(added);
        const before = gradeSeam(file);
        const after = gradeSeam(added);
        expect(rank(after.levelMet)).toBeLessThanOrEqual(rank(before.levelMet));
        after.rounds.forEach((r, i) => {
          expect(rank(r.levelMet)).toBeLessThanOrEqual(rank(before.rounds[i]?.levelMet ?? null));
        });
        // Readings do not answer the checklist: completeness and the graded round stay as they were.
        expect(after.state).toBe(before.state);
        expect(after.gradedRound).toBe(before.gradedRound);
      }),
      RUNS,
    );
  });
});

describe('the order of readings does not change the result', () => {
  it('gives the same grade, to the byte, for any order of readings and rounds', () => {
    const caseArb = seamFileArb.chain((file) =>
      fc.record({
        file: fc.constant(file),
        readings: fc.shuffledSubarray(file.readings, {
          minLength: file.readings.length,
          maxLength: file.readings.length,
        }),
        rounds: fc.shuffledSubarray(file.rounds, {
          minLength: file.rounds.length,
          maxLength: file.rounds.length,
        }),
        reverseValueKeys: fc.boolean(),
      }),
    );
    fc.assert(
      fc.property(caseArb, ({ file, readings, rounds, reverseValueKeys }) => {
        const shuffled: SeamFile = {
          ...file,
          rounds,
          readings: reverseValueKeys
            ? readings.map((r) => ({ ...r, values: Object.fromEntries(Object.entries(r.values).reverse()) }))
            : readings,
        };
        expectValid(file);
        expectValid(shuffled);
        expect(JSON.stringify(gradeSeam(shuffled))).toBe(JSON.stringify(gradeSeam(file)));
      }),
      RUNS,
    );
  });
});

// ---------------------------------------------------------------------------------------------------------
// The validator at the boundary: whatever arrives, it answers with problems or a file, and never throws.

function expectAnswer(input: unknown): void {
  let parsed: ReturnType<typeof parseSeamFile> | undefined;
  expect(() => {
    parsed = parseSeamFile(input);
  }).not.toThrow();
  if (!parsed) throw new Error('no answer');
  if (parsed.ok) {
    const file = parsed.value;
    expect(() => gradeSeam(file)).not.toThrow();
    return;
  }
  expect(parsed.problems.length).toBeGreaterThan(0);
  expect(parsed.problems.length).toBeLessThanOrEqual(50);
  for (const p of parsed.problems) {
    expect(typeof p.path).toBe('string');
    expect(p.path.length).toBeGreaterThan(0);
    expect(typeof p.message).toBe('string');
    expect(p.message.trim().length).toBeGreaterThan(0);
  }
}

type Key = string | number;

/** Every path into a JSON-like tree, the root excluded. */
function pathsOf(node: unknown, prefix: Key[] = []): Key[][] {
  if (Array.isArray(node)) return node.flatMap((x, i) => [[...prefix, i], ...pathsOf(x, [...prefix, i])]);
  if (node !== null && typeof node === 'object')
    return Object.entries(node).flatMap(([k, x]) => [[...prefix, k], ...pathsOf(x, [...prefix, k])]);
  return [];
}

/** A copy of the tree with the value at the path replaced, or removed when `replacement` is "delete". */
function mutate(root: unknown, path: readonly Key[], replacement: { value: unknown } | 'delete'): unknown {
  const copy = structuredClone(root) as Record<Key, unknown>;
  let node: Record<Key, unknown> = copy;
  path.slice(0, -1).forEach((k) => {
    node = node[k] as Record<Key, unknown>;
  });
  const last = path[path.length - 1] as Key;
  if (replacement === 'delete') Reflect.deleteProperty(node, last);
  else node[last] = replacement.value;
  return copy;
}

const oddValue = fc.oneof(
  fc.jsonValue({ maxDepth: 2 }),
  fc.constantFrom(NaN, Infinity, -Infinity, -0, undefined, null, '', '12 mm', [], {}, 1e308, -1, 0.3, true),
);

describe('parseSeamFile never throws', () => {
  it('on arbitrary JSON values', () => {
    fc.assert(fc.property(fc.jsonValue(), expectAnswer), RUNS);
  });

  it('on arbitrary JavaScript values', () => {
    fc.assert(
      fc.property(
        fc.anything({ withBigInt: true, withDate: true, withMap: true, withSet: true }),
        expectAnswer,
      ),
      RUNS,
    );
  });

  it('on a valid file with one field replaced or removed, and grades whatever it accepts', () => {
    const caseArb = seamFileArb.chain((file) => {
      const paths = pathsOf(file);
      return fc.record({
        file: fc.constant(file),
        path: fc.constantFrom(...paths),
        replacement: fc.oneof(
          oddValue.map((value) => ({ value })),
          fc.constant<'delete'>('delete'),
        ),
      });
    });
    fc.assert(
      fc.property(caseArb, ({ file, path, replacement }) => expectAnswer(mutate(file, path, replacement))),
      RUNS,
    );
  });

  it('on generated valid files, which it accepts', () => {
    fc.assert(
      fc.property(seamFileArb, (file) => expectValid(file)),
      RUNS,
    );
  });
});
