/**
 * The bands and the sensitivity as reports (CSV + .about.txt, through src/report) and as plain JSON (the CLI's
 * --json `uncertainty` and `sensitivity` keys). The point estimate is the first number of every row: the bands sit
 * beside it and never replace it.
 */
import { MEASURES, reportFiles, SCENARIO_CAUTIONS, CAUTIONS, unitOf, VARIABLE_NAMES, type Cell, type ReportFile, type SourceOrigin } from '../report/index.ts';
import { VARIABLES, type Variable } from '../scenario/index.ts';
import { PARTS } from './draws.ts';
import type { PointBand, ScenarioBands, UncertaintyResult } from './bands.ts';
import type { SensitivityResult } from './sensitivity.ts';

export interface BandReportContext {
  tableName: string;
  sourceFile?: string;
  sourceHash?: string;
  sourceOrigins?: SourceOrigin[];
  date: string;
  moneyUnit: string;
  /** The model the point estimate used, in words. */
  modelType: string;
}

const BAND_HEADER = ['point estimate', 'p5', 'p50 (median)', 'p95', 'mean of draws'];
const bandCells = (b: PointBand | null): Cell[] => (b ? [b.point, b.p5, b.p50, b.p95, b.mean] : [null, null, null, null, null]);

function meta(ctx: BandReportContext, title: string, notes: string[], cautions: readonly string[]) {
  return {
    title, tableName: ctx.tableName, modelType: ctx.modelType, date: ctx.date, moneyUnit: ctx.moneyUnit,
    ...(ctx.sourceFile !== undefined ? { sourceFile: ctx.sourceFile } : {}),
    ...(ctx.sourceHash !== undefined ? { sourceHash: ctx.sourceHash } : {}),
    ...(ctx.sourceOrigins?.length ? { sourceOrigins: ctx.sourceOrigins } : {}),
    notes: [...notes, ...cautions],
  };
}

/** Every multiplier's band, one row per sector and multiplier (rows where the multiplier is not defined left out). */
export function multiplierBandReport(r: UncertaintyResult, ctx: BandReportContext, base = 'multiplier-bands'): ReportFile[] {
  const rows: Cell[][] = [['sector', 'multiplier', 'unit', ...BAND_HEADER]];
  for (let j = 0; j < r.sectors.length; j++) {
    for (const m of r.multipliers ?? []) {
      const b = m.values[j];
      if (!b) continue;
      const measure = MEASURES.find((x) => x.key === m.key)!;
      rows.push([r.sectors[j]!, measure.label, measure.unit(ctx.moneyUnit), ...bandCells(b)]);
    }
  }
  return reportFiles(base, meta(ctx, 'Multiplier uncertainty bands', r.notes, CAUTIONS), rows);
}

/** A scenario's bands: its totals by variable and part, then each sector's total output and jobs. */
export function scenarioBandReport(r: UncertaintyResult, s: ScenarioBands, ctx: BandReportContext, base: string): ReportFile[] {
  const rows: Cell[][] = [['what', 'sector', 'variable', 'effect', 'unit', ...BAND_HEADER]];
  for (const v of VARIABLES.filter((x) => x in s.totals)) {
    for (const p of PARTS) {
      const b = p === 'total' ? s.totals[v] : s.parts[v]![p];
      if (!b) continue;
      rows.push(['scenario total', null, VARIABLE_NAMES[v], p, unitOf(v, ctx.moneyUnit), ...bandCells(b)]);
    }
  }
  const bySector: [Variable, (PointBand | null)[] | null][] = [['output', s.bySector.output], ['employment', s.bySector.employment]];
  for (const [v, values] of bySector) {
    if (!values) continue;
    values.forEach((b, j) => { if (b) rows.push(['sector total', r.sectors[j]!, VARIABLE_NAMES[v], 'total', unitOf(v, ctx.moneyUnit), ...bandCells(b)]); });
  }
  return reportFiles(base, meta(ctx, `Uncertainty bands of scenario ${s.scenario}`, r.notes, [...CAUTIONS, ...SCENARIO_CAUTIONS]), rows);
}

