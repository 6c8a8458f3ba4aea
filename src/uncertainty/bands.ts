/**
 * From draws to bands: the 5th, 50th and 95th percentiles and the mean of every quantity over the accepted draws,
 * beside the point estimate (which stays the headline: a band never replaces it).
 */
import type { Variable } from '../scenario/index.ts';
import { bandOf, type Band } from './quantiles.ts';
import { DRAW_STATUS, type DrawChunk, type DrawPlan, type MultiplierKey, type Part } from './draws.ts';
import type { UncertaintySettings } from './settings.ts';

/** A band with the point estimate beside it. */
export interface PointBand extends Band {
  point: number;
}

export interface ScenarioBands {
  scenario: string;
  /**
   * Total effect of each variable drawn (null: not defined, e.g. jobs without an employment row); taxes and
   * full-time equivalents only when the table has those rows (`bandVariables`).
   */
  totals: Partial<Record<Variable, PointBand | null>>;
  /** Direct, indirect and induced effects of each variable drawn (induced null without the household closure). */
  parts: Partial<Record<Variable, Record<Exclude<Part, 'total'>, PointBand | null>>>;
  /** Total effect per sector on output and jobs (jobs null without an employment row). */
  bySector: { output: (PointBand | null)[]; employment: (PointBand | null)[] | null };
}

export interface Rejections {
  notProductive: number;
  closedNotUsable: number;
  refused: number;
}

export interface UncertaintyResult {
  settings: UncertaintySettings;
  sectors: string[];
  draws: number;
  accepted: number;
  rejected: number;
  rejectedWhy: Rejections;
  /** Every multiplier per sector; null when multipliers were not drawn. */
  multipliers: { key: MultiplierKey; values: (PointBand | null)[] }[] | null;
  scenarios: ScenarioBands[];
  /** Range of the FLQ δ actually drawn over the accepted draws, when δ was drawn. */
  deltaDrawn: [number, number] | null;
  /** How many draws (accepted or not) re-estimated the table at a drawn FLQ δ; 0 when δ was not drawn. */
  deltaDraws: number;
  /** What a reader must know beside the bands (rejections, few draws, what was perturbed). */
  notes: string[];
}

/** Below this many accepted draws no band is given. */
export const MIN_ACCEPTED = 20;
/** Above this share of rejected draws the bands are conditional on a table that often is not productive: warned. */
export const REJECTED_WARNING_SHARE = 0.05;

/** The chunks of one run in draw order, checked to cover 0 … draws − 1 exactly once. */
function ordered(chunks: readonly DrawChunk[], draws: number): DrawChunk[] {
  const sorted = [...chunks].sort((a, b) => a.from - b.from);
  let next = 0;
  for (const c of sorted) {
    if (c.from !== next) throw new Error(`draw chunks do not cover the draws (expected ${next}, got ${c.from})`);
    next = c.to;
  }
  if (next !== draws) throw new Error(`draw chunks end at ${next}, not ${draws}`);
  return sorted;
}

