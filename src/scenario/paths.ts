/**
 * Structural path analysis (Defourny & Thorbecke, "Structural path analysis and multiplier decomposition within a
 * social accounting matrix framework", Economic Journal 94, 1984): how a shock reaches one destination sector.
 *
 * For an elementary path p = (o → k₁ → … → d) — no pole visited twice — with arc intensities a_{k₁o}, a_{k₂k₁}, …:
 * - direct influence  I_D(p) = a_{k₁o}·a_{k₂k₁}·…·a_{d k_r} (product along the path; a_ij is what j buys from i per unit),
 * - total influence   I_T(p) = I_D(p)·M_p, with the path multiplier M_p = Δ_p / Δ (Δ = det(I − A), Δ_p the same
 *   determinant without the path's poles), which carries the feedback loops adjacent to the path,
 * - global influence  I_G(o → d) = l_do, the Leontief-inverse entry; it equals the sum of I_T over all elementary paths
 *   from o to d (D&T 1984).
 * M_p is computed as det(L_pp), the principal minor of the inverse on the path's poles, which equals Δ_p / Δ by Jacobi's
 * complementary-minor identity — a |p|×|p| determinant instead of an (m−|p|)×(m−|p|) one.
 *
 * A path's contribution to the destination is I_T(p)·f_o; over all elementary paths from every shocked pole the
 * contributions add up to the destination's output change. The search is bounded: at most `maxLength` arcs, and a partial
 * path o→…→k is not extended when |f_o|·I_D(partial)·l_dk — what everything beyond k can still carry to d, before the
 * partial path's own feedback — is below `minShare`·|x_d|; `maxVisits` caps the work.
 */
import { luDeterminant, luFactor, luSolveMany } from '../linalg/index.ts';
import {
  borderedOf, closedBorder, solveClosedTransposed, solveOpenTransposed, type PreparedModel,
} from '../model/index.ts';

export interface PathOptions {
  /** Longest path followed, in arcs. Default 6. */
  maxLength?: number;
  /** Partial paths that can carry less than this share of the destination's change are not followed. Default 1e-4. */
  minShare?: number;
  /** How many paths to list, largest |contribution| first. Default 20. */
  maxPaths?: number;
  /** Cap on search steps. Default 200 000. */
  maxVisits?: number;
  /** Search the open model (Type I, default) or the household-closed one (households as a pole). */
  model?: 'open' | 'closed';
}
export interface StructuralPath {
  /** Poles from origin to destination (indices; n is the household pole in the closed model). */
  poles: number[];
  labels: string[];
  direct: number;
  pathMultiplier: number;
  total: number;
  /** l_do: the global influence of the origin on the destination. */
  global: number;
  /** Shock at the origin. */
  shock: number;
  /** total × shock: what the path carries to the destination. */
  contribution: number;
  /** contribution / destination total, or null when that total is zero. */
  share: number | null;
}

export interface PathAnalysis {
  destination: number;
  destinationLabel: string;
  model: 'open' | 'closed';
  /** Destination's output change in the chosen model (sum over all paths). */
  destinationTotal: number;
  paths: StructuralPath[];
  /** Sum of the listed paths' contributions, and its share of destinationTotal (null when that is zero). */
  explained: number;
  explainedShare: number | null;
  /** Paths found before the list was cut to maxPaths. */
  found: number;
  /** True when maxVisits stopped the search early. */
  truncated: boolean;
  settings: Required<Omit<PathOptions, 'model'>>;
}

export const HOUSEHOLD_POLE_LABEL = 'Households';

/** No search takes more steps than this, whatever `maxVisits` asks (every search ends; elementary paths bound the depth). */
export const MAX_PATH_VISITS = 10_000_000;

/**
 * The system searched, as A (n×n) plus, for the closed model, the household column hc, row hr and corner (Ā is never
 * formed: at 2,000 sectors it would be another 32 MB), with the transposed solve and the columns of its inverse.
 */
interface System {
  m: number;
  n: number;
  A: Float64Array;
  hc: Float64Array | null;
  hr: Float64Array | null;
  corner: number;
  solveT: (c: Float64Array) => Float64Array;
  /** Columns k of (I − M)⁻¹ for the given poles, all in one blocked solve (luSolveMany). */
  columns: (poles: number[]) => Float64Array[];
  labels: string[];
}

/** Columns `poles` of L = (I − A)⁻¹: one blocked solve with a unit vector per pole. */
function openColumns(pm: PreparedModel, poles: number[]): Float64Array[] {
  const n = pm.coef.n;
  const k = poles.length;
  if (k === 0) return [];
  const b = new Float64Array(n * k);
  poles.forEach((p, c) => { if (p < n) b[p * k + c] = 1; });
  const x = luSolveMany(pm.openLU, b, k);
  return poles.map((_, c) => {
    const col = new Float64Array(n);
    for (let i = 0; i < n; i++) col[i] = x[i * k + c]!;
    return col;
  });
}

