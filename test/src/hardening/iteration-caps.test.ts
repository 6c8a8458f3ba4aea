// Every engine loop whose length depends on the data or on a caller's option ends: options asking for unbounded work
// are held to a fixed cap, and the result says how far it got.
import { describe, expect, it } from 'vitest';
import { perronRoot, PERRON_MAX_STEPS, prepareModel, solveOpen } from '../../../src/model/index.ts';
import { ras, RAS_MAX_ITERATIONS } from '../../../src/regional/index.ts';
import { MAX_PATH_VISITS, MAX_SPENDING_ROUNDS, spendingRounds, structuralPaths } from '../../../src/scenario/index.ts';
import { importTable } from '../../../src/table/index.ts';
import { refusal } from '../../support/refusal.ts';
import { EDGE_TABLES } from './edge-tables.ts';

describe('iteration caps', () => {
  it('spending rounds stop at MAX_SPENDING_ROUNDS on a table whose rounds die out only after ~10^16 steps, however many are asked for', () => {
    const pm = prepareModel(importTable(EDGE_TABLES.nearUnitRoot, { fileName: 'near.csv' }));
    const f = Float64Array.of(100, 0);
    const r = spendingRounds(pm, f, solveOpen(pm, f), { maxRounds: Number.POSITIVE_INFINITY });
    expect(r.rounds.length).toBe(MAX_SPENDING_ROUNDS);
    expect(r.reach.at(-1)!.rounds).toBeNull();
  });

  it('the Perron iteration stops at PERRON_MAX_STEPS even when asked for unbounded steps, with bounds that still hold', () => {
    // Ā nearly periodic (a bipartite sector–household graph plus one subnormal loop): the power iteration stalls.
    // Here ρ = √(h·c) = √(4·0.25·0.01) = 0.1 (the eigenvalues of [[0, c], [hᵀ, 0]] are ±√(h·c), plus zeros).
    const m = 5;
    const a = new Float64Array(m * m);
    for (let i = 0; i < 4; i++) { a[i * m + 4] = 0.01; a[4 * m + i] = 0.25; }
    a[3 * m + 3] = 4.94e-324;
    const p = perronRoot(a, m, { maxIterations: Number.POSITIVE_INFINITY });
    expect(p.iterations).toBeLessThanOrEqual(PERRON_MAX_STEPS);
    expect(p.lower).toBeLessThanOrEqual(0.1 + 1e-15);
    expect(p.upper).toBeGreaterThanOrEqual(0.1 - 1e-15);
  });

  it('RAS refuses an iteration cap above RAS_MAX_ITERATIONS; structural paths hold maxVisits to MAX_PATH_VISITS', () => {
    const e = refusal(() => ras(Float64Array.of(1, 2, 3, 4), 2, 2, Float64Array.of(3, 7), Float64Array.of(4, 6), { maxIterations: RAS_MAX_ITERATIONS + 1 }));
    expect(e.code).toBe('ras-iterations');
    const pm = prepareModel(importTable(EDGE_TABLES.periodic, { fileName: 'periodic.csv' }));
    const pa = structuralPaths(pm, Float64Array.of(100, 0), 1, { maxVisits: Number.POSITIVE_INFINITY });
    expect(pa.settings.maxVisits).toBe(MAX_PATH_VISITS);
  });
});
