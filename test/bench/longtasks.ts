/**
 * Long main-thread tasks in the app while it imports and analyses a large table: the app as the bench runs it
 * (browser.ts: the production build served by test/e2e/built-renderer.ts, Debian's Chromium, a page recording long tasks from its
 * first script), the file given to the import screen's file input, accepted, then the multiplier table shown.
 * A long task is one that kept the main thread busy for more than 50 ms (the Long Tasks API's definition).
 */
import { CHROMIUM } from '../e2e/harness.ts';
import { startBenchApp } from './browser.ts';

export interface LongTasks {
  n: number;
  /** Wall time from choosing the file to the multiplier table on screen. */
  totalMs: number;
  /** Start and duration of each long task, start relative to choosing the file, with the phase it fell in. */
  tasks: { startMs: number; durationMs: number; phase: string }[];
  maxMs: number;
  over100: number;
}

export async function appLongTasks(file: string, n: number): Promise<LongTasks | { skipped: string }> {
  const app = await startBenchApp();
  if (app === null) return { skipped: `no Chromium at ${CHROMIUM}` };
  try {
    const page = await app.newPage(60_000);
    await page.goto(app.url);
    await page.getByTestId('verdict').waitFor({ timeout: 60_000 });
    await page.click('[data-screen="import"]');
    await page.evaluate(() => { window.__tasks = []; });
    const now = (): Promise<number> => page.evaluate(() => performance.now());
    const t0 = await now();
    await page.getByTestId('file-input').setInputFiles(file);
    await page.getByTestId('accept-import').waitFor({ state: 'visible', timeout: 120_000 });
    const tPreview = await now();
    await page.getByTestId('accept-import').click({ timeout: 120_000 });
    await page.waitForFunction((label) => document.querySelector('[data-testid="table-name"]')?.textContent?.includes(label), `${n.toLocaleString('en-US')} sectors`, { timeout: 180_000 });
    const tAnalysed = await now();
    await page.click('[data-screen="multipliers"]');
    await page.getByTestId('multiplier-table').waitFor({ timeout: 60_000 });
    const tShown = await now();
    await page.waitForTimeout(200); // let the observer deliver the last entries
    const raw = await page.evaluate(() => window.__tasks ?? []);
    const phase = (t: number): string => (t < tPreview ? 'reading and preview' : t < tAnalysed ? 'import and analysis' : t < tShown ? 'multiplier screen' : 'after');
    const tasks = raw.map((t) => ({ startMs: t.start - t0, durationMs: t.duration, phase: phase(t.start) }));
    return { n, totalMs: tShown - t0, tasks, maxMs: Math.max(0, ...tasks.map((t) => t.durationMs)), over100: tasks.filter((t) => t.durationMs > 100).length };
  } finally {
    await app.close();
  }
}
