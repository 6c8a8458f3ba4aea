/**
 * `npm run bench`: dense kernels, and the whole job when its parts exist, on seeded invented matrices of
 * n = 50, 200, 500, 1000, 2000, side by side with ml-matrix and (when python3 has numpy) numpy/OpenBLAS.
 * Prints a table and writes JSON to bench-results/. Options: --sizes 50,200  --quick (fewer repeats)  --pairs K (runs of
 * each whole job, default 5)  --no-app (skip the app in Chromium: the import run and every screen, app-screens.ts)  --large N (the large-table run, default 5000; 0 skips)
 * --whole (the whole-process jobs only: no kernel rows, no in-process job rows).
 * Speed is measured here only, never in unit tests.
 */
import { mkdirSync, writeFileSync, readFileSync } from 'node:fs';
import { cpus, loadavg, totalmem } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { Matrix, LuDecomposition, inverse as mlInverse } from 'ml-matrix';
import { luFactor, luInverse, scaledResidual, setKernelMode } from '../../src/linalg/index.ts';
import { luFactorReference } from '../../src/linalg/lu-reference.ts';
import { leontiefMatrix } from './matrices.ts';
import { time, runsFor, type Timing } from './timing.ts';
import { numpyAvailable, numpyInverse, type NumpyTiming } from './numpy.ts';
import { benchJob, jobCsv, type JobRow } from './job.ts';
import { analyzeJob, scenarioJob, pythonExecutable, EQUAL_TOLERANCE, type PairedJob } from './cli-job.ts';
import { appLongTasks, type LongTasks } from './longtasks.ts';
import { appScreens, printAppRun, type AppRun } from './app-screens.ts';
import { benchDraws, type DrawsBench } from './draws.ts';
import { drawingApp, drawingAppLine, type DrawingApp } from './draws-app.ts';
import { startParallelKernels, parallelKernelsReady, stopParallelKernels } from '../../src/cli/parallel.ts';

const args = process.argv.slice(2);
const sizesArg = args[args.indexOf('--sizes') + 1];
const SIZES = args.includes('--sizes') && sizesArg ? sizesArg.split(',').map(Number) : [50, 200, 500, 1000, 2000];
const QUICK = args.includes('--quick');
const option = (name: string, fallback: number): number => (args.includes(name) ? Number(args[args.indexOf(name) + 1]) : fallback);
/** Pairs (ours, numpy) of each whole job. */
const PAIRS = option('--pairs', QUICK ? 1 : 5);
/** Sectors of the large-table run (0: skipped). */
const LARGE = option('--large', 5000);
/** Only the whole-process jobs (the kernels and the in-process job are skipped). */
const WHOLE = args.includes('--whole');
/** ml-matrix's inverse is skipped above n = 1000 when the n = 1000 time predicts more than this (O(n³) scaling). */
const ML_INVERSE_BUDGET_MS = 40_000;
/** Helper threads for the threaded runs: one per extra core. */
const HELPERS = cpus().length - 1;

const outDir = join(process.cwd(), 'bench-results');
mkdirSync(outDir, { recursive: true });

function cpuModel(): string {
  try {
    const line = readFileSync('/proc/cpuinfo', 'utf8').split('\n').find((l) => l.startsWith('model name'));
    return line ? line.split(':')[1]!.trim() : cpus()[0]?.model ?? 'unknown';
  } catch { return cpus()[0]?.model ?? 'unknown'; }
}

interface Row {
  n: number;
  luOurs: Timing; luOursJs: Timing; luThreads: Timing | null; invThreads: Timing | null; luReference: Timing | null; luMl: Timing | null;
  invOurs: Timing; invMl: Timing | null; invMlSkipped: string | null; invNumpy: NumpyTiming | null;
  residual: number; peakMB: number | null; baselineMB: number | null;
}

const fmt = (ms: number | null | undefined): string => (ms == null ? '—' : ms < 10 ? ms.toFixed(2) : ms < 1000 ? ms.toFixed(1) : (ms / 1000).toFixed(2) + ' s');
const ratio = (a: number | null | undefined, b: number | null | undefined): string => (a == null || b == null ? '—' : (a / b).toFixed(2) + '×');

