// Seeded random input–output tables for tests (invented numbers, never a reference value). Each returns the same
// table for the same arguments on every run.
import type { TableParts } from './io-table.ts';
import { seeded, type Random } from './random.ts';

/**
 * A seeded random economy of n sectors, balanced: column sums of A are below 1 with the rest split between
 * labour income, other value added and imports; households buy a share of household income.
 */
export function randomEconomyParts(n: number, seed: number, density = 0.6): TableParts {
  const r = seeded(seed);
  const x = Array.from({ length: n }, () => 50 + 950 * r());
  const Z: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const labour: number[] = [], otherVA: number[] = [], imports: number[] = [], employment: number[] = [];
  for (let j = 0; j < n; j++) {
    const w = Array.from({ length: n }, () => (r() < density ? r() : 0));
    const s = w.reduce((p, q) => p + q, 0) || 1;
    const inter = 0.2 + 0.5 * r(); // share of output bought from other local sectors
    for (let i = 0; i < n; i++) Z[i]![j] = (w[i]! / s) * inter * x[j]!;
    const rest = (1 - inter) * x[j]!;
    labour.push(rest * (0.3 + 0.3 * r()));
    imports.push(rest * 0.2 * r());
    otherVA.push(rest - labour[j]! - imports[j]!);
    employment.push(x[j]! * (0.002 + 0.01 * r()));
  }
  const income = labour.reduce((p, q) => p + q, 0);
  const hw = Array.from({ length: n }, () => r());
  const hs = hw.reduce((p, q) => p + q, 0);
  const households = hw.map((v) => (v / hs) * income * (0.3 + 0.4 * r()));
  return { Z, x, labour, otherVA, imports, employment, households };
}

/**
 * Random flows among n sectors S0…S{n−1}: about 20 % zero, the rest integers below 100; output of each sector is
 * max(row sum, column sum) · scale + base + an integer below 200, so there is room for value added and final demand.
 * Draws from `rnd` in a fixed order (Z row by row, then x).
 */
export function randomFlows(n: number, rnd: Random, { scale, base }: { scale: number; base: number }) {
  const sectors = Array.from({ length: n }, (_, i) => `S${i}`);
  const Z = sectors.map(() => sectors.map(() => (rnd() < 0.2 ? 0 : Math.floor(rnd() * 100))));
  const col = sectors.map((_, j) => Z.reduce((a, r) => a + r[j]!, 0));
  const row = Z.map((r) => r.reduce((a, v) => a + v, 0));
  const x = sectors.map((_, j) => Math.max(col[j]!, row[j]!) * scale + base + Math.floor(rnd() * 200));
  return { sectors, Z, col, row, x };
}

/**
 * An invented, balanced, productive CSV table of n sectors with about 1 % of flows non-zero: output at least 1.5 times
 * both what a sector sells and what it buys from other sectors, so value added and final demand stay positive.
 * `zero` is the text of a zero flow ('0', or e.g. '0.000000000000' for a file many times larger at the same size).
 */
export function sparseTableCsv(n: number, seed = 20261201, zero = '0'): string {
  // The C-standard constants evaluated in doubles (the product exceeds 2^53 and rounds): not seededC's sequence, but
  // the one the end-to-end tables were first made with, kept so that their files stay the same.
  let state = seed;
  const rnd = () => { state = (state * 1103515245 + 12345) % 2147483648; return state / 2147483648; };
  const s = Array.from({ length: n }, (_, i) => `Sector ${i + 1}`);
  const x = s.map(() => Math.round(1000 + rnd() * 9000));
  const Z = s.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) if (rnd() < 0.01) Z[i]![j] = Math.round(rnd() * 2 * x[j]!) / 100;
  const lines = [['thousand dollars', ...s, 'Households', 'Exports', 'Total output'].join(',')];
  const sold = Z.map((r) => r.reduce((a, b) => a + b, 0));
  const bought = s.map((_, j) => Z.reduce((a, r) => a + r[j]!, 0));
  const out = s.map((_, i) => Math.max(x[i]!, sold[i]! * 1.5, bought[i]! * 1.5));
  for (let i = 0; i < n; i++) {
    const hh = (out[i]! - sold[i]!) * 0.4;
    lines.push([s[i], ...Z[i]!.map((v) => (v === 0 ? zero : v)), hh, out[i]! - sold[i]! - hh, out[i]].join(','));
  }
  const lab = s.map((_, j) => (out[j]! - bought[j]!) * 0.55);
  lines.push(['Compensation of employees', ...lab, '', '', ''].join(','));
  lines.push(['Other value added', ...s.map((_, j) => out[j]! - bought[j]! - lab[j]!), '', '', ''].join(','));
  lines.push(['Employment', ...out.map((v) => Math.round(v / 100)), '', '', ''].join(','));
  return lines.join('\n');
}

/**
 * A large dense labelled-matrix CSV table (invented numbers) for the import: n sectors, three final-demand columns,
 * value-added, import, jobs and total rows; about 40 MB at n = 2000. Balanced, so the import adds no warnings.
 */
export function denseTableCsv(n: number, seed = 1): string {
  const rnd = seeded(seed);
  // Flows in cents, kept as integers so that totals are exact.
  const Z = new Float64Array(n * n);
  const colZ = new Float64Array(n);
  const rowZ = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = Math.floor(rnd() * 1_000_000);
      Z[i * n + j] = v;
      rowZ[i] = rowZ[i]! + v;
      colZ[j] = colZ[j]! + v;
    }
  }
  // Output: intermediate use is about half of output on both sides.
  const x = Float64Array.from({ length: n }, (_, j) => Math.max(rowZ[j]!, colZ[j]!) * 2 + Math.floor(rnd() * 100));
  const c = (v: number): string => (v / 100).toFixed(2);
  const header = ['thousand dollars'];
  for (let j = 0; j < n; j++) header.push(`Sector ${j + 1}`);
  header.push('Households', 'Exports', 'Other final demand', 'Total output');
  const lines = [header.join(',')];
  for (let i = 0; i < n; i++) {
    const fd = x[i]! - rowZ[i]!;
    const h = Math.floor(fd * 0.4);
    const e = Math.floor(fd * 0.4);
    const parts = [`Sector ${i + 1}`];
    for (let j = 0; j < n; j++) parts.push(c(Z[i * n + j]!));
    parts.push(c(h), c(e), c(fd - h - e), c(x[i]!));
    lines.push(parts.join(','));
  }
  const va = Array.from({ length: n }, (_, j) => x[j]! - colZ[j]!);
  const row = (label: string, f: (j: number) => string): string => [label, ...Array.from({ length: n }, (_, j) => f(j)), '', '', '', ''].join(',');
  lines.push(row('Compensation of employees', (j) => c(Math.floor(va[j]! * 0.5))));
  lines.push(row('Other value added', (j) => c(va[j]! - Math.floor(va[j]! * 0.5) - Math.floor(va[j]! * 0.1))));
  lines.push(row('Imports', (j) => c(Math.floor(va[j]! * 0.1))));
  lines.push(row('Employment (jobs)', (j) => String(Math.round(x[j]! / 1e6))));
  lines.push(row('Total input', (j) => c(x[j]!)));
  return lines.join('\r\n') + '\r\n';
}
