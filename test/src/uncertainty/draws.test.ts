// Monte Carlo bands against the outside world: exact collapse with no perturbation, coverage of a distribution known
// in closed form, the first-order (delta-method) variance, widening with the CV, reproducibility, and rejected draws
// counted rather than let into a band.
import { describe, expect, it } from 'vitest';
import { inv, multiply, identity, subtract, matrix, type Matrix } from 'mathjs';
import { SAMPLE_CSV, importTable, type IOTable } from '../../../src/table/index.ts';
import { NO_SHOCK_INPUTS, type LineSet } from '../../../src/scenario/index.ts';
import {
  defaultSettings, planDraws, runDraws, runUncertainty, sigmaOf, startRun, DRAW_STATUS, PURPOSE, Stream,
  type DrawSetup, type UncertaintySettings,
} from '../../../src/uncertainty/index.ts';
import { makeTable } from '../../support/coefficient-tables.ts';
import { EMPLOYMENT_SAMPLE_CSV, NATIONAL_SAMPLE_CSV, parseEmploymentCsv, regionalizeTable } from '../../../src/regional/index.ts';

const sample = importTable(SAMPLE_CSV, { fileName: 'sample.csv' });
const scenario: LineSet = {
  name: 'New plant',
  lines: [
    { sector: 'Food processing', amount: 10000, kind: 'final-demand', localShare: 0.8 },
    { sector: 'Construction', amount: 5000, kind: 'final-demand', localShare: 1 },
  ],
};

function setup(table: IOTable, over: Partial<UncertaintySettings>, extra: Partial<DrawSetup> = {}): DrawSetup {
  return { table, closure: 'households', multipliers: true, scenarios: [scenario], inputs: NO_SHOCK_INPUTS, residentShare: null, settings: defaultSettings(over), spectrum: false, ...extra };
}

// Φ⁻¹(0.05) = −1.6448536269514722 (standard normal table, e.g. Abramowitz & Stegun table 26.5).
const Z05 = -1.6448536269514722;

