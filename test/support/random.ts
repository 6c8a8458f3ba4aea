// Seeded pseudo-random numbers for tests, so every run sees the same data (test data only, never a reference value).
// Linear congruential generators modulo 2^32: `seeded` uses the constants a = 1664525, c = 1013904223 (Press et al.,
// Numerical Recipes, 2nd ed., §7.1, "quick and dirty" generator); `seededC` uses a = 1103515245, c = 12345 (the
// example rand() of the C standard, ISO/IEC 9899 §7.22.2.2). Both return numbers in [0, 1).

export type Random = () => number;

export function seeded(seed: number): Random {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32);
}

export function seededC(seed: number): Random {
  let s = seed >>> 0;
  return () => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) / 2 ** 32);
}

/** An n×m row-major matrix of entries uniform in [−1, 1) from `seeded(seed)`, with `dominance` added to the diagonal. */
export function randomMatrix(n: number, m: number, seed: number, dominance = 0): Float64Array {
  const r = seeded(seed);
  const a = new Float64Array(n * m);
  for (let k = 0; k < n * m; k++) a[k] = r() * 2 - 1;
  if (dominance !== 0) for (let i = 0; i < Math.min(n, m); i++) a[i * m + i] = a[i * m + i]! + dominance;
  return a;
}

/** Mulberry32 (public domain; common practice, no source), for the generators of committed sample data. */
export function mulberry32(seed: number): Random {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}
