// The toe Kt formulas against finite-element values from outside the project: ../shared/data/toe-kt-fe (see its
// README: public FE data set of weld-toe Kt under bending, t = 10 mm, 2D plane models). Tolerances as the issue
// asks, inside each formula's validity: Anthes and Kiyak butt bending within ±6 % for ρ ≤ 3.5 mm; Anthes
// cruciform within ±3 % on convex faces (convexity ≥ 0.05 mm). The median and worst errors are printed.
import { existsSync, readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it, type TestContext } from 'vitest';
import {
  anthesButtBending,
  anthesButtOutside,
  anthesCruciformBending,
  anthesCruciformOutside,
  kiyakButtBending,
  kiyakOutside,
} from '../../src/domain/index.js';

const DIR = fileURLToPath(new URL('../../../shared/data/toe-kt-fe/', import.meta.url));
const PRESENT = existsSync(DIR);
const ABSENT = `FE reference data not found at ${DIR} (../shared/data/toe-kt-fe beside the repository)`;
const SKIPPED = `${ABSENT}: the FE checks are skipped (with CI=true they must run).`;
if (!PRESENT && process.env.CI !== 'true') console.warn(SKIPPED);

/** Skips with the reason when the data is absent, except under CI, where its absence is a failure. */
function needData(ctx: TestContext): void {
  if (PRESENT) return;
  if (process.env.CI === 'true') throw new Error(`${ABSENT}, and CI=true: the FE checks must run.`);
  ctx.skip(SKIPPED);
}

function csv(name: string): Record<string, number>[] {
  const [head, ...lines] = readFileSync(`${DIR}${name}`, 'utf8').trim().split(/\r?\n/);
  const keys = (head ?? '').split(',');
  return lines.map((line) => {
    const cells = line.split(',');
    return Object.fromEntries(keys.map((k, i) => [k, k === 'id' ? NaN : Number(cells[i])]));
  });
}

interface Errors {
  readonly n: number;
  readonly median: number;
  readonly worst: number;
  readonly medianSigned: number;
}

function summarise(errors: readonly number[]): Errors {
  const abs = errors.map(Math.abs).sort((a, b) => a - b);
  const signed = [...errors].sort((a, b) => a - b);
  const mid = (xs: number[]): number =>
    xs.length % 2
      ? (xs[xs.length >> 1] as number)
      : ((xs[xs.length / 2 - 1] as number) + (xs[xs.length / 2] as number)) / 2;
  return { n: abs.length, median: mid(abs), worst: abs[abs.length - 1] ?? NaN, medianSigned: mid(signed) };
}

const pct = (x: number): string => `${(100 * x).toFixed(2)} %`;

function report(what: string, e: Errors): void {
  console.log(
    `${what}: ${e.n} cases, median |error| ${pct(e.median)}, worst |error| ${pct(e.worst)}, median signed ${pct(e.medianSigned)}`,
  );
}

describe('butt joints in bending (butt-bending-fe.csv)', () => {
  const cases = () => csv('butt-bending-fe.csv').filter((c) => (c.rho_mm as number) <= 3.5);

  it('Anthes (1993) agrees within ±6 % inside its validity', (ctx) => {
    needData(ctx);
    const errors: number[] = [];
    for (const c of cases()) {
      const ratio = (c.t_mm as number) / (c.rho_mm as number);
      if (anthesButtOutside(ratio, c.flank_deg as number).length) continue;
      errors.push(anthesButtBending(ratio, c.flank_deg as number) / (c.kt_bending_fe as number) - 1);
    }
    const e = summarise(errors);
    report('Anthes butt bending vs FE', e);
    expect(e.n).toBeGreaterThan(500);
    expect(e.worst).toBeLessThanOrEqual(0.06);
  });

  it('Kiyak (2016) agrees within ±6 % inside its validity', (ctx) => {
    needData(ctx);
    const errors: number[] = [];
    for (const c of cases()) {
      const [t, h, rho, flank] = [c.t_mm, c.h_mm, c.rho_mm, c.flank_deg] as number[] as [
        number,
        number,
        number,
        number,
      ];
      if (kiyakOutside(flank, h, t, rho).length) continue;
      errors.push(kiyakButtBending(flank, h, t, rho) / (c.kt_bending_fe as number) - 1);
    }
    const e = summarise(errors);
    report('Kiyak butt bending vs FE', e);
    expect(e.n).toBeGreaterThan(500);
    expect(e.worst).toBeLessThanOrEqual(0.06);
  });
});

describe('cruciform joints in bending (cruciform-bending-fe.csv)', () => {
  const inRange = () =>
    csv('cruciform-bending-fe.csv').flatMap((c) => {
      const t = c.t_mm as number;
      const flank = 180 - (c.toe_angle_deg as number);
      const ratio = t / (c.rho_mm as number);
      const aOverT = (c.a_mm as number) / t;
      if (anthesCruciformOutside(ratio, flank, aOverT, 0).length) return [];
      return [
        {
          convexity: c.convexity_mm as number,
          error: anthesCruciformBending(ratio, flank, aOverT, 0) / (c.kt_bending_fe as number) - 1,
        },
      ];
    });

  it('Anthes (1993), s = 0, agrees within ±3 % on convex faces inside its validity', (ctx) => {
    needData(ctx);
    const e = summarise(
      inRange()
        .filter((c) => c.convexity >= 0.05)
        .map((c) => c.error),
    );
    report('Anthes cruciform bending vs FE, convex faces', e);
    expect(e.n).toBeGreaterThan(200);
    expect(e.worst).toBeLessThanOrEqual(0.03);
  });

  it('on flat or concave faces it reads high, about +10 % (notch reference §4): the engine flags those faces', (ctx) => {
    needData(ctx);
    const e = summarise(
      inRange()
        .filter((c) => c.convexity < 0.05)
        .map((c) => c.error),
    );
    report('Anthes cruciform bending vs FE, flat or concave faces', e);
    expect(e.n).toBeGreaterThan(100);
    expect(e.medianSigned).toBeGreaterThan(0.05);
    expect(e.medianSigned).toBeLessThan(0.15);
  });
});
