/**
 * The Monte Carlo draws. Draw k perturbs the study's table (perturb.ts; optionally first re-estimating it at a drawn
 * FLQ δ, and drawing the scenarios' local shares), then recomputes everything in full through the functions the
 * study itself uses: prepareModel (coefficients, household closure, a new factorisation and bordering), decideModels
 * (the analysis' productivity verdict and closed-model decision, closed-model.ts), computeMultipliers and runScenario.
 * A draw therefore means what the point estimate means, model for model.
 *
 * Rejected draws (counted by reason, left out of the bands, not replaced — so draw k is the same draw whatever the
 * thread count, and the count of rejections says how far the CV strains the table):
 *  - not productive: the perturbed table's open model fails the analysis' verdict;
 *  - closed model not usable: the point estimate uses the household-closed model but the draw's is not usable;
 *  - refused: the scenario refuses the perturbed table (e.g. effects that are not finite).
 * A draw uses the household-closed model exactly when the point estimate does, so totals never mix Type I and II.
 */
import { isInputError } from '../diagnostics/index.ts';
import { releaseLU } from '../linalg/index.ts';
import {
  coefficients, computeMultipliers, decideModels, modelStructure, modelsForClosure, prepareModel, spectrum,
  type Availability, type ModelStructure, type Multipliers, type PreparedModel,
} from '../model/index.ts';
import { runPhase, VARIABLES, type LineSet, type ScenarioResult, type ShockInputs, type Variable } from '../scenario/index.ts';
import type { IOTable } from '../table/index.ts';
import { sigmaPlan, type SigmaPlan } from './cv.ts';
import { perturbCoefficients } from './perturb.ts';
import { PURPOSE, Stream } from './random.ts';
import type { UncertaintySettings } from './settings.ts';

/** Every multiplier of the analysis (linkage indices are not multipliers and have no bands). */
export const MULTIPLIER_KEYS = [
  'output.typeI', 'output.typeII',
  'income.simple', 'income.typeI', 'income.total', 'income.typeII',
  'employment.simple', 'employment.typeI', 'employment.total', 'employment.typeII',
  'valueAdded.simple', 'valueAdded.total',
] as const;
export type MultiplierKey = (typeof MULTIPLIER_KEYS)[number];

export const PARTS = ['direct', 'indirect', 'induced', 'total'] as const;
export type Part = (typeof PARTS)[number];
/** Variables with bands per sector. */
export const SECTOR_VARIABLES = ['output', 'employment'] as const;
export type SectorVariable = (typeof SECTOR_VARIABLES)[number];

/** What to draw: plain data, so it can be posted to another thread as it is. */
export interface DrawSetup {
  /** The point estimate's table. */
  table: IOTable;
  /** The study's closure setting (scenarios use the household-closed model only with 'households'). */
  closure: 'households' | 'none';
  /** Draw every multiplier. */
  multipliers: boolean;
  /** Scenario phases to draw, each a named list of lines (lines ready: every line has a sector). */
  scenarios: LineSet[];
  /** What the lines may refer to (spending mixes, activities, margins, price index): the study's. */
  inputs: ShockInputs;
  /** Resident share of each sector's labour income (commuting), or null for all residents: the study's closure. */
  residentShare: Float64Array | null;
  settings: UncertaintySettings;
  /** The point estimate's analysis computed the full spectrum (it decides productivity for tables with negative flows). */
  spectrum: boolean;
}

/** What cannot be posted: the county estimate at another FLQ δ (study layer), when the table is such an estimate. */
export interface DrawContext {
  tableAt?: ((delta: number) => IOTable) | null;
}

export const DRAW_STATUS = { accepted: 0, notProductive: 1, closedNotUsable: 2, refused: 3 } as const;
export type DrawStatus = (typeof DRAW_STATUS)[keyof typeof DRAW_STATUS];

export interface ScenarioLayout {
  /** Offset of each variable's direct, indirect, induced and total effect. */
  totals: Record<Variable, Record<Part, number>>;
  /** Offset of the n per-sector totals of output and of jobs (null without an employment row). */
  sectors: { output: number; employment: number | null };
}

/** Where each quantity sits in a draw's vector of results. */
export interface Layout {
  n: number;
  multipliers: { key: MultiplierKey; offset: number }[];
  scenarios: ScenarioLayout[];
  size: number;
}

