import { sveltekit } from '@sveltejs/kit/vite';
import type { Plugin } from 'vite';
import { defineConfig } from 'vitest/config';
import { generateSW } from 'workbox-build';
import { existsSync } from 'node:fs';
import { budgetProblem, firstLoad, FIRST_LOAD_BUDGET_BYTES, type ChunkInfo } from './test/bundle-size/first-load-budget.ts';

/**
 * Fails the client build when the JavaScript of the first screen passes its budget (120 KB gzip)
 * or pulls in the chart library or the QR reader (test/build/first-load-budget.ts says what counts).
 */
function firstLoadBudget(): Plugin {
  let isClientBuild = false;
  let root = process.cwd();
  return {
    name: 'kinnote-first-load-budget',
    apply: 'build',
    configResolved(config) {
      isClientBuild = !config.build.ssr && !config.build.lib;
      root = config.root;
    },
    generateBundle(_options, bundle) {
      if (!isClientBuild) return;
      const chunks: ChunkInfo[] = [];
      for (const item of Object.values(bundle)) {
        if (item.type === 'chunk') chunks.push({ fileName: item.fileName, code: item.code, imports: item.imports, moduleIds: item.moduleIds, facadeModuleId: item.facadeModuleId });
      }
      // Worker bundles and other nested builds have no SvelteKit entry: nothing to check there.
      if (!chunks.some((c) => c.facadeModuleId?.replaceAll('\\', '/').endsWith('/kit/src/runtime/client/entry.js'))) return;
      const load = firstLoad(chunks, root);
      const problem = budgetProblem(load);
      if (problem) this.error(problem);
      console.log(`[first-load budget] ${(load.gzipBytes / 1024).toFixed(1)} KB gzip of ${(FIRST_LOAD_BUDGET_BYTES / 1024).toFixed(0)} KB in ${load.files.length} files; no uPlot, no jsQR, no pdf-lib`);
    },
  };
}

/**
 * Writes build/sw.js with Workbox once adapter-static has written build/.
 * SvelteKit runs a nested client build that loads this config again; only the outer (server)
 * build's close comes after the adapter, so the plugin acts there alone.
 */
function offlineWorker(): Plugin {
  let isServerBuild = false;
  return {
    name: 'kinnote-offline-worker',
    apply: 'build',
    configResolved(config) {
      isServerBuild = Boolean(config.build.ssr);
    },
    closeBundle: {
      sequential: true,
      order: 'post',
      async handler() {
        if (!isServerBuild || !existsSync('build/index.html')) return;
        const { count, size, warnings } = await generateSW({
          globDirectory: 'build',
          globPatterns: ['**/*.{html,js,css,json,webmanifest,png,svg,ico,txt,woff2}'],
          globIgnores: ['sw.js', 'workbox-*.js'],
          swDest: 'build/sw.js',
          navigateFallback: '/index.html',
          // Hashed file names under _app/immutable need no revision query.
          dontCacheBustURLsMatching: /^_app\/immutable\//,
          cleanupOutdatedCaches: true,
          clientsClaim: true,
          // No skipWaiting: a new version waits until the user accepts it (see update-watch.ts).
          skipWaiting: false,
          maximumFileSizeToCacheInBytes: 8 * 1024 * 1024,
          sourcemap: false,
          inlineWorkboxRuntime: true,
        });
        for (const warning of warnings) console.warn(`[offline worker] ${warning}`);
        console.log(`[offline worker] precached ${count} files, ${(size / 1024).toFixed(0)} KiB`);
      },
    },
  };
}

export default defineConfig({
  plugins: [sveltekit(), firstLoadBudget(), offlineWorker()],
  worker: { format: 'es' },
  // Rolldown's plugin-timing notice counts the service-worker step (after the build) as slow; it is expected.
  build: { rolldownOptions: { checks: { pluginTimings: false } } },
  test: {
    reporters: ['default', './test/e2e/count-reporter.ts'],
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          environment: 'node',
          // Vitest's 5 s default is a hang guard that a loaded 2-core machine exceeds for honest work
          // (the demo import, PBKDF2 at 600,000 rounds); speed is measured in `npm run bench`, not here.
          testTimeout: 60_000,
          hookTimeout: 60_000,
          include: ['test/unit/**/*.test.ts', 'test/reference/**/*.test.ts'],
        },
      },
      {
        test: {
          name: 'e2e',
          environment: 'node',
          include: ['test/e2e/**/*.e2e.ts'],
          globalSetup: ['test/e2e/global-setup.ts'],
          fileParallelism: false,
          // Budgets for a loaded 2-core machine (CI may share it with another heavy job). Waits inside
          // the tests are on conditions and name what they wait for; these only bound a hang.
          testTimeout: 150_000,
          hookTimeout: 180_000,
          // expect.poll's 1 s default failed an Undo that took 3.7 s at load 27: a condition, given time.
          expect: { poll: { timeout: 15_000 } },
        },
      },
    ],
  },
});
