import { defineConfig } from 'vitest/config';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

// Two projects: fast engine/unit/property tests, and end-to-end tests in real Chromium (serial, slower).
export default defineConfig({
  test: {
    root,
    projects: [
      {
        test: {
          name: 'unit',
          root,
          include: ['test/src/**/*.test.ts', 'test/main/**/*.test.ts', 'test/renderer/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
        },
      },
      {
        test: {
          name: 'e2e',
          root,
          include: ['test/e2e/**/*.test.ts'],
          environment: 'node',
          testTimeout: 180_000,
          hookTimeout: 180_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
