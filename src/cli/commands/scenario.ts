/**
 * `roundwise scenario TABLE.csv --shock SHOCK.csv [--map MAP.json] [--json] [--out DIR] [--paths SECTOR] [--project FILE.json]`
 * Demand-shock effects by sector (direct / indirect / induced / total), spending rounds, implied multipliers;
 * optionally structural paths to one sector, and the study saved as a project file.
 */
import { basename, join } from 'node:path';
import { z } from '../../schema/index.ts';
import { formatLocated, InputError } from '../../diagnostics/index.ts';
import { analyzePrepared, type Analysis, prepareModel } from '../../model/index.ts';
import {
  analysisNotes, multiplierRows, reportFiles, type ReportFile, CAUTIONS, modelTypeOf, scenarioReports,
  SCENARIO_CAUTIONS, type ScenarioReportContext,
} from '../../report/index.ts';
import { createProject, parseProject, serializeProject, sha256Hex, roleMapSchema } from '../../project/index.ts';
import {
  analyseScenario, parseShockCsv, VARIABLES, type EffectSplit, type PathAnalysis, type RoundsResult, type ScenarioResult,
} from '../../scenario/index.ts';
import { importTable, type RoleMap } from '../../table/index.ts';
import { readInputFile, writeFileAtomic, type CliIO } from '../io.ts';

interface Args {
  table: string;
  shock: string;
  map?: string;
  json: boolean;
  out?: string;
  paths?: string;
  project?: string;
}

const USAGE = 'usage: roundwise scenario TABLE.csv --shock SHOCK.csv [--map MAP.json] [--json] [--out DIR] [--paths SECTOR] [--project FILE.json]';

function usageError(message: string): InputError {
  return new InputError('usage', message, {}, USAGE);
}

export function parseArgs(argv: string[]): Args {
  const positional: string[] = [];
  const opts: Partial<Args> = { json: false };
  const valued = new Set(['--shock', '--map', '--out', '--paths', '--project']);
  for (let i = 0; i < argv.length; i++) {
    const a = argv[i]!;
    if (a === '--json') opts.json = true;
    else if (valued.has(a)) {
      const v = argv[++i];
      if (v === undefined || v.startsWith('--')) throw usageError(`${a} needs a value`);
      (opts as Record<string, string>)[a.slice(2)] = v;
    } else if (a.startsWith('--')) throw usageError(`unknown option '${a}'`);
    else positional.push(a);
  }
  if (positional.length !== 1) throw usageError(positional.length ? `one table expected, got ${positional.length}` : 'no table given');
  if (!opts.shock) throw usageError('--shock SHOCK.csv is required');
  return { ...opts, table: positional[0]!, shock: opts.shock } as Args;
}

const decoder = new TextDecoder('utf-8');

/** An output that cannot be written (a file where a folder should be, no permission, full disk) is a located refusal. */
function writeOrRefuse(path: string, content: string): void {
  writeFileAtomic(path, content);
}

function readRoleMap(path: string): Partial<RoleMap> {
  const text = decoder.decode(readInputFile(path));
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch {
    throw new InputError('bad-map', 'the role map is not valid JSON (expected {"rows": {label: role}, "columns": {label: role}})', { file: path });
  }
  const parsed = roleMapSchema.partial().safeParse(raw);
  if (!parsed.success) {
    const issue = parsed.error.issues[0]!;
    throw new InputError('bad-map', `role map ${issue.path.join('.') || '(top level)'}: ${issue.message}`, { file: path });
  }
  return parsed.data as z.infer<typeof roleMapSchema>;
}

