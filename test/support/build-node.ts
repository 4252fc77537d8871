// Compiles the command line and the Node grading worker (tsc -b tsconfig.node.json) so tests run fresh output.
// Test files run in parallel processes: a lock directory keeps two builds from writing dist/node at once.
import { execFileSync } from 'node:child_process';
import { mkdirSync, rmSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { setTimeout as sleep } from 'node:timers/promises';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../../', import.meta.url));
export const CLI_MAIN = join(ROOT, 'dist/node/src/cli/main.js');
export const NODE_WORKER = join(ROOT, 'dist/node/workers/node-grade.worker.js');

const LOCK = join(ROOT, '.tsbuild', 'test-build.lock');
const STALE_MS = 5 * 60_000;
const GIVE_UP_MS = 3 * 60_000;

async function acquire(): Promise<void> {
  mkdirSync(join(ROOT, '.tsbuild'), { recursive: true });
  const started = Date.now();
  for (;;) {
    try {
      mkdirSync(LOCK);
      return;
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'EEXIST') throw e;
    }
    try {
      // A lock left by a crashed run would block every later run.
      if (Date.now() - statSync(LOCK).mtimeMs > STALE_MS) rmSync(LOCK, { recursive: true, force: true });
    } catch {
      // Released between the two calls: try again.
    }
    if (Date.now() - started > GIVE_UP_MS) throw new Error(`another test run holds ${LOCK}`);
    await sleep(100);
  }
}

export async function buildNode(): Promise<void> {
  await acquire();
  try {
    execFileSync('npx', ['tsc', '-b', 'tsconfig.node.json'], { cwd: ROOT, stdio: 'pipe', encoding: 'utf8' });
    execFileSync('node', ['scripts/bin-mode.mjs'], { cwd: ROOT, stdio: 'pipe', encoding: 'utf8' });
  } catch (e) {
    const out = e as { stdout?: string; stderr?: string; message: string };
    throw new Error(
      `tsc -b tsconfig.node.json failed:\n${out.stdout ?? ''}${out.stderr ?? ''}${out.message}`,
    );
  } finally {
    rmSync(LOCK, { recursive: true, force: true });
  }
}

/** Build timeout for beforeAll: a cold tsc -b takes several seconds. */
export const BUILD_TIMEOUT_MS = 180_000;
