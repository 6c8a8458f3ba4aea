// Structural path analysis (Defourny & Thorbecke, Economic Journal 94, 1984): the global influence of o on d equals the
// sum of the total influences of all elementary paths from o to d, and the path multiplier is Δ_p/Δ (their definitions).
import { describe, it, expect } from 'vitest';
import * as math from 'mathjs';
import { prepareModel } from '../../../src/model/index.ts';
import { structuralPaths } from '../../../src/scenario/index.ts';
import { county4, makeTable } from '../../support/example-tables.ts';

function denseTable() {
  // Invented 5-sector table with every flow positive, so there are many elementary paths (65 from one pole to another).
  const n = 5;
  const Z = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => 10 + ((i * 7 + j * 3) % 11) * 6));
  const x = Array.from({ length: n }, (_, j) => 600 + 40 * j);
  return makeTable({
    sectors: ['S1', 'S2', 'S3', 'S4', 'S5'], Z, x,
    labour: x.map((v) => v * 0.25), household: [40, 60, 80, 100, 120], employment: [5, 6, 7, 8, 9],
  });
}

describe('structural paths', () => {
  const t = denseTable();
  const pm = prepareModel(t);
  const n = 5;
  const A = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => t.Z[i * n + j]! / t.x[j]!));
  const IminusA = math.subtract(math.identity(n), math.matrix(A)) as math.Matrix;
  const L = (math.inv(IminusA) as math.Matrix).toArray() as number[][];
  const delta = math.det(IminusA);
  const f = Float64Array.from([100, 0, -30, 50, 0]);
  const all = { maxLength: n - 1, minShare: 0, maxPaths: Number.POSITIVE_INFINITY };

  it('all elementary paths together give the destination’s output change L·f', () => {
    for (let d = 0; d < n; d++) {
      const pa = structuralPaths(pm, f, d, all);
      const ref = L[d]!.reduce((s, l, o) => s + l * f[o]!, 0);
      expect(pa.truncated).toBe(false);
      expect(Math.abs(pa.explained - ref) / Math.abs(ref)).toBeLessThan(1e-12);
      expect(pa.explainedShare).toBeCloseTo(1, 12);
      // 3 shocked origins; from an origin o ≠ d there are Σ_{k=0..3} 3!/(3−k)! = 16 elementary paths; o = d gives one.
      const origins = [0, 2, 3];
      expect(pa.found).toBe(origins.reduce((s, o) => s + (o === d ? 1 : 16), 0));
    }
  });
  it('per origin, total influences sum to the global influence l_do, and M_p = Δ_p / Δ', () => {
    const pa = structuralPaths(pm, f, 4, all);
    const byOrigin = new Map<number, number>();
    for (const p of pa.paths) {
      byOrigin.set(p.poles[0]!, (byOrigin.get(p.poles[0]!) ?? 0) + p.total);
      expect(p.global).toBeCloseTo(L[4]![p.poles[0]!]!, 12);
      const rest = [...Array(n).keys()].filter((k) => !p.poles.includes(k));
      const deltaP = rest.length ? math.det(rest.map((i) => rest.map((j) => (i === j ? 1 : 0) - A[i]![j]!))) : 1;
      expect(p.pathMultiplier).toBeCloseTo(deltaP / delta, 12);
      let direct = 1;
      for (let k = 1; k < p.poles.length; k++) direct *= A[p.poles[k]!]![p.poles[k - 1]!]!;
      expect(p.direct).toBeCloseTo(direct, 15);
      expect(p.contribution).toBeCloseTo(p.total * f[p.poles[0]!]!, 12);
    }
    for (const [o, s] of byOrigin) expect(Math.abs(s - L[4]![o]!) / L[4]![o]!).toBeLessThan(1e-12);
  });
  it('the household-closed system: paths through the household pole sum to the closed-model total', () => {
    const fbar = new Float64Array(n + 1);
    fbar.set(f);
    const pa = structuralPaths(pm, fbar, 1, { ...all, maxLength: n, model: 'closed' });
    const Abar = pm.closed!.Abar;
    const m = n + 1;
    const Lbar = (math.inv(math.subtract(math.identity(m), math.matrix(Array.from({ length: m }, (_, i) => Array.from(Abar.slice(i * m, i * m + m))))) as math.Matrix)).toArray() as number[][];
    const ref = Lbar[1]!.reduce((s, l, o) => s + l * fbar[o]!, 0);
    expect(Math.abs(pa.explained - ref) / Math.abs(ref)).toBeLessThan(1e-12);
    expect(pa.paths.some((p) => p.labels.includes('Households'))).toBe(true);
  });
  it('the bounded search lists the largest paths first and says how much they explain', () => {
    const pm4 = prepareModel(county4());
    const pa = structuralPaths(pm4, Float64Array.from([0, 200, 0, 0]), 0, { maxPaths: 5 });
    expect(pa.paths).toHaveLength(5);
    for (let k = 1; k < pa.paths.length; k++) expect(Math.abs(pa.paths[k - 1]!.contribution)).toBeGreaterThanOrEqual(Math.abs(pa.paths[k]!.contribution));
    expect(pa.paths[0]!.labels).toEqual(['Food processing', 'Farms']);
    expect(pa.explainedShare!).toBeGreaterThan(0.8);
    expect(pa.explainedShare!).toBeLessThanOrEqual(1 + 1e-12);
    const capped = structuralPaths(pm4, Float64Array.from([0, 200, 0, 0]), 0, { maxVisits: 3 });
    expect(capped.truncated).toBe(true);
  });
  // The cut ignores the partial path's own feedback loops, so it is a heuristic; checked here on a dense example.
  it('pruning keeps, in this example, every path that carries more than the threshold', () => {
    const full = structuralPaths(pm, f, 2, all);
    const pruned = structuralPaths(pm, f, 2, { maxLength: n - 1, minShare: 0.01, maxPaths: Number.POSITIVE_INFINITY });
    const big = full.paths.filter((p) => Math.abs(p.contribution) >= 0.01 * Math.abs(full.destinationTotal));
    const keys = new Set(pruned.paths.map((p) => p.poles.join('>')));
    for (const p of big) expect(keys.has(p.poles.join('>'))).toBe(true);
    expect(pruned.found).toBeLessThan(full.found);
  });
});