/** The table's multipliers by sector (the analysis report of `roundwise analyze`), beside the scenario's reports. */
function tableMultiplierReport(an: Analysis, ctx: ScenarioReportContext): ReportFile[] {
  return reportFiles('multipliers', {
    title: 'Multipliers and linkages by sector (the table)',
    tableName: an.tableName,
    ...(ctx.sourceFile !== undefined ? { sourceFile: ctx.sourceFile } : {}),
    ...(ctx.sourceHash !== undefined ? { sourceHash: ctx.sourceHash } : {}),
    modelType: an.viability.closedProductive ? 'open (Type I) and household-closed (Type II) input-output model' : 'open (Type I) input-output model; Type II not available',
    date: ctx.date,
    moneyUnit: an.moneyUnit,
    notes: [
      'Multipliers after Miller & Blair, Input-Output Analysis, 2nd ed. 2009, ch. 6; linkages after Rasmussen 1956.',
      'Blank cells are values that cannot be defined (see the notes below).',
      ...analysisNotes(an),
      ...SCENARIO_CAUTIONS,
    ],
  }, multiplierRows(an));
}

/** An existing file at the project path is replaced only when it is itself a readable Roundwise project. */
function refuseToOverwriteForeign(path: string): void {
  let bytes: Uint8Array;
  try {
    bytes = readInputFile(path);
  } catch {
    return; // nothing there yet
  }
  try {
    parseProject(decoder.decode(bytes), path);
  } catch (e) {
    if (e instanceof InputError) {
      throw new InputError('project-not-overwritten', `will not overwrite it: ${e.message}; choose another --project path`, e.location);
    }
    throw e;
  }
}

const arr = (v: Float64Array | null) => (v ? Array.from(v) : null);
const splitJson = (s: EffectSplit | null) => (s ? { direct: arr(s.direct), indirect: arr(s.indirect), induced: arr(s.induced), total: arr(s.total) } : null);

export function scenarioJson(r: ScenarioResult, rounds: RoundsResult, tableName: string, paths: PathAnalysis | null): Record<string, unknown> {
  const effects: Record<string, unknown> = {};
  const totals: Record<string, unknown> = {};
  const multipliers: Record<string, unknown> = {};
  for (const v of VARIABLES) {
    effects[v] = splitJson(r.effects[v]);
    totals[v] = r.totals[v];
    multipliers[v] = r.multipliers[v];
  }
  return {
    scenario: r.scenario,
    table: tableName,
    moneyUnit: r.moneyUnit,
    model: modelTypeOf(r),
    closure: r.closure,
    sectors: r.sectors,
    effects,
    totals,
    multipliers,
    rounds: {
      output: rounds.roundTotals,
      income: rounds.roundIncome,
      coverage: rounds.coverage,
      ratio: rounds.ratio,
      reach: rounds.reach,
      normA: rounds.normA,
      remainder: rounds.remainder,
      remainderBound: rounds.remainderBound,
      perronRoot: rounds.perronRoot,
    },
    ...(paths ? {
      paths: {
        destination: paths.destinationLabel, model: paths.model, destinationTotal: paths.destinationTotal,
        explained: paths.explained, explainedShare: paths.explainedShare, found: paths.found, truncated: paths.truncated,
        paths: paths.paths.map((p) => ({ sectors: p.labels, direct: p.direct, pathMultiplier: p.pathMultiplier, total: p.total, global: p.global, shock: p.shock, contribution: p.contribution, share: p.share })),
      },
    } : {}),
    notes: r.notes,
    cautions: [...CAUTIONS, ...SCENARIO_CAUTIONS],
  };
}

const fmt = (v: number | null) => (v === null ? 'n/a' : Math.abs(v) >= 1000 ? v.toFixed(0) : v.toPrecision(4));

function summary(r: ScenarioResult, rounds: RoundsResult, written: string[]): string {
  const names = { output: 'output', valueAdded: 'value added', income: 'labour income', employment: 'employment' } as const;
  const lines = [`Scenario '${r.scenario}' — ${modelTypeOf(r)}; money in ${r.moneyUnit}, employment in jobs.`, ''];
  lines.push(['', 'direct', 'indirect', 'induced', 'total', 'Type I', 'Type II'].map((c, k) => (k === 0 ? c.padEnd(14) : c.padStart(12))).join(''));
  for (const v of VARIABLES) {
    const t = r.totals[v];
    const m = r.multipliers[v];
    if (!t || !m) continue;
    lines.push([names[v].padEnd(14), ...[t.direct, t.indirect, t.induced, t.total, m.typeI.value, m.typeII.value].map((x) => fmt(x).padStart(12))].join(''));
  }
  lines.push('', `Spending rounds to reach the open-model total: ${rounds.reach.map((x) => `${x.target * 100} % in ${x.rounds ?? `more than ${rounds.rounds.length}`}`).join(', ')}.`);
  for (const note of r.notes) lines.push(note);
  lines.push('', 'Cautions: estimates under fixed production recipes, unchanged prices and local shares; gross, not net of displacement; induced effects depend on the household closure. See the .about.txt files for the full list; for decisions, consult a qualified regional economist.');
  if (written.length) lines.push('', `Wrote ${written.join(', ')}`);
  return `${lines.join('\n')}\n`;
}

