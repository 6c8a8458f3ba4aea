/**
 * Monte Carlo draws on several threads: the calling thread and helper threads (draw-worker.mjs → draw-engine.ts) claim
 * chunks of draws from one shared counter and each computes whole draws, so a 500-sector table's factorisations run
 * side by side instead of being split (which gains little at that size). Draw k depends only on (seed, k)
 * (src/uncertainty/draws.ts), so the bands are bit-identical whoever computes which chunk, and with one thread or
 * several. A helper that fails or never starts costs only time: every chunk no helper delivered is computed here.
 */
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { startWorker } from './worker-threads.ts';
import type { BandsRun, DrawChunk, UncertaintyResult } from '../study/index.ts';
import { claimChunks, type DrawJob } from './draw-claim.ts';

/** Draws per claimed chunk: enough to make posting a chunk back negligible, few enough to share the tail evenly. */
const CHUNK = 8;

/** Fewer than this many multiply-adds of factorisation in the whole run (draws × n³) are not worth starting a thread. */
const MIN_THREADED_WORK = 5e9;

/** Whether a run of `draws` on `sectors` is worth helper threads (a thread costs ~0.1–0.3 s to start). */
export function drawThreadsWorthIt(sectors: number, draws: number): boolean {
  return draws * sectors ** 3 >= MIN_THREADED_WORK;
}

export interface ThreadedBands {
  bands: UncertaintyResult;
  /** Draws computed by helper threads (0 when none was started or none delivered). */
  byHelpers: number;
}

/**
 * `count` helper threads (default: one per further core), started before the run is planned so that loading the
 * engine into them (about 0.2 s) overlaps this thread's point estimate; finishBandsThreaded gives them their work.
 */
export function startDrawHelpers(count = availableParallelism() - 1): Worker[] {
  const workers: Worker[] = [];
  for (let i = 0; i < count; i++) {
    try {
      workers.push(startWorker(new URL('./draw-worker.mjs', import.meta.url)));
    } catch {
      break;
    }
  }
  return workers;
}

/** Helpers started for a run that will not use them. */
export async function stopDrawHelpers(workers: readonly Worker[]): Promise<void> {
  await Promise.all(workers.map((w) => w.terminate()));
}

/**
 * Every draw of `run`, on this thread and helper threads: `helpers` started ones (startDrawHelpers, which this stops),
 * or a number to start (default: one per further core). `callerDraws: false` leaves every chunk to the helpers (tests:
 * proves a helper's chunks give the same bands), unless none delivers.
 */
export async function finishBandsThreaded(run: BandsRun, helpers: number | Worker[] = availableParallelism() - 1, opts: { callerDraws?: boolean } = {}): Promise<ThreadedBands> {
  const setup = run.setup;
  const started = typeof helpers === 'number' ? null : helpers;
  if (setup === null || (started ? started.length : helpers as number) < 1 || run.total <= CHUNK) {
    if (started) await stopDrawHelpers(started);
    for (let from = 0; from < run.total; from += CHUNK) run.step(from, Math.min(run.total, from + CHUNK));
    return { bands: run.finish(), byHelpers: 0 };
  }
  const job: DrawJob = { counter: new SharedArrayBuffer(4), total: run.total, size: CHUNK };
  const delivered = new Set<number>();
  let byHelpers = 0;
  const workers: Worker[] = started ?? startDrawHelpers(helpers as number);
  const settled: Promise<void>[] = [];
  for (const w of workers) {
    settled.push(new Promise<void>((resolve) => {
      w.on('message', (m: { chunk?: DrawChunk; done?: boolean }) => {
        if (m.chunk) { run.add(m.chunk); delivered.add(m.chunk.from); byHelpers += m.chunk.to - m.chunk.from; }
        if (m.done) resolve();
      });
      w.on('error', () => resolve());
      w.on('exit', () => resolve());
    }));
    // Queued until the helper listens: the setup first, then the job.
    w.postMessage({ setup });
    w.postMessage(job);
  }
  try {
    const mine = new Set<number>();
    if (opts.callerDraws !== false) claimChunks(job, (from, to) => { run.step(from, to); mine.add(from); });
    await Promise.all(settled);
    // Chunks a failed helper claimed but never delivered.
    for (let from = 0; from < run.total; from += CHUNK) {
      if (!mine.has(from) && !delivered.has(from)) run.step(from, Math.min(run.total, from + CHUNK));
    }
  } finally {
    await Promise.all(workers.map((w) => w.terminate()));
  }
  return { bands: run.finish(), byHelpers };
}