const numpyVersion = numpyAvailable();
const loadBefore = loadavg();
const started = new Date();
const rows: Row[] = [];
let mlInverse1000: number | null = null;

for (const n of WHOLE ? [] : SIZES) {
  const m = leontiefMatrix(n);
  const runs = QUICK ? Math.max(1, Math.ceil(runsFor(n) / 3)) : runsFor(n);
  process.stderr.write(`n=${n}: ours…`);
  setKernelMode('auto');
  const luOurs = time(() => luFactor(m, n), runs);
  const invOurs = time(() => luInverse(luFactor(m, n)), runs);
  const residual = scaledResidual(m, luInverse(luFactor(m, n)), n);
  setKernelMode('js');
  const luOursJs = time(() => luFactor(m, n), runs);
  setKernelMode('auto');
  let luThreads: Timing | null = null;
  let invThreads: Timing | null = null;
  if (HELPERS > 0) {
    process.stderr.write(` ${HELPERS + 1} threads…`);
    startParallelKernels(HELPERS);
    if ((await parallelKernelsReady()) === HELPERS) {
      luThreads = time(() => luFactor(m, n), runs);
      invThreads = time(() => luInverse(luFactor(m, n)), runs);
    }
    await stopParallelKernels();
  }
  process.stderr.write(' reference…');
  const luReference = n <= 2000 ? time(() => luFactorReference(m, n), n >= 1000 ? 1 : runs, n >= 1000 ? 0 : 1) : null;
  process.stderr.write(' ml-matrix…');
  const mm = new Matrix(Array.from({ length: n }, (_, i) => Array.from(m.subarray(i * n, (i + 1) * n))));
  const mlRuns = n >= 1000 ? 1 : runs;
  const luMl = time(() => new LuDecomposition(mm), mlRuns, n >= 1000 ? 0 : 1);
  let invMl: Timing | null = null;
  let invMlSkipped: string | null = null;
  const predicted = mlInverse1000 !== null ? mlInverse1000 * (n / 1000) ** 3 : 0;
  if (n > 1000 && predicted > ML_INVERSE_BUDGET_MS) {
    invMlSkipped = `skipped: n=1000 took ${fmt(mlInverse1000)}, so n=${n} would take about ${fmt(predicted)} (over ${ML_INVERSE_BUDGET_MS / 1000} s)`;
  } else {
    invMl = time(() => mlInverse(mm), mlRuns, n >= 1000 ? 0 : 1);
    if (n === 1000) mlInverse1000 = invMl.medianMs;
  }
  process.stderr.write(' numpy…');
  const invNumpy = numpyVersion ? numpyInverse(m, n, QUICK ? 3 : Math.max(5, runs), join(outDir, `matrix-${n}.f64`)) : null;
  process.stderr.write(' memory…');
  const child = spawnSync(process.execPath, ['--import', 'tsx', join('test', 'bench', 'memory-child.ts'), 'inverse', String(n)], { encoding: 'utf8' });
  const mem = child.status === 0 ? (JSON.parse(child.stdout) as { baselineMB: number; peakMB: number }) : null;
  process.stderr.write(' done\n');
  rows.push({ n, luOurs, luOursJs, luThreads, invThreads, luReference, luMl, invOurs, invMl, invMlSkipped, invNumpy, residual, peakMB: mem?.peakMB ?? null, baselineMB: mem?.baselineMB ?? null });
}

/** The bench's shock: a final-demand line, a fixed output and a jobs line (invented amounts), paths to sector 10 (or the last). */
function shockFile(n: number): { file: string; destination: string } {
  const file = join(outDir, 'shock.csv');
  writeFileSync(file, 'sector,amount,kind,local_share,note\nInvented sector 1,25000,final-demand,0.8,new plant sales (invented)\n'
    + 'Invented sector 2,10000,output,,contract (invented)\nInvented sector 3,50,jobs,,new jobs (invented)\n');
  return { file, destination: `Invented sector ${Math.min(10, n)}` };
}

