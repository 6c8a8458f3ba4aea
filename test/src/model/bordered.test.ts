// The household-closed matrix Ā = [A hc; hrᵀ corner] is worked on as its parts (closure.ts, perron.ts, graph.ts):
// every result must equal the one on the formed (n+1)×(n+1) matrix — bit for bit where the same sums run in the same
// order (Perron bounds and vectors), exactly for graph invariants (the period, Denardo 1977; strong connectivity).
import { describe, it, expect } from 'vitest';
import { borderedMatrix, closeHouseholds, householdCorner, type Bordered } from '../../../src/model/closure.ts';
import { borderedPeriod, sectorBlocks } from '../../../src/model/graph.ts';
import { perronRoot, perronRootBordered, perronRootsOpenClosed } from '../../../src/model/perron.ts';
import { coefficients } from '../../../src/model/coefficients.ts';
import { matVec } from '../../../src/linalg/index.ts';
import { seeded } from '../../support/random.ts';
import { randomEconomy } from '../../support/coefficient-tables.ts';

/** Seeded random parts: non-negative, with a share `zeros` of entries (A and both borders) set to zero. */
function randomParts(n: number, seed: number, zeros: number, corner = 0): Bordered {
  const r = seeded(seed);
  const entry = (scale: number) => (r() < zeros ? 0 : r() * scale);
  const A = Float64Array.from({ length: n * n }, () => entry(1.6 / n));
  const hc = Float64Array.from({ length: n }, () => entry(1 / n));
  const hr = Float64Array.from({ length: n }, () => entry(0.4));
  return { A, n, hc, hr, corner };
}

