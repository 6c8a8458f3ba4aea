// The model against mathjs and ml-matrix (general-purpose registry libraries) on seeded random non-negative matrices.
import { describe, it, expect } from 'vitest';
import { det, eigs, inv, multiply, trace } from 'mathjs';
import { analyzeTable } from '../../../src/model/analysis.ts';
import { perronRoot } from '../../../src/model/perron.ts';
import { spectrum } from '../../../src/model/spectrum.ts';
import { hawkinsSimon } from '../../../src/model/hawkins.ts';
import { randomEconomy, toRows } from '../../support/coefficient-tables.ts';
import { seeded } from '../../support/random.ts';
import { rel } from '../../support/compare.ts';

/** Ā from the analysis's own coefficients: A bordered by household purchases per unit of income and income per unit of output. */
function closeRows(an: ReturnType<typeof analyzeTable>, n: number): number[][] {
  const rows = toRows(an.coefficients.A, n).map((row, i) => [...row, an.coefficients.householdConsumption![i]!]);
  rows.push([...Array.from(an.coefficients.labourIncome), 0]);
  return rows;
}

function identityMinusRows(a: number[][]): number[][] {
  return a.map((row, i) => row.map((v, j) => (i === j ? 1 : 0) - v));
}

describe('Leontief inverse, multipliers and determinants against mathjs', () => {
  for (const n of [2, 5, 12, 30]) {
    it(`n=${n}`, () => {
      const t = randomEconomy(n, 4000 + n);
      const an = analyzeTable(t, { inverse: true });
      const A = toRows(an.coefficients.A, n);
      const Lref = inv(identityMinusRows(A)) as number[][];
      const L = an.leontief!;
      let worst = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) worst = Math.max(worst, rel(L[i * n + j]!, Lref[i]![j]!, 1e-300));
      expect(worst).toBeLessThan(1e-9);
      // output multipliers = column sums of mathjs's inverse; income simple = h·L
      const h = Array.from(an.coefficients.labourIncome);
      for (let j = 0; j < n; j++) {
        let col = 0, inc = 0;
        for (let i = 0; i < n; i++) { col += Lref[i]![j]!; inc += h[i]! * Lref[i]![j]!; }
        expect(rel(an.multipliers.output.typeI[j]!, col, 1e-300)).toBeLessThan(1e-9);
        expect(rel(an.multipliers.income.simple[j]!, inc, 1e-300)).toBeLessThan(1e-9);
      }
      // Hawkins–Simon minors: product of our pivots equals mathjs's determinant of each leading block
      const hs = hawkinsSimon(an.coefficients.A, n);
      expect(hs.holds).toBe(true);
      const M = identityMinusRows(A);
      let minor = 1;
      for (let k = 1; k <= n; k++) {
        minor *= hs.pivots[k - 1]!;
        const lead = M.slice(0, k).map((row) => row.slice(0, k));
        expect(rel(minor, det(lead) as number, 1e-300)).toBeLessThan(1e-9);
      }
      expect(an.checks.inverseResidual!).toBeLessThan(30);
      // Type II multipliers: column sums of mathjs's inverse of I − Ā, households as sector n+1 (Miller & Blair 2009, §2.5; README methods table)
      const Abar = closeRows(an, n);
      const Lbar = inv(identityMinusRows(Abar)) as number[][];
      const e = Array.from(an.coefficients.employment!);
      for (let j = 0; j < n; j++) {
        let out = 0, jobs = 0;
        for (let i = 0; i < n; i++) { out += Lbar[i]![j]!; jobs += e[i]! * Lbar[i]![j]!; }
        expect(rel(an.multipliers.output.typeII[j]!, out, 1e-300)).toBeLessThan(1e-9);
        expect(rel(an.multipliers.income.total[j]!, Lbar[n]![j]!, 1e-300)).toBeLessThan(1e-9);
        expect(rel(an.multipliers.employment.total[j]!, jobs, 1e-300)).toBeLessThan(1e-9);
        expect(rel(an.multipliers.income.typeII[j]!, Lbar[n]![j]! / h[j]!, 1e-300)).toBeLessThan(1e-9);
      }
    });
  }
});

