/**
 * `roundwise scenario TABLE.csv --shock SHOCK.csv [--map MAP.json] [--json] [--out DIR] [--paths SECTOR] [--project FILE.json]`
 * Demand-shock effects by sector (direct / indirect / induced / total), spending rounds, implied multipliers;
 * optionally structural paths to one sector, and the study saved as a project file.
 */
import { basename, join } from 'node:path';
import { z } from '../../schema/index.ts';
import { InputError } from '../../diagnostics/index.ts';
import { roleMapSchema } from '../../project/index.ts';
import { parseShockCsv } from '../../scenario/index.ts';
import type { RoleMap } from '../../table/index.ts';
import {
  CAUTIONS, modelTypeOf, prepareStudy, projectFileOf, reachText, runStudyScenario, scenarioJson, scenarioReportSet, studyFromProjectFile,
  studyFromTableFile, tableReport, VARIABLES, type PreparedStudy, type ScenarioOutcome,
} from '../../study/index.ts';
import { readInputFile, writeFileAtomic, type CliIO } from '../io.ts';

interface Args {
  table: string;
  shock: string;
  map?: string;
  json: boolean;
  out?: string;
  paths?: string;
  project?: string;
  closure?: string;
}

const USAGE = 'usage: roundwise scenario TABLE.csv --shock SHOCK.csv [--map MAP.json] [--closure households|none] [--json] [--out DIR] [--paths SECTOR] [--project FILE.json]';

function usageError(message: string): InputError {
  return new InputError('usage', message, {}, USAGE);
}

export function parseArgs(argv: string[]): Args {
  const positional: string[] = [];
  const opts: Partial<Args> = { json: false };
  const valued = new Set(['--shock', '--map', '--out', '--paths', '--project', '--closure']);
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
  if (opts.closure !== undefined && opts.closure !== 'households' && opts.closure !== 'none') throw usageError(`--closure must be households or none, got '${opts.closure}'`);
  return { ...opts, table: positional[0]!, shock: opts.shock } as Args;
}

const decoder = new TextDecoder('utf-8');

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

/** An existing file at the project path is replaced only when it is itself a readable Roundwise project. */
function refuseToOverwriteForeign(path: string): void {
  let bytes: Uint8Array;
  try {
    bytes = readInputFile(path);
  } catch {
    return; // nothing there yet
  }
  try {
    studyFromProjectFile(decoder.decode(bytes), path);
  } catch (e) {
    if (e instanceof InputError) {
      throw new InputError('project-not-overwritten', `will not overwrite it: ${e.message}; choose another --project path`, e.location);
    }
    throw e;
  }
}

const fmt = (v: number | null) => (v === null ? 'n/a' : Math.abs(v) >= 1000 ? v.toFixed(0) : v.toPrecision(4));

function summary(ps: PreparedStudy, o: ScenarioOutcome, written: string[]): string {
  const r = o.result;
  const names = { output: 'output', valueAdded: 'value added', income: 'labour income', employment: 'employment' } as const;
  const lines = [`Scenario '${r.scenario}' — ${modelTypeOf(r)}; money in ${r.moneyUnit}, employment in jobs.`, ''];
  lines.push(['', 'direct', 'indirect', 'induced', 'total', 'Type I', 'Type II'].map((c, k) => (k === 0 ? c.padEnd(14) : c.padStart(12))).join(''));
  for (const v of VARIABLES) {
    const t = r.totals[v];
    const m = r.multipliers[v];
    if (!t || !m) continue;
    lines.push([names[v].padEnd(14), ...[t.direct, t.indirect, t.induced, t.total, m.typeI.value, m.typeII.value].map((x) => fmt(x).padStart(12))].join(''));
  }
  lines.push('', `Spending rounds (round 0 is the initial demand), share of the open-model output total reached: ${o.rounds.reach.map((x) => reachText(o.rounds, x.target)).join(', ')}.`);
  const p = o.paths;
  if (p) {
    lines.push('', `Structural paths to '${p.destinationLabel}' (${p.model} model): output change there ${fmt(p.destinationTotal)} ${r.moneyUnit}; the ${p.paths.length} paths listed explain ${p.explainedShare === null ? 'n/a' : `${(p.explainedShare * 100).toFixed(1)} %`}${p.truncated ? ' (search cut short)' : ''}.`);
    lines.push(`${'carries'.padStart(12)}${'share'.padStart(9)}  path`);
    for (const x of p.paths) lines.push(`${fmt(x.contribution).padStart(12)}${(x.share === null ? 'n/a' : `${(x.share * 100).toFixed(1)} %`).padStart(9)}  ${x.labels.join(' > ')}`);
  }
  if (ps.verdict.productive !== true) lines.push('', ps.verdict.say);
  for (const note of o.notes) lines.push(note);
  lines.push('', `Cautions: ${CAUTIONS[0]} See the .about.txt files for the full list; for decisions, consult a qualified regional economist.`);
  if (written.length) lines.push('', `Wrote ${written.join(', ')}`);
  return `${lines.join('\n')}\n`;
}

export async function run(argv: string[], io: CliIO): Promise<number> {
  if (argv.includes('--help') || argv.includes('-h')) {
    io.stdout(`${USAGE}\n\nSHOCK.csv: header sector,amount[,kind][,local_share][,note]; kind is final-demand (default), output or jobs; local_share 0-1 (default 1, final-demand lines only).\n--closure households (default when the table allows it) or none; --paths SECTOR adds the structural paths to that sector; --project FILE.json saves the study as a project file.\n`);
    return 0;
  }
  const args = parseArgs(argv);
  const roles = args.map ? readRoleMap(args.map) : undefined;
  const scenario = parseShockCsv(decoder.decode(readInputFile(args.shock)), args.shock);
  const study = studyFromTableFile(readInputFile(args.table), basename(args.table), roles ? { roles } : {}, { scenarios: [scenario] });
  if (args.closure) study.settings.closure = args.closure as 'households' | 'none';
  study.settings.activeScenario = scenario.name;
  if (args.paths !== undefined) {
    if (!study.table.sectors.includes(args.paths)) throw new InputError('unknown-sector', `--paths: unknown sector '${args.paths}'`, { rowLabel: args.paths });
    study.settings.paths.destination = args.paths;
  }
  const ps = prepareStudy(study, { spectrum: false });
  const outcome = runStudyScenario(ps, scenario, { paths: args.paths ?? null });

  const written: string[] = [];
  const date = new Date().toISOString();
  if (args.out !== undefined) {
    const files = [...scenarioReportSet(ps, outcome, date), ...tableReport(ps, 'multipliers', date)];
    for (const f of files) {
      const path = join(args.out, f.name);
      writeFileAtomic(path, f.content);
      written.push(path);
    }
  }
  if (args.project !== undefined) {
    refuseToOverwriteForeign(args.project);
    writeFileAtomic(args.project, projectFileOf(study));
    written.push(args.project);
  }
  if (args.json) io.stdout(`${JSON.stringify(scenarioJson(ps, outcome), null, 2)}\n`);
  else io.stdout(summary(ps, outcome, written));
  return 0;
}
