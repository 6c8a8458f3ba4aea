/**
 * The adapter behind "Start from supply and use tables", run in Node: what the screen shows must be src/sut's own
 * transformation (called directly here), the CSV it hands to "Use this table" must read back to the same table,
 * nothing shown may be NaN or Infinity, a table with negatives is marked unusable, and a bad pair is refused with the
 * engine's located message.
 */
import { describe, expect, it } from 'vitest';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../support/cli.ts';
import { api } from '../../renderer/worker/compute.ts';
import type { SupplyUseRequest } from '../../renderer/worker/supply-use.ts';
import { importTable } from '../../src/table/index.ts';
import { deriveSymmetric, readSupplyUse, SUPPLY_SAMPLE_CSV, SUPPLY_SAMPLE_FILE_NAME, USE_SAMPLE_CSV, USE_SAMPLE_FILE_NAME } from '../../src/sut/index.ts';
import { formatLocated, isInputError } from '../../src/diagnostics/index.ts';
import { BRIDGE_SAMPLE_CSV, BRIDGE_SAMPLE_FILE_NAME, EMPLOYMENT_BY_CODE_SAMPLE_CSV, EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME } from '../../src/classification/index.ts';
import { NATIONAL_SAMPLE_CSV, NATIONAL_SAMPLE_FILE_NAME } from '../../src/regional/index.ts';

const supply = { text: SUPPLY_SAMPLE_CSV, fileName: SUPPLY_SAMPLE_FILE_NAME };
const use = { text: USE_SAMPLE_CSV, fileName: USE_SAMPLE_FILE_NAME };
const pair = () => readSupplyUse(supply, use);
const req = (o: Partial<SupplyUseRequest>): SupplyUseRequest => ({ supply, use, by: 'industry', assumption: 'product-sales', negatives: 'keep', ...o });

function finiteDeep(x: unknown): boolean {
  if (typeof x === 'number') return Number.isFinite(x);
  if (Array.isArray(x)) return x.every(finiteDeep);
  if (x && typeof x === 'object') return Object.values(x).every(finiteDeep);
  return true;
}

describe('the supply and use screen\'s adapter', () => {
  it('shows the engine\'s fixed product sales structure table, and hands over a CSV that reads back to it', () => {
    const v = api.buildSymmetric(req({}));
    const d = deriveSymmetric(pair(), { assumption: 'product-sales' });
    expect(v.sectors).toEqual(d.table.sectors);
    expect(v.rows.map((r) => r.output)).toEqual(Array.from(d.table.x));
    v.rows.forEach((r, j) => {
      let inputs = 0;
      for (let i = 0; i < d.table.n; i++) inputs += d.table.Z[i * d.table.n + j]!;
      expect(r.inputs).toBe(inputs);
    });
    expect(v.result.hasNegatives).toBe(false);
    const back = importTable(v.result.csv, { fileName: v.result.fileName });
    expect(Array.from(back.Z)).toEqual(Array.from(d.table.Z));
    expect(finiteDeep(v)).toBe(true);
    expect(v.result.about).toMatch(/Eurostat model D/);
  });

  it('marks the product technology\'s table with negatives as unusable, and its zero-and-RAS version as usable', () => {
    const kept = api.buildSymmetric(req({ by: 'product', assumption: 'product' }));
    const d = deriveSymmetric(pair(), { assumption: 'product' });
    expect(kept.negatives.flows).toBe(d.negatives.flows);
    expect(kept.negatives.flows).toBeGreaterThan(0);
    expect(kept.result.hasNegatives).toBe(true);
    const fixed = api.buildSymmetric(req({ by: 'product', assumption: 'product', negatives: 'zero-ras' }));
    expect(fixed.result.hasNegatives).toBe(false);
    expect(fixed.rows.every((r) => r.negatives === 0)).toBe(true);
    expect(finiteDeep(fixed)).toBe(true);
  });

  it('refuses a pair whose products disagree with the engine\'s located message', () => {
    const bad = { text: USE_SAMPLE_CSV.replace(/^Farming,(\d+)/m, (_, x: string) => `Farming,${Number(x) + 50000}`), fileName: 'bad-use.csv' };
    let err: unknown;
    try { api.buildSymmetric(req({ use: bad })); } catch (e) { err = e; }
    expect(isInputError(err)).toBe(true);
    expect(formatLocated(err as never)).toMatch(/^bad-use\.csv \(row 'Farming'\): supply and use disagree/);
  });
});

