// `beadbook import` and `beadbook profile` run as a QA desk runs them: a child process, its exit code and JSON.
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, rmSync, writeFileSync, openSync, writeSync, closeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildNode, BUILD_TIMEOUT_MS, CLI_MAIN, ROOT } from '../support/build-node.js';
import { weldProfile } from '../support/weld-profile.js';

const TABLE = 'test/fixtures/import/line3-scan.csv';
const MAPPING = 'test/fixtures/import/line3-mapping.json';
const SEAM = 'docs/examples/deck-splice-butt.json';

interface Run {
  readonly status: number | null;
  readonly stdout: string;
  readonly stderr: string;
}
const run = (args: readonly string[]): Run => {
  const r = spawnSync(process.execPath, [CLI_MAIN, ...args], {
    cwd: ROOT,
    encoding: 'utf8',
    maxBuffer: 64 << 20,
  });
  if (r.error) throw r.error;
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
};

let tmp = '';
beforeAll(async () => {
  await buildNode();
  tmp = mkdtempSync(join(tmpdir(), 'beadbook-import-'));
}, BUILD_TIMEOUT_MS);
afterAll(() => rmSync(tmp, { recursive: true, force: true }));

describe('beadbook import', () => {
  it('prints the readings, the quarantined rows with lines and reasons, the hash and the grade (exit 0)', () => {
    const r = run(['import', TABLE, '--mapping', MAPPING, '--seam', SEAM, '--json']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as {
      sha256: string;
      readings: {
        id: string;
        values: Record<string, number>;
        source: { importId: string };
        instrument: { id: string };
      }[];
      quarantine: { line: number; reason: string }[];
      dataRows: number;
      grade: { levelMet: string | null; caution: string };
      importId: string;
    };
    expect(out.sha256).toBe(
      createHash('sha256')
        .update(readFileSync(join(ROOT, TABLE)))
        .digest('hex'),
    );
    expect(out.dataRows).toBe(5);
    expect(out.quarantine).toEqual([
      { line: 5, reason: '"Angle L [deg]": holds "NaN": the scanner found no value' },
      { line: 6, reason: '"Radius R [mm]": toeRadius -0.2 mm must be greater than 0 mm' },
    ]);
    // Three rows, each: plate 1's toe, plate 2's toe and the cross-section.
    expect(out.readings).toHaveLength(9);
    expect(out.readings[0]?.values).toEqual({ toeAngle: 152.5, toeRadius: 1.2, undercutDepth: 0.05 });
    expect(
      out.readings.every((x) => x.source.importId === out.importId && x.instrument.id === 'L3-SCAN'),
    ).toBe(true);
    expect(out.grade.levelMet).toMatch(/^(B|C|D|belowD)$/);
  });

  it('maps the columns by their header words when no mapping is given', () => {
    const r = run(['import', TABLE, '--json']);
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as { mappingSuggested: boolean; columns: { target: string }[] };
    expect(out.mappingSuggested).toBe(true);
    expect(out.columns.map((c) => c.target)).toEqual([
      'plate1.toeAngle',
      'plate2.toeAngle',
      'plate1.toeRadius',
      'plate2.toeRadius',
      'reinforcementHeight',
      'reinforcementWidth',
      'plate1.undercutDepth',
      'linearMisalignment',
    ]);
  });

  it('refuses an empty file with exit 2 and says why in the JSON', () => {
    const f = join(tmp, 'empty.csv');
    writeFileSync(f, '');
    const r = run(['import', f, '--json']);
    expect(r.status).toBe(2);
    expect(JSON.parse(r.stdout)).toMatchObject({ refused: { message: 'The file is empty.' }, bytes: 0 });
  });

  it('refuses a 200 MB file, written here, by the stated size limit (exit 2)', () => {
    const f = join(tmp, 'huge.csv');
    const fd = openSync(f, 'w');
    const block = Buffer.from('10;150,5;148;2,1;14\n'.repeat(52_429));
    writeSync(fd, 'Position;Angle L;Angle R;Height;Width\n');
    for (let written = 0; written < 200 * 1024 * 1024; written += block.length) writeSync(fd, block);
    closeSync(fd);
    const r = run(['import', f, '--json']);
    expect(r.status).toBe(2);
    const out = JSON.parse(r.stdout) as { refused: { message: string } };
    expect(out.refused.message).toMatch(/^The file is 200\.0 MiB; at most 64\.0 MiB is accepted/);
    rmSync(f);
  });

  it('refuses a mapping file that is not a mapping, naming the field (exit 2)', () => {
    const f = join(tmp, 'bad-mapping.json');
    writeFileSync(f, JSON.stringify({ format: 'beadbook.import-mapping/1', columns: { height: 'Height' } }));
    const r = run(['import', TABLE, '--mapping', f]);
    expect(r.status).toBe(2);
    expect(r.stderr).toContain('columns.height');
  });
});

describe('beadbook profile', () => {
  it('prints per slice the geometry and fit quality, with flagged slices named (exit 0)', () => {
    const lines = ['slice_mm,x_mm,z_mm'];
    const shapes = [
      { position: 100, shape: { height: 2, flank: 30, toeRadius: 1, spacing: 0.05 } },
      { position: 110, shape: { height: 1.5, flank: 25, toeRadius: 1.5, spacing: 0.05, offset: 0.6 } },
      { position: 120, shape: { height: 2, flank: 30, toeRadius: 1, spacing: 0.05, noise: 0.06, seed: 5 } },
    ];
    for (const { position, shape } of shapes) {
      const { x, z } = weldProfile(shape);
      for (let i = 0; i < x.length; i++)
        lines.push(`${position},${(x[i] ?? 0).toFixed(4)},${(z[i] ?? 0).toFixed(5)}`);
    }
    const f = join(tmp, 'profiles.csv');
    writeFileSync(f, `${lines.join('\n')}\n`);
    const r = run(['profile', f, '--json']);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
    const out = JSON.parse(r.stdout) as {
      slices: {
        position: number;
        flagged: boolean;
        quality: number;
        toes: { flankAngle: number; toeRadius: number }[];
        reinforcementHeight: number;
        linearMisalignment: number;
      }[];
      readings: unknown[];
      flagged: number;
    };
    expect(out.slices.map((s) => [s.position, s.flagged])).toEqual([
      [100, false],
      [110, false],
      [120, true],
    ]);
    expect(out.slices[0]?.toes[0]?.flankAngle).toBeCloseTo(30, 0);
    expect(out.slices[0]?.reinforcementHeight).toBeCloseTo(2, 2);
    expect(out.slices[1]?.linearMisalignment).toBeCloseTo(0.6, 2);
    expect(out.flagged).toBe(1);
    // Two readings (one per toe) for each slice that is not flagged.
    expect(out.readings).toHaveLength(4);
  });

  it('refuses a file without x and z columns (exit 2)', () => {
    const f = join(tmp, 'nox.csv');
    writeFileSync(f, 'a,b,c,d\n1,2,3,4\n');
    const r = run(['profile', f, '--json']);
    expect(r.status).toBe(2);
    expect((JSON.parse(r.stdout) as { refused: { message: string } }).refused.message).toMatch(
      /^No x and z columns found/,
    );
  });
});
