/**
 * `roundwise scenario TABLE.csv --shock SHOCK.csv`: a study of one table with one scenario of one or more phases —
 * direct / indirect / induced / total effects by sector per phase, spending rounds, implied multipliers; an annual
 * phase's cumulative effect and present value; net of displacement and deadweight when lines give them; optionally
 * structural paths to one sector, and the study saved as a project file. Everything is computed by src/study, as in
 * the app.
 */
import { TABLE_DIALECT_OPTIONS, tableDialect } from './table-dialect.ts';
import { BRIEF_OPTIONS, deliverableFiles, XLSX_OPTION } from './deliverables.ts';
import { readFileLimited } from '../../node-io/index.ts';
import {
  CAUTIONS, checkStudyInputs, modelTypeOf, projectFileOf, reachText, runStudyScenario, scenarioJson, scenarioReportSet, studyFromProjectFile,
  tableReport, studyFromTableFile, timingText, unitOf, cumulativeUnitOf, VARIABLE_NAMES, VARIABLES, MONEY_VARIABLES, InputError, visibleText, parseShockCsv, mixesFromFile, parseActivityCsv,
  parseMarginsCsv, parsePriceIndexCsv, parseCommutingCsv, matchKey, readBridge, scenarioByBridge, ACTIVITY_HEADER, MARGINS_HEADER, MIX_HEADER, PRICE_INDEX_HEADER, SHOCK_HEADER,
  type Closure, type EffectTotals, type Scenario, type Study, type PhaseOutcome, type PreparedStudy, type ScenarioOutcome, type ScenarioResult,
  bandReports, scenarioBandsJson, sensitivityJson, sensitivityReports, studySensitivity,
} from '../../study/index.ts';
import { defineCommand, type RunContext } from '../command.ts';
import { summaryNumber } from '../terminal.ts';
import { prepareAnd, startHelpersFor, unkeptTableBuffer } from './analyze.ts';
import { collectImportGarbage } from '../memory.ts';
import { bandsOf, flqOf, scenarioBandsSummary, sensitivitySummary, uncertaintySettingsOf, SCENARIO_UNCERTAINTY_OPTIONS } from './uncertainty-options.ts';


function totalsTable(r: ScenarioResult, title: string): string[] {
  const lines = [title];
  lines.push(['', 'direct', 'indirect', 'induced', 'total', 'Type I', 'Type II'].map((c, k) => (k === 0 ? c.padEnd(22) : c.padStart(12))).join(''));
  for (const v of VARIABLES) {
    const t = r.totals[v];
    const m = r.multipliers[v];
    if (!t || !m) continue;
    lines.push([`${VARIABLE_NAMES[v]}`.padEnd(22), ...[t.direct, t.indirect, t.induced, t.total, m.typeI.value, m.typeII.value].map((x) => summaryNumber(x).padStart(12))].join(''));
  }
  return lines;
}

function overTimeLines(p: PhaseOutcome, moneyUnit: string): string[] {
  const o = p.overTime;
  if (!o) return [];
  const unit = visibleText(moneyUnit);
  const lines = [`Over ${o.years} years (years × one year, undiscounted): ${VARIABLES.flatMap((v) => {
    const t = o.cumulative[v];
    return t ? [`${VARIABLE_NAMES[v]} ${summaryNumber(t.total)} ${cumulativeUnitOf(v, unit)}`] : [];
  }).join(', ')}.`];
  if (o.presentValue) {
    lines.push(`Present value at ${o.rate} a year (ordinary annuity, factor ${summaryNumber(o.annuityFactor)}): ${MONEY_VARIABLES.flatMap((v) => {
      const t = o.presentValue![v];
      return t ? [`${VARIABLE_NAMES[v]} ${summaryNumber(t.total)}`] : [];
    }).join(', ')} ${unit}.`);
  }
  return lines;
}

