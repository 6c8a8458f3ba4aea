/**
 * Household closure (Type II model; Miller & Blair 2009, §2.5 and §6.2): households become sector n+1.
 * Row n+1 (household income per unit of output) = h_j; column n+1 (household purchases per unit of household income)
 * = c_i / x_h, where x_h = total household income. Ā is (n+1)×(n+1), row-major.
 */
import type { Coefficients } from './coefficients.ts';

export interface ClosedCoefficients {
  /** Size of the closed system, n + 1. */
  m: number;
  Abar: Float64Array;
  /** Household consumption coefficients c_i / x_h (the new column), length n. */
  hc: Float64Array;
  /** Household income coefficients (the new row): h_j, or h_j times the resident share under commuting; length n. */
  hr: Float64Array;
}

/**
 * Null when the table has no household income or no household consumption: Type II is then undefined.
 *
 * `residentShare` (0–1 per sector, default 1) is the part of each sector's labour income paid to people living in
 * the region: the rest (commuters' pay) leaks out before household spending, so the household row is h_j·share_j.
 * Consumption per unit of household income stays the table's c_i / x_h. A smaller row never makes the closed model
 * less productive (Ā only loses weight, so ρ(Ā) cannot grow: Perron–Frobenius monotonicity).
 */
export function closeHouseholds(c: Coefficients, residentShare?: Float64Array): ClosedCoefficients | null {
  const { n, A, h, householdConsumption, householdIncomeTotal } = c;
  let consumption = 0;
  for (let i = 0; i < n; i++) consumption += householdConsumption[i]!;
  if (!(householdIncomeTotal > 0) || !(consumption > 0)) return null;
  const m = n + 1;
  const Abar = new Float64Array(m * m);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Abar[i * m + j] = A[i * n + j]!;
  const hc = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    hc[i] = householdConsumption[i]! / householdIncomeTotal;
    Abar[i * m + n] = hc[i]!;
  }
  const hr = residentShare ? Float64Array.from(h, (v, j) => v * residentShare[j]!) : Float64Array.from(h);
  for (let j = 0; j < n; j++) Abar[n * m + j] = hr[j]!;
  return { m, Abar, hc, hr };
}
