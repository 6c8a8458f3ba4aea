// RAS on a whole table (the RAS update of Miller & Blair 2009, §7.4): flows meet the new intermediate totals, the
// table still balances, the other rows and columns keep their proportions, and the CLI's file reads back.
import { describe, it, expect } from 'vitest';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { balanceTable } from '../../../src/regional/index.ts';
import { importTable } from '../../../src/table/index.ts';
import { InputError } from '../../../src/diagnostics/index.ts';
import { THREE, expectClose } from './build-table.ts';
import { runCli } from '../../support/cli.ts';

const f64 = (a: number[]) => Float64Array.from(a);
const FIX = join(import.meta.dirname, '../../fixtures/regional');

function sums(t: typeof THREE) {
  const n = t.n;
  const rows = Array.from({ length: n }, (_, i) => t.Z.subarray(i * n, (i + 1) * n).reduce((a, b) => a + b, 0));
  const cols = Array.from({ length: n }, (_, j) => Array.from({ length: n }, (_, i) => t.Z[i * n + j]!).reduce((a, b) => a + b, 0));
  return { rows, cols };
}

describe('balanceTable', () => {
  const sales = f64([66, 77, 100]);
  const purchases = f64([80, 63, 100]);
  const b = balanceTable(THREE, { sales, purchases });

  it('intermediate flows meet the sales and purchases; zeros and output are kept', () => {
    expect(b.ras.converged).toBe(true);
    const s = sums(b.table);
    expectClose(s.rows, sales, 1e-9);
    expectClose(s.cols, purchases, 1e-9);
    expectClose(b.table.x, THREE.x, 0);
  });

  it('every row and column still sums to total output; value added and final demand keep their proportions', () => {
    const t = b.table;
    for (let k = 0; k < t.n; k++) {
      const va = t.labourIncome[0]!.values[k]! + t.otherValueAdded[0]!.values[k]! + t.imports[0]!.values[k]!;
      const fd = t.householdConsumption[0]!.values[k]! + t.otherFinalDemand[0]!.values[k]!;
      expect(va + purchases[k]!).toBeCloseTo(t.x[k]!, 9);
      expect(fd + sales[k]!).toBeCloseTo(t.x[k]!, 9);
      const before = THREE.labourIncome[0]!.values[k]! / (THREE.labourIncome[0]!.values[k]! + THREE.otherValueAdded[0]!.values[k]! + THREE.imports[0]!.values[k]!);
      expect(t.labourIncome[0]!.values[k]! / va).toBeCloseTo(before, 12);
      const hhBefore = THREE.householdConsumption[0]!.values[k]! / (THREE.householdConsumption[0]!.values[k]! + THREE.otherFinalDemand[0]!.values[k]!);
      expect(t.householdConsumption[0]!.values[k]! / fd).toBeCloseTo(hhBefore, 12);
    }
  });

  it('new outputs: jobs keep their jobs-per-output coefficient', () => {
    const o = balanceTable(THREE, { sales, purchases, output: f64([220, 300, 380]) });
    expectClose(o.table.employment!, [110, 200, 665]); // 100·220/200, 200, 700·380/400 — by hand
  });

  it('refuses intermediate sales or purchases above total output, naming the sector', () => {
    const e = (() => { try { balanceTable(THREE, { sales: f64([66, 77, 401]), purchases: f64([80, 63, 401]) }); } catch (x) { return x; } })();
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).location.rowLabel).toBe('Services');
  });
});

describe('roundwise balance --table', () => {
  it('writes balanced-table.csv that the importer reads back balanced, with the new totals', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'rw-balance-table-'));
    const { code, out, err } = await runCli(['balance', join(FIX, 'three-nation.csv'), '--table', '--rows', join(FIX, 'three-sales.csv'), '--columns', join(FIX, 'three-purchases.csv'), '--output', join(FIX, 'three-output.csv'), '--out', dir]);
    expect(err).toBe('');
    expect(code).toBe(0);
    expect(out).toMatch(/converged/);
    const back = importTable(readFileSync(join(dir, 'balanced-table.csv'), 'utf8'), { fileName: 'balanced-table.csv' });
    expect(back.warnings).toEqual([]);
    expectClose(back.x, [220, 300, 380]);
    const s = sums(back);
    expectClose(s.rows, [66, 77, 100], 1e-9);
    expectClose(s.cols, [80, 63, 100], 1e-9);
    expect(readFileSync(join(dir, 'balanced-table.about.txt'), 'utf8')).toMatch(/Money unit: million dollars/);
  });
  it('--output without --table is a usage error', async () => {
    const { err } = await runCli(['balance', join(FIX, 'flows.csv'), '--rows', join(FIX, 'flow-rows.csv'), '--columns', join(FIX, 'flow-columns.csv'), '--output', join(FIX, 'three-output.csv')]);
    expect(err).toMatch(/apply to --table only/);
  });
});