/** The variables drawn for a table: taxes and full-time equivalents only when the table has those rows. */
export function bandVariables(t: IOTable): Variable[] {
  return VARIABLES.filter((v) => (v !== 'taxes' || (t.taxes?.length ?? 0) > 0) && (v !== 'fte' || (t.fte ?? null) !== null));
}

export function layoutOf(setup: DrawSetup): Layout {
  const n = setup.table.n;
  let size = 0;
  const multipliers = setup.multipliers ? MULTIPLIER_KEYS.map((key) => { const offset = size; size += n; return { key, offset }; }) : [];
  const hasJobs = setup.table.employment !== null;
  const variables = bandVariables(setup.table);
  const scenarios = setup.scenarios.map((): ScenarioLayout => {
    const totals = {} as Record<Variable, Record<Part, number>>;
    for (const v of variables) {
      const parts = {} as Record<Part, number>;
      for (const p of PARTS) parts[p] = size++;
      totals[v] = parts;
    }
    const output = size;
    size += n;
    let employment: number | null = null;
    if (hasJobs) { employment = size; size += n; }
    return { totals, sectors: { output, employment } };
  });
  return { n, multipliers, scenarios, size };
}

/** A range of draws, computed: `values` holds (to − from) vectors of `layout.size` numbers (NaN where undefined). */
export interface DrawChunk {
  from: number;
  to: number;
  values: Float64Array;
  status: Uint8Array;
  /** FLQ δ of each draw (NaN when δ is not drawn). */
  delta: Float64Array;
}

/** Local-share assumptions of one scenario: groups of final-demand line indices that share one draw. */
type ShareGroups = number[][];

/**
 * Final-demand lines spread from one spending mix share their local-share assumption (one draw moves them together);
 * every other final-demand or mix line is an assumption of its own. Other kinds have no local share of their own.
 */
export function localShareGroups(s: LineSet): ShareGroups {
  const groups = new Map<string, number[]>();
  s.lines.forEach((l, i) => {
    if (l.kind !== 'final-demand' && l.kind !== 'mix') return;
    const key = l.kind === 'final-demand' && l.mix !== undefined ? `mix:${l.mix}` : `line:${i}`;
    const g = groups.get(key);
    if (g) g.push(i); else groups.set(key, [i]);
  });
  return [...groups.values()];
}

/** The uniform range of a local share: ± range around the typed share, within [0, 1]. */
export function shareRange(share: number, range: number): [number, number] {
  return [Math.max(0, share - range), Math.min(1, share + range)];
}

export interface DrawPlan {
  setup: DrawSetup;
  layout: Layout;
  sigma: SigmaPlan;
  /** Whether the point estimate's model uses the household closure (its analysis' decision), else why not. */
  closed: true | string;
  shareGroups: ShareGroups[];
  tableAt: ((delta: number) => IOTable) | null;
  /** The point estimate's intermediate coefficients (each draw multiplies them by its factors). */
  A: Float64Array;
  /**
   * The point estimate's signs and sector graphs (decideModels), and the household row and column they were found
   * with: a draw whose coefficients have the same zeros and signs (positive factors on these A) and whose household
   * row and column have the same zeros uses them instead of searching its graphs again (the same blocks and periods,
   * so the same decision).
   */
  structure: { of: ModelStructure; hc: Float64Array | null; hr: Float64Array | null };
  /**
   * The point estimate's Perron vector of Ā: each draw's closed-model decision tries it first (a drawn Ā is near the
   * point estimate's, so one step from it usually certifies ρ(Ā) < 1, where three or more from 1 did; perron.ts `hint`
   * says why the decision is the same).
   */
  closedHint: Float64Array | null;
}

/** Resolve the CVs against the table and make the point estimate's model decision once per thread. */
/**
 * The model of a table under the study's commuting shares (the household row the study's own results use); `A`, when
 * given, are the table's intermediate coefficients already computed (a draw's perturbed ones).
 */
export function modelOf(table: IOTable, residentShare: Float64Array | null, A?: Float64Array): PreparedModel {
  return prepareModel(table, coefficients(table, A), residentShare ? { residentShare } : {});
}

/**
 * The draws only compare the Perron roots with 1 (productive or not, closed model certified not productive), so their
 * power iterations stop once the certified bounds settle that comparison; the decision is the full iteration's
 * (perron.ts, `decideAt`).
 */
