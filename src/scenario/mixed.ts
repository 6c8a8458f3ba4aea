/**
 * Mixed exogenous/endogenous model (Miller & Blair, Input–Output Analysis, 2nd ed. 2009, §13.1 "mixed models",
 * recalled from memory): sectors whose output is fixed from outside leave the endogenous set, and the others solve
 * (I − A_ee)·Δx_e = Δf_e + A_ex·Δx_x.
 *
 * Solved here on the full factorisation instead of re-factoring I − A_ee: the same solution is the full model
 * (I − A)·Δx = Δf + E·μ, where E holds the unit columns of the fixed sectors and μ is the final demand those sectors
 * would need to reach their fixed output. The fixed rows of Δx = L·(Δf + E·μ) give the small k×k system
 * L_xx·μ = Δx_x − (L·Δf)_x (L_xx is a principal block of a nonsingular inverse, so invertible).
 * Rows e of the full system are exactly the partitioned equations above; tests check this against a direct solve.
 */
import { luFactor, luSolve } from '../linalg/index.ts';

export interface MixedSolution {
  /** Output change of every endogenous row of the system (length m). Fixed rows equal their target exactly. */
  x: Float64Array;
  /** Effective final demand f + E·μ (length m): the demand that reproduces x in the full model. */
  fEffective: Float64Array;
}

/**
 * @param solve x = (I − M)⁻¹ b for the system at hand (open or household-closed), length m.
 * @param f final-demand change, length m (zero at fixed rows).
 * @param fixed indices of fixed rows (< m), with their targets.
 */
export function solveMixed(
  solve: (b: Float64Array) => Float64Array,
  m: number,
  f: Float64Array,
  fixed: readonly number[],
  targets: readonly number[],
): MixedSolution {
  const base = solve(f);
  const k = fixed.length;
  if (k === 0) return { x: base, fEffective: Float64Array.from(f) };
  // Columns of (I − M)⁻¹ at the fixed sectors.
  const cols: Float64Array[] = fixed.map((j) => {
    const unit = new Float64Array(m);
    unit[j] = 1;
    return solve(unit);
  });
  const Lxx = new Float64Array(k * k);
  const rhs = new Float64Array(k);
  for (let r = 0; r < k; r++) {
    for (let c = 0; c < k; c++) Lxx[r * k + c] = cols[c]![fixed[r]!]!;
    rhs[r] = targets[r]! - base[fixed[r]!]!;
  }
  const mu = luSolve(luFactor(Lxx, k), rhs);
  const x = Float64Array.from(base);
  for (let c = 0; c < k; c++) {
    const mc = mu[c]!;
    const col = cols[c]!;
    for (let i = 0; i < m; i++) x[i] = x[i]! + mc * col[i]!;
  }
  // The fixed outputs are set exactly, not left with rounding from the update above.
  for (let r = 0; r < k; r++) x[fixed[r]!] = targets[r]!;
  const fEffective = Float64Array.from(f);
  for (let c = 0; c < k; c++) fEffective[fixed[c]!] = fEffective[fixed[c]!]! + mu[c]!;
  return { x, fEffective };
}
