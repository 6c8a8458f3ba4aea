// Aggregation: flows summed (checked against S·Z·Sᵀ with mathjs, a general-purpose library), coefficients recomputed,
// and two theorems: the aggregated model reproduces the aggregated base-year outputs exactly (a^G x^G + f^G = x^G
// because S·Z·1 = Z^G·1), and with identical input recipes inside every group the members' output multipliers equal the
// group's (push-through identity S(I − BS)⁻¹ = (I − SB)⁻¹S; Morimoto 1970's condition, recalled from memory).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { matrix, multiply, transpose } from 'mathjs';
import { aggregateTable, parseGroupMapping } from '../../../src/regional/index.ts';
import { coefficients, prepareModel, solveOpen, solveOpenTransposed } from '../../../src/model/index.ts';
import { buildTable, expectClose, rows, type TableSpec } from './build-table.ts';
import { refusal } from '../../support/refusal.ts';
import { seededC } from '../../support/random.ts';
import { randomFlows } from '../../support/random-tables.ts';

function randomSpec(n: number, seed: number): TableSpec {
  const { sectors, Z, col, row, x } = randomFlows(n, seededC(seed), { scale: 1.5, base: 20 });
  return {
    sectors, Z, x,
    labour: x.map((v, j) => (v - col[j]!) * 0.6), otherVA: x.map((v, j) => (v - col[j]!) * 0.3), imports: x.map((v, j) => (v - col[j]!) * 0.1),
    households: x.map((v, i) => (v - row[i]!) * 0.5), otherFD: x.map((v, i) => (v - row[i]!) * 0.5),
    employment: x.map((v) => v / 10),
  };
}

const MAP5 = 'sector,group\nS0,Primary\nS1,Making\nS2,Primary\nS3,Services\nS4,Making\n';

describe('aggregation', () => {
  const t = buildTable(randomSpec(5, 42));
  const res = aggregateTable(t, parseGroupMapping(MAP5, 'groups.csv'));
  // S: 3×5 with S_gi = 1 when sector i is in group g (groups in order of first mention)
  const S = [[1, 0, 1, 0, 0], [0, 1, 0, 0, 1], [0, 0, 0, 1, 0]];
  it('groups in order of first mention, members in table order', () => {
    expect(res.groups).toEqual(['Primary', 'Making', 'Services']);
    expect(res.members).toEqual([['S0', 'S2'], ['S1', 'S4'], ['S3']]);
  });
  it('Z^G = S·Z·Sᵀ and x^G = S·x (mathjs)', () => {
    const zg = multiply(multiply(matrix(S), matrix(rows(t.Z, 5))), transpose(matrix(S))).toArray() as number[][];
    expectClose(res.table.Z, zg.flat());
    expectClose(res.table.x, (multiply(matrix(S), Array.from(t.x)) as unknown as { toArray(): number[] }).toArray());
  });
  it('value-added rows, final-demand columns and employment are summed over members', () => {
    const sum = (v: Float64Array) => S.map((r) => r.reduce((a, sg, i) => a + sg * v[i]!, 0));
    expectClose(res.table.labourIncome[0]!.values, sum(t.labourIncome[0]!.values));
    expectClose(res.table.householdConsumption[0]!.values, sum(t.householdConsumption[0]!.values));
    expectClose(res.table.employment!, sum(t.employment!));
  });
  it('analysing the aggregated table equals analysing independently aggregated flows', () => {
    const zg = multiply(multiply(matrix(S), matrix(rows(t.Z, 5))), transpose(matrix(S))).toArray() as number[][];
    const xg = S.map((r) => r.reduce((a, sg, i) => a + sg * t.x[i]!, 0));
    const sum = (v: Float64Array) => S.map((r) => r.reduce((a, sg, i) => a + sg * v[i]!, 0));
    const independent = buildTable({
      sectors: ['Primary', 'Making', 'Services'], Z: zg, x: xg,
      labour: sum(t.labourIncome[0]!.values), otherVA: sum(t.otherValueAdded[0]!.values), imports: sum(t.imports[0]!.values),
      households: sum(t.householdConsumption[0]!.values), otherFD: sum(t.otherFinalDemand[0]!.values), employment: sum(t.employment!),
    });
    const a = coefficients(res.table);
    const b = coefficients(independent);
    expectClose(a.A, b.A);
    expectClose(a.h, b.h);
    expectClose(a.e!, b.e!);
    const ones = new Float64Array(3).fill(1);
    expectClose(solveOpenTransposed(prepareModel(res.table), ones), solveOpenTransposed(prepareModel(independent), ones), 1e-10);
  });
  it('the report carries an aggregation-bias note and the members\' multiplier spread', () => {
    expect(res.notes.join(' ')).toMatch(/Aggregation bias/);
    const making = res.bias.find((b) => b.group === 'Making')!;
    expect(making.memberMultipliers).toHaveLength(2);
    expect(making.groupMultiplier).toBeGreaterThan(1);
  });
});

