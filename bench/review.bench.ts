// npm run bench:review — the supervisor's review queue with 5,000 seams (BEADBOOK_BENCH_SEAMS for another count):
//  1. server: time to answer GET /supervisor/review (the first page of 50, default order), and with two flags, a
//     welder and a sort, over HTTP on loopback, median of 15;
//  2. browser: Chromium opens the queue signed in; time from navigation start to first contentful paint, median
//     of 5 fresh pages;
//  3. the same with 50 seams, so each figure is also given as a ratio to it (the cost of the yard's size);
//  4. review facts made per seam from real records (fold, grade, assessment): ms per seam over 200 seams.
// The 5,000 seams' review facts are written directly (varied welders, levels, flags, inspectors, decisions): the
// queue reads only that table. Exit code 1 when the 5,000-seam first paint exceeds 1 s (the queue must stay
// responsive). Prints one JSON line.
import { serve, type ServerType } from '@hono/node-server';
import type { AddressInfo } from 'node:net';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createApp } from '../src/server/app.js';
import { ensureSupervisor } from '../src/server/bootstrap.js';
import { testConfig } from '../src/server/config.js';
import { memoryLogger } from '../src/server/log.js';
import { SqliteStorage } from '../src/server/storage/sqlite/sqlite-storage.js';
import type { ReviewFacts } from '../src/server/storage/types.js';
import { canonicalJson, RECORD_SCHEMA_VERSION } from '../src/protocol/index.js';
import { kestrelPointYard } from '../src/demo/kestrel-point-yard.js';
import { launchChromium, newProfileDir, removeProfileDir } from '../test/e2e/support/chromium.js';

const SEAMS = Number(process.env['BEADBOOK_BENCH_SEAMS'] ?? 5000);
const SMALL = 50;
const PASSWORD = 'bench supervisor password';
const FIRST_PAINT_LIMIT_MS = 1000;

const median = (xs: number[]): number => {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)] ?? NaN;
};
const round1 = (x: number) => Math.round(x * 10) / 10;

function facts(i: number): ReviewFacts {
  const rank = i % 4;
  const level = (['belowD', 'D', 'C', 'B'] as const)[rank] as string;
  const day = `2026-11-${String(1 + (i % 28)).padStart(2, '0')}`;
  return {
    seamId: `bench-${String(i).padStart(6, '0')}`,
    namespace: 'live',
    label: `Seam ${i} frame ${i % 90}`,
    tags: [`T-${i}`],
    organisation: 'Bench yard',
    area: `Bay ${i % 12}`,
    drawing: `D-${i % 300}`,
    welder: `W-${i % 40}`,
    procedure: `WPS-${i % 15}`,
    requiredLevel: 'C',
    edition: 'ISO 5817:2014',
    state: 'graded',
    levelMet: level,
    levelRank: rank,
    meetsRequired: rank >= 2,
    gradedRound: 1,
    latestRound: 1 + (i % 3 === 0 ? 1 : 0),
    readingCount: 10 + (i % 30),
    borderlineCount: i % 7 === 0 ? 1 + (i % 3) : 0,
    fatFlag: i % 11 === 0 ? 'below' : 'notAssessable',
    samplingAdequate: i % 5 !== 0,
    unverifiedRows: i % 4,
    deviceLevelMet: i % 13 === 0 ? 'B' : level,
    gradeMismatch: i % 13 === 0 && level !== 'B',
    inspectedFirst: day,
    inspectedLast: day,
    lastReceivedAt: `${day}T10:00:00.000Z`,
    basedOn: i + 1,
    gradedAt: `${day}T10:00:01.000Z`,
    computedAt: `${day}T10:00:02.000Z`,
    inspectors: [`Inspector ${i % 25}`],
  };
}

