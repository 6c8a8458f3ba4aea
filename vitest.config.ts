import { defineConfig } from 'vitest/config';
import { BaseSequencer, type TestSpecification } from 'vitest/node';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('.', import.meta.url));

/**
 * Shell tests that each need a module graph of their own: they mock modules, fake timers or stub globals
 * (fake-indexeddb/auto installs indexedDB).
 */
const SHELL_ISOLATED = [
  'test/main/index.test.ts', 'test/main/preload.test.ts',
  'test/renderer/client.test.ts', 'test/renderer/recompute.test.ts', 'test/renderer/bridge/browser.test.ts',
  'test/renderer/bridge/recovery-slots.test.ts',
];

/**
 * Files under test/src that need more than the engine (src/ but src/cli and src/node-io), left out by
 * `npm run test:engine` (`--mode engine`): they run the CLI (in process through test/support/cli.ts, or its launcher,
 * bundle, helper threads or output writer), the file I/O of src/node-io, the app's worker or shell code, outside
 * programs (poppler's readers of the deliverables' PDFs, test/support/deliverables.ts; child processes killed mid-write),
 * or ESLint over the whole tree. `npm test` runs them all.
 */
const NEEDS_MORE_THAN_THE_ENGINE = [
  'test/src/architecture.test.ts',
  'test/src/cli/**',
  'test/src/node-io/**',
  'test/src/deliverables/brief.test.ts', 'test/src/deliverables/how-sure.test.ts', 'test/src/deliverables/phases.test.ts', 'test/src/deliverables/workbook.test.ts',
  'test/src/study/front-ends.test.ts',
  'test/src/linalg/parallel.test.ts', 'test/src/linalg/parallel-draws.test.ts',
  'test/src/hardening/atomic-save.test.ts', 'test/src/hardening/cli.test.ts', 'test/src/hardening/large.test.ts',
  'test/src/hardening/no-network.test.ts', 'test/src/hardening/numeric-edges.test.ts', 'test/src/hardening/regional-cli.test.ts',
  'test/src/regional/balance-table.test.ts', 'test/src/regional/cli-*.test.ts', 'test/src/regional/plausibility.test.ts',
  'test/src/scenario/cli.test.ts', 'test/src/scenario/shock-checks.test.ts',
];

/**
 * The e2e files whose time is mostly waiting: crash-recovery copies are written 1.5 s after an edit, and these files
 * wait for one again and again. Run side by side they left a core idle for about 25 s; each is paired with a file
 * that keeps its core busy instead (see E2eLast).
 */
const E2E_WAITING = ['test/e2e/recovery-tabs.test.ts', 'test/e2e/recovery.test.ts'];
const E2E_BUSY = ['test/e2e/app.test.ts', 'test/e2e/accessibility.test.ts'];

/**
 * Vitest's own order (projects by name, then larger or longer files first) with the e2e files last: the e2e server's
 * renderer is built while the unit files run (test/e2e/built-renderer.ts), instead of before any file. The e2e files
 * start with a waiting file and a busy one, and the second waiting file comes after the second busy one, so the two
 * test workers never wait at the same time for long.
 */
class E2eLast extends BaseSequencer {
  override async sort(files: TestSpecification[]): Promise<TestSpecification[]> {
    const sorted = await super.sort(files);
    const e2e = (f: TestSpecification) => f.project.name === 'e2e';
    const rel = (f: TestSpecification) => f.moduleId.slice(root.length).replaceAll('\\', '/');
    const pick = (name: string | undefined) => sorted.filter((f) => e2e(f) && rel(f) === name);
    const [w1, w2] = E2E_WAITING;
    const [b1, b2] = E2E_BUSY;
    const first = [...pick(w1), ...pick(b1), ...pick(b2), ...pick(w2)];
    const rest = sorted.filter((f) => e2e(f) && !first.includes(f));
    return [...sorted.filter((f) => !e2e(f)), ...first, ...rest];
  }
}

/**
 * Three projects (`npm test` runs all; `--project NAME` one):
 * - unit: test/src (the engine, the CLI in process), test/main and test/renderer, in one module graph per worker
 *   (`isolate: false`): loading the engine once instead of once per file is most of the saving, and one project
 *   instead of an engine and a shell one saved about 11 core-seconds (two fewer worker start-ups, the engine loaded
 *   once per worker instead of twice). Safe because these files leave no module or global state behind (kernel mode
 *   and helper threads are restored in afterAll; nothing is mocked), except the engine worker's study and last picked
 *   file (module state of renderer/worker/), which test/renderer/worker-reset.ts resets before each file.
 * - shell-isolated: the rest of test/main and test/renderer (SHELL_ISOLATED), a module graph per file, each in a
 *   worker thread of its own.
 * - e2e: real Chromium against the built renderer (Vite build + preview server, started once in
 *   test/e2e/global-setup.ts). Files are not isolated (`isolate: false`): a worker loads Playwright and the engine
 *   once, and launches one Chromium that serves every file it runs (test/e2e/harness.ts); each file starts from the
 *   worker's one page, reset (blank, storage emptied, the previous file's listeners and scripts removed), and no test
 *   leaves module state behind.
 */
export default defineConfig(({ mode }) => ({
  test: {
    root,
    maxWorkers: 2,
    sequence: { sequencer: E2eLast },
    projects: [
      {
        test: {
          name: 'unit',
          root,
          include: ['test/src/**/*.test.ts', 'test/main/**/*.test.ts', 'test/renderer/**/*.test.ts'],
          exclude: mode === 'engine' ? [...SHELL_ISOLATED, ...NEEDS_MORE_THAN_THE_ENGINE] : SHELL_ISOLATED,
          setupFiles: ['test/renderer/worker-reset.ts'],
          environment: 'node',
          testTimeout: 30_000,
          isolate: false,
        },
      },
      {
        test: {
          name: 'shell-isolated',
          root,
          include: SHELL_ISOLATED,
          // A worker thread per file rather than a child process: the same fresh module graph and globals, without
          // starting Node six times (about 1.3 core-seconds less).
          pool: 'threads',
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
}));
