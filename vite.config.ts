/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import preact from '@preact/preset-vite';

export default defineConfig({
  plugins: [preact()],
  build: { outDir: 'dist/app', emptyOutDir: true, target: 'es2022' },
  worker: { format: 'es' },
  preview: { headers: { 'Cache-Control': 'no-cache' } },
  test: {
    include: ['test/**/*.test.ts', 'test/**/*.test.tsx'],
    environment: 'node',
    pool: 'forks',
    testTimeout: 30_000,
    allowOnly: false,
  },
});