/** The sensitivity table, sorted by the swing in total output (a tornado chart's order). */
export function sensitivityReport(s: SensitivityResult, ctx: BandReportContext, base: string): ReportFile[] {
  const header: Cell[] = ['rank', 'assumption', 'as typed', 'low setting', 'high setting'];
  for (const v of VARIABLES) header.push(`${VARIABLE_NAMES[v]} at low (${unitOf(v, ctx.moneyUnit)})`, `${VARIABLE_NAMES[v]} at high (${unitOf(v, ctx.moneyUnit)})`, `${VARIABLE_NAMES[v]} swing (${unitOf(v, ctx.moneyUnit)})`);
  const rows: Cell[][] = [header];
  rows.push([0, 'point estimate (every assumption as typed)', null, null, null, ...VARIABLES.flatMap((v) => [s.point[v], s.point[v], 0])]);
  s.items.forEach((it, k) => {
    rows.push([k + 1, it.assumption, it.base, it.low.setting, it.high.setting, ...VARIABLES.flatMap((v) => [it.low.totals[v], it.high.totals[v], it.swing[v]])]);
  });
  const why = s.items.flatMap((it) => [it.low, it.high].filter((x) => x.why).map((x) => `${it.assumption} at ${x.setting}: no totals (${x.why}).`));
  return reportFiles(base, meta(ctx, `Sensitivity of scenario ${s.scenario}`, [...s.notes, ...why], [...CAUTIONS, ...SCENARIO_CAUTIONS]), rows);
}

const bandJson = (b: PointBand | null) => (b ? { point: b.point, p5: b.p5, p50: b.p50, p95: b.p95, mean: b.mean } : null);

/** The run's settings and rejections (every `uncertainty` object starts with these). */
function headJson(r: UncertaintyResult): Record<string, unknown> {
  const s = r.settings;
  return {
    draws: r.draws, seed: s.seed, cv: s.cv, ...(s.cvFile ? { cvFile: s.cvFile } : {}), localShareRange: s.localShareRange,
    ...(s.deltaRange ? { deltaRange: s.deltaRange } : {}), ...(r.deltaDraws ? { deltaDraws: r.deltaDraws } : {}), ...(r.deltaDrawn ? { deltaDrawn: r.deltaDrawn } : {}),
    accepted: r.accepted, rejected: r.rejected, rejectedWhy: { ...r.rejectedWhy },
  };
}

/** `uncertainty` of analyze --json: every multiplier, one band (or null) per sector in sector order. */
export function multiplierBandsJson(r: UncertaintyResult): Record<string, unknown> {
  const multipliers: Record<string, unknown> = {};
  for (const m of r.multipliers ?? []) multipliers[m.key] = m.values.map(bandJson);
  return { ...headJson(r), sectors: r.sectors, multipliers, notes: r.notes };
}

/** `uncertainty` of scenario --json: totals per variable, their parts, and per-sector output and jobs. */
export function scenarioBandsJson(r: UncertaintyResult, s: ScenarioBands): Record<string, unknown> {
  const totals: Record<string, unknown> = {};
  const parts: Record<string, unknown> = {};
  for (const v of VARIABLES.filter((x) => x in s.totals)) {
    totals[v] = bandJson(s.totals[v] ?? null);
    const pv = s.parts[v]!;
    parts[v] = { direct: bandJson(pv.direct), indirect: bandJson(pv.indirect), induced: bandJson(pv.induced) };
  }
  return {
    ...headJson(r), totals, parts,
    sectors: { labels: r.sectors, output: s.bySector.output.map(bandJson), employment: s.bySector.employment ? s.bySector.employment.map(bandJson) : null },
    notes: r.notes,
  };
}

export function sensitivityJson(s: SensitivityResult): Record<string, unknown> {
  return {
    step: s.step, ...(s.marginStep !== null ? { marginStep: s.marginStep } : {}), point: s.point,
    items: s.items.map((it) => ({ kind: it.kind, assumption: it.assumption, base: it.base, low: { ...it.low }, high: { ...it.high }, swing: it.swing })),
    notes: s.notes,
  };
}
