/**
 * Node adapter for the parallel kernels: starts helper threads (worker_threads) that share the kernel's Wasm memory
 * and attaches them to src/linalg (protocol in src/linalg/parallel.ts). Without it, or if it fails, the kernels run
 * single-threaded exactly as before.
 */
import { availableParallelism } from 'node:os';
import type { Worker } from 'node:worker_threads';
import { startWorker } from './worker-threads.ts';
import { attachHelpers, createParallelKernel, detachHelpers, readyHelpers, CONTROL_LAYOUT, type ParallelKernel } from '../linalg/index.ts';

/** Where the helpers' first kept factorisation will be, lent to input that dies before it (src/linalg/workspace.ts). */
export { bytesAtFactorHome } from '../linalg/index.ts';

let workers: Worker[] = [];
/** The helpers' kernel made ahead of them (reserveParallelKernel), for startParallelKernels to take. */
let reserved: ParallelKernel | null = null;

/**
 * The kernel and shared memory the helpers will run on, made before they start (null when none would start, or they
 * run already): a caller can read input into that memory (bytesAtFactorHome) before the helpers' start-up competes
 * with the read for the process's memory map.
 */
export function reserveParallelKernel(helpers = availableParallelism() - 1): ParallelKernel | null {
  if (workers.length > 0 || helpers < 1) return null;
  reserved ??= createParallelKernel();
  return reserved;
}

/**
 * Start `helpers` helper threads (default: one fewer than the machine's cores). Returns the number started (0 when
 * the engine lacks Wasm SIMD or shared memory, or the machine has one core). Helpers do not keep the process alive.
 */
export function startParallelKernels(helpers = availableParallelism() - 1): number {
  if (workers.length > 0 || helpers < 1) return workers.length;
  const pk = reserved ?? createParallelKernel();
  reserved = null;
  if (pk === null) return 0;
  const url = new URL('./parallel-worker.mjs', import.meta.url);
  for (let index = 0; index < helpers; index++) {
    const w = startWorker(url, {
      workerData: { module: pk.kernel.module, memory: pk.kernel.memory, control: pk.control.buffer, index, layout: CONTROL_LAYOUT },
    });
    w.unref();
    // A helper that dies never reports ready (or stops being ready), so no job is ever assigned to it.
    w.on('error', () => undefined);
    workers.push(w);
  }
  attachHelpers(pk, helpers);
  return helpers;
}

/** Resolve once every started helper reports ready (or after `timeoutMs`); returns how many are ready. */
export async function parallelKernelsReady(timeoutMs = 5000): Promise<number> {
  const until = Date.now() + timeoutMs;
  while (readyHelpers() < workers.length && Date.now() < until) await new Promise((r) => setTimeout(r, 2));
  return readyHelpers();
}

/** Stop the helpers and return to single-thread kernels. */
export async function stopParallelKernels(): Promise<void> {
  detachHelpers();
  await Promise.all(workers.map((w) => w.terminate()));
  workers = [];
}
