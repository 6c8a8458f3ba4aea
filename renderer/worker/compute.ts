/**
 * The worker's engine adapter: calls the engine (src/) and turns its results into the views the screens show.
 * Pure functions over module state (the current table and its prepared model), so it also runs under Node in
 * test/renderer without a browser.
 */
import {
  importTable, previewTable as enginePreview, ROW_ROLES, COLUMN_ROLES, type IOTable, type Layout, type RoleMap,
  SAMPLE_CSV, SAMPLE_FILE_NAME, SAMPLE_NOTE,
} from '../../src/table/index.ts';
import {
  prepareModel, solveOpen, type PreparedModel, analyzePrepared, type Analysis, type ModeKind, type Values,
} from '../../src/model/index.ts';
import { luInverse } from '../../src/linalg/index.ts';
import {
  runScenario as engineRunScenario, spendingRounds, spreadPattern, structuralPaths, compareScenarios, type Scenario,
  type ScenarioLine, type EffectSplit, type Variable, type ScenarioResult,
} from '../../src/scenario/index.ts';
import {
  impactReport, roundsReport, pathReport, comparisonReport, scenarioMultiplierReport, type ScenarioReportContext,
  type ReportFile, analysisReports,
} from '../../src/report/index.ts';
import {
  createProject, parseProject, serializeProject, sourceInfo, type SourceInfo, utf8Bytes,
} from '../../src/project/index.ts';
import { formatLocated, InputError } from '../../src/diagnostics/index.ts';
import type { AnalysisView, Eigen, MultiplierRow, TableInfo } from './protocol.ts';
import { regionalApi } from './regional.ts';

export const SAMPLE_FILE = SAMPLE_FILE_NAME;

/** Where a table came from: enough to import it again (project files keep this). */
export interface TableSource {
  text: string;
  fileName: string;
  roles?: Partial<RoleMap>;
  layout?: string | undefined;
}

export type ScenarioDraft = Scenario;

interface State {
  table: IOTable;
  pm: PreparedModel;
  full: Analysis;
  analysis: AnalysisView;
  source: SourceInfo | null;
}

let state: State | null = null;

function current(): State {
  if (!state) throw new Error('no table is loaded');
  return state;
}

function finite(v: number | null | undefined): number | null {
  return typeof v === 'number' && Number.isFinite(v) ? v : null;
}

function importOptions(src: TableSource): Parameters<typeof importTable>[1] {
  const o: Parameters<typeof importTable>[1] = { fileName: src.fileName };
  if (src.roles) o.roles = src.roles;
  if (src.layout) o.layout = src.layout as Layout;
  return o;
}

function tableInfo(t: IOTable, fileName: string): TableInfo {
  let total = 0;
  for (let j = 0; j < t.n; j++) total += t.x[j]!;
  return {
    name: t.name,
    fileName,
    n: t.n,
    sectors: t.sectors,
    moneyUnit: t.moneyUnit,
    layout: t.layout,
    hasEmployment: t.employment !== null,
    hasHouseholds: t.labourIncome.length > 0 && t.householdConsumption.length > 0,
    warnings: t.warnings.map((w) => formatLocated(w)),
    output: Array.from(t.x),
    totalOutput: total,
    patterns: [...t.householdConsumption, ...t.otherFinalDemand].flatMap((col) => {
      let sum = 0;
      for (let i = 0; i < t.n; i++) sum += Math.max(0, col.values[i]!);
      if (!(sum > 0)) return [];
      const shares = t.sectors.map((sector, i) => ({ sector, share: Math.max(0, col.values[i]!) / sum })).filter((x) => x.share > 0);
      return [{ name: `Like ${col.label}`, shares }];
    }),
    roles: { rows: { ...t.roles.rows }, columns: { ...t.roles.columns } },
  };
}

const BEHAVIOUR: Record<ModeKind, string> = {
  'collapse': 'gone after a few rounds',
  'decay': 'dies out round by round',
  'two-period-oscillation': 'flips sign every round and never dies out',
  'steady': 'persists unchanged: never dies out',
  'growth': 'grows every round',
  'growth-sign-flips': 'grows while flipping sign',
  'rotating-decay': 'swings back and forth while dying out',
  'rotating-steady': 'swings forever at the same size',
  'rotating-growth': 'swings with growing size',
};

