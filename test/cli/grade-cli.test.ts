// The compiled command-line grader, run as a user runs it: a child process, its exit code, stdout and stderr.
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync, truncateSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SeamGrade } from '../../src/domain/index.js';
import { BUILD_TIMEOUT_MS, buildNode, CLI_MAIN, ROOT } from '../support/build-node.js';

const EXAMPLE = 'docs/examples/deck-splice-butt.json';
const BAD_FIXTURES = join(ROOT, 'test/fixtures/bad-seam-files');

interface Run {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
}

function run(
  args: readonly string[],
  command = process.execPath,
  prefix: readonly string[] = [CLI_MAIN],
): Run {
  const r = spawnSync(command, [...prefix, ...args], { cwd: ROOT, encoding: 'utf8' });
  if (r.error) throw r.error;
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** Refused input: exit 2, the reason on stderr, nothing on stdout. */
function expectRefused(r: Run, ...fragments: string[]): void {
  expect(r.stdout).toBe('');
  for (const f of fragments) expect(r.stderr).toContain(f);
  expect(r.status).toBe(2);
}

let tmp = '';

beforeAll(async () => {
  await buildNode();
  tmp = mkdtempSync(join(tmpdir(), 'beadbook-cli-'));
}, BUILD_TIMEOUT_MS);

afterAll(() => {
  if (tmp) rmSync(tmp, { recursive: true, force: true });
});

// A verified table for one row, with the values the built-in table already holds for ISO 5817:2014 Table 1
// row 1.12 (butt weld): α ≥ 90° at D, 110° at C, 150° at B. Only the row's verification status changes.
const verifiedToeTable = {
  format: 'beadbook.limits/1',
  edition: 'ISO 5817:2014',
  name: 'Yard table 2026-1',
  verifiedBy: 'Test QA',
  verifiedOn: '2026-10-01',
  rows: [
    {
      id: '1.12-butt',
      bands: [
        {
          levels: {
            D: { kind: 'minAngle', deg: 90 },
            C: { kind: 'minAngle', deg: 110 },
            B: { kind: 'minAngle', deg: 150 },
          },
        },
      ],
    },
  ],
};

describe('beadbook grade on the example file', () => {
  it('exits 0 and prints the edition, the level met and a caution line', () => {
    const r = run(['grade', EXAMPLE]);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('ISO 5817:2014 (built-in limits; 2 row(s) in play unverified)');
    expect(r.stdout).toContain('Seam KP-B3-DS-014');
    // The EXC2 preset (EN 1090-2 execution class, as mapped in the presets) asks level C. Excess weld metal at 400 mm: h = 3.4 mm with b = 15 mm. ISO 5817:2014 Table 1 row 1.9:
    // C allows 1 mm + 0.15·b = 3.25 mm (fails), D allows 1 mm + 0.25·b = 4.75 mm (meets).
    expect(r.stdout).toContain(
      'Result: level met D, required C — DOES NOT MEET the required level (round 1)',
    );
    expect(r.stdout).toContain(
      'Worst position: 400 mm — Excess weld metal (butt weld): 3.4 mm against 3.25 mm',
    );
    expect(r.stdout).toContain('Unverified rows (recalled values): 1.12-butt, 3.1-plates');
    expect(r.stdout).toMatch(/\nCaution: Quality levels are graded against ISO 5817 limits/);
  });

  it('prints the whole grade as JSON with --json', () => {
    const r = run(['grade', EXAMPLE, '--json']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const g = JSON.parse(r.stdout) as SeamGrade;
    expect(g.edition).toBe('ISO 5817:2014');
    expect(g.levelMet).toBe('D');
    expect(g.requiredLevel).toBe('C');
    expect(g.meetsRequired).toBe(false);
    expect(g.rounds.map((x) => x.round)).toEqual([1]);
    expect(g.rounds[0]?.supersededReadings).toEqual(['r-0007']);
    expect(g.unverifiedRows).toEqual(['1.12-butt', '3.1-plates']);
    expect(g.verifiedTable).toBeNull();
    expect(g.caution.length).toBeGreaterThan(0);
  });

  it('takes --json before the file too', () => {
    const r = run(['grade', '--json', EXAMPLE]);
    expect(r.status).toBe(0);
    expect((JSON.parse(r.stdout) as SeamGrade).levelMet).toBe('D');
  });
});

describe('beadbook grade --limits', () => {
  it('marks the rows of a verified table as verified: they leave the unverified list', () => {
    const limits = join(tmp, 'yard-table.json');
    writeFileSync(limits, JSON.stringify(verifiedToeTable));
    const text = run(['grade', EXAMPLE, '--limits', limits]);
    expect(text.stderr).toBe('');
    expect(text.status).toBe(0);
    expect(text.stdout).toContain(
      'ISO 5817:2014 (verified table "Yard table 2026-1"; 1 row(s) in play unverified)',
    );
    expect(text.stdout).toContain('Unverified rows (recalled values): 3.1-plates\n');
    const json = run(['grade', EXAMPLE, '--json', '--limits', limits]);
    const g = JSON.parse(json.stdout) as SeamGrade;
    expect(g.unverifiedRows).toEqual(['3.1-plates']);
    expect(g.verifiedTable).toEqual({
      name: 'Yard table 2026-1',
      verifiedBy: 'Test QA',
      verifiedOn: '2026-10-01',
    });
    // Same limits as built in, so the same result.
    expect(g.levelMet).toBe('D');
  });

  it('refuses a table for a row that does not exist, naming the row', () => {
    const limits = join(tmp, 'unknown-row.json');
    writeFileSync(
      limits,
      JSON.stringify({ ...verifiedToeTable, rows: [{ ...verifiedToeTable.rows[0], id: '9.9' }] }),
    );
    expectRefused(
      run(['grade', EXAMPLE, '--limits', limits]),
      'Limit table',
      'rows[0].id',
      'unknown row "9.9"',
    );
  });

  it('refuses a table for the other edition', () => {
    const limits = join(tmp, 'other-edition.json');
    writeFileSync(limits, JSON.stringify({ ...verifiedToeTable, edition: 'ISO 5817:2023' }));
    expectRefused(
      run(['grade', EXAMPLE, '--limits', limits]),
      'edition: the table is for ISO 5817:2023; the seam asks ISO 5817:2014',
    );
  });
});

describe('beadbook refuses bad input with exit 2, the reason on stderr and nothing on stdout', () => {
  it('an invalid seam file, naming the path of the problem', () => {
    const r = run(['grade', join(BAD_FIXTURES, 'thickness-as-string.json')]);
    expectRefused(r, 'is not valid (1 problem)', 'seam.plate1.thickness: must be a number in mm');
  });

  it('an array instead of a seam file', () => {
    expectRefused(
      run(['grade', join(BAD_FIXTURES, 'whole-file-array.json')]),
      '(file): seam file must be an object',
    );
  });

  it('text that is not JSON', () => {
    const file = join(tmp, 'truncated.json');
    writeFileSync(file, '{"format": "beadbook.seam/1", "units": {');
    expectRefused(run(['grade', file]), `Seam file "${file}" is not valid JSON`);
  });

  it('an empty file', () => {
    const file = join(tmp, 'empty.json');
    writeFileSync(file, '');
    expectRefused(run(['grade', file]), 'is not valid JSON');
  });

  it('a file that does not exist', () => {
    expectRefused(run(['grade', join(tmp, 'no-such-seam.json')]), 'cannot be read: no such file');
  });

  it('a file over the size limit, without reading it', () => {
    const file = join(tmp, 'huge.json');
    writeFileSync(file, '');
    // Sparse: the size is set, no data is written. The limit is MAX_FILE_BYTES in src/cli/grade-command.ts.
    truncateSync(file, 64 * 1024 * 1024 + 1);
    expectRefused(run(['grade', file]), 'at most 64.0 MiB is accepted');
  });

  it('an unknown command', () => {
    expectRefused(run(['frobnicate', EXAMPLE]), 'unknown command "frobnicate"', 'Usage:');
  });

  it('grade without a file', () => {
    expectRefused(run(['grade']), 'grade takes exactly one seam file');
  });

  it('grade with two files', () => {
    expectRefused(run(['grade', EXAMPLE, EXAMPLE]), 'grade takes exactly one seam file');
  });

  it('an unknown option', () => {
    expectRefused(run(['grade', EXAMPLE, '--level', 'B']), "Unknown option '--level'");
  });

  it('a missing limits file', () => {
    expectRefused(
      run(['grade', EXAMPLE, '--limits', join(tmp, 'nope.json')]),
      'Limit table',
      'cannot be read',
    );
  });
});

describe('help', () => {
  it('--help prints the usage and exits 0', () => {
    const r = run(['--help']);
    expect(r.status).toBe(0);
    expect(r.stdout).toContain('beadbook grade FILE [--json] [--limits LIMITS.json]');
  });

  it('no arguments at all exits 2 with the usage', () => {
    const r = run([]);
    expect(r.status).toBe(2);
    expect(r.stdout + r.stderr).toContain('Usage:');
  });
});

describe('npx beadbook from the repository root', () => {
  it("runs the package's own bin, with the same output as node dist/node/src/cli/main.js", () => {
    const viaNpx = run(['beadbook', 'grade', EXAMPLE], 'npx', []);
    const direct = run(['grade', EXAMPLE]);
    expect(viaNpx.stderr).toBe('');
    expect(viaNpx.status).toBe(0);
    expect(viaNpx.stdout).toBe(direct.stdout);
  });
});
