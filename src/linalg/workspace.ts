/**
 * Scratch buffers for the blocked kernels. When the Wasm SIMD kernel is available the buffers are views of its
 * linear memory (the kernel can only read and write there), otherwise ordinary Float64Arrays. Buffers live only for
 * the duration of one call: results are copied out, so no caller ever holds a view that a later memory growth could
 * detach. While helper threads are attached (parallel.ts) every workspace lives in their shared memory.
 */
import { activateWasm, kernelMode } from './gemm.ts';
import { instantiateGemm, type WasmKernel } from './wasm-gemm.ts';
import { sharedKernel } from './parallel.ts';

/** Workspaces up to this size reuse one cached Wasm memory; larger ones get a memory of their own, freed after. */
const REUSE_LIMIT_BYTES = 32 * 1024 * 1024;
/** Below this many elements in total the JavaScript kernel is as fast and needs no copying. */
const MIN_WASM_ELEMENTS = 32 * 32;
/** Each buffer starts on a cache-line boundary. */
const ALIGN_BYTES = 64;

let cached: WasmKernel | null = null;
let busy = false;

/** Run `work` with zero-filled buffers of the given lengths (elements). Re-entrant calls get plain arrays. */
export function withWorkspace<T>(lengths: readonly number[], work: (bufs: Float64Array[]) => T): T {
  let elements = 0;
  for (const l of lengths) elements += l;
  if (busy || kernelMode() === 'js' || elements < MIN_WASM_ELEMENTS) return work(lengths.map((l) => new Float64Array(l)));
  let bytes = 0;
  for (const l of lengths) bytes += Math.ceil((8 * l) / ALIGN_BYTES) * ALIGN_BYTES;
  const shared = sharedKernel();
  const kernel = shared !== null ? grown(shared, bytes) : bytes <= REUSE_LIMIT_BYTES ? cachedKernel(bytes) : instantiateGemm(bytes);
  if (kernel === null) return work(lengths.map((l) => new Float64Array(l)));
  const bufs: Float64Array[] = [];
  let at = 0;
  for (const l of lengths) {
    const view = new Float64Array(kernel.memory.buffer, at, l);
    view.fill(0);
    bufs.push(view);
    at += Math.ceil((8 * l) / ALIGN_BYTES) * ALIGN_BYTES;
  }
  busy = true;
  activateWasm(kernel);
  try {
    return work(bufs);
  } finally {
    activateWasm(null);
    busy = false;
  }
}

/** The helpers' shared memory, grown to fit (it is never shrunk while helpers are attached). */
function grown(k: WasmKernel, bytes: number): WasmKernel | null {
  const have = k.memory.buffer.byteLength;
  if (have >= bytes) return k;
  try { k.memory.grow(Math.ceil((bytes - have) / 65536)); } catch { return null; }
  return k;
}

function cachedKernel(bytes: number): WasmKernel | null {
  if (cached === null) {
    cached = instantiateGemm(bytes);
    return cached;
  }
  const have = cached.memory.buffer.byteLength;
  if (have < bytes) cached.memory.grow(Math.ceil((bytes - have) / 65536));
  return cached;
}
