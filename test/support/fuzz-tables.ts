/**
 * Generators and checks shared by the hardening tests (and the table, scenario and renderer tests that fuzz input): random valid flow tables as a grid of cell texts, the ways
 * to write the same grid as CSV (delimiters, decimal comma, quotes, BOM, line ends), and the checks every refusal
 * must pass (an InputError with a location and a one-line message; no other exception).
 * The tables are invented test data, not references.
 */
import fc from 'fast-check';
import { expect } from 'vitest';
import { InputError, formatLocated } from '../../src/diagnostics/index.ts';
import type { IOTable } from '../../src/table/index.ts';

/** Invented sector names that no role suggestion recognises. */
export const SECTOR_POOL = [
  'Farming', 'Fishing', 'Forestry', 'Quarrying', 'Utilities', 'Construction', 'Food processing', 'Sawmills', 'Machinery',
  'Retail trade', 'Transport', 'Finance', 'Real estate', 'Legal services', 'Health care', 'Lodging', 'Schools', 'Repair',
];

/** A valid table as cell texts: grid[0] is the header, grid[1..n] the sector rows, then value-added rows and employment. */
export interface GridTable {
  grid: string[][];
  n: number;
  sectors: string[];
  /** Grid row and column of sector i's row and column. */
  sectorRow: (i: number) => number;
  sectorCol: (j: number) => number;
  /** Grid rows holding money values (sector rows and value-added rows) and the columns holding numbers. */
  moneyRows: number[];
  numberCols: number[];
  employmentRow: number;
}

const cents = fc.integer({ min: 0, max: 5_000_000_00 }).map((k) => k / 100);
const positiveCents = fc.integer({ min: 1_00, max: 5_000_000_00 }).map((k) => k / 100);

/** Random valid table with 2–7 sectors: flows, two final-demand columns, total output, three value-added rows, jobs. */
export const gridTable: fc.Arbitrary<GridTable> = fc
  .shuffledSubarray(SECTOR_POOL, { minLength: 2, maxLength: 7 })
  .chain((sectors) => {
    const n = sectors.length;
    return fc.record({
      sectors: fc.constant(sectors),
      Z: fc.array(cents, { minLength: n * n, maxLength: n * n }),
      fd: fc.array(positiveCents, { minLength: 2 * n, maxLength: 2 * n }),
      va: fc.array(positiveCents, { minLength: 3 * n, maxLength: 3 * n }),
      jobs: fc.array(fc.integer({ min: 0, max: 20_000 }), { minLength: n, maxLength: n }),
    });
  })
  .map(({ sectors, Z, fd, va, jobs }) => {
    const n = sectors.length;
    const grid: string[][] = [['thousand dollars', ...sectors, 'Households', 'Exports', 'Total output']];
    for (let i = 0; i < n; i++) {
      const row = Z.slice(i * n, i * n + n);
      const f = [fd[2 * i]!, fd[2 * i + 1]!];
      const total = [...row, ...f].reduce((a, b) => a + b, 0);
      grid.push([sectors[i]!, ...row.map(String), ...f.map(String), String(total)]);
    }
    const vaLabels = ['Labor income', 'Other value added', 'Imports'];
    vaLabels.forEach((label, k) => grid.push([label, ...va.slice(k * n, k * n + n).map(String), '', '', '']));
    grid.push(['Employment', ...jobs.map(String), '', '', '']);
    const moneyRows = Array.from({ length: n + 3 }, (_, k) => k + 1);
    return {
      grid,
      n,
      sectors,
      sectorRow: (i: number) => i + 1,
      sectorCol: (j: number) => j + 1,
      moneyRows,
      numberCols: Array.from({ length: n + 3 }, (_, k) => k + 1),
      employmentRow: n + 4,
    };
  });

export interface Encoding {
  delimiter: ',' | ';' | '\t';
  /** Decimal comma (only with ';'). */
  decimalComma: boolean;
  quoteAll: boolean;
  eol: '\r\n' | '\n' | '\r';
  bom: boolean;
  /** Blank lines added at the end. */
  trailingBlank: number;
}

export const CLEAN: Encoding = { delimiter: ',', decimalComma: false, quoteAll: false, eol: '\r\n', bom: false, trailingBlank: 0 };

export const encoding: fc.Arbitrary<Encoding> = fc
  .record({
    delimiter: fc.constantFrom(',' as const, ';' as const, '\t' as const),
    decimalComma: fc.boolean(),
    quoteAll: fc.boolean(),
    eol: fc.constantFrom('\r\n' as const, '\n' as const, '\r' as const),
    bom: fc.boolean(),
    trailingBlank: fc.integer({ min: 0, max: 2 }),
  })
  .map((e) => ({ ...e, decimalComma: e.delimiter === ';' && e.decimalComma }));

const NUMERIC = /^-?\d+(\.\d+)?([eE][+-]?\d+)?$/;

/** The grid as CSV text in the given encoding. */
export function toText(grid: readonly (readonly string[])[], e: Encoding = CLEAN): string {
  const lines = grid.map((row) =>
    row
      .map((cell) => {
        const v = e.decimalComma && NUMERIC.test(cell) ? cell.replace('.', ',') : cell;
        return e.quoteAll ? `"${v.replace(/"/g, '""')}"` : v;
      })
      .join(e.delimiter),
  );
  for (let k = 0; k < e.trailingBlank; k++) lines.push('');
  return (e.bom ? '\uFEFF' : '') + lines.join(e.eol) + e.eol;
}

