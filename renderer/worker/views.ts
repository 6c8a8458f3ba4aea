/**
 * Shaping the study's results into what the screens show: plain, structured-clone-friendly views, sized for the
 * screen, with null and a reason where a value cannot be computed (never NaN). No engine step is run here: every
 * number comes from the prepared study (src/study).
 */
import {
  formatLocated, linkageClass, matchKey, ROW_ROLES, COLUMN_ROLES, type TablePreview, MEASURES, measureValues, unitDemandRounds, shockInputsOf, studyCoefficientRows, VARIABLES,
  type ModeKind, type PreparedStudy, type ScenarioOutcome, type PhaseOutcome, type Study, type EffectSplit, type EffectTotals, type ScenarioMultiplier,
  type Variable, type PathAnalysis, type TotalsRecord,
} from '../../src/study/index.ts';
import type { LabelledVector } from '../../src/table/index.ts';
import type { AnalysisView, EffectView, Eigen, GridMargin, MultiplierRow, PathsView, PhaseView, PreviewView, ScenarioView, TableInfo, TableSource, TotalsView } from './protocol.ts';

const finite = (v: number | null | undefined): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** Rounds listed on the screens (the reports carry all of them). */
const ROUNDS_SHOWN = 40;

export function tableInfo(study: Study, fileName: string): TableInfo {
  const t = study.table;
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
    mixes: shockInputsOf(study).mixes.map((m) => ({ name: m.name, shares: m.shares.map((x) => ({ sector: x.sector, share: x.share })) })),
    activities: study.activities.map((a) => a.name),
    activitySectors: Object.fromEntries(study.activities.map((a) => [a.name, a.purchases.map((p) => p.sector)])),
    hasTaxes: (t.taxes?.length ?? 0) > 0,
    hasFte: t.fte != null,
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

/**
 * Why Type II is unavailable, in the planner's words, by the engine's one closed-model decision; the engine's own
 * reason, with its bounds, stays in the notes.
 */
const TYPE_II_WHY: Partial<Record<string, string>> = {
  'no-closure': 'the table has no labour income row or no household consumption column, so households cannot be closed',
  'open-not-productive': 'the table itself is not productive, so neither is the model with households closed',
  'not-productive': 'with households closed the model is not productive: households would re-spend more than all they earn locally (see the notes below the table)',
  'within-rounding': 'with households closed the model is on the edge of productivity: households re-spend all they earn locally (see the notes below the table)',
};

/** A measure's name as its column heading shows it. */
function measureName(key: string): string {
  const label = MEASURES.find((m) => m.key === key)?.label ?? (key === 'linkages' ? 'backward and forward linkages' : key);
  return label.charAt(0).toUpperCase() + label.slice(1);
}

export function analysisView(ps: PreparedStudy): AnalysisView {
  const full = ps.analysis;
  const { n, sectors } = full;
  const v = full.viability;
  // Notes name measures as the column headings do ("Output Type II", not the engine's key), one line per reason.
  const grouped = new Map<string, { where: string; reason: string; names: string[] }>();
  for (const note of [...full.multipliers.notes, ...full.linkages.notes]) {
    const where = note.sectors === 'all' ? 'all sectors' : `${note.sectors.map((j) => sectors[j]).slice(0, 5).join(', ')}${note.sectors.length > 5 ? ` and ${note.sectors.length - 5} more` : ''}`;
    const key = `${where}\u0000${note.reason}`;
    const g = grouped.get(key) ?? { where, reason: note.reason, names: [] };
    g.names.push(measureName(note.measure));
    grouped.set(key, g);
  }
  const notes = [...grouped.values()].map((g) => `${g.names.join(', ')} (${g.where}): ${g.reason}`);
  const columns = MEASURES.map((m) => measureValues(full, m.key));
  const multipliers: MultiplierRow[] = sectors.map((sector, j) => ({
    sector, index: j,
    values: Object.fromEntries(MEASURES.map((m, k) => [m.key, finite(columns[k]![j])])) as MultiplierRow['values'],
    linkage: linkageClass(full, j) ?? 'undefined',
  }));
  const ur = unitDemandRounds(ps);
  const reach99 = ur.rounds ? ur.rounds.reach.find((x) => x.target === 0.99)!.round : null;
  const mean = (key: 'output.typeI' | 'output.typeII'): number | null => {
    let s = 0;
    for (const r of multipliers) { const x = r.values[key]; if (x === null) return null; s += x; }
    return n ? s / n : null;
  };
  const [lower, upper] = v.perronRootBounds;
  return {
    verdict: ps.verdict,
    perron: { value: finite(v.perronRoot), lower: finite(lower), upper: finite(upper), ...(v.perronConverged ? {} : { reason: 'the iteration stopped before the bounds met; they are still certified' }) },
    hawkinsSimon: v.hawkinsSimon,
    reach99: ur.rounds
      ? (reach99 === null ? { value: null, reason: `not reached within ${ur.rounds.rounds.length} rounds` } : { value: reach99 })
      : { value: null, reason: ur.reason },
    rounds: ur.rounds ? ur.rounds.roundTotals.slice(0, ROUNDS_SHOWN).map((x, k) => ({ round: k, added: x, reached: ur.rounds.coverage[k]! })) : [],
    spectrum: (v.spectrum ?? []).map((e): Eigen => ({ re: e.re, im: e.im, modulus: e.modulus, behaviour: BEHAVIOUR[e.kind] })),
    ...(v.spectrumNote ? { spectrumNote: v.spectrumNote } : {}),
    blocks: v.blocks.map((b) => ({ sectors: b.sectors.map((j) => sectors[j]!), cyclic: b.period !== null, period: b.period })),
    reducible: !v.irreducible,
    period: v.period,
    roundsToTolerance: v.roundsToTolerance,
    tolerance: v.tolerance,
    perronClosed: finite(v.perronRootClosed),
    condition: finite(full.checks.condition),
    measures: MEASURES.map((m) => ({ key: m.key, label: m.label, unit: m.unit(full.moneyUnit), model: m.model, ...(m.jobsPerMoney ? { jobsPerMoney: true as const } : {}) })),
    multipliers,
    hasTypeII: full.availability.closed === true,
    typeIIReason: full.availability.closed === true ? null : (TYPE_II_WHY[v.closedModel.status] ?? full.availability.closed),
    meanOutput: mean('output.typeI'),
    meanOutputII: mean('output.typeII'),
    notes: [...notes, ...full.warnings.map((w) => formatLocated(w))],
  };
}

function effectView(s: EffectSplit | null, t: EffectTotals | null, m: ScenarioMultiplier | null): EffectView | null {
  if (!s || !t || !m) return null;
  return {
    direct: Array.from(s.direct),
    indirect: Array.from(s.indirect),
    induced: s.induced ? Array.from(s.induced) : null,
    total: Array.from(s.total),
    totals: { direct: t.direct, indirect: t.indirect, induced: t.induced, total: t.total },
    typeI: finite(m.typeI.value),
    typeII: finite(m.typeII.value),
  };
}

function totalsView(rec: TotalsRecord): Partial<Record<Variable, TotalsView | null>> {
  const out: Partial<Record<Variable, TotalsView | null>> = {};
  for (const [v, t] of Object.entries(rec) as [Variable, EffectTotals | null][]) out[v] = t ? { direct: t.direct, indirect: t.indirect, induced: t.induced, total: t.total } : null;
  return out;
}

function phaseView(p: PhaseOutcome): PhaseView {
  const r = p.result;
  const effects = {} as Record<Variable, EffectView | null>;
  for (const v of VARIABLES) effects[v] = effectView(r.effects[v], r.totals[v], r.multipliers[v]);
  const fixed = r.shock.fixed.map((j) => r.sectors[j]!);
  const ot = p.overTime;
  return {
    phase: p.phase.name,
    name: p.label,
    timing: p.phase.timing,
    year: p.phase.year ?? null,
    years: p.phase.years ?? null,
    sectors: r.sectors,
    moneyUnit: r.moneyUnit,
    closure: r.closure,
    inducedReason: r.closure === 'household' ? null : r.multipliers.output.typeII.reason ?? 'no household closure',
    effects,
    net: p.net ? totalsView(p.net.totals) : null,
    outside: r.outside.map((o) => ({ label: o.label, direct: { ...o.direct } })),
    overTime: ot ? { years: ot.years, cumulative: totalsView(ot.cumulative), presentValue: ot.presentValue ? totalsView(ot.presentValue) : null, rate: ot.rate } : null,
    rounds: p.rounds.roundTotals.slice(0, ROUNDS_SHOWN).map((x, k) => ({ round: k, output: x, reached: p.rounds.coverage[k] ?? 0 })),
    reach99: p.rounds.reach.find((x) => x.target === 0.99)?.round ?? null,
    roundsComputed: p.rounds.rounds.length,
    roundZeroFixed: fixed,
    effectiveDemand: Array.from(r.effectiveDemand),
    notes: p.notes,
  };
}

export function scenarioView(o: ScenarioOutcome): ScenarioView {
  return {
    name: o.scenario.name,
    phases: o.phases.map(phaseView),
    byTiming: o.byTiming.map((t) => ({ timing: t.timing, phases: t.phases, totals: totalsView(t.gross) })),
    model: o.model,
  };
}

export function pathsView(p: PathAnalysis): PathsView {
  return {
    destination: p.destinationLabel,
    model: p.model,
    total: p.destinationTotal,
    explainedShare: p.explainedShare,
    truncated: p.truncated,
    paths: p.paths.map((x) => ({ labels: x.labels, contribution: x.contribution, share: x.share, direct: x.direct, pathMultiplier: x.pathMultiplier })),
  };
}

/** Sectors listed in the preview's balance report. */
const BALANCE_SHOWN = 8;

const ROLE_PLURAL: Record<string, string> = {
  labourIncome: 'labour income (compensation of employees)', otherValueAdded: 'other value added', imports: 'imports', employment: 'employment',
  householdConsumption: 'household consumption', otherFinalDemand: 'other final demand',
};

export function previewView(p: TablePreview, src: TableSource): PreviewView {
  const b = p.balance;
  const balance: PreviewView['balance'] = [];
  if (b) {
    const at = (v: number[] | null, j: number): number | null => (v && typeof v[j] === 'number' && Number.isFinite(v[j]) ? v[j]! : null);
    b.sectors.forEach((sector, j) => {
      // The worst of the three comparisons the import makes (finish.ts), with the sums it compared.
      const sides: PreviewView['balance'] = [
        { sector, side: 'sales', sum: at(b.sales, j), against: b.output[j]!, againstName: 'total output', gap: at(b.rowGap, j) ?? 0 },
        { sector, side: 'inputs', sum: at(b.purchases, j), against: at(b.statedTotalInput, j) ?? b.output[j]!, againstName: b.statedTotalInput ? 'total input' : 'total output', gap: at(b.columnGap, j) ?? 0 },
        { sector, side: 'total input', sum: at(b.statedTotalInput, j), against: b.output[j]!, againstName: 'total output', gap: at(b.totalGap, j) ?? 0 },
      ];
      balance.push(sides.reduce((w, x) => (Math.abs(x.gap) > Math.abs(w.gap) ? x : w)));
    });
    balance.sort((x, y) => Math.abs(y.gap) - Math.abs(x.gap));
  }
  const rowKeys = new Map(p.rows.filter((r) => r.role !== 'sector').map((r) => [matchKey(r.label), r.label]));
  const mayBeSectors = p.columns.filter((c) => c.role !== 'sector' && rowKeys.has(matchKey(c.label))).map((c) => rowKeys.get(matchKey(c.label))!);
  const chosen = new Set((src.roles?.sectors ?? []).map(matchKey));
  const combined: string[] = [];
  const group = (xs: { label: string; role: string }[], axis: 'rows' | 'columns') => {
    const by = new Map<string, string[]>();
    for (const x of xs) if (ROLE_PLURAL[x.role]) by.set(x.role, [...(by.get(x.role) ?? []), x.label]);
    for (const [role, labels] of by) {
      if (labels.length > 1) combined.push(`${labels.length} ${axis} are read as ${ROLE_PLURAL[role]} (${labels.map((l) => `'${l}'`).join(', ')}): they are added together${role === 'labourIncome' ? ' into the household income of the Type II model' : role === 'householdConsumption' ? ' into the households’ purchases in the Type II model' : ''}.`);
    }
  };
  group(p.rows, 'rows');
  group(p.columns, 'columns');
  const d = p.dialect;
  return {
    fileName: src.fileName,
    layout: p.layout ?? src.layout ?? 'matrix',
    sectors: p.sectors,
    rows: p.rows.filter((r) => r.role !== 'sector').map((r) => ({ label: r.label, role: r.role })),
    columns: p.columns.filter((c) => c.role !== 'sector').map((c) => ({ label: c.label, role: c.role })),
    rowRoles: ROW_ROLES,
    columnRoles: COLUMN_ROLES,
    mayBeSectors,
    chosenSectors: p.sectors.filter((s) => chosen.has(matchKey(s))),
    dialect: d ? {
      delimiter: d.delimiter, delimiterFrom: d.delimiterFrom, delimiterNote: d.delimiterNote,
      decimalMark: d.decimalMark, decimalMarkFrom: d.decimalMarkFrom, decimalMarkNote: d.decimalMarkNote,
    } : null,
    cells: p.cells,
    balance: balance.slice(0, BALANCE_SHOWN),
    balanced: b?.balanced ?? false,
    tolerance: b?.tolerance ?? 0.001,
    outputSource: b?.outputSource ?? null,
    combined,
    warnings: p.warnings.map((w) => formatLocated(w)),
    refusal: p.refusal?.formatted ?? null,
  };
}

/** Σ over rows of an n×n row-major matrix: one total per column. */
function columnSums(values: Float64Array, n: number): Float64Array {
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) out[j] = out[j]! + values[i * n + j]!;
  return out;
}

