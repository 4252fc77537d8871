// Long tasks while an inspector enters thousands of readings on the Gauge screen.
//
// Route: the bench drives the real screen of the production build, with no hook or test-only code in the app.
// Each entry is what a user's Save is: the toe-angle field gets a value (the input event the keyboard would
// fire), the reading form is submitted (form.requestSubmit(), as Enter or the Save button does), and the bench
// waits until the screen shows this reading's level and the readings count has gone up. So every entry runs the
// screen's own save path — build the reading, check it, store.appendReading into IndexedDB, read back what is
// new, grade in the worker, render the grade — with a PerformanceObserver('longtask') recording the main
// thread throughout. The loop runs inside the page (page.evaluate, in batches) so the bench's own round trips
// do not pace it.
import type { BrowserContext, Page } from 'playwright-core';
import {
  firstPage,
  launchChromium,
  newProfileDir,
  removeProfileDir,
} from '../../test/e2e/support/chromium.js';
import {
  installLongTaskObserver,
  longTaskMark,
  longTasksSince,
  round,
  type LongTaskSummary,
} from './longtasks.js';

export interface EntryRun {
  readonly entries: number;
  readonly cpuSlowdown: number;
  readonly totalMs: number;
  readonly meanMsPerEntry: number;
  /** Mean time per entry over the last batch: a save that grows with the seam shows here. */
  readonly lastBatchMeanMs: number;
  readonly firstBatchMeanMs: number;
  readonly longTasks: Omit<LongTaskSummary, 'tasks'> & {
    readonly over50ms: number;
    readonly longest: readonly { readonly start: number; readonly duration: number }[];
  };
  /**
   * For information (not part of the 50 ms limit): long tasks while the seam with all those readings opens on
   * the Seam screen (every reading's grade, the strip chart), and then on the Seams list.
   */
  readonly afterEntries: {
    readonly seamScreen: Omit<LongTaskSummary, 'tasks'>;
    readonly seamsList: Omit<LongTaskSummary, 'tasks'>;
  };
}

const SEAM_LENGTH_MM = 100_000;
const PITCH_MM = 10;
const BATCH = 500;

/** Sets up a seam through the New seam form and opens its Gauge screen with a toe gauge confirmed. */
export async function openGauge(page: Page, origin: string): Promise<void> {
  await page.goto(`${origin}/#/seam/new`);
  const box = (name: string) => page.getByRole('textbox', { name, exact: true });
  await box('Label').fill('Bench seam');
  await box('Plate 1 thickness t1 (mm)').fill('10');
  await box('Plate 2 thickness t2 (mm)').fill('10');
  await box('Length (mm)').fill(String(SEAM_LENGTH_MM));
  await box('Material').fill('S355J2');
  await page.getByRole('button', { name: 'Save seam' }).click();
  await page.getByRole('link', { name: 'Gauge readings' }).click();
  await box('Toe gauge id').fill('TG-1');
  await page.getByRole('button', { name: 'Use this toe gauge' }).click();
  await page.locator('details.gauge-more > summary').click();
  await box('Pitch (mm)').fill(String(PITCH_MM));
  await page.locator('form.gauge-form input[name="toeAngle"]').waitFor();
}

