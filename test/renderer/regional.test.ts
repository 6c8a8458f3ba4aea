/**
 * The adapter behind "Start from a larger table", run in Node: what the screen shows must be the engine's own
 * regionalization (src/regional called directly), the CSV it hands to "Use this table" must read back to the same
 * table, nothing shown may be NaN or Infinity, and bad inputs are refused with the engine's located message.
 */
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { api } from '../../renderer/worker/compute.ts';
import { buildRegional, type RegionalRequest } from '../../renderer/worker/regional.ts';
import { importTable } from '../../src/table/index.ts';
import { analyzeTable } from '../../src/model/index.ts';
import {
  aggregateTable, balanceTable, flqLambda, parseEmploymentCsv, parseGroupMapping, regionalize, EMPLOYMENT_SAMPLE_CSV,
  EMPLOYMENT_SAMPLE_FILE_NAME, GROUPS_SAMPLE_CSV, GROUPS_SAMPLE_FILE_NAME, NATIONAL_SAMPLE_CSV,
  NATIONAL_SAMPLE_FILE_NAME,
} from '../../src/regional/index.ts';
import { formatLocated, isInputError } from '../../src/diagnostics/index.ts';

const FIX = fileURLToPath(new URL('../fixtures/regional/', import.meta.url));
const fix = (f: string) => ({ text: readFileSync(join(FIX, f), 'utf8'), fileName: f });
const national = { text: NATIONAL_SAMPLE_CSV, fileName: NATIONAL_SAMPLE_FILE_NAME };
const employment = { text: EMPLOYMENT_SAMPLE_CSV, fileName: EMPLOYMENT_SAMPLE_FILE_NAME };

function engine(method: 'slq' | 'cilq' | 'flq', delta = 0.3) {
  const t = importTable(NATIONAL_SAMPLE_CSV, { fileName: NATIONAL_SAMPLE_FILE_NAME });
  return regionalize(t, parseEmploymentCsv(EMPLOYMENT_SAMPLE_CSV, EMPLOYMENT_SAMPLE_FILE_NAME), { method, delta });
}

function allFinite(v: unknown, path = '$'): string[] {
  if (typeof v === 'number') return Number.isFinite(v) ? [] : [path];
  if (v instanceof Float64Array) return Array.from(v).flatMap((x, i) => (Number.isFinite(x) ? [] : [`${path}[${i}]`]));
  if (Array.isArray(v)) return v.flatMap((x, i) => allFinite(x, `${path}[${i}]`));
  if (v && typeof v === 'object') return Object.entries(v).flatMap(([k, x]) => allFinite(x, `${path}.${k}`));
  return [];
}

/** The located message the worker would send for a refused request. */
function refusal(req: RegionalRequest): string {
  try {
    buildRegional(req);
  } catch (e) {
    if (isInputError(e)) return formatLocated(e);
    throw e;
  }
  throw new Error('expected a refusal');
}

