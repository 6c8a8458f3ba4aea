/**
 * The one hot kernel: C ← C − A·B on sub-blocks of flat row-major Float64Arrays (the update every blocked
 * factorisation, solve and inverse here spends its time in; BLAS calls it DGEMM).
 *
 * Written for V8's optimising compiler: a single monomorphic signature (Float64Array and small integers only), no
 * closures or objects in the loops, and a 4×4 register tile — four rows of C updated from four rows of B per pass,
 * so each loaded B value feeds four multiply-adds. The operands are walked in tiles (TILE_K rows of B by TILE_N
 * columns) sized to stay in the per-core L2 cache while every row of A streams past them. Where the engine has
 * WebAssembly SIMD, the same update runs in the kernel of wasm-gemm.ts (about three times faster, measured in
 * test/bench).
 */
import type { WasmGemm, WasmKernel } from './wasm-gemm.ts';
import { splitGemm } from './parallel.ts';

/** Depth of one B tile (rows of B, columns of A) for the JavaScript kernel. */
export const TILE_K = 128;
/** Width of one B tile (columns of B and C) for the JavaScript kernel. */
export const TILE_N = 512;
/** Tiles for the Wasm kernel, which holds its 4×4 block of C in registers for the whole tile depth. */
const WASM_TILE_K = 128;
const WASM_TILE_N = 256;

/** 'auto' uses the Wasm SIMD kernel when the engine has it; 'js' forces the JavaScript kernel (tests, benchmarks). */
export type KernelMode = 'auto' | 'js';
let mode: KernelMode = 'auto';
export function setKernelMode(m: KernelMode): void { mode = m; }
export function kernelMode(): KernelMode { return mode; }

/** The Wasm kernel whose memory holds the current workspace (see workspace.ts), or null. */
let active: WasmKernel | null = null;
export function activateWasm(k: WasmKernel | null): void { active = k; }
export function activeWasm(): WasmKernel | null { return active; }

/**
 * C[m×n] −= A[m×k]·B[k×n], where X[i][j] lives at x[xOff + i·ldx + j]. The three regions must not overlap
 * unless they are disjoint sub-blocks of one array (the factorisation relies on that). When all three arrays are
 * views of the active Wasm memory, the bulk goes to the SIMD kernel and only edge strips (m or n not a multiple
 * of 4) to the JavaScript one.
 */
export function gemmSubtract(
  c: Float64Array, cOff: number, ldc: number,
  a: Float64Array, aOff: number, lda: number,
  b: Float64Array, bOff: number, ldb: number,
  m: number, n: number, k: number,
): void {
  if (m <= 0 || n <= 0 || k <= 0) return;
  const w = active;
  if (w !== null && m >= 4 && n >= 4) {
    const buf = w.memory.buffer;
    if (c.buffer === buf && a.buffer === buf && b.buffer === buf) {
      wasmTiled(w.gemm, c, cOff, ldc, a, aOff, lda, b, bOff, ldb, m, n, k);
      return;
    }
  }
  jsTiled(c, cOff, ldc, a, aOff, lda, b, bOff, ldb, m, n, k);
}

function jsTiled(
  c: Float64Array, cOff: number, ldc: number,
  a: Float64Array, aOff: number, lda: number,
  b: Float64Array, bOff: number, ldb: number,
  m: number, n: number, k: number,
): void {
  for (let p0 = 0; p0 < k; p0 += TILE_K) {
    const kk = Math.min(TILE_K, k - p0);
    for (let j0 = 0; j0 < n; j0 += TILE_N) {
      const nn = Math.min(TILE_N, n - j0);
      kernel(c, cOff + j0, ldc, a, aOff + p0, lda, b, bOff + p0 * ldb + j0, ldb, m, nn, kk);
    }
  }
}

function wasmTiled(
  gemm: WasmGemm,
  c: Float64Array, cOff: number, ldc: number,
  a: Float64Array, aOff: number, lda: number,
  b: Float64Array, bOff: number, ldb: number,
  m: number, n: number, k: number,
): void {
  const m4 = m & ~3;
  const n4 = n & ~3;
  const cBase = c.byteOffset + 8 * cOff;
  const aBase = a.byteOffset + 8 * aOff;
  const bBase = b.byteOffset + 8 * bOff;
  const split = splitGemm(gemm, cBase, 8 * ldc, aBase, 8 * lda, bBase, 8 * ldb, m4, n4, k, WASM_TILE_K, WASM_TILE_N);
  for (let p0 = 0; p0 < k && !split; p0 += WASM_TILE_K) {
    const kk = Math.min(WASM_TILE_K, k - p0);
    for (let j0 = 0; j0 < n4; j0 += WASM_TILE_N) {
      const nn = Math.min(WASM_TILE_N, n4 - j0);
      gemm(cBase + 8 * j0, 8 * ldc, aBase + 8 * p0, 8 * lda, bBase + 8 * (p0 * ldb + j0), 8 * ldb, m4, nn, kk);
    }
  }
  if (n4 < n) jsTiled(c, cOff + n4, ldc, a, aOff, lda, b, bOff + n4, ldb, m4, n - n4, k);
  if (m4 < m) jsTiled(c, cOff + m4 * ldc, ldc, a, aOff + m4 * lda, lda, b, bOff, ldb, m - m4, n, k);
}