function analyse(pm: PreparedModel): { analysis: AnalysisView; full: Analysis } {
  const full = analyzePrepared(pm);
  const { n, sectors } = pm.coef;
  const v = full.viability;
  const m = full.multipliers;
  const link = full.linkages;
  const notes: string[] = [];
  for (const note of [...m.notes, ...link.notes]) {
    const where = note.sectors === 'all' ? 'all sectors' : note.sectors.map((j) => sectors[j]).slice(0, 5).join(', ');
    notes.push(`${note.measure} (${where}): ${note.reason}`);
  }
  const key = new Set(link.keySectors);
  const at = (vals: Values, j: number): number | null => finite(vals[j]);
  const rows: MultiplierRow[] = sectors.map((sector, j) => {
    const b = at(link.backward, j), f = at(link.forward, j);
    return {
      sector, index: j,
      output: at(m.output.typeI, j),
      outputII: at(m.output.typeII, j),
      income: at(m.income.simple, j),
      incomeII: at(m.income.total, j),
      incomeRatioI: at(m.income.typeI, j),
      incomeRatioII: at(m.income.typeII, j),
      valueAdded: at(m.valueAdded.simple, j),
      valueAddedII: at(m.valueAdded.total, j),
      employment: at(m.employment.simple, j),
      employmentII: at(m.employment.total, j),
      employmentRatioI: at(m.employment.typeI, j),
      employmentRatioII: at(m.employment.typeII, j),
      backward: b, forward: f,
      linkage: b === null || f === null ? 'undefined' : key.has(j) ? 'key' : b > 1 ? 'backward' : f > 1 ? 'forward' : 'weak',
    };
  });

  const spec: Eigen[] = (v.spectrum ?? []).map((e) => ({ re: e.re, im: e.im, modulus: e.modulus, behaviour: BEHAVIOUR[e.kind] }));

  // Spending rounds for one unit of final demand in every sector.
  let rounds: AnalysisView['rounds'] = [];
  let rounds99: AnalysisView['rounds99'] = { value: null, reason: v.productive ? 'not reached within 200 rounds' : 'the table is not productive: the rounds do not die out' };
  if (v.productive) {
    const f = new Float64Array(n).fill(1);
    const r = spendingRounds(pm, f, solveOpen(pm, f), { maxRounds: 200 });
    let total = 0;
    for (const x of r.roundTotals) total += x;
    let cum = 0;
    rounds = r.roundTotals.slice(0, 40).map((x, k) => {
      cum += x;
      return { round: k, added: x, cumulative: cum / (total || 1) };
    });
    const reach = r.reach.find((x) => x.target === 0.99);
    if (reach?.rounds != null) rounds99 = { value: reach.rounds };
  }

  const [lower, upper] = v.perronRootBounds;
  const productive: boolean | null = v.verdictNote && !v.negativeFlows && v.productive !== (upper < 1) ? null : v.productive;
  let say: string;
  const detail: string[] = [];
  if (v.productive) {
    say = 'Every round of spending is smaller than the last: the table is productive.';
    detail.push(`Each round of local inter-industry buying is at most ${pct(upper)} of the round before (the Perron root), so the rounds add up to a finite total: the Leontief inverse exists and the multipliers are meaningful.`);
  } else {
    say = 'Rounds of spending do not die out: the table is not productive.';
    detail.push(`The Perron root is at least ${lower.toFixed(4)}: taken together, the sectors need a dollar or more of local inputs per dollar of output. Check the units and the roles of the rows and columns.`);
  }
  detail.push(v.hawkinsSimon
    ? 'Hawkins–Simon condition holds: every leading principal minor of I − A is positive.'
    : `Hawkins–Simon condition fails at the minor of order ${v.hawkinsSimonDetail.firstFailing?.order ?? '?'} (sector '${sectors[v.hawkinsSimonDetail.firstFailing?.sector ?? 0] ?? '?'}').`);
  if (v.verdictNote) detail.push(v.verdictNote);
  if (!v.irreducible && n > 1) detail.push(`The table is reducible: its sectors fall into ${v.blocks.length} groups that do not all buy from one another (see Table).`);

  let sumI = 0, sumII = 0, countII = 0;
  for (const r of rows) {
    sumI += r.output ?? 0;
    if (r.outputII !== null) { sumII += r.outputII; countII++; }
  }
  const analysis: AnalysisView = {
    verdict: { productive, say, detail },
    perron: { value: finite(v.perronRoot), lower: finite(lower), upper: finite(upper), ...(v.perronConverged ? {} : { reason: 'the iteration stopped before the bounds met; they are still certified' }) },
    hawkinsSimon: v.hawkinsSimon,
    rounds99,
    rounds,
    spectrum: spec,
    ...(v.spectrumNote ? { spectrumNote: v.spectrumNote } : {}),
    blocks: v.blocks.map((b) => ({ sectors: b.sectors.map((j) => sectors[j]!), cyclic: b.period !== null, period: b.period })),
    reducible: !v.irreducible,
    period: v.period,
    roundsToTolerance: v.roundsToTolerance,
    tolerance: v.tolerance,
    perronClosed: finite(v.perronRootClosed),
    condition: finite(full.checks.condition),
    multipliers: rows,
    hasTypeII: v.closedProductive === true,
    meanOutput: n && v.productive ? sumI / n : null,
    meanOutputII: countII === n && n > 0 ? sumII / n : null,
    notes: [...notes, ...full.warnings.map((w) => formatLocated(w))],
  };
  return { analysis, full };
}

