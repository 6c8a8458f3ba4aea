/**
 * End-to-end harness: every e2e file shares one server of the built renderer (the real renderer config), started once
 * by global-setup.ts. Each test worker launches one Debian Chromium (playwright-core, over a pipe) on its first
 * session and keeps it for every file it runs (the e2e project does not isolate files), and each file gets a browser
 * context of its own. Launching in the worker rather than sharing one browser server saves the relay through the
 * main process (every message, screenshot and picked file crossed a compressed WebSocket and a pipe), and lets
 * Playwright hand picked files to Chromium by path. When CI is set and no Chromium is found the suite fails;
 * elsewhere it skips with a message saying why.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { inject } from 'vitest';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

declare module 'vitest' {
  export interface ProvidedContext {
    /** The shared server started by global-setup.ts; null when no Chromium was found. */
    e2e: { url: string } | null;
  }
}

export const REPO = fileURLToPath(new URL('../..', import.meta.url));
export const CHROMIUM = process.env.ROUNDWISE_CHROMIUM ?? '/usr/bin/chromium';
/**
 * The flags every test and bench run uses, plus one: the browser's own address-bar popup (a web page of its own since
 * Chromium 14x) is not built. Headless Chromium still made it for every browser context, in a renderer process of
 * its own that took about 1.3 s of CPU per context and kept running after (measured: a new context with the app
 * loaded 2.9 → 1.4 core-s). It is the browser's interface, not the page's: the app under test is the same.
 */
export const CHROMIUM_ARGS = [
  '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run',
  '--disable-features=WebUIOmniboxPopup,WebUIOmniboxAimPopup,WebUIOmniboxFullPopup',
];
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
  /** The shared server's address. */
  url: string;
  browser: Browser;
  /** This file's own browser context (storage, downloads, pages). */
  context: BrowserContext;
  page: Page;
  /** Console errors and uncaught page errors seen so far. */
  errors: string[];
  close(): Promise<void>;
}

let workerBrowser: Promise<Browser> | null = null;
let builtOk: Promise<void> | null = null;

export async function startSession(): Promise<Session> {
  requireChromium();
  const shared = inject('e2e');
  if (!shared) throw new Error('e2e: the shared server was not started (run the e2e project of vitest.config.ts).');
  // The server answers once the renderer is built (built-renderer.ts); a failed build is said here, not as a timeout.
  builtOk ??= fetch(shared.url).then(async (r) => { if (!r.ok) throw new Error(`e2e: ${await r.text()}`); });
  await builtOk;
  // Closed by Playwright when the worker exits.
  workerBrowser ??= chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
  const browser = await workerBrowser;
  const context = await browser.newContext({ viewport: { width: 1280, height: 800 }, acceptDownloads: true, locale: 'en-US' });
  const page = await context.newPage();
  // File choosers are intercepted from the start: Playwright turns interception on when the first 'filechooser'
  // listener is added, without waiting for it, so a `waitForEvent('filechooser')` just before a key press could lose
  // the race and let Chromium open its own dialog (seen once in app.test.ts's Ctrl+O, on a loaded machine).
  page.on('filechooser', () => {});
  const errors: string[] = [];
  page.on('console', (m) => { if (m.type() === 'error') errors.push(`console: ${m.text()}`); });
  page.on('pageerror', (e) => errors.push(`page: ${e.message}`));
  return {
    url: shared.url, browser, context, page, errors,
    async close() {
      await context.close().catch(() => {});
    },
  };
}

/** A session with the app loaded on the sample county (its verdict shown), and a generous default timeout. */
export async function openApp(): Promise<Session> {
  const s = await startSession();
  s.page.setDefaultTimeout(60_000);
  await s.page.goto(s.url);
  await s.page.getByTestId('verdict').waitFor({ timeout: 150_000 });
  return s;
}

/** Open a screen from the sidebar and wait for it to be shown. */
export async function goTo(page: Page, screen: string): Promise<void> {
  await page.click(`[data-screen="${screen}"]`);
  await page.waitForSelector('main[aria-label]');
}

/**
 * Screenshots are taken only by `npm run screenshots` (test/e2e/screenshots.mjs sets ROUNDWISE_SCREENSHOTS=1): each is
 * a fresh frame rasterised and read back, about 0.14 core-s, some 70 of them in the suite, for pictures no assertion
 * reads. `npm test` runs the same steps and checks without them.
 */
export const takeScreenshots = process.env.ROUNDWISE_SCREENSHOTS === '1';

export async function shot(page: Page, name: string): Promise<void> {
  if (!takeScreenshots) return;
  await page.screenshot({ path: join(SCREENSHOTS, `${name}.png`), fullPage: false });
}

/** Money as the app shows it: one decimal in the session's locale (en-US). */
export function money(v: number): string {
  return v.toLocaleString('en-US', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
}

/** The text of one cell of a table found by its test id: the row by its sector label, the column by position (0 = the label). */
export async function rowCell(page: Page, table: string, sector: string, col: number): Promise<string> {
  const row = page.getByTestId(table).locator('tbody tr').filter({ has: page.locator('th', { hasText: new RegExp(`^${sector}$`) }) });
  return ((await row.locator('th, td').nth(col).textContent()) ?? '').trim();
}