function phaseLines(o: ScenarioOutcome, p: PhaseOutcome): string[] {
  const r = p.result;
  const unit = visibleText(r.moneyUnit);
  const lines: string[] = [];
  if (o.phases.length > 1) lines.push('', `Phase '${visibleText(p.phase.name)}' (${timingText(p.phase)})${p.phase.timing === 'annual' ? ': one year\'s effects' : ''}`);
  lines.push(...totalsTable(r, p.net ? 'Gross:' : ''));
  if (p.net) lines.push(...totalsTable(p.net, 'Net of displacement and deadweight:'));
  for (const row of r.outside) lines.push(`  of which outside the table's sectors: ${visibleText(row.label)} (direct ${summaryNumber(row.direct.output)} ${unit} output, ${summaryNumber(row.direct.income)} ${unit} labour income${row.direct.employment != null ? `, ${summaryNumber(row.direct.employment)} jobs` : ''})`);
  lines.push(...overTimeLines(p, r.moneyUnit));
  lines.push(`Spending rounds (round 0 is the initial demand), share of the open-model output total reached: ${p.rounds.reach.map((x) => reachText(p.rounds, x.target)).join(', ')}.`);
  const pa = p.paths;
  if (pa) {
    lines.push(`Structural paths to '${visibleText(pa.destinationLabel)}' (${pa.model} model): output change there ${summaryNumber(pa.destinationTotal)} ${unit}; the ${pa.paths.length} paths listed explain ${pa.explainedShare === null ? 'n/a' : `${(pa.explainedShare * 100).toFixed(1)} %`}${pa.truncated ? ' (search cut short)' : ''}.`);
    lines.push(`${'carries'.padStart(12)}${'share'.padStart(9)}  path`);
    for (const x of pa.paths) lines.push(`${summaryNumber(x.contribution).padStart(12)}${(x.share === null ? 'n/a' : `${(x.share * 100).toFixed(1)} %`).padStart(9)}  ${x.labels.map((l) => visibleText(l)).join(' > ')}`);
  }
  if (o.phases.length > 1) for (const note of r.notes) lines.push(visibleText(note));
  return lines;
}

function timingSumLines(o: ScenarioOutcome, moneyUnit: string): string[] {
  const lines: string[] = [];
  for (const t of o.byTiming) {
    const what = t.timing === 'once' ? 'All one-time phases, added' : 'All annual phases, one year of each, added';
    const parts = VARIABLES.flatMap((v) => {
      const x = t.gross[v] as EffectTotals | null | undefined;
      return x ? [`${VARIABLE_NAMES[v]} ${summaryNumber(x.total)} ${unitOf(v, visibleText(moneyUnit))}`] : [];
    });
    lines.push('', `${what} (${t.phases.map((n) => `'${visibleText(n)}'`).join(', ')}; gross totals): ${parts.join(', ')}.`);
  }
  if (o.phases.some((p) => p.phase.timing === 'once') && o.phases.some((p) => p.phase.timing === 'annual')) {
    lines.push('One-time and annual effects are not added together.');
  }
  return lines;
}