function pct(v: number): string {
  return `${(v * 100).toFixed(1)} %`;
}

function load(t: IOTable, fileName: string, source: SourceInfo | null): { table: TableInfo; analysis: AnalysisView; starter: ScenarioDraft } {
  const pm = prepareModel(t);
  const { analysis, full } = analyse(pm);
  state = { table: t, pm, full, analysis, source };
  return { table: tableInfo(t, fileName), analysis, starter: starter(t) };
}

// ---- preview ----

export interface PreviewView {
  fileName: string;
  layout: string;
  sectors: string[];
  rows: { label: string; role: string }[];
  columns: { label: string; role: string }[];
  rowRoles: readonly string[];
  columnRoles: readonly string[];
  /** First cells of the file, as read. */
  cells: string[][];
  /** Purchases are null when the table has no value-added or import rows. */
  balance: { sector: string; inputs: number | null; output: number; gap: number; relative: number }[];
  balanced: boolean;
  tolerance: number;
  outputSource: string | null;
  warnings: string[];
  /** Why the file, as it stands, would be refused (located), or null. */
  refusal: string | null;
}

function firstCells(text: string): string[][] {
  return text.split(/\r?\n/, 14).filter((l) => l.trim() !== '').slice(0, 12).map((l) => l.split(/[,;\t]/).slice(0, 10));
}

function previewTable(src: TableSource): PreviewView {
  const p = enginePreview(src.text, importOptions(src));
  const b = p.balance;
  const balance: PreviewView['balance'] = [];
  if (b) {
    b.sectors.forEach((sector, j) => {
      const gaps = [b.columnGap?.[j], b.rowGap?.[j], b.totalGap?.[j]].filter((g): g is number => typeof g === 'number');
      const worst = gaps.reduce((w, g) => (Math.abs(g) > Math.abs(w) ? g : w), 0);
      balance.push({ sector, inputs: finite(b.purchases?.[j]), output: b.output[j]!, gap: worst, relative: worst });
    });
    balance.sort((x, y) => Math.abs(y.relative) - Math.abs(x.relative));
  }
  return {
    fileName: src.fileName,
    layout: p.layout ?? src.layout ?? 'matrix',
    sectors: p.sectors,
    rows: p.rows.filter((r) => r.role !== 'sector').map((r) => ({ label: r.label, role: r.role })),
    columns: p.columns.filter((c) => c.role !== 'sector').map((c) => ({ label: c.label, role: c.role })),
    rowRoles: ROW_ROLES,
    columnRoles: COLUMN_ROLES,
    cells: firstCells(src.text),
    balance: balance.slice(0, 8),
    balanced: b?.balanced ?? false,
    tolerance: b?.tolerance ?? 0.001,
    outputSource: b?.outputSource ?? null,
    warnings: p.warnings.map((w) => formatLocated(w)),
    refusal: p.refusal?.formatted ?? null,
  };
}

// ---- scenarios ----

