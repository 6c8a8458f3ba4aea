/**
 * Helper threads are started through here: node:worker_threads is loaded on first use, so a run without helper
 * threads (every table under 4 MiB) never loads it (3 ms of a 500-sector run's start-up). Used by parallel.ts (the
 * parallel kernels' helpers) and draw-pool.ts (the draw helpers).
 */
import { createRequire } from 'node:module';
import type { Worker, WorkerOptions } from 'node:worker_threads';

const require = createRequire(import.meta.url);

export function startWorker(url: URL, options?: WorkerOptions): Worker {
  const { Worker: NodeWorker } = require('node:worker_threads') as typeof import('node:worker_threads');
  return new NodeWorker(url, options);
}
