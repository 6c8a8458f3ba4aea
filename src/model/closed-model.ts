/**
 * Whether the household-closed (Type II) model can be used: one decision, made by the analysis and read by every
 * scenario on the same prepared table.
 *
 * In exact arithmetic, for a productive open model with A ≥ 0 the closed model is productive exactly when the Schur
 * complement s = 1 − ā_hh − h·u (u = (I − A)⁻¹c, see prepared.ts) is positive: the leading principal minors of I − Ā
 * are those of I − A (all positive) and, last, det(I − Ā) = det(I − A)·s, so Hawkins–Simon holds for I − Ā exactly
 * when s > 0, and for a non-negative Ā that is ρ(Ā) < 1 (Hawkins & Simon 1949; hawkins.ts). In floating point a
 * table whose closed model has ρ(Ā) = 1 exactly — any balanced table whose only final demand is household consumption:
 * x̄ = (x, total income) solves Ā·x̄ = x̄ — gives an s of rounding size and either sign, and dividing by it turns a
 * shock of 100 into induced effects of 10¹⁸. So the closed model is used only when
 *   1. the certified Collatz–Wielandt bounds (perron.ts) do not put ρ(Ā) at 1 or above (not applied to tables with
 *      negative flows, where they bound ρ(|Ā|), an upper bound of the spectral radius only), and
 *   2. the computed s exceeds the bound on its own rounding error, SAFETY × (e₁ + e₂), derived here:
 *      e₁ — forming s from the computed û: s is 1 − ā_hh − Σ h_i û_i, a sum of n + 2 terms, so
 *           |fl(s) − s(û)| ≤ γ_{n+2}·(1 + |ā_hh| + Σ|h_i û_i|)          (Higham, Accuracy and Stability of Numerical
 *           Algorithms, 2nd ed. 2002, §3.1, the bound for inner products and sums; γ_k = k·u/(1 − k·u), u = 2⁻⁵³);
 *      e₂ — the solve for û: it is the exact solution of (B + ΔB)û = c with |ΔB| ≤ γ_{3n}·Pᵀ|L̂||Û| (Higham 2002,
 *           Thm 9.4, LU with partial pivoting, P·B = L̂Û), so to first order h·(û − u) = −w·ΔB·û with w = h·B⁻¹ and
 *           |h·(û − u)| ≤ γ_{3n}·|w|ᵀ·Pᵀ|L̂||Û|·|û|,
 *           computed here in O(n²) from the factors at hand.
 *      SAFETY = 4 covers the second-order terms and the use of the computed ŵ for w (both of relative size O(κ·u)).
 *      On random balanced tables whose closed model is exactly singular the computed |s| stayed below 1/30 of this
 *      bound (test/src/model/closed-model.test.ts), so the bound is not tight enough to let rounding through.
 * Once s clears its bound, s > 0 settles productivity (the theorem above) even where the power iteration has not
 * narrowed the bounds below 1 (a nearly periodic Ā converges slowly); |s| within the bound means ρ(Ā) = 1 to within
 * rounding, whatever the bounds say, because dividing by such an s is dividing by noise.
 * When s clears the bound but by less than ACCURACY_MARGIN times, the induced effects (proportional to 1/s) may have
 * lost most of their digits: the model is used, with a note (the open model's analogue is the condition limit 1e12).
 */
import type { ClosedBorder, PreparedModel } from './prepared.ts';
import { closedBorder } from './prepared.ts';
import { perronRootBordered, type PerronOptions } from './perron.ts';
import { borderedAbs, borderedOf, householdCorner } from './closure.ts';

const UNIT_ROUNDOFF = 2 ** -53;
const SAFETY = 4;
/** s below this many times its rounding bound leaves fewer than about four correct digits in 1/s. */
const ACCURACY_MARGIN = 1e4;

export type ClosedModelStatus =
  | 'usable'
  | 'no-closure' // the table has no household income row or no household consumption column
  | 'open-not-productive' // the open model itself is not usable
  | 'not-productive' // ρ(Ā) ≥ 1 certified, or s clearly negative: households re-spend more than they earn locally
  | 'within-rounding'; // ρ(Ā) is 1 to within rounding: s is not clear of its rounding error

export interface ClosedModelDecision {
  usable: boolean;
  status: ClosedModelStatus;
  /** Why the closed model is not used (null when usable). One sentence, for notes and warnings. */
  reason: string | null;
  /** Set when usable but s is within ACCURACY_MARGIN of its rounding bound: the induced effects may be inaccurate. */
  accuracyNote: string | null;
  /** The computed Schur complement s = 1 − ā_hh − h·u, or null without a bordering (no closure, singular I − A). */
  schur: number | null;
  /** The bound on the rounding error of s (see the file comment), or null with s. */
  schurRoundingBound: number | null;
  /** Certified bounds on ρ(Ā) (of |Ā| when flows are negative), or null without closure. */
  perronRootClosedBounds: [number, number] | null;
}

function gamma(k: number): number {
  const g = k * UNIT_ROUNDOFF;
  return g / (1 - g);
}

function short(x: number): string {
  return x === 0 ? '0' : x.toPrecision(3);
}

