import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('.', import.meta.url));

/**
 * Three projects (`npm test` runs all; `--project NAME` one):
 * - engine: test/src, pure functions and in-process CLI runs, in one module graph (`isolate: false`): loading the
 *   engine once instead of once per file is most of the saving. Safe because these tests leave no module state behind
 *   (kernel mode and helper threads are restored in afterAll; nothing is mocked).
 * - shell: test/main and test/renderer, isolated per file: they mock `electron`, fake timers and browser globals.
 * - e2e: real Chromium against the built renderer (Vite build + preview server, started once in
 *   test/e2e/global-setup.ts). Files are not isolated (`isolate: false`): a worker loads Playwright and the engine
 *   once, and launches one Chromium that serves every file it runs (test/e2e/harness.ts); each file has its own
 *   browser context, and no test leaves module state behind.
 */
export default defineConfig({
  test: {
    root,
    maxWorkers: 2,
    projects: [
      {
        test: {
          name: 'engine',
          root,
          include: ['test/src/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
          isolate: false,
        },
      },
      {
        test: {
          name: 'shell',
          root,
          include: ['test/main/**/*.test.ts', 'test/renderer/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
        },
      },
      {
        test: {
          name: 'e2e',
          root,
          include: ['test/e2e/**/*.test.ts'],
          globalSetup: ['test/e2e/global-setup.ts'],
          environment: 'node',
          testTimeout: 180_000,
          hookTimeout: 180_000,
          fileParallelism: true,
          isolate: false,
        },
      },
    ],
  },
});
