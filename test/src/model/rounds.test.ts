// The power-series certificate: rigorous, minimal, and honest about divergence.
import { describe, it, expect } from 'vitest';
import { inv } from 'mathjs';
import { certificate, roundByRound, roundsFor, seriesVerdict } from '../../../src/model/rounds.ts';

const flat = (a: number[][]) => Float64Array.from(a.flat());

describe('power series', () => {
  it('the bound holds round by round for a matrix with negative entries (|A^t f| ≤ |A|^t |f|), L from mathjs', () => {
    const a = [[0.2, -0.3, 0.1], [0.25, 0.1, -0.2], [-0.1, 0.3, 0.15]];
    const n = 3;
    const cert = certificate(flat(a), n, new Float64Array(n).fill(1), 'row sums')!;
    expect(cert.beta).toBeLessThan(1);
    const L = inv(a.map((row, i) => row.map((v, j) => (i === j ? 1 : 0) - v))) as number[][];
    const f = Float64Array.of(3, -1, 2);
    const exact = L.map((row) => row.reduce((s, lij, j) => s + lij * f[j]!, 0));
    const rr = roundByRound(flat(a), n, f, 30, cert);
    for (let t = 0; t <= 30; t++) {
      for (let i = 0; i < n; i++) expect(Math.abs(exact[i]! - rr.partialSums[t]![i]!)).toBeLessThanOrEqual(rr.errorBounds![t]![i]! + 1e-14);
    }
    // the bound is not vacuous: it shrinks geometrically with rate β
    expect(rr.errorBounds![30]![0]! / rr.errorBounds![0]![0]!).toBeCloseTo(cert.beta ** 30, 12);
  });

  it('roundsFor is the least k meeting the tolerance', () => {
    for (const beta of [0.1, 0.5, 0.9, 0.999]) {
      const cert = { v: Float64Array.of(1), beta, spread: 3, source: 'row sums' as const };
      for (const tol of [1e-3, 1e-6, 1e-12]) {
        const k = roundsFor(cert, tol);
        expect((3 * beta ** (k + 1)) / (1 - beta)).toBeLessThanOrEqual(tol);
        if (k > 0) expect((3 * beta ** k) / (1 - beta)).toBeGreaterThan(tol);
      }
    }
  });

  it('says "does not converge" instead of producing an infinite bound when ρ ≥ 1', () => {
    const v = seriesVerdict(flat([[0.5, 0.6], [0.6, 0.5]]), 2, {}, 1e-6, 1.1);
    expect(v.converges).toBe(false);
    // ρ(A) < 1 but every weight vector tried fails to contract: reported, not guessed
    const w = seriesVerdict(flat([[0, 4], [0.01, 0]]), 2, {}, 1e-6, 0); // ρ = 0.2, row sums 4 and 0.01
    expect(w.converges).toBe(false);
    const withPerron = seriesVerdict(flat([[0, 4], [0.01, 0]]), 2, { perron: Float64Array.of(20, 1) }, 1e-6, 0.2);
    expect(withPerron.converges).toBe(true);
    if (withPerron.converges) expect(withPerron.certificate.beta).toBeCloseTo(0.2, 12);
  });
});
