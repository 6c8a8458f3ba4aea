/**
 * Splitting large C −= A·B updates across helper threads that share the kernel's Wasm memory.
 *
 * Pure protocol, no platform code: a platform adapter (src/cli/parallel.ts with Node worker_threads; a Web Worker
 * host could do the same) creates the shared kernel here, starts helpers that instantiate the same module over the
 * same memory and run `HELPER_LOOP_LAYOUT`'s protocol, and attaches them. Without helpers everything runs on the
 * calling thread, unchanged.
 *
 * Protocol (one Int32Array on a SharedArrayBuffer): the caller writes a job (the gemm arguments, tile sizes and a row
 * chunking of C), assigns it to the helpers that have reported ready, bumps GEN and wakes them. Caller and helpers
 * then claim chunks of C (row ranges, or column ranges for short wide updates) with an atomic counter until none are left — so a helper slowed by other processes
 * simply takes fewer chunks — and the caller waits until every assigned helper has finished. Chunks are disjoint
 * blocks of C; A and B are only read; so no two threads ever write the same entry.
 */
import { instantiateGemm, type WasmGemm, type WasmKernel } from './wasm-gemm.ts';

/** Slots of the control array (passed to helpers, so the worker script has no copy of its own). */
export const CONTROL_LAYOUT = {
  GEN: 0, STOP: 1, PENDING: 2, NEXT: 3, CHUNKS: 4, CHUNK: 5, TILE_K: 6, TILE_N: 7,
  /** 1 when chunks are column ranges of C (wide, short updates), 0 for row ranges. */
  BY_COLUMNS: 17,
  /** 9 gemm arguments: c, ldc, a, lda, b, ldb (byte addresses and byte strides), m, n, k. */
  ARGS: 8,
  /** Per helper h: READY + h is 1 once the helper waits for jobs; ASSIGN + h is the GEN of its current job. */
  READY: 32, ASSIGN: 64,
  MAX_HELPERS: 32,
  LENGTH: 96,
} as const;
const L = CONTROL_LAYOUT;

/** Updates below this many multiply-adds stay on the calling thread (waking a helper costs tens of microseconds). */
const MIN_SPLIT_MULADDS = 1 << 21;

export interface ParallelKernel {
  kernel: WasmKernel;
  control: Int32Array;
}

let pool: { kernel: WasmKernel; control: Int32Array; helpers: number } | null = null;
let splitJobs = 0;

/** How many updates have been split across helpers since start (for tests and the benchmark). */
export function splitJobCount(): number { return splitJobs; }

/**
 * A kernel over a shared memory plus a control array, for an adapter to hand to its helpers; null when the engine
 * lacks Wasm SIMD, shared memory or Atomics.
 */
export function createParallelKernel(initialBytes = 1 << 24): ParallelKernel | null {
  if (typeof SharedArrayBuffer === 'undefined' || typeof Atomics === 'undefined') return null;
  const kernel = instantiateGemm(initialBytes, true);
  if (kernel === null) return null;
  const control = new Int32Array(new SharedArrayBuffer(L.LENGTH * 4));
  return { kernel, control };
}

/** Route large updates through `helpers` helper threads running on `pk` (they report ready by themselves). */
export function attachHelpers(pk: ParallelKernel, helpers: number): void {
  pool = { kernel: pk.kernel, control: pk.control, helpers: Math.min(helpers, L.MAX_HELPERS) };
}

/** Stop the helpers (their loops exit) and go back to single-thread kernels. */
export function detachHelpers(): void {
  if (pool === null) return;
  Atomics.store(pool.control, L.STOP, 1);
  Atomics.add(pool.control, L.GEN, 1);
  Atomics.notify(pool.control, L.GEN);
  pool = null;
}

/** The shared kernel while helpers are attached (workspace.ts then places every workspace in its memory). */
export function sharedKernel(): WasmKernel | null {
  return pool === null ? null : pool.kernel;
}

/** Number of helpers that have reported ready. */
export function readyHelpers(): number {
  if (pool === null) return 0;
  let r = 0;
  for (let h = 0; h < pool.helpers; h++) if (Atomics.load(pool.control, L.READY + h) === 1) r++;
  return r;
}

/**
 * The m4×n4 block (multiples of 4) of C −= A·B with byte addresses, split by row chunks across the calling thread and
 * the ready helpers. Returns false (having done nothing) when it is too small to split or no helper is ready.
 */
