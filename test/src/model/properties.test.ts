// Properties that are theorems, checked with fast-check on random non-negative matrices. References are computed
// independently: ρ by ml-matrix's eigenvalue decomposition, leading minors by mathjs's det, L by mathjs's inv.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { det, inv } from 'mathjs';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { analyzeTable } from '../../../src/model/analysis.ts';
import { hawkinsSimon } from '../../../src/model/hawkins.ts';
import { perronRoot } from '../../../src/model/perron.ts';
import { sectorBlocks } from '../../../src/model/graph.ts';
import { roundByRound } from '../../../src/model/rounds.ts';
import { randomEconomy, tableFromA } from '../../support/coefficient-tables.ts';

function evdRadius(rows: number[][]): number {
  const evd = new EigenvalueDecomposition(new Matrix(rows));
  return Math.max(0, ...evd.realEigenvalues.map((re, k) => Math.hypot(re, evd.imaginaryEigenvalues[k]!)));
}

/**
 * Reference ρ: ml-matrix's eigenvalues of each irreducible diagonal block (where the Perron root is a simple eigenvalue
 * and so computed to about ε·its condition), the largest over the blocks (Horn & Johnson §8.3). On the whole of a
 * reducible matrix a defective eigenvalue (a Jordan block of size m) is only computed to about ε^{1/m}.
 */
function spectralRadius(rows: number[][]): number {
  const n = rows.length;
  let best = 0;
  for (const b of sectorBlocks(Float64Array.from(rows.flat()), n)) {
    if (!b.cyclic) continue;
    best = Math.max(best, evdRadius(b.sectors.map((i) => b.sectors.map((j) => rows[i]![j]!))));
  }
  return best;
}

/** Non-negative n×n matrices with some zeros, as rows (entries in steps of 1e-4, so the reference QR never meets subnormals). */
const entry = fc.oneof(fc.constant(0), fc.integer({ min: 0, max: 10000 }).map((k) => k / 10000));
const nonNegative = fc.integer({ min: 1, max: 7 }).chain((n) =>
  fc.array(fc.array(entry, { minLength: n, maxLength: n }), { minLength: n, maxLength: n }));

/** Scale to a target spectral radius t (so both sides of ρ = 1 are well represented). */
function scaledTo(rows: number[][], t: number): number[][] | null {
  const r = spectralRadius(rows);
  if (!(r > 1e-6)) return null;
  return rows.map((row) => row.map((v) => (v * t) / r));
}

