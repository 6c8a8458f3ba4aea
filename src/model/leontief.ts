/**
 * The explicit Leontief inverse L = (I − A)⁻¹, formed only for display and export (every computation solves with the
 * factorisation instead), with its LAPACK xGET03 accuracy ratio ‖(I − A)L − I‖₁ / (‖I − A‖₁‖L‖₁·n·ε).
 */
import { identityMinus, luInverse, scaledResidual } from '../linalg/index.ts';
import type { PreparedModel } from './prepared.ts';

export function formLeontief(pm: PreparedModel): { L: Float64Array; residual: number | null } {
  const { A, n } = pm.coef;
  const L = luInverse(pm.openLU);
  const r = scaledResidual(identityMinus(A, n), L, n);
  return { L, residual: Number.isFinite(r) ? r : null };
}
