/**
 * Spending rounds: the power-series view of the open model, L·f = f + A·f + A²·f + … (Miller & Blair 2009, §2.4,
 * recalled from memory). Round 0 is the shock (the effective final demand, so output lines enter as the demand that
 * produces their fixed output), round k+1 = A·(round k).
 *
 * Coverage after rounds 0..K is 1 − ‖x − S_K‖₁ / ‖x‖₁ with x the open-model total and S_K the sum of the rounds.
 * With ‖A‖₁ < 1 (every column sum below one) the remainder obeys ‖x − S_K‖₁ ≤ ‖A‖₁^(K+1) / (1 − ‖A‖₁) · ‖f‖₁.
 * The ratio of successive rounds ‖round k+1‖₁ / ‖round k‖₁ tends to the Perron root ρ(A) for an irreducible A and a
 * shock with a non-zero Perron component (power method; Golub & Van Loan 2013, §7.3).
 */
import { matVec, norm1 } from '../linalg/index.ts';
import type { PreparedModel } from '../model/index.ts';

export const COVERAGE_TARGETS = [0.9, 0.99, 0.999] as const;

/** The most rounds ever computed, whatever `maxRounds` asks (the project schema allows the same). */
export const MAX_SPENDING_ROUNDS = 10_000;

export interface RoundsOptions {
  /** Stop after this many rounds (round 0 included) even if 99.9 % is not reached. Default 200, at most MAX_SPENDING_ROUNDS. */
  maxRounds?: number;
  /** ρ(A) when already known (viability check), reported beside the ratios. */
  perronRoot?: number;
  /** A·f, A²·f, … as far as already formed (each as matVec forms it: the same bits); later rounds are formed here. */
  products?: readonly Float64Array[];
}

export interface RoundsResult {
  /** Output change by round: rounds[k] is a vector in sector order. */
  rounds: Float64Array[];
  /** Σ_i of each round (money). */
  roundTotals: number[];
  /** Labour income of each round, h·round k (money). */
  roundIncome: number[];
  /** Coverage of the open-model total after rounds 0..k. */
  coverage: number[];
  /** ‖round k‖₁ / ‖round k−1‖₁ for k ≥ 1 (index 0 is null); null where the previous round is zero. */
  ratio: (number | null)[];
  /**
   * The round by which each coverage target is reached: the first k whose rounds 0..k cover the target share of the
   * open-model total (round 0 is the initial demand), or null when not reached within maxRounds. This is the one way
   * Roundwise counts rounds, on every screen, report and CLI line.
   */
  reach: { target: number; round: number | null }[];
  /** ‖A‖₁, the largest column sum of |A|. */
  normA: number;
  /** The a-priori bound on ‖x − S_K‖₁ after the computed rounds, or null when ‖A‖₁ ≥ 1. */
  remainderBound: number | null;
  /** ‖x − S_K‖₁ actually left after the computed rounds. */
  remainder: number;
  /** ρ(A), the limit of the ratios, when given in the options. */
  perronRoot: number | null;
}

function norm1Vec(v: Float64Array): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += Math.abs(v[i]!);
  return s;
}

/** Rounds for the effective demand `f` whose open-model solution is `x`. */
export function spendingRounds(pm: PreparedModel, f: Float64Array, x: Float64Array, opts: RoundsOptions = {}): RoundsResult {
  const { n, A, h } = pm.coef;
  const maxRounds = Math.min(MAX_SPENDING_ROUNDS, Math.max(1, Math.floor(opts.maxRounds ?? 200) || 1));
  const xNorm = norm1Vec(x);
  const last = COVERAGE_TARGETS[COVERAGE_TARGETS.length - 1]!;
  const rounds: Float64Array[] = [];
  const roundTotals: number[] = [];
  const roundIncome: number[] = [];
  const coverage: number[] = [];
  const ratio: (number | null)[] = [];
  const cum = new Float64Array(n);
  let r: Float64Array = Float64Array.from(f);
  const known = opts.products ?? [];
  let remainder = xNorm;
  for (let k = 0; k < maxRounds; k++) {
    if (k > 0) r = k <= known.length && known[k - 1]!.length === n ? known[k - 1]!.slice() : matVec(A, n, n, r);
    rounds.push(r);
    let tot = 0;
    let inc = 0;
    for (let i = 0; i < n; i++) { tot += r[i]!; inc += h[i]! * r[i]!; cum[i] = cum[i]! + r[i]!; }
    roundTotals.push(tot);
    roundIncome.push(inc);
    let rem = 0;
    for (let i = 0; i < n; i++) rem += Math.abs(x[i]! - cum[i]!);
    remainder = rem;
    coverage.push(xNorm > 0 ? 1 - rem / xNorm : 1);
    const prev = k > 0 ? norm1Vec(rounds[k - 1]!) : 0;
    ratio.push(k > 0 && prev > 0 ? norm1Vec(r) / prev : null);
    if (coverage[k]! >= last) break;
  }
  const reach = COVERAGE_TARGETS.map((target) => {
    const k = coverage.findIndex((c) => c >= target);
    return { target, round: k < 0 ? null : k };
  });
  const normA = norm1(A, n);
  const K = rounds.length - 1;
  const remainderBound = normA < 1 ? (normA ** (K + 1) / (1 - normA)) * norm1Vec(f) : null;
  return { rounds, roundTotals, roundIncome, coverage, ratio, reach, normA, remainderBound, remainder, perronRoot: opts.perronRoot ?? null };
}
