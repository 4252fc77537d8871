// Builds the app with Vite in a child process: a clean NODE_ENV=production build exactly as `vite build` makes
// it, whatever environment the caller (vitest, the bench) runs in. BEADBOOK_VERSION stamps the version, so two
// builds of the same source differ the way two deploys do.
import { spawn } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { ROOT } from './paths.js';

export interface AppBuild {
  readonly dir: string;
  readonly version: string;
}

/** One chunk of Vite's build manifest (dist/.vite/manifest.json), the fields we read. */
export interface ManifestChunk {
  readonly file: string;
  readonly isEntry?: boolean;
  readonly isDynamicEntry?: boolean;
  readonly imports?: readonly string[];
  readonly dynamicImports?: readonly string[];
  readonly css?: readonly string[];
}

export async function buildApp(outDir: string, version: string): Promise<AppBuild> {
  await viteBuild(['--outDir', outDir, '--emptyOutDir', '--manifest'], { BEADBOOK_VERSION: version });
  return { dir: outDir, version };
}

/** `vite build` with the given arguments, run from the repository root. */
export async function viteBuild(
  args: readonly string[],
  env: Readonly<Record<string, string>> = {},
): Promise<void> {
  const vite = join(ROOT, 'node_modules', 'vite', 'bin', 'vite.js');
  const output: string[] = [];
  const code = await new Promise<number | null>((resolve, reject) => {
    const child = spawn(process.execPath, [vite, 'build', ...args, '--logLevel', 'warn'], {
      cwd: ROOT,
      env: { ...process.env, NODE_ENV: 'production', ...env },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    child.stdout.on('data', (chunk: Buffer) => output.push(chunk.toString()));
    child.stderr.on('data', (chunk: Buffer) => output.push(chunk.toString()));
    child.on('error', reject);
    child.on('close', resolve);
  });
  if (code !== 0)
    throw new Error(`vite build ${args.join(' ')} failed (exit ${String(code)}):\n${output.join('')}`);
}

export function readBuildManifest(dir: string): Record<string, ManifestChunk> {
  return JSON.parse(readFileSync(join(dir, '.vite', 'manifest.json'), 'utf8')) as Record<
    string,
    ManifestChunk
  >;
}

/** The chunk index.html loads, and every chunk it imports statically: what the first paint waits for. */
export function eagerChunks(manifest: Record<string, ManifestChunk>): ManifestChunk[] {
  const entry = Object.values(manifest).find((chunk) => chunk.isEntry);
  if (!entry) throw new Error('the build manifest has no entry chunk');
  const seen = new Map<string, ManifestChunk>();
  const visit = (chunk: ManifestChunk): void => {
    if (seen.has(chunk.file)) return;
    seen.set(chunk.file, chunk);
    for (const key of chunk.imports ?? []) {
      const imported = manifest[key];
      if (imported) visit(imported);
    }
  };
  visit(entry);
  return [...seen.values()];
}

/** Chunks loaded only through import(): the lazy screens and panels. */
export function lazyChunks(manifest: Record<string, ManifestChunk>): ManifestChunk[] {
  return Object.values(manifest).filter((chunk) => chunk.isDynamicEntry === true);
}
