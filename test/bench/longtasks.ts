/**
 * Long main-thread tasks in the app while it imports and analyses a large table: the renderer in Debian's Chromium
 * (the end-to-end suite's global setup, run here outside vitest: the production build served by Vite's preview server,
 * one Chromium through playwright-core), a PerformanceObserver for 'longtask' entries installed
 * before the page loads, the file given to the import screen's file input, accepted, then the multiplier table shown.
 * A long task is one that kept the main thread busy for more than 50 ms (the Long Tasks API's definition).
 */
import { existsSync } from 'node:fs';
import { chromium } from 'playwright-core';
import type { TestProject } from 'vitest/node';
import { CHROMIUM } from '../e2e/harness.ts';
import setupE2e from '../e2e/global-setup.ts';

export interface LongTasks {
  n: number;
  /** Wall time from choosing the file to the multiplier table on screen. */
  totalMs: number;
  /** Start and duration of each long task, start relative to choosing the file, with the phase it fell in. */
  tasks: { startMs: number; durationMs: number; phase: string }[];
  maxMs: number;
  over100: number;
}

declare global {
  interface Window { __longTasks?: { startMs: number; durationMs: number }[] }
}

export async function appLongTasks(file: string, n: number): Promise<LongTasks | { skipped: string }> {
  if (!existsSync(CHROMIUM)) return { skipped: `no Chromium at ${CHROMIUM}` };
  let shared: { url: string; wsEndpoint: string } | null = null;
  const teardown = await setupE2e({ provide: (_key: string, value: typeof shared) => { shared = value; } } as unknown as TestProject);
  const started = shared as { url: string; wsEndpoint: string } | null;
  if (started === null) { await teardown(); return { skipped: 'the e2e setup did not start a server and a browser' }; }
  const browser = await chromium.connect(started.wsEndpoint);
  const s = { url: started.url, page: await (await browser.newContext({ viewport: { width: 1280, height: 800 }, locale: 'en-US' })).newPage() };
  try {
    const page = s.page;
    await page.addInitScript(() => {
      window.__longTasks = [];
      new PerformanceObserver((list) => {
        for (const e of list.getEntries()) window.__longTasks!.push({ startMs: e.startTime, durationMs: e.duration });
      }).observe({ type: 'longtask', buffered: true });
    });
    await page.goto(s.url);
    await page.getByTestId('verdict').waitFor({ timeout: 60_000 });
    await page.click('[data-screen="import"]');
    await page.evaluate(() => { window.__longTasks = []; });
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
    const raw = await page.evaluate(() => window.__longTasks ?? []);
    const phase = (t: number): string => (t < tPreview ? 'reading and preview' : t < tAnalysed ? 'import and analysis' : t < tShown ? 'multiplier screen' : 'after');
    const tasks = raw.map((t) => ({ startMs: t.startMs - t0, durationMs: t.durationMs, phase: phase(t.startMs) }));
    return { n, totalMs: tShown - t0, tasks, maxMs: Math.max(0, ...tasks.map((t) => t.durationMs)), over100: tasks.filter((t) => t.durationMs > 100).length };
  } finally {
    await browser.close().catch(() => {});
    await teardown();
  }
}
