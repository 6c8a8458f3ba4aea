/**
 * `roundwise balance MATRIX.csv --rows ROWS.csv --columns COLS.csv [--tolerance 1e-10] [--max-iterations 10000] [--json] [--out DIR]`
 * RAS: scales a non-negative labelled matrix to given row and column totals (src/regional/ras.ts).
 */
import { InputError } from '../../diagnostics/index.ts';
import { CAUTIONS, reportFiles, aboutText } from '../../report/index.ts';
import { importTable, writeTableCsv } from '../../table/index.ts';
import { balanceTable, parseLabelledMatrix, parseTotals, ras, RAS_DEFAULT_MAX_ITERATIONS, RAS_DEFAULT_TOLERANCE, type RasResult, type LabelledMatrix } from '../../regional/index.ts';
import type { CliIO } from '../io.ts';
import { num, numberOption, parseCommandArgs, readInput, readRoleMap, requireOne, requireOption, sha256, writeAll } from './regional-shared.ts';

export const USAGE = 'roundwise balance MATRIX.csv --rows ROWS.csv --columns COLS.csv [--table [--output OUTPUT.csv] [--map MAP.json]] [--tolerance 1e-10] [--max-iterations 10000] [--json] [--out DIR]';

const HELP = `${USAGE}

RAS balancing (Stone; Bacharach 1970): scales the rows and columns of a non-negative matrix until its row and column
sums meet the given totals. Zeros stay zero. Used to update flows to new totals or to balance an estimated county
block to known county totals.
  MATRIX.csv          first row: column labels (the corner cell may hold any text); then one row per label, numbers;
                      blank cells are zero
  --rows ROWS.csv     label,total for every row of the matrix (header optional)
  --columns COLS.csv  label,total for every column
  --tolerance T       stop when every total is met within this relative gap (default ${RAS_DEFAULT_TOLERANCE})
  --max-iterations K  iteration cap (default ${RAS_DEFAULT_MAX_ITERATIONS}); not converging by then is an error
  --table             MATRIX.csv is a whole input-output table (any layout roundwise analyze reads): its intermediate
                      flows are scaled to ROWS (intermediate sales) and COLS (intermediate purchases) by sector;
                      final demand and value added absorb the rest of total output in their original proportions
  --output OUTPUT.csv with --table: label,total new total output by sector (default: the table's own)
  --map MAP.json      with --table: role overrides for the table's rows and columns
  --json              print the result as one JSON object (matrix, r, s, iterations, converged, gaps)
  --out DIR           write balanced.csv (same layout as MATRIX.csv), or with --table balanced-table.csv (reads back
                      with roundwise analyze), and balanced.about.txt (convergence report)
Refused: totals whose sums disagree, a positive total on an all-zero row or column, or a zero pattern that cannot
carry the totals (the message names the rows and columns).
`;

function report(res: RasResult): string[] {
  return [
    `RAS ${res.converged ? 'converged' : 'did not converge'} after ${res.iterations} iteration${res.iterations === 1 ? '' : 's'} (tolerance ${res.tolerance}, cap ${res.maxIterations}).`,
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

export async function run(args: string[], io: CliIO): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    rows: { type: 'string' },
    columns: { type: 'string' },
    tolerance: { type: 'string' },
    'max-iterations': { type: 'string' },
    table: { type: 'boolean' },
    output: { type: 'string' },
    map: { type: 'string' },
    json: { type: 'boolean' },
    out: { type: 'string' },
    help: { type: 'boolean', short: 'h' },
  }, USAGE);
  if (values.help) {
    io.stdout(HELP);
    return 0;
  }
  const matrixPath = requireOne(positionals, 'matrix', USAGE);
  const rowsPath = requireOption(values.rows, 'rows', USAGE);
  const colsPath = requireOption(values.columns, 'columns', USAGE);
  const tolerance = numberOption(values.tolerance, 'tolerance');
  const maxIterations = numberOption(values['max-iterations'], 'max-iterations');

  if (!values.table && (values.output !== undefined || values.map !== undefined)) throw new InputError('usage', '--output and --map apply to --table only');
  const rasOpts = {
    fileName: matrixPath,
    ...(tolerance !== undefined ? { tolerance } : {}),
    ...(maxIterations !== undefined ? { maxIterations } : {}),
  };
  const text = readInput(matrixPath);
  let m: LabelledMatrix;
  let res: RasResult;
  let tableFile: { csv: string; notes: string[]; name: string; moneyUnit: string } | undefined;
  if (values.table) {
    const roles = readRoleMap(values.map);
    const t = importTable(text, { fileName: matrixPath, ...(roles ? { roles } : {}) });
    const sales = parseTotals(readInput(rowsPath), rowsPath, t.sectors, 'sector');
    const purchases = parseTotals(readInput(colsPath), colsPath, t.sectors, 'sector');
    const output = values.output !== undefined ? parseTotals(readInput(values.output), values.output, t.sectors, 'sector') : undefined;
    const b = balanceTable(t, { sales, purchases, ...(output ? { output } : {}) }, rasOpts);
    res = b.ras;
    m = { rowLabels: t.sectors, columnLabels: t.sectors, rows: t.n, columns: t.n, values: t.Z };
    tableFile = { csv: writeTableCsv(b.table), notes: [...b.notes, ...b.warnings.map((w) => w.message)], name: b.table.name, moneyUnit: b.table.moneyUnit };
  } else {
    m = parseLabelledMatrix(text, matrixPath);
    const u = parseTotals(readInput(rowsPath), rowsPath, m.rowLabels, 'row');
    const v = parseTotals(readInput(colsPath), colsPath, m.columnLabels, 'column');
    res = ras(m.values, m.rows, m.columns, u, v, { ...rasOpts, rowLabels: m.rowLabels, columnLabels: m.columnLabels });
  }
  if (!res.converged) {
    throw new InputError(
      'ras-not-converged',
      `RAS did not converge within ${res.maxIterations} iterations (largest relative gap ${num(Math.max(res.rowGap, res.columnGap), 3)} > ${res.tolerance}); ` +
        'nothing was written. Raise --max-iterations or loosen --tolerance; slow convergence means the totals force some cells toward zero',
      { file: matrixPath },
    );
  }
  let files: string[] | undefined;
  if (values.out) {
    const meta = {
      title: 'Matrix balanced by RAS',
      tableName: matrixPath,
      sourceFile: matrixPath,
      sourceHash: sha256(text),
      modelType: 'RAS biproportional balancing (Stone; Bacharach 1970)',
      date: new Date().toISOString(),
      moneyUnit: tableFile?.moneyUnit ?? 'as in the source matrix',
      notes: [...report(res), `Row totals from ${rowsPath}; column totals from ${colsPath}.`],
    };
    files = writeAll(values.out, tableFile
      ? [
          { name: 'balanced-table.csv', content: tableFile.csv },
          { name: 'balanced-table.about.txt', content: aboutText({ ...meta, title: 'Input-output table balanced by RAS', tableName: tableFile.name, notes: [...meta.notes, ...tableFile.notes] }) },
        ]
      : reportFiles('balanced', meta, [
          ['Row \\ column', ...m.columnLabels],
          ...m.rowLabels.map((l, i) => [l, ...Array.from(res.matrix.subarray(i * m.columns, (i + 1) * m.columns))]),
        ]));
  }
  if (values.json) io.stdout(`${JSON.stringify({ ...json(m, res), ...(files ? { files } : {}) })}\n`);
  else io.stdout([...report(res), ...(files ? [`Wrote ${files.join(', ')}`] : []), ''].join('\n'));
  return 0;
}
