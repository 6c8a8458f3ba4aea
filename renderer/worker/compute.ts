/**
 * The worker's engine adapter: calls the engine (src/) and turns its results into the views the screens show.
 * Pure functions over module state (the current table and its prepared model), so it also runs under Node in
 * test/renderer without a browser.
 */
import { importTable } from '../../src/table/index.ts';
import type { IOTable, Layout, RoleMap } from '../../src/table/types.ts';
import { prepareModel, solveOpen, type PreparedModel } from '../../src/model/prepared.ts';
import { perronRoot } from '../../src/model/perron.ts';
import { hawkinsSimon } from '../../src/model/hawkins.ts';
import { spectrum, SPECTRUM_MAX_SECTORS, type ModeKind } from '../../src/model/spectrum.ts';
import { computeLinkages, computeMultipliers, type Availability, type Values } from '../../src/model/multipliers.ts';
import { runScenario as engineRunScenario, spendingRounds, structuralPaths } from '../../src/scenario/index.ts';
import type { Scenario, ScenarioLine, EffectSplit, Variable } from '../../src/scenario/types.ts';
import { reportFiles, type ReportFile } from '../../src/report/document.ts';
import type { Cell } from '../../src/report/csv.ts';
import { formatLocated, isInputError } from '../../src/diagnostics/errors.ts';
import sampleCsv from '../../sample-data/fernhollow-county.csv?raw';
import type { AnalysisView, Eigen, MultiplierRow, TableInfo } from './protocol.ts';

export const SAMPLE_FILE = 'fernhollow-county.csv';

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
  analysis: AnalysisView;
  avail: Availability;
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

