// The C −= A·B kernels (JavaScript and hand-assembled Wasm SIMD) against a plain triple loop (the definition) on
// sub-blocks with offsets and leading dimensions, at shapes that are and are not multiples of the 4×4 tile.
import { describe, it, expect, afterAll } from 'vitest';
import { gemmSubtract, setKernelMode } from '../../../src/linalg/gemm.ts';
import { instantiateGemm, gemmModuleBytes } from '../../../src/linalg/wasm-gemm.ts';
import { withWorkspace } from '../../../src/linalg/workspace.ts';
import { seeded } from '../../support/random.ts';

interface Case { m: number; n: number; k: number; ldc: number; lda: number; ldb: number; cOff: number; aOff: number; bOff: number }

const SHAPES: Array<[number, number, number]> = [[1, 1, 1], [4, 4, 1], [5, 7, 3], [8, 8, 8], [13, 300, 9], [300, 13, 130], [64, 520, 260]];

function caseFor([m, n, k]: [number, number, number]): Case {
  return { m, n, k, ldc: n + 3, lda: k + 5, ldb: n + 1, cOff: 2, aOff: 1, bOff: 3 };
}

function fill(x: Float64Array, seed: number): void {
  const r = seeded(seed);
  for (let q = 0; q < x.length; q++) x[q] = r() * 2 - 1;
}

/** The definition, on copies. */
function expected(c: Float64Array, a: Float64Array, b: Float64Array, t: Case): Float64Array {
  const out = Float64Array.from(c);
  for (let i = 0; i < t.m; i++) for (let j = 0; j < t.n; j++) {
    let s = 0;
    for (let p = 0; p < t.k; p++) s += a[t.aOff + i * t.lda + p]! * b[t.bOff + p * t.ldb + j]!;
    out[t.cOff + i * t.ldc + j] = out[t.cOff + i * t.ldc + j]! - s;
  }
  return out;
}

function maxDiff(x: Float64Array, y: Float64Array): number {
  let d = 0;
  for (let q = 0; q < x.length; q++) d = Math.max(d, Math.abs(x[q]! - y[q]!));
  return d;
}

describe('gemmSubtract', () => {
  afterAll(() => setKernelMode('auto'));
  it('this engine compiles the Wasm SIMD module (so the tests below exercise it)', () => {
    expect(gemmModuleBytes().subarray(0, 4)).toEqual(Uint8Array.from([0, 0x61, 0x73, 0x6d]));
    expect(instantiateGemm(1024)).not.toBeNull();
  });
  for (const shape of SHAPES) {
    const t = caseFor(shape);
    const sizes = [t.cOff + t.m * t.ldc, t.aOff + t.m * t.lda, t.bOff + t.k * t.ldb];
    it(`JavaScript kernel at ${shape.join('×')}`, () => {
      const [c, a, b] = sizes.map((l) => new Float64Array(l)) as [Float64Array, Float64Array, Float64Array];
      fill(c, 1); fill(a, 2); fill(b, 3);
      const want = expected(c, a, b, t);
      gemmSubtract(c, t.cOff, t.ldc, a, t.aOff, t.lda, b, t.bOff, t.ldb, t.m, t.n, t.k);
      expect(maxDiff(c, want)).toBeLessThan(1e-12 * t.k);
    });
    it(`Wasm kernel (workspace views) at ${shape.join('×')}, entries outside the block untouched`, () => {
      withWorkspace(sizes, ([c, a, b]) => {
        expect(c!.buffer).not.toBeInstanceOf(SharedArrayBuffer);
        fill(c!, 1); fill(a!, 2); fill(b!, 3);
        const want = expected(c!, a!, b!, t);
        gemmSubtract(c!, t.cOff, t.ldc, a!, t.aOff, t.lda, b!, t.bOff, t.ldb, t.m, t.n, t.k);
        expect(maxDiff(c!, want)).toBeLessThan(1e-12 * t.k);
      });
    });
  }
  it('a workspace in js mode is plain memory, and results agree with the Wasm path', () => {
    setKernelMode('js');
    const plain = withWorkspace([4096], ([x]) => x!.buffer.byteLength);
    expect(plain).toBe(4096 * 8);
    setKernelMode('auto');
  });
});
