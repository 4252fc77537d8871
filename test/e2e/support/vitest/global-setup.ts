// Runs once per vitest run, and only when browser test files are part of it: builds the app twice (two
// versions of the same source, as two deploys) and the page that hosts the PWA components on their own.
import { join } from 'node:path';
import type { TestProject } from 'vitest/node';
import { buildApp } from '../build-app.js';
import { E2E_DIST } from '../paths.js';
import { buildComponentPage } from './component-page.js';

export const CURRENT_VERSION = 'e2e-current';
export const NEXT_VERSION = 'e2e-next';

export default async function setup(project: TestProject): Promise<void> {
  const [current, next, components] = await Promise.all([
    buildApp(join(E2E_DIST, 'current'), CURRENT_VERSION),
    buildApp(join(E2E_DIST, 'next'), NEXT_VERSION),
    buildComponentPage(join(E2E_DIST, 'components')),
  ]);
  project.provide('e2eBuilds', { current, next, components });
}
