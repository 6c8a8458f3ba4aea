/**
 * A^k·1 (k = 1, 2, …) of a table's coefficient matrix, when formed on the Perron iterations' passes over A
 * (availability.ts, perron.ts `chain`), for the spending rounds of one unit of final demand in every sector
 * (src/study/rounds.ts), which would otherwise form them again at one pass over A each (32 MB at 2,000 sectors).
 * Keyed by the matrix itself: nothing writes a prepared table's A in place.
 */
const known = new WeakMap<Float64Array, readonly Float64Array[]>();

/** How many of the products the analysis forms at most (the unit rounds usually stop after 10–20). */
export const POWERS_OF_ONES = 64;

export function rememberPowersOfOnes(a: Float64Array, products: readonly Float64Array[]): void {
  if (products.length > 0) known.set(a, products);
}

/** A·1, A²·1, … as far as they were formed for `a` (possibly none). Read-only: copy before handing one out. */
export function powersOfOnes(a: Float64Array): readonly Float64Array[] {
  return known.get(a) ?? [];
}
