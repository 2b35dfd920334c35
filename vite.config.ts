/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

// The viewer is built into dist/web and served by server/ (Express). Tests run with vitest.
export default defineConfig({
  plugins: [react(), tailwindcss()],
  // react-router's package exports point every bundler at its development build (dev-only checks
  // and warnings, larger); the viewer takes the production build it ships beside it. Both entries
  // share the same internal chunks, so the router and the DOM provider stay one instance.
  resolve: {
    alias: [
      { find: /^react-router$/, replacement: fileURLToPath(new URL('node_modules/react-router/dist/production/index.mjs', import.meta.url)) },
      { find: /^react-router\/dom$/, replacement: fileURLToPath(new URL('node_modules/react-router/dist/production/dom-export.mjs', import.meta.url)) },
    ],
  },
  build: { outDir: 'dist/web', emptyOutDir: true, sourcemap: false, chunkSizeWarningLimit: 600 },
  server: { proxy: { '/api': 'http://127.0.0.1:3000' } },
  test: {
    include: ['tests/**/*.test.ts', 'tests/**/*.test.tsx'],
    setupFiles: ['tests/setup/fail-on-console.ts'],
    // The CLI is built once per run for the tests that run it as a process.
    globalSetup: ['tests/setup/cli-build.ts'],
    testTimeout: 30_000,
    hookTimeout: 60_000,
    pool: 'forks',
    maxWorkers: 2,
  },
});
