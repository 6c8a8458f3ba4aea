/**
 * How an estimated county table compares with the table it came from, so an implausible estimate is never used
 * without a word. The yardstick is the average Type I output multiplier (column sums of (I − A)⁻¹, Miller & Blair
 * 2009, ch. 6) over the sectors present in the county:
 * - against the national table: location quotients only ever lower coefficients (r_ij ≤ a_ij), so every county
 *   multiplier is at most the national one (L = Σ A^k is monotone in A ≥ 0); the note says how much of the national
 *   indirect effect (multiplier − 1) the estimate keeps;
 * - against a plausible range for a county, 1.2–2.5 (common practice, no source; published county Type I output
 *   multipliers mostly lie between about 1.2 and 2, recalled from memory). Below it the estimate sends nearly all
 *   local purchasing out of the county — FLQ with a very small county share of national jobs does this, since
 *   λ* = log₂(1 + E^R/E^N)^δ is then small; above it the estimate keeps implausibly much local (SLQ and CILQ are known
 *   to understate regional imports, the reason FLQ was proposed: Flegg, Webber & Elliott 1995, recalled from memory).
 */
import type { Warning } from '../diagnostics/index.ts';
import { coefficients, decideModels, prepareModel, solveOpenTransposed } from '../model/index.ts';
import type { IOTable } from '../table/index.ts';

/** Plausible average Type I output multiplier of a county table (common practice, no source; see the file comment). */
export const COUNTY_TYPE_I_RANGE: readonly [number, number] = [1.2, 2.5];

export interface EstimateComparison {
  /** Average Type I output multiplier over the sectors present in the county; null when that table is not productive. */
  nationalAverageTypeI: number | null;
  estimateAverageTypeI: number | null;
  /** (estimate − 1) / (national − 1): the share of the national indirect effect the estimate keeps; null when undefined. */
  indirectShareKept: number | null;
  plausibleRange: [number, number];
  /** Whether the estimate's average lies in the plausible range; null when it could not be computed. */
  plausible: boolean | null;
  /** Sectors the averages are taken over (present in the county). */
  sectors: number;
  /** One sentence with the numbers, for notes. */
  note: string;
}

/**
 * Type I output multipliers (column sums of L), or why there are none: the model layer's one verdict on the table
 * (decideModels, as the analysis and the study's judgement of the estimate make it), never a test of its own.
 */
function typeIOutput(t: IOTable): { m: Float64Array | null; why: string | null } {
  const pm = prepareModel(t, coefficients(t));
  const open = decideModels(pm).availability.open;
  if (open !== true) return { m: null, why: open };
  const m = solveOpenTransposed(pm, new Float64Array(t.n).fill(1));
  return m.every(Number.isFinite) ? { m, why: null } : { m: null, why: 'the multipliers are beyond the range of numbers' };
}

function mean(v: Float64Array | null, present: boolean[]): number | null {
  if (!v) return null;
  let s = 0, k = 0;
  present.forEach((p, j) => { if (p) { s += v[j]!; k++; } });
  return k > 0 ? s / k : null;
}

function fmt(x: number): string {
  return x.toFixed(2);
}

/** Compare the estimate with its source table; `present[j]` is true for sectors with county jobs. */
export function compareEstimate(national: IOTable, estimate: IOTable, present: boolean[]): { comparison: EstimateComparison; warning: Warning | null } {
  const natM = typeIOutput(national);
  const estM = typeIOutput(estimate);
  const nat = mean(natM.m, present);
  const est = mean(estM.m, present);
  const range: [number, number] = [COUNTY_TYPE_I_RANGE[0], COUNTY_TYPE_I_RANGE[1]];
  const kept = nat !== null && est !== null && nat > 1 ? (est - 1) / (nat - 1) : null;
  const plausible = est === null ? null : est >= range[0] && est <= range[1];
  const sectors = present.filter(Boolean).length;
  const over = `over the ${sectors} sector${sectors === 1 ? '' : 's'} present in the county`;
  const note = est === null
    ? `The estimate's Type I output multipliers are not defined, so it cannot be compared with the national table: ${estM.why ?? 'no sector is present'}.`
    : `Average Type I output multiplier ${over}: ${fmt(est)} in the estimate against ${nat === null ? `none in the national table, whose multipliers are not defined: ${natM.why ?? 'no sector is present'}` : `${fmt(nat)} in the national table`}${kept === null ? '' : ` (the estimate keeps ${Math.round(kept * 100)} % of the national indirect effect)`}; a plausible county average is ${fmt(range[0])}–${fmt(range[1])} (common practice, no source).`;
  let warning: Warning | null = null;
  if (est !== null && !plausible) {
    const low = est < range[0];
    warning = {
      code: 'regional-implausible-multipliers',
      message: `the estimate looks implausible: its average Type I output multiplier is ${fmt(est)}${nat === null ? '' : ` against ${fmt(nat)} nationally`}, ${low ? 'below' : 'above'} the plausible county range ${fmt(range[0])}–${fmt(range[1])}; ${low
        ? 'it sends nearly all local purchasing out of the county (FLQ with a small county share of national jobs does this): check the employment data, try a smaller δ or CILQ, or balance to known county totals (RAS)'
        : 'it keeps implausibly much purchasing in the county (SLQ and CILQ tend to understate regional imports): try FLQ, or balance to known county totals (RAS)'}; a survey-based county table, where one exists, is the better source`,
    };
  }
  return { comparison: { nationalAverageTypeI: nat, estimateAverageTypeI: est, indirectShareKept: kept, plausibleRange: range, plausible, sectors, note }, warning };
}
