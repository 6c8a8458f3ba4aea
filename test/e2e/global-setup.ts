/**
 * One end-to-end session for all e2e files: the renderer built once for production and served (built-renderer.ts),
 * plus one Chromium, both started here and reached by every file through `inject('e2e')`. Each file opens its own
 * browser context (its own storage, downloads and pages), so files stay independent; only the served files and the
 * browser process are shared.
 */
import { mkdirSync } from 'node:fs';
import { chromium } from 'playwright-core';
import type { TestProject } from 'vitest/node';
import { CHROMIUM, CHROMIUM_ARGS, DOWNLOADS, SCREENSHOTS, chromiumFound } from './harness.ts';
import { serveBuiltRenderer } from './built-renderer.ts';

export default async function setup(project: TestProject): Promise<() => Promise<void>> {
  if (!chromiumFound) {
    project.provide('e2e', null); // startSession() says why (and fails in CI)
    return async () => {};
  }
  mkdirSync(SCREENSHOTS, { recursive: true });
  mkdirSync(DOWNLOADS, { recursive: true });
  // The browser starts while the app is built.
  const [browser, app] = await Promise.all([
    chromium.launchServer({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true }),
    serveBuiltRenderer(),
  ]);
  project.provide('e2e', { url: app.url, wsEndpoint: browser.wsEndpoint() });
  return async () => {
    await browser.close().catch(() => {});
    await app.close();
  };
}
