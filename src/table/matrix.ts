/**
 * The labelled-matrix layout (also the coefficients layout, which has the same shape): first record = column labels
 * after a corner cell, first field of every other record = row label.
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import type { Grid } from './grid.ts';
import { parseNumberText, showNumber, type DecimalMark } from './numbers.ts';
import { classify, type Classified, type ExtraColumn, type ExtraRow, type RawTable } from './structure.ts';
import { cleanLabel, matchKey, splitSectorMark } from './labels.ts';
import type { RoleMap } from './types.ts';

export interface ReadOptions {
  fileName: string;
  decimalMark: DecimalMark;
  roles?: Partial<RoleMap>;
  allowNegative: boolean;
  /** Told the labels and roles as soon as they are known, before any number is read (for the preview). */
  onStructure?: (c: Classified) => void;
}

/** A label as kept (labels.ts); a "(sector)" mark is removed and its match key added to `marked`. */
export function readLabel(raw: string, marked: Set<string>): string {
  const { label, marked: isMarked } = splitSectorMark(cleanLabel(raw));
  if (isMarked) marked.add(matchKey(label));
  return label;
}

/** Non-blank records, in order. */
export function contentRows(grid: Grid): number[] {
  const out: number[] = [];
  for (let r = 0; r < grid.rowCount; r++) if (!grid.blank(r)) out.push(r);
  return out;
}

/** Width of the header without trailing empty fields (a trailing delimiter is common in spreadsheet exports). */
export function headerWidth(grid: Grid, r: number): number {
  let w = grid.width(r);
  while (w > 1 && grid.cell(r, w - 1).trim() === '') w--;
  return w;
}

/** Refuse a record whose field count differs from the header's (extra fields are tolerated only when empty). */
export function checkWidth(grid: Grid, r: number, width: number, fileName: string, rowLabel?: string): void {
  const w = grid.width(r);
  if (w < width) {
    throw new InputError('ragged-row', `row has ${w} field${w === 1 ? '' : 's'}, the header has ${width}`, { file: fileName, line: grid.line(r), column: w, ...(rowLabel !== undefined ? { rowLabel } : {}) });
  }
  for (let c = width; c < w; c++) {
    if (grid.cell(r, c).trim() !== '') {
      throw new InputError('ragged-row', `row has a value in field ${c + 1}, beyond the header's ${width} fields`, { file: fileName, line: grid.line(r), column: c + 1, ...(rowLabel !== undefined ? { rowLabel } : {}) });
    }
  }
}

/** Read one cell as a number, refusing with its location; a blank cell is 0 unless `blankRefused`. */
export function readCell(grid: Grid, r: number, c: number, decimalCode: number, mark: DecimalMark, blankRefused: boolean, where: () => Location): number {
  const v = grid.plain(r, c, decimalCode);
  if (v === v) return v;
  const raw = grid.cell(r, c);
  const p = parseNumberText(raw, mark);
  if (p.problem === null) return p.value;
  const text = raw.trim();
  const shown = text.length > 24 ? `${text.slice(0, 24)}…` : text;
  switch (p.problem) {
    case 'blank':
      if (!blankRefused) return 0;
      throw new InputError('blank-flow', 'empty cell in the inter-industry block (write 0 for no flow)', where());
    case 'non-numeric':
      throw new InputError('non-numeric', `'${shown}' is not a number${mark === ',' ? ' (decimal comma expected)' : ''}`, where());
    case 'not-finite':
      throw new InputError('not-finite', `'${shown}' is not a finite number`, where());
    case 'overflow':
      throw new InputError('overflow', `'${shown}' is too large for a number (above ${showNumber(Number.MAX_VALUE)})`, where());
  }
}

export function negativeFlow(v: number, where: Location): InputError {
  return new InputError('negative-flow', `negative intermediate flow ${showNumber(v)} (allow negative flows to accept it)`, where);
}

/**
 * out[base + j] = values[cols[j]] for every j < cols.length; a value that is not a plain number (NaN), or negative
 * when `allowNegative` is false, comes from slow(row, j) instead. The hot loop of the import, in a function of its
 * own: small, so the engine optimises it within the first records (inside readMatrix it ran interpreted for most of a
 * 500-sector table while the large function waited to be compiled).
 */
function gatherRow(values: Float64Array, cols: Int32Array, out: Float64Array, base: number, allowNegative: boolean, row: number, slow: (row: number, j: number) => number): void {
  const n = cols.length;
  for (let j = 0; j < n; j++) {
    const v = values[cols[j]!]!;
    out[base + j] = v === v && (v >= 0 || allowNegative) ? v : slow(row, j);
  }
}

