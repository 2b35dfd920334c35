/// <reference types="vitest/config" />
import { defineConfig, type Plugin } from 'vite';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { fileURLToPath } from 'node:url';

/**
 * The formula page is where the bench goes most, and where its wait matters: its chunk (and the
 * chunks it imports) is fetched beside the app's own code instead of after the app has started.
 * Fetched only: it runs when the router first opens a formula.
 */
function preloadFormulaPage(): Plugin {
  return {
    name: 'panform-preload-formula-page',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler(_html, ctx) {
        const chunks = Object.values(ctx.bundle ?? {}).filter((c) => c.type === 'chunk');
        const page = chunks.find((c) => c.facadeModuleId?.endsWith('/src/app/routes/formula.tsx'));
        if (!page) return [];
        const entry = chunks.find((c) => c.isEntry);
        const already = new Set([entry?.fileName, ...(entry?.imports ?? [])]);
        const files = [page.fileName, ...page.imports].filter((f) => !already.has(f));
        return [...new Set(files)].map((f) => ({ tag: 'link', attrs: { rel: 'modulepreload', crossorigin: true, href: `/${f}` }, injectTo: 'head' as const }));
      },
    },
  };
}

// The viewer is built into dist/web and served by server/ (Express). Tests run with vitest.
export default defineConfig({
  plugins: [react(), tailwindcss(), preloadFormulaPage()],
  // react-router's package exports point every bundler at its development build (dev-only checks
  // and warnings, larger); the viewer takes the production build it ships beside it. Both entries
  // share the same internal chunks, so the router and the DOM provider stay one instance.
  resolve: {
    alias: [
      { find: /^react-router$/, replacement: fileURLToPath(new URL('node_modules/react-router/dist/production/index.mjs', import.meta.url)) },
      { find: /^react-router\/dom$/, replacement: fileURLToPath(new URL('node_modules/react-router/dist/production/dom-export.mjs', import.meta.url)) },
    ],
  },
  // Files copied as they are into the build (src/public/early-fetch.js).
  publicDir: 'src/public',
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