const jobs: JobRow[] = [];
const clis: PairedJob[] = [];
const scenarios: PairedJob[] = [];
for (const n of SIZES) {
  process.stderr.write(`job n=${n}…`);
  const csv = jobCsv(n);
  if (!WHOLE) jobs.push(benchJob(n, QUICK ? Math.max(1, Math.ceil(runsFor(n) / 3)) : runsFor(n), csv));
  const file = join(outDir, `invented-${n}.csv`);
  writeFileSync(file, csv);
  process.stderr.write(' CLI analyze…');
  clis.push(analyzeJob(n, file, PAIRS, numpyVersion !== null));
  if (n >= 5) {
    process.stderr.write(' CLI scenario…');
    const shock = shockFile(n);
    scenarios.push(scenarioJob(n, file, shock.file, shock.destination, PAIRS, numpyVersion !== null));
  }
  process.stderr.write(' done\n');
}

// The large table: one pair (numpy too, when present), time and peak memory of the whole process.
let large: PairedJob | null = null;
if (LARGE > 0) {
  process.stderr.write(`large n=${LARGE}: writing the table…`);
  const file = join(outDir, `invented-${LARGE}.csv`);
  writeFileSync(file, jobCsv(LARGE));
  process.stderr.write(' CLI analyze…');
  large = analyzeJob(LARGE, file, 1, numpyVersion !== null);
  process.stderr.write(' done\n');
}

// Monte Carlo draws of a full scenario at 500 sectors (or the largest size asked for, if smaller).
const drawsN = Math.min(500, Math.max(...SIZES));
process.stderr.write(`draws n=${drawsN}…`);
const draws: DrawsBench = benchDraws(drawsN, QUICK ? 20 : 100, outDir, numpyVersion !== null, QUICK ? 50 : 1000);
process.stderr.write(' done\n');

// The app while it draws (the How sure? panel, on the table the draws bench gave the CLI).
let drawingRun: DrawingApp | { skipped: string } = { skipped: 'not run (--no-app)' };
if (!args.includes('--no-app')) {
  process.stderr.write(`app drawing n=${drawsN}…`);
  try { drawingRun = await drawingApp(join(outDir, `draws-${drawsN}.csv`), drawsN, QUICK ? 50 : 200); } catch (e) { drawingRun = { skipped: `failed: ${String(e).split('\n')[0]}` }; }
  process.stderr.write(' done\n');
}

// Long main-thread tasks in the app, at the largest size (the table file the CLI job just used).
const appN = Math.max(...SIZES);
let app: LongTasks | { skipped: string } = { skipped: 'not run (--no-app)' };
if (!args.includes('--no-app')) {
  process.stderr.write(`app n=${appN}…`);
  try { app = await appLongTasks(join(outDir, `invented-${appN}.csv`), appN); } catch (e) { app = { skipped: `failed: ${String(e).split('\n')[0]}` }; }
  process.stderr.write(' done\n');
}
// Every screen of the app at the largest size, as a planner uses it (app-screens.ts): long tasks, keystrokes, edits.
let appRun: AppRun | { skipped: string } = { skipped: 'not run (--no-app)' };
if (!args.includes('--no-app')) {
  process.stderr.write(`app screens n=${appN}…`);
  try { appRun = await appScreens(join(outDir, `invented-${appN}.csv`), appN); } catch (e) { appRun = { skipped: `failed: ${String(e).split('\n')[0]}` }; }
  process.stderr.write(' done\n');
}

