/** Wall-clock timing with warm-up and medians (the machine may be shared: medians of repeats, never a single run). */
export interface Timing { medianMs: number; minMs: number; runs: number; allMs: number[] }

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m]! : (s[m - 1]! + s[m]!) / 2;
}

/**
 * Median of `runs` timed calls after a warm-up: at least `warmup` calls and, when `warmup` > 0, calls until 300 ms have
 * passed, so V8 has optimised the code being timed (small sizes otherwise measure the interpreter).
 */
export function time(fn: () => unknown, runs: number, warmup = 1): Timing {
  const until = performance.now() + (warmup > 0 ? 300 : 0);
  for (let w = 0; w < warmup || performance.now() < until; w++) fn();
  const all: number[] = [];
  for (let r = 0; r < runs; r++) {
    const t = performance.now();
    fn();
    all.push(performance.now() - t);
  }
  return { medianMs: median(all), minMs: Math.min(...all), runs, allMs: all };
}

/** Repeats scaled to size: many for small n, at least `min` for large. */
export function runsFor(n: number, min = 3): number {
  if (n <= 50) return 41;
  if (n <= 200) return 15;
  if (n <= 500) return 9;
  return min;
}
