/**
 * Full spectrum of A (small tables only) and the long-run behaviour of each eigen-mode. A demand impulse f spreads
 * round by round as A^t f; along an eigenvector the t-th round is λ^t times the first, so λ says what that component
 * does in the long run (the modes of x(t+1) = A·x(t); Luenberger, Introduction to Dynamic Systems, 1979, ch. 5,
 * recalled from memory). Eigenvalues from ml-matrix's EigenvalueDecomposition (Hessenberg reduction and shifted QR,
 * after EISPACK hqr2), O(n³): only for n ≤ SPECTRUM_MAX_SECTORS; larger tables use the Perron root alone.
 */
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';

export const SPECTRUM_MAX_SECTORS = 400;
const FLUSH = 1e-150;

export type ModeKind =
  | 'collapse' // λ = 0: the component is gone after finitely many rounds
  | 'decay' // 0 < |λ| < 1, real: dies out geometrically (alternating in sign when λ < 0)
  | 'two-period-oscillation' // λ = −1: flips sign every round, never dies
  | 'steady' // λ = 1: persists unchanged
  | 'growth' // λ > 1: grows geometrically
  | 'growth-sign-flips' // λ < −1: grows while flipping sign
  | 'rotating-decay' // complex, |λ| < 1: spirals in
  | 'rotating-steady' // complex, |λ| = 1: rotates forever at constant size
  | 'rotating-growth'; // complex, |λ| > 1: spirals out

export interface Mode {
  re: number;
  im: number;
  modulus: number;
  kind: ModeKind;
}

/**
 * Classification with a tolerance for the rounding of the eigenvalue itself (an eigenvalue of a non-normal matrix
 * is computed to about ε·‖A‖·κ(λ); 1e-9 relative is common practice, no source).
 */
export function classifyMode(re: number, im: number, tol = 1e-9): ModeKind {
  const modulus = Math.hypot(re, im);
  if (modulus <= tol) return 'collapse';
  const scale = Math.max(1, modulus);
  if (Math.abs(im) <= tol * scale) {
    if (Math.abs(re - 1) <= tol) return 'steady';
    if (Math.abs(re + 1) <= tol) return 'two-period-oscillation';
    if (re > 1) return 'growth';
    if (re < -1) return 'growth-sign-flips';
    return 'decay';
  }
  if (Math.abs(modulus - 1) <= tol) return 'rotating-steady';
  return modulus < 1 ? 'rotating-decay' : 'rotating-growth';
}

/** All eigenvalues of the n×n row-major matrix a, by decreasing modulus, each with its long-run mode. */
export function spectrum(a: Float64Array, n: number): Mode[] {
  if (n === 0) return [];
  // Scale to max |a_ij| = 1 and flush entries below FLUSH of that to zero. The QR iteration's convergence test
  // (|h_{l,l−1}| < ε·s) can never pass when s underflows, so subnormal entries make it loop forever; dropping
  // entries of relative size 1e-150 is a backward perturbation far below the ε·‖A‖ the algorithm already commits.
  let scale = 0;
  for (let k = 0; k < n * n; k++) scale = Math.max(scale, Math.abs(a[k]!));
  if (scale === 0) return Array.from({ length: n }, () => ({ re: 0, im: 0, modulus: 0, kind: 'collapse' as const }));
  const rows: number[][] = [];
  for (let i = 0; i < n; i++) {
    rows.push(Array.from(a.subarray(i * n, (i + 1) * n), (v) => {
      const s = v / scale;
      return Math.abs(s) < FLUSH ? 0 : s;
    }));
  }
  const evd = new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: false });
  const re = evd.realEigenvalues;
  const im = evd.imaginaryEigenvalues;
  const modes: Mode[] = [];
  for (let k = 0; k < n; k++) {
    const r = (re[k] ?? 0) * scale, i = (im[k] ?? 0) * scale;
    modes.push({ re: r, im: i, modulus: Math.hypot(r, i), kind: classifyMode(r, i) });
  }
  modes.sort((p, q) => q.modulus - p.modulus || q.re - p.re);
  return modes;
}