describe('bordered closed matrix', () => {
  it('closeHouseholds forms Ā = [A hc; h 0] on demand (Miller & Blair 2009, §2.5)', () => {
    const c = coefficients(randomEconomy(9, 31));
    const closed = closeHouseholds(c)!;
    const n = c.n, m = n + 1;
    expect(householdCorner(closed)).toBe(0);
    const abar = closed.Abar;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) expect(abar[i * m + j]).toBe(c.A[i * n + j]);
      expect(abar[i * m + n]).toBe(c.householdConsumption[i]! / c.householdIncomeTotal);
    }
    for (let j = 0; j < n; j++) expect(abar[n * m + j]).toBe(c.h[j]);
    expect(abar[n * m + n]).toBe(0);
    expect(closed.Abar).toBe(abar); // formed once
  });

  it('the period and strong connectivity equal those of the formed matrix', () => {
    let connected = 0, split = 0, periodic = 0;
    for (let seed = 1; seed <= 200; seed++) {
      const n = 1 + (seed % 7);
      const zeros = [0, 0.5, 0.8, 0.95][seed % 4]!;
      const b = randomParts(n, seed, zeros, seed % 5 === 0 ? 0.1 : 0);
      const blocks = sectorBlocks(borderedMatrix(b.A, n, b.hc, b.hr, b.corner), n + 1);
      const p = borderedPeriod(b);
      if (blocks.length === 1) {
        connected++;
        if (blocks[0]!.period !== 1) periodic++;
        expect(p).toBe(blocks[0]!.period);
      } else {
        split++;
        expect(p).toBeUndefined();
      }
    }
    // the seeds exercise each case
    expect(connected).toBeGreaterThan(10);
    expect(split).toBeGreaterThan(10);
    expect(periodic).toBeGreaterThan(0);
  });

  it('ρ(Ā) bounds and right vector equal perronRoot on the formed matrix, bit for bit', () => {
    for (let seed = 1; seed <= 120; seed++) {
      const n = 1 + (seed % 23);
      const b = randomParts(n, 1000 + seed, [0, 0.3, 0.7, 0.9][seed % 4]!, seed % 6 === 0 ? 0.05 : 0);
      const formed = perronRoot(borderedMatrix(b.A, n, b.hc, b.hr, b.corner), n + 1, { rightOnly: true });
      const parts = perronRootBordered(b);
      expect(parts.lower).toBe(formed.lower);
      expect(parts.upper).toBe(formed.upper);
      expect(parts.root).toBe(formed.root);
      expect(parts.converged).toBe(formed.converged);
      expect(Array.from(parts.right)).toEqual(Array.from(formed.right));
    }
  });

  it('ρ(A) and ρ(Ā) iterated together (one pass over A per step) equal the two iterations run alone, bit for bit', () => {
    let fused = 0;
    for (let seed = 1; seed <= 120; seed++) {
      const n = 1 + (seed % 23);
      const b = randomParts(n, 2000 + seed, [0, 0.3, 0.7, 0.9][seed % 4]!, seed % 6 === 0 ? 0.05 : 0);
      // options as the callers pass them: defaults; a low iteration cap on one side (the other runs on alone);
      // the draws' decision at 1
      const opts = [{}, { maxIterations: 3 }, { decideAt: 1 }][seed % 3]!;
      const closedOpts = [{}, { maxIterations: 7 }, { decideAt: 1 }][(seed >> 1) % 3]!;
      const both = perronRootsOpenClosed(b.A, n, opts, b, closedOpts);
      const open = perronRoot(b.A, n, opts);
      const closed = perronRootBordered(b, closedOpts);
      for (const [got, want] of [[both.open, open], [both.closed, closed]] as const) {
        expect([got.lower, got.upper, got.root, got.iterations, got.converged]).toEqual([want.lower, want.upper, want.root, want.iterations, want.converged]);
        expect(Array.from(got.right)).toEqual(Array.from(want.right));
        expect(Array.from(got.left)).toEqual(Array.from(want.left));
        expect(got.blockBounds).toEqual(want.blockBounds);
        expect(got.blocks).toEqual(want.blocks);
      }
      const blocks = sectorBlocks(b.A, n);
      if (n > 1 && blocks.length === 1 && blocks[0]!.cyclic && borderedPeriod(b) != null) fused++;
    }
    expect(fused).toBeGreaterThan(20); // the shared pass ran, not only the fallback
  });

  it('a chain riding on the shared passes gives A^k·start as matVec forms it, bit for bit, and leaves both roots unchanged', () => {
    // The chain's sums must be matVec's (dense.ts) in the same order, so the unit spending rounds read from it
    // (powers.ts) are the ones formed product by product.
    let rode = 0;
    for (let seed = 1; seed <= 80; seed++) {
      const n = 1 + (seed % 23);
      const b = randomParts(n, 3000 + seed, [0, 0.3, 0.7][seed % 3]!);
      const start = Float64Array.from({ length: n }, (_, i) => 1 + ((i * 7 + seed) % 5) / 3);
      const max = [64, 3, 1][seed % 3]!;
      const plain = perronRootsOpenClosed(b.A, n, {}, b);
      const withChain = perronRootsOpenClosed(b.A, n, {}, b, {}, undefined, { start, max });
      for (const [got, want] of [[withChain.open, plain.open], [withChain.closed, plain.closed]] as const) {
        expect([got.lower, got.upper, got.iterations]).toEqual([want.lower, want.upper, want.iterations]);
        expect(Array.from(got.right)).toEqual(Array.from(want.right));
        expect(Array.from(got.left)).toEqual(Array.from(want.left));
      }
      expect(plain.chain).toEqual([]);
      const fused = n > 1 && sectorBlocks(b.A, n).length === 1 && sectorBlocks(b.A, n)[0]!.cyclic && borderedPeriod(b) != null;
      // as many as the closed iteration's passes (it shares them, then runs on alone), up to max; none unfused
      expect(withChain.chain.length).toBe(fused ? Math.min(max, withChain.closed.iterations) : 0);
      let v: Float64Array = start;
      for (const p of withChain.chain) {
        v = matVec(b.A, n, n, v);
        expect(Array.from(p)).toEqual(Array.from(v));
      }
      if (withChain.chain.length > 1) rode++;
    }
    expect(rode).toBeGreaterThan(15);
  });

  it('a hint decides ρ(Ā) < 1 in one step when it can, and the lower bound reaches 1 exactly when it does without one', () => {
    // Collatz–Wielandt (Horn & Johnson 2013, Cor 8.1.29): any positive vector certifies an upper bound, so a hinted
    // step with upper < 1 proves ρ(Ā) < 1 and no certified lower bound can reach 1 (the closed-model decision reads
    // only that); otherwise the plain iteration runs, bit for bit.
    let hintedOne = 0, plainSteps = 0, fellBack = 0;
    for (let seed = 1; seed <= 60; seed++) {
      const n = 2 + (seed % 17);
      // Scaled so that some seeds have ρ(Ā) above 1 (the hint cannot settle those).
      const b = randomParts(n, 2000 + seed, [0, 0.3, 0.6][seed % 3]!);
      if (seed % 4 === 0) for (let k = 0; k < b.A.length; k++) b.A[k] = b.A[k]! * 1.8;
      const near = perronRootBordered({ ...b, A: b.A.map((v) => v * 1.01) }).right; // the Perron vector of a nearby matrix
      const plain = perronRootBordered(b, { decideAt: 1 });
      const hinted = perronRootBordered(b, { decideAt: 1, hint: near });
      expect(hinted.lower >= 1).toBe(plain.lower >= 1);
      if (hinted.iterations === 1 && hinted.upper < 1) {
        hintedOne++;
        plainSteps += plain.iterations;
      } else {
        fellBack++;
        expect(hinted.lower).toBe(plain.lower);
        expect(hinted.upper).toBe(plain.upper);
        expect(hinted.iterations).toBe(plain.iterations);
      }
    }
    expect(hintedOne).toBeGreaterThan(10);
    expect(plainSteps).toBeGreaterThan(hintedOne); // the plain iteration needed more steps for those
    expect(fellBack).toBeGreaterThan(3);
  });

  it('a periodic closed graph (households ⇄ one sector ⇄ another) gets the same certified root', () => {
    // Arcs follow the entries (row i, column j ≠ 0: i → j): a_01 = 0.5 (0 → 1), Ā's column entry for sector 1 = 0.3
    // (1 → households), its row entry for sector 0 = 0.6 (households → 0): one cycle 0 → 1 → h → 0 of length 3.
    const b: Bordered = { A: Float64Array.of(0, 0.5, 0, 0), n: 2, hc: Float64Array.of(0, 0.3), hr: Float64Array.of(0.6, 0), corner: 0 };
    expect(borderedPeriod(b)).toBe(3);
    const r = perronRootBordered(b);
    // ρ of a 3-cycle with weights 0.5, 0.3, 0.6 is (0.5·0.3·0.6)^(1/3) (theorem: the eigenvalues of a weighted cycle
    // are the cube roots of the product of its weights)
    const want = Math.cbrt(0.5 * 0.3 * 0.6);
    expect(r.lower).toBeLessThanOrEqual(want * (1 + 1e-12));
    expect(r.upper).toBeGreaterThanOrEqual(want * (1 - 1e-12));
    expect(Math.abs(r.root - want)).toBeLessThan(1e-10 * want);
  });
});
