// RAS (Stone 1961; Bacharach 1970; Miller & Blair 2009, §7.4) against closed forms and theorems:
// - RAS keeps every cross-product ratio x_ij·x_kl/(x_il·x_kj) of the start matrix (the biproportional form
//   x = diag(r)·A⁰·diag(s); Mosteller 1968, Bishop, Fienberg & Holland 1975 — recalled from memory), so a 2×2 result
//   is the root of a quadratic; with all ratios 1 the result is u·vᵀ/total.
// - the result meets its totals within the tolerance and keeps the zeros of the start matrix.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { ras, rasFeasibility, RasConvergenceError } from '../../../src/regional/index.ts';
import { expectClose } from './build-table.ts';
import { refusal } from '../../support/refusal.ts';
import { seededC } from '../../support/random.ts';

const f64 = (a: number[]) => Float64Array.from(a);

describe('worked examples', () => {
  it('2×2 with A⁰ = [[2,1],[1,2]], u = (4,6), v = (5,5): x11 solves 3a² − 37a + 80 = 0 (cross-product ratio 4)', () => {
    // x = [[a, 4−a],[5−a, 1+a]] with a(1+a) / ((4−a)(5−a)) = 4  ⇒  3a² − 37a + 80 = 0, a = (37 − √409)/6
    const a = (37 - Math.sqrt(409)) / 6;
    const res = ras(f64([2, 1, 1, 2]), 2, 2, f64([4, 6]), f64([5, 5]));
    expect(res.converged).toBe(true);
    expectClose(res.matrix, [a, 4 - a, 5 - a, 1 + a], 1e-9);
  });
  it('a start matrix of ones gives u·vᵀ/total (every cross-product ratio 1)', () => {
    const u = [3, 7, 10];
    const v = [4, 6, 2, 8];
    const res = ras(new Float64Array(12).fill(1), 3, 4, f64(u), f64(v));
    expectClose(res.matrix, u.flatMap((ui) => v.map((vj) => (ui * vj) / 20)), 1e-9);
  });
  it('the first iteration scales rows by u_i/row sum, then columns by v_j/column sum (hand computation); stopping there is refused with that report', () => {
    // A⁰ = [[1,2],[3,4]], u = (6, 14): r = (6/3, 14/7) = (2, 2) ⇒ [[2,4],[6,8]], column sums (8, 12); v = (10, 10): s = (10/8, 10/12)
    let err: unknown = null;
    try {
      ras(f64([1, 2, 3, 4]), 2, 2, f64([6, 14]), f64([10, 10]), { maxIterations: 1, fileName: 'flows.csv' });
    } catch (e) {
      err = e;
    }
    expect(err).toBeInstanceOf(RasConvergenceError);
    const stop = err as RasConvergenceError;
    expect(stop.code).toBe('ras-not-converged');
    expect(stop.location).toEqual({ file: 'flows.csv' });
    expect(stop.message).toMatch(/^RAS did not converge within 1 iterations \(largest relative gap \S+ > 1e-10\)/);
    const res = stop.report;
    expect(res.iterations).toBe(1);
    expectClose(res.matrix, [2 * 1.25, 4 * (10 / 12), 6 * 1.25, 8 * (10 / 12)]);
    expectClose(res.r, [2, 2]);
    expectClose(res.s, [1.25, 10 / 12]);
    expect(res.converged).toBe(false);
  });
  it('reports its iterations, final gaps and history; stops at once when the targets already hold', () => {
    const res = ras(f64([1, 2, 3, 4]), 2, 2, f64([3, 7]), f64([4, 6]));
    expect(res.iterations).toBe(0);
    expect(res.converged).toBe(true);
    const slow = ras(f64([2, 1, 1, 2]), 2, 2, f64([4, 6]), f64([5, 5]), { tolerance: 1e-12 });
    expect(slow.history.length).toBe(slow.iterations);
    expect(slow.history.at(-1)!).toBeLessThanOrEqual(1e-12);
    expect(Math.max(slow.rowGap, slow.columnGap)).toBeLessThanOrEqual(1e-12);
  });
  it('a zero target empties its row (zeros stay, new zeros allowed)', () => {
    const res = ras(f64([1, 1, 1, 1]), 2, 2, f64([0, 5]), f64([2, 3]));
    expect(Array.from(res.matrix.subarray(0, 2))).toEqual([0, 0]);
    expectClose(res.matrix.subarray(2), [2, 3], 1e-12);
  });
});

