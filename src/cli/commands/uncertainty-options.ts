/**
 * The options of the commands that can say how sure their numbers are: --draws N (Monte Carlo bands), --seed, --cv,
 * --cv-file (and, for scenarios, --share-range and --sensitivity with --share-step). The ranges are the engine's own
 * checks (src/uncertainty/settings.ts), so the app refuses the same values with the same words.
 */
import {
  beginStudyBands, cvProblem, defaultUncertaintySettings, deltaRangeProblem, flqOriginOf, DEFAULT_FLQ_DELTA, DEFAULT_MARGIN_STEP, drawsProblem, parseCvCsv, seedProblem, shareRangeProblem,
  visibleText, DEFAULT_CV, DEFAULT_SEED, DEFAULT_SHARE_STEP, VARIABLE_NAMES, VARIABLES,
  type BandsRequest, type BandsRun, type FlqOrigin, type PreparedStudy, type IOTable, type ScenarioBands, type SensitivityResult, type UncertaintyResult, type UncertaintySettings,
} from '../../study/index.ts';
import type { RunContext } from '../command.ts';
import { summaryNumber, textTable } from '../terminal.ts';
import { drawThreadsWorthIt, finishBandsThreaded, startDrawHelpers, stopDrawHelpers } from '../draw-pool.ts';

/**
 * The bands of a request, the draws shared with helper threads when the run is large enough to gain from them (started
 * first, so they load while this thread computes the point estimate).
 */
export async function bandsOf(ps: PreparedStudy, req: BandsRequest, origin: FlqOrigin | null = null): Promise<UncertaintyResult> {
  const helpers = drawThreadsWorthIt(ps.study.table.n, req.settings.draws) ? startDrawHelpers() : [];
  let run: BandsRun;
  try {
    run = beginStudyBands(ps, req, origin);
  } catch (e) {
    await stopDrawHelpers(helpers);
    throw e;
  }
  return (await finishBandsThreaded(run, helpers)).bands;
}

export const UNCERTAINTY_OPTIONS = {
  draws: { type: 'number', value: 'N', help: 'add Monte Carlo bands (5th, 50th, 95th percentiles and mean) from N draws of the table (20–100000; 1000 is usual)', check: drawsProblem },
  seed: { type: 'number', value: 'S', help: `seed of the draws (whole number 0–4294967295, default ${DEFAULT_SEED}): the same seed gives the same bands`, check: seedProblem },
  cv: { type: 'number', value: 'X', help: `coefficient of variation of every coefficient's error (default ${DEFAULT_CV}: 10 %)`, check: cvProblem },
  'cv-file': { type: 'string', value: 'F.csv', help: 'per-cell, per-row or per-column CVs: lines row,column,cv (* for every row or column), applied in order after --cv' },
} as const;

export const SCENARIO_UNCERTAINTY_OPTIONS = {
  ...UNCERTAINTY_OPTIONS,
  'share-range': { type: 'number', value: 'R', help: 'with --draws: also draw each local share uniformly within ± R (0–1, within 0–1)', check: shareRangeProblem },
  sensitivity: { type: 'boolean', help: 'add one-at-a-time sensitivity of the totals: each local share ± the step, the household closure off and on' },
  'share-step': { type: 'number', value: 'X', help: `step of the local shares for --sensitivity (default ${DEFAULT_SHARE_STEP})`, check: (x: number) => (x > 0 && x <= 1 ? null : 'must be a number above 0 and at most 1') },
  'margin-step': { type: 'number', value: 'X', help: `relative step of the margin shares of purchaser-price lines for --sensitivity: × (1 ± X) (default ${DEFAULT_MARGIN_STEP})`, check: (x: number) => (x > 0 && x <= 1 ? null : 'must be a number above 0 and at most 1') },
  'flq-national': { type: 'string', value: 'NATIONAL.csv', help: 'the table is an FLQ estimate (roundwise regionalize --method flq) from this national table: vary FLQ δ (--sensitivity) or draw it (--draws with --delta-range); needs --flq-employment' },
  'flq-employment': { type: 'string', value: 'EMP.csv', help: 'the county employment the FLQ estimate was made with (as for regionalize --employment)' },
  'flq-delta': { type: 'number', value: 'D', help: `the δ the FLQ estimate was made with (default ${DEFAULT_FLQ_DELTA}); the estimate is re-run and must give the table`, check: (x: number) => (x >= 0 && x <= 1 ? null : 'must be a number from 0 to 1') },
  'delta-range': { type: 'string', value: 'LOW,HIGH', help: 'FLQ δ range: the low and high settings of --sensitivity (default δ ± 0.1 within 0–1), and with --draws δ drawn uniformly from it' },
} as const;

interface FlqValues {
  'flq-national'?: string | undefined;
  'flq-employment'?: string | undefined;
  'flq-delta'?: number | undefined;
  'delta-range'?: string | undefined;
}

/** Half-width of the default δ range around the estimate's δ (common practice, no source: FLQ δ is usually tried within about ± 0.1). */
const DEFAULT_DELTA_SPREAD = 0.1;

/**
 * The table's FLQ origin and the δ range, when --flq-national says the table is an FLQ estimate; null otherwise. The
 * estimate is re-run from the files named and must reproduce the table (flqOriginOf refuses it otherwise).
 */
