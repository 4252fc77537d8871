// npm run bench (import): a 100,000-row parameter table read, validated and graded, as a ratio to papaparse's
// plain parse of the same file in the same run (target ≤ 1.5×); 10,000 profiles × 1,000 points extracted, as a
// ratio to one plain least-squares line fit over the same points (target ≤ 3×), with profiles per second; and the
// parsing of a profile file timed on its own. Each run times the baseline and the measured work back to back and
// the ratio is the median of the runs' ratios, so load from other work on the machine shifts both alike.
import { performance } from 'node:perf_hooks';
import Papa from 'papaparse';
import { BUILT_IN_CRITERIA, gradeSeam, type Seam, type SeamFile } from '../src/domain/index.js';
import { nodeHasher } from '../src/cli/node-hasher.js';
import { importTable, MAPPING_FORMAT, sha256, type ImportMapping } from '../src/domain/import/index.js';
import { extractSlice, fitLine, importProfiles } from '../src/domain/profile/index.js';

const ROWS = 100_000;
const SLICES = 10_000;
const POINTS = 1_000;
const RUNS = 5;
const TABLE_TARGET = 1.5;
const PROFILE_TARGET = 3;

const seam: Seam = {
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
};

// One row per toe (a toe column), so 100,000 rows make 100,000 readings: a seam holds at most 200,000.
function table(): string {
  const lines = [
    'Position [mm];Toe;Angle [deg];Radius [mm];Undercut [mm];Height [mm];Width [mm];Offset [mm]',
  ];
  for (let i = 0; i < ROWS; i++) {
    const k = (i * 7919) % 1000;
    const cells = [
      (Math.floor(i / 2) * 0.5).toFixed(2),
      i % 2 === 0 ? 'L' : 'R',
      (140 + (k % 30)).toFixed(1),
      (0.5 + (k % 30) / 10).toFixed(2),
      ((k % 8) / 20).toFixed(2),
      (1 + (k % 40) / 20).toFixed(2),
      (12 + (k % 10) / 3).toFixed(2),
      (((k % 30) - 15) / 20).toFixed(2),
    ];
    lines.push(cells.join(';').replaceAll('.', ','));
  }
  return `${lines.join('\r\n')}\r\n`;
}

const MAPPING: ImportMapping = {
  format: MAPPING_FORMAT,
  misalignmentBasis: 'faceSurface',
  columns: {
    position: 'Position',
    toe: 'Toe',
    toeAngle: 'Angle',
    toeRadius: 'Radius',
    undercutDepth: 'Undercut',
    reinforcementHeight: 'Height',
    reinforcementWidth: 'Width',
    linearMisalignment: 'Offset',
  },
};

const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] as number;
const time = (fn: () => void) => {
  const t = performance.now();
  fn();
  return performance.now() - t;
};

// --- parameter table ---
const text = table();
const bytes = new TextEncoder().encode(text);
const context = { importId: 'bench', seam, recordedAt: '2026-11-20T08:00:00Z' };
const papaMs: number[] = [];
const importMs: number[] = [];
const readOnlyMs: number[] = [];
const gradeMs: number[] = [];
const tableRatios: number[] = [];
const jsHashMs: number[] = [];
let readings = 0;
let level = '';
for (let run = 0; run <= RUNS; run++) {
  const p = time(() => Papa.parse(text));
  let gradeT = 0;
  const i = time(() => {
    // Hashed as the command line hashes (node:crypto); the worker uses WebCrypto, the JS fallback is benched below.
    const o = importTable(bytes, { mapping: MAPPING, context, hasher: nodeHasher() });
    if (o.kind !== 'read') throw new Error(`bench table refused: ${o.refusal.message}`);
    readings = o.readings.length;
    const file: SeamFile = {
      format: 'beadbook.seam/1',
      units: { length: 'mm', angle: 'deg' },
      seam,
      rounds: [{ number: 1, kind: 'first', checklist: {} }],
      readings: o.readings,
    };
    gradeT = time(() => {
      level =
        gradeSeam(file, BUILT_IN_CRITERIA['ISO 5817:2014'], { readings: 'columns' }).rounds[0]?.levelMet ??
        '';
    });
  });
  // The pure JS hasher (the fallback where no native one is given), timed apart: not part of the ratio.
  const j = time(() => {
    const h = sha256();
    h.update(bytes);
    h.digest();
  });
  if (run === 0) continue;
  papaMs.push(p);
  importMs.push(i);
  readOnlyMs.push(i - gradeT);
  gradeMs.push(gradeT);
  tableRatios.push(i / p);
  jsHashMs.push(j);
}

