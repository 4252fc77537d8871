// Long-task harness for the app bench: records every main-thread task over 50 ms (PerformanceObserver
// 'longtask') from the moment a page starts. A screen bench installs it on the context, drives the page
// (e.g. entering 10,000 readings) and reads the summary for just that stretch:
//
//   await installLongTaskObserver(context);
//   await page.goto(origin);
//   const mark = await longTaskMark(page);
//   ...drive the page...
//   const summary = await longTasksSince(page, mark);
import type { BrowserContext, Page } from 'playwright-core';

export interface LongTask {
  /** ms since the page's time origin (navigation start) */
  readonly start: number;
  readonly duration: number;
}

export interface LongTaskSummary {
  readonly count: number;
  readonly totalMs: number;
  readonly maxMs: number;
  readonly tasks: readonly LongTask[];
}

// Page-side code as text: this project has no DOM typings (tsconfig.node.json), and the observer must run
// before any page script, which addInitScript guarantees. Long tasks are not buffered, so start at once.
const OBSERVER_SCRIPT = `(() => {
  if (globalThis.__beadbookLongTasks) return;
  const tasks = [];
  globalThis.__beadbookLongTasks = tasks;
  if (!PerformanceObserver.supportedEntryTypes.includes('longtask')) return;
  new PerformanceObserver((list) => {
    for (const entry of list.getEntries()) tasks.push({ start: entry.startTime, duration: entry.duration });
  }).observe({ type: 'longtask' });
})();`;

/** Starts recording in every page the context opens from now on. */
export async function installLongTaskObserver(context: BrowserContext): Promise<void> {
  await context.addInitScript({ content: OBSERVER_SCRIPT });
}

/** The page's clock now (ms since its time origin), to mark the start of a stretch of work. */
export function longTaskMark(page: Page): Promise<number> {
  return page.evaluate(() => performance.now());
}

/**
 * Long tasks that started at or after `since` (a longTaskMark, or 0 for "since navigation"). Waits two frames
 * first: observers report after the task ends.
 */
export async function longTasksSince(page: Page, since = 0): Promise<LongTaskSummary> {
  const from = Number.isFinite(since) ? since : 0;
  const tasks = await page.evaluate<LongTask[]>(
    `new Promise((resolve) => requestAnimationFrame(() => requestAnimationFrame(() => resolve(
      (globalThis.__beadbookLongTasks ?? []).filter((task) => task.start >= ${String(from)})))))`,
  );
  return summarize(tasks);
}

export function summarize(tasks: readonly LongTask[]): LongTaskSummary {
  const durations = tasks.map((task) => task.duration);
  return {
    count: tasks.length,
    totalMs: round(durations.reduce((sum, d) => sum + d, 0)),
    maxMs: round(durations.reduce((max, d) => Math.max(max, d), 0)),
    tasks,
  };
}

export function round(ms: number): number {
  return Math.round(ms * 10) / 10;
}