export interface EffectView {
  direct: number[];
  indirect: number[];
  induced: number[] | null;
  total: number[];
  totals: { direct: number; indirect: number; induced: number | null; total: number };
  typeI: number | null;
  typeII: number | null;
}

export interface ScenarioView {
  name: string;
  sectors: string[];
  moneyUnit: string;
  closure: 'household' | 'none';
  effects: Record<Variable, EffectView | null>;
  rounds: { round: number; output: number; coverage: number }[];
  rounds99: number | null;
  effectiveDemand: number[];
  notes: string[];
}

function effectView(s: EffectSplit | null, t: { direct: number; indirect: number; induced: number | null; total: number } | null, m: { typeI: { value: number | null }; typeII: { value: number | null } } | null, closure: boolean): EffectView | null {
  if (!s || !t || !m) return null;
  const induced = closure && s.induced ? Array.from(s.induced) : null;
  const openTotal = Array.from(s.direct, (d, i) => d + s.indirect[i]!);
  return {
    direct: Array.from(s.direct),
    indirect: Array.from(s.indirect),
    induced,
    total: induced ? Array.from(s.total) : openTotal,
    totals: { direct: t.direct, indirect: t.indirect, induced: closure ? t.induced : null, total: closure && t.induced !== null ? t.total : t.direct + t.indirect },
    typeI: finite(m.typeI.value),
    typeII: closure ? finite(m.typeII.value) : null,
  };
}

function scenarioOf(d: ScenarioDraft): Scenario {
  // Lines with no sector yet or a zero amount are still being typed: left out rather than refused.
  const lines: ScenarioLine[] = d.lines.filter((l) => l.sector !== '' && l.amount !== 0);
  return { name: d.name, lines };
}

function requireProductive(): void {
  if (!current().full.viability.productive) {
    throw new InputError('not-productive', 'the table is not productive (its spending rounds do not die out), so scenario effects are not defined; check the table on the Import screen');
  }
}

function runScenario(args: { scenario: ScenarioDraft; closure: boolean }): ScenarioView {
  requireProductive();
  const { pm, table } = current();
  const r = engineRunScenario(pm, scenarioOf(args.scenario));
  const closure = args.closure && r.closure === 'household';
  const vars: Variable[] = ['output', 'valueAdded', 'income', 'employment'];
  const effects = {} as Record<Variable, EffectView | null>;
  for (const v of vars) effects[v] = effectView(r.effects[v], r.totals[v], r.multipliers[v], closure);
  const rr = spendingRounds(pm, r.effectiveDemand, r.openOutput, { maxRounds: 200 });
  const reach = rr.reach.find((x) => x.target === 0.99)?.rounds ?? null;
  return {
    name: r.scenario,
    sectors: r.sectors,
    moneyUnit: table.moneyUnit,
    closure: closure ? 'household' : 'none',
    effects,
    rounds: rr.roundTotals.slice(0, 30).map((v, k) => ({ round: k, output: v, coverage: rr.coverage[k] ?? 0 })),
    rounds99: reach,
    effectiveDemand: Array.from(r.effectiveDemand),
    notes: r.notes,
  };
}

export interface PathsView {
  destination: string;
  total: number;
  explainedShare: number | null;
  truncated: boolean;
  paths: { labels: string[]; contribution: number; share: number | null; direct: number; pathMultiplier: number }[];
}

function paths(args: { scenario: ScenarioDraft; sector: string; closure: boolean }): PathsView {
  requireProductive();
  const { pm } = current();
  const r = engineRunScenario(pm, scenarioOf(args.scenario));
  const dest = pm.coef.sectors.indexOf(args.sector);
  if (dest < 0) throw new Error(`unknown sector '${args.sector}'`);
  // The scenario's own closure verdict: a household-closed model that is not productive is dropped there (with a note).
  const model = args.closure && r.closure === 'household' ? 'closed' : 'open';
  const f = model === 'closed' ? Float64Array.from([...r.effectiveDemand, 0]) : r.effectiveDemand;
  const pa = structuralPaths(pm, f, dest, { model, maxPaths: 15 });
  return {
    destination: pa.destinationLabel,
    total: pa.destinationTotal,
    explainedShare: pa.explainedShare,
    truncated: pa.truncated,
    paths: pa.paths.map((p) => ({ labels: p.labels, contribution: p.contribution, share: p.share, direct: p.direct, pathMultiplier: p.pathMultiplier })),
  };
}