function analyse(t: IOTable, pm: PreparedModel): { analysis: AnalysisView; avail: Availability } {
  const { n, A, sectors } = pm.coef;
  const notes: string[] = [];
  const pr = perronRoot(A, n);
  const hs = hawkinsSimon(A, n, pm.openLU);
  const productive = pr.upper < 1 ? true : pr.lower >= 1 ? false : hs.holds && !hs.nearZero;
  const open: Availability['open'] = pm.openLU.singular
    ? 'I − A is singular: the Leontief inverse does not exist'
    : productive ? true : 'the table is not productive (Perron root ≥ 1): the Leontief inverse is not a sum of spending rounds';
  let closed: Availability['closed'] = true;
  if (!pm.closed) closed = 'the table has no household income row or no household consumption column';
  else if (!pm.border) closed = 'the open model cannot be solved';
  else if (!(pm.border.s > 0)) closed = 'the household-closed model is not productive (households re-spend more than they earn)';
  const avail: Availability = { open, closed };

  const m = computeMultipliers(pm, avail);
  const link = computeLinkages(pm, m.output.typeI, avail);
  for (const note of [...m.notes, ...link.notes]) {
    const where = note.sectors === 'all' ? 'all sectors' : note.sectors.map((j) => sectors[j]).slice(0, 5).join(', ');
    notes.push(`${note.measure} (${where}): ${note.reason}`);
  }
  const key = new Set(link.keySectors);
  const at = (v: Values, j: number): number | null => finite(v[j]);
  const rows: MultiplierRow[] = sectors.map((sector, j) => {
    const b = at(link.backward, j) ?? 0, f = at(link.forward, j) ?? 0;
    return {
      sector, index: j,
      output: at(m.output.typeI, j) ?? Number.NaN,
      outputII: at(m.output.typeII, j),
      income: at(m.income.simple, j) ?? Number.NaN,
      incomeII: at(m.income.total, j),
      incomeRatioI: at(m.income.typeI, j),
      incomeRatioII: at(m.income.typeII, j),
      valueAdded: at(m.valueAdded.simple, j) ?? Number.NaN,
      valueAddedII: at(m.valueAdded.total, j),
      employment: at(m.employment.simple, j),
      employmentII: at(m.employment.total, j),
      backward: b, forward: f,
      linkage: key.has(j) ? 'key' : b > 1 ? 'backward' : f > 1 ? 'forward' : 'weak',
    };
  });

  let spec: Eigen[] = [];
  let spectrumNote: string | undefined;
  if (n <= SPECTRUM_MAX_SECTORS) {
    spec = spectrum(A, n).map((e) => ({ re: e.re, im: e.im, modulus: e.modulus, behaviour: BEHAVIOUR[e.kind] }));
  } else {
    spectrumNote = `The full spectrum is computed for tables up to ${SPECTRUM_MAX_SECTORS} sectors; this one has ${n}. The Perron root and its bounds are shown.`;
  }

  // Spending rounds for one unit of final demand in every sector.
  let rounds: AnalysisView['rounds'] = [];
  let rounds99: AnalysisView['rounds99'] = { value: null, reason: open === true ? 'not reached within 200 rounds' : open };
  if (open === true) {
    const f = new Float64Array(n).fill(1);
    const r = spendingRounds(pm, f, solveOpen(pm, f), { maxRounds: 200 });
    let total = 0;
    for (const v of r.roundTotals) total += v;
    let cum = 0;
    rounds = r.roundTotals.slice(0, 40).map((v, k) => {
      cum += v;
      return { round: k, added: v, cumulative: cum / (total || 1) };
    });
    const reach = r.reach.find((x) => x.target === 0.99);
    if (reach?.rounds != null) rounds99 = { value: reach.rounds };
  }

  const rho = finite(pr.root);
  let say: string;
  const detail: string[] = [];
  if (productive === true) {
    say = 'Every round of spending is smaller than the last: the table is productive.';
    detail.push(`Each round of inter-industry purchases is at most ${pct(pr.upper)} of the one before (the Perron root), so the rounds add up to a finite total — the Leontief inverse.`);
  } else if (productive === false) {
    say = 'Spending rounds do not die out: the table is not productive.';
    detail.push(`The Perron root is at least ${pr.lower.toFixed(4)}: some sectors need more than a dollar of local inputs per dollar of output. Check the units and the roles of the rows and columns.`);
  } else {
    say = 'The table is at the edge of productivity; results would rest on rounding.';
    detail.push('The Perron root is within rounding of 1. Check the table before using its results.');
  }
  detail.push(hs.holds
    ? 'Hawkins–Simon condition holds: every leading principal minor of I − A is positive.'
    : `Hawkins–Simon condition fails at sector '${sectors[hs.firstFailing?.sector ?? 0] ?? '?'}' (minor of order ${hs.firstFailing?.order ?? '?'}).`);
  const reducible = pr.blocks.length > 1;
  if (reducible) detail.push(`The table is reducible: the sectors fall into ${pr.blocks.length} groups that do not all buy from each other (see Table).`);

  let sumI = 0, sumII = 0, countII = 0;
  for (const r of rows) {
    sumI += Number.isFinite(r.output) ? r.output : 0;
    if (r.outputII !== null) { sumII += r.outputII; countII++; }
  }
  const analysis: AnalysisView = {
    verdict: { productive, say, detail },
    perron: { value: rho, lower: finite(pr.lower), upper: finite(pr.upper), ...(pr.converged ? {} : { reason: 'the iteration stopped before the bounds met; they are still certified' }) },
    hawkinsSimon: hs.holds,
    rounds99,
    rounds,
    spectrum: spec,
    ...(spectrumNote ? { spectrumNote } : {}),
    blocks: pr.blocks.map((b) => ({ sectors: b.sectors.map((j) => sectors[j]!), cyclic: b.cyclic, period: b.period })),
    reducible,
    multipliers: rows,
    hasTypeII: closed === true,
    meanOutput: n ? sumI / n : Number.NaN,
    meanOutputII: countII === n && n > 0 ? sumII / n : null,
    notes,
  };
  return { analysis, avail };
}

function pct(v: number): string {
  return `${(v * 100).toFixed(1)} %`;
}

function load(t: IOTable, fileName: string): { table: TableInfo; analysis: AnalysisView } {
  const pm = prepareModel(t);
  const { analysis, avail } = analyse(t, pm);
  state = { table: t, pm, analysis, avail };
  return { table: tableInfo(t, fileName), analysis };
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
  balance: { sector: string; inputs: number; output: number; gap: number; relative: number }[];
  balanced: boolean;
  warnings: string[];
  /** Why the file, as it stands, would be refused (located), or null. */
  refusal: string | null;
}

