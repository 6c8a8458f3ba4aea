/**
 * The worker's side of the "How sure?" panel: Monte Carlo bands taken a range of draws per call (so the UI shows
 * progress and can stop between calls while the worker stays the only place that computes), and the one-at-a-time
 * sensitivity of a scenario. Every number comes from src/study (beginStudyBands, studySensitivity), the functions the
 * CLI's --draws and --sensitivity use, so the same seed gives the same bands in both. Views are plain and finite.
 */
import {
  beginStudyBands, checkUncertaintySettings, defaultUncertaintySettings, flqOriginOf, MEASURES, readyLines, studySensitivity, unitOf, utf8Bytes, VARIABLE_NAMES, VARIABLES,
  type BandsRun, type HowSure, type IOTable, type PointBand, type PreparedStudy, type UncertaintyResult, type Variable,
} from '../../src/study/index.ts';
import type { BandColumns, BandSettings, BandView, BandsView, FlqInputs, ScenarioDraft, SensitivityView, StudyChoices } from './protocol.ts';

/** A variable as the reports name it (VARIABLE_NAMES), capitalised to head a row. */
const variableLabel = (v: Variable) => VARIABLE_NAMES[v].charAt(0).toUpperCase() + VARIABLE_NAMES[v].slice(1);

function band(b: PointBand | null): BandView | null {
  return b ? { point: b.point, p5: b.p5, p50: b.p50, p95: b.p95, mean: b.mean } : null;
}

function columns(bands: readonly (PointBand | null)[]): BandColumns {
  const n = bands.length;
  const c: BandColumns = { point: new Float64Array(n), p5: new Float64Array(n), p50: new Float64Array(n), p95: new Float64Array(n), mean: new Float64Array(n) };
  bands.forEach((b, j) => {
    c.point[j] = b ? b.point : Number.NaN;
    c.p5[j] = b ? b.p5 : Number.NaN;
    c.p50[j] = b ? b.p50 : Number.NaN;
    c.p95[j] = b ? b.p95 : Number.NaN;
    c.mean[j] = b ? b.mean : Number.NaN;
  });
  return c;
}

export function bandsView(r: UncertaintyResult, target: BandsView['target'], moneyUnit: string): BandsView {
  const s = r.scenarios[0] ?? null;
  return {
    target,
    draws: r.draws, accepted: r.accepted, rejected: r.rejected, rejectedWhy: { ...r.rejectedWhy },
    seed: r.settings.seed, cv: r.settings.cv, localShareRange: r.settings.localShareRange,
    delta: r.settings.deltaRange ? { range: [...r.settings.deltaRange], draws: r.deltaDraws, drawn: r.deltaDrawn ? [...r.deltaDrawn] : null } : null,
    sectors: r.sectors,
    notes: r.notes,
    multipliers: r.multipliers ? r.multipliers.map((m) => {
      const measure = MEASURES.find((x) => x.key === m.key)!;
      return { key: m.key, label: measure.label, unit: measure.unit(moneyUnit), values: columns(m.values) };
    }) : null,
    totals: s ? VARIABLES.map((v) => ({ variable: v, label: variableLabel(v), unit: unitOf(v, moneyUnit), band: band(s.totals[v] ?? null) })) : null,
    sectorOutput: s ? columns(s.bySector.output) : null,
    sectorJobs: s && s.bySector.employment ? columns(s.bySector.employment) : null,
    moneyUnit,
  };
}

/**
 * The bands and sensitivity last computed for each table, closure and scenario (null: the multipliers), so the brief
 * and the workbook include them exactly when they belong to what is exported.
 */
export function howSureMemory() {
  const byTable = new WeakMap<IOTable, Map<string, HowSure>>();
  const key = (ps: PreparedStudy, scenario: ScenarioDraft | null) =>
    JSON.stringify([ps.study.settings.closure, scenario ? [scenario.name, readyLines(scenario).phases] : null]);
  const slot = (ps: PreparedStudy, scenario: ScenarioDraft | null): HowSure => {
    let m = byTable.get(ps.study.table);
    if (!m) byTable.set(ps.study.table, (m = new Map()));
    const k = key(ps, scenario);
    let h = m.get(k);
    if (!h) m.set(k, (h = {}));
    return h;
  };
  return {
    rememberBands(ps: PreparedStudy, scenario: ScenarioDraft | null, r: UncertaintyResult) { slot(ps, scenario).bands = r; },
    rememberSensitivity(ps: PreparedStudy, scenario: ScenarioDraft, s: NonNullable<HowSure['sensitivity']>) { slot(ps, scenario).sensitivity = s; },
    of(ps: PreparedStudy, scenario: ScenarioDraft | null): HowSure {
      return byTable.get(ps.study.table)?.get(key(ps, scenario)) ?? {};
    },
  };
}
export type HowSureMemory = ReturnType<typeof howSureMemory>;