/**
 * The rows and columns around the n×n block, as the table has them: for flows, each final-demand column, total final
 * demand and total output on the right, and below the intermediate inputs, each value-added, taxes and imports row,
 * total output, jobs and FTE; for coefficients the same rows per unit of output (the study's coefficient rows); for
 * the Leontief inverse the analysis' Type I output multipliers (its column sums). Other totals are plain sums of what
 * is shown.
 */
export function gridMargins(ps: PreparedStudy, which: 'Z' | 'A' | 'L', values: Float64Array): { below: GridMargin[]; right: GridMargin[] } {
  const { table: t } = ps.study;
  const c = ps.pm.coef;
  const n = c.n;
  const unit = t.moneyUnit;
  if (which === 'L') {
    // The analysis' Type I output multipliers, the numbers the Multipliers screen and report show (null: not defined).
    const typeI = Float64Array.from(ps.analysis.multipliers.output.typeI, (v) => v ?? Number.NaN);
    return { below: [{ label: 'Column sum (Type I output multiplier)', values: typeI, style: 'ratio', note: 'output in every sector per unit of final demand for the column’s sector' }], right: [] };
  }
  if (which === 'A') {
    const below: GridMargin[] = [
      { label: 'Column sum (intermediate inputs)', values: columnSums(values, n), style: 'ratio', note: `intermediate inputs per ${unit} of the column’s output` },
      ...studyCoefficientRows(ps).map((r) => ({ label: r.label, values: r.values, style: 'ratio' as const, note: `${r.what} per ${unit} of output` })),
    ];
    if (c.e) below.push({ label: `Jobs per ${unit} of output`, values: c.e, style: 'ratio', note: 'employment coefficient' });
    if (c.fte) below.push({ label: `FTE per ${unit} of output`, values: c.fte, style: 'ratio', note: 'full-time-equivalent coefficient' });
    return { below, right: [] };
  }
  const rows = (list: LabelledVector[] | undefined, what: string) => (list ?? []).map((v) => ({ label: v.label, values: v.values, what }));
  const vaRows = [...rows(t.labourIncome, 'labour income'), ...rows(t.otherValueAdded, 'other value added'), ...rows(t.taxes, 'taxes less subsidies'), ...rows(t.imports, 'imports')];
  const fd = [...rows(t.householdConsumption, 'household final demand'), ...rows(t.otherFinalDemand, 'final demand')];
  const totalFd = new Float64Array(n);
  for (const f of fd) for (let i = 0; i < n; i++) totalFd[i] = totalFd[i]! + f.values[i]!;
  const right: GridMargin[] = [
    ...fd.map((f) => ({ label: f.label, values: f.values, style: 'money' as const, note: `${f.what}, ${unit}` })),
    ...(fd.length > 1 ? [{ label: 'Total final demand', values: totalFd, style: 'money' as const, note: `sum of the final-demand columns, ${unit}` }] : []),
    { label: 'Total output', values: c.x, style: 'money', note: `each row sector’s total output, ${unit}` },
  ];
  const below: GridMargin[] = [
    { label: 'Intermediate inputs', values: columnSums(values, n), style: 'money', note: `column sum of the flows, ${unit}` },
    ...vaRows.map((r) => ({ label: r.label, values: r.values, style: 'money' as const, note: `${r.what}, ${unit}` })),
    { label: 'Total output', values: c.x, style: 'money', note: `each column sector’s total output, ${unit}` },
  ];
  if (t.employment) below.push({ label: 'Jobs', values: t.employment, style: 'jobs', note: 'employment (headcount), not money' });
  if (t.fte) below.push({ label: 'Full-time equivalents', values: t.fte, style: 'jobs', note: 'full-time equivalents, not money' });
  return { below, right };
}
