/**
 * `roundwise scenario TABLE.csv --shock SHOCK.csv`: a study of one table with one scenario — direct / indirect /
 * induced / total effects by sector, spending rounds, implied multipliers; optionally structural paths to one sector,
 * and the study saved as a project file. Everything is computed by src/study, as in the app.
 */
import { TABLE_DIALECT_OPTIONS, tableDialect } from './table-dialect.ts';
import { readFileLimited } from '../../node-io/index.ts';
import {
  CAUTIONS, modelTypeOf, prepareStudy, projectFileOf, reachText, runStudyScenario, scenarioJson, scenarioReportSet, studyFromProjectFile, tableReport, studyFromTableFile, VARIABLES, type Closure, type PreparedStudy, type ScenarioOutcome, InputError, visibleText, parseShockCsv, matchKey, readBridge, scenarioByBridge,
  bandReports, scenarioBandsJson, sensitivityJson, sensitivityReports, studyBands, studySensitivity,
} from '../../study/index.ts';
import { defineCommand } from '../command.ts';
import { withHelperThreads } from './analyze.ts';
import { scenarioBandsSummary, sensitivitySummary, uncertaintySettingsOf, SCENARIO_UNCERTAINTY_OPTIONS } from './uncertainty-options.ts';

const fmt = (v: number | null) => (v === null ? 'n/a' : Math.abs(v) >= 1000 ? v.toFixed(0) : v.toPrecision(4));

function summary(ps: PreparedStudy, o: ScenarioOutcome): string {
  const r = o.result;
  const names = { output: 'output', valueAdded: 'value added', income: 'labour income', employment: 'employment' } as const;
  const lines = [`Scenario '${visibleText(r.scenario)}' — ${modelTypeOf(r)}; money in ${visibleText(r.moneyUnit)}, employment in jobs.`, ''];
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
    lines.push('', `Structural paths to '${visibleText(p.destinationLabel)}' (${p.model} model): output change there ${fmt(p.destinationTotal)} ${visibleText(r.moneyUnit)}; the ${p.paths.length} paths listed explain ${p.explainedShare === null ? 'n/a' : `${(p.explainedShare * 100).toFixed(1)} %`}${p.truncated ? ' (search cut short)' : ''}.`);
    lines.push(`${'carries'.padStart(12)}${'share'.padStart(9)}  path`);
    for (const x of p.paths) lines.push(`${fmt(x.contribution).padStart(12)}${(x.share === null ? 'n/a' : `${(x.share * 100).toFixed(1)} %`).padStart(9)}  ${x.labels.map((l) => visibleText(l)).join(' > ')}`);
  }
  if (ps.verdict.productive !== true) lines.push('', ps.verdict.say);
  for (const note of o.notes) lines.push(visibleText(note));
  lines.push('', `Cautions: ${CAUTIONS[0]} See the .about.txt files for the full list; for decisions, consult a qualified regional economist.`);
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
    studyFromProjectFile(text, path);
  } catch (e) {
    if (e instanceof InputError) {
      throw new InputError('project-not-overwritten', `will not overwrite it: ${e.message}; choose another --project path`, e.location);
    }
    throw e;
  }
}

