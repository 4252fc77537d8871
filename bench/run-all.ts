// npm run bench: every bench in turn, each in its own process so one's heap and JIT state do not colour the next.
// A bench that misses its target exits non-zero; the rest still run, and the summary names what missed.
import { spawnSync } from 'node:child_process';
import { join } from 'node:path';

const DIST = import.meta.dirname;
const BENCHES = [
  'grade.bench.js',
  'assess.bench.js',
  'ingest.bench.js',
  'import.bench.js',
  'tag-decode.bench.js',
  'review.bench.js',
  join('app', 'app.bench.js'),
];

const missed: string[] = [];
for (const bench of BENCHES) {
  process.stdout.write(`\n== ${bench}\n`);
  const run = spawnSync(process.execPath, [join(DIST, bench)], { stdio: 'inherit' });
  if (run.status !== 0) missed.push(`${bench} (exit ${run.status ?? run.signal ?? 'unknown'})`);
}
process.stdout.write(
  missed.length ? `\nbench: missed or failed: ${missed.join(', ')}\n` : '\nbench: every target met\n',
);
process.exitCode = missed.length ? 1 : 0;