const DRAW_PERRON = { decideAt: 1 };

export function planDraws(setup: DrawSetup, ctx: DrawContext = {}): DrawPlan {
  const pm = modelOf(setup.table, setup.residentShare);
  const structure = modelStructure(pm);
  const base = decideModels(pm, { structure, spectralRadius: spectralRadiusFor(setup, structure.negativeFlows, pm.coef.A, pm.coef.n) });
  return {
    setup,
    layout: layoutOf(setup),
    sigma: sigmaPlan(setup.table, setup.settings.cv, setup.settings.cvRules),
    closed: base.availability.closed,
    shareGroups: setup.scenarios.map(localShareGroups),
    tableAt: setup.settings.deltaRange && ctx.tableAt ? ctx.tableAt : null,
    A: pm.coef.A,
    structure: { of: structure, hc: pm.closed?.hc ?? null, hr: pm.closed?.hr ?? null },
    closedHint: positive(base.perronClosedRight),
  };
}

/** v when every entry is positive (a start vector certifies an upper bound only then), else null. */
function positive(v: Float64Array | null): Float64Array | null {
  if (v === null) return null;
  for (let i = 0; i < v.length; i++) if (!(v[i]! > 0)) return null;
  return v;
}

function spectralRadiusFor(setup: DrawSetup, negativeFlows: boolean, A: Float64Array, n: number): number | null {
  // Only tables with negative flows need it for the verdict.
  if (!setup.spectrum || !negativeFlows) return null;
  const modes = spectrum(A, n);
  return modes.length ? modes[0]!.modulus : null;
}

function writeValues(out: Float64Array, at: number, v: readonly (number | null)[] | Float64Array | null, n: number): void {
  for (let i = 0; i < n; i++) {
    const x = v ? v[i] : null;
    out[at + i] = x === null || x === undefined || !Number.isFinite(x) ? Number.NaN : x;
  }
}

function multiplierValues(m: Multipliers, key: MultiplierKey): (number | null)[] {
  const [group, form] = key.split('.') as [string, string];
  return (m as unknown as Record<string, Record<string, (number | null)[]>>)[group]![form]!;
}

function writeScenario(out: Float64Array, base: number, lay: ScenarioLayout, r: ScenarioResult, n: number): boolean {
  let finite = true;
  for (const v of Object.keys(lay.totals) as Variable[]) {
    const t = r.totals[v];
    for (const p of PARTS) {
      const x = t ? t[p] : null;
      out[base + lay.totals[v][p]] = x === null ? Number.NaN : x;
      if (x !== null && !Number.isFinite(x)) finite = false;
    }
  }
  writeValues(out, base + lay.sectors.output, r.effects.output.total, n);
  if (lay.sectors.employment !== null) writeValues(out, base + lay.sectors.employment, r.effects.employment?.total ?? null, n);
  return finite;
}

/** The scenario with its local shares drawn (each group moves together within its lines' ranges). */
function drawShares(s: LineSet, groups: ShareGroups, range: number, rng: Stream): LineSet {
  const lines = s.lines.slice();
  for (const g of groups) {
    const u = rng.uniform();
    for (const i of g) {
      const l = lines[i]!;
      const [lo, hi] = shareRange(l.localShare, range);
      lines[i] = { ...l, localShare: lo + (hi - lo) * u };
    }
  }
  return { ...s, lines };
}

function sameZeros(p: Float64Array | null, q: Float64Array | null): boolean {
  if (p === null || q === null) return p === q;
  if (p.length !== q.length) return false;
  for (let i = 0; i < p.length; i++) if ((p[i] === 0) !== (q[i] === 0)) return false;
  return true;
}

/** The plan's structure when `pm` (whose A has the plan's zeros and signs) has the plan's household zeros too, else null. */
function knownStructure(plan: DrawPlan, pm: PreparedModel): ModelStructure | null {
  const { of, hc, hr } = plan.structure;
  return sameZeros(pm.closed?.hc ?? null, hc) && sameZeros(pm.closed?.hr ?? null, hr) ? of : null;
}

/**
 * One evaluation of the study's quantities on `table` (perturbed or not), written at `out[base…]`: the status says
 * whether it counts. `shares` is the local-share stream (null: the shares as typed). `zerosKept`: A has the zeros and
 * signs of the plan's A.
 */
