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
  /** Household income coefficients h_j (the new row), length n. */
  hr: Float64Array;
}

/** Null when the table has no household income or no household consumption: Type II is then undefined. */
export function closeHouseholds(c: Coefficients): ClosedCoefficients | null {
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
  for (let j = 0; j < n; j++) Abar[n * m + j] = h[j]!;
  return { m, Abar, hc, hr: Float64Array.from(h) };
}