export function readMatrix(grid: Grid, rowsInFile: number[], opts: ReadOptions, layout: 'matrix' | 'coefficients'): RawTable {
  const { fileName, decimalMark: mark, allowNegative } = opts;
  const dc = mark.charCodeAt(0);
  const hr = rowsInFile[0]!;
  const W = headerWidth(grid, hr);
  const corner = cleanLabel(grid.cell(hr, 0));
  const marked = new Set<string>();
  const colLabels: string[] = [];
  const colFirst = new Map<string, number>();
  for (let c = 1; c < W; c++) {
    const label = readLabel(grid.cell(hr, c), marked);
    const loc = { file: fileName, line: grid.line(hr), column: c + 1 };
    if (label === '') throw new InputError('missing-label', 'column has no label', loc);
    const first = colFirst.get(matchKey(label));
    if (first !== undefined) throw new InputError('duplicate-label', `duplicate column label '${label}' (also in field ${first + 1})`, { ...loc, columnLabel: label });
    colFirst.set(matchKey(label), c);
    colLabels.push(label);
  }
  const dataRows = rowsInFile.slice(1);
  const rowLabels: string[] = [];
  const rowFirst = new Map<string, number>();
  for (const r of dataRows) {
    const label = readLabel(grid.cell(r, 0), marked);
    checkWidth(grid, r, W, fileName, label || undefined);
    const loc = { file: fileName, line: grid.line(r), column: 1 };
    if (label === '') throw new InputError('missing-label', 'row has numbers but no label', loc);
    const first = rowFirst.get(matchKey(label));
    if (first !== undefined) throw new InputError('duplicate-label', `duplicate row label '${label}' (also on line ${grid.line(first)})`, { ...loc, rowLabel: label });
    rowFirst.set(matchKey(label), r);
    rowLabels.push(label);
  }
  const cl = classify(
    rowLabels,
    (k) => ({ file: fileName, line: grid.line(dataRows[k]!), column: 1 }),
    colLabels,
    (k) => ({ file: fileName, line: grid.line(hr), column: k + 2 }),
    opts.roles,
    fileName,
    marked,
  );
  opts.onStructure?.(cl);
  const n = cl.sectors.length;
  if (n === 0) {
    throw new InputError('no-sectors', 'no row label matches a column label, so there is no inter-industry block (sector rows and columns need the same labels)', { file: fileName, line: grid.line(hr) });
  }
  // grid rows of sector i, grid columns of sector j
  const sectorRow = new Int32Array(n);
  const sectorCol = new Int32Array(n);
  cl.rowSector.forEach((s, k) => {
    if (s >= 0) sectorRow[s] = dataRows[k]!;
  });
  cl.colSector.forEach((s, k) => {
    if (s >= 0) sectorCol[s] = k + 1;
  });
  const extraRows: { r: number; row: ExtraRow }[] = [];
  cl.rows.forEach((lr, k) => {
    if (lr.role !== 'sector' && lr.role !== 'ignore') extraRows.push({ r: dataRows[k]!, row: { label: lr.label, role: lr.role, values: new Float64Array(n) } });
  });
  const extraCols: { c: number; col: ExtraColumn }[] = [];
  cl.columns.forEach((lc, k) => {
    if (lc.role !== 'sector' && lc.role !== 'ignore') extraCols.push({ c: k + 1, col: { label: lc.label, role: lc.role, values: new Float64Array(n) } });
  });

  const at = (r: number, c: number, rowLabel: string, columnLabel: string): Location => ({ file: fileName, line: grid.line(r), column: c + 1, rowLabel, columnLabel });
  const sectors = cl.sectors;
  const Z = new Float64Array(n * n);
  // Each record's numbers in one pass (grid.plainRow); a cell that is not a plain number, or a negative flow, goes
  // through the functions below. No closure in the loops captures a loop variable: V8 would then allocate a context
  // per cell (about 300 MB of short-lived garbage at 2,000 sectors) whether or not the closure is ever made.
  const values = new Float64Array(W);
  const flowCell = (i: number, j: number): number => {
    const r = sectorRow[i]!, c = sectorCol[j]!;
    const where = (): Location => at(r, c, sectors[i]!, sectors[j]!);
    let v = values[c]!;
    if (v !== v) v = readCell(grid, r, c, dc, mark, true, where);
    if (v < 0 && !allowNegative) throw negativeFlow(v, where());
    return v;
  };
  const columnCell = (i: number, k: number): number => {
    const r = sectorRow[i]!, { c, col } = extraCols[k]!;
    return readCell(grid, r, c, dc, mark, false, () => at(r, c, sectors[i]!, col.label));
  };
  const rowCell = (k: number, j: number): number => {
    const { r, row } = extraRows[k]!, c = sectorCol[j]!;
    return readCell(grid, r, c, dc, mark, false, () => at(r, c, row.label, sectors[j]!));
  };
  for (let i = 0; i < n; i++) {
    grid.plainRow(sectorRow[i]!, dc, values);
    gatherRow(values, sectorCol, Z, i * n, allowNegative, i, flowCell);
    for (let k = 0; k < extraCols.length; k++) {
      const v = values[extraCols[k]!.c]!;
      extraCols[k]!.col.values[i] = v === v ? v : columnCell(i, k);
    }
  }
  for (let k = 0; k < extraRows.length; k++) {
    grid.plainRow(extraRows[k]!.r, dc, values);
    gatherRow(values, sectorCol, extraRows[k]!.row.values, 0, true, k, rowCell);
  }
  // Labour income paid by final-demand columns (government wages): household income too (finish.ts).
  const finalDemandIncome: RawTable['finalDemandIncome'] = [];
  for (const { r, row } of extraRows) {
    if (row.role !== 'labourIncome') continue;
    for (const { c, col } of extraCols) {
      if (col.role !== 'householdConsumption' && col.role !== 'otherFinalDemand') continue;
      const where = () => at(r, c, row.label, col.label);
      const v = readCell(grid, r, c, dc, mark, false, where);
      if (v !== 0) finalDemandIncome.push({ row: row.label, column: col.label, value: v, at: where() });
    }
  }
  return {
    layout,
    fileName,
    corner,
    decimalMark: mark,
    sectors,
    Z,
    rows: extraRows.map((e) => e.row),
    columns: extraCols.map((e) => e.col),
    classified: cl,
    finalDemandIncome,
    flowAt: (i, j) => at(sectorRow[i]!, sectorCol[j]!, sectors[i]!, sectors[j]!),
    rowCellAt: (k, j) => at(extraRows[k]!.r, sectorCol[j]!, extraRows[k]!.row.label, sectors[j]!),
    columnCellAt: (k, i) => at(sectorRow[i]!, extraCols[k]!.c, sectors[i]!, extraCols[k]!.col.label),
  };
}
