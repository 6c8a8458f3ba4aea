/**
 * RAS: biproportional scaling of a non-negative matrix A⁰ to given row totals u and column totals v,
 * A = diag(r) · A⁰ · diag(s) (Stone, Input–Output and National Accounts, OEEC 1961; Bacharach, Biproportional Matrices
 * and Input–Output Change, 1970; Miller & Blair, Input–Output Analysis, 2nd ed. 2009, §7.4). Each iteration scales
 * every row to its total, then every column to its total. Zeros stay zero (cells are only ever multiplied).
 * Before iterating, infeasible targets are refused: totals that disagree, a positive total on an all-zero row or column,
 * and any other zero pattern that cannot carry the totals (feasibility.ts). Not converging within the cap is refused
 * too (RasConvergenceError, carrying the convergence report), so no front end can use a half-balanced matrix.
 */
import { InputError } from '../diagnostics/index.ts';
import { rasFeasibility } from './feasibility.ts';

export interface RasOptions {
  /** Stop when every row and column total is met within this relative gap; default 1e-10. */
  tolerance?: number;
  /** Iteration cap; default 10 000. */
  maxIterations?: number;
  /** Labels for messages. */
  rowLabels?: string[];
  columnLabels?: string[];
  /** Shown in messages. */
  fileName?: string;
}

export interface RasResult {
  rows: number;
  columns: number;
  /** The balanced matrix, rows×columns row-major. */
  matrix: Float64Array;
  /** Row multipliers r and column multipliers s: matrix = diag(r)·A⁰·diag(s) (products over all iterations). */
  r: Float64Array;
  s: Float64Array;
  iterations: number;
  converged: boolean;
  /** Largest relative gap between a row (column) sum and its target at the end. */
  rowGap: number;
  columnGap: number;
  /** Largest relative gap (rows or columns) after each iteration. */
  history: number[];
  tolerance: number;
  maxIterations: number;
}

/** RAS stopped at its iteration cap with a gap above the tolerance: refused, with the report of how far it got. */
export class RasConvergenceError extends InputError {
  readonly report: RasResult;
  constructor(report: RasResult, file: string | undefined) {
    super(
      'ras-not-converged',
      `RAS did not converge within ${report.maxIterations} iterations (largest relative gap ${Number(Math.max(report.rowGap, report.columnGap).toPrecision(3))} > ${report.tolerance}); ` +
        'slow convergence means the totals force some cells toward zero: raise the iteration cap or loosen the tolerance, or check the totals',
      file !== undefined ? { file } : {},
    );
    this.report = report;
  }
}

export const RAS_DEFAULT_TOLERANCE = 1e-10;
export const RAS_DEFAULT_MAX_ITERATIONS = 10_000;
/** The largest iteration cap a caller may ask for (so every run ends in reasonable time). */
export const RAS_MAX_ITERATIONS = 1_000_000;

/** |sum − target| / target, or / grand total for a zero target. */
function relGap(sum: number, target: number, total: number): number {
  const d = Math.abs(sum - target);
  return d === 0 ? 0 : d / (target > 0 ? target : total);
}

function list(labels: string[] | undefined, idx: number[], prefix: string): string {
  const names = idx.slice(0, 6).map((k) => `'${labels?.[k] ?? `${prefix} ${k + 1}`}'`);
  return names.join(', ') + (idx.length > 6 ? ` and ${idx.length - 6} more` : '');
}

