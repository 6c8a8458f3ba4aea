/**
 * Profiling aid for the app while it draws (not part of `npm run bench`, which measures; this says where the time
 * goes): the flow of draws-app.ts on an unminified production build (MINIFY=1: minified), with Chromium's CPU profiler
 * (CDP Profiler, 0.2 ms sampling) and a trace of the renderer's main thread (devtools.timeline) running from Compute to
 * the bands on screen. Prints every main-thread task over 25 ms with its trace events by own time (style, layout,
 * paint, script…), and for each long task (over 50 ms, Long Tasks API) the functions with the most self and inclusive
 * time in it. TYPE=1 also types into the multiplier table's filter meanwhile, as draws-app.ts does; SCREEN=scenarios
 * draws a scenario instead. The profile is kept in bench-results/draws-app-N.cpuprofile (opens in Chromium's DevTools).
 *
 * Run alone: `npx tsx test/bench/profile-draws-app.ts [n] [draws]`.
 */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { build, preview } from 'vite';
import { chromium } from 'playwright-core';
import { CHROMIUM, CHROMIUM_ARGS, REPO } from '../e2e/harness.ts';
import { inventedFile, useTableFile } from './browser.ts';

interface TraceEvent { name: string; ph: string; pid: number; tid: number; ts: number; dur?: number; args?: { name?: string } }

const n = Number(process.argv[2] ?? 500);
const draws = Number(process.argv[3] ?? 200);
const { file, dir } = await inventedFile(n);
const configFile = join(REPO, 'renderer', 'vite.config.ts');
const outDir = mkdtempSync(join(tmpdir(), 'roundwise-profile-'));
await build({ configFile, logLevel: 'error', build: { outDir, emptyOutDir: true, minify: process.env.MINIFY === '1', reportCompressedSize: false } });
const server = await preview({ configFile, logLevel: 'error', build: { outDir }, preview: { port: 0, strictPort: false } });
const browser = await chromium.launch({ executablePath: CHROMIUM, args: CHROMIUM_ARGS, headless: true });
try {
  const page = await (await browser.newContext({ viewport: { width: 1280, height: 800 }, locale: 'en-US' })).newPage();
  page.setDefaultTimeout(300_000);
  await page.addInitScript(() => {
    window.__tasks = [];
    new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__tasks!.push({ start: e.startTime, duration: e.duration }); })
      .observe({ type: 'longtask', buffered: true });
  });
  await page.goto(server.resolvedUrls!.local[0]!);
  await page.getByTestId('verdict').waitFor();
  await useTableFile(page, file, n);
  await page.click(`[data-screen="${process.env.SCREEN ?? 'multipliers'}"]`);
  const panel = page.getByTestId('how-sure');
  await panel.getByTestId('band-draws').fill(String(draws));
  await panel.getByTestId('band-seed').fill('1');
  await panel.getByTestId('band-cv').fill('0.1');
  await page.waitForTimeout(1000);
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Profiler.enable');
  await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
  const t0 = await page.evaluate(() => performance.now());
  await cdp.send('Profiler.start');
  await browser.startTracing(page, { categories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'toplevel', 'v8.execute'] });
  await panel.getByTestId('band-compute').click();
  if (process.env.TYPE === '1') {
    const filter = page.locator('[data-testid="multiplier-table"] input[type="search"]').first();
    await filter.click();
    await filter.pressSequentially('Invented sector 12', { delay: 150 });
  }
  await panel.getByTestId('band-summary').waitFor();
  await page.waitForTimeout(500);
  const { profile } = await cdp.send('Profiler.stop');
  const events = (JSON.parse((await browser.stopTracing()).toString()) as { traceEvents: TraceEvent[] }).traceEvents;
  const t1 = await page.evaluate(() => performance.now());
  const long = await page.evaluate(([a, b]) => window.__tasks!.filter((t) => t.start + t.duration > a! && t.start < b!), [t0, t1]);
  writeFileSync(join(dir, `draws-app-${n}.cpuprofile`), JSON.stringify(profile));
  // Trace and profile timestamps are µs of one monotonic clock; the profile starts at t0 of the page's clock (± a few ms).
  const pageMs = (us: number) => (us - profile.startTime) / 1000;
  console.log(`${draws} draws at n=${n}: ${((t1 - t0) / 1000).toFixed(1)} s; long tasks: ${long.map((t) => `${t.duration.toFixed(0)} ms at +${(t.start - t0).toFixed(0)}`).join(', ') || 'none'}`);

  const main = events.find((e) => e.name === 'thread_name' && e.args?.name === 'CrRendererMain');
  const onMain = events.filter((e) => e.pid === main?.pid && e.tid === main?.tid && e.ph === 'X' && e.dur !== undefined);
  for (const t of onMain.filter((e) => e.name === 'RunTask' && e.dur! > 25_000)) {
    const inner = onMain.filter((e) => e !== t && e.ts >= t.ts && e.ts + e.dur! <= t.ts + t.dur!);
    const own = new Map<string, number>();
    for (const e of inner) {
      const children = inner.filter((c) => c !== e && c.ts >= e.ts && c.ts + c.dur! <= e.ts + e.dur!);
      own.set(e.name, (own.get(e.name) ?? 0) + Math.max(0, e.dur! - children.reduce((a, c) => a + c.dur!, 0)));
    }
    console.log(`task ${(t.dur! / 1000).toFixed(1)} ms at +${pageMs(t.ts).toFixed(0)}: ${[...own].sort((a, b) => b[1] - a[1]).slice(0, 8).map(([k, v]) => `${k} ${(v / 1000).toFixed(1)}`).join(', ')}`);
  }

  const nodes = new Map<number, (typeof profile.nodes)[number]>(profile.nodes.map((x) => [x.id, x]));
  const parent = new Map<number, number>();
  for (const x of profile.nodes) for (const c of x.children ?? []) parent.set(c, x.id);
  const stack = (id: number) => {
    const out: string[] = [];
    for (let k: number | undefined = id; k !== undefined; k = parent.get(k)) {
      const f = nodes.get(k)!.callFrame;
      out.push(`${f.functionName || '(anonymous)'} ${f.url.split('/').pop()}:${f.lineNumber + 1}`);
    }
    return out;
  };
  const deltas = profile.timeDeltas ?? [];
  let ts = profile.startTime;
  const samples = (profile.samples ?? []).map((id, i) => { ts += deltas[i]!; return { t: pageMs(ts) + t0, id, dt: (deltas[i + 1] ?? 0) / 1000 }; });
  for (const w of long) {
    const self = new Map<string, number>();
    const incl = new Map<string, number>();
    for (const { id, dt } of samples.filter((x) => x.t >= w.start && x.t <= w.start + w.duration)) {
      const s = stack(id);
      self.set(s[0]!, (self.get(s[0]!) ?? 0) + dt);
      for (const f of new Set(s)) incl.set(f, (incl.get(f) ?? 0) + dt);
    }
    const top = (m: Map<string, number>, k: number) => [...m].sort((p, q) => q[1] - p[1]).slice(0, k).map(([f, v]) => `  ${v.toFixed(1).padStart(6)} ms  ${f}`).join('\n');
    console.log(`\nlong task ${w.duration.toFixed(0)} ms at +${(w.start - t0).toFixed(0)}\n self:\n${top(self, 12)}\n inclusive:\n${top(incl, 30)}`);
  }
} finally {
  await browser.close();
  await server.close();
  rmSync(outDir, { recursive: true, force: true });
}
