// Profile extraction against surface profiles with known geometry from outside the project:
// ../shared/data/butt-profiles (see its README: half profiles of butt-weld caps, x from the centre-line outward,
// clean). Each half is mirrored into a full cap; seeded Gaussian noise is added for the noisy rows. The issue's
// targets (0.025 mm spacing, clean, 90th percentile) are asserted: flank ±2°, height ±0.05 mm, width ±0.3 mm,
// toe radius ±25 % for ρ ≥ 0.5 mm. The whole table (docs/import.md) is printed.
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it, type TestContext } from 'vitest';
import { extractSlice, type SliceGeometry } from '../../src/domain/profile/index.js';
import { seededNormal } from '../support/weld-profile.js';

const DIR = fileURLToPath(new URL('../../../shared/data/butt-profiles/', import.meta.url));
const PRESENT = existsSync(DIR);
const ABSENT = `reference profiles not found at ${DIR} (../shared/data/butt-profiles beside the repository)`;
const SKIPPED = `${ABSENT}: the profile accuracy checks are skipped (with CI=true they must run).`;
if (!PRESENT && process.env.CI !== 'true') console.warn(SKIPPED);

/** Skips with the reason when the data is absent, except under CI, where its absence is a failure. */
function needData(ctx: TestContext): void {
  if (PRESENT) return;
  if (process.env.CI === 'true') throw new Error(`${ABSENT}, and CI=true: the profile checks must run.`);
  ctx.skip(SKIPPED);
}

interface Known {
  readonly file: string;
  readonly spacing: number;
  readonly height: number;
  readonly flank: number;
  readonly rho: number;
  readonly width: number;
}

function manifest(): Known[] {
  const [head, ...lines] = readFileSync(`${DIR}manifest.csv`, 'utf8').trim().split(/\r?\n/);
  const keys = (head ?? '').split(',');
  return lines.map((line) => {
    const cells = line.split(',');
    const get = (k: string) => cells[keys.indexOf(k)] ?? '';
    return {
      file: get('file'),
      spacing: Number(get('spacing_mm')),
      height: Number(get('h_mm')),
      flank: Number(get('flank_deg')),
      rho: Number(get('rho_mm')),
      width: Number(get('profile_width_mm')),
    };
  });
}

/** The half profile mirrored about x = 0 (the centre point once), with seeded noise of σ `noise` mm. */
function fullCap(file: string, noise: number, seed: number): { x: Float64Array; z: Float64Array } {
  const rows = readFileSync(`${DIR}${file}`, 'utf8').trim().split(/\r?\n/).slice(1);
  const half = rows.map((r) => r.split(',').map(Number) as [number, number]);
  const n = half.length * 2 - 1;
  const x = new Float64Array(n);
  const z = new Float64Array(n);
  const m = half.length - 1;
  for (let i = 0; i <= m; i++) {
    const [hx, hz] = half[i] as [number, number];
    x[m - i] = -hx;
    z[m - i] = hz;
    x[m + i] = hx;
    z[m + i] = hz;
  }
  const normal = seededNormal(seed);
  if (noise > 0) for (let i = 0; i < n; i++) z[i] = (z[i] as number) + noise * normal();
  return { x, z };
}

interface Row {
  readonly flank: number[];
  readonly radius: number[];
  readonly height: number[];
  readonly width: number[];
  flagged: number;
  readonly n: number;
}

function errorsFor(spacing: number, noise: number): Row {
  const cases = manifest().filter((c) => c.spacing === spacing);
  const row: Row = { flank: [], radius: [], height: [], width: [], flagged: 0, n: cases.length };
  cases.forEach((c, k) => {
    const { x, z } = fullCap(c.file, noise, 1000 + k);
    const g: SliceGeometry = extractSlice(x, z);
    if (g.flagged) row.flagged++;
    if (!g.toes) return;
    for (const t of g.toes) {
      row.flank.push(t.flankAngle === null ? Infinity : Math.abs(t.flankAngle - c.flank));
      if (c.rho >= 0.5) row.radius.push(t.toeRadius === null ? Infinity : Math.abs(t.toeRadius / c.rho - 1));
    }
    row.height.push(Math.abs((g.reinforcementHeight ?? Infinity) - c.height));
    row.width.push(Math.abs((g.reinforcementWidth ?? Infinity) - c.width));
  });
  return row;
}

/** Nearest-rank percentile of absolute errors; a missing value (no fit) counts as infinite. */
function pctile(xs: readonly number[], p: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s.length ? (s[Math.min(s.length - 1, Math.ceil((p / 100) * s.length) - 1)] as number) : Infinity;
}

const both = (xs: readonly number[], f: (v: number) => string) =>
  `${f(pctile(xs, 50))} / ${f(pctile(xs, 90))}`;
const deg = (v: number) => `${v.toFixed(2)}°`;
const mm = (v: number) => `${v.toFixed(3)} mm`;
const rel = (v: number) => (Number.isFinite(v) ? `${(100 * v).toFixed(1)} %` : '–');

describe('extraction against the reference butt profiles (median / 90th percentile of |error|)', () => {
  it('meets the issue targets on clean profiles at 0.025 mm spacing, and prints the accuracy table', (ctx) => {
    needData(ctx);
    const table: string[] = ['spacing, noise | flank θ | toe radius | height h | width b | flagged'];
    let clean: Row | null = null;
    for (const spacing of [0.025, 0.075]) {
      for (const noise of [0, 0.01, 0.03]) {
        const r = errorsFor(spacing, noise);
        if (spacing === 0.025 && noise === 0) clean = r;
        table.push(
          `${spacing} mm, ${noise ? `σ ${noise} mm` : 'clean'} | ${both(r.flank, deg)} | ${both(r.radius, rel)} | ` +
            `${both(r.height, mm)} | ${both(r.width, mm)} | ${r.flagged} / ${r.n}`,
        );
      }
    }
    console.log(table.join('\n'));
    if (!clean) throw new Error('no clean 0.025 mm profiles in the manifest');
    expect(clean.n).toBe(12);
    expect(clean.flagged).toBe(0);
    expect(clean.flank).toHaveLength(24);
    expect(pctile(clean.flank, 90)).toBeLessThanOrEqual(2);
    expect(pctile(clean.height, 90)).toBeLessThanOrEqual(0.05);
    expect(pctile(clean.width, 90)).toBeLessThanOrEqual(0.3);
    expect(clean.radius.length).toBeGreaterThan(0);
    expect(pctile(clean.radius, 90)).toBeLessThanOrEqual(0.25);
  });

  it('flags every profile with 0.03 mm noise and none of the clean ones at either spacing', (ctx) => {
    needData(ctx);
    for (const spacing of [0.025, 0.075]) {
      expect(errorsFor(spacing, 0).flagged).toBe(0);
      const noisy = errorsFor(spacing, 0.03);
      expect(noisy.flagged).toBe(noisy.n);
    }
  });
});
