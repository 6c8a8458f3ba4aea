/**
 * SHOCK.csv: header `sector,amount[,kind][,local_share][,note]` (any order, case-insensitive), one scenario line per row.
 * kind defaults to final-demand, local_share to 1. Parsed with papaparse; refusals name the file line and column.
 */
import Papa from 'papaparse';
import { InputError } from '../diagnostics/index.ts';
import { recordStartLines, checkNotBinary } from '../table/index.ts';
import { LINE_KINDS, type LineKind, type Scenario, type ScenarioLine } from './types.ts';

const COLUMNS = ['sector', 'amount', 'kind', 'local_share', 'note'] as const;
type Column = (typeof COLUMNS)[number];

/** Plain decimal or scientific notation; no thousands separators (ambiguous across locales). */
const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

function parseNumber(text: string, file: string, line: number, column: number, what: string, sector?: string): number {
  const t = text.trim();
  if (!NUMBER.test(t)) {
    throw new InputError('bad-number', `${what} '${text}' is not a number (use a plain number such as 1250.5, no thousands separators)`, { file, line, column, ...(sector !== undefined ? { rowLabel: sector } : {}) });
  }
  return Number(t);
}

export function parseShockCsv(text: string, fileName: string, scenarioName?: string): Scenario {
  const body = text.replace(/^\uFEFF/, '');
  checkNotBinary(body, fileName);
  const parsed = Papa.parse<string[]>(body, { header: false, skipEmptyLines: false });
  const rows = parsed.data;
  // File line of each record: a quoted note may span lines, so record r does not always start on line r + 1.
  const starts = recordStartLines(body);
  const lineOf = (r: number): number => starts[r] ?? r + 1;
  const headerIdx = rows.findIndex((r) => r.some((c) => c.trim() !== ''));
  if (headerIdx < 0) throw new InputError('empty-scenario', 'the shock file is empty', { file: fileName });
  const header = rows[headerIdx]!.map((c) => c.trim().toLowerCase());
  const pos = {} as Record<Column, number>;
  header.forEach((h, k) => {
    if (h === '') return;
    if (!(COLUMNS as readonly string[]).includes(h)) {
      throw new InputError('bad-header', `unknown column '${rows[headerIdx]![k]}'; expected sector, amount and optionally kind, local_share, note`, { file: fileName, line: lineOf(headerIdx), column: k + 1 });
    }
    if (pos[h as Column] !== undefined) {
      throw new InputError('bad-header', `column '${h}' appears twice`, { file: fileName, line: lineOf(headerIdx), column: k + 1 });
    }
    pos[h as Column] = k;
  });
  for (const required of ['sector', 'amount'] as const) {
    if (pos[required] === undefined) {
      throw new InputError('bad-header', `the header needs a '${required}' column (sector,amount[,kind][,local_share][,note])`, { file: fileName, line: lineOf(headerIdx) });
    }
  }
  const lines: ScenarioLine[] = [];
  for (let r = headerIdx + 1; r < rows.length; r++) {
    const row = rows[r]!;
    if (row.every((c) => c.trim() === '')) continue;
    const line = lineOf(r);
    const cell = (c: Column): string => (pos[c] !== undefined ? (row[pos[c]] ?? '') : '');
    const sector = cell('sector').trim();
    if (sector === '') throw new InputError('missing-sector', 'sector is empty', { file: fileName, line, column: pos.sector + 1 });
    const amount = parseNumber(cell('amount'), fileName, line, pos.amount + 1, 'amount', sector);
    const kindText = cell('kind').trim().toLowerCase();
    const kind = (kindText === '' ? 'final-demand' : kindText) as LineKind;
    if (!LINE_KINDS.includes(kind)) {
      throw new InputError('bad-kind', `kind '${cell('kind')}' is not one of ${LINE_KINDS.join(', ')}`, { file: fileName, line, column: pos.kind! + 1, rowLabel: sector });
    }
    const shareText = cell('local_share').trim();
    const localShare = shareText === '' ? 1 : parseNumber(shareText, fileName, line, pos.local_share! + 1, 'local share', sector);
    if (localShare < 0 || localShare > 1) {
      throw new InputError('local-share-range', `local share ${shareText} is outside [0, 1]`, { file: fileName, line, column: pos.local_share! + 1, rowLabel: sector });
    }
    const note = cell('note').trim();
    lines.push({ sector, amount, kind, localShare, ...(note ? { note } : {}), origin: { file: fileName, line } });
  }
  if (lines.length === 0) throw new InputError('empty-scenario', 'the shock file has a header but no lines', { file: fileName, line: lineOf(headerIdx) });
  return { name: scenarioName ?? fileName.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, ''), lines };
}
