/**
 * The long layout: one record per cell, `from,to,value`. Sectors are the labels found both as `from` and as `to`;
 * other `from` labels are value-added, import, employment or total rows, other `to` labels final-demand or total
 * columns. A pair that does not occur is 0; a pair that occurs twice is refused.
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import type { Grid } from './grid.ts';
import { checkWidth, headerWidth, negativeFlow, readCell, readLabel, type ReadOptions } from './matrix.ts';
import { normaliseLabel } from './roles.ts';
import { classify, type ExtraColumn, type ExtraRow, type RawTable } from './structure.ts';
import { matchKey } from './labels.ts';

const FROM = ['from', 'row', 'seller'];
const TO = ['to', 'column', 'buyer'];
const VALUE = ['value', 'flow', 'amount'];

/** Field positions of from/to/value when the header names exactly these three, else null. */
export function longHeader(grid: Grid, r: number): { from: number; to: number; value: number } | null {
  if (headerWidth(grid, r) !== 3) return null;
  const keys = [0, 1, 2].map((c) => normaliseLabel(grid.cell(r, c)));
  const from = keys.findIndex((k) => FROM.includes(k));
  const to = keys.findIndex((k) => TO.includes(k));
  const value = keys.findIndex((k) => VALUE.includes(k));
  if (from < 0 || to < 0 || value < 0 || new Set([from, to, value]).size !== 3) return null;
  return { from, to, value };
}

