// The grading API across a real worker_threads boundary, as the compiled Node worker exposes it with comlink.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { wrap, type Remote } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { gradeSeam, parseSeamFile, type SeamFile } from '../../src/domain/index.js';
import type { GradeApi } from '../../workers/grade-api.js';
import { BUILD_TIMEOUT_MS, buildNode, NODE_WORKER, ROOT } from '../support/build-node.js';

const example = JSON.parse(
  readFileSync(join(ROOT, 'docs/examples/deck-splice-butt.json'), 'utf8'),
) as unknown;

let worker: Worker | undefined;
let api: Remote<GradeApi>;

beforeAll(async () => {
  await buildNode();
  worker = new Worker(NODE_WORKER);
  api = wrap<GradeApi>(nodeEndpoint(worker));
}, BUILD_TIMEOUT_MS);

afterAll(async () => {
  await worker?.terminate();
});

function validExample(): SeamFile {
  const parsed = parseSeamFile(example);
  if (!parsed.ok) throw new Error('the example file does not validate');
  return parsed.value;
}

describe('grade() in the Node worker', () => {
  it('returns the same grade as gradeSeam in this process', async () => {
    const reply = await api.grade(example);
    if (!reply.ok) throw new Error(`refused: ${JSON.stringify(reply.problems)}`);
    expect(reply.grade).toEqual(gradeSeam(validExample()));
    expect(reply.grade.levelMet).toBe('D');
  });

  it('returns problems, not a grade, for an invalid file', async () => {
    const file = structuredClone(example) as { seam: { plate1: { thickness: unknown } } };
    file.seam.plate1.thickness = '12 mm';
    const reply = await api.grade(file);
    expect(reply.ok).toBe(false);
    if (reply.ok) return;
    expect(reply.problems).toEqual([
      {
        path: 'seam.plate1.thickness',
        message: 'must be a number in mm (write 12, not "12 mm"); got "12 mm"',
      },
    ]);
  });

  it('applies a verified limits table sent along', async () => {
    const table = {
      format: 'beadbook.limits/1',
      edition: 'ISO 5817:2014',
      name: 'Worker table',
      verifiedBy: 'Test QA',
      verifiedOn: '2026-10-01',
      // ISO 5817:2014 Table 1 row 1.12 (butt weld), the values already built in: α ≥ 90°, 110°, 150° at D, C, B.
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
    const reply = await api.grade(example, table);
    if (!reply.ok) throw new Error(`refused: ${JSON.stringify(reply.problems)}`);
    expect(reply.grade.unverifiedRows).toEqual(['3.1-plates']);
    expect(reply.grade.verifiedTable?.name).toBe('Worker table');
  });

  it('refuses a limits table that does not validate', async () => {
    const reply = await api.grade(example, { format: 'beadbook.limits/1' });
    expect(reply.ok).toBe(false);
    if (reply.ok) return;
    expect(reply.problems.map((p) => p.path)).toContain('edition');
  });
});

describe('validate() in the Node worker', () => {
  it('returns no problems for a valid file', async () => {
    expect(await api.validate(example)).toEqual([]);
  });

  it('returns the problems of an invalid file', async () => {
    expect(await api.validate(null)).toEqual([
      { path: '(file)', message: 'seam file must be an object, got null' },
    ]);
  });

  it('answers like parseSeamFile in this process', async () => {
    const file = structuredClone(example) as { readings: { round: number }[] };
    (file.readings[0] as { round: number }).round = 7;
    const local = parseSeamFile(file);
    expect(local.ok).toBe(false);
    expect(await api.validate(file)).toEqual(local.ok ? [] : local.problems);
  });
});