export async function run(argv: string[], io: CliIO): Promise<number> {
  if (argv.includes('--help') || argv.includes('-h')) {
    io.stdout(`${USAGE}\n\nSHOCK.csv: header sector,amount[,kind][,local_share][,note]; kind is final-demand (default), output or jobs; local_share 0-1 (default 1, final-demand lines only).\n--paths SECTOR adds the structural paths to that sector; --project FILE.json saves the study as a project file.\n`);
    return 0;
  }
  const args = parseArgs(argv);
  const tableBytes = readInputFile(args.table);
  const roles = args.map ? readRoleMap(args.map) : undefined;
  const table = importTable(decoder.decode(tableBytes), { fileName: args.table, ...(roles ? { roles } : {}) });
  const scenario = parseShockCsv(decoder.decode(readInputFile(args.shock)), args.shock);

  const pm = prepareModel(table);
  // The table's own analysis: its viability verdict goes into the notes, its multipliers into the reports.
  const an = analyzePrepared(pm, { spectrum: false });
  if (pm.openLU.singular) {
    throw new InputError('singular', 'I − A is singular (Perron root 1), so the table cannot carry a demand shock; check that every sector has value added or imports (roundwise analyze shows the details)', { file: args.table });
  }
  let pathsTo: number | null = null;
  if (args.paths !== undefined) {
    pathsTo = table.sectors.indexOf(args.paths);
    if (pathsTo < 0) throw new InputError('unknown-sector', `--paths: unknown sector '${args.paths}'`, { rowLabel: args.paths });
  }
  const analysis = analyseScenario(pm, scenario, { pathsTo, rounds: { perronRoot: an.viability.perronRoot } });
  const { result, rounds, paths } = analysis;
  if (!an.viability.productive) {
    const why = an.viability.verdictNote ?? `Perron root ${an.viability.perronRoot.toPrecision(6)} is not below 1`;
    result.notes.unshift(`NOT MEANINGFUL: the table does not describe a productive economy (${why}); the numbers below follow from the equations but cannot be read as effects. Check the table and its role map (roundwise analyze).`);
  }
  for (const w of table.warnings) result.notes.push(`Table warning: ${formatLocated(w)}`);

  const ctx: ScenarioReportContext = { tableName: table.name, sourceFile: basename(args.table), sourceHash: sha256Hex(tableBytes), date: new Date().toISOString() };
  const written: string[] = [];
  if (args.out !== undefined) {
    const files = [...scenarioReports(analysis, ctx), ...tableMultiplierReport(an, ctx)];
    for (const f of files) {
      const path = join(args.out, f.name);
      writeOrRefuse(path, f.content);
      written.push(path);
    }
  }
  if (args.project !== undefined) {
    const project = createProject(table, { source: { fileName: basename(args.table), sha256: ctx.sourceHash!, bytes: tableBytes.length }, scenarios: [scenario] });
    project.settings.activeScenario = scenario.name;
    if (args.paths !== undefined) project.settings.paths.destination = args.paths;
    refuseToOverwriteForeign(args.project);
    writeOrRefuse(args.project, serializeProject(project));
    written.push(args.project);
  }
  if (args.json) io.stdout(`${JSON.stringify(scenarioJson(result, rounds, table.name, paths), null, 2)}\n`);
  else io.stdout(summary(result, rounds, written));
  return 0;
}