export function readLong(grid: Grid, rowsInFile: number[], opts: ReadOptions): RawTable {
  const { fileName, decimalMark: mark, allowNegative } = opts;
  const dc = mark.charCodeAt(0);
  const hr = rowsInFile[0]!;
  const h = longHeader(grid, hr);
  if (!h) throw new InputError('bad-long-header', "the long layout needs a header naming the fields 'from', 'to' and 'value'", { file: fileName, line: grid.line(hr) });
  // The value header may carry the money unit: "value (thousand dollars)".
  const unit = /\(([^()]*)\)\s*$/.exec(grid.cell(hr, h.value));
  const fromLabels: string[] = [];
  const toLabels: string[] = [];
  const fromIdx = new Map<string, number>();
  const toIdx = new Map<string, number>();
  const fromLine: number[] = [];
  const toLine: number[] = [];
  const entries = new Map<string, number>(); // "fromIdx,toIdx" → grid row
  const marked = new Set<string>();
  for (const r of rowsInFile.slice(1)) {
    checkWidth(grid, r, 3, fileName);
    const f = readLabel(grid.cell(r, h.from), marked);
    const t = readLabel(grid.cell(r, h.to), marked);
    const line = grid.line(r);
    if (f === '') throw new InputError('missing-label', "record has no 'from' label", { file: fileName, line, column: h.from + 1 });
    if (t === '') throw new InputError('missing-label', "record has no 'to' label", { file: fileName, line, column: h.to + 1 });
    // Labels differing only in case or spacing are one label (the first spelling is kept).
    let fi = fromIdx.get(matchKey(f));
    if (fi === undefined) {
      fi = fromLabels.length;
      fromIdx.set(matchKey(f), fi);
      fromLabels.push(f);
      fromLine.push(line);
    }
    let ti = toIdx.get(matchKey(t));
    if (ti === undefined) {
      ti = toLabels.length;
      toIdx.set(matchKey(t), ti);
      toLabels.push(t);
      toLine.push(line);
    }
    const key = `${fi},${ti}`;
    const prev = entries.get(key);
    if (prev !== undefined) {
      throw new InputError('duplicate-entry', `the pair '${fromLabels[fi]}' → '${toLabels[ti]}' occurs twice (also on line ${grid.line(prev)})`, { file: fileName, line, column: h.value + 1, rowLabel: f, columnLabel: t });
    }
    entries.set(key, r);
  }
  const cl = classify(
    fromLabels,
    (k) => ({ file: fileName, line: fromLine[k]!, column: h.from + 1 }),
    toLabels,
    (k) => ({ file: fileName, line: toLine[k]!, column: h.to + 1 }),
    opts.roles,
    fileName,
    marked,
  );
  opts.onStructure?.(cl);
  const n = cl.sectors.length;
  if (n === 0) throw new InputError('no-sectors', "no 'from' label matches a 'to' label, so there is no inter-industry block", { file: fileName, line: grid.line(hr) });
  const sectors = cl.sectors;
  const rows: ExtraRow[] = [];
  const rowOfFrom = new Int32Array(fromLabels.length).fill(-1);
  cl.rows.forEach((lr, k) => {
    if (lr.role !== 'sector' && lr.role !== 'ignore') {
      rowOfFrom[k] = rows.length;
      rows.push({ label: lr.label, role: lr.role, values: new Float64Array(n) });
    }
  });
  const columns: ExtraColumn[] = [];
  const colOfTo = new Int32Array(toLabels.length).fill(-1);
  cl.columns.forEach((lc, k) => {
    if (lc.role !== 'sector' && lc.role !== 'ignore') {
      colOfTo[k] = columns.length;
      columns.push({ label: lc.label, role: lc.role, values: new Float64Array(n) });
    }
  });
  const Z = new Float64Array(n * n);
  const finalDemandIncome: RawTable['finalDemandIncome'] = [];
  for (const [key, r] of entries) {
    const comma = key.indexOf(',');
    const fi = Number(key.slice(0, comma));
    const ti = Number(key.slice(comma + 1));
    const si = cl.rowSector[fi]!;
    const sj = cl.colSector[ti]!;
    const where = (): Location => ({ file: fileName, line: grid.line(r), column: h.value + 1, rowLabel: fromLabels[fi]!, columnLabel: toLabels[ti]! });
    if (si >= 0 && sj >= 0) {
      const v = readCell(grid, r, h.value, dc, mark, false, where);
      if (v < 0 && !allowNegative) throw negativeFlow(v, where());
      Z[si * n + sj] = v;
    } else if (si >= 0 && colOfTo[ti]! >= 0) {
      columns[colOfTo[ti]!]!.values[si] = readCell(grid, r, h.value, dc, mark, false, where);
    } else if (sj >= 0 && rowOfFrom[fi]! >= 0) {
      rows[rowOfFrom[fi]!]!.values[sj] = readCell(grid, r, h.value, dc, mark, false, where);
    } else if (rowOfFrom[fi]! >= 0 && colOfTo[ti]! >= 0) {
      // Labour income paid by a final-demand column (government wages): household income too (finish.ts).
      const row = rows[rowOfFrom[fi]!]!;
      const col = columns[colOfTo[ti]!]!;
      if (row.role === 'labourIncome' && (col.role === 'householdConsumption' || col.role === 'otherFinalDemand')) {
        const v = readCell(grid, r, h.value, dc, mark, false, where);
        if (v !== 0) finalDemandIncome.push({ row: row.label, column: col.label, value: v, at: where() });
      }
    }
  }
  const entryAt = (f: string, t: string): Location => {
    const r = entries.get(`${fromIdx.get(matchKey(f))},${toIdx.get(matchKey(t))}`);
    return r === undefined ? { file: fileName, rowLabel: f, columnLabel: t } : { file: fileName, line: grid.line(r), column: h.value + 1, rowLabel: f, columnLabel: t };
  };
  return {
    layout: 'long',
    fileName,
    corner: unit ? unit[1]!.trim() : '',
    decimalMark: mark,
    sectors,
    Z,
    rows,
    columns,
    classified: cl,
    finalDemandIncome,
    flowAt: (i, j) => entryAt(sectors[i]!, sectors[j]!),
    rowCellAt: (k, j) => entryAt(rows[k]!.label, sectors[j]!),
    columnCellAt: (k, i) => entryAt(sectors[i]!, columns[k]!.label),
  };
}