// ---- grids (Table screen) ----

export interface GridView {
  which: 'Z' | 'A' | 'L';
  n: number;
  sectors: string[];
  /** Row-major n×n values. */
  values: Float64Array;
  max: number;
}

function grid(args: { which: 'Z' | 'A' | 'L' }): GridView {
  const { pm, table } = current();
  const n = pm.coef.n;
  let values: Float64Array;
  if (args.which === 'Z') values = Float64Array.from(table.Z);
  else if (args.which === 'A') values = Float64Array.from(pm.coef.A);
  else {
    if (!current().full.viability.productive) throw new InputError('not-productive', 'the table is not productive, so the Leontief inverse is not shown');
    // The explicit inverse, only when the user asks for the grid: the blocked inverse on the existing factorisation
    // (about 1 s at 2,000 sectors) rather than n separate solves (about 20 s there).
    values = luInverse(pm.openLU);
  }
  let max = 0;
  for (let k = 0; k < values.length; k++) if (values[k]! > max) max = values[k]!;
  return { which: args.which, n, sectors: pm.coef.sectors, values, max };
}

// ---- reports ----

export type ReportKind = 'multipliers' | 'coefficients' | 'viability' | 'spectrum' | 'perron-vectors' | 'leontief-inverse' | 'scenario-impact' | 'scenario-rounds' | 'scenario-multipliers' | 'scenario-paths' | 'comparison';

function context(): ScenarioReportContext {
  const { table, source } = current();
  return { tableName: table.name, date: new Date().toISOString(), ...(source ? { sourceFile: source.fileName, sourceHash: source.sha256 } : {}) };
}

function report(args: { kind: ReportKind; scenario?: ScenarioDraft; scenarios?: ScenarioDraft[]; closure?: boolean; sector?: string }): ReportFile[] {
  const { full, pm, table, source } = current();
  const unit = table.moneyUnit;
  switch (args.kind) {
    case 'multipliers':
    case 'coefficients':
    case 'viability':
    case 'spectrum':
    case 'perron-vectors':
    case 'leontief-inverse': {
      // The same files the CLI writes (src/report/analysis.ts); the inverse is formed only when asked for.
      if (args.kind === 'leontief-inverse') requireProductive();
      const an = args.kind === 'leontief-inverse' ? analyzePrepared(pm, { inverse: true }) : full;
      const files = analysisReports(an, { date: new Date().toISOString(), ...(source ? { sourceFile: source.fileName, sourceHash: source.sha256 } : {}) });
      const mine = files.filter((f) => f.name === `${args.kind}.csv` || f.name === `${args.kind}.about.txt`);
      if (!mine.length) throw new Error(args.kind === 'spectrum' ? (full.viability.spectrumNote ?? 'the spectrum was not computed') : `no ${args.kind} report for this table`);
      return mine;
    }
    case 'comparison': {
      requireProductive();
      const list = args.scenarios ?? [];
      const results = list.map((sc) => engineRunScenario(pm, scenarioOf(sc)));
      return comparisonReport(compareScenarios(results), unit, context());
    }
    default: {
      requireProductive();
      if (!args.scenario) throw new Error('this report needs a scenario');
      const r = engineRunScenario(pm, scenarioOf(args.scenario));
      const base = `${slug(args.scenario.name)}`;
      if (args.kind === 'scenario-impact') return impactReport(r, context(), `${base}-impact`);
      if (args.kind === 'scenario-multipliers') return scenarioMultiplierReport(r, context(), `${base}-multipliers`);
      if (args.kind === 'scenario-rounds') return roundsReport(r, spendingRounds(pm, r.effectiveDemand, r.openOutput, { maxRounds: 200 }), context(), `${base}-rounds`);
      const dest = pm.coef.sectors.indexOf(args.sector ?? '');
      const target = dest >= 0 ? dest : largest(r);
      const model = args.closure && r.closure === 'household' ? 'closed' : 'open';
      const f = model === 'closed' ? Float64Array.from([...r.effectiveDemand, 0]) : r.effectiveDemand;
      return pathReport(r, structuralPaths(pm, f, target, { model }), context(), `${base}-paths`);
    }
  }
}

