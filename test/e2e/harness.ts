/**
 * End-to-end harness: every e2e file shares one server of the built renderer (the real renderer config), started once
 * by global-setup.ts. Each test worker launches one Debian Chromium (playwright-core, over a pipe) on its first
 * session and keeps it for every file it runs (the e2e project does not isolate files), with one browser context and
 * one page that each file starts from, reset to a blank page with empty storage (see resetPage). Launching in the
 * worker rather than sharing one browser server saves the relay through the main process (every message, screenshot
 * and picked file crossed a compressed WebSocket and a pipe), and lets Playwright hand picked files to Chromium by
 * path. When CI is set and no Chromium is found the suite fails; elsewhere it skips with a message saying why.
 */
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';
import { inject } from 'vitest';
import { chromium, type Browser, type BrowserContext, type Dialog, type Disposable, type Page } from 'playwright-core';

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
/** The size every e2e page has (the app's smallest supported window). */
const VIEWPORT = { width: 1280, height: 800 };
/** The browser context every e2e page lives in: the smallest supported window, downloads kept, English (US). */
export const CONTEXT_OPTIONS = { viewport: VIEWPORT, acceptDownloads: true, locale: 'en-US' };
/** Playwright's own default timeout for actions and navigation. */
const PLAYWRIGHT_TIMEOUT = 30_000;
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
  /** The worker's browser context (storage, downloads, pages), emptied when a file's session starts. */
  context: BrowserContext;
  /** The worker's page, blank when the session starts. */
  page: Page;
  /** Console errors and uncaught page errors seen so far. */
  errors: string[];
  close(): Promise<void>;
}

let workerBrowser: Promise<Browser> | null = null;
let workerPage: Promise<WorkerPage> | null = null;
let builtOk: Promise<void> | null = null;

/** The worker's one page, and what a file may have added to it that the next file must not inherit. */
interface WorkerPage {
  context: BrowserContext;
  page: Page;
  /** The harness's own listeners, kept from file to file; every other listener belongs to a file. */
  keep: Set<unknown>;
  /** Init scripts the files added (page.addInitScript is wrapped to record them). */
  scripts: Disposable[];
}

async function newWorkerPage(browser: Browser): Promise<WorkerPage> {
  const context = await browser.newContext(CONTEXT_OPTIONS);
  const page = await context.newPage();
  // File choosers are intercepted from the start: Playwright turns interception on when the first 'filechooser'
  // listener is added, without waiting for it, so a `waitForEvent('filechooser')` just before a key press could lose
  // the race and let Chromium open its own dialog (seen once in app.test.ts's Ctrl+O, on a loaded machine). The
  // listener stays for the worker's life, so interception is never turned off and on again.
  const intercept = () => {};
  page.on('filechooser', intercept);
  const scripts: Disposable[] = [];
  const addInitScript = page.addInitScript.bind(page);
  page.addInitScript = (async (...args: Parameters<Page['addInitScript']>) => {
    const script = await addInitScript(...args);
    scripts.push(script);
    return script;
  }) as Page['addInitScript'];
  return { context, page, keep: new Set([intercept]), scripts };
}

/**
 * The worker's page as a new context would give it, without the cost of one: a new context and page start a renderer
 * process and a page (about 1.3 core-seconds with the app loaded), where loading the app again into the same page
 * costs about half (0.69 against 1.34 core-s of Chromium per file, measured 2026-12-03). What a file can leave behind
 * is undone here: other pages, its listeners, init scripts, routes, emulated media, viewport and timeouts, and the
 * origin's storage (the crash-recovery copies in IndexedDB, localStorage), which is cleared after the app has left
 * the page, so a copy the app writes as it goes is cleared too.
 */
async function resetPage(w: WorkerPage, url: string): Promise<void> {
  const { context, page } = w;
  await Promise.all(context.pages().filter((p) => p !== page).map((p) => p.close({ runBeforeUnload: false })));
  // Page is an event emitter at run time; its typings leave out the listing methods.
  const emitter = page as unknown as Pick<NodeJS.EventEmitter, 'eventNames' | 'listeners'>;
  for (const type of emitter.eventNames()) {
    for (const listener of emitter.listeners(type)) if (!w.keep.has(listener)) page.off(type as 'close', listener as () => void);
  }
  await Promise.all(w.scripts.splice(0).map((script) => script.dispose()));
  await page.unrouteAll({ behavior: 'ignoreErrors' });
  await context.unrouteAll({ behavior: 'ignoreErrors' });
  await page.emulateMedia({ media: null });
  await page.setViewportSize(VIEWPORT);
  page.setDefaultTimeout(PLAYWRIGHT_TIMEOUT);
  page.setDefaultNavigationTimeout(PLAYWRIGHT_TIMEOUT);
  if (page.url() !== 'about:blank') {
    // The app asks before leaving with unsaved work; the next file starts anew whatever the last one left.
    const leave = (d: Dialog) => void (d.type() === 'beforeunload' ? d.accept() : d.dismiss());
    page.on('dialog', leave);
    await page.goto('about:blank');
    page.off('dialog', leave);
  }
  const cdp = await context.newCDPSession(page);
  await cdp.send('Storage.clearDataForOrigin', { origin: new URL(url).origin, storageTypes: 'all' });
  await cdp.detach();
  await context.clearCookies();
  await context.clearPermissions();
}

/** Console errors and uncaught page errors of `page`, added to `errors` as they come. */
export function recordErrors(page: Page, errors: string[]): void {
  page.on('console', (m) => { if (m.type() === 'error') errors.push(`console: ${m.text()}`); });
  page.on('pageerror', (e) => errors.push(`page: ${e.message}`));
}

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
  // A file that closed the worker's page leaves the next one a new context and page.
  const last = await workerPage;
  if (last?.page.isClosed()) {
    await last.context.close().catch(() => {});
    workerPage = null;
  }
  workerPage ??= newWorkerPage(browser);
  const w = await workerPage;
  await resetPage(w, shared.url);
  const { context, page } = w;
  const errors: string[] = [];
  recordErrors(page, errors);
  return {
    url: shared.url, browser, context, page, errors,
    async close() {
      // Reset at once, so the app leaves the page (no timers or copies running into the next file); the next session
      // resets again, so a file that failed before closing leaves nothing behind either.
      await resetPage(w, shared.url).catch(() => {});
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
