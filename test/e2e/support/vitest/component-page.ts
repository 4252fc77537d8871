// Builds test/e2e/fixtures/components: a page that mounts the PWA components alone, so their behaviour is
// checked in Chromium whatever the screens around them look like.
import { join } from 'node:path';
import { viteBuild } from '../build-app.js';
import { ROOT } from '../paths.js';

export const COMPONENT_PAGE_SRC = join(ROOT, 'test', 'e2e', 'fixtures', 'components');

export async function buildComponentPage(outDir: string): Promise<{ readonly dir: string }> {
  await viteBuild([
    COMPONENT_PAGE_SRC,
    '--config',
    join(COMPONENT_PAGE_SRC, 'vite.config.ts'),
    '--outDir',
    outDir,
    '--emptyOutDir',
  ]);
  return { dir: outDir };
}