describe('refusals', () => {
  it('row and column totals that disagree', () => {
    const e = refusal(() => ras(f64([1, 1, 1, 1]), 2, 2, f64([3, 4]), f64([3, 5])));
    expect(e.message).toMatch(/row totals sum to 7 but the column totals sum to 8/);
  });
  it('a positive total on an all-zero row, and on an all-zero column, naming it', () => {
    const labels = { rowLabels: ['Farming', 'Mining'], columnLabels: ['Farming', 'Mining'] };
    const row = refusal(() => ras(f64([0, 0, 1, 1]), 2, 2, f64([1, 3]), f64([2, 2]), labels));
    expect(row.message).toMatch(/every cell of the row is zero/);
    expect(row.location.rowLabel).toBe('Farming');
    const col = refusal(() => ras(f64([1, 0, 1, 0]), 2, 2, f64([2, 2]), f64([3, 1]), labels));
    expect(col.message).toMatch(/every cell of the column is zero/);
    expect(col.location.columnLabel).toBe('Mining');
  });
  it('a zero pattern that cannot carry the totals (Hall condition), naming the rows and columns', () => {
    // row 1 sells only to column 1, which takes 1, but row 1 needs 5
    const e = refusal(() => ras(f64([1, 0, 1, 1]), 2, 2, f64([5, 1]), f64([1, 5]), { rowLabels: ['A', 'B'], columnLabels: ['C', 'D'] }));
    expect(e.message).toMatch(/row 'A' need 5 in total, but the only columns they have entries in \('C'\) take 1/);
  });
  it('negative cells, negative totals, a bad tolerance or cap', () => {
    expect(refusal(() => ras(f64([1, -1, 1, 1]), 2, 2, f64([1, 1]), f64([1, 1]))).message).toMatch(/non-negative matrix/);
    expect(refusal(() => ras(f64([1, 1, 1, 1]), 2, 2, f64([-1, 3]), f64([1, 1]))).message).toMatch(/non-negative number/);
    expect(refusal(() => ras(f64([1, 1, 1, 1]), 2, 2, f64([1, 1]), f64([1, 1]), { tolerance: 0 })).message).toMatch(/tolerance/);
    expect(refusal(() => ras(f64([1, 1, 1, 1]), 2, 2, f64([1, 1]), f64([1, 1]), { maxIterations: 0.5 })).message).toMatch(/iteration cap/);
  });
});

/** A random start matrix with zeros, and feasible targets: the margins of a random matrix with the same pattern. */
const problem = fc
  .record({ m: fc.integer({ min: 1, max: 6 }), n: fc.integer({ min: 1, max: 6 }), seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }), zeros: fc.double({ min: 0, max: 0.5, noNaN: true }) })
  .map(({ m, n, seed, zeros }) => {
    const rnd = seededC(seed);
    const a0 = Float64Array.from({ length: m * n }, () => (rnd() < zeros ? 0 : 0.1 + rnd() * 10));
    const target = a0.map((v) => (v > 0 ? v * (0.2 + rnd() * 5) : 0));
    const u = new Float64Array(m);
    const v = new Float64Array(n);
    for (let i = 0; i < m; i++) for (let j = 0; j < n; j++) { u[i] = u[i]! + target[i * n + j]!; v[j] = v[j]! + target[i * n + j]!; }
    return { m, n, a0, u, v };
  });

