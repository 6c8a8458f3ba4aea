// Kernels split across a helper thread (src/linalg/parallel.ts protocol, Node adapter src/cli/parallel.ts) give the
// same numbers as the single-thread kernels: each row of C is computed by exactly the same operations whichever
// thread takes its chunk, so results must be bit-identical, and agree with the unblocked reference to rounding.
import { describe, it, expect, beforeAll, afterAll } from 'vitest';
import { luFactor, luInverse, luSolveMany } from '../../../src/linalg/index.ts';
import { luFactorReference, luInverseReference } from '../../../src/linalg/lu-reference.ts';
import { splitJobCount, sharedKernel } from '../../../src/linalg/parallel.ts';
import { bytesAtFactorHome, withKeptFactors } from '../../../src/linalg/workspace.ts';
import type { LU } from '../../../src/linalg/index.ts';
import { startParallelKernels, parallelKernelsReady, stopParallelKernels } from '../../../src/cli/index.ts';
import { randomMatrix } from '../../support/random.ts';

const N = 301; // large enough for split updates, not a multiple of 4
const a = randomMatrix(N, N, 42);
const b = randomMatrix(N, 9, 43);
const single = (() => {
  const f = luFactor(a, N);
  return { f, inv: luInverse(f), many: luSolveMany(f, b, 9) };
})();

/** A factorisation made while the helpers were attached: kept at the start of their shared memory. */
let kept: LU | null = null;

describe('kernels with a helper thread', () => {
  beforeAll(async () => {
    expect(startParallelKernels(1)).toBe(1);
    expect(await parallelKernelsReady()).toBe(1);
  });
  afterAll(async () => { await stopParallelKernels(); });

  it('lends the factors\' future home for input read before them (the CLI reads a large table file there)', () => {
    const bytes = bytesAtFactorHome(sharedKernel()!, 4096);
    expect(bytes).not.toBeNull();
    expect(bytes!.buffer).toBe(sharedKernel()!.memory.buffer);
    expect(bytes!.byteOffset).toBe(0);
    // Garbage where the factors will be kept (every double a NaN): the next test's factors must not see it.
    bytes!.fill(0xff);
  });

  it('splits large updates and gives bit-identical factors, inverse and solves', () => {
    const before = splitJobCount();
    const f = luFactor(a, N);
    const inv = luInverse(f);
    const many = luSolveMany(f, b, 9);
    kept = f;
    // The home is taken now: nothing else may be read there.
    expect(bytesAtFactorHome(sharedKernel()!, 16)).toBeNull();
    expect(splitJobCount()).toBeGreaterThan(before);
    expect(sharedKernel()).not.toBeNull();
    expect(Array.from(f.piv)).toEqual(Array.from(single.f.piv));
    expect(Array.from(f.lu)).toEqual(Array.from(single.f.lu));
    expect(Array.from(inv)).toEqual(Array.from(single.inv));
    expect(Array.from(many)).toEqual(Array.from(single.many));
    // Results are ordinary (unshared) arrays that outlive the workspace.
    expect(inv.buffer).not.toBeInstanceOf(SharedArrayBuffer);
  });

  it('agrees with the unblocked reference', () => {
    const g = luFactorReference(a, N);
    const ref = luInverseReference(g);
    const inv = luInverse(luFactor(a, N));
    let d = 0, s = 0;
    for (let k = 0; k < N * N; k++) { d = Math.max(d, Math.abs(inv[k]! - ref[k]!)); s = Math.max(s, Math.abs(ref[k]!)); }
    expect(d / s).toBeLessThan(1e-10);
  });
});

describe('after the helpers stop', () => {
  it('runs single-threaded with the same results', () => {
    expect(sharedKernel()).toBeNull();
    const before = splitJobCount();
    expect(Array.from(luInverse(luFactor(a, N)))).toEqual(Array.from(single.inv));
    expect(splitJobCount()).toBe(before);
  });

  it('solves against factors kept in the shared memory where they are, after it grew, with the same results', () => {
    const f = kept!;
    expect(f.lu.buffer).toBeInstanceOf(SharedArrayBuffer);
    const seen = withKeptFactors(f.lu, [N * N * 4], (lu, [x]) => {
      // The factors in place (same bytes, a view of the grown memory), the workspace after them.
      expect(lu.buffer).toBe(x!.buffer);
      expect(lu.byteOffset).toBe(f.lu.byteOffset);
      expect(x!.byteOffset).toBeGreaterThanOrEqual(f.lu.byteOffset + 8 * N * N);
      return Array.from(lu);
    });
    expect(seen).toEqual(Array.from(single.f.lu));
    expect(Array.from(luSolveMany(f, b, 9))).toEqual(Array.from(single.many));
  });

  it('solves against factors in storage of their own where they are when the right-hand sides fit after them', () => {
    // single.f was factored without helpers, in a Wasm memory of its own with room for 256 right-hand sides.
    expect(single.f.lu.buffer).not.toBeInstanceOf(SharedArrayBuffer);
    const inPlace = withKeptFactors(single.f.lu, [N * 9], (lu, [x]) => lu.buffer === single.f.lu.buffer && lu.byteOffset === 0 && x!.buffer === lu.buffer);
    expect(inPlace).toBe(true);
    // The same numbers, bit for bit, as the same factors copied into a workspace (an ordinary array is never taken).
    const copied = luSolveMany({ ...single.f, lu: Float64Array.from(single.f.lu) }, b, 9);
    expect(Array.from(luSolveMany(single.f, b, 9))).toEqual(Array.from(copied));
    // Too many to fit, or factors in an ordinary array: not taken (the caller copies them into a workspace).
    expect(withKeptFactors(single.f.lu, [N * N], () => true)).toBeNull();
    const small = luFactor(a.subarray(0, 100), 10);
    expect(withKeptFactors(small.lu, [10], () => true)).toBeNull();
  });
});