describe('theorems (fast-check)', () => {
  it('the blocks of the sector graph are its strongly connected components (by definition: mutual reachability, here by Warshall\'s transitive closure)', () => {
    // Sparse patterns of up to 12 sectors (mostly zeros, so the matrix is often reducible and the dense shortcut's
    // sweeps leave work to its column search), and full ones.
    const pattern = fc.integer({ min: 1, max: 12 }).chain((n) => fc.tuple(fc.constant(n), fc.array(fc.oneof(fc.constant(0), fc.constant(0), fc.constant(0), fc.constant(0.5)), { minLength: n * n, maxLength: n * n })));
    fc.assert(fc.property(pattern, ([n, flat]) => {
      const reach = flat.map((v) => v !== 0);
      for (let k = 0; k < n; k++) for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (reach[i * n + k] && reach[k * n + j]) reach[i * n + j] = true;
      const blockOf = new Int32Array(n).fill(-1);
      sectorBlocks(Float64Array.from(flat), n).forEach((b, k) => { for (const i of b.sectors) blockOf[i] = k; });
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          const mutual = i === j || (reach[i * n + j]! && reach[j * n + i]!);
          expect(blockOf[i] === blockOf[j]).toBe(mutual);
        }
      }
    }), { numRuns: 300 });
  });

  it('Hawkins–Simon ⇔ ρ(A) < 1 for non-negative A (Hawkins & Simon, Econometrica 1949)', () => {
    fc.assert(fc.property(nonNegative, fc.double({ min: 0.3, max: 1.7, noNaN: true }), (raw, t) => {
      const a = scaledTo(raw, t);
      fc.pre(a !== null);
      const rho = spectralRadius(a!);
      fc.pre(Math.abs(rho - 1) > 1e-6);
      const n = a!.length;
      const ima = a!.map((row, i) => row.map((v, j) => (i === j ? 1 : 0) - v));
      let allMinorsPositive = true;
      for (let k = 1; k <= n; k++) if (!((det(ima.slice(0, k).map((r) => r.slice(0, k))) as number) > 0)) { allMinorsPositive = false; break; }
      expect(allMinorsPositive).toBe(rho < 1); // the theorem itself, on reference computations
      expect(hawkinsSimon(Float64Array.from(a!.flat()), n).holds).toBe(rho < 1);
      const an = analyzeTable(tableFromA(a!));
      expect(an.viability.productive).toBe(rho < 1);
      expect(an.viability.hawkinsSimon).toBe(rho < 1);
      expect(an.series.converges).toBe(rho < 1);
    }), { numRuns: 200, seed: 20261201 });
  });

  it('Collatz–Wielandt bounds bracket ρ on positive matrices (ρ from ml-matrix on the whole matrix)', () => {
    const positive = fc.integer({ min: 1, max: 9 }).chain((n) =>
      fc.array(fc.array(fc.integer({ min: 1, max: 10000 }).map((k) => k / 10000), { minLength: n, maxLength: n }), { minLength: n, maxLength: n }));
    fc.assert(fc.property(positive, (a) => {
      const rho = evdRadius(a);
      const p = perronRoot(Float64Array.from(a.flat()), a.length);
      expect(p.lower).toBeLessThanOrEqual(rho * (1 + 1e-12));
      expect(p.upper).toBeGreaterThanOrEqual(rho * (1 - 1e-12));
      expect(p.upper - p.lower).toBeLessThanOrEqual(1e-11 * rho);
    }), { numRuns: 300, seed: 17 });
  });

  it('Collatz–Wielandt bounds bracket ρ (ρ from ml-matrix, block by block)', () => {
    fc.assert(fc.property(nonNegative, (a) => {
      const n = a.length;
      const rho = spectralRadius(a);
      const p = perronRoot(Float64Array.from(a.flat()), n);
      const slack = 1e-10 * Math.max(1, rho); // the reference eigenvalue's own rounding
      expect(p.lower).toBeLessThanOrEqual(rho + slack);
      expect(p.upper).toBeGreaterThanOrEqual(rho - slack);
    }), { numRuns: 300, seed: 7 });
  });

  it('L ≥ I elementwise and L agrees with mathjs (productive tables)', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 25 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
      const an = analyzeTable(randomEconomy(n, seed, 0.4), { inverse: true });
      const L = an.leontief!;
      const rows = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0) - an.coefficients.A[i * n + j]!));
      const ref = inv(rows) as number[][];
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
        expect(L[i * n + j]!).toBeGreaterThanOrEqual(i === j ? 1 : 0);
        expect(Math.abs(L[i * n + j]! - ref[i]![j]!)).toBeLessThanOrEqual(1e-9 * Math.abs(ref[i]![j]!) + 1e-15);
      }
    }), { numRuns: 60, seed: 3 });
  });

  it('partial power sums approach L·f within the stated bound', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 15 }), fc.integer({ min: 0, max: 1e6 }), fc.array(fc.double({ min: -5, max: 5, noNaN: true }), { minLength: 15, maxLength: 15 }), (n, seed, fs) => {
      const an = analyzeTable(randomEconomy(n, seed, 0.5), { inverse: true });
      expect(an.series.converges).toBe(true);
      if (!an.series.converges) return;
      const f = Float64Array.from(fs.slice(0, n));
      const L = an.leontief!;
      const exact = new Float64Array(n);
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) exact[i] = exact[i]! + L[i * n + j]! * f[j]!;
      const k = an.viability.roundsToTolerance!;
      const rr = roundByRound(an.coefficients.A, n, f, k, an.series.certificate);
      let fmax = 0;
      for (const v of f) fmax = Math.max(fmax, Math.abs(v));
      const rounding = 1e-12 * (fmax + 1);
      for (let t = 0; t <= k; t++) {
        for (let i = 0; i < n; i++) {
          expect(Math.abs(exact[i]! - rr.partialSums[t]![i]!)).toBeLessThanOrEqual(rr.errorBounds![t]![i]! + rounding);
        }
      }
      for (let i = 0; i < n; i++) expect(Math.abs(exact[i]! - rr.partialSums[k]![i]!)).toBeLessThanOrEqual(an.viability.tolerance * fmax + rounding);
    }), { numRuns: 60, seed: 11 });
  });

  it('Type II ≥ Type I (households only add induced rounds; Miller & Blair 2009 §6.2)', () => {
    fc.assert(fc.property(fc.integer({ min: 1, max: 20 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
      const an = analyzeTable(randomEconomy(n, seed));
      const m = an.multipliers;
      for (let j = 0; j < n; j++) {
        expect(m.output.typeII[j]!).toBeGreaterThanOrEqual(m.output.typeI[j]!);
        expect(m.income.typeII[j]!).toBeGreaterThanOrEqual(m.income.typeI[j]!);
        expect(m.employment.typeII[j]!).toBeGreaterThanOrEqual(m.employment.typeI[j]!);
        expect(m.valueAdded.total[j]!).toBeGreaterThanOrEqual(m.valueAdded.simple[j]!);
        expect(m.income.total[j]!).toBeGreaterThanOrEqual(m.income.simple[j]!);
        expect(m.output.typeI[j]!).toBeGreaterThanOrEqual(1);
      }
      expect(an.viability.perronRootClosed!).toBeGreaterThanOrEqual(an.viability.perronRoot - 1e-12);
    }), { numRuns: 80, seed: 5 });
  });

  it('the dominant-round direction A^t f/‖A^t f‖ converges to the right Perron vector (Perron–Frobenius, primitive A)', () => {
    fc.assert(fc.property(fc.integer({ min: 2, max: 12 }), fc.integer({ min: 0, max: 1e6 }), (n, seed) => {
      const an = analyzeTable(randomEconomy(n, seed, 1)); // all flows positive: primitive
      expect(an.viability.primitive).toBe(true);
      const f = Float64Array.from({ length: n }, (_, i) => (i === 0 ? 1 : 0));
      const rr = roundByRound(an.coefficients.A, n, f, 60, null);
      const last = rr.rounds[60]!;
      const s = last.reduce((p, q) => p + q, 0);
      const v = an.viability.rightPerronVector;
      for (let i = 0; i < n; i++) expect(Math.abs(last[i]! / s - v[i]!)).toBeLessThan(1e-8);
      // and the eigen-equation A v = ρ v holds for the vector reported
      for (let i = 0; i < n; i++) {
        let av = 0;
        for (let j = 0; j < n; j++) av += an.coefficients.A[i * n + j]! * v[j]!;
        expect(Math.abs(av - an.viability.perronRoot * v[i]!)).toBeLessThan(1e-10);
      }
    }), { numRuns: 40, seed: 13 });
  });
});
