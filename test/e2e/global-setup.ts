/**
 * One end-to-end session for all e2e files: Vite's dev server (the real renderer config, started in the vitest main
 * process) and one Chromium, started once here and reached by every file through `inject('e2e')`. Each file opens its
 * own browser context (its own storage, downloads and pages), so files stay independent; only the server's
 * compiled modules and the browser process are shared, which is what took most of each file's start-up.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { createServer } from 'vite';
import { chromium } from 'playwright-core';
import type { TestProject } from 'vitest/node';
import { CHROMIUM, CHROMIUM_ARGS, DOWNLOADS, REPO, SCREENSHOTS, chromiumFound } from './harness.ts';

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  if (!chromiumFound) {
    project.provide('e2e', null); // startSession() says why (and fails in CI)
    return async () => {};
  }
  mkdirSync(SCREENSHOTS, { recursive: true });
  mkdirSync(DOWNLOADS, { recursive: true });
  const server = await createServer({
    configFile: join(REPO, 'renderer', 'vite.config.ts'),
    // Warm-up compiles the app and the engine worker while the other projects' tests run.
    server: { port: 0, strictPort: false, hmr: false, warmup: { clientFiles: ['./index.html', './main.ts', './worker/engine.worker.ts'] } },
    logLevel: 'error',
  });
  await server.listen();
  const url = server.resolvedUrls?.local[0];
  if (!url) throw new Error('e2e: the dev server did not report a URL');
  const browser = await chromium.launchServer({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
  project.provide('e2e', { url, wsEndpoint: browser.wsEndpoint() });
  return async () => {
    await browser.close().catch(() => {});
    await server.close();
  };
}
