/**
 * `roundwise analyze TABLE.csv`: a study of one table — coefficients, viability (the verdict in words), multipliers and
 * linkages; print a summary or one JSON object, and write the table's reports with their sidecars into --out DIR.
 */
import { deliverableFiles, XLSX_OPTION } from './deliverables.ts';
import {
  MEASURES, measureValues, prepareStudy, studyAnalysisJson, studyFromTableFile, tableReportSet, type PreparedStudy, type PrepareOptions, type Study, formatLocated, visibleText,
  bandReports, multiplierBandsJson, type ImportSettings,
} from '../../study/index.ts';
import { bandsOf, multiplierBandsSummary, uncertaintySettingsOf, UNCERTAINTY_OPTIONS } from './uncertainty-options.ts';
import { TABLE_DIALECT_OPTIONS, tableDialect } from './table-dialect.ts';
import { defineCommand, type RunContext } from '../command.ts';
import { bytesAtFactorHome, parallelKernelsReady, reserveParallelKernel, startParallelKernels, stopParallelKernels } from '../parallel.ts';
import { collectImportGarbage } from '../memory.ts';

/**
 * From this many sectors the Monte Carlo draws share their factorisations' updates with helper threads (one per extra
 * core); a single factorisation gains from them only from FACTOR_PARALLEL_MIN_SECTORS (at 500 sectors a 2-thread LU
 * saves about 1.5 ms, less than a helper's start-up: test/bench).
 */
const PARALLEL_MIN_SECTORS = 500;
const FACTOR_PARALLEL_MIN_SECTORS = 1000;

function fmt(x: number | null, digits = 4): string {
  return x === null ? '—' : x.toFixed(digits);
}

/** The measures the terminal summary shows, headed by the engine's own names (two lines: quantity, then form). */
const SUMMARY_MEASURES = ['output.typeI', 'output.typeII', 'income.typeI', 'income.typeII', 'employment.typeI', 'employment.typeII', 'linkage.backward', 'linkage.forward'] as const;

/** "labour income Type II" → ["labour income", "Type II"]; "backward linkage" → ["linkage", "backward"]. */
function twoLines(label: string): [string, string] {
  const m = /^(.*) (Type I+|simple|total)$/.exec(label);
  if (m) return [m[1]!, m[2]!];
  const [form = '', quantity = ''] = label.split(' ');
  return [quantity, form];
}

/** A short human summary: the verdict in words, then the multipliers table. */
export function summary(ps: PreparedStudy): string {
  const an = ps.analysis;
  const v = an.viability;
  const lines = [
    `${visibleText(an.tableName)}: ${an.n} sectors, money unit ${visibleText(an.moneyUnit) || '(not stated)'}`,
    ps.verdict.say,
    ...ps.verdict.detail.map((d) => `  ${d}`),
    `structure: ${v.irreducible ? `irreducible, ${v.primitive ? 'primitive' : `period ${v.period}`}` : `reducible, ${v.blocks.length} blocks`}; rounds until less than ${v.tolerance} of any demand is left: ${v.roundsToTolerance ?? 'not certified'}`,
    '',
  ];
  const measures = SUMMARY_MEASURES.map((k) => MEASURES.find((m) => m.key === k)!);
  const sectors = an.sectors.map((s) => visibleText(s));
  const width = Math.min(28, Math.max(6, ...sectors.map((s) => s.length)));
  const pad = (s: string, w: number) => (s.length > w ? s.slice(0, w - 1) + '…' : s.padEnd(w));
  const heads = measures.map((m) => twoLines(m.label));
  const colWidth = Math.max(10, ...heads.flat().map((h) => h.length));
  lines.push([pad('', width), ...heads.map((h) => h[0]!.padStart(colWidth))].join(' '));
  lines.push([pad('sector', width), ...heads.map((h) => h[1]!.padStart(colWidth))].join(' '));
  const cols = measures.map((m) => measureValues(an, m.key));
  for (let j = 0; j < an.n; j++) {
    lines.push([pad(sectors[j]!, width), ...cols.map((c) => fmt(c[j] ?? null).padStart(colWidth))].join(' '));
  }
  if (an.linkages.keySectors.length) lines.push('', `key sectors: ${an.linkages.keySectors.map((i) => sectors[i]).join(', ')}`);
  return lines.join('\n') + '\n';
}

/** A table file from this size usually holds FACTOR_PARALLEL_MIN_SECTORS sectors or more (a 1,000-sector matrix CSV is about 5 MB). */
const EARLY_HELPER_BYTES = 4 << 20;

/**
 * Start the helper threads as soon as a large table file has been read, before it is parsed: their start-up (a thread,
 * the kernel's instantiation) then overlaps the parsing on the other core, and `withHelperThreads` finds them ready.
 * The command's end stops them (main.ts) if nothing did before.
 */
export function startHelpersFor(tableBytes: number): void {
  if (tableBytes >= EARLY_HELPER_BYTES) startParallelKernels();
}

/**
 * Where to read a table file whose bytes the run does not keep (`into` of RunContext.input): a large one is read into
 * the memory its helpers will share (made now, the helpers started after the read), where its factors will be kept
 * (`bytesAtFactorHome`), so the factorisation reuses the pages the file's bytes touched instead of faulting in fresh
 * ones; the bytes are dead by then (the study drops them after the import). Anything else gets a buffer of its own.
 */
