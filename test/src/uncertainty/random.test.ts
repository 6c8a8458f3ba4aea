// The draws' random streams: reproducible per (seed, draw, purpose), independent across them, and with the
// distributions the perturbation relies on (standard normal deviates, log-normal factors of mean 1 and the asked CV).
import { describe, expect, it } from 'vitest';
import { PURPOSE, Stream, sigmaOf } from '../../../src/uncertainty/index.ts';
import { streamState } from '../../../src/uncertainty/random.ts';
import { xoroshiro128plusFromState } from 'pure-rand/generator/xoroshiro128plus';
import { uniformFloat64 } from 'pure-rand/distribution/uniformFloat64';

const N = 20000;

function normals(seed: number, draw: number, count = N): Float64Array {
  const s = new Stream(seed, draw, PURPOSE.coefficients);
  return Float64Array.from({ length: count }, () => s.normal());
}

function mean(x: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < x.length; i++) s += x[i]!;
  return s / x.length;
}
function variance(x: ArrayLike<number>): number {
  const m = mean(x);
  let s = 0;
  for (let i = 0; i < x.length; i++) s += (x[i]! - m) ** 2;
  return s / (x.length - 1);
}

// Standard normal CDF through erf (Abramowitz & Stegun 7.1.26, |error| < 1.5e-7 — ample for a KS test at this N).
function phi(z: number): number {
  const t = 1 / (1 + 0.3275911 * Math.abs(z) / Math.SQRT2);
  const y = 1 - (((((1.061405429 * t - 1.453152027) * t) + 1.421413741) * t - 0.284496736) * t + 0.254829592) * t * Math.exp(-(z * z) / 2);
  return z >= 0 ? 0.5 * (1 + y) : 0.5 * (1 - y);
}

