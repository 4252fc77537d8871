// Reads the precache list that vite-plugin-pwa injected into a built sw.js.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';

/** URLs (relative to the app root, e.g. "assets/index-abc.js") the service worker precaches. */
export function precachedUrls(buildDir: string): string[] {
  const sw = readFileSync(join(buildDir, 'sw.js'), 'utf8');
  const urls = [...sw.matchAll(/"url":"([^"]+)"/g)].map((match) => match[1] ?? '');
  if (urls.length === 0) throw new Error(`no precache list found in ${join(buildDir, 'sw.js')}`);
  return urls;
}
