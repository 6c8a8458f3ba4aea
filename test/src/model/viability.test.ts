// Viability on small matrices whose answers follow from theorems or closed forms (named beside each case).
import { describe, it, expect } from 'vitest';
import { analyzeTable } from '../../../src/model/analysis.ts';
import { sectorBlocks, stronglyConnected, sectorGraph } from '../../../src/model/graph.ts';
import { perronRoot } from '../../../src/model/perron.ts';
import { hawkinsSimon } from '../../../src/model/hawkins.ts';
import { classifyMode, spectrum } from '../../../src/model/spectrum.ts';
import { tableFromA } from '../../support/coefficient-tables.ts';

const flat = (a: number[][]) => Float64Array.from(a.flat());

function noBadNumbers(x: unknown): void {
  // Walks the whole Analysis: every number must be finite (NaN and Infinity never reach the user).
  if (typeof x === 'number') { expect(Number.isFinite(x)).toBe(true); return; }
  if (x instanceof Float64Array) { for (const v of x) expect(Number.isFinite(v)).toBe(true); return; }
  if (Array.isArray(x)) { x.forEach(noBadNumbers); return; }
  if (x && typeof x === 'object') Object.values(x).forEach(noBadNumbers);
}

describe('sector graph', () => {
  it('finds strongly connected blocks in topological order (Tarjan 1972)', () => {
    // 0 ⇄ 1 sell to 2; 2 sells to 3 ⇄ 4; 5 is isolated
    const a = new Float64Array(36);
    for (const [i, j] of [[0, 1], [1, 0], [1, 2], [2, 3], [3, 4], [4, 3]]) a[i! * 6 + j!] = 0.1;
    const comps = stronglyConnected(sectorGraph(a, 6));
    const pos = (s: number) => comps.findIndex((c) => c.includes(s));
    expect(comps.map((c) => c.join(',')).sort()).toEqual(['0,1', '2', '3,4', '5']);
    expect(pos(0)).toBeLessThan(pos(2));
    expect(pos(2)).toBeLessThan(pos(3));
  });
  it('handles a 3000-sector chain without overflowing the call stack', () => {
    const n = 3000;
    const adj = Array.from({ length: n }, (_, i) => Int32Array.of((i + 1) % n));
    expect(stronglyConnected(adj)).toHaveLength(1);
  });
  it('period = gcd of cycle lengths (Denardo 1977)', () => {
    // cycles of length 2 and 4 only: period 2; add a 3-cycle: period 1
    const a = new Float64Array(25);
    for (const [i, j] of [[0, 1], [1, 0], [1, 2], [2, 3], [3, 0]]) a[i! * 5 + j!] = 0.2;
    a[4 * 5 + 4] = 0.1;
    const blocks = sectorBlocks(a, 5);
    expect(blocks.find((b) => b.sectors.includes(0))!.period).toBe(2);
    expect(blocks.find((b) => b.sectors.includes(4))!.period).toBe(1);
    a[2 * 5 + 0] = 0.2; // 0→1→2→0
    expect(sectorBlocks(a, 5).find((b) => b.sectors.includes(0))!.period).toBe(1);
  });
});

