/**
 * Whole jobs, process start to exit, side by side with numpy: `roundwise analyze TABLE.csv --json` against
 * numpy_job.py, and `roundwise scenario TABLE.csv --shock SHOCK.csv --paths SECTOR --json` against numpy_scenario.py.
 * Runs are paired (ours and numpy's one after the other, the order alternating), so a change in the machine's load
 * hits both sides of a pair; each pair gives a ratio, reported as min/median/max. numpy runs under the Python
 * interpreter itself (`sys.executable`, not a launcher shim such as pyenv's) with OPENBLAS_CORETYPE and
 * OPENBLAS_L2_SIZE removed from its environment only, ours without NODE_EXTRA_CA_CERTS (numpy.ts). The two outputs
 * are compared number by number, so the race is between equal answers (EQUAL_TOLERANCE).
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { loadavg } from 'node:os';
import { join } from 'node:path';
import { childEnv, oursEnv } from './numpy.ts';
import { median } from './timing.ts';

/** Largest relative difference accepted between our numbers and numpy's (both are backward stable; see compare). */
export const EQUAL_TOLERANCE = 1e-9;

export interface Side { medianMs: number; minMs: number; maxMs: number; allMs: number[]; peakMB: number | null }

export interface PairedJob {
  job: 'analyze' | 'scenario';
  n: number;
  ours: Side | null;
  numpy: Side | null;
  /** ours/numpy per pair. */
  ratio: { min: number; median: number; max: number; all: number[] } | null;
  /** Largest relative difference between the outputs (see compare); null when not compared. */
  maxRelDiff: number | null;
  /** Where that difference is (a JSON path). */
  worstAt: string | null;
  equal: boolean | null;
  note: string | null;
  /** 1-minute load average before and after the job's runs. */
  load: [number, number];
}

const TIME = '/usr/bin/time';

/** The interpreter python3 resolves to (pyenv and similar shims add a process and a shell script to every start). */
export function pythonExecutable(): string | null {
  const r = spawnSync('python3', ['-c', 'import sys; print(sys.executable)'], { encoding: 'utf8', env: childEnv() });
  const exe = r.status === 0 ? r.stdout.trim() : '';
  return exe && existsSync(exe) ? exe : null;
}

interface Run { ms: number; peakMB: number | null; stdout: string }

/** One run: wall time, and the peak RSS from /usr/bin/time when it exists. */
function runOnce(cmd: string, args: string[], env: NodeJS.ProcessEnv): Run | { error: string } {
  const useTime = existsSync(TIME);
  const t = performance.now();
  const p = useTime
    ? spawnSync(TIME, ['-f', '%M', cmd, ...args], { encoding: 'utf8', env, maxBuffer: 1 << 28 })
    : spawnSync(cmd, args, { encoding: 'utf8', env, maxBuffer: 1 << 28 });
  const ms = performance.now() - t;
  if (p.status !== 0) {
    const said = (p.stderr ?? '').trim().split('\n').filter((l) => !/^Command exited|^\d+$/.test(l)).slice(-2).join(' ');
    return { error: `${[cmd, ...args].slice(0, 3).join(' ')} exited with status ${p.status}: ${said}` };
  }
  let peakMB: number | null = null;
  if (useTime) {
    const kb = Number((p.stderr ?? '').trim().split('\n').pop());
    if (Number.isFinite(kb)) peakMB = kb / 1024;
  }
  return { ms, peakMB, stdout: p.stdout };
}

function side(runs: Run[]): Side {
  const all = runs.map((r) => r.ms);
  const peaks = runs.map((r) => r.peakMB).filter((x): x is number => x !== null);
  return { medianMs: median(all), minMs: Math.min(...all), maxMs: Math.max(...all), allMs: all, peakMB: peaks.length ? Math.max(...peaks) : null };
}

type Json = Record<string, unknown>;

/**
 * Largest relative difference over every number numpy's output has at a path ours has too (strings must be equal).
 * A number is compared relative to the larger of its own size and 1e-6 of the largest entry of its array: entries
 * far below the rest of their vector (an effect of 1e-12 beside effects of 1e4) carry the rounding of the whole
 * solve, which is relative to the vector, not to the entry (Higham 2002, §9: backward stability bounds norms).
 */
