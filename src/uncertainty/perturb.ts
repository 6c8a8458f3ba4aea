/**
 * One perturbed table. Every non-zero perturbed cell (intermediate flows, labour income, household purchases; see
 * cv.ts) is multiplied by an independent log-normal factor with mean 1 and the cell's CV:
 *     f = exp(σ·z − σ²/2),  z ~ N(0, 1),  σ² = ln(1 + cv²)   ⇒  E[f] = 1,  sd(f) = cv.
 * Total output x is held fixed, so multiplying a flow z_ij is multiplying its coefficient a_ij = z_ij/x_j by the same
 * factor: the draws are the stochastic coefficient model of West ("A stochastic analysis of an input–output model",
 * Econometrica 54(2), 1986 — recalled from memory), with independent errors per cell as in Bullard & Sebald ("Monte
 * Carlo sensitivity analysis of input–output models", Review of Economics and Statistics 70(4), 1988 — recalled from
 * memory). Why log-normal rather than normal errors: a factor is always positive, so no coefficient changes sign
 * (a non-negative table stays non-negative without truncating the distribution, which would move its mean) and
 * a zero stays zero (no trade that the table does not show is invented); the mean and the CV are exactly the ones
 * asked for. The rows are not re-balanced: a perturbed table's rows need not add up to its total output, as in the
 * coefficient model itself.
 * Jobs per unit of output and other value added are not perturbed: they multiply the solution outside the inverse,
 * so their own uncertainty adds to the bands in proportion and is left to the analyst (stated in every report).
 */
import type { IOTable, LabelledVector } from '../table/index.ts';
import type { SigmaPlan } from './cv.ts';
import type { Stream } from './random.ts';

function perturbVector(values: Float64Array, sigma: number | Float64Array, rng: Stream): Float64Array {
  const out = new Float64Array(values.length);
  if (typeof sigma === 'number') {
    const shift = -0.5 * sigma * sigma;
    for (let i = 0; i < values.length; i++) {
      const v = values[i]!;
      out[i] = v === 0 ? 0 : v * Math.exp(shift + sigma * rng.normal());
    }
  } else {
    for (let i = 0; i < values.length; i++) {
      const v = values[i]!;
      if (v === 0) continue;
      const s = sigma[i]!;
      out[i] = v * Math.exp(s * rng.normal() - 0.5 * s * s);
    }
  }
  return out;
}

function perturbRows(rows: LabelledVector[], sigmas: (number | Float64Array)[], rng: Stream): LabelledVector[] {
  return rows.map((r, k) => ({ label: r.label, values: perturbVector(r.values, sigmas[k]!, rng) }));
}

/**
 * The draw's intermediate coefficients written into `out`: a_ij·f_ij with a factor drawn for every non-zero flow z_ij in
 * row-major order, as perturbTable draws them (a_ij = z_ij/x_j with x held fixed, so perturbing the coefficient is
 * perturbing the flow; only the last bit of rounding differs from dividing a perturbed flow). Returns whether `out` is
 * zero exactly where A is (a factor is positive, so then every entry also keeps its sign): false only when a product
 * underflowed to zero or a flow of zero has a non-zero coefficient.
 */
function perturbCoefficientsInto(Z: Float64Array, A: Float64Array, sigma: number | Float64Array, rng: Stream, out: Float64Array): boolean {
  let kept = true;
  const z = new Float64Array(STRIDE);
  for (let from = 0; from < Z.length; from += STRIDE) {
    const to = Math.min(Z.length, from + STRIDE);
    rng.normals(z, nonZeros(Z, from, to));
    const ok = typeof sigma === 'number' ? factorsUniform(Z, A, sigma, z, out, from, to) : factorsCells(Z, A, sigma, z, out, from, to);
    kept &&= ok;
  }
  return kept;
}

/** How many of Z[from … to) are not zero (a small function of its own: in the loop above it ran unoptimised). */
function nonZeros(Z: Float64Array, from: number, to: number): number {
  let m = 0;
  for (let i = from; i < to; i++) if (Z[i] !== 0) m++;
  return m;
}

/**
 * Cells per step: the step's deviates are drawn together into a buffer (Stream.normals), then its factors applied by
 * small functions called hundreds of times per draw, which V8 optimises as functions within the first draw.
 */
const STRIDE = 1024;

/** Cells [from, to) with one σ for every cell, z the deviates of its non-zero cells in order; whether the zeros were kept. */
function factorsUniform(Z: Float64Array, A: Float64Array, sigma: number, z: Float64Array, out: Float64Array, from: number, to: number): boolean {
  const shift = -0.5 * sigma * sigma;
  let kept = true;
  let k = 0;
  for (let i = from; i < to; i++) {
    const a = A[i]!;
    if (Z[i] === 0) { out[i] = 0; if (a !== 0) kept = false; continue; }
    const x = a * Math.exp(shift + sigma * z[k++]!);
    out[i] = x;
    if (x === 0 && a !== 0) kept = false;
  }
  return kept;
}

/** Cells [from, to) with a σ of their own. */
function factorsCells(Z: Float64Array, A: Float64Array, sigma: Float64Array, z: Float64Array, out: Float64Array, from: number, to: number): boolean {
  let kept = true;
  let k = 0;
  for (let i = from; i < to; i++) {
    const a = A[i]!;
    if (Z[i] === 0) { out[i] = 0; if (a !== 0) kept = false; continue; }
    const s = sigma[i]!;
    const x = a * Math.exp(s * z[k++]! - 0.5 * s * s);
    out[i] = x;
    if (x === 0 && a !== 0) kept = false;
  }
  return kept;
}

/**
 * One draw's table and coefficients without forming the perturbed flows: `A` (the unperturbed table's coefficients)
 * times the factors, written into `out`; the labour-income and household rows perturbed as perturbTable does, from
 * the same stream after the coefficients. `zerosKept`: `out` has A's zeros and signs (perturbCoefficientsInto).
 * Returns null when nothing is perturbed (the caller uses the table as it is).
 */
export function perturbCoefficients(table: IOTable, A: Float64Array, plan: SigmaPlan, rng: Stream, out: Float64Array): { table: IOTable; A: Float64Array; zerosKept: boolean } | null {
  if (!plan.perturbed) return null;
  const zerosKept = perturbCoefficientsInto(table.Z, A, plan.z, rng, out);
  return {
    table: {
      ...table,
      labourIncome: perturbRows(table.labourIncome, plan.labour, rng),
      householdConsumption: perturbRows(table.householdConsumption, plan.household, rng),
    },
    A: out,
    zerosKept,
  };
}

/** The table with its perturbed cells drawn from `rng`; the table itself when nothing is perturbed. */
export function perturbTable(table: IOTable, plan: SigmaPlan, rng: Stream): IOTable {
  if (!plan.perturbed) return table;
  return {
    ...table,
    Z: perturbVector(table.Z, plan.z, rng),
    labourIncome: perturbRows(table.labourIncome, plan.labour, rng),
    householdConsumption: perturbRows(table.householdConsumption, plan.household, rng),
  };
}
