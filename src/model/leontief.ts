/**
 * The explicit Leontief inverse L = (I − A)⁻¹, formed only for display and export (every computation solves with the
 * factorisation instead), with its LAPACK xGET03 accuracy ratio ‖(I − A)L − I‖₁ / (‖I − A‖₁‖L‖₁·n·ε).
 */
import { identityMinus, luInverse, scaledResidual } from '../linalg/index.ts';
import type { PreparedModel } from './prepared.ts';

/** L alone, the blocked inverse on the open model's factorisation: for a view that shows it and checks nothing. */
export function leontiefOf(pm: PreparedModel): Float64Array {
  return luInverse(pm.openLU);
}

/** L with its accuracy ratio (a product of two n×n matrices: n³ more work), for the analysis and the report. */
export function formLeontief(pm: PreparedModel): { L: Float64Array; residual: number | null } {
  const { A, n } = pm.coef;
  const L = leontiefOf(pm);
  const r = scaledResidual(identityMinus(A, n), L, n);
  return { L, residual: Number.isFinite(r) ? r : null };
}