describe('theorems, on random tables', () => {
  it('the aggregated model reproduces aggregated base-year output: (I − A^G)⁻¹ S f = S (I − A)⁻¹ f for base f', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 9 }), fc.integer({ min: 1, max: 2 ** 31 - 1 }), fc.integer({ min: 1, max: 4 }), (n, seed, k) => {
        const t = buildTable(randomSpec(n, seed));
        const groups = t.sectors.map((s, i) => `${s},G${(i * 7 + seed) % Math.min(k, n)}`).join('\n');
        const res = aggregateTable(t, parseGroupMapping(groups, 'g.csv'));
        const f = new Float64Array(n);
        for (let i = 0; i < n; i++) f[i] = t.householdConsumption[0]!.values[i]! + t.otherFinalDemand[0]!.values[i]!;
        const fg = new Float64Array(res.table.n);
        const xd = solveOpen(prepareModel(t), f);
        const sx = new Float64Array(res.table.n);
        for (let i = 0; i < n; i++) { fg[res.groupOf[i]!] = fg[res.groupOf[i]!]! + f[i]!; sx[res.groupOf[i]!] = sx[res.groupOf[i]!]! + xd[i]!; }
        expectClose(solveOpen(prepareModel(res.table), fg), sx, 1e-9);
      }),
      { numRuns: 100 },
    );
  });
  it('identical recipes within every group: member output multipliers equal the group multiplier (no aggregation bias)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 8 }), fc.integer({ min: 1, max: 2 ** 31 - 1 }), (n, seed) => {
        const rnd = seededC(seed);
        const k = 1 + (seed % n);
        const groupOf = Array.from({ length: n }, (_, i) => i % k);
        // one recipe per group: B is n×k with column sums below 1; A = B·S, so members of a group share their column
        const B = Array.from({ length: n }, () => Array.from({ length: k }, () => rnd() * (0.8 / n)));
        const x = Array.from({ length: n }, () => 50 + rnd() * 500);
        const Z = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => B[i]![groupOf[j]!]! * x[j]!));
        const col = x.map((_, j) => Z.reduce((a, r) => a + r[j]!, 0));
        const sectors = x.map((_, i) => `S${i}`);
        const t = buildTable({ sectors, Z, x, labour: x.map((v, j) => v - col[j]!) });
        const res = aggregateTable(t, parseGroupMapping(sectors.map((l, i) => `${l},G${groupOf[i]}`).join('\n'), 'g.csv'));
        for (const b of res.bias) for (const m of b.memberMultipliers!) expect(Math.abs(m - b.groupMultiplier!)).toBeLessThan(1e-10 * m);
      }),
      { numRuns: 100 },
    );
  });
});

describe('refusals, with locations', () => {
  const t = buildTable(randomSpec(3, 7));
  it('a mapped label not in the table', () => {
    const e = refusal(() => aggregateTable(t, parseGroupMapping('sector,group\nS0,A\nS9,B\nS1,A\nS2,B\n', 'g.csv')));
    expect(e.location).toMatchObject({ file: 'g.csv', line: 3, column: 1, rowLabel: 'S9' });
  });
  it('a table sector with no group', () => {
    const e = refusal(() => aggregateTable(t, parseGroupMapping('S0,A\nS1,A\n', 'g.csv')));
    expect(e.message).toMatch(/no group is given for sector 'S2'/);
  });
  it('a sector mapped twice, an empty group', () => {
    expect(refusal(() => parseGroupMapping('S0,A\nS0,B\n', 'g.csv')).location).toMatchObject({ line: 2, rowLabel: 'S0' });
    expect(refusal(() => parseGroupMapping('S0,A\nS1,\n', 'g.csv')).location).toMatchObject({ line: 2, column: 2 });
  });
  it('a group named like a non-sector row or column', () => {
    const e = refusal(() => aggregateTable(t, parseGroupMapping('S0,Households\nS1,A\nS2,A\n', 'g.csv')));
    expect(e.message).toMatch(/non-sector row or column/);
  });
});