describe('properties', () => {
  it('meets the targets within the tolerance, keeps zeros, and keeps cross-product ratios of positive 2×2 blocks', () => {
    fc.assert(
      fc.property(problem, ({ m, n, a0, u, v }) => {
        const tol = 1e-9;
        const res = ras(a0, m, n, u, v, { tolerance: tol, maxIterations: 100_000 });
        expect(res.converged).toBe(true);
        let total = 0;
        for (const x of u) total += x;
        for (let i = 0; i < m; i++) {
          let s = 0;
          for (let j = 0; j < n; j++) s += res.matrix[i * n + j]!;
          expect(Math.abs(s - u[i]!)).toBeLessThanOrEqual(tol * (u[i]! > 0 ? u[i]! : total) * (1 + 1e-6));
        }
        for (let j = 0; j < n; j++) {
          let s = 0;
          for (let i = 0; i < m; i++) s += res.matrix[i * n + j]!;
          expect(Math.abs(s - v[j]!)).toBeLessThanOrEqual(tol * (v[j]! > 0 ? v[j]! : total) * (1 + 1e-6));
        }
        for (let k = 0; k < m * n; k++) if (a0[k] === 0) expect(res.matrix[k]).toBe(0);
        for (let i = 0; i + 1 < m; i++) {
          for (let j = 0; j + 1 < n; j++) {
            const c = [i * n + j, i * n + j + 1, (i + 1) * n + j, (i + 1) * n + j + 1];
            if (c.some((k) => !(res.matrix[k]! > 1e-200))) continue;
            const before = (a0[c[0]!]! * a0[c[3]!]!) / (a0[c[1]!]! * a0[c[2]!]!);
            const after = (res.matrix[c[0]!]! * res.matrix[c[3]!]!) / (res.matrix[c[1]!]! * res.matrix[c[2]!]!);
            expect(Math.abs(after / before - 1)).toBeLessThan(1e-9);
          }
        }
      }),
      { numRuns: 200 },
    );
  });
  it('the feasibility check accepts every target built from the pattern itself', () => {
    fc.assert(fc.property(problem, ({ m, n, a0, u, v }) => { expect(rasFeasibility(a0, m, n, u, v)).toBeNull(); }), { numRuns: 200 });
  });
  it('the feasibility check agrees with the supply–demand theorem checked over every set of rows (Gale 1957)', () => {
    // with equal grand totals, targets are reachable iff every set I of rows has Σ_{i∈I} u_i ≤ Σ_{j∈N(I)} v_j
    const arb = fc.record({ m: fc.integer({ min: 1, max: 5 }), n: fc.integer({ min: 1, max: 5 }), seed: fc.integer({ min: 1, max: 2 ** 31 - 1 }) });
    fc.assert(
      fc.property(arb, ({ m, n, seed }) => {
        const rnd = seededC(seed);
        const a0 = Float64Array.from({ length: m * n }, () => (rnd() < 0.5 ? 0 : 1));
        const u = Float64Array.from({ length: m }, () => Math.floor(rnd() * 5));
        const v = new Float64Array(n);
        let rest = u.reduce((a, b) => a + b, 0);
        for (let j = 0; j < n; j++) { const take = j === n - 1 ? rest : Math.floor(rnd() * (rest + 1)); v[j] = take; rest -= take; }
        let hall = true;
        for (let mask = 1; mask < 1 << m; mask++) {
          let need = 0;
          const reach = new Set<number>();
          for (let i = 0; i < m; i++) if (mask & (1 << i)) { need += u[i]!; for (let j = 0; j < n; j++) if (a0[i * n + j]! > 0) reach.add(j); }
          let give = 0;
          for (const j of reach) give += v[j]!;
          if (need > give) hall = false;
        }
        expect(rasFeasibility(a0, m, n, u, v) === null).toBe(hall);
      }),
      { numRuns: 400 },
    );
  });
});