/** Untiled C −= A·B with the 4×4 register tile; the caller keeps B's block cache-sized. */
function kernel(
  c: Float64Array, cOff: number, ldc: number,
  a: Float64Array, aOff: number, lda: number,
  b: Float64Array, bOff: number, ldb: number,
  m: number, n: number, k: number,
): void {
  const k4 = k - (k % 4);
  let i = 0;
  for (; i + 3 < m; i += 4) {
    const c0 = cOff + i * ldc;
    const c1 = c0 + ldc;
    const c2 = c1 + ldc;
    const c3 = c2 + ldc;
    const a0 = aOff + i * lda;
    const a1 = a0 + lda;
    const a2 = a1 + lda;
    const a3 = a2 + lda;
    let p = 0;
    for (; p < k4; p += 4) {
      const x00 = a[a0 + p]!, x01 = a[a0 + p + 1]!, x02 = a[a0 + p + 2]!, x03 = a[a0 + p + 3]!;
      const x10 = a[a1 + p]!, x11 = a[a1 + p + 1]!, x12 = a[a1 + p + 2]!, x13 = a[a1 + p + 3]!;
      const x20 = a[a2 + p]!, x21 = a[a2 + p + 1]!, x22 = a[a2 + p + 2]!, x23 = a[a2 + p + 3]!;
      const x30 = a[a3 + p]!, x31 = a[a3 + p + 1]!, x32 = a[a3 + p + 2]!, x33 = a[a3 + p + 3]!;
      const b0 = bOff + p * ldb;
      const b1 = b0 + ldb;
      const b2 = b1 + ldb;
      const b3 = b2 + ldb;
      for (let j = 0; j < n; j++) {
        const y0 = b[b0 + j]!, y1 = b[b1 + j]!, y2 = b[b2 + j]!, y3 = b[b3 + j]!;
        c[c0 + j] = c[c0 + j]! - (x00 * y0 + x01 * y1 + x02 * y2 + x03 * y3);
        c[c1 + j] = c[c1 + j]! - (x10 * y0 + x11 * y1 + x12 * y2 + x13 * y3);
        c[c2 + j] = c[c2 + j]! - (x20 * y0 + x21 * y1 + x22 * y2 + x23 * y3);
        c[c3 + j] = c[c3 + j]! - (x30 * y0 + x31 * y1 + x32 * y2 + x33 * y3);
      }
    }
    for (; p < k; p++) {
      const x0 = a[a0 + p]!, x1 = a[a1 + p]!, x2 = a[a2 + p]!, x3 = a[a3 + p]!;
      const b0 = bOff + p * ldb;
      for (let j = 0; j < n; j++) {
        const y = b[b0 + j]!;
        c[c0 + j] = c[c0 + j]! - x0 * y;
        c[c1 + j] = c[c1 + j]! - x1 * y;
        c[c2 + j] = c[c2 + j]! - x2 * y;
        c[c3 + j] = c[c3 + j]! - x3 * y;
      }
    }
  }
  for (; i < m; i++) {
    const c0 = cOff + i * ldc;
    const a0 = aOff + i * lda;
    let p = 0;
    for (; p < k4; p += 4) {
      const x0 = a[a0 + p]!, x1 = a[a0 + p + 1]!, x2 = a[a0 + p + 2]!, x3 = a[a0 + p + 3]!;
      const b0 = bOff + p * ldb;
      const b1 = b0 + ldb;
      const b2 = b1 + ldb;
      const b3 = b2 + ldb;
      for (let j = 0; j < n; j++) c[c0 + j] = c[c0 + j]! - (x0 * b[b0 + j]! + x1 * b[b1 + j]! + x2 * b[b2 + j]! + x3 * b[b3 + j]!);
    }
    for (; p < k; p++) {
      const x = a[a0 + p]!;
      const b0 = bOff + p * ldb;
      for (let j = 0; j < n; j++) c[c0 + j] = c[c0 + j]! - x * b[b0 + j]!;
    }
  }
}
