/**
 * Generates sample-data/national-table.csv: an INVENTED national input–output table (not real data) with the
 * 16 sectors of the sample county, Fernhollow County, at national magnitudes. Seeded, so the file is reproducible:
 *
 *   npx tsx sample-data/generate-national-table.ts        (rewrites national-table.csv)
 *
 * Whole numbers of million dollars, so every row and column balances exactly: intermediate purchases + compensation
 * of employees + other value added + imports = total input = total output = intermediate sales + households + exports
 * + other final demand. Same layout as the sample county. test/src/regional/sample-data.test.ts checks that the committed
 * files are this output.
 */

export const SECTORS = [
  'Farming', 'Forestry and logging', 'Mining and quarrying', 'Utilities', 'Construction', 'Food processing',
  'Wood and paper products', 'Metal and machinery', 'Wholesale and retail trade', 'Transport and warehousing',
  'Information and finance', 'Real estate', 'Professional services', 'Health and social care',
  'Accommodation and food service', 'Public administration and education',
] as const;

/** Per sector: rough national output (million dollars), intermediate input share, output per job (million dollars), household share of final demand. */
const PROFILE: [number, number, number, number][] = [
  [180_000, 0.55, 0.12, 0.25], [40_000, 0.45, 0.15, 0.05], [150_000, 0.4, 0.6, 0.02], [250_000, 0.45, 0.7, 0.6],
  [900_000, 0.5, 0.12, 0.05], [450_000, 0.65, 0.25, 0.6], [200_000, 0.6, 0.25, 0.15], [700_000, 0.6, 0.3, 0.15],
  [1_500_000, 0.35, 0.09, 0.75], [600_000, 0.45, 0.12, 0.3], [1_800_000, 0.4, 0.35, 0.45], [1_600_000, 0.25, 0.8, 0.85],
  [1_400_000, 0.35, 0.15, 0.15], [1_300_000, 0.35, 0.08, 0.75], [600_000, 0.45, 0.05, 0.85], [1_700_000, 0.3, 0.1, 0.2],
];

/** Likely suppliers (row indices) of each buying sector: they get larger shares of its intermediate purchases. */
const SUPPLIERS: number[][] = [
  [0, 3, 5, 8, 9], [1, 7, 9], [3, 7, 9], [2, 3, 7], [2, 6, 7, 8], [0, 5, 8, 9], [1, 3, 6, 9], [2, 3, 7, 9],
  [8, 9, 10, 11], [3, 7, 8, 9], [10, 11, 12], [4, 10, 11], [10, 11, 12], [5, 8, 12, 13], [0, 5, 8, 11], [4, 10, 12, 13],
];

function lcg(seed: number): () => number {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

export function nationalTableCsv(seed = 20261201): string {
  const rnd = lcg(seed);
  const n = SECTORS.length;
  const x = PROFILE.map(([size]) => Math.round(size * (0.9 + 0.2 * rnd())));
  const Z = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    const weights = Array.from({ length: n }, (_, i) => (SUPPLIERS[j]!.includes(i) ? 4 + 4 * rnd() : rnd() < 0.35 ? 0 : rnd()));
    const sum = weights.reduce((a, b) => a + b, 0);
    const share = PROFILE[j]![1] * (0.9 + 0.2 * rnd());
    for (let i = 0; i < n; i++) Z[i]![j] = Math.round((x[j]! * share * weights[i]!) / sum);
  }
  // a small sector cannot sell more than most of its output to others: scale such rows down
  for (let i = 0; i < n; i++) {
    const sold = Z[i]!.reduce((a, b) => a + b, 0);
    if (sold > 0.8 * x[i]!) for (let j = 0; j < n; j++) Z[i]![j] = Math.floor((Z[i]![j]! * 0.8 * x[i]!) / sold);
  }
  const comp: number[] = [];
  const otherVA: number[] = [];
  const imports: number[] = [];
  for (let j = 0; j < n; j++) {
    let bought = 0;
    for (let i = 0; i < n; i++) bought += Z[i]![j]!;
    const rest = x[j]! - bought;
    imports[j] = Math.round(rest * (0.08 + 0.12 * rnd()));
    comp[j] = Math.round((rest - imports[j]!) * (0.5 + 0.25 * rnd()));
    otherVA[j] = rest - imports[j]! - comp[j]!;
  }
  const households: number[] = [];
  const exports: number[] = [];
  const otherFD: number[] = [];
  for (let i = 0; i < n; i++) {
    const rest = x[i]! - Z[i]!.reduce((a, b) => a + b, 0);
    households[i] = Math.round(rest * PROFILE[i]![3]);
    exports[i] = Math.round((rest - households[i]!) * (0.2 + 0.5 * rnd()));
    otherFD[i] = rest - households[i]! - exports[i]!;
  }
  const jobs = x.map((v, j) => Math.round(v / (PROFILE[j]![2] * (0.9 + 0.2 * rnd()))));

  const sum = (v: number[]) => v.reduce((a, b) => a + b, 0);
  const q = (s: string) => (/[",]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s);
  // the layout of the sample county (sample-data/fernhollow-county.csv): money unit in the corner, value-added rows,
  // jobs, then the totals row with final-demand sums and the grand total
  const lines: (string | number)[][] = [
    ['million dollars', ...SECTORS, 'Households', 'Exports', 'Other final demand', 'Total output'],
    ...SECTORS.map((s, i) => [s, ...Z[i]!, households[i]!, exports[i]!, otherFD[i]!, x[i]!]),
    ['Compensation of employees', ...comp, '', '', '', ''],
    ['Other value added', ...otherVA, '', '', '', ''],
    ['Imports', ...imports, '', '', '', ''],
    ['Employment (jobs)', ...jobs, '', '', '', ''],
    ['Total input', ...x, sum(households), sum(exports), sum(otherFD), sum(x)],
  ];
  return lines.map((r) => r.map((c) => (typeof c === 'number' ? String(c) : q(c))).join(',')).join('\r\n') + '\r\n';
}

/** Jobs by sector in Fernhollow County: the Employment (jobs) row of the invented sample county, fernhollow-county.csv. */
export const COUNTY_JOBS = [3742, 1015, 457, 383, 3796, 2189, 1204, 1427, 7528, 1976, 1454, 774, 2726, 5001, 4352, 6657];

/** sample-data/fernhollow-employment.csv: `sector,regional,national`, national jobs from the national table's Employment row. */
export function employmentCsv(seed = 20261201): string {
  const jobsRow = nationalTableCsv(seed).split('\r\n').find((l) => l.startsWith('Employment (jobs),'))!;
  const national = jobsRow.split(',').slice(1, 1 + SECTORS.length);
  const lines = SECTORS.map((s, i) => `${s},${COUNTY_JOBS[i]},${national[i]}`);
  return ['sector,regional,national', ...lines].join('\n') + '\n';
}

// Run directly: rewrite the committed files.
if (import.meta.url === `file://${process.argv[1]}`) {
  const { writeFileSync } = await import('node:fs');
  writeFileSync(new URL('./national-table.csv', import.meta.url), nationalTableCsv());
  writeFileSync(new URL('./fernhollow-employment.csv', import.meta.url), employmentCsv());
}