describe('Monte Carlo bands', () => {
  it('collapse to the point estimate exactly when the CV is 0', () => {
    const r = runUncertainty(setup(sample, { cv: 0, draws: 40 }))!;
    expect(r.accepted).toBe(40);
    for (const m of r.multipliers!) {
      for (const b of m.values) {
        if (b === null) continue;
        expect([b.p5, b.p50, b.p95, b.mean]).toEqual([b.point, b.point, b.point, b.point]);
      }
    }
    const sc = r.scenarios[0]!;
    for (const b of [...Object.values(sc.totals), ...sc.bySector.output, ...(sc.bySector.employment ?? [])]) {
      expect(b).not.toBeNull();
      expect([b!.p5, b!.p50, b!.p95, b!.mean]).toEqual([b!.point, b!.point, b!.point, b!.point]);
    }
    expect(sc.totals.output!.point).toBeGreaterThan(15000); // the shock itself plus indirect and induced effects
  });

  it('cover a distribution known in closed form (one sector: m = 1/(1 − a·f), f log-normal)', () => {
    // Output multiplier of one sector with coefficient a: 1/(1 − a f). Its p-quantile is that of f:
    // f_p = exp(σ Φ⁻¹(p) − σ²/2). The number of draws below the true quantile is Binomial(N, p); we allow 4 standard
    // deviations (normal approximation to the binomial).
    const a = 0.3, cv = 0.2, N = 2000;
    const table = makeTable({ Z: [[a * 100]], x: [100], labour: [10], otherVA: [40], imports: [20], households: [10], otherFD: [60] });
    const s = setup(table, { cv, draws: N, seed: 99 }, { scenarios: [] });
    const plan = planDraws(s);
    const chunk = runDraws(plan, 0, N);
    const key = plan.layout.multipliers.find((m) => m.key === 'output.typeI')!.offset;
    const sigma = sigmaOf(cv);
    const q = (z: number) => 1 / (1 - a * Math.exp(sigma * z - (sigma * sigma) / 2));
    let below05 = 0, below50 = 0, above95 = 0;
    for (let k = 0; k < N; k++) {
      expect(chunk.status[k]).toBe(DRAW_STATUS.accepted);
      const m = chunk.values[k * plan.layout.size + key]!;
      if (m <= q(Z05)) below05++;
      if (m <= q(0)) below50++;
      if (m >= q(-Z05)) above95++;
    }
    const tol = (p: number) => 4 * Math.sqrt(N * p * (1 - p));
    expect(Math.abs(below05 - 0.05 * N)).toBeLessThan(tol(0.05));
    expect(Math.abs(below50 - 0.5 * N)).toBeLessThan(tol(0.5));
    expect(Math.abs(above95 - 0.05 * N)).toBeLessThan(tol(0.05));
    // The reported band brackets the true median and lies near the true 5th and 95th percentiles.
    const b = runUncertainty(s)!.multipliers!.find((m) => m.key === 'output.typeI')!.values[0]!;
    expect(b.p5).toBeLessThan(q(0));
    expect(b.p95).toBeGreaterThan(q(0));
    // How near: the sample p-quantile of N normal deviates has standard deviation √(p(1 − p)/N)/φ(z_p) (asymptotic
    // normality of sample quantiles; Cramér, Mathematical Methods of Statistics, 1946, §28.5 — recalled from memory),
    // and m moves by dm/m = a·f·σ·m per unit of z (delta method); allowed: 4 such standard deviations.
    const near = (z: number) => {
      const f = Math.exp(sigma * z - (sigma * sigma) / 2);
      const sdZ = Math.sqrt(0.05 * 0.95 / N) / (Math.exp(-z * z / 2) / Math.sqrt(2 * Math.PI));
      return 4 * sdZ * a * f * sigma * q(z);
    };
    expect(Math.abs(b.p5 / q(Z05) - 1)).toBeLessThan(near(Z05));
    expect(Math.abs(b.p95 / q(-Z05) - 1)).toBeLessThan(near(-Z05));
  });

  it('spread the output multipliers as the first-order variance from ∂L = L·∂A·L says, for a small CV', () => {
    // Var(m_j) ≈ cv² Σ_ik (u_i a_ik L_kj)², u = 1ᵀL, for independent relative errors of sd cv in each a_ik
    // (first-order Taylor expansion of L = (I − A)⁻¹). L from mathjs, independently of the engine.
    const n = sample.n, cv = 0.01, N = 1500;
    const A: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => sample.Z[i * n + j]! / sample.x[j]!));
    const L = (inv(subtract(identity(n), matrix(A)) as Matrix) as Matrix).toArray() as number[][];
    const u = (multiply(matrix([new Array<number>(n).fill(1)]), matrix(L)) as Matrix).toArray()[0] as number[];
    const r = runUncertainty(setup(sample, { cv, draws: N, seed: 5 }, { scenarios: [] }))!;
    expect(r.accepted).toBe(N);
    const plan = planDraws(setup(sample, { cv, draws: N, seed: 5 }, { scenarios: [] }));
    const chunk = runDraws(plan, 0, N);
    const off = plan.layout.multipliers.find((m) => m.key === 'output.typeI')!.offset;
    for (let j = 0; j < n; j++) {
      let v = 0;
      for (let i = 0; i < n; i++) for (let k = 0; k < n; k++) v += (u[i]! * A[i]![k]! * L[k]![j]!) ** 2;
      const sdDelta = cv * Math.sqrt(v);
      let s1 = 0, s2 = 0;
      for (let d = 0; d < N; d++) { const m = chunk.values[d * plan.layout.size + off + j]!; s1 += m; s2 += m * m; }
      const sdMc = Math.sqrt((s2 - (s1 * s1) / N) / (N - 1));
      // The sample sd has relative standard error ≈ 1/√(2(N−1)) ≈ 1.8 %; 5 of them (16 sectors tested) plus a
      // second-order remainder that is O(cv) relative.
      expect(Math.abs(sdMc / sdDelta - 1)).toBeLessThan(5 / Math.sqrt(2 * (N - 1)) + 0.01);
    }
  });

  it('widen with the CV, on average over seeds', () => {
    const width = (cv: number) => {
      let w = 0;
      for (const seed of [1, 2, 3]) {
        const t = runUncertainty(setup(sample, { cv, draws: 100, seed }, { multipliers: false }))!.scenarios[0]!.totals.output!;
        w += t.p95 - t.p5;
      }
      return w / 3;
    };
    const [w1, w2, w3] = [width(0.02), width(0.08), width(0.3)];
    expect(w1).toBeGreaterThan(0);
    expect(w2).toBeGreaterThan(w1);
    expect(w3).toBeGreaterThan(w2);
  });

  it('are reproducible: the same seed gives bit-identical draws however they are split, another seed other draws', () => {
    const s = setup(sample, { cv: 0.1, draws: 60, seed: 42, localShareRange: 0.1 });
    const plan = planDraws(s);
    const whole = runDraws(plan, 0, 60);
    const parts = [runDraws(planDraws(s), 23, 60), runDraws(planDraws(s), 0, 23)];
    const joined = new Float64Array(whole.values.length);
    joined.set(parts[1]!.values, 0);
    joined.set(parts[0]!.values, parts[1]!.values.length);
    expect(new Uint8Array(joined.buffer)).toEqual(new Uint8Array(whole.values.buffer));
    const r1 = runUncertainty(s, {}, { chunk: 7 });
    const r2 = runUncertainty(s, {}, { chunk: 60 });
    expect(r1).toEqual(r2);
    const other = runUncertainty({ ...s, settings: { ...s.settings, seed: 43 } });
    expect(other!.scenarios[0]!.totals.output!.p50).not.toBe(r1!.scenarios[0]!.totals.output!.p50);
  });

  it('count draws that are not productive and leave them out of every band', () => {
    // One sector with a = 0.8 and CV 0.3: a draw is not productive exactly when its factor f ≥ 1/0.8.
    const a = 0.8, cv = 0.3, N = 400, seed = 8;
    const table = makeTable({ Z: [[a * 100]], x: [100], labour: [10], otherVA: [5], imports: [5], households: [0], otherFD: [20] });
    const s = setup(table, { cv, draws: N, seed }, { scenarios: [{ name: 'x', lines: [{ sector: 'S1', amount: 1, kind: 'final-demand', localShare: 1 }] }] });
    const r = runUncertainty(s)!;
    const sigma = sigmaOf(cv);
    let expected = 0;
    for (let k = 0; k < N; k++) {
      const f = Math.exp(sigma * new Stream(seed, k, PURPOSE.coefficients).normal() - (sigma * sigma) / 2);
      if (a * f >= 1 - 1e-12) expected++;
    }
    expect(expected).toBeGreaterThan(0);
    expect(r.rejectedWhy.notProductive).toBe(expected);
    expect(r.rejected).toBe(expected);
    expect(r.accepted).toBe(N - expected);
    expect(r.notes.join(' ')).toMatch(new RegExp(`${expected} of ${N} draws .* were left out \\(${expected} not productive`));
    const b = r.multipliers!.find((m) => m.key === 'output.typeI')!.values[0]!;
    expect(Number.isFinite(b.p95) && b.p95 > 0 && Number.isFinite(b.mean)).toBe(true);
  });

  it('refuse a table that is not productive itself (no point estimate to put bands around)', () => {
    const table = makeTable({ Z: [[120]], x: [100], labour: [10], otherVA: [5], imports: [5] });
    expect(() => startRun(setup(table, { cv: 0.1, draws: 20 }, { scenarios: [] }))).toThrow(/not productive/);
  });

  it('refuse settings out of range with the setting named', () => {
    expect(() => startRun(setup(sample, { draws: 5 }))).toThrow(/number of draws must be a whole number from 20/);
    expect(() => startRun(setup(sample, { cv: -1 }))).toThrow(/CV must be a number from 0 to 2/);
    expect(() => startRun(setup(sample, { seed: 1.5 }))).toThrow(/seed must be a whole number/);
  });
});

