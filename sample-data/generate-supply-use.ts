/**
 * Generates sample-data/national-supply.csv and national-use.csv: an INVENTED national supply and use pair (not real
 * data) behind the invented national table (national-table.csv), and the invented classification bridge with county
 * employment by code (fernhollow-bridge.csv, fernhollow-employment-by-code.csv). Deterministic:
 *
 *   npx tsx sample-data/generate-supply-use.ts
 *
 * Construction: the national table's sectors become 16 products and 16 industries of the same names. Industry j makes
 * most of product j and, as secondary production, a whole-number 8 % of the output of product (j + 3) mod 16 (which
 * industry (j + 3) mod 16 then makes less of), so every product's output is the national table's. The use table is
 * what the product technology assumption implies — U = A·Vᵀ with A the national table's coefficients — rounded to
 * whole numbers; rounding leftovers go to Exports (products) and Other value added (industries), so the pair balances
 * exactly. Value added, imports and jobs of each industry are those of its products' mix (w·q̂⁻¹·Vᵀ).
 * It also writes src/sut/sample.ts, the pair as string constants for the app (no file access needed).
 * test/src/sut/sample-data.test.ts checks the committed files are this output.
 */
import { importTable } from '../src/table/index.ts';
import { nationalTableCsv, SECTORS } from './generate-national-table.ts';

const SECONDARY_SHARE = 0.08;
const SHIFT = 3;

export function supplyUseCsv(): { supply: string; use: string } {
  const t = importTable(nationalTableCsv(), { fileName: 'national-table.csv' });
  const n = t.n;
  const x = Array.from(t.x);
  // V[j][p]: industry j's output of product p.
  const V = Array.from({ length: n }, (_, j) => Array.from({ length: n }, (_, p) => (j === p ? x[p]! : 0)));
  for (let j = 0; j < n; j++) {
    const p = (j + SHIFT) % n;
    const moved = Math.round(SECONDARY_SHARE * x[p]!);
    V[j]![p] = V[j]![p]! + moved;
    V[p]![p] = V[p]![p]! - moved;
  }
  const A = (i: number, k: number) => t.Z[i * n + k]! / x[k]!;
  const U = Array.from({ length: n }, (_, p) => Array.from({ length: n }, (_, j) => {
    let s = 0;
    for (let k = 0; k < n; k++) s += A(p, k) * V[j]![k]!;
    return Math.round(s);
  }));
  const households = Array.from(t.householdConsumption[0]!.values);
  const otherFd = Array.from(t.otherFinalDemand.find((c) => c.label === 'Other final demand')!.values);
  const exports = x.map((q, p) => q - U[p]!.reduce((a, b) => a + b, 0) - households[p]! - otherFd[p]!);
  const g = V.map((row) => row.reduce((a, b) => a + b, 0));
  const mix = (w: Float64Array, j: number) => Math.round(V[j]!.reduce((a, v, k) => a + (v * w[k]!) / x[k]!, 0));
  const comp = g.map((_, j) => mix(t.labourIncome[0]!.values, j));
  const imports = g.map((_, j) => mix(t.imports[0]!.values, j));
  const jobs = g.map((_, j) => mix(t.employment!, j));
  const otherVa = g.map((gj, j) => gj - U.reduce((a, row) => a + row[j]!, 0) - comp[j]! - imports[j]!);
  const supply = [
    ['million dollars', ...SECTORS].join(','),
    ...SECTORS.map((s, p) => [s, ...V.map((row) => row[p]!)].join(',')),
    ['Total', ...g].join(','),
  ].join('\n') + '\n';
  const use = [
    ['million dollars', ...SECTORS, 'Households', 'Exports', 'Other final demand'].join(','),
    ...SECTORS.map((s, p) => [s, ...U[p]!, households[p]!, exports[p]!, otherFd[p]!].join(',')),
    ['Compensation of employees', ...comp, '', '', ''].join(','),
    ['Other value added', ...otherVa, '', '', ''].join(','),
    ['Imports', ...imports, '', '', ''].join(','),
    ['Employment (jobs)', ...jobs, '', '', ''].join(','),
  ].join('\n') + '\n';
  return { supply, use };
}

/**
 * An invented classification (codes FH-01 … of no real scheme) for the sample county's employment records: most codes
 * name one sector; FH-12 splits between two sectors by shares; FH-90 and FH-91 both fall in one sector.
 */