const T = HELPERS + 1;
const best = (r: Row): number => Math.min(r.invOurs.medianMs, r.invThreads?.medianMs ?? Infinity);
const header = ['n', 'LU', `LU ${T} thr`, 'LU JS kernel', 'LU unblocked', 'LU ml-matrix', 'inverse', `inverse ${T} thr`, 'inverse ml-matrix', 'inverse numpy', 'ours/numpy', 'ml-matrix/ours', 'residual', 'peak RSS'];
const table = rows.map((r) => [
  String(r.n), fmt(r.luOurs.medianMs), fmt(r.luThreads?.medianMs), fmt(r.luOursJs.medianMs), fmt(r.luReference?.medianMs), fmt(r.luMl?.medianMs),
  fmt(r.invOurs.medianMs), fmt(r.invThreads?.medianMs), r.invMl ? fmt(r.invMl.medianMs) : 'skipped', fmt(r.invNumpy?.medianMs),
  ratio(best(r), r.invNumpy?.medianMs), ratio(r.invMl?.medianMs, best(r)),
  r.residual.toFixed(2), r.peakMB == null ? '—' : `${r.peakMB.toFixed(0)} MB`,
]);
function printTable(head: string[], body: string[][]): void {
  const widths = head.map((h, c) => Math.max(h.length, ...body.map((row) => row[c]!.length)));
  const line = (cells: string[]): string => '| ' + cells.map((x, c) => x.padStart(widths[c]!)).join(' | ') + ' |';
  console.log(line(head));
  console.log('|' + widths.map((w) => '-'.repeat(w + 2)).join('|') + '|');
  for (const row of body) console.log(line(row));
}
const loadAfter = loadavg();
const machine = { cpu: cpuModel(), cores: cpus().length, memoryGB: +(totalmem() / 2 ** 30).toFixed(1), node: process.version, numpy: numpyVersion };
console.log(`Roundwise bench — ${started.toISOString()} — ${machine.cpu}, ${machine.cores} cores, Node ${machine.node}${numpyVersion ? `, numpy ${numpyVersion}` : ', numpy not available'}`);
console.log(`load average before ${loadBefore.map((x) => x.toFixed(2)).join(' ')}, after ${loadAfter.map((x) => x.toFixed(2)).join(' ')} (medians of repeated runs; times in ms unless marked s)`);
if (rows.length) printTable(header, table);
if (rows.length) console.log(`LU = factorisation with partial pivoting; inverse = factorisation + explicit inverse (ours: Wasm SIMD kernel, 1 thread unless marked; ${T} thr = with ${HELPERS} helper thread(s)); ours/numpy and ml-matrix/ours use our faster column; residual = ‖M·X − I‖₁/(‖M‖₁‖X‖₁nε) of our inverse (LAPACK threshold 30); peak RSS = factorisation + inverse in a fresh Node process (1 thread).`);
for (const r of rows) if (r.invMlSkipped) console.log(`ml-matrix inverse at n=${r.n} ${r.invMlSkipped}.`);
if (!numpyVersion) console.log('numpy columns empty: `python3 -c "import numpy"` failed on this machine.');

const jobHeader = ['n', 'CSV', 'import', 'prepare (coefficients + LU + bordering)', 'full analysis', 'one scenario'];
const jobTable = jobs.map((j) => [String(j.n), `${j.csvMB.toFixed(1)} MB`, fmt(j.importMs.medianMs), fmt(j.prepareMs.medianMs), fmt(j.analysisMs.medianMs), fmt(j.scenarioMs.medianMs)]);
if (jobs.length) printTable(jobHeader, jobTable);
if (jobs.length) console.log('Whole job on invented tables written by writeTableCsv, in process, 1 thread: import = importTable on the CSV text; full analysis = analyzeTable (defaults: spectrum only up to 400 sectors, no explicit inverse); one scenario = runScenario after preparation (a final-demand line in one sector).');
const mb = (x: number | null | undefined): string => (x == null ? '—' : `${x.toFixed(0)} MB`);
const spread = (j: PairedJob): string => (j.ratio ? `${j.ratio.min.toFixed(2)} / ${j.ratio.median.toFixed(2)} / ${j.ratio.max.toFixed(2)}` : '—');
const wholeHeader = ['job', 'n', 'load', 'ours (median, min–max)', 'numpy (median, min–max)', 'ours/numpy min / median / max', 'peak RSS ours', 'peak RSS numpy', `equal to ${EQUAL_TOLERANCE}`];
const range = (x: PairedJob['ours']): string => (x ? `${fmt(x.medianMs)} (${fmt(x.minMs)}–${fmt(x.maxMs)})` : '—');
const wholeRow = (j: PairedJob, name: string): string[] => [name, String(j.n), `${j.load[0].toFixed(1)}–${j.load[1].toFixed(1)}`, range(j.ours), range(j.numpy), spread(j), mb(j.ours?.peakMB), mb(j.numpy?.peakMB),
  j.equal === null ? '—' : `${j.equal ? 'yes' : 'NO'} (${j.maxRelDiff!.toExponential(1)})`];
