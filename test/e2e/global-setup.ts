/**
 * One end-to-end session for all e2e files: the renderer built once for production (the real renderer config, into
 * a temporary folder) and served by Vite's preview server, plus one Chromium, both started here and reached by every
 * file through `inject('e2e')`. A built app loads in a few requests where the dev server answers hundreds of module
 * requests per page load, and every test opens fresh pages. Each file opens its own browser context (its own storage,
 * downloads and pages), so files stay independent; only the served files and the browser process are shared.
 */
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build, preview } from 'vite';
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
  const configFile = join(REPO, 'renderer', 'vite.config.ts');
  const outDir = mkdtempSync(join(tmpdir(), 'roundwise-e2e-'));
  // The browser starts while the app is built.
  const [browser] = await Promise.all([
    chromium.launchServer({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true }),
    build({ configFile, logLevel: 'error', build: { outDir, emptyOutDir: true, minify: false, reportCompressedSize: false } }),
  ]);
  const server = await preview({ configFile, logLevel: 'error', build: { outDir }, preview: { port: 0, strictPort: false } });
  const url = server.resolvedUrls?.local[0];
  if (!url) throw new Error('e2e: the preview server did not report a URL');
  project.provide('e2e', { url, wsEndpoint: browser.wsEndpoint() });
  return async () => {
    await browser.close().catch(() => {});
    await server.close();
    rmSync(outDir, { recursive: true, force: true });
  };
}