export function splitGemm(
  gemm: WasmGemm, c: number, ldc: number, a: number, lda: number, b: number, ldb: number,
  m4: number, n4: number, k: number, tileK: number, tileN: number,
): boolean {
  const p = pool;
  if (p === null || Math.max(m4, n4) < 32 || m4 * n4 * k < MIN_SPLIT_MULADDS) return false;
  const ctl = p.control;
  const gen = Atomics.load(ctl, L.GEN) + 1;
  let assigned = 0;
  for (let h = 0; h < p.helpers; h++) {
    if (Atomics.load(ctl, L.READY + h) === 1) { Atomics.store(ctl, L.ASSIGN + h, gen); assigned++; }
  }
  if (assigned === 0) return false;
  // About eight chunks per thread, in whole 4-wide tiles, so a thread slowed or descheduled by other processes holds
  // up the others by little. Short, wide updates (the back substitution of the inverse) are split by columns, so each
  // thread reads only its part of B; tall ones by rows.
  const threads = assigned + 1;
  const byColumns = n4 > m4;
  const extent = byColumns ? n4 : m4;
  const chunk = Math.max(byColumns ? 16 : 8, Math.ceil(extent / (8 * threads) / 4) * 4);
  ctl[L.ARGS] = c; ctl[L.ARGS + 1] = ldc; ctl[L.ARGS + 2] = a; ctl[L.ARGS + 3] = lda;
  ctl[L.ARGS + 4] = b; ctl[L.ARGS + 5] = ldb; ctl[L.ARGS + 6] = m4; ctl[L.ARGS + 7] = n4; ctl[L.ARGS + 8] = k;
  ctl[L.TILE_K] = tileK; ctl[L.TILE_N] = tileN;
  ctl[L.CHUNK] = chunk;
  ctl[L.CHUNKS] = Math.ceil(extent / chunk);
  ctl[L.BY_COLUMNS] = byColumns ? 1 : 0;
  Atomics.store(ctl, L.NEXT, 0);
  Atomics.store(ctl, L.PENDING, assigned);
  splitJobs++;
  Atomics.store(ctl, L.GEN, gen); // publishes the plain writes above
  Atomics.notify(ctl, L.GEN);
  runChunks(ctl, gemm);
  for (;;) {
    const left = Atomics.load(ctl, L.PENDING);
    if (left === 0) break;
    Atomics.wait(ctl, L.PENDING, left);
  }
  return true;
}

/**
 * Claim and run row chunks of the posted job until none are left. The helper loop (src/cli/parallel-worker.mjs)
 * runs the same steps; kept in step with it by the tests in test/src/linalg/parallel.test.ts.
 */
export function runChunks(ctl: Int32Array, gemm: WasmGemm): void {
  const c = ctl[L.ARGS]!, ldc = ctl[L.ARGS + 1]!, a = ctl[L.ARGS + 2]!, lda = ctl[L.ARGS + 3]!;
  const b = ctl[L.ARGS + 4]!, ldb = ctl[L.ARGS + 5]!, m = ctl[L.ARGS + 6]!, n = ctl[L.ARGS + 7]!, k = ctl[L.ARGS + 8]!;
  const tk = ctl[L.TILE_K]!, tn = ctl[L.TILE_N]!, size = ctl[L.CHUNK]!, chunks = ctl[L.CHUNKS]!, byColumns = ctl[L.BY_COLUMNS] === 1;
  for (;;) {
    const q = Atomics.add(ctl, L.NEXT, 1);
    if (q >= chunks) return;
    const i0 = byColumns ? 0 : q * size;
    const mm = byColumns ? m : Math.min(size, m - i0);
    const jStart = byColumns ? q * size : 0;
    const jEnd = byColumns ? Math.min(n, jStart + size) : n;
    for (let p0 = 0; p0 < k; p0 += tk) {
      const kk = Math.min(tk, k - p0);
      for (let j0 = jStart; j0 < jEnd; j0 += tn) {
        gemm(c + i0 * ldc + 8 * j0, ldc, a + i0 * lda + 8 * p0, lda, b + p0 * ldb + 8 * j0, ldb, mm, Math.min(tn, jEnd - j0), kk);
      }
    }
  }
}