describe('Perron root', () => {
  it('cyclic permutation scaled by 0.5: ρ = 0.5 exactly, period 3 (eigenvalues are 0.5·cube roots of 1)', () => {
    const a = flat([[0, 0.5, 0], [0, 0, 0.5], [0.5, 0, 0]]);
    const p = perronRoot(a, 3);
    expect(p.lower).toBeLessThanOrEqual(0.5);
    expect(p.upper).toBeGreaterThanOrEqual(0.5);
    expect(p.upper - p.lower).toBeLessThan(1e-14);
    expect(p.converged).toBe(true);
    const an = analyzeTable(tableFromA([[0, 0.5, 0], [0, 0, 0.5], [0.5, 0, 0]]));
    expect(an.viability.period).toBe(3);
    expect(an.viability.primitive).toBe(false);
    const kinds = an.viability.spectrum!.map((m) => m.kind).sort();
    expect(kinds).toEqual(['decay', 'rotating-decay', 'rotating-decay']);
  });
  it('reducible: ρ is the largest over the diagonal blocks (Horn & Johnson §8.3)', () => {
    // upper block triangular: blocks [[0.2, 0.3],[0.3, 0.2]] (ρ = 0.5) and [[0.7]] (ρ = 0.7)
    const a = [[0.2, 0.3, 0.1], [0.3, 0.2, 0.1], [0, 0, 0.7]];
    const an = analyzeTable(tableFromA(a));
    expect(an.viability.irreducible).toBe(false);
    expect(an.viability.blocks.map((b) => b.sectors.join(',')).sort()).toEqual(['0,1', '2']);
    const [lo, hi] = an.viability.perronRootBounds;
    expect(lo).toBeLessThanOrEqual(0.7);
    expect(hi).toBeGreaterThanOrEqual(0.7);
    expect(hi - lo).toBeLessThan(1e-12);
    const b01 = an.viability.blocks.find((b) => b.sectors.length === 2)!;
    expect(b01.perronRootBounds[0]).toBeLessThanOrEqual(0.5 + 1e-15);
    expect(b01.perronRootBounds[1]).toBeGreaterThanOrEqual(0.5 - 1e-15);
    expect(an.viability.period).toBeNull();
    expect(an.viability.productive).toBe(true);
    // the reported right vector is a non-negative eigenvector for ρ (the dominant block is unique here)
    const v = an.viability.rightPerronVector;
    for (let i = 0; i < 3; i++) {
      const av = a[i]!.reduce((p, aij, j) => p + aij * v[j]!, 0);
      expect(v[i]!).toBeGreaterThanOrEqual(0);
      expect(Math.abs(av - 0.7 * v[i]!)).toBeLessThan(1e-9);
    }
    noBadNumbers(an);
  });
  it('nilpotent (strictly triangular) A: ρ = 0, every mode collapses', () => {
    const an = analyzeTable(tableFromA([[0, 0.4, 0.2], [0, 0, 0.5], [0, 0, 0]]));
    expect(an.viability.perronRootBounds).toEqual([0, 0]);
    expect(an.viability.spectrum!.every((m) => m.kind === 'collapse')).toBe(true);
    // A³ = 0, so rounds 3, 4, … are exactly zero; the geometric certificate is rigorous but not exact here
    expect(an.viability.roundsToTolerance).toBeGreaterThanOrEqual(2);
    expect(an.viability.roundsToTolerance).toBeLessThanOrEqual(6);
    noBadNumbers(an);
  });
});

describe('Hawkins–Simon', () => {
  it('reports the first failing leading minor (I − A = [[0.5, −0.6], [−0.9, 0.4]]: minor₂ = 0.2 − 0.54 < 0)', () => {
    const hs = hawkinsSimon(flat([[0.5, 0.6], [0.9, 0.6]]), 2);
    expect(hs.holds).toBe(false);
    expect(hs.firstFailing!.order).toBe(2);
    expect(hs.firstFailing!.pivot).toBeCloseTo(0.4 - (0.6 * 0.9) / 0.5, 14);
    expect(10 ** hs.firstFailing!.log10AbsMinor!).toBeCloseTo(0.34, 12);
  });
  it('fails at order 1 when a sector uses more than its output of itself', () => {
    const hs = hawkinsSimon(flat([[1.2, 0], [0, 0.1]]), 2);
    expect(hs.firstFailing).toMatchObject({ order: 1, sector: 0 });
  });
});

