// Debian's Chromium driven by playwright-core: never a downloaded browser. Each profile directory is fresh
// unless a test relaunches on purpose with the same one (storage surviving a browser restart).
import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const CHROMIUM_PATH = '/usr/bin/chromium';

export const CHROMIUM_FLAGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export function newProfileDir(): Promise<string> {
  return mkdtemp(join(tmpdir(), 'beadbook-chromium-'));
}

export async function removeProfileDir(dir: string): Promise<void> {
  await rm(dir, { recursive: true, force: true, maxRetries: 3 });
}

export interface LaunchOptions {
  /**
   * A Y4M or MJPEG file the fake camera plays in a loop (getUserMedia is granted without a prompt). Only the
   * flags the fake capture needs are added to the standard ones.
   */
  readonly fakeCameraFile?: string;
}

/** Flags for a fake camera fed from a video file. */
export function fakeCameraFlags(file: string): string[] {
  return [
    '--use-fake-device-for-media-stream',
    '--use-fake-ui-for-media-stream',
    `--use-file-for-fake-video-capture=${file}`,
  ];
}

/** Starts Chromium on the profile (playwright passes it as --user-data-dir). */
export function launchChromium(profileDir: string, options: LaunchOptions = {}): Promise<BrowserContext> {
  return chromium.launchPersistentContext(profileDir, {
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: options.fakeCameraFile
      ? [...CHROMIUM_FLAGS, ...fakeCameraFlags(options.fakeCameraFile)]
      : CHROMIUM_FLAGS,
    serviceWorkers: 'allow',
  });
}

/** The tab a persistent context opens with, or a new one. */
export async function firstPage(context: BrowserContext): Promise<Page> {
  return context.pages()[0] ?? (await context.newPage());
}

/** Uncaught exceptions and unhandled rejections in the page, collected for a final "none" check. */
export function collectPageErrors(page: Page): string[] {
  const errors: string[] = [];
  page.on('pageerror', (error) => errors.push(`${error.name}: ${error.message}`));
  return errors;
}
