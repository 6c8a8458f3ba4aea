/**
 * Scratch buffers for the blocked kernels. When the Wasm SIMD kernel is available the buffers are views of its
 * linear memory (the kernel can only read and write there), otherwise ordinary Float64Arrays. Buffers live only for
 * the duration of one call: results are copied out, so no caller ever holds a view that a later memory growth could
 * detach. While helper threads are attached (parallel.ts) every workspace lives in their shared memory.
 *
 * A factorisation's own storage (`factorStorage`) is the exception: the factors are computed where they stay, so a
 * large matrix is written once and never copied in or out of the kernel's memory (on a machine where every fresh page
 * costs a fault, a 2,000-sector copy costs more than the arithmetic around it; test/bench). Such storage is a Wasm
 * memory of its own that nothing ever grows, freed with the factorisation. While helper threads are attached, only
 * the first large factorisation is kept in their shared memory (at its start; later workspaces are placed after it, and
 * a shared memory's growth never detaches existing views): that memory never shrinks, so factors kept there one per
 * Monte Carlo draw, say, would never be freed; later factorisations are copied out. Only the CLI attaches helpers,
 * for one table per process, whose factorisation is that first one.
 */
import { activateWasm, activeWasm, kernelMode } from './gemm.ts';
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

/** Factorisations from this many elements get storage of their own (below it, copying in and out costs next to nothing). */
export const OWN_STORAGE_MIN_ELEMENTS = 256 * 256;

/** Right-hand sides a solve against factors in their own storage may have and still run where they are (a path search has at most 140 poles with its default settings). */
const KEPT_SOLVE_COLUMNS = 256;

/** The helpers' shared memory whose start holds a kept factorisation, and that factorisation's size in bytes. */
let pinned: { kernel: WasmKernel; end: number } | null = null;

function pinnedEnd(shared: WasmKernel): number {
  return pinned !== null && pinned.kernel === shared ? pinned.end : 0;
}

const aligned = (bytes: number): number => Math.ceil(bytes / ALIGN_BYTES) * ALIGN_BYTES;

export interface FactorStorage {
  /** Where the factors are computed and kept (zero-filled). */
  view: Float64Array;
  /** The kernel whose memory holds `view` (activate it while factoring), or null for a plain array. */
  kernel: WasmKernel | null;
}

/**
 * Storage for a factorisation of `elements` entries that outlives the call, or null when the factors should be
 * computed in an ordinary workspace and copied out (small matrices, the JavaScript kernel, a factorisation already kept
 * in the helpers' shared memory, or no memory to spare).
 */
export function factorStorage(elements: number): FactorStorage | null {
  if (busy || kernelMode() === 'js' || elements < OWN_STORAGE_MIN_ELEMENTS) return null;
  const bytes = aligned(8 * elements);
  const shared = sharedKernel();
  if (shared !== null) {
    if (pinnedEnd(shared) > 0 || grown(shared, bytes) === null) return null;
    pinned = { kernel: shared, end: bytes };
    const view = new Float64Array(shared.memory.buffer, 0, elements);
    view.fill(0);
    sharedHomes.set(view, shared);
    return { view, kernel: shared };
  }
  if (spare !== null && spare.view.length === elements) {
    const reused = spare;
    spare = null;
    reused.view.fill(0);
    return reused;
  }
  // Room after the factors for a solve against them with up to KEPT_SOLVE_COLUMNS right-hand sides (withKeptFactors):
  // a memory's pages cost nothing until they are first touched, and such a memory can never grow (growing would detach
  // the factors' view).
  const kernel = instantiateGemm(bytes + aligned(8 * Math.ceil(Math.sqrt(elements)) * KEPT_SOLVE_COLUMNS));
  if (kernel === null) return null;
  const view = new Float64Array(kernel.memory.buffer, 0, elements);
  owners.set(view, kernel);
  return { view, kernel };
}

/**
 * `bytes` bytes at the start of the helpers' shared memory (`shared`, the kernel they run or will run on), where the
 * first kept factorisation will be placed (factorStorage), for input that is dead before any kernel runs: the CLI
 * reads a large table file there, so the factors later reuse pages that reading the file already touched instead of
 * faulting in fresh ones (21 MB at 2,000 sectors; README "Performance"). The caller must drop the view before the
 * first workspace or factorisation, which overwrite it. Null once a factorisation is kept there, or without memory to
 * grow.
 */