describe('edge cases give defined results', () => {
  it('ρ = 1 exactly (columns sum to 1, a closed economy): not productive, singular, no NaN', () => {
    const an = analyzeTable(tableFromA([[0.5, 0.5], [0.5, 0.5]]));
    expect(an.viability.productive).toBe(false);
    expect(an.viability.perronRootBounds[0]).toBeLessThanOrEqual(1);
    expect(an.viability.perronRootBounds[1]).toBeGreaterThanOrEqual(1);
    expect(an.series.converges).toBe(false);
    expect(an.viability.roundsToTolerance).toBeNull();
    expect(an.multipliers.output.typeI).toEqual([null, null]);
    expect(an.multipliers.notes.some((n) => n.measure === 'output.typeI' && n.sectors === 'all')).toBe(true);
    expect(an.warnings.map((w) => w.code)).toContain('not-productive');
    expect(an.viability.spectrum!.map((m) => m.kind)).toEqual(['steady', 'collapse']);
    noBadNumbers(an);
  });
  it('ρ > 1: not productive by both tests, the series is reported as divergent', () => {
    const an = analyzeTable(tableFromA([[0.6, 0.7], [0.7, 0.6]], { labour: [0.1, 0.1], households: [0.1, 0.1] })); // ρ = 1.3
    expect(an.viability.hawkinsSimon).toBe(false);
    expect(an.viability.productive).toBe(false);
    expect(an.viability.verdictNote).toBeNull();
    expect(an.viability.perronRootBounds[0]).toBeGreaterThan(1.29);
    expect(an.series.converges).toBe(false);
    if (!an.series.converges) expect(an.series.reason).toMatch(/do not die out/);
    expect(an.viability.spectrum!.map((m) => m.kind)).toEqual(['growth', 'decay']);
    expect(an.multipliers.income.typeII).toEqual([null, null]);
    noBadNumbers(an);
  });
  it('within rounding of ρ = 1: the verdict says the tests were decided by noise', () => {
    const e = 1e-17; // below double resolution at 1: I − A is exactly singular or nearly
    const an = analyzeTable(tableFromA([[0.5, 0.5 - e], [0.5, 0.5]]));
    expect(an.viability.productive).toBe(false);
    noBadNumbers(an);
    const an2 = analyzeTable(tableFromA([[0.5, 0.5 - 1e-15], [0.5, 0.5]]));
    expect(an2.viability.verdictNote ?? '').toMatch(/rounding/);
    noBadNumbers(an2);
  });
  it('ill-conditioning is warned about (κ(I − A) ≈ 4/δ for A = [[.5, .5 − δ], [.5, .5]])', () => {
    const an = analyzeTable(tableFromA([[0.5, 0.5 - 1e-13], [0.5, 0.5]]));
    expect(an.checks.condition!).toBeGreaterThan(1e12);
    expect(an.warnings.map((w) => w.code)).toContain('ill-conditioned');
    const ok = analyzeTable(tableFromA([[0.5, 0.3], [0.2, 0.5]]));
    expect(ok.warnings.map((w) => w.code)).not.toContain('ill-conditioned');
    noBadNumbers(an);
  });
  it('a sector with no employment, no labour income: ratios are null with a reason', () => {
    const an = analyzeTable(tableFromA([[0.1, 0.2], [0.2, 0.1]], { labour: [0.3, 0], employment: [2, 0], households: [0.2, 0.1] }));
    expect(an.multipliers.income.typeI[1]).toBeNull();
    expect(an.multipliers.employment.typeII[1]).toBeNull();
    expect(an.multipliers.income.typeI[0]).not.toBeNull();
    const note = an.multipliers.notes.find((n) => n.measure === 'income.typeI')!;
    expect(note.sectors).toEqual([1]);
    expect(note.reason).toMatch(/zero/);
    noBadNumbers(an);
  });
  it('negative flows: flagged, defined', () => {
    const an = analyzeTable(tableFromA([[0.1, -0.05], [0.2, 0.1]]));
    expect(an.viability.negativeFlows).toBe(true);
    expect(an.warnings.map((w) => w.code)).toContain('negative-flows');
    expect(an.viability.productive).toBe(true);
    noBadNumbers(an);
  });
});

describe('mode classification', () => {
  it('terminates on subnormal entries (the QR iteration alone loops forever on this matrix)', () => {
    const a = [[0, 0.9999999999999983, 0, 2.4516481716241e-12], [0, 9e-323, 4.4e-323, 0], [0, 5.1206698511066505e-250, 0, 0], [0, 3.1384539661532265e-62, 0, 0]];
    const modes = spectrum(Float64Array.from(a.flat()), 4);
    expect(modes.map((m) => m.kind)).toEqual(['collapse', 'collapse', 'collapse', 'collapse']);
  });
  it.each([
    [0, 0, 'collapse'], [0.5, 0, 'decay'], [-0.5, 0, 'decay'], [-1, 0, 'two-period-oscillation'], [1, 0, 'steady'],
    [1.5, 0, 'growth'], [-1.5, 0, 'growth-sign-flips'], [0.3, 0.4, 'rotating-decay'], [0.6, 0.8, 'rotating-steady'], [1, 1, 'rotating-growth'],
  ] as const)('λ = %d + %di → %s', (re, im, kind) => {
    expect(classifyMode(re, im)).toBe(kind);
  });
});