export function compare(ours: unknown, theirs: unknown): { worst: number; at: string | null } {
  let worst = 0;
  let at: string | null = null;
  const note = (d: number, path: string): void => { if (d > worst || Number.isNaN(d)) { worst = Number.isNaN(d) ? Infinity : d; at = path; } };
  const walk = (a: unknown, b: unknown, path: string): void => {
    if (typeof b === 'number') {
      const v = typeof a === 'number' ? a : a && typeof a === 'object' && typeof (a as { value?: unknown }).value === 'number' ? (a as { value: number }).value : null;
      if (v === null) { note(Infinity, path); return; }
      note(Math.abs(v - b) / Math.max(Math.abs(b), 1e-300), path);
      return;
    }
    if (typeof b === 'string') { if (a !== b) note(Infinity, path); return; }
    if (Array.isArray(b)) {
      if (!Array.isArray(a) || a.length < b.length) { note(Infinity, path); return; }
      let scale = 0;
      for (const y of b) if (typeof y === 'number') scale = Math.max(scale, Math.abs(y));
      b.forEach((y, i) => {
        const x: unknown = a[i];
        if (typeof y === 'number' && typeof x === 'number') note(Math.abs(x - y) / Math.max(Math.abs(y), 1e-6 * scale, 1e-300), `${path}[${i}]`);
        else walk(x, y, `${path}[${i}]`);
      });
      return;
    }
    if (b && typeof b === 'object') {
      if (!a || typeof a !== 'object') { note(Infinity, path); return; }
      for (const k of Object.keys(b)) walk((a as Json)[k], (b as Json)[k], path ? `${path}.${k}` : k);
    }
  };
  walk(ours, theirs, '');
  return { worst, at };
}

/**
 * `runs` pairs of (ours, numpy), alternating which goes first. Without numpy only ours is timed.
 */
export function pairedJob(job: PairedJob['job'], n: number, ours: string[], numpy: string[] | null, runs: number): PairedJob {
  let python = numpy ? pythonExecutable() : null;
  let numpyNote: string | null = numpy && !python ? 'numpy not run: python3 reports no sys.executable' : null;
  const mine: Run[] = [];
  const theirs: Run[] = [];
  const loadBefore = loadavg()[0]!;
  const fail = (note: string): PairedJob => ({ job, n, ours: null, numpy: null, ratio: null, maxRelDiff: null, worstAt: null, equal: null, note, load: [loadBefore, loadavg()[0]!] });
  for (let r = 0; r < runs; r++) {
    const order = r % 2 === 0 ? ['ours', 'numpy'] : ['numpy', 'ours'];
    for (const who of order) {
      if (who === 'ours') {
        const o = runOnce(process.execPath, ours, oursEnv());
        if ('error' in o) return fail(o.error);
        mine.push(o);
      } else if (python && numpy) {
        const p = runOnce(python, numpy, childEnv());
        if ('error' in p) { numpyNote = p.error; python = null; } else theirs.push(p);
      }
    }
  }
  const result: PairedJob = { job, n, ours: side(mine), numpy: null, ratio: null, maxRelDiff: null, worstAt: null, equal: null, note: numpyNote, load: [loadBefore, loadavg()[0]!] };
  if (theirs.length === mine.length && theirs.length > 0) {
    result.numpy = side(theirs);
    const ratios = mine.map((m, k) => m.ms / theirs[k]!.ms);
    result.ratio = { min: Math.min(...ratios), median: median(ratios), max: Math.max(...ratios), all: ratios };
    try {
      const c = compare(JSON.parse(mine[0]!.stdout), JSON.parse(theirs[0]!.stdout));
      result.maxRelDiff = c.worst;
      result.worstAt = c.at;
      result.equal = c.worst <= EQUAL_TOLERANCE;
    } catch (e) {
      result.note = `outputs not compared: ${String(e)}`;
    }
  }
  return result;
}

/** The analyze job on a table file. */
export function analyzeJob(n: number, file: string, runs: number, withNumpy: boolean): PairedJob {
  return pairedJob('analyze', n, [join('src', 'cli', 'roundwise.mjs'), 'analyze', file, '--json'], withNumpy ? [join('test', 'bench', 'numpy_job.py'), file] : null, runs);
}

/** The scenario job: a mixed shock (final demand, a fixed output, jobs) with structural paths to one sector. */
export function scenarioJob(n: number, file: string, shock: string, destination: string, runs: number, withNumpy: boolean): PairedJob {
  return pairedJob('scenario', n, [join('src', 'cli', 'roundwise.mjs'), 'scenario', file, '--shock', shock, '--paths', destination, '--json'],
    withNumpy ? [join('test', 'bench', 'numpy_scenario.py'), file, shock, destination] : null, runs);
}
