/**
 * The app as the bench measures it in Debian's Chromium (playwright-core, the e2e harness's flags): the renderer as
 * shipped (../e2e/built-renderer.ts, not the dev server's on-demand modules), one browser, and pages that record from
 * their first script on the main thread's long tasks (Long Tasks API: busy over 50 ms) and key events' latency (Event
 * Timing: event to the next paint, entries over 16 ms).
 */
import { existsSync, mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, type Browser, type Page } from 'playwright-core';
import { CHROMIUM, CHROMIUM_ARGS } from '../e2e/harness.ts';
import { serveBuiltRenderer } from '../e2e/built-renderer.ts';

const REPO = fileURLToPath(new URL('../..', import.meta.url));

declare global {
  interface Window {
    __tasks?: { start: number; duration: number }[];
    __keys?: { name: string; start: number; duration: number }[];
  }
}

export interface BenchApp {
  url: string;
  browser: Browser;
  /** A 1280×800 page (en-US) recording long tasks into `window.__tasks` and key events into `window.__keys`. */
  newPage(timeoutMs: number): Promise<Page>;
  close(): Promise<void>;
}

/** null when there is no Chromium (the bench then says the app part was skipped, and why); `minify: false` for profiles. */
export async function startBenchApp(opts: { minify?: boolean } = {}): Promise<BenchApp | null> {
  if (!existsSync(CHROMIUM)) return null;
  const app = await serveBuiltRenderer(opts);
  await app.ready;
  const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
  return {
    url: app.url,
    browser,
    async newPage(timeoutMs) {
      const page = await (await browser.newContext({ viewport: { width: 1280, height: 800 }, locale: 'en-US' })).newPage();
      page.setDefaultTimeout(timeoutMs);
      await page.addInitScript(() => {
        window.__tasks = [];
        window.__keys = [];
        new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__tasks!.push({ start: e.startTime, duration: e.duration }); })
          .observe({ type: 'longtask', buffered: true });
        new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__keys!.push({ name: e.name, start: e.startTime, duration: e.duration }); })
          .observe({ type: 'event', durationThreshold: 16, buffered: true } as PerformanceObserverInit);
      });
      return page;
    },
    async close() {
      await browser.close().catch(() => {});
      await app.close();
    },
  };
}

/** For a bench part run alone: the invented n-sector table in bench-results/ (written once), and where its result goes. */
export async function inventedFile(n: number): Promise<{ file: string; dir: string }> {
  const dir = join(REPO, 'bench-results');
  mkdirSync(dir, { recursive: true });
  const file = join(dir, `invented-${n}.csv`);
  if (!existsSync(file)) {
    const { jobCsv } = await import('./job.ts');
    writeFileSync(file, jobCsv(n));
  }
  return { file, dir };
}

/** Until the table of n sectors is the table in use and no work is in progress. */
export function tableInUse(page: Page, n: number): Promise<unknown> {
  return page.waitForFunction((s) => document.querySelector('[data-testid="table-name"]')?.textContent?.includes(s) && !document.querySelector('[data-testid="progress"]'), `${n.toLocaleString('en-US')} sectors`);
}

/** A new page of the app, loaded (the sample's verdict shown), then `file` chosen on the Import screen and accepted: its n sectors are the table in use. */
export async function pageWithTable(app: BenchApp, file: string, n: number): Promise<Page> {
  const page = await app.newPage(300_000);
  await page.goto(app.url);
  await page.getByTestId('verdict').waitFor();
  await page.click('[data-screen="import"]');
  await page.getByTestId('file-input').setInputFiles(file);
  await page.locator('[data-testid="accept-import"]:not([disabled])').waitFor();
  await page.getByTestId('accept-import').click();
  await tableInUse(page, n);
  return page;
}

/**
 * Where the profiling aids start: the invented n-sector table, the built app (unminified unless MINIFY=1) and a page
 * with that table in use. The app is closed again when getting there fails.
 */
export async function appOnInventedTable(n: number): Promise<{ app: BenchApp; page: Page; dir: string }> {
  const { file, dir } = await inventedFile(n);
  const app = await startBenchApp({ minify: process.env.MINIFY === '1' });
  if (!app) throw new Error(`no Chromium at ${CHROMIUM}`);
  try {
    return { app, page: await pageWithTable(app, file, n), dir };
  } catch (e) {
    await app.close();
    throw e;
  }
}
