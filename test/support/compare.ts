// Comparing computed numbers with reference numbers.

/**
 * Relative difference |a − b| / max(floor, size), where size defaults to |b| (the reference). `floor` keeps a
 * reference near zero from turning a tiny absolute error into a huge relative one: each test states its own.
 */
export function rel(a: number, b: number, floor = 1, size = Math.abs(b)): number {
  return Math.abs(a - b) / Math.max(floor, size);
}

/**
 * Relative difference of two computations of one number where neither is the reference (two front ends, say):
 * |a − b| / max(|a|, |b|), and 0 when both are 0.
 */
export function relBetween(a: number, b: number): number {
  const size = Math.max(Math.abs(a), Math.abs(b));
  return size === 0 ? 0 : Math.abs(a - b) / size;
}
