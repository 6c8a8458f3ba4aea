// The power-series certificate: rigorous, minimal, and honest about divergence.
import { describe, it, expect } from 'vitest';
import { inv } from 'mathjs';
import { certificate, contractionRate, contractionRates, MAX_ROUNDS, roundByRound, roundsFor, seriesVerdict } from '../../../src/model/rounds.ts';
import { seeded } from '../../support/random.ts';

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
        const k = roundsFor(cert, tol)!;
        expect((3 * beta ** (k + 1)) / (1 - beta)).toBeLessThanOrEqual(tol);
        if (k > 0) expect((3 * beta ** k) / (1 - beta)).toBeGreaterThan(tol);
      }
    }
  });

  it('a contraction rate within rounding of 1 gives null (more than MAX_ROUNDS rounds), not a loop that k++ cannot end', () => {
    // 2⁵³ + 1 is not a double: past 2⁵³ rounds, k++ leaves k unchanged, so a stepping loop there never ends
    for (const beta of [1 - 2 ** -52, 1 - 4e-15, 1 - 1e-9, 1 - 1e-6]) {
      const cert = { v: Float64Array.of(1), beta, spread: 1, source: 'row sums' as const };
      expect(roundsFor(cert, 1e-6)).toBeNull();
    }
    // just inside the cap: the least k, as before (k + 1 ≥ log(tol(1 − β))/log β)
    const cert = { v: Float64Array.of(1), beta: 0.9999, spread: 1, source: 'row sums' as const };
    const k = roundsFor(cert, 1e-6)!;
    expect(k).toBeLessThanOrEqual(MAX_ROUNDS);
    expect(0.9999 ** (k + 1) / 1e-4).toBeLessThanOrEqual(1e-6);
    expect(0.9999 ** k / 1e-4).toBeGreaterThan(1e-6);
    expect(k).toBeGreaterThan(200_000); // log(1e-10)/log(0.9999) ≈ 230,247
    expect(roundsFor(cert, 1e-6, 1000)).toBeNull();
    expect(() => roundByRound(Float64Array.of(0.5), 1, Float64Array.of(1), 2 ** 53, null)).toThrow(RangeError);
  });

  it('ρ(A) certified below 1 but within 4e-15: "not practically convergent", with the certificate and an estimate of the rounds', () => {
    const a = flat([[0.5, 0.5 - 4e-15], [0.5 - 4e-15, 0.5]]); // eigenvalues 0.5 ± (0.5 − 4e-15)
    const v = seriesVerdict(a, 2, { perron: Float64Array.of(0.5, 0.5) }, 1e-6, 1 - 5e-15);
    expect(v.converges).toBe(false);
    if (v.converges) return;
    expect(v.kind).toBe('too-slow');
    expect(v.certificate!.beta).toBeLessThan(1);
    // rounds ≈ log(1e-6·(1 − β))/log β ≈ 47/4e-15 ≈ 1.2e16 (β from the row sums, widened for rounding)
    expect(v.roundsEstimate!).toBeGreaterThan(1e16);
    expect(v.roundsEstimate!).toBeLessThan(2e16);
    expect(v.reason).toMatch(/^not practically convergent/);
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
  it('contractionRates gives each vector the rate contractionRate gives it alone, bit for bit (three vectors in registers, or any number)', () => {
    const r = seeded(77);
    for (let t = 0; t < 40; t++) {
      const n = 1 + (t % 13);
      const a = Float64Array.from({ length: n * n }, () => (r() < 0.3 ? 0 : (r() - 0.2) / n));
      const k = 1 + (t % 4);
      const vs = Array.from({ length: k }, (_, c) => Float64Array.from({ length: n }, () => (c === 1 && t % 5 === 0 ? r() - 0.5 : 0.1 + r())));
      const rates = contractionRates(a, n, vs);
      vs.forEach((v, c) => expect(rates[c]).toBe(contractionRate(a, n, v)));
    }
  });
});