function checkInputs(a0: Float64Array, m: number, n: number, u: Float64Array, v: Float64Array, o: RasOptions, tol: number): void {
  const file = o.fileName;
  const rl = (i: number) => o.rowLabels?.[i] ?? `row ${i + 1}`;
  const cl = (j: number) => o.columnLabels?.[j] ?? `column ${j + 1}`;
  if (a0.length !== m * n || u.length !== m || v.length !== n) throw new InputError('ras-shape', `the matrix is ${m}×${n} but ${u.length} row totals and ${v.length} column totals were given`, { file });
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < n; j++) {
      const x = a0[i * n + j]!;
      if (!Number.isFinite(x) || x < 0) throw new InputError('ras-negative', `RAS needs a non-negative matrix; this cell is ${x}`, { file, rowLabel: rl(i), columnLabel: cl(j) });
    }
  }
  for (let i = 0; i < m; i++) if (!Number.isFinite(u[i]!) || u[i]! < 0) throw new InputError('ras-target', `row total ${u[i]} must be a non-negative number`, { file, rowLabel: rl(i) });
  for (let j = 0; j < n; j++) if (!Number.isFinite(v[j]!) || v[j]! < 0) throw new InputError('ras-target', `column total ${v[j]} must be a non-negative number`, { file, columnLabel: cl(j) });
  let su = 0;
  let sv = 0;
  for (const x of u) su += x;
  for (const x of v) sv += x;
  if (Math.abs(su - sv) > Math.max(tol, 1e-12) * Math.max(su, sv)) {
    throw new InputError('ras-totals-disagree', `the row totals sum to ${su} but the column totals sum to ${sv}; they must agree`, { file });
  }
  for (let i = 0; i < m; i++) {
    if (!(u[i]! > 0)) continue;
    let any = false;
    for (let j = 0; j < n && !any; j++) any = a0[i * n + j]! > 0;
    if (!any) throw new InputError('ras-zero-row', `row total ${u[i]} is positive but every cell of the row is zero; scaling cannot reach it`, { file, rowLabel: rl(i) });
  }
  for (let j = 0; j < n; j++) {
    if (!(v[j]! > 0)) continue;
    let any = false;
    for (let i = 0; i < m && !any; i++) any = a0[i * n + j]! > 0;
    if (!any) throw new InputError('ras-zero-column', `column total ${v[j]} is positive but every cell of the column is zero; scaling cannot reach it`, { file, columnLabel: cl(j) });
  }
  const gap = rasFeasibility(a0, m, n, u, v, Math.max(tol, 1e-9));
  if (gap) {
    throw new InputError(
      'ras-infeasible',
      `the zero pattern cannot carry these totals: ${gap.rows.length === 1 ? 'row' : 'rows'} ${list(o.rowLabels, gap.rows, 'row')} need ${gap.rowTotal} in total, ` +
        `but the only columns they have entries in (${gap.columns.length ? list(o.columnLabels, gap.columns, 'column') : 'none'}) take ${gap.columnTotal}`,
      { file, rowLabel: rl(gap.rows[0] ?? 0) },
    );
  }
}

export function ras(a0: Float64Array, m: number, n: number, u: Float64Array, v: Float64Array, opts: RasOptions = {}): RasResult {
  const tolerance = opts.tolerance ?? RAS_DEFAULT_TOLERANCE;
  const maxIterations = opts.maxIterations ?? RAS_DEFAULT_MAX_ITERATIONS;
  if (!(tolerance > 0) || !Number.isFinite(tolerance)) throw new InputError('ras-tolerance', `the tolerance must be a positive number (got ${tolerance})`, {});
  if (!Number.isInteger(maxIterations) || maxIterations < 1 || maxIterations > RAS_MAX_ITERATIONS) {
    throw new InputError('ras-iterations', `the iteration cap must be a whole number from 1 to ${RAS_MAX_ITERATIONS.toLocaleString('en-US')} (got ${maxIterations})`, {});
  }
  checkInputs(a0, m, n, u, v, opts, tolerance);

  let total = 0;
  for (const x of u) total += x;
  const a = Float64Array.from(a0);
  const r = new Float64Array(m).fill(1);
  const s = new Float64Array(n).fill(1);
  const rowSum = new Float64Array(m);
  const colSum = new Float64Array(n);
  const sums = () => {
    rowSum.fill(0);
    colSum.fill(0);
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < n; j++) {
        const x = a[i * n + j]!;
        rowSum[i] = rowSum[i]! + x;
        colSum[j] = colSum[j]! + x;
      }
    }
  };
  const gaps = (): [number, number] => {
    let gr = 0;
    let gc = 0;
    for (let i = 0; i < m; i++) gr = Math.max(gr, relGap(rowSum[i]!, u[i]!, total));
    for (let j = 0; j < n; j++) gc = Math.max(gc, relGap(colSum[j]!, v[j]!, total));
    return [gr, gc];
  };
  const history: number[] = [];
  sums();
  let [rowGap, columnGap] = gaps();
  let iterations = 0;
  while (Math.max(rowGap, columnGap) > tolerance && iterations < maxIterations) {
    iterations++;
    for (let i = 0; i < m; i++) {
      const f = rowSum[i]! > 0 ? u[i]! / rowSum[i]! : 0;
      r[i] = r[i]! * f;
      for (let j = 0; j < n; j++) a[i * n + j] = a[i * n + j]! * f;
    }
    sums();
    for (let j = 0; j < n; j++) {
      const f = colSum[j]! > 0 ? v[j]! / colSum[j]! : 0;
      s[j] = s[j]! * f;
      for (let i = 0; i < m; i++) a[i * n + j] = a[i * n + j]! * f;
    }
    sums();
    [rowGap, columnGap] = gaps();
    history.push(Math.max(rowGap, columnGap));
  }
  const report: RasResult = { rows: m, columns: n, matrix: a, r, s, iterations, converged: Math.max(rowGap, columnGap) <= tolerance, rowGap, columnGap, history, tolerance, maxIterations };
  if (!report.converged) throw new RasConvergenceError(report, opts.fileName);
  return report;
}
