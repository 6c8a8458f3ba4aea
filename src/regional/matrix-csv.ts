/**
 * Plain labelled matrices and label,total lists for RAS balancing: a matrix CSV has column labels in its first row
 * (the corner cell may hold any text) and a row label in the first cell of every other row; a totals CSV has one
 * `label,total` line per row or column (header optional). Blank matrix cells are zero.
 */
import { InputError } from '../diagnostics/index.ts';
import { checkFieldCount, cleanLabel, readNumberCell, readSmallCsv, type SmallCsv } from '../table/index.ts';
import { isHeaderRow } from './header-row.ts';

function rowsOf(text: string, fileName: string): SmallCsv {
  const csv = readSmallCsv(text, fileName);
  if (csv.rows.length === 0) throw new InputError('empty', 'the file is empty', { file: fileName });
  return csv;
}

export interface LabelledMatrix {
  rowLabels: string[];
  columnLabels: string[];
  rows: number;
  columns: number;
  /** rows×columns row-major. */
  values: Float64Array;
}

function checkUnique(labels: string[], what: string, loc: (k: number) => { file: string; line?: number; column?: number }): void {
  const seen = new Map<string, number>();
  labels.forEach((l, k) => {
    if (l === '') throw new InputError('label-empty', `a ${what} label is empty`, loc(k));
    if (seen.has(l)) throw new InputError('label-duplicate', `${what} label '${l}' appears twice`, loc(k));
    seen.set(l, k);
  });
}

export function parseLabelledMatrix(text: string, fileName: string): LabelledMatrix {
  const csv = rowsOf(text, fileName);
  const rows = csv.rows;
  const mark = csv.dialect.decimalMark;
  const head = rows[0]!;
  const columnLabels = head.cells.slice(1).map(cleanLabel);
  while (columnLabels.length && columnLabels[columnLabels.length - 1] === '') columnLabels.pop();
  const n = columnLabels.length;
  if (n === 0) throw new InputError('matrix-no-columns', 'the first row must hold the column labels', { file: fileName, line: head.line });
  checkUnique(columnLabels, 'column', (k) => ({ file: fileName, line: head.line, column: k + 2 }));
  const body = rows.slice(1);
  if (body.length === 0) throw new InputError('empty', 'the file has column labels but no rows', { file: fileName });
  const rowLabels = body.map((r) => cleanLabel(r.cells[0] ?? ''));
  checkUnique(rowLabels, 'row', (k) => ({ file: fileName, line: body[k]!.line, column: 1 }));
  const values = new Float64Array(body.length * n);
  body.forEach((r, i) => {
    checkFieldCount(csv, r, n + 1, `the ${n} column labels`, rowLabels[i]!);
    for (let j = 0; j < n; j++) {
      const c = r.cells[j + 1] ?? '';
      const loc = { file: fileName, line: r.line, column: j + 2, rowLabel: rowLabels[i]!, columnLabel: columnLabels[j]! };
      if (c === '') continue;
      const v = readNumberCell(c, mark);
      if (v === null) throw new InputError('matrix-not-numeric', `'${c}' is not a number${mark === ',' ? ' (decimal comma expected)' : ''}`, loc);
      if (v < 0) throw new InputError('matrix-negative', `cells must not be negative (${c}) for balancing`, loc);
      values[i * n + j] = v;
    }
  });
  return { rowLabels, columnLabels, rows: body.length, columns: n, values };
}

/** Totals in the order of `labels`; every label must appear exactly once. `what` is "row" or "column". */
export function parseTotals(text: string, fileName: string, labels: string[], what: string): Float64Array {
  const csv = rowsOf(text, fileName);
  const rows = csv.rows;
  const mark = csv.dialect.decimalMark;
  const body = isHeaderRow(rows[0]!, [1], mark) ? rows.slice(1) : rows;
  const index = new Map(labels.map((l, k) => [l, k]));
  const out = new Float64Array(labels.length);
  const line = new Array<number>(labels.length).fill(0);
  for (const r of body) {
    const label = cleanLabel(r.cells[0] ?? '');
    checkFieldCount(csv, r, 2, 'the 2 fields label,total', label || undefined);
    const k = index.get(label);
    if (k === undefined) throw new InputError('totals-unknown-label', `'${label}' is not a ${what} label of the matrix`, { file: fileName, line: r.line, column: 1, rowLabel: label });
    if (line[k]) throw new InputError('totals-duplicate', `'${label}' is listed twice (first on line ${line[k]})`, { file: fileName, line: r.line, column: 1, rowLabel: label });
    line[k] = r.line;
    const c = r.cells[1] ?? '';
    const v = readNumberCell(c, mark);
    const loc = { file: fileName, line: r.line, column: 2, rowLabel: label };
    if (v === null) throw new InputError('totals-not-numeric', `total '${c}' is not a number`, loc);
    if (v < 0) throw new InputError('totals-negative', `total ${c} must not be negative`, loc);
    out[k] = v;
  }
  const missing = labels.filter((_, k) => !line[k]);
  if (missing.length) throw new InputError('totals-missing', `no total is given for ${what} ${missing.map((l) => `'${l}'`).join(', ')}`, { file: fileName, rowLabel: missing[0]! });
  return out;
}
