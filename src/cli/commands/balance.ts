/**
 * `roundwise balance MATRIX.csv --rows ROWS.csv --columns COLS.csv`: RAS scales a non-negative labelled matrix (or,
 * with --table, a whole table's intermediate flows) to given row and column totals (src/regional/ras.ts).
 */
import { CAUTIONS, reportFiles, aboutText, type ReportFile, importTable, writeTableCsv, balanceTable, parseLabelledMatrix, parseTotals, ras, RAS_DEFAULT_MAX_ITERATIONS, RAS_DEFAULT_TOLERANCE, type RasResult, type LabelledMatrix } from '../../study/index.ts';
import { TABLE_DIALECT_OPTIONS, tableDialect } from './table-dialect.ts';
import { defineCommand } from '../command.ts';
import { num } from '../terminal.ts';

function report(res: RasResult): string[] {
  return [
    // ras() refuses (RasConvergenceError) rather than return an unconverged matrix, so a report is always of convergence.
    `RAS converged after ${res.iterations} iteration${res.iterations === 1 ? '' : 's'} (tolerance ${res.tolerance}, cap ${res.maxIterations}).`,
    `Largest relative gap: rows ${num(res.rowGap, 3)}, columns ${num(res.columnGap, 3)}.`,
    'Zeros of the start matrix are kept; the result is diag(r)·A·diag(s).',
  ];
}

function json(m: LabelledMatrix, res: RasResult) {
  return {
    rowLabels: m.rowLabels,
    columnLabels: m.columnLabels,
    matrix: Array.from({ length: m.rows }, (_, i) => Array.from(res.matrix.subarray(i * m.columns, (i + 1) * m.columns))),
    r: Array.from(res.r),
    s: Array.from(res.s),
    iterations: res.iterations,
    converged: res.converged,
    rowGap: res.rowGap,
    columnGap: res.columnGap,
    tolerance: res.tolerance,
    maxIterations: res.maxIterations,
    cautions: CAUTIONS,
  };
}

export const balance = defineCommand({
  name: 'balance',
  summary: 'RAS balancing (Stone; Bacharach 1970): scale a non-negative matrix, or a table\'s flows, to given row and column totals',
  positional: { name: 'MATRIX.csv', help: 'first row: column labels (the corner cell may hold any text); then one row per label, numbers; blank cells are zero' },
  options: {
    rows: { type: 'string', value: 'ROWS.csv', required: true, help: 'label,total for every row of the matrix (header optional); with --table, intermediate sales by sector' },
    columns: { type: 'string', value: 'COLS.csv', required: true, help: 'label,total for every column; with --table, intermediate purchases by sector' },
    tolerance: { type: 'number', value: 'T', help: `stop when every total is met within this relative gap (default ${RAS_DEFAULT_TOLERANCE})`, check: (t) => (t > 0 ? null : 'must be a positive number') },
    'max-iterations': { type: 'number', value: 'K', help: `iteration cap (default ${RAS_DEFAULT_MAX_ITERATIONS}); not converging by then is refused and nothing is written`, check: (k) => (Number.isInteger(k) && k >= 1 ? null : 'must be a positive whole number') },
    table: { type: 'boolean', help: 'MATRIX.csv is a whole input-output table (any layout roundwise analyze reads); final demand and value added absorb the rest of output' },
    output: { type: 'string', value: 'OUTPUT.csv', help: 'with --table: label,total new total output by sector (default: the table\'s own)' },
    map: { type: 'string', value: 'MAP.json', help: 'with --table: role overrides for the table\'s rows and columns' },
    ...TABLE_DIALECT_OPTIONS,
  },
  outHelp: 'write balanced.csv (same layout as MATRIX.csv), or with --table balanced-table.csv (reads back with roundwise analyze), each with an .about.txt (convergence report)',
  notes: [
    'Zeros stay zero. Refused: totals whose sums disagree, a positive total on an all-zero row or column, a zero pattern',
    'that cannot carry the totals (the message names the rows and columns), and not converging within the cap.',
    '--json prints matrix, r, s, iterations, converged and the largest gaps.',
  ],
  async run({ input, values }, ctx) {
    if (!values.table && (values.output !== undefined || values.map !== undefined)) throw ctx.usageError('--output and --map apply to --table only');
    if (!values.table && (values.delimiter !== undefined || values['decimal-mark'] !== undefined)) throw ctx.usageError('--delimiter and --decimal-mark apply to --table only');
    const rasOpts = {
      fileName: input,
      ...(values.tolerance !== undefined ? { tolerance: values.tolerance } : {}),
      ...(values['max-iterations'] !== undefined ? { maxIterations: values['max-iterations'] } : {}),
    };
    const file = ctx.input(input);
    let m: LabelledMatrix;
    let res: RasResult;
    let tableFile: { csv: string; notes: string[]; name: string; moneyUnit: string } | undefined;
    if (values.table) {
      const roles = ctx.roleMap(values.map);
      const t = importTable(file.text, { fileName: input, ...tableDialect(values), ...(roles ? { roles } : {}) });
      const sales = parseTotals(ctx.input(values.rows).text, values.rows, t.sectors, 'sector');
      const purchases = parseTotals(ctx.input(values.columns).text, values.columns, t.sectors, 'sector');
      const output = values.output !== undefined ? parseTotals(ctx.input(values.output).text, values.output, t.sectors, 'sector') : undefined;
      const b = balanceTable(t, { sales, purchases, ...(output ? { output } : {}) }, rasOpts);
      res = b.ras;
      m = { rowLabels: t.sectors, columnLabels: t.sectors, rows: t.n, columns: t.n, values: t.Z };
      tableFile = { csv: writeTableCsv(b.table), notes: [...b.notes, ...b.warnings.map((w) => w.message)], name: b.table.name, moneyUnit: b.table.moneyUnit };
    } else {
      m = parseLabelledMatrix(file.text, input);
      const u = parseTotals(ctx.input(values.rows).text, values.rows, m.rowLabels, 'row');
      const v = parseTotals(ctx.input(values.columns).text, values.columns, m.columnLabels, 'column');
      res = ras(m.values, m.rows, m.columns, u, v, { ...rasOpts, rowLabels: m.rowLabels, columnLabels: m.columnLabels });
    }
    const meta = {
      title: 'Matrix balanced by RAS',
      tableName: file.name,
      sourceFile: file.name,
      sourceHash: file.sha256,
      modelType: 'RAS biproportional balancing (Stone; Bacharach 1970)',
      date: ctx.date,
      moneyUnit: tableFile?.moneyUnit ?? 'as in the source matrix',
      notes: [...report(res), `Row totals from ${values.rows}; column totals from ${values.columns}.`],
    };
    const reports: ReportFile[] = tableFile
      ? [
          { name: 'balanced-table.csv', content: tableFile.csv },
          { name: 'balanced-table.about.txt', content: aboutText({ ...meta, title: 'Input-output table balanced by RAS', tableName: tableFile.name, notes: [...meta.notes, ...tableFile.notes] }) },
        ]
      : reportFiles('balanced', meta, [
          ['Row \\ column', ...m.columnLabels],
          ...m.rowLabels.map((l, i) => [l, ...Array.from(res.matrix.subarray(i * m.columns, (i + 1) * m.columns))]),
        ]);
    return {
      summary: () => [...report(res), ''].join('\n'),
      json: () => json(m, res),
      reports,
    };
  },
});
