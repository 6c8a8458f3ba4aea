/**
 * Which models results may use — the one decision, made from a prepared table: the open model when the table is
 * productive (Hawkins–Simon and a certified Perron root below 1; for a table with negative flows both tests and a
 * spectral radius below 1), the household-closed model when closed-model.ts says it is usable. The analysis
 * (analysis.ts) makes it once per table and words it; the uncertainty draws (src/uncertainty) make it again for every
 * perturbed table through this same function, so a draw uses a model exactly when the analysis of that table would.
 */
import { perronRoot, perronRootsOpenClosed, type PerronOptions, type PerronResult } from './perron.ts';
import { POWERS_OF_ONES, rememberPowersOfOnes } from './powers.ts';
import { borderedAbs, borderedOf } from './closure.ts';
import { hawkinsSimon, type HawkinsSimon } from './hawkins.ts';
import { borderedPeriod, sectorBlocks, type SectorBlock } from './graph.ts';
import { closedBorder, type PreparedModel } from './prepared.ts';
import { decideClosedModel, rememberClosedModelDecision, type ClosedModelDecision } from './closed-model.ts';
import type { Availability } from './multipliers.ts';

export interface ModelDecision {
  /** A has negative entries: the Perron bounds are those of |A|. */
  negativeFlows: boolean;
  blocks: SectorBlock[];
  /** Perron root of A (of |A| with negative flows), with certified bounds and vectors. */
  perron: PerronResult;
  hawkinsSimon: HawkinsSimon;
  productive: boolean;
  /** Set when the two tests disagree or are decided by rounding, or A has negative entries. */
  verdictNote: string | null;
  perronRootClosed: number | null;
  perronRootClosedBounds: [number, number] | null;
  /** The right vector of the iteration for ρ(Ā) (sums to 1), or null without closure. */
  perronClosedRight: Float64Array | null;
  closedModel: ClosedModelDecision;
  availability: Availability;
}

/**
 * What the decision reads of a table besides its numbers: the signs of A and the sector graphs of A and Ā, which depend
 * only on which coefficients (and household row and column entries) are zero and which are negative. A table with the
 * same zeros and signs as one already decided has the same structure (the Monte Carlo draws: positive factors on the
 * point estimate's table), so it may be passed in instead of found again.
 */
export interface ModelStructure {
  /** A has negative entries. */
  negativeFlows: boolean;
  /** Blocks of A's sector graph (graph.ts). */
  blocks: SectorBlock[];
  /** The closed graph's period as borderedPeriod gives it (undefined: not strongly connected); null without closure. */
  closedPeriod: { period: number | null | undefined } | null;
}

/** The structure of `pm`'s table (see ModelStructure). */
export function modelStructure(pm: PreparedModel): ModelStructure {
  const { n, A } = pm.coef;
  const closedPeriod = pm.closed ? { period: borderedPeriod(borderedOf(A, n, pm.closed)) } : null;
  return { negativeFlows: hasNegative(A), blocks: sectorBlocks(A, n), closedPeriod };
}

export interface DecisionOptions {
  perron?: PerronOptions;
  /** The table's structure when already known (modelStructure of a table with the same zeros and signs). */
  structure?: ModelStructure;
  /**
   * With `perron.decideAt`: a positive vector to try first for ρ(Ā), e.g. the closed Perron vector of a nearby table
   * (perron.ts `hint`; the closed-model decision reads only the comparison it keeps the same).
   */
  closedHint?: Float64Array;
  /** Spectral radius of A from the full spectrum when it was computed (decides tables with negative flows), else null. */
  spectralRadius?: number | null;
  /**
   * Form A·1, A²·1, … on the Perron iterations' passes over A and remember them for the unit spending rounds
   * (powers.ts): the analysis asks, the draws do not.
   */
  powersOfOnes?: boolean;
}

function fmt(x: number): string {
  return x.toPrecision(6);
}

function hasNegative(a: Float64Array): boolean {
  for (let k = 0; k < a.length; k++) if (a[k]! < 0) return true;
  return false;
}

