/**
 * Median over several `npm run bench` runs (the machine may be shared: one run is never the whole story).
 * Usage: tsx test/bench/summary.ts [N]   — reads the newest N (default 3) bench-results/bench-*.json and prints, per
 * size, the median over runs of each run's median, as a Markdown table for README.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { median } from './timing.ts';

type T = { medianMs: number } | null | undefined;
interface Run {
  started: string; loadBefore: number[]; loadAfter: number[];
  machine: { cpu: string; cores: number; node: string; numpy: string | null };
  rows: Array<{ n: number; luOurs: T; luThreads: T; luOursJs: T; luReference: T; luMl: T; invOurs: T; invThreads: T; invMl: T; invNumpy: T; residual: number; peakMB: number | null }>;
  jobs?: Array<{ n: number; csvMB: number; importMs: T; prepareMs: T; analysisMs: T; scenarioMs: T }>;
  clis?: Array<{ n: number; ours: T & { peakMB?: number | null }; numpy: T & { peakMB?: number | null }; maxRelDiff: number | null }>;
  app?: { n: number; totalMs: number; maxMs: number; over100: number; tasks: unknown[] } | { skipped: string };
}

const dir = join(process.cwd(), 'bench-results');
const count = Number(process.argv[2] ?? 3);
const files = readdirSync(dir).filter((f) => /^bench-.*\.json$/.test(f)).sort().slice(-count);
const runs = files.map((f) => JSON.parse(readFileSync(join(dir, f), 'utf8')) as Run);
if (runs.length === 0) { console.log('no bench-results/bench-*.json yet: run `npm run bench` first'); process.exit(1); }

const fmt = (ms: number | null): string => (ms === null ? '—' : ms < 10 ? ms.toFixed(2) + ' ms' : ms < 1000 ? ms.toFixed(0) + ' ms' : (ms / 1000).toFixed(2) + ' s');
const med = (xs: Array<number | null | undefined>): number | null => {
  const v = xs.filter((x): x is number => typeof x === 'number' && Number.isFinite(x));
  return v.length ? median(v) : null;
};
const sizes = [...new Set(runs.flatMap((r) => r.rows.map((x) => x.n)))].sort((a, b) => a - b);
function cell<R extends { n: number }>(pick: (r: Run) => R[] | undefined, n: number, get: (row: R) => number | null | undefined): number | null {
  return med(runs.map((r) => { const row = pick(r)?.find((x) => x.n === n); return row ? get(row) : null; }));
}
const row = (cells: string[]): string => `| ${cells.join(' | ')} |`;

console.log(`${runs.length} runs (${runs.map((r) => r.started).join(', ')}); ${runs[0]!.machine.cpu}, ${runs[0]!.machine.cores} cores, Node ${runs[0]!.machine.node}, numpy ${runs[0]!.machine.numpy ?? '—'}`);
console.log(`load average (1 min) at the starts: ${runs.map((r) => r.loadBefore[0]!.toFixed(1)).join(', ')}`);
console.log();
console.log(row(['n', 'LU', 'LU 2 threads', 'LU, JS kernel', 'LU unblocked', 'LU ml-matrix', 'inverse', 'inverse 2 threads', 'inverse ml-matrix', 'inverse numpy', 'ours/numpy', 'ml-matrix/ours']));
console.log(row(Array(12).fill('---')));
for (const n of sizes) {
  const g = (f: (x: Run['rows'][number]) => T): number | null => cell((r) => r.rows, n, (x) => f(x)?.medianMs);
  const inv = g((x) => x.invOurs), invT = g((x) => x.invThreads), np = g((x) => x.invNumpy), ml = g((x) => x.invMl);
  const best = Math.min(inv ?? Infinity, invT ?? Infinity);
  console.log(row([String(n), fmt(g((x) => x.luOurs)), fmt(g((x) => x.luThreads)), fmt(g((x) => x.luOursJs)), fmt(g((x) => x.luReference)), fmt(g((x) => x.luMl)),
    fmt(inv), fmt(invT), fmt(ml), fmt(np), np ? (best / np).toFixed(1) + '×' : '—', ml ? (ml / best).toFixed(0) + '×' : '—']));
}
console.log();
console.log(row(['n', 'CSV', 'import', 'prepare', 'full analysis', 'one scenario', 'CLI analyze --json', 'numpy script', 'CLI/numpy', 'peak RSS (CLI)', 'max rel. diff']));
console.log(row(Array(11).fill('---')));
for (const n of sizes) {
  const j = (f: (x: NonNullable<Run['jobs']>[number]) => number | null | undefined): number | null => cell((r) => r.jobs, n, f);
  const c = (f: (x: NonNullable<Run['clis']>[number]) => number | null | undefined): number | null => cell((r) => r.clis, n, f);
  const ours = c((x) => x.ours?.medianMs), np = c((x) => x.numpy?.medianMs), peak = c((x) => x.ours?.peakMB), diff = c((x) => x.maxRelDiff);
  const csv = j((x) => x.csvMB);
  console.log(row([String(n), csv === null ? '—' : `${csv.toFixed(1)} MB`, fmt(j((x) => x.importMs?.medianMs)), fmt(j((x) => x.prepareMs?.medianMs)), fmt(j((x) => x.analysisMs?.medianMs)),
    fmt(j((x) => x.scenarioMs?.medianMs)), fmt(ours), fmt(np), ours && np ? (ours / np).toFixed(2) + '×' : '—', peak === null ? '—' : `${peak.toFixed(0)} MB`, diff === null ? '—' : diff.toExponential(1)]));
}
const apps = runs.map((r) => r.app).filter((a): a is Exclude<Run['app'], { skipped: string } | undefined> => !!a && !('skipped' in a));
if (apps.length) console.log(`\napp at n=${apps[0]!.n}: longest main-thread task per run ${apps.map((a) => fmt(a.maxMs)).join(', ')}; tasks over 100 ms per run ${apps.map((a) => a.over100).join(', ')}`);
