/**
 * `roundwise scenario TABLE.csv --shock SHOCK.csv`: demand-shock effects by sector (direct / indirect / induced /
 * total), spending rounds, implied multipliers; optionally structural paths to one sector, and the study saved as a
 * project file.
 */
import { formatLocated, InputError, visibleText } from '../../diagnostics/index.ts';
import { analyzePrepared, type Analysis, prepareModel } from '../../model/index.ts';
import {
  analysisNotes, multiplierRows, reportFiles, type ReportFile, CAUTIONS, modelTypeOf, scenarioReports,
  SCENARIO_CAUTIONS, type ScenarioReportContext,
} from '../../report/index.ts';
import { createProject, parseProject, serializeProject } from '../../project/index.ts';
import {
  analyseScenario, parseShockCsv, VARIABLES, type EffectSplit, type PathAnalysis, type RoundsResult, type Scenario,
  type ScenarioAnalysis, type ScenarioResult,
} from '../../scenario/index.ts';
import { importTable, type IOTable } from '../../table/index.ts';
import { readFileLimited } from '../../node-io/index.ts';
import { defineCommand } from '../command.ts';

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

function summary(r: ScenarioResult, rounds: RoundsResult): string {
  const names = { output: 'output', valueAdded: 'value added', income: 'labour income', employment: 'employment' } as const;
  const lines = [`Scenario '${visibleText(r.scenario)}' — ${modelTypeOf(r)}; money in ${visibleText(r.moneyUnit)}, employment in jobs.`, ''];
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
  return `${lines.join('\n')}\n`;
}

/** An existing file at the project path is replaced only when it is itself a readable Roundwise project. */
function refuseToOverwriteForeign(path: string): void {
  let text: string;
  try {
    text = new TextDecoder('utf-8').decode(readFileLimited(path).bytes);
  } catch (e) {
    if (e instanceof InputError && e.code === 'read-failed') return; // nothing there yet (or unreadable: the write says so)
    if (e instanceof InputError) throw new InputError('project-not-overwritten', `will not overwrite it: ${e.message}; choose another --project path`, e.location);
    throw e;
  }
  try {
    parseProject(text, path);
  } catch (e) {
    if (e instanceof InputError) {
      throw new InputError('project-not-overwritten', `will not overwrite it: ${e.message}; choose another --project path`, e.location);
    }
    throw e;
  }
}

/**
 * The engine part of the command: the table's own analysis (its viability verdict goes into the notes, its
 * multipliers into the reports) and the scenario's effects, rounds and paths.
 */
function computeScenario(table: IOTable, scenario: Scenario, pathsTo: string | undefined, tableFile: string): { an: Analysis; analysis: ScenarioAnalysis } {
  const pm = prepareModel(table);
  const an = analyzePrepared(pm, { spectrum: false });
  if (pm.openLU.singular) {
    throw new InputError('singular', 'I − A is singular (Perron root 1), so the table cannot carry a demand shock; check that every sector has value added or imports (roundwise analyze shows the details)', { file: tableFile });
  }
  let destination: number | null = null;
  if (pathsTo !== undefined) {
    destination = table.sectors.indexOf(pathsTo);
    if (destination < 0) throw new InputError('unknown-sector', `--paths: unknown sector '${pathsTo}'`, { rowLabel: pathsTo });
  }
  const analysis = analyseScenario(pm, scenario, { pathsTo: destination, rounds: { perronRoot: an.viability.perronRoot } });
  if (!an.viability.productive) {
    const why = an.viability.verdictNote ?? `Perron root ${an.viability.perronRoot.toPrecision(6)} is not below 1`;
    analysis.result.notes.unshift(`NOT MEANINGFUL: the table does not describe a productive economy (${why}); the numbers below follow from the equations but cannot be read as effects. Check the table and its role map (roundwise analyze).`);
  }
  for (const w of table.warnings) analysis.result.notes.push(`Table warning: ${formatLocated(w)}`);
  return { an, analysis };
}

export const scenario = defineCommand({
  name: 'scenario',
  summary: 'direct, indirect, induced and total effects of a demand shock on output, value added, labour income and jobs; spending rounds; structural paths',
  positional: { name: 'TABLE.csv', help: 'the flow table, in any layout roundwise analyze reads' },
  options: {
    shock: { type: 'string', value: 'SHOCK.csv', required: true, help: 'the shock: header sector,amount[,kind][,local_share][,note]; kind final-demand (default), output or jobs; local_share 0–1 (default 1)' },
    map: { type: 'string', value: 'MAP.json', help: 'role overrides for the table\'s rows and columns' },
    paths: { type: 'string', value: 'SECTOR', help: 'add the structural paths that carry the effect to SECTOR' },
    project: { type: 'string', value: 'FILE.json', help: 'save the study (table, shock, settings) as a project file the app opens; an existing file is replaced only if it is a Roundwise project' },
  },
  outHelp: 'write scenario-impact, scenario-rounds, scenario-rounds-by-sector, scenario-multipliers, multipliers (and scenario-paths with --paths) as CSV, each with an .about.txt',
  async run({ input, values }, ctx) {
    const tableFile = ctx.input(input);
    const roles = ctx.roleMap(values.map);
    const table = importTable(tableFile.text, { fileName: input, ...(roles ? { roles } : {}) });
    const scenario = parseShockCsv(ctx.input(values.shock).text, values.shock);
    const { an, analysis } = computeScenario(table, scenario, values.paths, input);
    const { result, rounds, paths } = analysis;

    const reportCtx: ScenarioReportContext = { tableName: table.name, sourceFile: tableFile.name, sourceHash: tableFile.sha256, date: ctx.date };
    const files = [];
    if (values.project !== undefined) {
      const project = createProject(table, { source: { fileName: tableFile.name, sha256: reportCtx.sourceHash!, bytes: tableFile.bytes.length }, scenarios: [scenario] });
      project.settings.activeScenario = scenario.name;
      if (values.paths !== undefined) project.settings.paths.destination = values.paths;
      refuseToOverwriteForeign(values.project);
      files.push({ path: values.project, content: serializeProject(project) });
    }
    return {
      summary: () => summary(result, rounds),
      json: () => scenarioJson(result, rounds, table.name, paths),
      ...(values.out !== undefined ? { reports: [...scenarioReports(analysis, reportCtx), ...tableMultiplierReport(an, reportCtx)] } : {}),
      files,
    };
  },
});
