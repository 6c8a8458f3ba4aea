/**
 * SHOCK.csv: header `sector,amount[,kind][,local_share][,note]` (any order, case-insensitive), one scenario line per row.
 * kind defaults to final-demand, local_share to 1. Read with the tables' dialect rules (src/table readSmallCsv:
 * comma, semicolon or tab, decimal comma, thousands separators, quotes, "sep=" line); refusals name the file line and
 * field. A value beyond the header's fields is refused ("A,1,000" is not the amount 1).
 */
import { InputError } from '../diagnostics/index.ts';
import { checkFieldCount, cleanLabel, numberCell, readSmallCsv } from '../table/index.ts';
import { LINE_KINDS, type LineKind, type Scenario, type ScenarioLine } from './types.ts';

const COLUMNS = ['sector', 'amount', 'kind', 'local_share', 'note'] as const;
type Column = (typeof COLUMNS)[number];

export function parseShockCsv(text: string, fileName: string, scenarioName?: string): Scenario {
  const csv = readSmallCsv(text, fileName);
  const rows = csv.rows;
  const mark = csv.dialect.decimalMark;
  if (rows.length === 0) throw new InputError('empty-scenario', 'the shock file is empty', { file: fileName });
  const head = rows[0]!;
  const header = head.cells.map((c) => c.toLowerCase());
  let width = header.length;
  while (width > 0 && header[width - 1] === '') width--;
  const pos = {} as Record<Column, number>;
  header.slice(0, width).forEach((h, k) => {
    if (h === '') return;
    if (!(COLUMNS as readonly string[]).includes(h)) {
      throw new InputError('bad-header', `unknown column '${head.cells[k]}'; expected sector, amount and optionally kind, local_share, note`, { file: fileName, line: head.line, column: k + 1 });
    }
    if (pos[h as Column] !== undefined) {
      throw new InputError('bad-header', `column '${h}' appears twice`, { file: fileName, line: head.line, column: k + 1 });
    }
    pos[h as Column] = k;
  });
  for (const required of ['sector', 'amount'] as const) {
    if (pos[required] === undefined) {
      throw new InputError('bad-header', `the header needs a '${required}' column (sector,amount[,kind][,local_share][,note])`, { file: fileName, line: head.line });
    }
  }
  const lines: ScenarioLine[] = [];
  for (const row of rows.slice(1)) {
    const line = row.line;
    const cell = (c: Column): string => (pos[c] !== undefined ? (row.cells[pos[c]] ?? '') : '');
    const sector = cleanLabel(cell('sector'));
    checkFieldCount(csv, row, width, `the header's ${width} fields`, sector || undefined);
    const unnamed = header.slice(0, width).findIndex((h, k) => h === '' && (row.cells[k] ?? '') !== '');
    if (unnamed >= 0) {
      throw new InputError('extra-field', `row has a value in field ${unnamed + 1} ('${row.cells[unnamed]}'), whose column has no header`, { file: fileName, line, column: unnamed + 1, ...(sector ? { rowLabel: sector } : {}) });
    }
    if (sector === '') throw new InputError('missing-sector', 'sector is empty', { file: fileName, line, column: pos.sector + 1 });
    const at = (c: Column) => ({ file: fileName, line, column: pos[c]! + 1, rowLabel: sector });
    const amount = numberCell(cell('amount'), mark, 'amount', 'bad-number', at('amount'));
    const kindText = cell('kind').toLowerCase();
    const kind = (kindText === '' ? 'final-demand' : kindText) as LineKind;
    if (!LINE_KINDS.includes(kind)) {
      throw new InputError('bad-kind', `kind '${cell('kind')}' is not one of ${LINE_KINDS.join(', ')}`, at('kind'));
    }
    const shareText = cell('local_share');
    const localShare = shareText === '' ? 1 : numberCell(shareText, mark, 'local share', 'bad-number', at('local_share'));
    if (localShare < 0 || localShare > 1) {
      throw new InputError('local-share-range', `local share ${shareText} is outside [0, 1]`, at('local_share'));
    }
    const note = cell('note');
    lines.push({ sector, amount, kind, localShare, ...(note ? { note } : {}), origin: { file: fileName, line } });
  }
  if (lines.length === 0) throw new InputError('empty-scenario', 'the shock file has a header but no lines', { file: fileName, line: head.line });
  return { name: scenarioName ?? fileName.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, ''), lines };
}
