/**
 * One call from an imported table to everything the analysis screens and reports show: coefficients, viability
 * (Hawkins–Simon, Perron root, irreducibility, period, spectrum), the power-series certificate, multipliers and
 * linkages, accuracy checks, and warnings. The result holds only typed arrays, plain arrays and plain objects, so it
 * crosses a Web Worker boundary by structured clone and turns into JSON without loss (no NaN or Infinity anywhere).
 */
import type { Warning } from '../diagnostics/index.ts';
import type { IOTable } from '../table/index.ts';
import { conditionEstimate1, RESIDUAL_THRESHOLD, UNIT_ROUNDOFF } from '../linalg/index.ts';
import { formLeontief } from './leontief.ts';
import { coefficients } from './coefficients.ts';
import { prepareModel, solveClosed, type PreparedModel } from './prepared.ts';
import type { ClosedModelDecision } from './closed-model.ts';
import { decideModels } from './availability.ts';
import {
  implausibleMultipliers, implausibleMultiplierWarning, negativeValueAdded, negativeValueAddedWarning,
  type ImplausibleMultiplier, type NegativeValueAdded,
} from './plausibility.ts';
import type { PerronOptions } from './perron.ts';
import type { HawkinsSimon } from './hawkins.ts';
import { borderedOf, type Bordered } from './closure.ts';
import { spectrum as fullSpectrum, SPECTRUM_MAX_SECTORS, type Mode } from './spectrum.ts';
import { seriesVerdict, type SeriesVerdict } from './rounds.ts';
import { computeLinkages, computeMultipliers, type Availability, type Linkages, type Multipliers } from './multipliers.ts';

export interface AnalysisOptions {
  /** Relative tolerance for `roundsToTolerance` (default 1e-6: rounds until what is left is a millionth of the demand). */
  tolerance?: number;
  /** Full spectrum: 'auto' (default) computes it for n ≤ 400. */
  spectrum?: boolean | 'auto';
  /** Form the explicit Leontief inverse (for display and export; O(n³)). Default false. */
  inverse?: boolean;
  perron?: PerronOptions;
}

export interface BlockInfo {
  /** Sector indices, ascending. */
  sectors: number[];
  /** Gcd of cycle lengths in the block; null for a block without cycles (it only passes demand on). */
  period: number | null;
  /** Certified bounds on the block's Perron root. */
  perronRootBounds: [number, number];
}

export interface Viability {
  /** ρ(A), midpoint of the certified interval. For a table with negative flows: ρ(|A|), an upper bound on the spectral radius. */
  perronRoot: number;
  perronRootBounds: [number, number];
  perronIterations: number;
  perronConverged: boolean;
  /** Right Perron vector (sums to 1): the long-run direction of the rounds. */
  rightPerronVector: Float64Array;
  /** Left Perron vector (sums to 1): long-run weight of each sector's demand. */
  leftPerronVector: Float64Array;
  hawkinsSimon: boolean;
  hawkinsSimonDetail: HawkinsSimon;
  irreducible: boolean;
  /** Strongly connected blocks in topological order (a block sells only to itself and to later blocks). */
  blocks: BlockInfo[];
  /** Period of A when irreducible, else null. */
  period: number | null;
  /** Irreducible with period 1. */
  primitive: boolean;
  /** The one verdict: Hawkins–Simon holds and ρ(A) < 1 (certified). */
  productive: boolean;
  /** Set when the two tests disagree or are decided by rounding (ρ(A) ≈ 1). */
  verdictNote: string | null;
  /** ρ(Ā) of the household-closed model; null without closure. */
  perronRootClosed: number | null;
  perronRootClosedBounds: [number, number] | null;
  /** The closed model is usable (`closedModel.usable`); null without closure. */
  closedProductive: boolean | null;
  /** The one closed-model decision (closed-model.ts): status, reason, Schur complement and its rounding bound. */
  closedModel: ClosedModelDecision;
  /**
   * Rounds after which less than `tolerance`·‖f‖∞ of any demand f is left unaccounted; null when the series diverges,
   * is not certified, or needs more than MAX_ROUNDS rounds (`series.kind` says which, `series.reason` why).
   */
  roundsToTolerance: number | null;
  tolerance: number;
  /** Eigenvalues of A by decreasing modulus with their long-run mode; null when skipped (see spectrumNote). */
  spectrum: Mode[] | null;
  spectrumNote: string | null;
  /** A has negative entries: Perron–Frobenius and Hawkins–Simon ⇔ ρ < 1 do not apply as such. */
  negativeFlows: boolean;
  /**
   * Sectors whose value added x_j − Σ_i z_ij − m_j is negative (plausibility.ts), with the numbers; empty when none.
   * Not part of `productive` (a table can be productive with such a sector), but warned about by name.
   */
  negativeValueAdded: NegativeValueAdded[];
}