/** FLQ inputs and a δ range as the panel sends them. */
export interface FlqRequest {
  inputs: FlqInputs;
  range: [number, number];
}

/**
 * The table's FLQ origin from the inputs the Larger-table screen kept: flqOriginOf re-runs the estimate and refuses a
 * table it does not reproduce, as the CLI's --flq-national/--flq-employment/--flq-delta are refused.
 */
function originOf(ps: PreparedStudy, inputs: FlqInputs) {
  const file = (f: FlqInputs['national']) => ({ bytes: utf8Bytes(f.text), fileName: f.fileName });
  return flqOriginOf(ps.study.table, file(inputs.national), file(inputs.employment), inputs.delta);
}

/** The operations, given the worker's way to the study as the screens have it now. */
export function uncertaintyApi(studyAt: (choices: StudyChoices, scenarios?: ScenarioDraft[]) => PreparedStudy, memory: HowSureMemory = howSureMemory()) {
  let run: { id: number; bands: BandsRun; target: BandsView['target']; moneyUnit: string; ps: PreparedStudy; scenario: ScenarioDraft | null } | null = null;
  let lastId = 0;
  /** The run a step belongs to: a panel whose run was replaced by a newer one (another screen's) is told so. */
  const runOf = (id: number) => {
    if (!run || run.id !== id) throw new Error('these bands were replaced by a newer computation; compute them again');
    return run;
  };
  return {
    /**
     * Check the settings, compute the point estimate and plan the draws; the draws follow with bandsStep. With `flq`
     * every draw re-estimates the table at a δ drawn uniformly in `flq.range`, as the CLI's --draws with --delta-range.
     */
    bandsStart(args: { choices: StudyChoices; settings: BandSettings; scenario: ScenarioDraft | null; flq?: FlqRequest | null }): { id: number; total: number } {
      const settings = defaultUncertaintySettings({ ...args.settings, deltaRange: args.flq ? [...args.flq.range] : null });
      checkUncertaintySettings(settings);
      const ps = studyAt(args.choices);
      const scenarios = args.scenario ? [readyLines(args.scenario)] : [];
      const origin = args.flq ? originOf(ps, args.flq.inputs) : null;
      run = { id: ++lastId, bands: beginStudyBands(ps, { settings, multipliers: !args.scenario, scenarios }, origin), target: args.scenario ? 'scenario' : 'multipliers', moneyUnit: ps.study.table.moneyUnit, ps, scenario: args.scenario };
      return { id: run.id, total: run.bands.total };
    },
    bandsStep(args: { id: number; from: number; to: number }): { done: number } {
      runOf(args.id).bands.step(args.from, args.to);
      return { done: args.to };
    },
    bandsFinish(args: { id: number }): BandsView {
      const r = runOf(args.id);
      const result = r.bands.finish();
      memory.rememberBands(r.ps, r.scenario, result);
      run = null;
      return bandsView(result, r.target, r.moneyUnit);
    },
    /**
     * With `flq` (the table in use is the plain FLQ estimate of those inputs, as the Larger-table screen made it) FLQ δ
     * is varied over `range` too, after flqOriginOf has checked the estimate is this table (refused otherwise, as the
     * CLI's --flq-national/--flq-employment/--flq-delta are).
     */
    sensitivity(args: { choices: StudyChoices; scenario: ScenarioDraft; step: number; flq?: FlqRequest | null }): SensitivityView {
      const ps = studyAt(args.choices);
      const flq = args.flq ? { origin: originOf(ps, args.flq.inputs), range: args.flq.range } : null;
      const all = studySensitivity(ps, args.scenario, args.step, { flq });
      memory.rememberSensitivity(ps, args.scenario, all);
      const s = all[0]!; // the first phase (the panel shows one phase's sensitivity; the workbook has every phase's)
      return {
        scenario: s.scenario, step: s.step, point: s.point, notes: s.notes, moneyUnit: ps.study.table.moneyUnit,
        items: s.items.map((it) => ({
          kind: it.kind, assumption: it.assumption, base: it.base,
          low: { setting: it.low.setting, totals: it.low.totals, why: it.low.why ?? null },
          high: { setting: it.high.setting, totals: it.high.totals, why: it.high.why ?? null },
          swing: it.swing,
        })),
      };
    },
  };
}