export const BRIDGE_ROWS: [string, string, number | null][] = [
  ['FH-01', 'Farming', null], ['FH-02', 'Forestry and logging', null], ['FH-03', 'Mining and quarrying', null],
  ['FH-04', 'Utilities', null], ['FH-05', 'Construction', null], ['FH-06', 'Food processing', null],
  ['FH-07', 'Wood and paper products', null], ['FH-08', 'Metal and machinery', null],
  ['FH-09', 'Wholesale and retail trade', null], ['FH-10', 'Transport and warehousing', null],
  ['FH-11', 'Information and finance', null],
  ['FH-12', 'Real estate', 0.4], ['FH-12', 'Professional services', 0.6],
  ['FH-13', 'Health and social care', null], ['FH-14', 'Accommodation and food service', null],
  ['FH-90', 'Public administration and education', null], ['FH-91', 'Public administration and education', null],
];

/** County jobs by code: the county's jobs of sample-data/fernhollow-employment.csv, spread over the invented codes. */
export function employmentByCodeCsv(): string {
  const rows: [string, number][] = [
    ['FH-01', 3742], ['FH-02', 1015], ['FH-03', 457], ['FH-04', 383], ['FH-05', 3796], ['FH-06', 2189], ['FH-07', 1204],
    ['FH-08', 1427], ['FH-09', 7528], ['FH-10', 1976], ['FH-11', 1454], ['FH-12', 3500], ['FH-13', 5001], ['FH-14', 4352],
    ['FH-90', 4100], ['FH-91', 2557],
  ];
  return ['code,regional', ...rows.map(([c, v]) => `${c},${v}`)].join('\n') + '\n';
}

export function bridgeCsv(): string {
  return ['code,sector,share', ...BRIDGE_ROWS.map(([c, s, sh]) => `${c},${s},${sh ?? ''}`)].join('\n') + '\n';
}

/** src/sut/sample.ts: the sample pair for the app's "Start from supply and use tables" screen. */
export function sampleModuleText(): string {
  const { supply, use } = supplyUseCsv();
  return [
    '/**',
    ' * The bundled supply and use pair (invented; every number is made up for demonstration): the national supply and',
    ' * use tables behind sample-data/national-table.csv. Written by sample-data/generate-supply-use.ts; do not edit by hand.',
    ' */',
    `export const SUPPLY_SAMPLE_FILE_NAME = 'national-supply.csv';`,
    `export const USE_SAMPLE_FILE_NAME = 'national-use.csv';`,
    `export const SUT_SAMPLE_NOTE = 'The supply and use tables are invented; every number is made up for demonstration.';`,
    `export const SUPPLY_SAMPLE_CSV = ${JSON.stringify(supply)};`,
    `export const USE_SAMPLE_CSV = ${JSON.stringify(use)};`,
    '',
  ].join('\n');
}

/** src/classification/sample.ts: the sample bridge and county jobs by code for the app's "Larger table" screen. */
export function bridgeSampleModuleText(): string {
  return [
    '/**',
    ' * The bundled classification bridge and county jobs by its codes (invented; the codes FH-01 … belong to no real',
    ' * classification). Written by sample-data/generate-supply-use.ts; do not edit by hand.',
    ' */',
    `export const BRIDGE_SAMPLE_FILE_NAME = 'fernhollow-bridge.csv';`,
    `export const EMPLOYMENT_BY_CODE_SAMPLE_FILE_NAME = 'fernhollow-employment-by-code.csv';`,
    `export const BRIDGE_SAMPLE_CSV = ${JSON.stringify(bridgeCsv())};`,
    `export const EMPLOYMENT_BY_CODE_SAMPLE_CSV = ${JSON.stringify(employmentByCodeCsv())};`,
    '',
  ].join('\n');
}

if (import.meta.url === `file://${process.argv[1]}`) {
  const { writeFileSync } = await import('node:fs');
  const { supply, use } = supplyUseCsv();
  writeFileSync(new URL('./national-supply.csv', import.meta.url), supply);
  writeFileSync(new URL('./national-use.csv', import.meta.url), use);
  writeFileSync(new URL('./fernhollow-bridge.csv', import.meta.url), bridgeCsv());
  writeFileSync(new URL('./fernhollow-employment-by-code.csv', import.meta.url), employmentByCodeCsv());
  writeFileSync(new URL('../src/sut/sample.ts', import.meta.url), sampleModuleText());
  writeFileSync(new URL('../src/classification/sample.ts', import.meta.url), bridgeSampleModuleText());
}
