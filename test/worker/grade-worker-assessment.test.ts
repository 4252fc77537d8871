// The grading worker's reply carries the assessment beside the grade, equal to assessSeam in this process.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Worker } from 'node:worker_threads';
import { wrap, type Remote } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assessSeam, gradeSeam, INDICATIVE_CAUTION, parseSeamFile } from '../../src/domain/index.js';
import type { GradeApi } from '../../workers/grade-api.js';
import { BUILD_TIMEOUT_MS, buildNode, NODE_WORKER, ROOT } from '../support/build-node.js';

const example = JSON.parse(
  readFileSync(join(ROOT, 'docs/examples/bracket-fillet-site.json'), 'utf8'),
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

describe('grade() in the Node worker', () => {
  it('replies with the assessment of the graded seam, with its caution', async () => {
    const reply = await api.grade(example);
    if (!reply.ok) throw new Error(`refused: ${JSON.stringify(reply.problems)}`);
    const parsed = parseSeamFile(example);
    if (!parsed.ok) throw new Error('example does not validate');
    expect(reply.assessment).toEqual(assessSeam(parsed.value, gradeSeam(parsed.value)));
    expect(reply.assessment.caution).toBe(INDICATIVE_CAUTION);
    expect(reply.assessment.fatigue.earned.details).toEqual(['511']);
  });
});