describe('Monte Carlo bands with the FLQ δ drawn', () => {
  // The county estimate is re-made at each draw's δ (here regionalize() on the bundled invented national table).
  const national = importTable(NATIONAL_SAMPLE_CSV, { fileName: 'national.csv' });
  const employment = parseEmploymentCsv(EMPLOYMENT_SAMPLE_CSV, 'employment.csv');
  const tableAt = (delta: number) => regionalizeTable(national, employment, { method: 'flq', delta }).table;
  const county = tableAt(0.3);

  it('draw δ uniformly within the range and widen the bands with it; a range of one δ is no perturbation', () => {
    const base = { cv: 0, draws: 40, seed: 4 };
    const wide = runUncertainty(setup(county, { ...base, deltaRange: [0.1, 0.5] }, { scenarios: [], multipliers: true }), { tableAt })!;
    expect(wide.deltaDrawn![0]).toBeGreaterThanOrEqual(0.1);
    expect(wide.deltaDrawn![1]).toBeLessThan(0.5);
    expect(wide.deltaDrawn![1] - wide.deltaDrawn![0]).toBeGreaterThan(0.2);
    const m = wide.multipliers!.find((x) => x.key === 'output.typeI')!.values[0]!;
    expect(m.p95 - m.p5).toBeGreaterThan(0);
    const one = runUncertainty(setup(county, { ...base, deltaRange: [0.3, 0.3] }, { scenarios: [], multipliers: true }), { tableAt })!;
    for (const b of one.multipliers!.find((x) => x.key === 'output.typeI')!.values) expect([b!.p5, b!.p95]).toEqual([b!.point, b!.point]);
    expect(one.notes[0]).toMatch(/re-estimated at an FLQ δ drawn uniformly from 0.3 to 0.3/);
  });
});
