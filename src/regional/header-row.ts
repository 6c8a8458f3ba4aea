/** Whether the first row of a small regional input (employment, totals) is a header. */
import { readNumberCell, type DecimalMark, type SmallCsvRow } from '../table/index.ts';

/**
 * True when the first row looks like a header: none of the cells where numbers belong is a number. A data row with
 * one bad number among good ones is therefore kept as data, and refused at its own line.
 */
export function isHeaderRow(row: SmallCsvRow, numericColumns: number[], mark: DecimalMark): boolean {
  const cells = numericColumns.map((k) => row.cells[k] ?? '').filter((c) => c !== '');
  return cells.length > 0 && cells.every((c) => readNumberCell(c, mark) === null);
}
