/**
 * Technical coefficients and per-unit-output coefficients (Miller & Blair, Input–Output Analysis, 2nd ed. 2009, §2.2):
 * a_ij = z_ij / x_j; labour-income, other value-added, taxes, import, employment and FTE coefficients are the rows
 * divided by x_j. Value added per unit of output is h_j + other value added_j + taxes_j (`valueAddedPerUnit`): the
 * national-accounts total, compensation plus other value added plus taxes less subsidies on production (SNA 2008
 * ch. 7 — recalled from memory).
 */
import type { IOTable, LabelledVector } from '../table/index.ts';

export interface Coefficients {
  n: number;
  sectors: string[];
  /** Technical coefficients A = Z·diag(x)⁻¹, row-major n×n. */
  A: Float64Array;
  x: Float64Array;
  /** Household (labour) income per unit of output, h_j (all labour-income rows summed). */
  h: Float64Array;
  /** Other value added per unit of output (taxes not included). */
  otherVA: Float64Array;
  /** Taxes less subsidies per unit of output (all taxes rows summed), or null when the table has no taxes row. */
  taxes: Float64Array | null;
  /** Imports per unit of output. */
  imports: Float64Array;
  /** Jobs per unit of output, or null when the table has no employment row. */
  e: Float64Array | null;
  /** Full-time equivalents per unit of output, or null when the table has no FTE row. */
  fte: Float64Array | null;
  /** Household consumption from each sector (all household columns summed), money. */
  householdConsumption: Float64Array;
  /**
   * Total household income x_h = Σ_j labour income_j + labour income paid by final-demand columns (government wages):
   * the household sector's "output" in the closed model (Miller & Blair 2009, §2.5 — recalled from memory).
   */
  householdIncomeTotal: number;
}

export function sumVectors(vs: LabelledVector[], n: number): Float64Array {
  const out = new Float64Array(n);
  for (const v of vs) for (let i = 0; i < n; i++) out[i] = out[i]! + v.values[i]!;
  return out;
}

function perUnit(v: Float64Array, x: Float64Array): Float64Array {
  const out = new Float64Array(v.length);
  for (let j = 0; j < v.length; j++) out[j] = x[j]! > 0 ? v[j]! / x[j]! : 0;
  return out;
}

/** Each row per unit of output, as `coefficients` divides (0 where output is 0): the rows one by one, not summed. */
export function perUnitRows(rows: readonly LabelledVector[], x: Float64Array): LabelledVector[] {
  return rows.map((v) => ({ ...v, values: perUnit(v.values, x) }));
}

/** A = Z·diag(x)⁻¹ into `A` (which may be Z itself: each entry depends only on its own flow); 0 where x is 0. */
function flowsOverOutput(t: IOTable, A: Float64Array): Float64Array {
  const { n, Z, x } = t;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const xj = x[j]!;
      A[i * n + j] = xj > 0 ? Z[i * n + j]! / xj : 0;
    }
  }
  return A;
}

/**
 * Coefficients of a validated table. Sectors with zero output get zero coefficients (the importer refuses such a sector
 * that buys inputs). `A`, when given, is taken as the intermediate coefficients instead of Z/x (the Monte Carlo draws
 * perturb the coefficients themselves, into a buffer they reuse); everything else still comes from the table.
 */
export function coefficients(t: IOTable, given?: Float64Array): Coefficients {
  const { n, x } = t;
  const A = given ?? flowsOverOutput(t, new Float64Array(n * n));
  const labour = sumVectors(t.labourIncome, n);
  let householdIncomeTotal = 0;
  for (let j = 0; j < n; j++) householdIncomeTotal += labour[j]!;
  for (const c of t.householdIncomeFromFinalDemand ?? []) householdIncomeTotal += c.value;
  return {
    n,
    sectors: t.sectors,
    A,
    x,
    h: perUnit(labour, x),
    otherVA: perUnit(sumVectors(t.otherValueAdded, n), x),
    taxes: t.taxes?.length ? perUnit(sumVectors(t.taxes, n), x) : null,
    imports: perUnit(sumVectors(t.imports, n), x),
    e: t.employment ? perUnit(t.employment, x) : null,
    fte: t.fte ? perUnit(t.fte, x) : null,
    householdConsumption: sumVectors(t.householdConsumption, n),
    householdIncomeTotal,
  };
}

/**
 * `coefficients(t)` computed in the table's own flow buffer, for a caller that never needs the flows again (a CLI run
 * that saves no project and draws nothing): A = Z·diag(x)⁻¹ by the same divisions, entry by entry where Z was, so a
 * large run holds one n×n matrix instead of two and touches 32 MB less fresh memory at 2,000 sectors. The table is
 * left without flows: reading `t.Z` afterwards throws, so a use nobody foresaw fails loudly instead of reading A.
 */
export function coefficientsOverFlows(t: IOTable): Coefficients {
  const coef = coefficients(t, flowsOverOutput(t, t.Z));
  Object.defineProperty(t, 'Z', {
    get: () => { throw new Error('the table\'s flows were turned into its coefficients (coefficientsOverFlows); nothing may read them afterwards'); },
    enumerable: true,
    configurable: true,
  });
  return coef;
}

/** Value added per unit of output: labour income + other value added + taxes less subsidies (when the table has them). */
export function valueAddedPerUnit(c: Coefficients): Float64Array {
  const va = new Float64Array(c.n);
  for (let j = 0; j < c.n; j++) va[j] = c.h[j]! + c.otherVA[j]! + (c.taxes ? c.taxes[j]! : 0);
  return va;
}
