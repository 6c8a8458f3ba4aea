/**
 * One server for all e2e files: the renderer built once for production and served (built-renderer.ts), reached by
 * every file through `inject('e2e')`. Setup returns as soon as the server listens; the build goes on while the other
 * projects' files run (they come first, vitest.config.ts), and the server answers once it is done. Chromium is
 * launched by each test worker (harness.ts startSession), and each file starts from the worker's page reset to a blank
 * page with empty storage and nothing a previous file added, so files stay independent.
 */
import { mkdirSync } from 'node:fs';
import type { TestProject } from 'vitest/node';
import { DOWNLOADS, SCREENSHOTS, chromiumFound } from './harness.ts';
import { serveBuiltRenderer } from './built-renderer.ts';

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  if (!chromiumFound) {
    project.provide('e2e', null); // startSession() says why (and fails in CI)
    return async () => {};
  }
  mkdirSync(SCREENSHOTS, { recursive: true });
  mkdirSync(DOWNLOADS, { recursive: true });
  const app = await serveBuiltRenderer();
  project.provide('e2e', { url: app.url });
  return async () => { await app.close(); };
}