export interface AccuracyChecks {
  /** ‖b − (I−A)x‖₁/(‖I−A‖₁‖x‖₁·n·ε) for the solve x = L·1 (LAPACK xGET02 ratio); null when not solvable. */
  solveResidual: number | null;
  /** ‖(I−A)X − I‖₁/(‖I−A‖₁‖X‖₁·n·ε) for the explicit inverse (xGET03 ratio); null when the inverse was not formed. */
  inverseResidual: number | null;
  /** The same ratio for the closed system (I − Ā)x̄ = 1 solved by bordering; null without a productive closure. */
  closedSolveResidual: number | null;
  /** Estimated 1-norm condition number of I − A; null when singular. */
  condition: number | null;
  residualThreshold: number;
}

export interface CoefficientsOut {
  /** Technical coefficients, n×n row-major. */
  A: Float64Array;
  x: Float64Array;
  labourIncome: Float64Array;
  otherValueAdded: Float64Array;
  /** Taxes less subsidies per unit of output, or null without a taxes row. */
  taxes: Float64Array | null;
  imports: Float64Array;
  employment: Float64Array | null;
  /** Full-time equivalents per unit of output, or null without an FTE row. */
  fte: Float64Array | null;
  /** Household purchases from each sector per unit of household income; null without closure. */
  householdConsumption: Float64Array | null;
  householdIncomeTotal: number;
}

export interface Analysis {
  tableName: string;
  sectors: string[];
  n: number;
  moneyUnit: string;
  coefficients: CoefficientsOut;
  viability: Viability;
  series: SeriesVerdict;
  multipliers: Multipliers;
  /** Output multipliers above MULTIPLIER_PLAUSIBILITY (Type I 4, Type II 6), by measure, largest first; empty when none. */
  implausibleMultipliers: ImplausibleMultiplier[];
  linkages: Linkages;
  /**
   * The one decision on which models results may use: the open model when the table is productive, the
   * household-closed model when it is productive too; otherwise the reason. Multipliers, scenarios and every front
   * end read it from here.
   */
  availability: Availability;
  /** Explicit L = (I − A)⁻¹, n×n row-major, only when asked for (`inverse: true`) and the table is productive. */
  leontief: Float64Array | null;
  checks: AccuracyChecks;
  warnings: Warning[];
}

/** Above this 1-norm condition estimate of I − A, results may have lost most of their digits (warned). */
export const CONDITION_LIMIT = 1e12;

/** ‖I − A‖₁ (maximum absolute column sum), read row by row so the n×n matrix I − A is never formed. */
function identityMinusNorm1(a: Float64Array, n: number): number {
  const col = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const row = i * n;
    for (let j = 0; j < n; j++) col[j] = col[j]! + Math.abs((i === j ? 1 : 0) - a[row + j]!);
  }
  let best = 0;
  for (let j = 0; j < n; j++) if (col[j]! > best) best = col[j]!;
  return best;
}

/**
 * LAPACK xGET02 ratio ‖b − (I − A)x‖₁ / (‖I − A‖₁·‖x‖₁·n·ε) for one solve, computed from A (as linalg's solveResidual
 * does for a formed matrix), so no n×n copy is made.
 */
function openSolveResidual(a: Float64Array, n: number, x: Float64Array, b: Float64Array, norm: number): number {
  let resid = 0, xnorm = 0;
  for (let i = 0; i < n; i++) {
    let s = b[i]! - x[i]!;
    const row = i * n;
    for (let j = 0; j < n; j++) s += a[row + j]! * x[j]!;
    resid += Math.abs(s);
    xnorm += Math.abs(x[i]!);
  }
  if (resid === 0) return 0;
  const denom = norm * xnorm * n * UNIT_ROUNDOFF;
  return denom > 0 ? resid / denom : Number.POSITIVE_INFINITY;
}

/** ‖I − Ā‖₁ from the parts of Ā (closure.ts), accumulated in the order `identityMinusNorm1` uses on the formed matrix. */
function borderedIdentityMinusNorm1(b: Bordered): number {
  const { A, n, hc, hr, corner } = b;
  const col = new Float64Array(n + 1);
  for (let i = 0; i < n; i++) {
    const row = i * n;
    for (let j = 0; j < n; j++) col[j] = col[j]! + Math.abs((i === j ? 1 : 0) - A[row + j]!);
    col[n] = col[n]! + Math.abs(0 - hc[i]!);
  }
  for (let j = 0; j < n; j++) col[j] = col[j]! + Math.abs(0 - hr[j]!);
  col[n] = col[n]! + Math.abs(1 - corner);
  let best = 0;
  for (let j = 0; j <= n; j++) if (col[j]! > best) best = col[j]!;
  return best;
}

