/**
 * Location quotients for estimating regional input coefficients from national ones.
 *
 * - Simple location quotient (SLQ): SLQ_i = (E_i^R / E^R) / (E_i^N / E^N), E = employment
 *   (Miller & Blair, Input–Output Analysis, 2nd ed. 2009, §8.3.1).
 * - Cross-industry quotient (CILQ): CILQ_ij = SLQ_i / SLQ_j off the diagonal and SLQ_i on it — the diagonal
 *   convention is common practice following Smith & Morrison, Simulating the Urban Economy, 1974 (recalled from memory).
 * - Flegg's quotient (FLQ; Flegg, Webber & Elliott 1995, Regional Studies 29; Flegg & Webber 1997, Regional Studies 31):
 *   λ* = [log2(1 + E^R / E^N)]^δ, FLQ_ij = λ*·CILQ_ij off the diagonal and λ*·SLQ_i on it, 0 ≤ δ ≤ 1.
 *   Flegg & Tohmo (2013, Regional Studies 47) report δ around 0.25–0.35 fitting survey-based tables; 0.3 is our default.
 *
 * Regional coefficients: r_ij = a_ij · min(q_ij, 1) — a quotient below one means the region cannot supply all of its
 * own need for sector i's product and imports the rest; at or above one, the national coefficient is kept.
 */

export type LqMethod = 'slq' | 'cilq' | 'flq';

export const LQ_METHODS: readonly LqMethod[] = ['slq', 'cilq', 'flq'];

/** δ suggested by Flegg & Tohmo (2013). */
export const DEFAULT_FLQ_DELTA = 0.3;

/** SLQ_i for every sector. A sector with no national jobs has no quotient (0 is returned; callers refuse such input). */
export function simpleLQ(regional: Float64Array, national: Float64Array): Float64Array {
  const n = regional.length;
  let er = 0;
  let en = 0;
  for (let i = 0; i < n; i++) { er += regional[i]!; en += national[i]!; }
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    out[i] = national[i]! > 0 && er > 0 ? regional[i]! / er / (national[i]! / en) : 0;
  }
  return out;
}

/**
 * CILQ_ij, n×n row-major. When the buying sector j is absent (SLQ_j = 0) the quotient is unbounded; it is returned
 * as +Infinity so that min(CILQ_ij, 1) = 1, the limit as SLQ_j → 0⁺ (the recipe of a sector that does not exist
 * in the region never carries any flow, so this only fixes the reported coefficient).
 */
export function crossIndustryLQ(slq: Float64Array): Float64Array {
  const n = slq.length;
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      if (i === j) out[i * n + j] = slq[i]!;
      else out[i * n + j] = slq[j]! > 0 ? slq[i]! / slq[j]! : slq[i]! > 0 ? Infinity : 0;
    }
  }
  return out;
}

/** λ* = [log2(1 + E^R/E^N)]^δ; lies in (0, 1] when 0 < E^R ≤ E^N and 0 ≤ δ ≤ 1. */
export function flqLambda(regionalTotal: number, nationalTotal: number, delta: number): number {
  return Math.pow(Math.log2(1 + regionalTotal / nationalTotal), delta);
}

/** FLQ_ij = λ*·CILQ_ij off the diagonal, λ*·SLQ_i on it (n×n row-major). */
export function flegg(slq: Float64Array, lambda: number): Float64Array {
  const q = crossIndustryLQ(slq);
  for (let k = 0; k < q.length; k++) q[k] = q[k]! === Infinity ? Infinity : lambda * q[k]!;
  return q;
}

/** The quotient matrix q_ij of a method (SLQ is the same for every buying sector j). */
export function quotientMatrix(method: LqMethod, slq: Float64Array, lambda: number): Float64Array {
  const n = slq.length;
  if (method === 'cilq') return crossIndustryLQ(slq);
  if (method === 'flq') return flegg(slq, lambda);
  const q = new Float64Array(n * n);
  for (let i = 0; i < n; i++) q.fill(slq[i]!, i * n, (i + 1) * n);
  return q;
}

/** r_ij = a_ij · min(q_ij, 1). */
export function regionalCoefficients(A: Float64Array, q: Float64Array): Float64Array {
  const r = new Float64Array(A.length);
  for (let k = 0; k < A.length; k++) r[k] = A[k]! * Math.min(q[k]!, 1);
  return r;
}