printTable(wholeHeader, [...clis.map((c) => wholeRow(c, 'analyze --json')), ...scenarios.map((c) => wholeRow(c, 'scenario --paths --json')), ...(large ? [wholeRow(large, 'analyze --json (large)')] : [])]);
console.log(`Whole process, start to exit, ${PAIRS} pair(s) per row, ours and numpy back to back in alternating order; ratios per pair. numpy = ${pythonExecutable() ?? 'python3'} running test/bench/numpy_job.py (loadtxt, two inv, the same multipliers, linkages and Perron root) or numpy_scenario.py (the same mixed shock, effects, rounds and structural paths), OPENBLAS_CORETYPE and OPENBLAS_L2_SIZE unset for numpy only, NODE_EXTRA_CA_CERTS for ours only (this machine sets all three; each slows that side's start: numpy.ts). equal = every number numpy prints matches ours to ${EQUAL_TOLERANCE} (relative; cli-job.ts compare).`);
for (const c of [...clis, ...scenarios, ...(large ? [large] : [])]) {
  if (c.note) console.log(`${c.job} n=${c.n}: ${c.note}`);
  if (c.equal === false) console.log(`${c.job} n=${c.n}: OUTPUTS DIFFER: relative difference ${c.maxRelDiff} at ${c.worstAt}`);
}
if ('skipped' in app) console.log(`App long tasks: ${app.skipped}.`);
else {
  console.log(`App at n=${app.n} (Chromium, production build, built-renderer.ts): file chosen to multiplier table on screen ${fmt(app.totalMs)}; ${app.tasks.length} long task(s) (> 50 ms) on the main thread, ${app.over100} over 100 ms, longest ${fmt(app.maxMs)}.`);
  for (const t of app.tasks) console.log(`  long task at +${fmt(t.startMs)}: ${fmt(t.durationMs)} (${t.phase})`);
}

printAppRun(appRun);

console.log(`Monte Carlo draws at n=${draws.n} (full scenario, open and household-closed, plus every multiplier), ${draws.draws} draws in process, 1 thread: ${fmt(draws.oursPerDrawMs)} per draw (1,000 draws ≈ ${fmt(draws.oursPerDrawMs * 1000)}); numpy loop doing the same solves: ${draws.numpyPerDrawMs === null ? 'n/a' : `${fmt(draws.numpyPerDrawMs)} per draw`}; ours/numpy ${draws.ratio === null ? '—' : `${draws.ratio.toFixed(2)}×`}.${draws.cli ? ` roundwise scenario --draws ${draws.cli.draws} (draws shared by ${HELPERS + 1} threads), start to exit: ${fmt(draws.cli.wallMs)}${draws.numpyPerDrawMs === null ? '' : ` against numpy's loop of the same draws ${fmt(draws.numpyPerDrawMs * draws.cli.draws)}: ${draws.cliRatio!.toFixed(2)}×`} (targets: under 10 s and at most 1.0×).` : ''}`);
console.log(drawingAppLine(drawingRun));

const json = { started: started.toISOString(), machine, loadBefore, loadAfter, quick: QUICK, rows, jobs, clis, scenarios, large, app, appRun, draws, drawingApp: drawingRun };
const stamp = started.toISOString().replace(/[:.]/g, '-');
writeFileSync(join(outDir, `bench-${stamp}.json`), JSON.stringify(json, null, 2));
writeFileSync(join(outDir, 'latest.json'), JSON.stringify(json, null, 2));
console.log(`JSON: bench-results/bench-${stamp}.json`);