/** `openSolveResidual` for the closed system, from the parts of Ā (each row summed in the formed matrix's order). */
function borderedSolveResidual(b: Bordered, x: Float64Array, rhs: Float64Array, norm: number): number {
  const { A, n, hc, hr, corner } = b;
  const m = n + 1;
  let resid = 0, xnorm = 0;
  const xn = x[n]!;
  for (let i = 0; i < n; i++) {
    let s = rhs[i]! - x[i]!;
    const row = i * n;
    for (let j = 0; j < n; j++) s += A[row + j]! * x[j]!;
    s += hc[i]! * xn;
    resid += Math.abs(s);
    xnorm += Math.abs(x[i]!);
  }
  let s = rhs[n]! - xn;
  for (let j = 0; j < n; j++) s += hr[j]! * x[j]!;
  s += corner * xn;
  resid += Math.abs(s);
  xnorm += Math.abs(xn);
  if (resid === 0) return 0;
  const denom = norm * xnorm * m * UNIT_ROUNDOFF;
  return denom > 0 ? resid / denom : Number.POSITIVE_INFINITY;
}

function fmt(x: number): string {
  return x.toPrecision(6);
}

/** Analyse a validated table. */
export function analyzeTable(table: IOTable, opts: AnalysisOptions = {}): Analysis {
  return analyzePrepared(prepareModel(table, coefficients(table)), opts);
}