/** The rounding bound e₁ + e₂ on the computed s (file comment), times SAFETY. O(n²), from the open factorisation. */
export function schurRoundingBound(b: ClosedBorder): number {
  const { lu, piv, n } = b.openLU;
  const { u, w, closed } = b;
  const corner = Math.abs(householdCorner(closed));
  let terms = 1 + corner;
  for (let i = 0; i < n; i++) terms += Math.abs(closed.hr[i]! * u[i]!);
  // t = |U|·|û|, then |L|·t (unit diagonal), then the dot with Pᵀ-permuted |w|: row i of P·B is row piv[i] of B.
  const t = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let s = 0;
    const row = i * n;
    for (let j = i; j < n; j++) s += Math.abs(lu[row + j]!) * Math.abs(u[j]!);
    t[i] = s;
  }
  let solve = 0;
  for (let i = 0; i < n; i++) {
    let s = t[i]!;
    const row = i * n;
    for (let j = 0; j < i; j++) s += Math.abs(lu[row + j]!) * t[j]!;
    solve += Math.abs(w[piv[i]!]!) * s;
  }
  return SAFETY * (gamma(n + 2) * terms + gamma(3 * n) * solve);
}

/**
 * The decision from its inputs (pure): whether the open model is productive, the bordering (null without closure or
 * with a singular I − A), certified bounds on ρ(Ā) (of |Ā| with negative flows), and whether A has negative entries.
 */
export function decideClosedModel(input: {
  hasClosure: boolean;
  openProductive: boolean;
  border: ClosedBorder | null;
  closedBounds: [number, number] | null;
  negativeFlows: boolean;
}): ClosedModelDecision {
  const { border, closedBounds } = input;
  const schur = border ? border.s : null;
  const bound = border ? schurRoundingBound(border) : null;
  const base = { schur, schurRoundingBound: bound, perronRootClosedBounds: closedBounds, accuracyNote: null };
  const no = (status: ClosedModelStatus, reason: string): ClosedModelDecision => ({ ...base, usable: false, status, reason });
  if (!input.hasClosure) {
    return no('no-closure', 'the table has no household income row or no household consumption column, so there is no household closure (Type II)');
  }
  if (!input.openProductive || !border || schur === null || bound === null) {
    return no('open-not-productive', 'the open model is not productive, so neither is the household-closed one');
  }
  const bounds = closedBounds ? `Perron root bounds ${closedBounds[0].toPrecision(16)}–${closedBounds[1].toPrecision(16)}` : 'Perron root not computed';
  const sText = `Schur complement s = ${short(schur)}, rounding bound ${short(bound)}`;
  if (!(Math.abs(schur) > bound)) {
    return no('within-rounding', `the household-closed model is on the edge of productivity (${bounds}; ${sText}): households re-spend all they earn locally, as in a table whose only final demand is household consumption`);
  }
  const certifiedAbove = !input.negativeFlows && closedBounds !== null && closedBounds[0] >= 1;
  if (schur < 0 || certifiedAbove) {
    return no('not-productive', `the household-closed model is not productive (${bounds}; ${sText}): households re-spend more than all they earn locally`);
  }
  const accuracyNote = schur < ACCURACY_MARGIN * bound
    ? `the household-closed model is nearly singular (${sText}, less than ${ACCURACY_MARGIN.toExponential(0)} times the bound): induced effects may have lost most of their digits`
    : null;
  return { ...base, usable: true, status: 'usable', reason: null, accuracyNote };
}

// The decision made for a prepared table, keyed by the model and by the closure and factorisation it was made from.
const decided = new WeakMap<PreparedModel, { border: ClosedBorder | null; decision: ClosedModelDecision }>();

/** Record the analysis's decision for `pm`, so scenarios on the same prepared table use the same one. */
export function rememberClosedModelDecision(pm: PreparedModel, decision: ClosedModelDecision): void {
  decided.set(pm, { border: closedBorder(pm), decision });
}

/**
 * The closed-model decision for a prepared table whose open model is productive (scenarios refuse the others first;
 * a singular I − A counts as not productive here): the analysis's own when it ran on
 * `pm`, otherwise made the same way (certified bounds on ρ(Ā) by power iteration, O(n²) per step, once per table).
 */
export function closedModelDecision(pm: PreparedModel, perron: PerronOptions = {}): ClosedModelDecision {
  const border = closedBorder(pm);
  const known = decided.get(pm);
  if (known && known.border === border) return known.decision;
  let negativeFlows = false;
  for (let k = 0; k < pm.coef.A.length; k++) if (pm.coef.A[k]! < 0) { negativeFlows = true; break; }
  let closedBounds: [number, number] | null = null;
  if (pm.closed) {
    const parts = borderedOf(pm.coef.A, pm.coef.n, pm.closed);
    const { blocks: _openBlocks, rightOnly: _right, ...opts } = perron;
    const pc = perronRootBordered(negativeFlows ? borderedAbs(parts, Float64Array.from(pm.coef.A, Math.abs)) : parts, opts);
    closedBounds = [pc.lower, pc.upper];
  }
  const decision = decideClosedModel({ hasClosure: pm.closed !== null, openProductive: !pm.openLU.singular, border, closedBounds, negativeFlows });
  decided.set(pm, { border, decision });
  return decision;
}
