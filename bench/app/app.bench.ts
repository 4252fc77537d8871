// npm run bench:app — what the tablet pays to open Beadbook:
//  1. first-paint JavaScript: gzip bytes of the entry chunk and everything it imports statically (what
//     index.html makes the browser load before the first screen); budget 50 KiB, exit code 1 above it;
//  2. offline cold start: Chromium started afresh on a profile where the app is installed, the server stopped
//     and the network off, CPU slowed 4x (CDP Emulation.setCPUThrottlingRate); time from navigation start to
//     the usable first screen (the later of the app's 'beadbook:first-screen' mark and first contentful
//     paint), median of 5 launches;
//  3. long tasks (over 50 ms) on the main thread during those cold starts;
//  4. long tasks while 10,000 readings are entered one after the other on the Gauge screen, each through the
//     screen's own Save (bench/app/entry.ts says how); exit code 1 when any main-thread task there exceeds 50 ms.
//     BEADBOOK_BENCH_ENTRIES sets another count, BEADBOOK_BENCH_ENTRY_CPU a CPU slowdown for that run (default 1).
// Prints one JSON line.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import type { BrowserContext } from 'playwright-core';
import { buildApp, eagerChunks, readBuildManifest } from '../../test/e2e/support/build-app.js';
import {
  firstPage,
  launchChromium,
  newProfileDir,
  removeProfileDir,
} from '../../test/e2e/support/chromium.js';
import { BENCH_DIST, ROOT } from '../../test/e2e/support/paths.js';
import { serveStatic } from '../../test/e2e/support/static-server.js';
import { benchEntries } from './entry.js';
import { installLongTaskObserver, longTasksSince, round, type LongTaskSummary } from './longtasks.js';

const FIRST_PAINT_JS_BUDGET_BYTES = 50 * 1024;
const RUNS = 5;
const CPU_SLOWDOWN = 4;
const FIRST_SCREEN_MARK = 'beadbook:first-screen';
const ENTRIES = Number(process.env['BEADBOOK_BENCH_ENTRIES'] ?? 10_000);
const ENTRY_CPU_SLOWDOWN = Number(process.env['BEADBOOK_BENCH_ENTRY_CPU'] ?? 1);
const LONG_TASK_LIMIT_MS = 50;

interface FileSize {
  readonly file: string;
  readonly bytes: number;
  readonly gzipBytes: number;
}

interface ColdStart {
  readonly firstScreenMs: number;
  readonly markMs: number;
  readonly fcpMs: number;
  readonly longTasks: LongTaskSummary;
}

function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  const value = sorted.length % 2 ? sorted[mid] : ((sorted[mid - 1] ?? 0) + (sorted[mid] ?? 0)) / 2;
  return round(value ?? Number.NaN);
}

function sizeOf(dir: string, file: string): FileSize {
  const bytes = readFileSync(join(dir, file));
  return { file, bytes: bytes.length, gzipBytes: gzipSync(bytes, { level: 9 }).length };
}

function firstPaintFiles(dir: string): { js: FileSize[]; css: FileSize[] } {
  const chunks = eagerChunks(readBuildManifest(dir));
  // Cross-check with what index.html really references: a script or preload the manifest walk missed
  // would make the figure too small.
  const html = readFileSync(join(dir, 'index.html'), 'utf8');
  const referenced = [...html.matchAll(/<(?:script|link)[^>]+(?:src|href)="\/([^"]+\.js)"/g)].map(
    (m) => m[1],
  );
  const known = new Set(chunks.map((chunk) => chunk.file));
  const missed = referenced.filter((file) => file !== undefined && !known.has(file));
  if (missed.length > 0)
    throw new Error(`index.html loads chunks outside the manifest walk: ${missed.join(', ')}`);
  return {
    js: chunks.map((chunk) => sizeOf(dir, chunk.file)),
    css: [...new Set(chunks.flatMap((chunk) => chunk.css ?? []))].map((file) => sizeOf(dir, file)),
  };
}

