/**
 * End-to-end harness: Vite's dev server started in-process on a free port with the real renderer config, and Debian's
 * Chromium driven by playwright-core. When CI is set and no Chromium is found the suite fails; elsewhere it skips
 * with a message saying why.
 */
import { existsSync, mkdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { createServer, type ViteDevServer } from 'vite';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

export const REPO = fileURLToPath(new URL('../..', import.meta.url));
export const CHROMIUM = process.env.ROUNDWISE_CHROMIUM ?? '/usr/bin/chromium';
export const CHROMIUM_ARGS = ['--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'];
export const SCREENSHOTS = join(REPO, 'test-output', 'screenshots');
export const DOWNLOADS = join(REPO, 'test-output', 'downloads');

export const chromiumFound = existsSync(CHROMIUM);
export const inCI = Boolean(process.env.CI);
/** Skip only outside CI; in CI a missing browser is a failure (see requireChromium). */
export const skipBrowser = !chromiumFound && !inCI;
if (skipBrowser) {
  console.warn(`e2e: skipped — no Chromium at ${CHROMIUM} (install Debian's chromium, or set ROUNDWISE_CHROMIUM). In CI this fails.`);
}

export function requireChromium(): void {
  if (!chromiumFound) throw new Error(`e2e: CI is set and no Chromium was found at ${CHROMIUM}; the end-to-end tests cannot run.`);
}

export interface Session {
  server: ViteDevServer;
  url: string;
  browser: Browser;
  context: BrowserContext;
  page: Page;
  /** Console errors and uncaught page errors seen so far. */
  errors: string[];
  close(): Promise<void>;
}

export async function startSession(): Promise<Session> {
  requireChromium();
  mkdirSync(SCREENSHOTS, { recursive: true });
  mkdirSync(DOWNLOADS, { recursive: true });
  const server = await createServer({
    configFile: join(REPO, 'renderer', 'vite.config.ts'),
    server: { port: 0, strictPort: false, hmr: false },
    logLevel: 'error',
  });
  await server.listen();
  const url = server.resolvedUrls?.local[0];
  if (!url) throw new Error('e2e: the dev server did not report a URL');
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true, locale: 'en-US' });
  const page = await context.newPage();
  const errors: string[] = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(`console: ${m.text()}`); });
  page.on('pageerror', (e) => errors.push(`page: ${e.message}`));
  return {
    server, url, browser, context, page, errors,
    async close() {
      await context.close().catch(() => {});
      await browser.close().catch(() => {});
      await server.close();
    },
  };
}

export async function shot(page: Page, name: string): Promise<void> {
  await page.screenshot({ path: join(SCREENSHOTS, `${name}.png`), fullPage: false });
}
