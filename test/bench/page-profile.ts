/**
 * Where a page's main-thread time goes, for the profiling scripts (profile-draws-app.ts, profile-screen.ts; not part
 * of `npm run bench`, which measures): Chromium's CPU profiler (CDP Profiler, 0.2 ms sampling) and a trace of the
 * renderer's main thread (devtools.timeline) over what `act` does. Reports every main-thread task over 25 ms (wall
 * time, and the thread's CPU time, which a loaded machine inflates less) with its trace events by own time (style,
 * layout, paint, script, messages…), the long tasks the page saw (Long Tasks API, the page's `window.__tasks`), and
 * for each traced task over 50 ms the functions with the most self and inclusive time in it.
 */
import type { Browser, Page } from 'playwright-core';

interface TraceEvent { name: string; ph: string; pid: number; tid: number; ts: number; dur?: number; tdur?: number; args?: { name?: string; beginData?: Record<string, unknown> } }

export interface PageProfile {
  /** The long tasks, one line per main-thread task over 25 ms, then one block per task over 50 ms. */
  report: string[];
  /** The CPU profile (opens in Chromium's DevTools as a .cpuprofile file). */
  profile: unknown;
  /** The trace's events (opens in Chromium's DevTools performance panel as `{ "traceEvents": … }`). */
  trace: unknown[];
  /** Long tasks (Long Tasks API) in the profiled window, start relative to its beginning. */
  long: { startMs: number; durationMs: number }[];
  wallMs: number;
}

/** Profile and trace the page while `act` runs (it should return once the page has settled); `cpu: false` traces only. */
export async function profilePage(browser: Browser, page: Page, act: () => Promise<unknown>, opts: { cpu?: boolean } = {}): Promise<PageProfile> {
  const cpu = opts.cpu ?? true; // false: the trace alone (the sampling profiler adds to the script's time)
  const cdp = await page.context().newCDPSession(page);
  await cdp.send('Profiler.enable');
  await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
  const t0 = await page.evaluate(() => performance.now());
  if (cpu) await cdp.send('Profiler.start');
  await browser.startTracing(page, { categories: ['devtools.timeline', 'disabled-by-default-devtools.timeline', 'toplevel', 'v8.execute'] });
  await act();
  const profile = cpu ? (await cdp.send('Profiler.stop')).profile : { nodes: [], startTime: 0, endTime: 0, samples: [], timeDeltas: [] };
  const events = (JSON.parse((await browser.stopTracing()).toString()) as { traceEvents: TraceEvent[] }).traceEvents;
  const t1 = await page.evaluate(() => performance.now());
  const long = await page.evaluate(([a, b]) => (window.__tasks ?? []).filter((t) => t.start + t.duration > a! && t.start < b!), [t0, t1]);
  await cdp.detach();
  const report: string[] = [];
  // Trace and profile timestamps are µs of one monotonic clock; the profile starts at t0 of the page's clock (± a few ms).
  const origin = cpu ? profile.startTime : events.reduce((m, e) => (e.ts > 0 && e.ts < m ? e.ts : m), Infinity);
  const pageMs = (us: number) => (us - origin) / 1000;
  report.push(`${((t1 - t0) / 1000).toFixed(2)} s; long tasks: ${long.map((t) => `${t.duration.toFixed(0)} ms at +${(t.start - t0).toFixed(0)}`).join(', ') || 'none'}`);

  const main = events.find((e) => e.name === 'thread_name' && e.args?.name === 'CrRendererMain');
  const onMain = events.filter((e) => e.pid === main?.pid && e.tid === main?.tid && e.ph === 'X' && e.dur !== undefined);
  for (const t of onMain.filter((e) => e.name === 'RunTask' && e.dur! > 25_000)) {
    const inner = onMain.filter((e) => e !== t && e.ts >= t.ts && e.ts + e.dur! <= t.ts + t.dur!);
    const own = new Map<string, number>();
    for (const e of inner) {
      const children = inner.filter((c) => c !== e && c.ts >= e.ts && c.ts + c.dur! <= e.ts + e.dur!);
      own.set(e.name, (own.get(e.name) ?? 0) + Math.max(0, e.dur! - children.reduce((a, c) => a + c.dur!, 0)));
    }
    report.push(`task ${(t.dur! / 1000).toFixed(1)} ms (thread CPU ${((t.tdur ?? 0) / 1000).toFixed(1)} ms) at +${pageMs(t.ts).toFixed(0)}: ${[...own].sort((a, b) => b[1] - a[1]).slice(0, 10).map(([k, v]) => `${k} ${(v / 1000).toFixed(1)}`).join(', ')}`);
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
  // Samples and trace events carry times of one monotonic clock (µs), so a task's samples are those inside its span.
  const deltas = profile.timeDeltas ?? [];
  let ts = profile.startTime;
  const samples = (profile.samples ?? []).map((id, i) => { ts += deltas[i]!; return { ts, id, dt: (deltas[i + 1] ?? 0) / 1000 }; });
  for (const t of onMain.filter((e) => e.name === 'RunTask' && e.dur! > 50_000)) {
    const self = new Map<string, number>();
    const incl = new Map<string, number>();
    for (const { id, dt } of samples.filter((x) => x.ts >= t.ts && x.ts <= t.ts + t.dur!)) {
      const s = stack(id);
      self.set(s[0]!, (self.get(s[0]!) ?? 0) + dt);
      for (const f of new Set(s)) incl.set(f, (incl.get(f) ?? 0) + dt);
    }
    const top = (m: Map<string, number>, k: number) => [...m].sort((p, q) => q[1] - p[1]).slice(0, k).map(([f, v]) => `  ${v.toFixed(1).padStart(6)} ms  ${f}`).join('\n');
    report.push(`\ntask ${(t.dur! / 1000).toFixed(1)} ms at +${pageMs(t.ts).toFixed(0)}\n self:\n${top(self, 12)}\n inclusive:\n${top(incl, 40)}`);
  }
  return { report, profile, trace: events, long: long.map((t) => ({ startMs: t.start - t0, durationMs: t.duration })), wallMs: t1 - t0 };
}