/** A = D·S·D⁻¹ with S symmetric non-negative: non-symmetric, non-negative, with S's eigenvalues (mathjs's symmetric solver is robust). */
function similarToSymmetric(n: number, seed: number): { a: Float64Array; s: number[][] } {
  const r = seeded(seed);
  const s: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) for (let j = i; j < n; j++) { const v = r() < 0.7 ? (r() * 1.6) / n : 0; s[i]![j] = v; s[j]![i] = v; }
  const d = Array.from({ length: n }, () => 0.2 + 3 * r());
  const a = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) a[i * n + j] = (d[i]! * s[i]![j]!) / d[j]!;
  return { a, s };
}

describe('eigenvalues against mathjs', () => {
  for (const n of [3, 8, 25, 60]) {
    it(`Perron bounds bracket ρ and the spectrum matches at n=${n}`, () => {
      const { a, s } = similarToSymmetric(n, 77 + n);
      const values = (eigs(s, { eigenvectors: false }).values as unknown as { toArray?: () => number[] }).toArray?.()
        ?? (eigs(s, { eigenvectors: false }).values as unknown as number[]);
      const ref = [...values].sort((p, q) => Math.abs(q) - Math.abs(p) || q - p);
      const rho = Math.abs(ref[0]!);
      const p = perronRoot(a, n);
      expect(p.lower).toBeLessThanOrEqual(rho * (1 + 1e-12));
      expect(p.upper).toBeGreaterThanOrEqual(rho * (1 - 1e-12));
      expect(rel(p.root, rho, 1e-300)).toBeLessThan(1e-9);
      const ours = spectrum(a, n);
      for (let k = 0; k < n; k++) {
        expect(Math.abs(ours[k]!.modulus - Math.abs(ref[k]!))).toBeLessThan(1e-9);
        expect(Math.abs(ours[k]!.im)).toBeLessThan(1e-9);
      }
    });
  }
  for (const n of [4, 10, 40]) {
    it(`non-symmetric spectrum: trace and determinant invariants from mathjs at n=${n}`, () => {
      const r = seeded(900 + n);
      const rows = Array.from({ length: n }, () => Array.from({ length: n }, () => (r() < 0.5 ? 0 : (r() * 2) / n)));
      const a = Float64Array.from(rows.flat());
      const modes = spectrum(a, n);
      // Σλ = tr A, Σλ² = tr A², Πλ = det A (Horn & Johnson Thm 1.2.12), references computed by mathjs
      let sRe = 0, s2Re = 0, pRe = 1, pIm = 0;
      for (const m of modes) {
        sRe += m.re;
        s2Re += m.re * m.re - m.im * m.im;
        [pRe, pIm] = [pRe * m.re - pIm * m.im, pRe * m.im + pIm * m.re];
      }
      expect(Math.abs(sRe - (trace(rows) as number))).toBeLessThan(1e-10);
      expect(Math.abs(s2Re - (trace(multiply(rows, rows) as number[][]) as number))).toBeLessThan(1e-10);
      const d = det(rows) as number;
      expect(Math.abs(pRe - d)).toBeLessThan(1e-10 * Math.max(1, Math.abs(d)));
      expect(Math.abs(pIm)).toBeLessThan(1e-10);
      // the Perron root is the largest modulus (Perron–Frobenius), bracketed by the certified bounds
      const p = perronRoot(a, n);
      expect(p.lower).toBeLessThanOrEqual(modes[0]!.modulus + 1e-12);
      expect(p.upper).toBeGreaterThanOrEqual(modes[0]!.modulus - 1e-12);
    });
  }
});