const ROW_ROLES = ['labourIncome', 'otherValueAdded', 'imports', 'employment', 'totalInput', 'ignore'] as const;
const COLUMN_ROLES = ['householdConsumption', 'otherFinalDemand', 'totalOutput', 'ignore'] as const;

function firstCells(text: string): string[][] {
  return text.split(/\r?\n/).filter((l) => l.trim() !== '').slice(0, 12).map((l) => l.split(/[,;\t]/).slice(0, 10));
}

function previewTable(src: TableSource): PreviewView {
  const base = { fileName: src.fileName, rowRoles: ROW_ROLES, columnRoles: COLUMN_ROLES, cells: firstCells(src.text) };
  try {
    const t = importTable(src.text, importOptions(src));
    const balance = t.sectors.map((sector, j) => {
      let inputs = 0;
      for (let i = 0; i < t.n; i++) inputs += t.Z[i * t.n + j]!;
      for (const v of [...t.labourIncome, ...t.otherValueAdded, ...t.imports]) inputs += v.values[j]!;
      const output = t.x[j]!;
      const gap = inputs - output;
      return { sector, inputs, output, gap, relative: output !== 0 ? gap / output : 0 };
    }).sort((a, b) => Math.abs(b.relative) - Math.abs(a.relative));
    return {
      ...base,
      layout: t.layout,
      sectors: t.sectors,
      rows: Object.entries(t.roles.rows).map(([label, role]) => ({ label, role })),
      columns: Object.entries(t.roles.columns).map(([label, role]) => ({ label, role })),
      balance: balance.slice(0, 8),
      balanced: balance.every((b) => Math.abs(b.relative) <= 0.001),
      warnings: t.warnings.map((w) => formatLocated(w)),
      refusal: null,
    };
  } catch (e) {
    if (!isInputError(e)) throw e;
    return { ...base, layout: src.layout ?? 'matrix', sectors: [], rows: [], columns: [], balance: [], balanced: false, warnings: [], refusal: formatLocated(e) };
  }
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

function runScenario(args: { scenario: ScenarioDraft; closure: boolean }): ScenarioView {
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
  const { pm } = current();
  const r = engineRunScenario(pm, scenarioOf(args.scenario));
  const dest = pm.coef.sectors.indexOf(args.sector);
  if (dest < 0) throw new Error(`unknown sector '${args.sector}'`);
  const model = args.closure && pm.closed ? 'closed' : 'open';
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
    if (current().avail.open !== true) throw new Error(String(current().avail.open));
    // L column by column: one solve per column, only when the user asks for the grid.
    values = new Float64Array(n * n);
    const e = new Float64Array(n);
    for (let j = 0; j < n; j++) {
      e.fill(0);
      e[j] = 1;
      const col = solveOpen(pm, e);
      for (let i = 0; i < n; i++) values[i * n + j] = col[i]!;
    }
  }
  let max = 0;
  for (let k = 0; k < values.length; k++) if (values[k]! > max) max = values[k]!;
  return { which: args.which, n, sectors: pm.coef.sectors, values, max };
}

// ---- reports ----

export type ReportKind = 'multipliers' | 'linkages' | 'coefficients' | 'scenario';

function meta(title: string, modelType: string, notes: string[] = []): Parameters<typeof reportFiles>[1] {
  const { table } = current();
  return { title, tableName: table.name, modelType, date: new Date().toISOString(), moneyUnit: table.moneyUnit, notes };
}