export const scenario = defineCommand({
  name: 'scenario',
  summary: 'direct, indirect, induced and total effects of a demand shock on output, value added, labour income and jobs; spending rounds; structural paths',
  positional: { name: 'TABLE.csv', help: 'the flow table, in any layout roundwise analyze reads' },
  options: {
    shock: { type: 'string', value: 'SHOCK.csv', required: true, help: 'the shock: header sector,amount[,kind][,local_share][,note]; kind final-demand (default), output or jobs; local_share 0–1 (default 1)' },
    map: { type: 'string', value: 'MAP.json', help: 'role overrides for the table\'s rows and columns' },
    closure: { type: 'string', value: 'households|none', choices: ['households', 'none'], help: 'households (default, when the table allows it): induced effects from the household closure; none: open model only' },
    paths: { type: 'string', value: 'SECTOR', help: 'add the structural paths that carry the effect to SECTOR (printed in the summary too)' },
    bridge: { type: 'string', value: 'BRIDGE.csv', help: 'code,sector[,share]: the shock file names codes of another classification, mapped to the table\'s sectors (shares split a code)' },
    project: { type: 'string', value: 'FILE.json', help: 'save the study (table, shock, settings) as a project file the app opens; an existing file is replaced only if it is a Roundwise project' },
    ...TABLE_DIALECT_OPTIONS,
    ...SCENARIO_UNCERTAINTY_OPTIONS,
  },
  outHelp: 'write the scenario\'s reports (NAME-inputs, NAME-impact, NAME-implied-multipliers, NAME-rounds, NAME-rounds-by-sector, and NAME-paths with --paths; NAME from the shock file; NAME-bands with --draws, NAME-sensitivity with --sensitivity) and the table\'s multipliers as CSV, each with an .about.txt',
  async run({ input, values }, ctx) {
    const tableFile = ctx.input(input);
    const roles = ctx.roleMap(values.map);
    const shock = parseShockCsv(ctx.input(values.shock).text, values.shock);
    const study = studyFromTableFile(tableFile.bytes, tableFile.name, { ...tableDialect(values), ...(roles ? { roles } : {}) });
    // With a bridge the shock file's sector column holds codes: each line is split among the code's sectors.
    const scenario = values.bridge === undefined ? shock : scenarioByBridge(shock, readBridge({ bytes: ctx.input(values.bridge).bytes, fileName: values.bridge }, study.table.sectors));
    study.scenarios = [scenario];
    if (values.closure !== undefined) study.settings.closure = values.closure as Closure;
    study.settings.activeScenario = scenario.name;
    let destination: string | null = null;
    if (values.paths !== undefined) {
      // The sector as the importer keeps labels (NFC, no invisible characters, case ignored), as shock files are read.
      const want = matchKey(values.paths);
      destination = study.table.sectors.find((s) => matchKey(s) === want) ?? null;
      if (destination === null) throw new InputError('unknown-sector', `--paths: unknown sector '${values.paths}'`, { rowLabel: values.paths });
      study.settings.paths.destination = destination;
    }
    const settings = uncertaintySettingsOf(values, ctx);
    if (values['share-step'] !== undefined && !values.sensitivity) throw ctx.usageError('--share-step needs --sensitivity');
    const ps = prepareStudy(study, { spectrum: false });
    const outcome = runStudyScenario(ps, scenario, { paths: destination });
    const bands = settings ? await withHelperThreads(study.table.n, () => studyBands(ps, { settings, multipliers: false, scenarios: [scenario] })!) : null;
    const sens = values.sensitivity ? studySensitivity(ps, scenario, values['share-step']) : null;
    const names = { output: 'output', valueAdded: 'value added', income: 'labour income', employment: 'employment' };
    const files = [];
    if (values.project !== undefined) {
      refuseToOverwriteForeign(values.project);
      files.push({ path: values.project, content: projectFileOf(study) });
    }
    return {
      summary: () => summary(ps, outcome)
        + (bands ? `${scenarioBandsSummary(bands, bands.scenarios[0]!, names).join('\n')}\n` : '')
        + (sens ? `${sensitivitySummary(sens, study.table.moneyUnit).join('\n')}\n` : ''),
      json: () => ({
        ...scenarioJson(ps, outcome),
        ...(bands ? { uncertainty: scenarioBandsJson(bands, bands.scenarios[0]!) } : {}),
        ...(sens ? { sensitivity: sensitivityJson(sens) } : {}),
      }),
      ...(values.out !== undefined ? {
        reports: [
          ...scenarioReportSet(ps, outcome, ctx.date), ...tableReport(ps, 'multipliers', ctx.date),
          ...(bands ? bandReports(ps, bands, ctx.date) : []), ...(sens ? sensitivityReports(ps, sens, ctx.date) : []),
        ],
      } : {}),
      files,
    };
  },
});