export function unkeptTableBuffer(bytes: number): Uint8Array | null {
  const pk = bytes >= EARLY_HELPER_BYTES ? reserveParallelKernel() : null;
  return pk === null ? null : bytesAtFactorHome(pk.kernel, bytes);
}

/**
 * `work` with helper threads for the factorisations' updates when the table is large (`sectors`); the numbers are
 * the same with or without them (each update's chunks are computed by the same kernel, whoever runs them).
 */
export async function withHelperThreads<T>(sectors: number, work: () => T, minSectors = PARALLEL_MIN_SECTORS): Promise<T> {
  const threaded = sectors >= minSectors && startParallelKernels() > 0;
  try {
    if (threaded) await parallelKernelsReady(2000);
    return work();
  } finally {
    if (threaded) await stopParallelKernels();
  }
}

/** The engine part of the command: the prepared study (helper threads for large tables). */
export async function prepare(study: Study, opts: PrepareOptions = {}): Promise<PreparedStudy> {
  return (await prepareAnd(study, opts, () => null)).ps;
}

/**
 * The prepared study and `use` of it while the helper threads of a large table are still there, so the solves of `use`
 * (a scenario's blocked path solve, say) share their updates with them too.
 */
export async function prepareAnd<T>(study: Study, opts: PrepareOptions, use: (ps: PreparedStudy) => T): Promise<{ ps: PreparedStudy; result: T }> {
  return withHelperThreads(study.table.n, () => {
    const ps = prepareStudy(study, opts);
    return { ps, result: use(ps) };
  }, FACTOR_PARALLEL_MIN_SECTORS);
}

/**
 * The study of the table file at `path`, without the file's bytes: `analyze` saves no project, so once the table is
 * imported nothing needs them, and the collection after the import (memory.ts) can free them with the decoded text
 * (the file's size twice off the peak). Read here, not in `run`, so no variable of `run` still holds them.
 */
function tableStudy(ctx: RunContext, path: string, settings: ImportSettings): Study {
  const file = ctx.input(path, { into: unkeptTableBuffer });
  startHelpersFor(file.bytes.length);
  return studyFromTableFile(file.bytes, file.name, settings, { keepBytes: false });
}

export const analyze = defineCommand({
  name: 'analyze',
  summary: 'coefficients, viability (Hawkins–Simon, Perron root with bounds), Type I and II multipliers and linkages of a table',
  positional: { name: 'TABLE.csv', help: 'the flow table (matrix or long layout; comma, semicolon or tab; decimal point or comma)' },
  options: {
    map: { type: 'string', value: 'MAP.json', help: 'role overrides for the table\'s rows and columns ({"rows": {label: role}, "columns": {label: role}})' },
    'allow-negative': { type: 'boolean', help: 'accept negative flows (e.g. subsidies or stock changes) instead of refusing them' },
    tolerance: { type: 'number', value: 'T', help: 'rounds to tolerance: count spending rounds until less than T of any demand is left (0 < T < 1; default 1e-6)', check: (t) => (t > 0 && t < 1 ? null : 'must be a number between 0 and 1') },
    ...XLSX_OPTION,
    ...TABLE_DIALECT_OPTIONS,
    ...UNCERTAINTY_OPTIONS,
  },
  outHelp: 'write multipliers, coefficients, Leontief inverse, viability, Perron vectors and spectrum (n ≤ 400) as CSV, each with an .about.txt; with --draws also multiplier-bands',
  notes: ['Warnings (e.g. an unproductive table) go to stderr; an unproductive table is analysed (exit 0), its multipliers left blank.'],
  async run({ input, values }, ctx) {
    const roles = ctx.roleMap(values.map);
    const study = tableStudy(ctx, input, { ...tableDialect(values), allowNegative: values['allow-negative'], ...(roles ? { roles } : {}) });
    collectImportGarbage(study.source?.bytes ?? 0);
    if (values.tolerance !== undefined) study.settings.rounds.tolerance = values.tolerance;
    const settings = uncertaintySettingsOf(values, ctx);
    // The draws perturb the flows; nothing else of this command reads them after the coefficients.
    const ps = await prepare(study, { inverse: values.out !== undefined || values.xlsx !== undefined, flowsDone: settings === null });
    for (const w of ps.analysis.warnings) ctx.warn(formatLocated(w));
    const bands = settings ? await bandsOf(ps, { settings, multipliers: true, scenarios: [] }) : null;
    return {
      summary: () => summary(ps) + (bands ? `${multiplierBandsSummary(bands).join('\n')}\n` : ''),
      json: () => ({ ...studyAnalysisJson(ps), ...(bands ? { uncertainty: multiplierBandsJson(bands) } : {}) }),
      ...(values.out !== undefined ? { reports: [...tableReportSet(ps, ctx.date, { inverse: true }), ...(bands ? bandReports(ps, bands, ctx.date) : [])] } : {}),
      files: await deliverableFiles(ps, null, values, ctx, { bands }),
    };
  },
});
