/**
 * Household closure (Type II model; Miller & Blair 2009, §2.5 and §6.2): households become sector n+1.
 * Row n+1 (household income per unit of output) = h_j; column n+1 (household purchases per unit of household income)
 * = c_i / x_h, where x_h = total household income. Ā is (n+1)×(n+1), row-major.
 *
 * Ā is A bordered by one column and one row, so every computation on it here works on the border (hc, hr and the
 * corner ā_hh) beside A: products, residuals and norms below, and the solves, which border the open factorisation
 * (prepared.ts). The (n+1)² matrix itself is formed only when something asks for `Abar` (a report, a path search
 * over the closed model's arcs), once, and kept.
 */
import type { Coefficients } from './coefficients.ts';

export interface ClosedCoefficients {
  /** Size of the closed system, n + 1. */
  m: number;
  /** Ā, m×m row-major (formed on first access when the closure was made by closeHouseholds). */
  readonly Abar: Float64Array;
  /** Household consumption coefficients c_i / x_h (the new column), length n. */
  hc: Float64Array;
  /** Household income coefficients (the new row): h_j, or h_j times the resident share under commuting; length n. */
  hr: Float64Array;
  /**
   * ā_hh, households' purchases from households per unit of household income: 0 in our closure. A closure assembled by
   * hand (a published example with ā_hh ≠ 0) may leave it out; `householdCorner` then reads it from `Abar`.
   */
  corner?: number;
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
  const hc = new Float64Array(n);
  for (let i = 0; i < n; i++) hc[i] = householdConsumption[i]! / householdIncomeTotal;
  const hr = residentShare ? Float64Array.from(h, (v, j) => v * residentShare[j]!) : Float64Array.from(h);
  let formed: Float64Array | null = null;
  return {
    m,
    hc,
    hr,
    corner: 0,
    get Abar(): Float64Array {
      if (formed === null) formed = borderedMatrix(A, n, hc, hr, 0);
      return formed;
    },
  };
}

/** [A hc; hrᵀ corner] as one (n+1)×(n+1) row-major matrix. */
export function borderedMatrix(A: Float64Array, n: number, hc: Float64Array, hr: Float64Array, corner: number): Float64Array {
  const m = n + 1;
  const out = new Float64Array(m * m);
  for (let i = 0; i < n; i++) {
    out.set(A.subarray(i * n, i * n + n), i * m);
    out[i * m + n] = hc[i]!;
  }
  out.set(hr.subarray(0, n), n * m);
  out[n * m + n] = corner;
  return out;
}

/** ā_hh of a closure. */
export function householdCorner(c: ClosedCoefficients): number {
  return c.corner ?? c.Abar[(c.m - 1) * c.m + (c.m - 1)] ?? 0;
}

/** The closed matrix as its parts: Ā = [A hc; hrᵀ corner] with A n×n. */
export interface Bordered {
  A: Float64Array;
  n: number;
  hc: Float64Array;
  hr: Float64Array;
  corner: number;
}

export function borderedOf(A: Float64Array, n: number, c: ClosedCoefficients): Bordered {
  return { A, n, hc: c.hc, hr: c.hr, corner: householdCorner(c) };
}

/** |Ā| as parts (tables with negative flows bound ρ(Ā) by ρ(|Ā|)); `absA` is |A|, already formed for the open model. */
export function borderedAbs(b: Bordered, absA: Float64Array): Bordered {
  return { A: absA, n: b.n, hc: Float64Array.from(b.hc, Math.abs), hr: Float64Array.from(b.hr, Math.abs), corner: Math.abs(b.corner) };
}