export function bytesAtFactorHome(shared: WasmKernel, bytes: number): Uint8Array | null {
  if (busy || pinnedEnd(shared) > 0 || grown(shared, bytes) === null) return null;
  return new Uint8Array(shared.memory.buffer, 0, bytes);
}

/** Own storage handed back by its factorisation's owner (releaseFactorStorage), kept for the next one of its size. */
let spare: FactorStorage | null = null;
const owners = new WeakMap<Float64Array, WasmKernel>();

/**
 * The caller will not read the factors in `view` again: their storage may hold the next factorisation of the same size
 * (a loop that factors one matrix after another — the Monte Carlo draws — then reuses one memory instead of a fresh,
 * page-faulting one each time). Views that are not own storage are ignored.
 */
export function releaseFactorStorage(view: Float64Array): void {
  const kernel = owners.get(view);
  if (kernel !== undefined) spare = { view, kernel };
}

/** Factors kept at the start of the helpers' shared memory, and that memory's kernel (it outlives the helpers). */
const sharedHomes = new WeakMap<Float64Array, WasmKernel>();

/**
 * Run `work` on factors `lu` where they are kept, with zero-filled buffers of the given lengths placed after them in
 * the same memory, so a solve with many right-hand sides reads the factors in place instead of copying them into a
 * workspace (at 2,000 sectors a 32 MB copy into fresh, page-faulting memory). Factors kept in the helpers' shared
 * memory qualify (it grows without moving or detaching them), and factors in storage of their own when the buffers
 * fit in the room left after them (see factorStorage). Returns null, having done nothing, otherwise (the caller
 * copies the factors into a workspace) — and while helpers are attached to another memory, whose split updates
 * would address that memory.
 */
export function withKeptFactors<T>(lu: Float64Array, lengths: readonly number[], work: (lu: Float64Array, bufs: Float64Array[]) => T): T | null {
  const shared = sharedHomes.get(lu);
  const kernel = shared ?? owners.get(lu);
  if (kernel === undefined || busy || kernelMode() === 'js') return null;
  const attached = sharedKernel();
  if (attached !== null && attached !== kernel) return null;
  let at = aligned(lu.byteOffset + 8 * lu.length);
  let bytes = at;
  for (const l of lengths) bytes += aligned(8 * l);
  if (shared !== undefined ? grown(kernel, bytes) === null : kernel.memory.buffer.byteLength < bytes) return null;
  // Views of the memory as it is now: the kernel works only on views of its current buffer (gemm.ts), and growing a
  // shared memory gives it a new buffer object over the same bytes.
  const buffer = kernel.memory.buffer;
  const factors = new Float64Array(buffer, lu.byteOffset, lu.length);
  const bufs: Float64Array[] = [];
  for (const l of lengths) {
    const view = new Float64Array(buffer, at, l);
    view.fill(0);
    bufs.push(view);
    at += aligned(8 * l);
  }
  return withKernel(kernel, () => work(factors, bufs));
}

/** Run `work` with `kernel` as the active Wasm kernel (the previous one restored after). */
export function withKernel<T>(kernel: WasmKernel | null, work: () => T): T {
  const before = activeWasm();
  const wasBusy = busy;
  busy = true;
  activateWasm(kernel);
  try {
    return work();
  } finally {
    activateWasm(before);
    busy = wasBusy;
  }
}

/** Run `work` with zero-filled buffers of the given lengths (elements). Re-entrant calls get plain arrays. */
export function withWorkspace<T>(lengths: readonly number[], work: (bufs: Float64Array[]) => T): T {
  let elements = 0;
  for (const l of lengths) elements += l;
  if (busy || kernelMode() === 'js' || elements < MIN_WASM_ELEMENTS) return work(lengths.map((l) => new Float64Array(l)));
  let bytes = 0;
  for (const l of lengths) bytes += aligned(8 * l);
  const shared = sharedKernel();
  const base = shared !== null ? pinnedEnd(shared) : 0;
  const kernel = shared !== null ? grown(shared, base + bytes) : bytes <= REUSE_LIMIT_BYTES ? cachedKernel(bytes) : instantiateGemm(bytes);
  if (kernel === null) return work(lengths.map((l) => new Float64Array(l)));
  const bufs: Float64Array[] = [];
  let at = base;
  for (const l of lengths) {
    const view = new Float64Array(kernel.memory.buffer, at, l);
    view.fill(0);
    bufs.push(view);
    at += aligned(8 * l);
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
