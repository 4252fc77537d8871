// The command-line grader prints the fatigue assessment with the grade: every part in --json, a short section
// with the caution in the readable output. Runs the compiled CLI on the example files, as a user would.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import {
  assessSeam,
  gradeSeam,
  INDICATIVE_CAUTION,
  parseSeamFile,
  type SeamAssessment,
  type SeamGrade,
} from '../../src/domain/index.js';
import { BUILD_TIMEOUT_MS, buildNode, CLI_MAIN, ROOT } from '../support/build-node.js';

const EXAMPLES = ['docs/examples/deck-splice-butt.json', 'docs/examples/bracket-fillet-site.json'];

function run(args: readonly string[]): { status: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [CLI_MAIN, ...args], { cwd: ROOT, encoding: 'utf8' });
  if (r.error) throw r.error;
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

beforeAll(async () => {
  await buildNode();
}, BUILD_TIMEOUT_MS);

describe.each(EXAMPLES)('beadbook grade %s', (example) => {
  it('--json includes the assessment, equal to assessSeam on the same file', () => {
    const r = run(['grade', '--json', example]);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as SeamGrade & { assessment: SeamAssessment };
    const parsed = parseSeamFile(JSON.parse(readFileSync(join(ROOT, example), 'utf8')));
    if (!parsed.ok) throw new Error('example does not validate');
    expect(out.assessment).toEqual(
      JSON.parse(JSON.stringify(assessSeam(parsed.value, gradeSeam(parsed.value)))),
    );
  });

  it('--json shows every part: km, toe ranking with crack site, FAT flag, life, effective notch, sensitivity, sampling', () => {
    const a = (JSON.parse(run(['grade', '--json', example]).stdout) as { assessment: SeamAssessment })
      .assessment;
    expect(a.misalignment.kmCalc).toBeGreaterThanOrEqual(1);
    expect(a.misalignment.kmEff).toBeGreaterThanOrEqual(1);
    expect(a.toes.toes.length).toBeGreaterThan(1);
    expect(a.toes.crackSite?.toe).toEqual(a.toes.toes[0]?.toe);
    expect(['meets', 'below']).toContain(a.fatigue.flag);
    expect('cycles' in a.fatigue.life).toBe(true);
    expect(a.effectiveNotch.fatEquivalent).toBeGreaterThan(0);
    expect(a.sensitivity.rows.length).toBeGreaterThan(0);
    expect(a.sampling.parameters.some((p) => p.count >= 2)).toBe(true);
    expect(a.caution).toBe(INDICATIVE_CAUTION);
  });

  it('the readable output has the assessment section and ends with the indicative caution', () => {
    const r = run(['grade', example]);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('Fatigue assessment (indicative;');
    expect(r.stdout).toMatch(/\nkm: \d/);
    expect(r.stdout).toContain('Toes, most likely crack site first:');
    expect(r.stdout).toMatch(/\nFAT: detail \d{3}/);
    expect(r.stdout).toContain('\nLife: ');
    expect(r.stdout).toContain('\nEffective notch: ');
    expect(r.stdout).toContain('Sampling (at-pitch readings only):');
    expect(r.stdout.trimEnd().endsWith(`Caution: ${INDICATIVE_CAUTION}`)).toBe(true);
  });
});

describe('the deck-splice example (one-sided butt weld, plates 10/12 mm, EXC2)', () => {
  it('earns IIW 216 (one side, no backing, root checked), and the crack site is a root-side toe', () => {
    const a = (
      JSON.parse(run(['grade', '--json', EXAMPLES[0] as string]).stdout) as { assessment: SeamAssessment }
    ).assessment;
    expect(a.fatigue.earned.details).toEqual(['216']);
    expect(a.toes.crackSite?.toe.side).toBe('root');
    expect(a.toes.note).toContain('puts the crack at the root');
  });
});
