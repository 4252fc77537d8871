/// <reference types="vitest/config" />
import { readFileSync } from 'node:fs';
import { defineConfig } from 'vite';
import preact from '@preact/preset-vite';
import { VitePWA } from 'vite-plugin-pwa';

const pkg = JSON.parse(readFileSync(new URL('./package.json', import.meta.url), 'utf8')) as {
  version: string;
};

// The version shown in the app. A deploy (or a test) can stamp its own, e.g. BEADBOOK_VERSION=0.1.0+3f2a.
const version = process.env['BEADBOOK_VERSION'] ?? pkg.version;

const certFile = process.env['BEADBOOK_TLS_CERT'];
const keyFile = process.env['BEADBOOK_TLS_KEY'];
const tls = certFile && keyFile ? { cert: readFileSync(certFile), key: readFileSync(keyFile) } : undefined;

export default defineConfig({
  define: { __BEADBOOK_VERSION__: JSON.stringify(version) },
  plugins: [
    preact(),
    VitePWA({
      // Our own service worker (src/sw.ts): it is type-checked under tsconfig.worker.json, answers only the
      // typed skip-waiting message, and later wakes the outbox sender; the plugin injects the precache list.
      strategies: 'injectManifest',
      srcDir: 'src',
      filename: 'sw.ts',
      // New versions wait for the user's consent (src/app/pwa/register.ts registers it with workbox-window).
      registerType: 'prompt',
      injectRegister: false,
      // One manifest only: public/manifest.webmanifest, linked from index.html.
      manifest: false,
      injectManifest: {
        // Everything the build emits, lazy chunks and worker files included, so every screen opens offline.
        globPatterns: ['**/*.{js,mjs,css,html,webmanifest,json,png,svg,ico,webp,woff2,wasm}'],
        globIgnores: ['sw.js', '.vite/**'],
        maximumFileSizeToCacheInBytes: 5 * 1024 * 1024,
      },
      devOptions: { enabled: false },
    }),
  ],
  build: { outDir: 'dist/app', emptyOutDir: true, target: 'es2022' },
  worker: { format: 'es' },
  // Applies to every file preview serves, sw.js included (checked by test/e2e/build-output.browser.test.ts).
  // Tablets need https for the service worker and the camera: give a certificate and key to serve over TLS.
  preview: { headers: { 'Cache-Control': 'no-cache' }, ...(tls ? { https: tls } : {}) },
  test: {
    environment: 'node',
    pool: 'forks',
    testTimeout: 30_000,
    allowOnly: false,
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['test/**/*.test.ts', 'test/**/*.test.tsx'],
          exclude: ['test/**/*.browser.test.ts', 'node_modules/**'],
        },
      },
      {
        // Built app served to headless Chromium. Runs after the unit tests, one file at a time (2 cores, and
        // each file starts its own Chromium); the app is built once per run by the global setup.
        extends: true,
        test: {
          name: 'browser',
          include: ['test/**/*.browser.test.ts'],
          globalSetup: ['test/e2e/support/vitest/global-setup.ts'],
          testTimeout: 120_000,
          hookTimeout: 180_000,
          maxWorkers: 1,
          sequence: { groupOrder: 1 },
        },
      },
    ],
  },
});
