// Repository paths for the browser tests and the app bench. These files also run compiled from dist/node, so
// the root is found by walking up to package.json rather than by a fixed relative path.
import { existsSync, readFileSync } from 'node:fs';
import { dirname, join } from 'node:path';
import { fileURLToPath } from 'node:url';

function findRoot(start: string): string {
  for (let dir = start; ; dir = dirname(dir)) {
    const pkg = join(dir, 'package.json');
    if (existsSync(pkg) && (JSON.parse(readFileSync(pkg, 'utf8')) as { name?: string }).name === 'beadbook') {
      return dir;
    }
    if (dirname(dir) === dir) throw new Error(`no beadbook package.json above ${start}`);
  }
}

export const ROOT = findRoot(dirname(fileURLToPath(import.meta.url)));
/** Builds made for browser tests; ignored by git, lint and prettier like the rest of dist/. */
export const E2E_DIST = join(ROOT, 'dist', 'e2e');
export const BENCH_DIST = join(ROOT, 'dist', 'bench');