// --- raw profiles, already in typed arrays ---
const xs = new Float64Array(SLICES * POINTS);
const zs = new Float64Array(SLICES * POINTS);
for (let s = 0; s < SLICES; s++) {
  const h = 1 + (s % 7) * 0.3;
  const theta = ((15 + (s % 11) * 3) * Math.PI) / 180;
  const rho = 0.5 + (s % 5) * 0.5;
  const r2 = h / (1 - Math.cos(theta)) - rho;
  const xToe = (h * Math.sin(theta)) / (1 - Math.cos(theta));
  for (let i = 0; i < POINTS; i++) {
    const x = -30 + (60 * i) / (POINTS - 1);
    const ax = Math.abs(x);
    let z = 0;
    if (ax <= r2 * Math.sin(theta)) z = h - r2 + Math.sqrt(r2 * r2 - ax * ax);
    else if (ax <= xToe) z = rho - Math.sqrt(Math.max(0, rho * rho - (ax - xToe) ** 2));
    xs[s * POINTS + i] = x;
    // Plate 2 sits 0.2 mm higher; the cap rides on the chord between the toes.
    const base = x >= xToe ? 0.2 : x > -xToe ? (0.2 * (x + xToe)) / (2 * xToe) : 0;
    zs[s * POINTS + i] = z + base;
  }
}
const lineMs: number[] = [];
const extractMs: number[] = [];
const profileRatios: number[] = [];
let flagged = 0;
let sink = 0;
for (let run = 0; run <= 3; run++) {
  const l = time(() => {
    for (let s = 0; s < SLICES; s++) {
      const o = s * POINTS;
      sink += fitLine(xs.subarray(o, o + POINTS), zs.subarray(o, o + POINTS), 0, POINTS)?.b ?? 0;
    }
  });
  let f = 0;
  const e = time(() => {
    for (let s = 0; s < SLICES; s++) {
      const o = s * POINTS;
      if (extractSlice(xs.subarray(o, o + POINTS), zs.subarray(o, o + POINTS), POINTS).flagged) f++;
    }
  });
  if (run === 0) continue;
  flagged = f;
  lineMs.push(l);
  extractMs.push(e);
  profileRatios.push(e / l);
}

// --- profile file parsing, on its own: 1,000 slices of 1,000 points as CSV ---
const FILE_SLICES = 1_000;
let csv = 'slice,x,z\n';
for (let s = 0; s < FILE_SLICES; s++) {
  for (let i = 0; i < POINTS; i++) {
    const k = s * POINTS + i;
    csv += `${s * 2},${(xs[k] as number).toFixed(4)},${(zs[k] as number).toFixed(5)}\n`;
  }
}
const csvBytes = new TextEncoder().encode(csv);
const fileMs: number[] = [];
for (let run = 0; run <= 2; run++) {
  const t = time(() => {
    const o = importProfiles(csvBytes, {
      context: { importId: 'bench', recordedAt: context.recordedAt },
      keepSlices: false,
    });
    if (o.kind !== 'read') throw new Error(o.refusal.message);
  });
  if (run > 0) fileMs.push(t);
}
const extractPerSlice = median(extractMs) / SLICES;
const fileTotal = median(fileMs);
const parseOnly = fileTotal - extractPerSlice * FILE_SLICES;

const round = (x: number, digits = 1) => Number(x.toFixed(digits));
const tableRatio = round(median(tableRatios), 2);
const profileRatio = round(median(profileRatios), 2);
const result = {
  table: {
    rows: ROWS,
    readings,
    inputMB: round(bytes.length / 1e6),
    papaparsePlainMs: round(median(papaMs)),
    parseValidateGradeMs: round(median(importMs)),
    parseValidateMs: round(median(readOnlyMs)),
    gradeMs: round(median(gradeMs)),
    ratio: tableRatio,
    ratioRange: [round(Math.min(...tableRatios), 2), round(Math.max(...tableRatios), 2)],
    target: `≤ ${TABLE_TARGET}× papaparse plain parse`,
    met: tableRatio <= TABLE_TARGET,
    hash: 'node:crypto (as the command line); the worker uses WebCrypto',
    sha256JsFallbackMs: round(median(jsHashMs)),
    levelMet: level,
  },
  profiles: {
    slices: SLICES,
    pointsPerSlice: POINTS,
    lineFitMs: round(median(lineMs)),
    extractMs: round(median(extractMs)),
    ratio: profileRatio,
    ratioRange: [round(Math.min(...profileRatios), 2), round(Math.max(...profileRatios), 2)],
    target: `≤ ${PROFILE_TARGET}× one plain least-squares line fit`,
    met: profileRatio <= PROFILE_TARGET,
    profilesPerSecond: Math.round(SLICES / (median(extractMs) / 1000)),
    flagged,
  },
  profileFile: {
    slices: FILE_SLICES,
    inputMB: round(csvBytes.length / 1e6),
    readAndExtractMs: round(fileTotal),
    parseMs: round(parseOnly),
    parseMBps: round(csvBytes.length / 1e6 / (parseOnly / 1000)),
  },
  sink: sink === 12345 ? 1 : 0,
};
process.stdout.write(`${JSON.stringify(result)}\n`);
const verdict = (met: boolean) => (met ? 'met' : 'missed');
process.stdout.write(
  `import: table ${ROWS} rows → ${readings} readings, read ${result.table.parseValidateMs} ms + grade ${result.table.gradeMs} ms vs papaparse ${result.table.papaparsePlainMs} ms: ` +
    `${tableRatio}× (target ≤ ${TABLE_TARGET}×, ${verdict(result.table.met)}); ` +
    `profiles: ${result.profiles.profilesPerSecond}/s, ${profileRatio}× a line fit (target ≤ ${PROFILE_TARGET}×, ${verdict(result.profiles.met)}); ` +
    `profile file parse ${result.profileFile.parseMBps} MB/s\n`,
);
// As every bench: a missed target is a non-zero exit, so `npm run bench` names it rather than saying all was met.
if (!result.table.met || !result.profiles.met) process.exitCode = 1;
