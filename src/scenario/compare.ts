/** Several scenarios on the same table, side by side, with each one's difference from the first (the baseline). */
import { InputError } from '../diagnostics/index.ts';
import { VARIABLES, type EffectTotals, type ScenarioResult, type Variable } from './types.ts';

export interface ScenarioComparison {
  scenarios: string[];
  sectors: string[];
  /** total[variable][s] = sector totals of scenario s (null when the variable is not available). */
  total: Record<Variable, (Float64Array | null)[]>;
  /** difference[variable][s] = total of scenario s − total of scenario 0. */
  difference: Record<Variable, (Float64Array | null)[]>;
  totals: Record<Variable, (EffectTotals | null)[]>;
}

export function compareScenarios(results: readonly ScenarioResult[]): ScenarioComparison {
  if (results.length < 2) throw new InputError('compare-too-few', 'comparison needs at least two scenarios');
  const first = results[0]!;
  for (const r of results) {
    if (r.sectors.length !== first.sectors.length || r.sectors.some((s, i) => s !== first.sectors[i])) {
      throw new InputError('compare-different-tables', `scenario '${r.scenario}' was run on a different table from '${first.scenario}'`);
    }
  }
  const total = {} as ScenarioComparison['total'];
  const difference = {} as ScenarioComparison['difference'];
  const totals = {} as ScenarioComparison['totals'];
  for (const v of VARIABLES) {
    total[v] = results.map((r) => r.effects[v]?.total ?? null);
    const base = total[v][0];
    difference[v] = total[v].map((t) => {
      if (!t || !base) return null;
      const d = new Float64Array(t.length);
      for (let i = 0; i < t.length; i++) d[i] = t[i]! - base[i]!;
      return d;
    });
    totals[v] = results.map((r) => r.totals[v] ?? null);
  }
  return { scenarios: results.map((r) => r.scenario), sectors: first.sectors, total, difference, totals };
}