/** The decision for `pm`; the closed-model part is remembered for `pm` (closedModelDecision returns it to scenarios). */
export function decideModels(pm: PreparedModel, opts: DecisionOptions = {}): ModelDecision {
  const { closed, openLU } = pm;
  const { n, A } = pm.coef;
  const structure = opts.structure ?? null;
  const negativeFlows = structure ? structure.negativeFlows : hasNegative(A);
  const absA = negativeFlows ? Float64Array.from(A, Math.abs) : A;
  const blocks = structure ? structure.blocks : sectorBlocks(A, n);
  // On Ā as A plus its border, never formed (closure.ts); bit for bit the iteration on the formed matrix. The two
  // Perron roots share their passes over A (perronRootsOpenClosed).
  const { blocks: _openBlocks, rightOnly: _right, ...perronOpts } = opts.perron ?? {};
  const parts = closed ? borderedOf(A, n, closed) : null;
  // The products ride only on passes over A itself (not |A|).
  const chain = opts.powersOfOnes && !negativeFlows ? { start: new Float64Array(n).fill(1), max: POWERS_OF_ONES } : undefined;
  const roots = parts
    ? perronRootsOpenClosed(absA, n, { ...opts.perron, blocks }, negativeFlows ? borderedAbs(parts, absA) : parts, { ...perronOpts, ...(opts.closedHint ? { hint: opts.closedHint } : {}) }, structure?.closedPeriod ?? undefined, chain)
    : { open: perronRoot(absA, n, { ...opts.perron, blocks }), closed: null, chain: [] };
  rememberPowersOfOnes(A, roots.chain);
  const perron = roots.open;
  const hs = hawkinsSimon(A, n, openLU);
  const spectralRadius = opts.spectralRadius ?? null;

  let productive: boolean;
  let verdictNote: string | null = null;
  if (openLU.singular) {
    productive = false;
    verdictNote = 'I − A is singular or within rounding of singular: 1 is an eigenvalue of A, so no finite Leontief inverse exists';
  } else if (!negativeFlows) {
    const below = perron.upper < 1;
    const above = perron.lower >= 1;
    productive = hs.holds && below;
    if (hs.holds !== below || (!below && !above) || hs.nearZero) {
      verdictNote = `the Perron root is within rounding of 1 (bounds ${fmt(perron.lower)}–${fmt(perron.upper)}; Hawkins–Simon ${hs.holds ? 'holds' : 'fails'}${hs.nearZero ? ' by a pivot of rounding size' : ''}); for a non-negative A the two tests agree exactly, so the disagreement is numerical noise: the table is treated as ${productive ? 'productive' : 'not productive'}`;
    }
  } else {
    const radiusBelow = spectralRadius !== null ? spectralRadius < 1 : perron.upper < 1;
    productive = hs.holds && radiusBelow;
    verdictNote = `A has negative entries, so Hawkins–Simon and the Perron root are not equivalent tests; the verdict needs both Hawkins–Simon and a spectral radius below 1 (${spectralRadius !== null ? `from the full spectrum, ${fmt(spectralRadius)}` : `bounded by ρ(|A|) ≤ ${fmt(perron.upper)}`})`;
  }

  let perronRootClosed: number | null = null;
  let perronRootClosedBounds: [number, number] | null = null;
  let perronClosedRight: Float64Array | null = null;
  if (roots.closed) {
    const pc = roots.closed;
    perronRootClosed = pc.root;
    perronClosedRight = pc.right;
    perronRootClosedBounds = [pc.lower, pc.upper];
  }
  const closedModel = decideClosedModel({
    hasClosure: closed !== null, openProductive: productive, border: closedBorder(pm), closedBounds: perronRootClosedBounds, negativeFlows,
  });
  rememberClosedModelDecision(pm, closedModel);

  const availability: Availability = {
    open: productive ? true : openLU.singular
      ? 'I − A is singular (1 is an eigenvalue of A), so no finite Leontief inverse exists; check that every sector has value added or imports'
      : 'the table is not productive (Perron root of A not below 1)',
    closed: closedModel.usable ? true : closedModel.reason!,
  };
  return { negativeFlows, blocks, perron, hawkinsSimon: hs, productive, verdictNote, perronRootClosed, perronRootClosedBounds, perronClosedRight, closedModel, availability };
}

/** Why a study's scenarios use no household closure when its table has a usable one. */
export const CLOSURE_OFF = 'the household closure is switched off for this study';

/** The models a study's scenarios use: the decision's availability, with the closure switched off when the study says so. */
export function modelsForClosure(availability: Availability, closure: 'households' | 'none'): Availability {
  return { open: availability.open, closed: closure === 'none' && availability.closed === true ? CLOSURE_OFF : availability.closed };
}
