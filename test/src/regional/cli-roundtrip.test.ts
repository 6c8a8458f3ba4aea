// The regional table written by `roundwise regionalize --out` is read back by `roundwise analyze`, and its Type I
// output multipliers are the column sums of (I − R)⁻¹ of the regional coefficients R printed by `--json`
// (Miller & Blair 2009, §2.3 and §6.2), the inverse taken independently with mathjs.
import { describe, it, expect } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { inv, matrix, multiply, subtract, identity, transpose } from 'mathjs';
import { importTable } from '../../../src/table/index.ts';
import { runCli } from '../../support/cli.ts';

const SAMPLE = join(import.meta.dirname, '../../../sample-data');
const FIX = join(import.meta.dirname, '../../fixtures/regional');

const cli = (...argv: string[]) => runCli(argv);

async function roundTrip(national: string, employment: string, method: string) {
  const dir = mkdtempSync(join(tmpdir(), `rw-roundtrip-${method}-`));
  const reg = await cli('regionalize', national, '--employment', employment, '--method', method, '--out', dir, '--json');
  expect(reg.err).toBe('');
  const r = JSON.parse(reg.out);
  const ana = await cli('analyze', join(dir, 'regional-table.csv'), '--json');
  expect(ana.err).toBe('');
  expect(ana.code).toBe(0);
  return { r, a: JSON.parse(ana.out) };
}

function typeIFromMathjs(R: number[][]): number[] {
  const n = R.length;
  const L = (inv(subtract(identity(n), matrix(R))) as unknown as { toArray(): number[][] }).toArray();
  return Array.from({ length: n }, (_, j) => L.reduce((s, row) => s + row[j]!, 0));
}

describe('regionalize --out, then analyze', () => {
  for (const method of ['slq', 'cilq', 'flq']) {
    it(`sample national table, ${method}: analyze reads the regional table and its output multipliers match mathjs`, async () => {
      const { r, a } = await roundTrip(join(SAMPLE, 'national-table.csv'), join(SAMPLE, 'fernhollow-employment.csv'), method);
      expect(a.sectors).toEqual(r.sectors);
      expect(a.viability.productive).toBe(true);
      const ref = typeIFromMathjs(r.coefficients);
      a.multipliers.output.typeI.forEach((m: number, j: number) => expect(Math.abs(m - ref[j]!) / ref[j]!).toBeLessThan(1e-9));
    });
  }
  it('hand-checked three-sector case (regionalize.test.ts): the same multipliers through both commands', async () => {
    const { r, a } = await roundTrip(join(FIX, 'three-nation.csv'), join(FIX, 'three-employment.csv'), 'slq');
    const ref = typeIFromMathjs(r.coefficients);
    a.multipliers.output.typeI.forEach((m: number, j: number) => expect(Math.abs(m - ref[j]!) / ref[j]!).toBeLessThan(1e-9));
  });
});

describe('aggregate --out, then analyze', () => {
  it('the aggregated sample county analyses to the multipliers of S·Z·Sᵀ / S·x (mathjs)', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'rw-roundtrip-agg-'));
    const county = join(SAMPLE, 'fernhollow-county.csv');
    const agg = await cli('aggregate', county, '--groups', join(SAMPLE, 'fernhollow-groups.csv'), '--out', dir, '--json');
    expect(agg.err).toBe('');
    const j = JSON.parse(agg.out);
    const ana = JSON.parse((await cli('analyze', join(dir, 'aggregated-table.csv'), '--json')).out);
    expect(ana.sectors).toEqual(j.groups);
    const t = importTable(readFileSync(county, 'utf8'), { fileName: 'fernhollow-county.csv' });
    const members: string[][] = j.members;
    const S: number[][] = members.map((m) => t.sectors.map((s) => (m.includes(s) ? 1 : 0)));
    const Z = Array.from({ length: t.n }, (_, i) => Array.from(t.Z.subarray(i * t.n, (i + 1) * t.n)));
    const Zg = multiply(multiply(matrix(S), matrix(Z)), transpose(matrix(S))).toArray() as number[][];
    const xg = S.map((row) => row.reduce((a, sg, i) => a + sg * t.x[i]!, 0));
    const ref = typeIFromMathjs(Zg.map((row) => row.map((z, h) => z / xg[h]!)));
    ana.multipliers.output.typeI.forEach((m: number, g: number) => expect(Math.abs(m - ref[g]!) / ref[g]!).toBeLessThan(1e-9));
  });
});
