// One setup and teardown for every browser test: whatever a test starts through these handles (a static or yard
// server, Chromium on a fresh profile, a scratch directory) is closed after it even when an assertion failed, in
// one order: browsers first (they hold connections to the servers), then servers, then the directories.
import { mkdtemp } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { afterAll, afterEach, beforeAll } from 'vitest';
import {
  collectPageErrors,
  firstPage,
  launchChromium,
  newProfileDir,
  removeProfileDir,
  type LaunchOptions,
} from '../chromium.js';
import { serveStatic, type StaticServer } from '../static-server.js';
import { startYardServer, type YardServer } from './yard-server.js';

export interface BrowserRun {
  readonly context: BrowserContext;
  /** The tab the browser opened with. */
  readonly page: Page;
  /** Uncaught errors of `page`, for the test's final `toEqual([])`. */
  readonly errors: string[];
  /** Pass it back to `launch` to start the browser again on the same storage. */
  readonly profile: string;
}

export interface BrowserLaunchOptions extends LaunchOptions {
  /** A profile from an earlier launch in the same test or file; a fresh one when left out. */
  readonly profile?: string;
}

export interface BrowserTest {
  serveStatic(dir: string): Promise<StaticServer>;
  startYardServer(appDir: string): Promise<YardServer>;
  launch(options?: BrowserLaunchOptions): Promise<BrowserRun>;
  /** A directory of its own under the system temp directory. */
  scratchDir(prefix: string): Promise<string>;
}

export interface UseBrowserOptions {
  /**
   * 'test' (the default) closes everything after each test; 'file' after the file's last test, for what a file
   * starts in `beforeAll` (see `useSharedBrowser`).
   */
  readonly per?: 'test' | 'file';
}

/** Registers the teardown hook of the calling file and returns the handles that start what it tears down. */
export function useBrowser(options: UseBrowserOptions = {}): BrowserTest {
  let contexts: BrowserContext[] = [];
  let servers: { close(): Promise<void> }[] = [];
  let dirs: string[] = [];

  const teardown = async (): Promise<void> => {
    const [openContexts, openServers, ownDirs] = [contexts, servers, dirs];
    contexts = [];
    servers = [];
    dirs = [];
    // Every step is tried even after one fails: a Chromium left running would hold a core the next file needs.
    const failures: unknown[] = [];
    const attempt = async (step: () => Promise<void>) => {
      try {
        await step();
      } catch (error) {
        failures.push(error);
      }
    };
    for (const context of openContexts.reverse()) await attempt(() => context.close());
    for (const server of openServers.reverse()) await attempt(() => server.close());
    for (const dir of ownDirs) await attempt(() => removeProfileDir(dir));
    if (failures.length > 0) throw failures[0];
  };
  if (options.per === 'file') afterAll(teardown);
  else afterEach(teardown);

  return {
    async serveStatic(dir) {
      const server = await serveStatic(dir);
      servers.push({ close: () => server.stop() });
      return server;
    },
    async startYardServer(appDir) {
      const server = await startYardServer(appDir);
      servers.push(server);
      return server;
    },
    async launch(launchOptions = {}) {
      const { profile: reused, ...chromiumOptions } = launchOptions;
      const profile = reused ?? (await newProfileDir());
      if (!reused) dirs.push(profile);
      const context = await launchChromium(profile, chromiumOptions);
      contexts.push(context);
      const page = await firstPage(context);
      return { context, page, errors: collectPageErrors(page), profile };
    },
    async scratchDir(prefix) {
      const dir = await mkdtemp(join(tmpdir(), prefix));
      dirs.push(dir);
      return dir;
    },
  };
}

export interface SharedBrowser {
  readonly server: StaticServer;
  readonly context: BrowserContext;
  readonly page: Page;
  readonly errors: string[];
}

/**
 * For files whose tests all use one server and one browser: `dir` served and Chromium launched before the first
 * test, both closed after the last. Read the handles inside tests (or later hooks), once they exist.
 */
export function useSharedBrowser(dir: string): SharedBrowser {
  const e2e = useBrowser({ per: 'file' });
  let started: { server: StaticServer; run: BrowserRun } | undefined;
  beforeAll(async () => {
    const server = await e2e.serveStatic(dir);
    started = { server, run: await e2e.launch() };
  });
  const get = () => {
    if (!started) throw new Error('the shared browser is started in beforeAll: read it inside a test');
    return started;
  };
  return {
    get server() {
      return get().server;
    },
    get context() {
      return get().run.context;
    },
    get page() {
      return get().run.page;
    },
    get errors() {
      return get().run.errors;
    },
  };
}
