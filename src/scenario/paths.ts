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
import { luDeterminant, luFactor } from '../linalg/index.ts';
import {
  solveClosed, solveClosedTransposed, solveOpen, solveOpenTransposed, type PreparedModel,
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

interface System {
  m: number;
  M: Float64Array;
  solve: (b: Float64Array) => Float64Array;
  solveT: (c: Float64Array) => Float64Array;
  labels: string[];
}

function systemOf(pm: PreparedModel, model: 'open' | 'closed'): System {
  if (model === 'closed') {
    if (!pm.closed) throw new Error('the table has no household closure');
    return {
      m: pm.closed.m,
      M: pm.closed.Abar,
      solve: (b) => solveClosed(pm, b),
      solveT: (c) => solveClosedTransposed(pm, c),
      labels: [...pm.coef.sectors, HOUSEHOLD_POLE_LABEL],
    };
  }
  return { m: pm.coef.n, M: pm.coef.A, solve: (b) => solveOpen(pm, b), solveT: (c) => solveOpenTransposed(pm, c), labels: pm.coef.sectors };
}

/**
 * The largest structural paths from the shock `f` (length n for the open model, n+1 for the closed one; use the
 * scenario's effective demand so fixed-output lines enter as the demand they imply) to `destination`.
 */
export function structuralPaths(pm: PreparedModel, f: Float64Array, destination: number, opts: PathOptions = {}): PathAnalysis {
  const model = opts.model ?? 'open';
  const sys = systemOf(pm, model);
  const { m, M } = sys;
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

  const columns = new Map<number, Float64Array>();
  const column = (k: number): Float64Array => {
    let c = columns.get(k);
    if (!c) {
      const e = new Float64Array(m);
      e[k] = 1;
      c = sys.solve(e);
      columns.set(k, c);
    }
    return c;
  };
  const pathMultiplier = (poles: number[]): number => {
    const k = poles.length;
    const sub = new Float64Array(k * k);
    for (let c = 0; c < k; c++) {
      const col = column(poles[c]!);
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
    for (let k = 0; k < m; k++) {
      if (onPath[k]) continue;
      const a = M[k * m + last]!;
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