function report(args: { kind: ReportKind; scenario?: ScenarioDraft; closure?: boolean }): ReportFile[] {
  const { analysis, pm, table } = current();
  const unit = table.moneyUnit;
  if (args.kind === 'multipliers') {
    const rows: Cell[][] = [[
      'sector', 'output Type I', 'output Type II', `income simple (${unit} per ${unit})`, `income total Type II (${unit} per ${unit})`,
      'income Type I', 'income Type II', `value added simple (${unit} per ${unit})`, `value added total (${unit} per ${unit})`,
      `employment simple (jobs per ${unit})`, `employment total (jobs per ${unit})`,
    ]];
    for (const r of analysis.multipliers) {
      rows.push([r.sector, finite(r.output), r.outputII, finite(r.income), r.incomeII, r.incomeRatioI, r.incomeRatioII, finite(r.valueAdded), r.valueAddedII, r.employment, r.employmentII]);
    }
    return reportFiles('multipliers', meta('Multipliers by sector', 'open (Type I) and household-closed (Type II)', analysis.notes), rows);
  }
  if (args.kind === 'linkages') {
    const rows: Cell[][] = [['sector', 'backward linkage (index)', 'forward linkage (index)', 'class']];
    for (const r of analysis.multipliers) rows.push([r.sector, r.backward, r.forward, r.linkage]);
    return reportFiles('linkages', meta('Backward and forward linkages (Rasmussen)', 'open (Type I)'), rows);
  }
  if (args.kind === 'coefficients') {
    const n = pm.coef.n;
    const rows: Cell[][] = [['sector (seller \\ buyer)', ...pm.coef.sectors]];
    for (let i = 0; i < n; i++) rows.push([pm.coef.sectors[i]!, ...Array.from(pm.coef.A.subarray(i * n, (i + 1) * n))]);
    return reportFiles('coefficients', meta(`Technical coefficients A (${unit} of input per ${unit} of output)`, 'open'), rows);
  }
  if (!args.scenario) throw new Error('the scenario report needs a scenario');
  const v = runScenario({ scenario: args.scenario, closure: args.closure ?? true });
  const head: Cell[] = ['sector'];
  const vars: [Variable, string][] = [['output', unit], ['valueAdded', unit], ['income', unit], ['employment', 'jobs']];
  for (const [name, u] of vars) {
    if (!v.effects[name]) continue;
    for (const part of ['direct', 'indirect', 'induced', 'total'] as const) {
      if (part === 'induced' && !v.effects[name]!.induced) continue;
      head.push(`${name} ${part} (${u})`);
    }
  }
  const rows: Cell[][] = [head];
  const lineOf = (label: string, get: (e: EffectView, part: 'direct' | 'indirect' | 'induced' | 'total') => number | null): Cell[] => {
    const row: Cell[] = [label];
    for (const [name] of vars) {
      const e = v.effects[name];
      if (!e) continue;
      for (const part of ['direct', 'indirect', 'induced', 'total'] as const) {
        if (part === 'induced' && !e.induced) continue;
        row.push(get(e, part));
      }
    }
    return row;
  };
  v.sectors.forEach((s, i) => rows.push(lineOf(s, (e, p) => (p === 'induced' ? e.induced![i]! : e[p][i]!))));
  rows.push(lineOf('Total', (e, p) => e.totals[p]));
  const lines = args.scenario.lines.map((l) => `${l.kind} ${l.amount} ${unit} in ${l.sector}, local share ${l.localShare}`);
  return reportFiles(`scenario-${slug(args.scenario.name)}`, meta(`Scenario effects: ${args.scenario.name}`, v.closure === 'household' ? 'household-closed (Type II)' : 'open (Type I)', [...lines, ...v.notes]), rows);
}

function slug(s: string): string {
  return s.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'scenario';
}

// ---- the API the UI calls ----

function starter(t: IOTable): ScenarioDraft {
  const s = t.sectors;
  return {
    name: 'New food plant',
    lines: [{ sector: s.find((x) => /food/i.test(x)) ?? s[0] ?? '', amount: 1000, kind: 'final-demand', localShare: 1 }],
  };
}

export const api = {
  loadSample(_: Record<string, never>): { table: TableInfo; analysis: AnalysisView; source: TableSource; starter: ScenarioDraft } {
    const source: TableSource = { text: sampleCsv, fileName: SAMPLE_FILE };
    const t = importTable(sampleCsv, { fileName: SAMPLE_FILE, name: 'Fernhollow County (invented sample)' });
    return { ...load(t, SAMPLE_FILE), source, starter: starter(t) };
  },
  previewTable,
  loadTable(src: TableSource): { table: TableInfo; analysis: AnalysisView } {
    return load(importTable(src.text, importOptions(src)), src.fileName);
  },
  runScenario,
  paths,
  grid,
  report,
};