function largest(r: ScenarioResult): number {
  const t = r.effects.output.total;
  let best = 0;
  for (let i = 1; i < t.length; i++) if (Math.abs(t[i]!) > Math.abs(t[best]!)) best = i;
  return best;
}

function slug(s: string): string {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'scenario';
}

// ---- projects ----

function saveProject(args: { name: string; scenarios: ScenarioDraft[]; closure: boolean; active: number }): string {
  const { table, source } = current();
  const known = new Set(table.sectors);
  for (const sc of args.scenarios) {
    sc.lines.forEach((l, k) => {
      if (l.sector !== '' && !known.has(l.sector)) {
        throw new InputError('unknown-sector', `scenario '${sc.name}', line ${k + 1}: sector '${l.sector}' is not in this table; change or remove the line before saving`, { rowLabel: l.sector });
      }
    });
  }
  // Lines still being typed (no sector yet) are not part of the study.
  const scenarios = args.scenarios.map((s) => ({ name: s.name, lines: s.lines.filter((l) => l.sector !== '').map((l) => ({ ...l })) }));
  const p = createProject(table, { name: args.name, source, scenarios });
  p.settings.paths.model = args.closure ? 'closed' : 'open';
  p.settings.activeScenario = args.scenarios[args.active]?.name ?? null;
  return serializeProject(p);
}

/**
 * The table, its source and the settings as a project with no scenarios, for the crash-recovery copy: no save-time
 * checks, so a scenario line that no longer matches the table can never stop the copy. The scenarios travel beside
 * it as the UI holds them (renderer/state/recovery-copy.ts).
 */
function recoveryBase(args: { name: string; closure: boolean }): string {
  const { table, source } = current();
  const p = createProject(table, { name: args.name, source });
  p.settings.paths.model = args.closure ? 'closed' : 'open';
  return serializeProject(p);
}

function openProject(args: { text: string; fileName: string }): { table: TableInfo; analysis: AnalysisView; scenarios: ScenarioDraft[]; closure: boolean; active: number; name: string } {
  const p = parseProject(args.text, args.fileName);
  const loaded = load(p.table, p.source?.fileName ?? args.fileName, p.source);
  const active = Math.max(0, p.scenarios.findIndex((s) => s.name === p.settings.activeScenario));
  return { ...loaded, scenarios: p.scenarios, closure: p.settings.paths.model === 'closed', active, name: p.name };
}

// ---- the API the UI calls ----

function starter(t: IOTable): ScenarioDraft {
  const s = t.sectors;
  const food = s.find((x) => /food/i.test(x));
  return {
    name: food ? 'New food plant' : 'Example scenario',
    lines: [{ sector: food ?? s[0] ?? '', amount: 1000, kind: 'final-demand', localShare: 1 }],
  };
}

function spread(args: { pattern: { name: string; shares: { sector: string; share: number }[] }; amount: number; localShare: number }): ScenarioLine[] {
  // Shares computed from a column can miss 1 by rounding; renormalise before the engine's strict check.
  let sum = 0;
  for (const x of args.pattern.shares) sum += x.share;
  const pattern = { name: args.pattern.name, shares: args.pattern.shares.map((x) => ({ sector: x.sector, share: x.share / sum })) };
  return spreadPattern(pattern, args.amount, { localShare: args.localShare });
}

export const api = {
  loadSample(_: Record<string, never>): { table: TableInfo; analysis: AnalysisView; source: TableSource; starter: ScenarioDraft; note: string } {
    const source: TableSource = { text: SAMPLE_CSV, fileName: SAMPLE_FILE };
    const t = importTable(SAMPLE_CSV, { fileName: SAMPLE_FILE, name: 'Fernhollow County (invented sample)' });
    return { ...load(t, SAMPLE_FILE, sourceInfo(SAMPLE_FILE, utf8Bytes(SAMPLE_CSV))), source, note: SAMPLE_NOTE };
  },
  previewTable,
  loadTable(src: TableSource): { table: TableInfo; analysis: AnalysisView; starter: ScenarioDraft } {
    return load(importTable(src.text, importOptions(src)), src.fileName, sourceInfo(src.fileName, utf8Bytes(src.text)));
  },
  runScenario,
  spread,
  paths,
  grid,
  report,
  saveProject,
  recoveryBase,
  openProject,
  ...regionalApi,
};