describe('the county estimate\'s adapter with a classification bridge', () => {
  it('jobs by the sample codes through the sample bridge give the estimate of the same jobs by sector, added and split by hand', () => {
    const national = { text: NATIONAL_SAMPLE_CSV, fileName: NATIONAL_SAMPLE_FILE_NAME };
    const viaBridge = api.buildRegional({
      national, employment: { text: EMPLOYMENT_BY_CODE_SAMPLE_CSV, fileName: EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME }, bridge: { text: BRIDGE_SAMPLE_CSV, fileName: BRIDGE_SAMPLE_FILE_NAME }, method: 'flq', delta: 0.3,
    });
    // By hand from the two sample files: FH-12's 3500 jobs split 0.4 / 0.6; FH-90 (4100) and FH-91 (2557) both in
    // Public administration and education.
    const bySector = [
      'sector,regional', 'Farming,3742', 'Forestry and logging,1015', 'Mining and quarrying,457', 'Utilities,383', 'Construction,3796',
      'Food processing,2189', 'Wood and paper products,1204', 'Metal and machinery,1427', 'Wholesale and retail trade,7528',
      'Transport and warehousing,1976', 'Information and finance,1454', 'Real estate,1400', 'Professional services,2100',
      'Health and social care,5001', 'Accommodation and food service,4352', 'Public administration and education,6657',
    ].join('\n');
    const direct = api.buildRegional({ national, employment: { text: bySector, fileName: 'jobs.csv' }, method: 'flq', delta: 0.3 });
    expect(viaBridge.rows.map((r) => r.regionalJobs)).toEqual(direct.rows.map((r) => r.regionalJobs));
    expect(Array.from(viaBridge.regional)).toEqual(Array.from(direct.regional));
    expect(viaBridge.notes[0]).toMatch(/through the bridge fernhollow-bridge\.csv/);
  });

  it('shows every label\'s role, even while a label without one refuses the pair, and a role map makes the CLI\'s table', async () => {
    // The sample supply table with a column of zeros the use table lacks and whose words name no role.
    const lines = SUPPLY_SAMPLE_CSV.trimEnd().split('\n');
    const odd = { text: `${lines.map((l, k) => `${l},${k === 0 ? 'Statistical discrepancy' : '0'}`).join('\n')}\n`, fileName: 'supply-odd.csv' };
    expect(() => api.buildSymmetric(req({ supply: odd }))).toThrow(/supply column 'Statistical discrepancy' matches no column of the use table/);
    const before = api.sutRoles({ supply: odd, use });
    expect(before.supplyColumns.filter((c) => c.role !== 'industry').map((c) => [c.label, c.role])).toEqual([['Statistical discrepancy', null]]);
    expect(before.useRows.map((c) => c.role)).toEqual(pair().industryRows.map((r) => r.role));
    const map = api.readSutMap({ text: '{"supply": {"Statistical discrepancy": "ignore"}}', fileName: 'roles.json' });
    expect(api.sutRoles({ supply: odd, use, map }).supplyColumns.at(-1)).toMatchObject({ label: 'Statistical discrepancy', role: 'ignore', mapped: true });
    const v = api.buildSymmetric(req({ supply: odd, map }));
    // The column of zeros set aside: the same table as the sample pair's, and as `roundwise sut --map`.
    expect(v.rows).toEqual(api.buildSymmetric(req({})).rows);
    const dir = mkdtempSync(join(tmpdir(), 'rw-sut-map-'));
    try {
      writeFileSync(join(dir, 'supply.csv'), odd.text);
      writeFileSync(join(dir, 'use.csv'), use.text);
      writeFileSync(join(dir, 'roles.json'), JSON.stringify(map));
      const cli = await runCli(['sut', join(dir, 'supply.csv'), join(dir, 'use.csv'), '--map', join(dir, 'roles.json'), '--json']);
      expect(cli.code, cli.err).toBe(0);
      expect(JSON.parse(cli.out).output).toEqual(v.rows.map((r) => r.output));
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    // A role map that does not read is refused at its key.
    expect(() => api.readSutMap({ text: '{\n "supply": {"Statistical discrepancy": "exports"}\n}', fileName: 'roles.json' })).toThrow(/unknown supply-table role for 'Statistical discrepancy'/);
  });

  it('keeps the pair\'s files and their SHA-256 with the table it hands over: project file, reports, the source replayed', () => {
    const v = api.buildSymmetric(req({}));
    expect(v.sources.map((o) => o.role)).toEqual(['supply', 'use']);
    expect(v.result.about).toContain(`Supply table SHA-256: ${v.sources[0]!.sha256}`);
    const loaded = api.loadTable({ text: v.result.csv, fileName: v.result.fileName, name: v.result.name, derivedFrom: v.sources });
    expect(loaded.table.sectors.length).toBe(v.sectors.length);
    const choices = { closure: 'households' as const, destination: null };
    expect(JSON.parse(api.saveProject({ name: 'x', scenarios: [], choices, active: 0 })).source.derivedFrom).toEqual(v.sources);
    const about = api.report({ kind: 'multipliers', scenarios: [], choices }).find((f) => f.name.endsWith('.about.txt'))!.content;
    expect(about).toContain(`Use table file: ${USE_SAMPLE_FILE_NAME}\r\nUse table SHA-256: ${v.sources[1]!.sha256}`);
  });
});
