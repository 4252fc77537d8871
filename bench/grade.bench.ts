// npm run bench: grading and validation time for 100,000 readings, as ratios to JSON.parse of the same input.
import { performance } from 'node:perf_hooks';
import { gradeSeam, parseSeamFile, type Reading, type SeamFile } from '../src/domain/index.js';

const READINGS = 100_000;
const RUNS = 7;

function makeFile(): SeamFile {
  const readings: Reading[] = [];
  for (let i = 0; i < READINGS; i++) {
    // A deterministic spread of values so every row is exercised and levels vary.
    const k = (i * 7919) % 1000;
    readings.push({
      id: `r${String(i).padStart(6, '0')}`,
      round: 1,
      position: (i * 10) % 100_000,
      sampling: i % 10 === 0 ? 'targeted' : 'atPitch',
      toe: { plate: i % 2 === 0 ? 1 : 2, side: 'face' },
      values: {
        toeAngle: 120 + (k % 60),
        toeRadius: 0.5 + (k % 30) / 10,
        undercutDepth: (k % 8) / 10,
        overlap: 0,
        reinforcementHeight: 1 + (k % 40) / 10,
        reinforcementWidth: 12 + (k % 10),
        sagging: 0,
        poreDiameter: (k % 5) / 10,
        endCraterDepth: 0,
        linearMisalignment: ((k % 30) - 15) / 10,
        angularMisalignment: ((k % 20) - 10) / 10,
      },
      instrument: { id: 'TG-1', resolutionMm: 0.1, resolutionDeg: 1 },
      source: { kind: 'gauge' },
      recordedAt: '2026-11-19T08:00:00Z',
    });
  }
  return {
    format: 'beadbook.seam/1',
    units: { length: 'mm', angle: 'deg' },
    seam: {
      id: 'bench',
      label: 'Bench seam',
      joint: { type: 'butt', sides: 'one', setting: 'shopFlat' },
      plate1: { thickness: 12 },
      plate2: { thickness: 12 },
      material: { name: 'S355', kind: 'steel' },
      length: 100_000,
      circumferential: false,
      surface: 'asWelded',
      acceptance: { edition: 'ISO 5817:2014', level: 'C' },
    },
    rounds: [{ number: 1, kind: 'first', checklist: {} }],
    readings,
  };
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] as number;
}

function time(fn: () => unknown): number {
  const t0 = performance.now();
  fn();
  return performance.now() - t0;
}

const text = JSON.stringify(makeFile());
if (process.env.BENCH_DUMP) (await import('node:fs')).writeFileSync(process.env.BENCH_DUMP, text);
const parsed = parseSeamFile(JSON.parse(text));
if (!parsed.ok) throw new Error(`bench input invalid: ${parsed.problems[0]?.message}`);
const file = parsed.value;
const valuesPerReading =
  file.readings.reduce((n, r) => n + Object.keys(r.values).length, 0) / file.readings.length;

const parseMs: number[] = [];
const gradeMs: number[] = [];
const validateMs: number[] = [];
const objectsMs: number[] = [];
let levels = '';
// Interleaved runs share the machine's noise; the first round warms the JIT and is dropped.
for (let run = 0; run <= RUNS; run++) {
  const p = time(() => JSON.parse(text));
  const v = time(() => parseSeamFile(JSON.parse(text))) - p;
  const g = time(() => {
    levels = gradeSeam(file, undefined, { readings: 'columns' }).rounds[0]?.levelMet ?? '';
  });
  const o = time(() => gradeSeam(file));
  if (run === 0) continue;
  parseMs.push(p);
  validateMs.push(Math.max(0, v));
  gradeMs.push(g);
  objectsMs.push(o);
}

const parse = median(parseMs);
const grade = median(gradeMs);
const validate = median(validateMs);
const result = {
  readings: READINGS,
  valuesPerReading: Number(valuesPerReading.toFixed(1)),
  inputMB: Number((text.length / 1e6).toFixed(1)),
  jsonParseMs: Number(parse.toFixed(1)),
  gradeMs: Number(grade.toFixed(1)),
  validateMs: Number(validate.toFixed(1)),
  gradeOverParse: Number((grade / parse).toFixed(2)),
  gradeWithReadingObjectsMs: Number(median(objectsMs).toFixed(1)),
  gradeWithReadingObjectsOverParse: Number((median(objectsMs) / parse).toFixed(2)),
  validateOverParse: Number((validate / parse).toFixed(2)),
  target: 'gradeOverParse ≤ 1',
  levelMet: levels,
};
process.stdout.write(`${JSON.stringify(result)}\n`);
process.stdout.write(
  `grade ${READINGS} readings: ${result.gradeMs} ms = ${result.gradeOverParse}× JSON.parse (${result.jsonParseMs} ms); ` +
    `validation ${result.validateMs} ms = ${result.validateOverParse}× JSON.parse\n`,
);
if (result.gradeOverParse > 1) {
  process.stdout.write('FAIL: grading is slower than JSON.parse of the same input\n');
  process.exitCode = 1;
}