async function startServer(seams: number) {
  const dir = mkdtempSync(join(tmpdir(), 'beadbook-bench-review-'));
  const storage = SqliteStorage.open(join(dir, 'bench.sqlite'), { synchronous: 'NORMAL' });
  const config = testConfig({ host: '127.0.0.1', port: 0, dbFile: join(dir, 'bench.sqlite') });
  const log = memoryLogger();
  await ensureSupervisor(storage, { ...config, supervisorPassword: PASSWORD }, log, new Date(), () => {});
  const account = await storage.findAccount('supervisor');
  for (let i = 0; i < seams; i++) await storage.saveReviewFacts(facts(i));
  // A decision on every third seam (half of them before the newest record: "not yet reviewed" again).
  for (let i = 0; i < seams; i += 3) {
    const id = `d-${i}`;
    const change = await storage.addDecision({
      id,
      seamId: facts(i).seamId,
      round: 1,
      outcome: i % 2 ? 'accepted' : 'rework',
      comment: null,
      decidedBy: account?.id ?? 1,
      decidedByName: 'supervisor',
      decidedAt: '2026-11-30T10:00:00.000Z',
      basedOn: i % 2 ? i + 1 : i,
      serverLevelMet: facts(i).levelMet,
      jws: '{}',
      previousId: null,
      item: canonicalJson({ id }),
    });
    if (change.kind !== 'added') throw new Error('bench decision not added');
  }
  const { app, deps } = await createApp({ config, storage, log });
  const server: ServerType = await new Promise((resolve) => {
    const s = serve({ fetch: app.fetch, port: 0, hostname: '127.0.0.1' }, () => resolve(s));
  });
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const res = await fetch(`${origin}/api/session`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin },
    body: JSON.stringify({ username: 'supervisor', password: PASSWORD }),
  });
  const token = (res.headers.get('set-cookie') ?? '').split(';')[0]?.split('=')[1] ?? '';
  return {
    origin,
    token,
    deps,
    storage,
    async close() {
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await deps.reviewIndexer.idle();
      await storage.close();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

async function serverTimes(origin: string, token: string, path: string, runs = 15): Promise<number> {
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t = performance.now();
    const res = await fetch(`${origin}${path}`, { headers: { cookie: `beadbook_session=${token}` } });
    await res.text();
    if (res.status !== 200) throw new Error(`${path}: ${res.status}`);
    times.push(performance.now() - t);
  }
  return median(times.slice(2));
}

async function firstPaint(origin: string, token: string, runs = 5): Promise<number> {
  const profile = await newProfileDir();
  const context = await launchChromium(profile);
  try {
    await context.addCookies([{ name: 'beadbook_session', value: token, url: origin }]);
    const times: number[] = [];
    for (let i = 0; i < runs; i++) {
      const page = await context.newPage();
      await page.goto(`${origin}/supervisor/review`);
      await page.waitForFunction(() => performance.getEntriesByName('first-contentful-paint').length > 0);
      const fcp = await page.evaluate(
        () => performance.getEntriesByName('first-contentful-paint')[0]?.startTime ?? NaN,
      );
      const rows = await page.locator('table.queue tbody tr').count();
      if (rows < 1) throw new Error('the queue rendered no row');
      times.push(fcp);
      await page.close();
    }
    return median(times);
  } finally {
    await context.close();
    await removeProfileDir(profile);
  }
}

/** Review facts from real records: the demo-like seam graded and assessed, per seam. */
async function indexCost(): Promise<number> {
  const storage = SqliteStorage.open(':memory:');
  const config = testConfig();
  const log = memoryLogger();
  const { deps } = await createApp({ config, storage, log });
  const n = 200;
  const [file] = kestrelPointYard();
  if (!file) throw new Error('no demo seam');
  for (let i = 0; i < n; i++) {
    const seamId = `cost-${i}`;
    await storage.putSeam(
      {
        id: seamId,
        namespace: 'live',
        setup: canonicalJson({ ...file.seam, id: seamId }),
        createdAt: '2026-12-01T00:00:00Z',
      },
      null,
    );
    const records = [
      ...file.rounds.map((r) => ({
        id: `${seamId}/round/${r.number}`,
        kind: 'round',
        body: { seamId, number: r.number, kind: r.kind, startedAt: '2026-11-19T08:00:00Z' },
      })),
      ...file.rounds.flatMap((r) =>
        Object.entries(r.checklist).map(([item, answer]) => ({
          id: `${seamId}/${r.number}/${item}`,
          kind: 'checklistAnswer',
          body: { seamId, round: r.number, item, answer, answeredAt: '2026-11-19T08:00:00Z' },
        })),
      ),
      ...file.readings.map((r) => ({
        id: `${seamId}-${r.id}`,
        kind: 'reading',
        body: {
          seamId,
          reading: {
            ...r,
            id: `${seamId}-${r.id}`,
            ...(r.supersedes ? { supersedes: `${seamId}-${r.supersedes}` } : {}),
          },
        },
      })),
    ];
    await storage.insertServerRecords(
      records.map((r, k) => ({
        id: r.id,
        kind: r.kind,
        schemaVersion: RECORD_SCHEMA_VERSION,
        seamId,
        deviceSeq: k + 1,
        body: canonicalJson(r.body),
        deviceCreatedAt: '2026-11-19T08:00:00Z',
        receivedAt: '2026-12-01T00:00:00Z',
      })),
    );
    await deps.regrader.regrade(seamId);
  }
  await deps.regrader.idle();
  await deps.reviewIndexer.idle();
  const t = performance.now();
  for (let i = 0; i < n; i++) await deps.reviewIndexer.index(`cost-${i}`);
  const perSeam = (performance.now() - t) / n;
  const made = await storage.getReviewFacts('cost-0');
  if (!made) throw new Error('no facts made');
  await storage.close();
  return perSeam;
}

const FILTERED = '/supervisor/review?flag=unreviewed&flag=samplingShort&welder=W-7&sort=inspected&dir=desc';

async function measure(seams: number) {
  const s = await startServer(seams);
  try {
    return {
      seams,
      serverMs: round1(await serverTimes(s.origin, s.token, '/supervisor/review')),
      serverFilteredMs: round1(await serverTimes(s.origin, s.token, FILTERED)),
      lastPageMs: round1(
        await serverTimes(s.origin, s.token, `/supervisor/review?sort=label&page=${Math.ceil(seams / 50)}`),
      ),
      firstContentfulPaintMs: round1(await firstPaint(s.origin, s.token)),
    };
  } finally {
    await s.close();
  }
}

const small = await measure(SMALL);
const large = await measure(SEAMS);
const perSeamMs = await indexCost();
const ratio = (a: number, b: number) => Math.round((a / b) * 100) / 100;
const out = {
  bench: 'review-queue',
  large,
  small,
  ratios: {
    server: ratio(large.serverMs, small.serverMs),
    serverFiltered: ratio(large.serverFilteredMs, small.serverFilteredMs),
    firstContentfulPaint: ratio(large.firstContentfulPaintMs, small.firstContentfulPaintMs),
  },
  reviewFactsMsPerSeam: round1(perSeamMs),
  firstPaintLimitMs: FIRST_PAINT_LIMIT_MS,
};
console.log(JSON.stringify(out));
if (large.firstContentfulPaintMs > FIRST_PAINT_LIMIT_MS) process.exitCode = 1;
