/**
 * The whole CLI job, process start to exit: `roundwise analyze TABLE.csv --json` versus the numpy script
 * numpy_job.py doing the same work (parse the CSV, invert the open and closed systems, compute the multipliers).
 * Also compares the two outputs, multiplier by multiplier, so the race is between equal answers.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { childEnv } from './numpy.ts';
import { median } from './timing.ts';

export interface CliJob {
  n: number;
  ours: { medianMs: number; allMs: number[]; peakMB: number | null } | null;
  numpy: { medianMs: number; allMs: number[]; peakMB: number | null } | null;
  /** Largest relative difference between our and numpy's multipliers and linkages; null when not compared. */
  maxRelDiff: number | null;
  note: string | null;
}

const TIME = '/usr/bin/time';

/** Run a command `runs` times; wall time of each, and the peak RSS from /usr/bin/time when it exists. */
function timed(cmd: string, args: string[], runs: number, env: NodeJS.ProcessEnv): { medianMs: number; allMs: number[]; peakMB: number | null; stdout: string } | { error: string } {
  const all: number[] = [];
  let stdout = '';
  let peakMB: number | null = null;
  for (let r = 0; r < runs; r++) {
    const useTime = existsSync(TIME);
    const t = performance.now();
    const p = useTime
      ? spawnSync(TIME, ['-f', '%M', cmd, ...args], { encoding: 'utf8', env, maxBuffer: 1 << 28 })
      : spawnSync(cmd, args, { encoding: 'utf8', env, maxBuffer: 1 << 28 });
    all.push(performance.now() - t);
    if (p.status !== 0) {
      const said = (p.stderr ?? '').trim().split('\n').filter((l) => !/^Command exited|^\d+$/.test(l)).slice(-2).join(' ');
      return { error: `${args.slice(0, 2).join(' ')} exited with status ${p.status}: ${said}` };
    }
    stdout = p.stdout;
    if (useTime) {
      const kb = Number((p.stderr ?? '').trim().split('\n').pop());
      if (Number.isFinite(kb)) peakMB = Math.max(peakMB ?? 0, kb / 1024);
    }
  }
  return { medianMs: median(all), allMs: all, peakMB, stdout };
}

type Json = Record<string, unknown>;

/** Max relative difference over the multiplier and linkage arrays both outputs have (null entries skipped). */
function compare(ours: Json, theirs: Json): number {
  let worst = 0;
  const walk = (a: unknown, b: unknown): void => {
    if (Array.isArray(a) && Array.isArray(b)) {
      for (let i = 0; i < Math.min(a.length, b.length); i++) {
        const x = a[i], y = b[i];
        if (typeof x === 'number' && typeof y === 'number' && Number.isFinite(y)) worst = Math.max(worst, Math.abs(x - y) / Math.max(Math.abs(y), 1e-300));
        else if (x && typeof x === 'object' && 'value' in x && typeof (x as { value: unknown }).value === 'number' && typeof y === 'number') {
          const v = (x as { value: number }).value;
          worst = Math.max(worst, Math.abs(v - y) / Math.max(Math.abs(y), 1e-300));
        }
      }
      return;
    }
    if (a && b && typeof a === 'object' && typeof b === 'object') for (const k of Object.keys(b)) if (k in (a as Json)) walk((a as Json)[k], (b as Json)[k]);
  };
  walk(ours['multipliers'], theirs['multipliers']);
  walk(ours['linkages'], theirs['linkages']);
  return worst;
}

export function cliJob(n: number, csv: string, dir: string, runs: number, withNumpy: boolean): CliJob {
  const file = join(dir, `invented-${n}.csv`);
  writeFileSync(file, csv);
  const ours = timed(process.execPath, [join('src', 'cli', 'roundwise.mjs'), 'analyze', file, '--json'], runs, process.env);
  if ('error' in ours) return { n, ours: null, numpy: null, maxRelDiff: null, note: ours.error };
  let numpy: CliJob['numpy'] = null;
  let maxRelDiff: number | null = null;
  let note: string | null = null;
  if (withNumpy) {
    const np = timed('python3', [join('test', 'bench', 'numpy_job.py'), file], runs, childEnv());
    if ('error' in np) note = np.error;
    else {
      numpy = { medianMs: np.medianMs, allMs: np.allMs, peakMB: np.peakMB };
      try { maxRelDiff = compare(JSON.parse(ours.stdout) as Json, JSON.parse(np.stdout) as Json); } catch (e) { note = `outputs not compared: ${String(e)}`; }
    }
  }
  return { n, ours: { medianMs: ours.medianMs, allMs: ours.allMs, peakMB: ours.peakMB }, numpy, maxRelDiff, note };
}