function summary(ps: PreparedStudy, o: ScenarioOutcome): string {
  const r = o.phases[0]!.result;
  const lines = [`Scenario '${visibleText(o.scenario.name)}' — ${modelTypeOf(r, o.model)}; money in ${visibleText(r.moneyUnit)}, employment in jobs.`];
  if (o.phases.length === 1) lines.push(`${o.phases[0]!.phase.timing === 'annual' ? 'Annual: one year\'s effects' : 'One-time effects'}.`, '');
  for (const p of o.phases) lines.push(...phaseLines(o, p));
  lines.push(...timingSumLines(o, r.moneyUnit));
  if (ps.verdict.productive !== true) lines.push('', ps.verdict.say);
  lines.push('');
  const phaseNotes = new Set(o.phases.length > 1 ? o.phases.flatMap((p) => p.result.notes) : []);
  for (const note of [...new Set(o.phases.flatMap((p) => p.notes))]) if (!phaseNotes.has(note)) lines.push(visibleText(note));
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

const share = (v: number) => (v >= 0 && v <= 1 ? null : 'must be a share from 0 to 1');

/**
 * The table file's study and the shock, read in this order. The study keeps the file's bytes only when `--project`
 * saves them: otherwise the collection after the import (memory.ts) frees them with the decoded text (21 MB each at
 * 2,000 sectors off the peak). Read here, not in `run`, so no variable of `run` still holds them.
 */
function studyAndShock(ctx: RunContext, input: string, values: { map: string | undefined; shock: string; project: string | undefined } & Parameters<typeof tableDialect>[0]): { study: Study; shock: Scenario } {
  const keepBytes = values.project !== undefined;
  const tableFile = ctx.input(input, keepBytes ? {} : { into: unkeptTableBuffer });
  startHelpersFor(tableFile.bytes.length);
  const roles = ctx.roleMap(values.map);
  const shock = parseShockCsv(ctx.input(values.shock).text, values.shock);
  const study = studyFromTableFile(tableFile.bytes, tableFile.name, { ...tableDialect(values), ...(roles ? { roles } : {}) }, { keepBytes });
  return { study, shock };
}

export const scenario = defineCommand({
  name: 'scenario',
  summary: 'direct, indirect, induced and total effects of a demand shock, phase by phase, on output, value added, labour income, jobs (and taxes and FTE when the table has them); spending rounds; structural paths',
  positional: { name: 'TABLE.csv', help: 'the flow table, in any layout roundwise analyze reads' },
  options: {
    shock: { type: 'string', value: 'SHOCK.csv', required: true, help: `the shock: header ${SHOCK_HEADER}; kind final-demand (default), output, jobs, labour-income, mix or activity; timing once (default) or annual; prices producer (default) or purchaser` },
    map: { type: 'string', value: 'MAP.json', help: 'role overrides for the table\'s rows and columns' },
    closure: { type: 'string', value: 'households|none', choices: ['households', 'none'], help: 'households (default, when the table allows it): induced effects from the household closure; none: open model only' },
    paths: { type: 'string', value: 'SECTOR', help: 'add the structural paths that carry the effect to SECTOR, in each phase (printed in the summary too)' },
    mix: { type: 'strings', value: 'MIX.csv', help: `spending mixes for mix lines: header ${MIX_HEADER} (the table's final-demand columns are mixes too: 'Table column: NAME')` },
    activity: { type: 'strings', value: 'ACT.csv', help: `activities not in the table, for activity lines: header ${ACTIVITY_HEADER}` },
    margins: { type: 'string', value: 'MARGINS.csv', help: `margins for purchaser-price lines: header ${MARGINS_HEADER}, a 'margin sector' row naming the sectors that earn them, an optional 'local share' row` },
    'price-index': { type: 'string', value: 'INDEX.csv', help: `a price index for lines with a price_year: header ${PRICE_INDEX_HEADER}` },
    'table-year': { type: 'number', value: 'YYYY', help: 'the year of the table\'s money (default: a four-digit year in the table\'s corner cell)', check: (v) => (Number.isInteger(v) && v >= 1000 && v <= 9999 ? null : 'must be a four-digit year') },
    'discount-rate': { type: 'number', value: 'R', help: 'discount rate per year for the present value of annual phases with a number of years (e.g. 0.035; default: none)', check: (v) => (v >= 0 && v < 1 ? null : 'must be a share from 0 up to (not including) 1') },
    commuting: { type: 'string', value: 'COMMUTING.csv', help: 'share of each sector\'s labour income paid to non-residents: header sector,share (leaks out before household spending)' },
    'commuting-share': { type: 'number', value: 'S', help: 'the same share for every sector not in --commuting, and for activities\' payrolls (default 0)', check: share },
    bridge: { type: 'string', value: 'BRIDGE.csv', help: 'code,sector[,share]: the shock file and the mix files name codes of another classification, mapped to the table\'s sectors (shares split a code)' },
    project: { type: 'string', value: 'FILE.json', help: 'save the study (table, shock, settings and the files above) as a project file the app opens; an existing file is replaced only if it is a Roundwise project' },
    ...BRIEF_OPTIONS,
    ...XLSX_OPTION,
    ...TABLE_DIALECT_OPTIONS,
    ...SCENARIO_UNCERTAINTY_OPTIONS,
  },
  outHelp: 'write the scenario\'s reports (NAME-inputs, NAME-phases, and per phase NAME[-PHASE]-impact, -net-impact with displacement or deadweight, -implied-multipliers, -rounds, -rounds-by-sector, and -paths with --paths; NAME from the shock file; NAME-bands with --draws, NAME-sensitivity with --sensitivity) and the table\'s multipliers as CSV, each with an .about.txt',
  async run({ input, values }, ctx) {
    const { study, shock } = studyAndShock(ctx, input, values);
    collectImportGarbage(study.source?.bytes ?? 0);
    // With a bridge the shock file's sector column holds codes: each line is split among the code's sectors.
    const bridge = values.bridge === undefined ? null : readBridge({ bytes: ctx.input(values.bridge).bytes, fileName: values.bridge }, study.table.sectors);
    const scenario = bridge === null ? shock : scenarioByBridge(shock, bridge);
    study.scenarios = [scenario];
    // With a bridge, mix files name codes too: each code's share is split among its sectors.
    study.mixes = values.mix.flatMap((f) => mixesFromFile(ctx.input(f).text, f, bridge));
    study.activities = values.activity.flatMap((f) => parseActivityCsv(ctx.input(f).text, f));
    for (const list of [study.mixes, study.activities]) {
      const seen = new Set<string>();
      for (const x of list) {
        if (seen.has(x.name)) throw new InputError('duplicate-name', `'${x.name}' is described twice (in ${x.origin?.file ?? 'the files given'})`, { ...(x.origin?.file ? { file: x.origin.file } : {}), ...(x.origin?.line ? { line: x.origin.line } : {}), rowLabel: x.name });
        seen.add(x.name);
      }
    }
    if (values.margins !== undefined) study.margins = parseMarginsCsv(ctx.input(values.margins).text, values.margins);
    if (values['price-index'] !== undefined) study.prices.index = parsePriceIndexCsv(ctx.input(values['price-index']).text, values['price-index']);
    if (values['table-year'] !== undefined) study.prices.tableYear = values['table-year'];
    if (values['discount-rate'] !== undefined) study.settings.discountRate = values['discount-rate'];
    study.commuting = {
      overall: values['commuting-share'] ?? 0,
      sectors: values.commuting !== undefined ? parseCommutingCsv(ctx.input(values.commuting).text, values.commuting) : [],
    };
    checkStudyInputs(study);
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
    const drawn = uncertaintySettingsOf(values, ctx);
    if (values['share-step'] !== undefined && !values.sensitivity) throw ctx.usageError('--share-step needs --sensitivity');
    if (values['margin-step'] !== undefined && !values.sensitivity) throw ctx.usageError('--margin-step needs --sensitivity');
    const flq = flqOf(values, ctx, study.table);
    if (flq && !values.sensitivity && !(drawn && flq.rangeGiven)) throw ctx.usageError('--flq-national needs --sensitivity, or --draws with --delta-range');
    // δ is drawn only when a range is given with --draws.
    const settings = drawn && flq?.rangeGiven ? { ...drawn, deltaRange: flq.range } : drawn;
    // The flows are read again only by draws, the sensitivity's re-estimates and a project saved from the numbers.
    const flowsDone = settings === null && !values.sensitivity && flq === null && values.project === undefined;
    const { ps, result: outcome } = await prepareAnd(study, { spectrum: false, flowsDone }, (p) => runStudyScenario(p, scenario, { paths: destination }));
    const bands = settings ? await bandsOf(ps, { settings, multipliers: false, scenarios: [scenario] }, flq?.origin ?? null) : null;
    const sens = values.sensitivity ? studySensitivity(ps, scenario, values['share-step'], {
      ...(values['margin-step'] !== undefined ? { marginStep: values['margin-step'] } : {}),
      flq: flq ? { origin: flq.origin, range: flq.range } : null,
    }) : null;
    const files = await deliverableFiles(ps, outcome, values, ctx, { bands, sensitivity: sens });
    if (values.project !== undefined) {
      refuseToOverwriteForeign(values.project);
      files.push({ path: values.project, content: projectFileOf(study) });
    }
    return {
      summary: () => summary(ps, outcome)
        + (bands ? bands.scenarios.map((b) => `${scenarioBandsSummary(bands, b).join('\n')}\n`).join('') : '')
        + (sens ? sens.map((x) => `${sensitivitySummary(x, study.table.moneyUnit).join('\n')}\n`).join('') : ''),
      json: () => ({
        ...scenarioJson(ps, outcome),
        // One phase: an object, as before phases; several: one per phase, in file order (each names its phase).
        ...(bands ? { uncertainty: bands.scenarios.length === 1 ? scenarioBandsJson(bands, bands.scenarios[0]!) : bands.scenarios.map((b) => scenarioBandsJson(bands, b)) } : {}),
        ...(sens ? { sensitivity: sens.length === 1 ? sensitivityJson(sens[0]!) : sens.map(sensitivityJson) } : {}),
      }),
      ...(values.out !== undefined ? {
        reports: [
          ...scenarioReportSet(ps, outcome, ctx.date), ...tableReport(ps, 'multipliers', ctx.date),
          ...(bands ? bandReports(ps, bands, ctx.date) : []), ...(sens ? sens.flatMap((x) => sensitivityReports(ps, x, ctx.date)) : []),
        ],
      } : {}),
      files,
    };
  },
});