describe('buildRegional (the Regional screen\'s view)', () => {
  it.each(['slq', 'cilq', 'flq'] as const)('%s: quotients, coefficients, absent sectors and leakage are the engine\'s', (method) => {
    const v = buildRegional({ national, employment, method, delta: 0.3 });
    const r = engine(method);
    expect(v.sectors).toEqual(r.sectors);
    expect(v.rows.map((x) => x.slq)).toEqual(Array.from(r.slq));
    expect(Array.from(v.regional)).toEqual(Array.from(r.coefficients));
    expect(Array.from(v.national)).toEqual(Array.from(r.nationalCoefficients));
    expect(v.rows.map((x) => x.leakage)).toEqual(Array.from(r.leakage));
    expect(v.rows.map((x) => x.leakageValue)).toEqual(Array.from(r.leakageValue));
    expect(v.absent).toEqual(r.absent);
    expect(v.lambda).toBe(r.lambda);
    expect(allFinite(v)).toEqual([]);
    // Local inputs plus leakage are the national recipe (Σ r_ij + Σ (a_ij − r_ij) = Σ a_ij).
    for (const x of v.rows) expect(x.localInputs + x.leakage).toBeCloseTo(x.nationalInputs, 12);
  });

  it('λ* is the published formula [log2(1 + E^R/E^N)]^δ (Flegg, Webber & Elliott 1995), computed independently', () => {
    const v = buildRegional({ national, employment, method: 'flq', delta: 0.3 });
    const jobs = EMPLOYMENT_SAMPLE_CSV.trim().split(/\r?\n/).slice(1).map((l) => l.split(',').map(Number));
    const er = jobs.reduce((s, c) => s + c[1]!, 0), en = jobs.reduce((s, c) => s + c[2]!, 0);
    expect(v.lambda!).toBeCloseTo(Math.pow(Math.log2(1 + er / en), 0.3), 12);
    expect(v.lambda).toBe(flqLambda(er, en, 0.3));
    expect(v.jobShare).toBeCloseTo(er / en, 14);
  });

  it('the CSV for "Use this table" reads back to the engine\'s regional table (same Perron root and multipliers)', () => {
    const v = buildRegional({ national, employment, method: 'flq', delta: 0.3 });
    const r = engine('flq');
    const back = importTable(v.result.csv, { fileName: v.result.fileName });
    expect(back.sectors).toEqual(r.table.sectors);
    const a = analyzeTable(back), b = analyzeTable(r.table);
    expect(Math.abs(a.viability.perronRoot - b.viability.perronRoot)).toBeLessThan(1e-12);
    expect(v.result.perron!).toBeCloseTo(b.viability.perronRoot, 9);
    for (let j = 0; j < r.sectors.length; j++) expect(a.multipliers.output.typeI[j]!).toBeCloseTo(b.multipliers.output.typeI[j]!, 9);
    // loaded through the worker API like any import
    const loaded = api.loadTable({ text: v.result.csv, fileName: v.result.fileName });
    expect(loaded.analysis.perron.value!).toBeCloseTo(b.viability.perronRoot, 12);
    expect(v.result.about).toMatch(/location quotients/);
    expect(v.result.about).toMatch(/Cautions/);
  });

  it('groups and RAS balancing follow the engine\'s aggregateTable and balanceTable', () => {
    const r = engine('cilq');
    const g = aggregateTable(r.table, parseGroupMapping(GROUPS_SAMPLE_CSV, GROUPS_SAMPLE_FILE_NAME));
    const vg = buildRegional({ national, employment, method: 'cilq', delta: 0.3, groups: { text: GROUPS_SAMPLE_CSV, fileName: GROUPS_SAMPLE_FILE_NAME } });
    expect(vg.result.n).toBe(g.table.n);
    expect(vg.groups!.names).toEqual(g.groups);
    expect(importTable(vg.result.csv, { fileName: 'g.csv' }).sectors).toEqual(g.table.sectors);

    // Consistent county totals: 90 % of the estimate's own intermediate sales and purchases.
    const n = r.sectors.length;
    const sales = new Float64Array(n), purchases = new Float64Array(n);
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) { sales[i]! += 0.9 * r.table.Z[i * n + j]!; purchases[j]! += 0.9 * r.table.Z[i * n + j]!; }
    const csv = (v: Float64Array) => ['sector,total', ...r.sectors.map((s, i) => `${s},${v[i]}`)].join('\n');
    const vb = buildRegional({ national, employment, method: 'cilq', delta: 0.3, balance: { rows: { text: csv(sales), fileName: 'sales.csv' }, columns: { text: csv(purchases), fileName: 'purchases.csv' } } });
    const b = balanceTable(r.table, { sales, purchases });
    expect(vb.balance!.converged).toBe(true);
    const back = importTable(vb.result.csv, { fileName: 'b.csv' });
    for (let k = 0; k < n * n; k++) expect(back.Z[k]!).toBeCloseTo(b.table.Z[k]!, 6);
  });

  it('refuses bad inputs with the engine\'s located message', () => {
    const three = fix('three-nation.csv');
    expect(refusal({ national: three, employment: fix('three-employment-bad-label.csv'), method: 'slq', delta: 0.3 })).toMatch(/three-employment-bad-label\.csv:\d+:1.*is not a sector/);
    expect(refusal({ national: three, employment: { text: 'sector,regional,national\nFarming,-3,100\nMaking,10,200\nServices,70,700\n', fileName: 'neg.csv' }, method: 'slq', delta: 0.3 })).toMatch(/neg\.csv:2:2.*negative/);
    expect(refusal({ national: three, employment: { text: 'sector,regional,national\nFarming,300,100\nMaking,10,200\nServices,70,700\n', fileName: 'above.csv' }, method: 'slq', delta: 0.3 })).toMatch(/above\.csv:2:2.*exceed national/);
    expect(refusal({ national: three, employment: { text: 'sector,regional,national\nFarming,0,100\nMaking,0,200\nServices,0,700\n', fileName: 'zero.csv' }, method: 'slq', delta: 0.3 })).toMatch(/zero\.csv.*zero in every sector/);
    expect(refusal({ national: three, employment: fix('three-employment.csv'), method: 'flq', delta: 1.5 })).toMatch(/between 0 and 1/);
  });
});