function systemOf(pm: PreparedModel, model: 'open' | 'closed'): System {
  const { n, A } = pm.coef;
  if (model === 'closed') {
    if (!pm.closed) throw new Error('the table has no household closure');
    const parts = borderedOf(A, n, pm.closed);
    return {
      m: n + 1, n, A, hc: parts.hc, hr: parts.hr, corner: parts.corner,
      solveT: (c) => solveClosedTransposed(pm, c),
      // Column k of L̄ by the bordering (prepared.ts): x = L·e_k + u·y, y = w_k/s (k < n); for the household pole
      // (k = n) x = u/s, y = 1/s.
      columns: (poles) => {
        const border = closedBorder(pm);
        if (!border || border.s === 0) throw new Error('matrix is singular: no unique solution');
        const { u, w, s } = border;
        const open = openColumns(pm, poles);
        return poles.map((p, c) => {
          const y = p < n ? w[p]! / s : 1 / s;
          const out = new Float64Array(n + 1);
          const x0 = open[c]!;
          for (let i = 0; i < n; i++) out[i] = (p < n ? x0[i]! : 0) + u[i]! * y;
          out[n] = y;
          return out;
        });
      },
      labels: [...pm.coef.sectors, HOUSEHOLD_POLE_LABEL],
    };
  }
  return { m: n, n, A, hc: null, hr: null, corner: 0, solveT: (c) => solveOpenTransposed(pm, c), columns: (poles) => openColumns(pm, poles), labels: pm.coef.sectors };
}

/**
 * The largest structural paths from the shock `f` (length n for the open model, n+1 for the closed one; use the
 * scenario's effective demand so fixed-output lines enter as the demand they imply) to `destination`.
 */
export function structuralPaths(pm: PreparedModel, f: Float64Array, destination: number, opts: PathOptions = {}): PathAnalysis {
  const model = opts.model ?? 'open';
  const sys = systemOf(pm, model);
  const { m, n, A, hc, hr, corner } = sys;
  const settings = {
    maxLength: opts.maxLength ?? 6,
    minShare: opts.minShare ?? 1e-4,
    maxPaths: opts.maxPaths ?? 20,
    maxVisits: Math.min(opts.maxVisits ?? 200_000, MAX_PATH_VISITS),
  };
  if (!(destination >= 0 && destination < m)) throw new RangeError(`destination ${destination} out of range`);
  if (f.length !== m) throw new RangeError(`shock has length ${f.length}, the system has ${m} poles`);

  const unit = new Float64Array(m);
  unit[destination] = 1;
  const toDest = sys.solveT(unit); // toDest[k] = l_dk
  let destinationTotal = 0;
  for (let o = 0; o < m; o++) destinationTotal += toDest[o]! * f[o]!;
  const threshold = settings.minShare * Math.abs(destinationTotal);

  // Columns of the inverse on the poles of found paths, solved together after the search (one blocked solve for all).
  const columns = new Map<number, Float64Array>();
  const pathMultiplier = (poles: number[]): number => {
    const k = poles.length;
    const sub = new Float64Array(k * k);
    for (let c = 0; c < k; c++) {
      const col = columns.get(poles[c]!)!;
      for (let r = 0; r < k; r++) sub[r * k + c] = col[poles[r]!]!;
    }
    return luDeterminant(luFactor(sub, k));
  };

  const found: { poles: number[]; direct: number; origin: number }[] = [];
  let visits = 0;
  let truncated = false;
  const onPath = new Uint8Array(m);
  const stack: number[] = [];

  const extend = (origin: number, last: number, direct: number): void => {
    if (truncated) return;
    // Column `last` of M (A, or Ā = [A hc; hrᵀ corner] without forming it): entry k < n at col[base + k·stride], then
    // the household row's entry.
    const col = last < n ? A : hc!;
    const base = last < n ? last : 0;
    const stride = last < n ? n : 1;
    const tail = m === n ? 0 : last < n ? hr![last]! : corner;
    for (let k = 0; k < m; k++) {
      if (onPath[k]) continue;
      const a = k < n ? col[base + k * stride]! : tail;
      if (a === 0) continue;
      if (++visits > settings.maxVisits) { truncated = true; return; }
      const d = direct * a;
      if (k === destination) {
        found.push({ poles: [...stack, k], direct: d, origin });
        continue;
      }
      if (stack.length >= settings.maxLength) continue; // a further arc would make the path longer than maxLength
      if (Math.abs(f[origin]! * d * toDest[k]!) < threshold) continue;
      onPath[k] = 1;
      stack.push(k);
      extend(origin, k, d);
      stack.pop();
      onPath[k] = 0;
      if (truncated) return;
    }
  };

  for (let o = 0; o < m; o++) {
    if (f[o] === 0) continue;
    if (o === destination) {
      found.push({ poles: [o], direct: 1, origin: o });
      continue;
    }
    onPath[o] = 1;
    stack.push(o);
    extend(o, o, 1);
    stack.pop();
    onPath[o] = 0;
    if (truncated) break;
  }

  const needed = [...new Set(found.flatMap((p) => p.poles))].sort((a, b) => a - b);
  sys.columns(needed).forEach((c, q) => columns.set(needed[q]!, c));
  const all: StructuralPath[] = found.map(({ poles, direct, origin }) => {
    const pm_ = pathMultiplier(poles);
    const total = direct * pm_;
    const shock = f[origin]!;
    const contribution = total * shock;
    return {
      poles,
      labels: poles.map((p) => sys.labels[p]!),
      direct,
      pathMultiplier: pm_,
      total,
      global: toDest[origin]!,
      shock,
      contribution,
      share: destinationTotal !== 0 ? contribution / destinationTotal : null,
    };
  });
  all.sort((a, b) => Math.abs(b.contribution) - Math.abs(a.contribution));
  const paths = all.slice(0, settings.maxPaths);
  let explained = 0;
  for (const p of paths) explained += p.contribution;
  return {
    destination,
    destinationLabel: sys.labels[destination]!,
    model,
    destinationTotal,
    paths,
    explained,
    explainedShare: destinationTotal !== 0 ? explained / destinationTotal : null,
    found: all.length,
    truncated,
    settings,
  };
}