// Page-side loop, as text (this project compiles the bench without DOM typings).
export const ENTER_BATCH = `async ({ from, count }) => {
  const form = document.querySelector('form.gauge-form');
  const status = form.querySelector('.gauge-status');
  const summary = () => document.querySelector('.gauge-list summary').textContent;
  const held = () => Number(/\\((\\d+) that count/.exec(summary())[1]);
  const setValue = Object.getOwnPropertyDescriptor(HTMLInputElement.prototype, 'value').set;
  const until = (done, what) => new Promise((resolve, reject) => {
    if (done()) return resolve();
    const timer = setTimeout(() => { observer.disconnect(); reject(new Error(what + ': ' + status.textContent)); }, 60000);
    const observer = new MutationObserver(() => {
      if (!done()) return;
      observer.disconnect(); clearTimeout(timer); resolve();
    });
    observer.observe(document.body, { subtree: true, childList: true, characterData: true, attributes: true });
  });
  const times = [];
  for (let i = from; i < from + count; i++) {
    const t0 = performance.now();
    // The value fields are remounted after each save: find the field again, as the focus does.
    const field = form.querySelector('input[name="toeAngle"]');
    setValue.call(field, String(95 + ((i * 37) % 85)));
    field.dispatchEvent(new Event('input', { bubbles: true }));
    // Let the screen render the typed value before Enter, as it has between a key press and the next.
    await new Promise((resolve) => setTimeout(resolve, 0));
    form.requestSubmit();
    await until(() => held() === i + 1 && status.textContent.includes('level met by this reading'),
      'entry ' + (i + 1) + ' was not saved and graded');
    times.push(performance.now() - t0);
  }
  return times;
}`;

/** Enters `entries` readings and reports the main thread's long tasks over the whole stretch. */
export async function benchEntries(origin: string, entries: number, cpuSlowdown: number): Promise<EntryRun> {
  const profile = await newProfileDir();
  let context: BrowserContext | undefined;
  try {
    context = await launchChromium(profile);
    await installLongTaskObserver(context);
    const page = await firstPage(context);
    const errors: string[] = [];
    page.on('pageerror', (e) => errors.push(e.message));
    await openGauge(page, origin);
    if (cpuSlowdown > 1) {
      const cdp = await context.newCDPSession(page);
      await cdp.send('Emulation.setCPUThrottlingRate', { rate: cpuSlowdown });
    }
    const mark = await longTaskMark(page);
    const times: number[] = [];
    for (let from = 0; from < entries; from += BATCH) {
      const count = Math.min(BATCH, entries - from);
      // A string expression: playwright does not call a function given as text, so the call is part of it.
      const batch = await page.evaluate<number[]>(`(${ENTER_BATCH})(${JSON.stringify({ from, count })})`);
      times.push(...batch);
      process.stderr.write(`bench:app entered ${from + count} of ${entries} readings\n`);
    }
    const summary = await longTasksSince(page, mark);
    const brief = ({ count, totalMs, maxMs }: LongTaskSummary) => ({ count, totalMs, maxMs });
    const seamMark = await longTaskMark(page);
    await page.getByRole('link', { name: '← Back to the seam' }).click();
    await page.locator('section.grade .grade-badge').waitFor({ timeout: 120_000 });
    const seamScreen = brief(await longTasksSince(page, seamMark));
    const listMark = await longTaskMark(page);
    await page.getByRole('navigation', { name: 'Screens' }).getByRole('link', { name: 'Seams' }).click();
    await page
      .locator('li.seam-row .badge')
      .filter({ hasNotText: 'grading' })
      .first()
      .waitFor({ timeout: 120_000 });
    const seamsList = brief(await longTasksSince(page, listMark));
    if (errors.length) throw new Error(`the page reported errors: ${errors.join('; ')}`);
    const mean = (xs: readonly number[]) => round(xs.reduce((s, x) => s + x, 0) / Math.max(1, xs.length));
    return {
      entries,
      cpuSlowdown,
      totalMs: round(times.reduce((s, x) => s + x, 0)),
      meanMsPerEntry: mean(times),
      firstBatchMeanMs: mean(times.slice(0, BATCH)),
      lastBatchMeanMs: mean(times.slice(-BATCH)),
      longTasks: {
        count: summary.count,
        totalMs: summary.totalMs,
        maxMs: summary.maxMs,
        over50ms: summary.tasks.filter((t) => t.duration > 50).length,
        longest: [...summary.tasks]
          .sort((a, b) => b.duration - a.duration)
          .slice(0, 5)
          .map((t) => ({ start: round(t.start), duration: round(t.duration) })),
      },
      afterEntries: { seamScreen, seamsList },
    };
  } finally {
    await context?.close();
    await removeProfileDir(profile);
  }
}