export function flqOf(values: FlqValues, ctx: RunContext, table: IOTable): { origin: FlqOrigin; range: [number, number]; rangeGiven: boolean } | null {
  if (values['flq-national'] === undefined) {
    const stray = (['flq-employment', 'flq-delta', 'delta-range'] as const).find((k) => values[k] !== undefined);
    if (stray) throw ctx.usageError(`--${stray} needs --flq-national NATIONAL.csv`);
    return null;
  }
  if (values['flq-employment'] === undefined) throw ctx.usageError('--flq-national needs --flq-employment EMP.csv');
  const delta = values['flq-delta'] ?? DEFAULT_FLQ_DELTA;
  let range: [number, number] = [Math.max(0, delta - DEFAULT_DELTA_SPREAD), Math.min(1, delta + DEFAULT_DELTA_SPREAD)];
  const given = values['delta-range'];
  if (given !== undefined) {
    const parts = given.split(',').map((x) => Number(x.trim()));
    const why = parts.length === 2 && given.split(',').every((x) => x.trim() !== '') ? deltaRangeProblem(parts as [number, number]) : 'must be two numbers LOW,HIGH with 0 ≤ LOW ≤ HIGH ≤ 1';
    if (why) throw ctx.usageError(`--delta-range ${given} ${why}`);
    range = parts as [number, number];
  }
  const nat = ctx.input(values['flq-national']);
  const emp = ctx.input(values['flq-employment']);
  const origin = flqOriginOf(table, { bytes: nat.bytes, fileName: nat.name }, { bytes: emp.bytes, fileName: emp.name }, delta);
  return { origin, range, rangeGiven: given !== undefined };
}

interface Values {
  draws: number | undefined;
  seed: number | undefined;
  cv: number | undefined;
  'cv-file': string | undefined;
  'share-range'?: number | undefined;
}

/** The Monte Carlo settings asked for, or null without --draws (the other options then refused as a usage mistake). */
export function uncertaintySettingsOf(values: Values, ctx: RunContext): UncertaintySettings | null {
  if (values.draws === undefined) {
    const stray = (['seed', 'cv', 'cv-file', 'share-range'] as const).find((k) => values[k] !== undefined);
    if (stray) throw ctx.usageError(`--${stray} needs --draws N`);
    return null;
  }
  let cvRules: UncertaintySettings['cvRules'] = [];
  let cvFile: string | null = null;
  if (values['cv-file'] !== undefined) {
    const f = ctx.input(values['cv-file']);
    cvRules = parseCvCsv(f.text, f.name);
    cvFile = f.name;
  }
  return defaultUncertaintySettings({
    draws: values.draws,
    ...(values.seed !== undefined ? { seed: values.seed } : {}),
    ...(values.cv !== undefined ? { cv: values.cv } : {}),
    cvRules, cvFile,
    localShareRange: values['share-range'] ?? 0,
  });
}


/** Summary lines of a scenario's bands: each variable's total with its 5th–95th percentile range, named as in reports. */
export function scenarioBandsSummary(r: UncertaintyResult, s: ScenarioBands): string[] {
  const lines = ['', `How sure: Monte Carlo bands from ${r.draws} draws (seed ${r.settings.seed}, CV ${r.settings.cv}${r.settings.cvFile ? ` and ${visibleText(r.settings.cvFile)}` : ''}); ${r.accepted} accepted, ${r.rejected} left out.`];
  const rows = VARIABLES.flatMap((v) => {
    const b = s.totals[v];
    return b ? [[VARIABLE_NAMES[v], ...[b.point, b.p5, b.p50, b.p95, b.mean].map(summaryNumber)]] : [];
  });
  lines.push(textTable(['', 'point', 'p5', 'p50', 'p95', 'mean'], rows));
  for (const n of r.notes.slice(2)) lines.push(visibleText(n));
  return lines;
}

/** Summary lines of the multipliers' bands: output Type I and II per sector with their 5th–95th percentile range. */
export function multiplierBandsSummary(r: UncertaintyResult): string[] {
  const lines = ['', `How sure: Monte Carlo bands from ${r.draws} draws (seed ${r.settings.seed}, CV ${r.settings.cv}${r.settings.cvFile ? ` and ${visibleText(r.settings.cvFile)}` : ''}); ${r.accepted} accepted, ${r.rejected} left out.`];
  const keys = ['output.typeI', 'output.typeII'] as const;
  const cols = keys.map((k) => r.multipliers?.find((m) => m.key === k)?.values ?? null);
  const width = Math.min(28, Math.max(6, ...r.sectors.map((s) => visibleText(s).length)));
  const pad = (s: string) => (s.length > width ? s.slice(0, width - 1) + '…' : s.padEnd(width));
  lines.push([pad('sector'), ...keys.map((k) => `${k === 'output.typeI' ? 'output Type I' : 'output Type II'} [p5, p95]`.padStart(30))].join(' '));
  r.sectors.forEach((s, j) => {
    lines.push([pad(visibleText(s)), ...cols.map((c) => {
      const b = c?.[j];
      return (b ? `${b.point.toFixed(4)} [${b.p5.toFixed(4)}, ${b.p95.toFixed(4)}]` : 'n/a').padStart(30);
    })].join(' '));
  });
  for (const n of r.notes.slice(2)) lines.push(visibleText(n));
  return lines;
}

/** Summary lines of the sensitivity: assumptions by swing in total output. */
export function sensitivitySummary(s: SensitivityResult, moneyUnit: string): string[] {
  const lines = ['', `Sensitivity of total output (${visibleText(moneyUnit)}), one assumption at a time, largest swing first:`];
  lines.push(`${'swing'.padStart(12)}${'at low'.padStart(14)}${'at high'.padStart(14)}  assumption (low → high)`);
  for (const it of s.items) {
    lines.push(`${summaryNumber(it.swing.output).padStart(12)}${summaryNumber(it.low.totals.output).padStart(14)}${summaryNumber(it.high.totals.output).padStart(14)}  ${visibleText(it.assumption)} (${visibleText(it.low.setting)} → ${visibleText(it.high.setting)}; as typed ${visibleText(it.base)})`);
  }
  return lines;
}