export function summarise(plan: DrawPlan, point: Float64Array, chunks: readonly DrawChunk[]): UncertaintyResult {
  const { setup, layout } = plan;
  const settings = setup.settings;
  const all = ordered(chunks, settings.draws);
  const why: Rejections = { notProductive: 0, closedNotUsable: 0, refused: 0 };
  const rows: Float64Array[] = [];
  let dLo = Infinity;
  let dHi = -Infinity;
  let deltaDraws = 0;
  for (const c of all) {
    for (let i = 0; i < c.to - c.from; i++) {
      const s = c.status[i];
      if (!Number.isNaN(c.delta[i]!)) deltaDraws++;
      if (s === DRAW_STATUS.accepted) {
        rows.push(c.values.subarray(i * layout.size, (i + 1) * layout.size));
        const d = c.delta[i]!;
        if (!Number.isNaN(d)) { dLo = Math.min(dLo, d); dHi = Math.max(dHi, d); }
      } else if (s === DRAW_STATUS.notProductive) why.notProductive++;
      else if (s === DRAW_STATUS.closedNotUsable) why.closedNotUsable++;
      else why.refused++;
    }
  }
  const accepted = rows.length;
  const rejected = settings.draws - accepted;
  const enough = accepted >= MIN_ACCEPTED;
  const scratch = new Float64Array(accepted);
  const band = (q: number): PointBand | null => {
    const p = point[q]!;
    if (!enough || Number.isNaN(p)) return null;
    for (let k = 0; k < accepted; k++) {
      const x = rows[k]![q]!;
      if (Number.isNaN(x)) return null;
      scratch[k] = x;
    }
    return { point: p, ...bandOf(scratch) };
  };
  const n = layout.n;
  const vector = (offset: number | null) => (offset === null ? null : Array.from({ length: n }, (_, i) => band(offset + i)));

  const multipliers = setup.multipliers ? layout.multipliers.map(({ key, offset }) => ({ key, values: vector(offset)! })) : null;
  const scenarios = setup.scenarios.map((sc, s): ScenarioBands => {
    const lay = layout.scenarios[s]!;
    const totals = {} as ScenarioBands['totals'];
    const parts = {} as ScenarioBands['parts'];
    for (const v of Object.keys(lay.totals) as Variable[]) {
      totals[v] = band(lay.totals[v].total);
      parts[v] = { direct: band(lay.totals[v].direct), indirect: band(lay.totals[v].indirect), induced: band(lay.totals[v].induced) };
    }
    return { scenario: sc.name, totals, parts, bySector: { output: vector(lay.sectors.output)!, employment: vector(lay.sectors.employment) } };
  });

  const notes = runNotes(plan, accepted, rejected, why);
  return {
    settings, sectors: [...setup.table.sectors], draws: settings.draws, accepted, rejected, rejectedWhy: why,
    multipliers, scenarios, deltaDrawn: dLo <= dHi ? [dLo, dHi] : null, deltaDraws, notes,
  };
}

const pct = (x: number) => `${Math.round(x * 1000) / 10} %`;

function runNotes(plan: DrawPlan, accepted: number, rejected: number, why: Rejections): string[] {
  const s = plan.setup.settings;
  const notes: string[] = [];
  const what = [
    `coefficients perturbed with independent log-normal errors of CV ${s.cv}${s.cvFile ? ` (cells, rows and columns in ${s.cvFile} with their own CV)` : ''}`,
    ...(s.localShareRange > 0 ? [`local shares drawn uniformly within ± ${s.localShareRange} (within 0–1)`] : []),
    ...(plan.tableAt && s.deltaRange ? [`the county table re-estimated at an FLQ δ drawn uniformly from ${s.deltaRange[0]} to ${s.deltaRange[1]}`] : []),
  ];
  notes.push(`Monte Carlo bands from ${s.draws} draws (seed ${s.seed}): ${what.join('; ')}. Each draw recomputes coefficients, the factorisation, the productivity verdict and the household-closed model in full. The bands are the 5th, 50th and 95th percentiles and the mean of the accepted draws; the point estimate stays the study's result.`);
  notes.push('Jobs per unit of output and other value added are not perturbed: their own uncertainty widens jobs and value-added bands further.');
  if (rejected > 0) {
    const parts = [
      why.notProductive ? `${why.notProductive} not productive` : '',
      why.closedNotUsable ? `${why.closedNotUsable} with a household-closed model that is not usable` : '',
      why.refused ? `${why.refused} refused by the scenario (effects not finite)` : '',
    ].filter(Boolean);
    notes.push(`${rejected} of ${s.draws} draws (${pct(rejected / s.draws)}) were left out (${parts.join(', ')}); the bands describe the ${accepted} accepted draws, i.e. tables near this one that remain usable.`);
    if (rejected / s.draws > REJECTED_WARNING_SHARE) {
      notes.push(`Warning: more than ${pct(REJECTED_WARNING_SHARE)} of the draws were left out, so the bands understate the uncertainty: errors this large often make the table unusable. Consider a smaller CV, or treat the table as not reliable at this level of error.`);
    }
  }
  if (accepted < MIN_ACCEPTED) notes.push(`Warning: only ${accepted} draws were accepted (at least ${MIN_ACCEPTED} are needed), so no bands are given.`);
  else if (accepted < 200) notes.push(`Only ${accepted} draws were accepted: the 5th and 95th percentiles rest on a handful of draws each and move noticeably with the seed; 1,000 draws or more are usual.`);
  return notes;
}
