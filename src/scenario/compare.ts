/**
 * Several scenarios (or phases of scenarios) on the same table, side by side. Each entry's difference is taken from
 * its baseline entry — the first scenario's phase of the same name and timing — and left out where there is none, so
 * a one-time phase is never compared with an annual one.
 */
import { InputError } from '../diagnostics/index.ts';
import { VARIABLES, type EffectTotals, type ScenarioResult, type Timing, type Variable } from './types.ts';

export interface ComparisonEntry {
  /** "Scenario" or "Scenario — Phase". */
  label: string;
  timing: Timing;
  result: ScenarioResult;
  /** Index of the entry this one is compared with, or null (the baseline itself, or no phase to compare with). */
  baseline: number | null;
}

export interface ScenarioComparison {
  /** Entry labels. */
  scenarios: string[];
  timings: Timing[];
  baselines: (number | null)[];
  sectors: string[];
  /** total[variable][s] = sector totals of entry s (null when the variable is not available). */
  total: Record<Variable, (Float64Array | null)[]>;
  /** difference[variable][s] = total of entry s − total of its baseline (null without one). */
  difference: Record<Variable, (Float64Array | null)[]>;
  totals: Record<Variable, (EffectTotals | null)[]>;
}

export function compareScenarios(entries: readonly ComparisonEntry[]): ScenarioComparison {
  if (entries.length < 2) throw new InputError('compare-too-few', 'comparison needs at least two scenarios');
  const first = entries[0]!.result;
  for (const { result: r } of entries) {
    if (r.sectors.length !== first.sectors.length || r.sectors.some((s, i) => s !== first.sectors[i])) {
      throw new InputError('compare-different-tables', `scenario '${r.scenario}' was run on a different table from '${first.scenario}'`);
    }
  }
  const total = {} as ScenarioComparison['total'];
  const difference = {} as ScenarioComparison['difference'];
  const totals = {} as ScenarioComparison['totals'];
  for (const v of VARIABLES) {
    total[v] = entries.map((e) => e.result.effects[v]?.total ?? null);
    difference[v] = entries.map((e, k) => {
      const t = total[v][k];
      const base = e.baseline === null || e.baseline === k ? null : total[v][e.baseline];
      if (!t || !base) return null;
      const d = new Float64Array(t.length);
      for (let i = 0; i < t.length; i++) d[i] = t[i]! - base[i]!;
      return d;
    });
    totals[v] = entries.map((e) => e.result.totals[v] ?? null);
  }
  return {
    scenarios: entries.map((e) => e.label), timings: entries.map((e) => e.timing), baselines: entries.map((e) => e.baseline),
    sectors: first.sectors, total, difference, totals,
  };
}