/** Analyse an already prepared model (the UI keeps the PreparedModel for scenarios). */
export function analyzePrepared(pm: PreparedModel, opts: AnalysisOptions = {}): Analysis {
  const { table, coef, closed, openLU } = pm;
  const { n, A, sectors } = coef;
  const tolerance = opts.tolerance ?? 1e-6;
  // The importer's inputs-exceed-output note is superseded by the analysis's own finding (with each sector's value added).
  const valueAddedFindings = negativeValueAdded(coef);
  const warnings: Warning[] = table.warnings.filter((w) => !(w.code === 'inputs-exceed-output' && valueAddedFindings.length > 0));
  const warn = (code: string, message: string): void => { warnings.push({ code, message }); };

  let modes: Mode[] | null = null;
  let spectrumNote: string | null = null;
  const wantSpectrum = opts.spectrum ?? 'auto';
  if (wantSpectrum === true || (wantSpectrum === 'auto' && n <= SPECTRUM_MAX_SECTORS)) {
    modes = fullSpectrum(A, n);
  } else {
    spectrumNote = wantSpectrum === false
      ? 'full spectrum not requested'
      : `full spectrum skipped for ${n} sectors (computed up to ${SPECTRUM_MAX_SECTORS}); the Perron root is certified by its bounds`;
  }
  const spectralRadius = modes && modes.length ? modes[0]!.modulus : null;

  // The one verdict, and the closed-model decision (availability.ts); scenarios on this prepared table read the same.
  const decision = decideModels(pm, { ...(opts.perron ? { perron: opts.perron } : {}), spectralRadius, powersOfOnes: true });
  const { negativeFlows, blocks, perron, productive, verdictNote, perronRootClosed, perronRootClosedBounds, closedModel } = decision;
  const hs = decision.hawkinsSimon;
  const irreducible = blocks.length === 1 && (n === 1 ? blocks[0]!.cyclic : true);
  const period = irreducible ? blocks[0]!.period : null;
  if (negativeFlows) warn('negative-flows', 'the table has negative intermediate flows: Perron–Frobenius results apply to |A| only, and multipliers may be negative');
  if (!productive) {
    const hsText = hs.firstFailing
      ? `Hawkins–Simon fails at the leading minor of order ${hs.firstFailing.order} (sector '${sectors[hs.firstFailing.sector]}', pivot ${fmt(hs.firstFailing.pivot)})`
      : 'Hawkins–Simon holds';
    warn('not-productive', `the table is not productive: Perron root ${fmt(perron.root)} (bounds ${fmt(perron.lower)}–${fmt(perron.upper)}); ${hsText}; multipliers are not defined`);
  } else if (verdictNote && !negativeFlows) {
    warn('productivity-noise', verdictNote);
  }
  const closedProductive = closed ? closedModel.usable : null;
  if (productive && closed && !closedModel.usable) warn('closed-not-productive', `${closedModel.reason}; Type II multipliers are not defined`);
  if (closedModel.accuracyNote) warn('closed-ill-conditioned', closedModel.accuracyNote);

  const avail: Availability = decision.availability;
  const multipliers = computeMultipliers(pm, avail);
  const linkages = computeLinkages(pm, multipliers.output.typeI, avail);
  if (valueAddedFindings.length) warn('negative-value-added', negativeValueAddedWarning(valueAddedFindings, table.moneyUnit));
  const highMultipliers = implausibleMultipliers(multipliers, sectors);
  for (const flag of highMultipliers) warn('implausible-multiplier', implausibleMultiplierWarning(flag));

  // Accuracy checks on the factorisation.
  let condition: number | null = null;
  let residual: number | null = null;
  let inverseResidual: number | null = null;
  let closedResidual: number | null = null;
  let leontief: Float64Array | null = null;
  if (!openLU.singular) {
    const norm = identityMinusNorm1(A, n);
    const c = conditionEstimate1(openLU, norm);
    condition = Number.isFinite(c) ? c : null;
    if (condition === null || condition > CONDITION_LIMIT) {
      warn('ill-conditioned', `I − A is ill-conditioned (condition estimate ${condition === null ? 'beyond range' : condition.toExponential(2)}, limit ${CONDITION_LIMIT.toExponential(0)}): results may have lost most of their digits`);
    }
    if (linkages.rowSums.every((v) => v !== null)) {
      const r = openSolveResidual(A, n, Float64Array.from(linkages.rowSums as number[]), new Float64Array(n).fill(1), norm);
      residual = Number.isFinite(r) ? r : null;
    }
    if (opts.inverse && productive) ({ L: leontief, residual: inverseResidual } = formLeontief(pm));
    const parts = closed ? borderedOf(coef.A, coef.n, closed) : null;
    if (parts && closedProductive) {
      const ones = new Float64Array(n + 1).fill(1);
      const r = borderedSolveResidual(parts, solveClosed(pm, ones), ones, borderedIdentityMinusNorm1(parts));
      closedResidual = Number.isFinite(r) ? r : null;
    }
    for (const [what, r] of [['solve', residual], ['inverse', inverseResidual], ['household-closed solve', closedResidual]] as const) {
      if (r !== null && r > RESIDUAL_THRESHOLD) {
        warn('residual', `the ${what} residual check failed (scaled residual ${fmt(r)} > ${RESIDUAL_THRESHOLD}): the results may be inaccurate`);
      }
    }
  }

  // Power series.
  const series = seriesVerdict(
    A, n,
    { perron: negativeFlows ? null : perron.right, leontiefRowSums: productive ? Float64Array.from(linkages.rowSums as number[]) : null },
    tolerance,
    negativeFlows ? 0 : perron.lower,
  );
  if (productive && !series.converges) warn(series.kind === 'too-slow' ? 'not-practically-convergent' : 'series-uncertified', series.reason);

  if (!perron.converged) {
    warn('perron-slow', `the Perron root iteration stopped before its tolerance; the certified bounds ${fmt(perron.lower)}–${fmt(perron.upper)} still hold`);
  }
  if (modes && spectralRadius !== null && !negativeFlows) {
    const slack = 1e-8 * Math.max(1, perron.upper);
    if (spectralRadius < perron.lower - slack || spectralRadius > perron.upper + slack) {
      warn('spectrum-disagrees', `the eigenvalue routine's spectral radius ${fmt(spectralRadius)} lies outside the certified Perron bounds ${fmt(perron.lower)}–${fmt(perron.upper)} (the bounds are rigorous)`);
    }
  }

  const viability: Viability = {
    perronRoot: perron.root,
    perronRootBounds: [perron.lower, perron.upper],
    perronIterations: perron.iterations,
    perronConverged: perron.converged,
    rightPerronVector: perron.right,
    leftPerronVector: perron.left,
    hawkinsSimon: hs.holds,
    hawkinsSimonDetail: hs,
    irreducible,
    blocks: blocks.map((b, k) => ({ sectors: b.sectors, period: b.period, perronRootBounds: perron.blockBounds[k] ?? [0, 0] })),
    period,
    primitive: irreducible && period === 1,
    productive,
    verdictNote,
    perronRootClosed,
    perronRootClosedBounds,
    closedProductive,
    closedModel,
    roundsToTolerance: series.converges ? series.roundsToTolerance : null,
    tolerance,
    spectrum: modes,
    spectrumNote,
    negativeFlows,
    negativeValueAdded: valueAddedFindings,
  };

  return {
    tableName: table.name,
    sectors: [...sectors],
    n,
    moneyUnit: table.moneyUnit,
    coefficients: {
      A,
      x: coef.x,
      labourIncome: coef.h,
      otherValueAdded: coef.otherVA,
      taxes: coef.taxes,
      imports: coef.imports,
      employment: coef.e,
      fte: coef.fte,
      householdConsumption: closed ? closed.hc : null,
      householdIncomeTotal: coef.householdIncomeTotal,
    },
    viability,
    series,
    multipliers,
    implausibleMultipliers: highMultipliers,
    linkages,
    availability: avail,
    leontief,
    checks: { solveResidual: residual, inverseResidual, closedSolveResidual: closedResidual, condition, residualThreshold: RESIDUAL_THRESHOLD },
    warnings,
  };
}
