/**
 * The app while it draws: Debian's Chromium (playwright-core) on the production build (browser.ts), an invented table of n sectors
 * imported, the Multipliers screen's "How sure?" panel computing Monte Carlo bands (the draws run in the engine worker,
 * a range at a time, the main thread only showing progress), and the multiplier table's filter typed into while it
 * draws. Measured in the page: long tasks (PerformanceObserver 'longtask', the main thread busy over 50 ms) from the
 * click on Compute to the bands on screen, and keystroke latency (Event Timing 'event' entries, key event to the next
 * paint) of the typing done meanwhile.
 *
 * Run alone: `npx tsx test/bench/draws-app.ts [n] [draws]`; `npm run bench` runs it at 500 sectors.
 */
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import type { Page } from 'playwright-core';
import { inventedFile, pageWithTable, startBenchApp } from './browser.ts';
import { CHROMIUM } from '../e2e/harness.ts';


export interface DrawingApp {
  n: number;
  draws: number;
  /** Compute clicked to the bands' summary on screen. */
  wallMs: number;
  longTasks: number;
  longestTaskMs: number;
  /** Keystroke to paint of the keys typed into the multiplier filter while drawing. */
  keysTyped: number;
  keyMedianMs: number;
  keyMaxMs: number;
  /** The same typing and wait with no draws running, just before (what the machine and the page do anyway). */
  baseline: { wallMs: number; longTasks: number; longestTaskMs: number; keysTyped: number; keyMedianMs: number; keyMaxMs: number };
}

const now = (page: Page): Promise<number> => page.evaluate(() => performance.now());

export async function drawingApp(file: string, n: number, draws: number): Promise<DrawingApp | { skipped: string }> {
  const app = await startBenchApp();
  if (!app) return { skipped: `no Chromium at ${CHROMIUM}` };
  try {
    const page = await pageWithTable(app, file, n);
    await page.click('[data-screen="multipliers"]');
    await page.locator('[data-testid="multiplier-table"] tbody tr').first().waitFor();
    const filter = page.locator('[data-testid="multiplier-table"] input[type="search"]').first();
    const typeWhile = async (done: () => Promise<unknown>) => {
      await filter.click();
      await filter.fill('');
      await filter.pressSequentially('Invented sector 12', { delay: 150 });
      await done();
    };
    const measure = async (a: number, b: number) => {
      const tasks = await page.evaluate(([x, y]) => (window.__tasks ?? []).filter((t) => t.start + t.duration > x! && t.start < y!), [a, b]);
      const keys = (await page.evaluate(([x, y]) => (window.__keys ?? []).filter((k) => k.name === 'keydown' && k.start >= x! && k.start <= y!), [a, b])).map((k) => k.duration).sort((x, y) => x - y);
      return {
        wallMs: b - a, longTasks: tasks.length, longestTaskMs: Math.max(0, ...tasks.map((t) => t.duration)),
        keysTyped: keys.length, keyMedianMs: keys.length ? keys[Math.floor(keys.length / 2)]! : 0, keyMaxMs: keys.at(-1) ?? 0,
      };
    };
    // Baseline: the same typing with nothing drawing.
    const b0 = await now(page);
    await typeWhile(() => page.waitForTimeout(1000));
    const b1 = await now(page);
    await page.waitForTimeout(300);
    const baseline = await measure(b0, b1);
    await filter.fill('');
    const panel = page.getByTestId('how-sure');
    await panel.getByTestId('band-draws').fill(String(draws));
    await panel.getByTestId('band-seed').fill('1');
    await panel.getByTestId('band-cv').fill('0.1');
    await page.waitForTimeout(500);
    const t0 = await now(page);
    await panel.getByTestId('band-compute').click();
    // Type into the table's filter while the worker draws (slowly, as a person types), then wait for the bands.
    await typeWhile(() => panel.getByTestId('band-summary').waitFor());
    const t1 = await now(page);
    await page.waitForTimeout(300);
    return { n, draws, ...(await measure(t0, t1)), baseline };
  } finally {
    await app.close();
  }
}

export function drawingAppLine(r: DrawingApp | { skipped: string }): string {
  if ('skipped' in r) return `App while drawing: ${r.skipped}.`;
  const keys = r.keysTyped ? `; ${r.keysTyped} keystrokes typed meanwhile, key event to paint median ${r.keyMedianMs.toFixed(0)} ms, worst ${r.keyMaxMs.toFixed(0)} ms (Event Timing reports only events over 16 ms)` : '; no keystroke over 16 ms to paint while drawing';
  const b = r.baseline;
  return `App while drawing (Chromium, production build, n=${r.n}, ${r.draws} draws in the engine worker): ${(r.wallMs / 1000).toFixed(1)} s from Compute to the bands; ${r.longTasks} main-thread task(s) over 50 ms${r.longTasks ? `, longest ${r.longestTaskMs.toFixed(0)} ms` : ''}${keys}. Baseline, the same typing with nothing drawing (${(b.wallMs / 1000).toFixed(1)} s): ${b.longTasks} task(s) over 50 ms${b.longTasks ? `, longest ${b.longestTaskMs.toFixed(0)} ms` : ''}, keystrokes median ${b.keyMedianMs.toFixed(0)} ms, worst ${b.keyMaxMs.toFixed(0)} ms (${b.keysTyped} over 16 ms).`;
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) {
  const n = Number(process.argv[2] ?? 500);
  const draws = Number(process.argv[3] ?? 200);
  const { file, dir } = await inventedFile(n);
  const r = await drawingApp(file, n, draws);
  console.log(drawingAppLine(r));
  writeFileSync(join(dir, `draws-app-${n}.json`), JSON.stringify(r, null, 2));
}