describe('random streams', () => {
  it('give the same numbers for the same (seed, draw, purpose), in any order of creation', () => {
    const a = normals(7, 3, 50);
    normals(7, 4, 50);
    expect(normals(7, 3, 50)).toEqual(a);
  });

  it('differ between neighbouring seeds, draws and purposes', () => {
    const states = new Set<string>();
    for (let seed = 0; seed < 20; seed++) {
      for (let draw = 0; draw < 50; draw++) {
        for (const p of Object.values(PURPOSE)) states.add(streamState(seed, draw, p).join(','));
      }
    }
    expect(states.size).toBe(20 * 50 * 3);
    const a = normals(1, 0, 200);
    const b = normals(1, 1, 200);
    // Sample correlation of two independent streams: |r| < 4/√n with overwhelming probability.
    const ma = mean(a), mb = mean(b);
    let sab = 0, saa = 0, sbb = 0;
    for (let i = 0; i < a.length; i++) { sab += (a[i]! - ma) * (b[i]! - mb); saa += (a[i]! - ma) ** 2; sbb += (b[i]! - mb) ** 2; }
    expect(Math.abs(sab / Math.sqrt(saa * sbb))).toBeLessThan(4 / Math.sqrt(a.length));
  });

  it('are pure-rand\'s xoroshiro128+ and uniformFloat64, bit for bit (the library is the reference for the inlined steps)', () => {
    for (const [seed, draw, purpose] of [[0, 0, PURPOSE.coefficients], [4294967295, 99999, PURPOSE.delta], [20261202, 7, PURPOSE.localShares]] as const) {
      const ref = xoroshiro128plusFromState(streamState(seed, draw, purpose));
      for (let i = 0; i < 16; i++) ref.next(); // the stream's warm-up
      const ours = new Stream(seed, draw, purpose);
      for (let i = 0; i < 5000; i++) expect(ours.uniform()).toBe(uniformFloat64(ref));
    }
  });

  it('fill a buffer with the deviates normal() gives one by one, bit for bit, and leave the stream where normal() does', () => {
    const one = new Stream(7, 3, PURPOSE.coefficients);
    const bulk = new Stream(7, 3, PURPOSE.coefficients);
    const want = Float64Array.from({ length: N }, () => one.normal());
    const got = new Float64Array(N);
    bulk.normals(got.subarray(0, 1234), 1234); // two calls: the state carries over between them
    bulk.normals(got.subarray(1234), N - 1234);
    expect(Array.from(got)).toEqual(Array.from(want));
    expect(bulk.uniform()).toBe(one.uniform());
    // The sample takes the rare paths too: beyond the ziggurat's base strip (r = 3.4426…, the tail) at least once.
    expect(want.some((z) => Math.abs(z) > 3.442619855899)).toBe(true);
  });

  it('give standard normal deviates (mean, variance, Kolmogorov–Smirnov)', () => {
    const z = normals(20261202, 0);
    // Mean: standard error 1/√N; variance: standard error √(2/(N−1)); 4 standard errors each.
    expect(Math.abs(mean(z))).toBeLessThan(4 / Math.sqrt(N));
    expect(Math.abs(variance(z) - 1)).toBeLessThan(4 * Math.sqrt(2 / (N - 1)));
    // KS statistic against Φ; the 0.1 % critical value for large N is 1.95/√N (Massey, "The Kolmogorov-Smirnov test for
    // goodness of fit", JASA 46, 1951, table 1 asymptotic row — recalled from memory).
    const sorted = Float64Array.from(z).sort();
    let d = 0;
    for (let i = 0; i < N; i++) {
      const f = phi(sorted[i]!);
      d = Math.max(d, Math.abs(f - i / N), Math.abs((i + 1) / N - f));
    }
    expect(d).toBeLessThan(1.95 / Math.sqrt(N));
  });

  it('put the normal probability into each tail and each strip of the ziggurat (a million deviates)', () => {
    const M = 1_000_000;
    const s = new Stream(99, 0, PURPOSE.coefficients);
    const cuts = [0.5, 1, 2, 3, 3.442619855899, 4];
    const beyond = new Array<number>(cuts.length).fill(0);
    let negative = 0;
    for (let k = 0; k < M; k++) {
      const z = s.normal();
      if (z < 0) negative++;
      const a = Math.abs(z);
      for (let c = 0; c < cuts.length; c++) if (a > cuts[c]!) beyond[c]!++;
    }
    // P(|Z| > c) = 2(1 − Φ(c)) (phi above, |error| < 1.5e-7); each count within 5 binomial standard deviations (plus
    // the approximation's error). The cut at r = 3.4426… is where the ziggurat's base strip hands over to its tail.
    cuts.forEach((c, i) => {
      const p = 2 * (1 - phi(c));
      expect(Math.abs(beyond[i]! / M - p)).toBeLessThan(5 * Math.sqrt(p * (1 - p) / M) + 3e-7);
    });
    expect(Math.abs(negative / M - 0.5)).toBeLessThan(5 * Math.sqrt(0.25 / M));
  });

  it('give uniforms on [0, 1) with the mean and variance of U(0, 1)', () => {
    const s = new Stream(3, 9, PURPOSE.localShares);
    const u = Float64Array.from({ length: N }, () => s.uniform());
    expect(Math.min(...u)).toBeGreaterThanOrEqual(0);
    expect(Math.max(...u)).toBeLessThan(1);
    expect(Math.abs(mean(u) - 0.5)).toBeLessThan(4 * Math.sqrt(1 / 12 / N));
    expect(Math.abs(variance(u) - 1 / 12)).toBeLessThan(0.004); // sd of the sample variance ≈ √(1/180/N) ≈ 5e-4
  });

  it('give log-normal factors exp(σz − σ²/2) with mean 1 and standard deviation cv', () => {
    for (const cv of [0.05, 0.3]) {
      const s = sigmaOf(cv);
      const f = Array.from(normals(11, 2), (z) => Math.exp(s * z - (s * s) / 2));
      // Standard error of the mean is cv/√N; of the sd roughly cv·√((κ−1)/(4N)) with kurtosis κ < 4 here.
      expect(Math.abs(mean(f) - 1)).toBeLessThan(4 * cv / Math.sqrt(N));
      expect(Math.abs(Math.sqrt(variance(f)) / cv - 1)).toBeLessThan(0.05);
    }
  });
});