function evaluate(plan: DrawPlan, table: IOTable, A: Float64Array | undefined, zerosKept: boolean, shares: Stream | null, out: Float64Array, base: number): DrawStatus {
  const pm = modelOf(table, plan.setup.residentShare, A);
  try {
    return evaluateModel(plan, pm, zerosKept ? knownStructure(plan, pm) : null, shares, out, base);
  } finally {
    releaseLU(pm.openLU); // nothing of the draw's model is kept: the next draw factors in the same storage
  }
}

function evaluateModel(plan: DrawPlan, pm: PreparedModel, known: ModelStructure | null, shares: Stream | null, out: Float64Array, base: number): DrawStatus {
  const { setup, layout } = plan;
  const n = layout.n;
  const structure = known ?? modelStructure(pm);
  const decision = decideModels(pm, {
    structure, spectralRadius: spectralRadiusFor(setup, structure.negativeFlows, pm.coef.A, n), perron: DRAW_PERRON,
    ...(plan.closedHint ? { closedHint: plan.closedHint } : {}),
  });
  if (decision.availability.open !== true) return DRAW_STATUS.notProductive;
  if (plan.closed === true && decision.availability.closed !== true) return DRAW_STATUS.closedNotUsable;
  // The point estimate's models: the closed model exactly when the point estimate uses it.
  const models: Availability = { open: true, closed: plan.closed };
  if (setup.multipliers) {
    const m = computeMultipliers(pm, models);
    for (const { key, offset } of layout.multipliers) writeValues(out, base + offset, multiplierValues(m, key), n);
  }
  const scenarioModels = modelsForClosure(models, setup.closure);
  for (let s = 0; s < setup.scenarios.length; s++) {
    const sc = shares && setup.settings.localShareRange > 0 ? drawShares(setup.scenarios[s]!, plan.shareGroups[s]!, setup.settings.localShareRange, shares) : setup.scenarios[s]!;
    let r: ScenarioResult;
    try {
      r = runPhase(pm, sc, scenarioModels, setup.inputs);
    } catch (e) {
      if (isInputError(e)) return DRAW_STATUS.refused;
      throw e;
    }
    if (!writeScenario(out, base, layout.scenarios[s]!, r, n)) return DRAW_STATUS.refused;
  }
  return DRAW_STATUS.accepted;
}

/** The point estimate through the same evaluation (no perturbation, δ and local shares as estimated and typed). */
export function pointEstimate(plan: DrawPlan): { values: Float64Array; status: DrawStatus } {
  const values = new Float64Array(plan.layout.size);
  return { values, status: evaluate(plan, plan.setup.table, plan.A, true, null, values, 0) };
}

/** Draws from ≤ k < to. Draw k depends only on (seed, k): any split of the draws over threads gives the same numbers. */
export function runDraws(plan: DrawPlan, from: number, to: number): DrawChunk {
  const { setup, layout } = plan;
  const { seed, deltaRange } = setup.settings;
  const count = Math.max(0, to - from);
  const values = new Float64Array(count * layout.size);
  const status = new Uint8Array(count);
  const delta = new Float64Array(count).fill(Number.NaN);
  // One buffer for every draw's coefficients in this range: a draw's model is dropped before the next draw starts.
  const buffer = new Float64Array(layout.n * layout.n);
  for (let c = 0; c < count; c++) {
    const k = from + c;
    let table = setup.table;
    let A = plan.A;
    let zerosKept = true;
    if (plan.tableAt && deltaRange) {
      const d = deltaRange[0] + (deltaRange[1] - deltaRange[0]) * new Stream(seed, k, PURPOSE.delta).uniform();
      delta[c] = d;
      table = plan.tableAt(d);
      A = coefficients(table).A;
      zerosKept = false; // another table: its own structure
    }
    const drawn = perturbCoefficients(table, A, plan.sigma, new Stream(seed, k, PURPOSE.coefficients), buffer);
    if (drawn) {
      ({ table, A } = drawn);
      zerosKept &&= drawn.zerosKept;
    }
    status[c] = evaluate(plan, table, A, zerosKept, new Stream(seed, k, PURPOSE.localShares), values, c * layout.size);
  }
  return { from, to, values, status, delta };
}