/** The numbers of two imported tables are the same doubles. */
export function expectSameTable(a: IOTable, b: IOTable): void {
  expect(a.sectors).toEqual(b.sectors);
  expect(Array.from(a.Z)).toEqual(Array.from(b.Z));
  expect(Array.from(a.x)).toEqual(Array.from(b.x));
  for (const k of ['labourIncome', 'otherValueAdded', 'imports', 'householdConsumption', 'otherFinalDemand'] as const) {
    expect(a[k].map((v) => [v.label, Array.from(v.values)])).toEqual(b[k].map((v) => [v.label, Array.from(v.values)]));
  }
  expect(a.employment && Array.from(a.employment)).toEqual(b.employment && Array.from(b.employment));
}

/** Every number the table holds is finite. */
export function expectFiniteTable(t: IOTable): void {
  const all = [t.Z, t.x, ...(t.employment ? [t.employment] : []), ...[...t.labourIncome, ...t.otherValueAdded, ...t.imports, ...t.householdConsumption, ...t.otherFinalDemand].map((v) => v.values)];
  for (const v of all) for (const x of v) expect(Number.isFinite(x)).toBe(true);
}

/** Codes of refusals about one cell or record: these must name a line and column. */
const CELL_CODES = new Set(['non-numeric', 'not-finite', 'blank-flow', 'negative-flow', 'ragged-row', 'duplicate-label', 'missing-label', 'duplicate-entry', 'negative-employment']);

/**
 * Run `f`; it must either return or throw an InputError whose location names the file (and, for a refusal about
 * one cell or record, its line and column) and whose formatted message is one short line. Returns the refusal.
 */
export function refusalOf(f: () => unknown, fileName: string): InputError | null {
  try {
    f();
    return null;
  } catch (e) {
    if (!(e instanceof InputError)) throw new Error(`not an InputError escaped: ${e instanceof Error ? (e.stack ?? e.message) : String(e)}`);
    expectWellFormedRefusal(e, fileName);
    return e;
  }
}

export function expectWellFormedRefusal(e: InputError, fileName: string): void {
  expect(e.location.file, `${e.code}: ${e.message}`).toBe(fileName);
  if (CELL_CODES.has(e.code)) {
    expect(e.location.line, `${e.code} names a line`).toBeGreaterThanOrEqual(1);
    expect(e.location.column, `${e.code} names a column`).toBeGreaterThanOrEqual(1);
  }
  const text = formatLocated(e);
  expect(text).not.toMatch(/\r/);
  expect(text.split('\n').length, text).toBeLessThanOrEqual(3);
  expect(text.length).toBeLessThan(400);
  expect(text).not.toMatch(/\bat .*\(.*:\d+:\d+\)/);
  // The user's own text is quoted ('NaN' is not a finite number); outside quotes no NaN, undefined or [object …].
  expect(text.replace(/'[^']*'/g, "''")).not.toMatch(/NaN|undefined|\[object/);
}

/** Every number anywhere in a value (objects, arrays, typed arrays, Maps) that is NaN or ±Infinity, by path. */
export function nonFinite(v: unknown, path = '$', out: string[] = [], seen = new Set<unknown>()): string[] {
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) out.push(`${path} = ${v}`);
  } else if (ArrayBuffer.isView(v) && !(v instanceof DataView)) {
    Array.from(v as unknown as ArrayLike<number>).forEach((x, i) => nonFinite(x, `${path}[${i}]`, out, seen));
  } else if (v !== null && typeof v === 'object' && !seen.has(v)) {
    seen.add(v);
    if (Array.isArray(v)) v.forEach((x, i) => nonFinite(x, `${path}[${i}]`, out, seen));
    else if (v instanceof Map) for (const [k, x] of v) nonFinite(x, `${path}.get(${String(k)})`, out, seen);
    else for (const [k, x] of Object.entries(v)) nonFinite(x, `${path}.${k}`, out, seen);
  }
  return out;
}

/** NaN or Infinity written as text into CSV cells or JSON ("NaN", "Infinity", "-Infinity", "∞"). */
export function nonFiniteText(text: string): string[] {
  return [...text.matchAll(/(^|[,"\s:[])(-?Infinity|NaN|∞)(?=$|[,"\s\]}])/gm)].map((m) => m[2]!);
}

/** A refused CLI run: non-zero exit, nothing on stdout, a 1–3 line message on stderr naming the command, no stack trace. */
/** A refusal as the CLI prints it: exit 2 for refused input (1 for a usage mistake), one to three lines, no trace. */
export function expectCliRefusal(r: { code: number; out: string; err: string }, command: string, exitCode: 1 | 2 = 2): void {
  expect(r.code, r.err).toBe(exitCode);
  expect(r.out).toBe('');
  expect(r.err.startsWith(`roundwise ${command}: `), r.err).toBe(true);
  expect(r.err.endsWith('\n')).toBe(true);
  const lines = r.err.trimEnd().split('\n');
  expect(lines.length, r.err).toBeLessThanOrEqual(3);
  expect(r.err).not.toMatch(/^\s+at\s/m);
  expect(r.err).not.toMatch(/internal error|TypeError|RangeError|ReferenceError/);
}