async function coldStart(profile: string, origin: string): Promise<ColdStart> {
  const context: BrowserContext = await launchChromium(profile);
  try {
    await context.setOffline(true);
    await installLongTaskObserver(context);
    const page = await firstPage(context);
    const cdp = await context.newCDPSession(page);
    await cdp.send('Emulation.setCPUThrottlingRate', { rate: CPU_SLOWDOWN });
    await page.goto(origin, { waitUntil: 'load' });
    await page.waitForFunction(
      `performance.getEntriesByName(${JSON.stringify(FIRST_SCREEN_MARK)}, 'mark').length > 0 &&
       performance.getEntriesByName('first-contentful-paint').length > 0`,
      undefined,
      { timeout: 60_000 },
    );
    const timing = await page.evaluate<{ mark: number; fcp: number; controlled: boolean }>(`({
      mark: performance.getEntriesByName(${JSON.stringify(FIRST_SCREEN_MARK)}, 'mark')[0].startTime,
      fcp: performance.getEntriesByName('first-contentful-paint')[0].startTime,
      controlled: navigator.serviceWorker.controller !== null,
    })`);
    // Offline and no server: only the service worker can have served the page, but say so if not.
    if (!timing.controlled) throw new Error('the cold start was not served by the service worker');
    const longTasks = await longTasksSince(page, 0);
    return {
      firstScreenMs: round(Math.max(timing.mark, timing.fcp)),
      markMs: round(timing.mark),
      fcpMs: round(timing.fcp),
      longTasks,
    };
  } finally {
    await context.close();
  }
}

async function main(): Promise<number> {
  const pkg = JSON.parse(readFileSync(join(ROOT, 'package.json'), 'utf8')) as { version: string };
  const build = await buildApp(join(BENCH_DIST, 'app'), pkg.version);
  const files = firstPaintFiles(build.dir);
  const jsGzip = files.js.reduce((sum, file) => sum + file.gzipBytes, 0);

  const server = await serveStatic(build.dir);
  const profile = await newProfileDir();
  const runs: ColdStart[] = [];
  let entry;
  try {
    // Install: open once online so the service worker precaches the app, then take everything away.
    const context = await launchChromium(profile);
    const page = await firstPage(context);
    await page.goto(server.origin);
    await page.waitForFunction('navigator.serviceWorker.controller !== null', undefined, { timeout: 60_000 });
    await context.close();
    await server.stop();
    for (let i = 0; i < RUNS; i++) runs.push(await coldStart(profile, server.origin));
    // Entering readings: online, on a profile of its own.
    await server.start();
    entry = await benchEntries(server.origin, ENTRIES, ENTRY_CPU_SLOWDOWN);
  } finally {
    await server.stop();
    await removeProfileDir(profile);
  }

  const withinBudget = jsGzip <= FIRST_PAINT_JS_BUDGET_BYTES;
  const entryWithinLimit = entry.longTasks.maxMs <= LONG_TASK_LIMIT_MS;
  const result = {
    bench: 'app',
    firstPaintJs: {
      gzipBytes: jsGzip,
      budgetBytes: FIRST_PAINT_JS_BUDGET_BYTES,
      withinBudget,
      files: files.js,
    },
    firstPaintCss: { gzipBytes: files.css.reduce((sum, file) => sum + file.gzipBytes, 0), files: files.css },
    offlineColdStart: {
      cpuSlowdown: CPU_SLOWDOWN,
      runs: RUNS,
      medianMs: median(runs.map((run) => run.firstScreenMs)),
      runsMs: runs.map((run) => run.firstScreenMs),
      markMedianMs: median(runs.map((run) => run.markMs)),
      fcpMedianMs: median(runs.map((run) => run.fcpMs)),
    },
    longTasksDuringColdStart: {
      countMedian: median(runs.map((run) => run.longTasks.count)),
      totalMsMedian: median(runs.map((run) => run.longTasks.totalMs)),
      maxMs: Math.max(...runs.map((run) => run.longTasks.maxMs)),
    },
    longTasksWhileEntering: { ...entry, limitMs: LONG_TASK_LIMIT_MS, withinLimit: entryWithinLimit },
  };
  process.stdout.write(`${JSON.stringify(result)}\n`);
  if (!withinBudget) {
    process.stderr.write(
      `first-paint JavaScript is ${jsGzip} bytes gzipped, over the ${FIRST_PAINT_JS_BUDGET_BYTES}-byte budget\n`,
    );
    return 1;
  }
  if (!entryWithinLimit) {
    process.stderr.write(
      `entering ${entry.entries} readings: the longest main-thread task took ${entry.longTasks.maxMs} ms (${entry.longTasks.over50ms} over ${LONG_TASK_LIMIT_MS} ms)\n`,
    );
    return 1;
  }
  return 0;
}

main().then(
  (code) => {
    process.exitCode = code;
  },
  (error: unknown) => {
    process.stderr.write(
      `bench:app failed: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}\n`,
    );
    process.exitCode = 2;
  },
);
