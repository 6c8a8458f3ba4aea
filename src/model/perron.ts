/**
 * Perron root of a non-negative matrix by power iteration, with certified Collatz–Wielandt bounds
 * (Horn & Johnson, Matrix Analysis, 2nd ed. 2013, Thm 8.1.26 and Cor 8.1.29):
 *   for any v > 0:            min_i (Av)_i / v_i ≤ ρ(A) ≤ max_i (Av)_i / v_i,
 *   for any v ≥ 0, v ≠ 0:     Av ≥ αv implies ρ(A) ≥ α,
 * and the same with the left vector (wᵀA)_j / w_j. Every iterate gives a valid interval, so the bounds hold even if the
 * iteration stops early; iterating only narrows them. Rounding in (Av)_i is covered by widening each ratio by
 * γ_{m+2} = (m+2)u/(1−(m+2)u) (a sum of m non-negative products has relative error at most γ_m; Higham, Accuracy and
 * Stability of Numerical Algorithms, 2nd ed. 2002, §3.1), so the interval is a rigorous enclosure of the exact ρ.
 *
 * O(n²) per step, never an eigen-decomposition. A reducible matrix is handled block by block (its Perron root is the
 * largest over the diagonal blocks of its Frobenius normal form, Horn & Johnson §8.3); a periodic block is iterated with
 * the shift B + I, which is primitive with the same Perron vector, so the iteration converges instead of cycling.
 */
import { borderedPeriod, sectorBlocks, type SectorBlock } from './graph.ts';
import { borderedMatrix, type Bordered } from './closure.ts';

const UNIT_ROUNDOFF = 2 ** -53;

export interface PerronOptions {
  /** Stop when upper − lower ≤ tolerance·upper (default 1e-12). */
  tolerance?: number;
  /**
   * Iteration cap per block (default: 2000 steps, fewer on large blocks so no block costs more than about 4·10⁸
   * multiply-adds, i.e. 100 steps at n = 2000), never more than PERRON_MAX_STEPS. The bounds stay certified when it is
   * hit; they are only wider.
   */
  maxIterations?: number;
  /** Blocks of the sector graph, when already computed. */
  blocks?: SectorBlock[];
  /** Iterate the right vector only (half the work per step; bounds from the right vector alone; `left` is then all zeros). */
  rightOnly?: boolean;
  /**
   * Stop a block's iteration as soon as its certified bounds lie on one side of this value (upper < it, or lower ≥ it):
   * for callers that only compare ρ with it (the Monte Carlo draws compare with 1). The comparison comes out as the
   * full iteration's would: the bounds only narrow as it goes on (each is the best over all steps), so a side once
   * certified stays certified, and an undecided block runs to the same end as without this option.
   */
  decideAt?: number;
}

export interface PerronResult {
  /** Best estimate of ρ(A): the midpoint of the certified interval. */
  root: number;
  /** Certified Collatz–Wielandt bounds: lower ≤ ρ(A) ≤ upper. */
  lower: number;
  upper: number;
  /** Right Perron vector (A v = ρ v), non-negative, summing to 1. Unique only when A is irreducible. */
  right: Float64Array;
  /** Left Perron vector (wᵀA = ρ wᵀ), non-negative, summing to 1. */
  left: Float64Array;
  /** Total power-iteration steps over all blocks. */
  iterations: number;
  /** True when every block met the tolerance. */
  converged: boolean;
  /** Certified [lower, upper] for each block of the sector graph, in the order of `blocks` ([0, 0] for a block without cycles). */
  blockBounds: [number, number][];
  blocks: SectorBlock[];
}

function safety(m: number): number {
  const g = (m + 2) * UNIT_ROUNDOFF;
  return g / (1 - g);
}

function normalise(v: Float64Array): void {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]!;
  if (s > 0) for (let i = 0; i < v.length; i++) v[i] = v[i]! / s;
}

interface Iterated {
  lower: number;
  upper: number;
  right: Float64Array;
  left: Float64Array;
  iterations: number;
  converged: boolean;
}

/**
 * av = b·v and wa = wᵀ·b in one pass over b, four rows at a time (one load of wa[j] per four rows, so the pass is
 * bound by reading b rather than by stores).
 */
function products(b: Float64Array, m: number, v: Float64Array, w: Float64Array, av: Float64Array, wa: Float64Array, rightOnly: boolean): void {
  if (rightOnly) { rightProduct(b, m, v, av); return; }
  wa.fill(0);
  let i = 0;
  for (; i + 3 < m; i += 4) {
    const r0 = i * m, r1 = r0 + m, r2 = r1 + m, r3 = r2 + m;
    const w0 = w[i]!, w1 = w[i + 1]!, w2 = w[i + 2]!, w3 = w[i + 3]!;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
    for (let j = 0; j < m; j++) {
      const vj = v[j]!;
      const b0 = b[r0 + j]!, b1 = b[r1 + j]!, b2 = b[r2 + j]!, b3 = b[r3 + j]!;
      s0 += b0 * vj; s1 += b1 * vj; s2 += b2 * vj; s3 += b3 * vj;
      wa[j] = wa[j]! + (w0 * b0 + w1 * b1 + w2 * b2 + w3 * b3);
    }
    av[i] = s0; av[i + 1] = s1; av[i + 2] = s2; av[i + 3] = s3;
  }
  for (; i < m; i++) {
    const row = i * m, wi = w[i]!;
    let s0 = 0;
    for (let j = 0; j < m; j++) {
      const bij = b[row + j]!;
      s0 += bij * v[j]!;
      wa[j] = wa[j]! + wi * bij;
    }
    av[i] = s0;
  }
}

function rightProduct(b: Float64Array, m: number, v: Float64Array, av: Float64Array): void {
  let i = 0;
  for (; i + 3 < m; i += 4) {
    const r0 = i * m, r1 = r0 + m, r2 = r1 + m, r3 = r2 + m;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
    for (let j = 0; j < m; j++) {
      const vj = v[j]!;
      s0 += b[r0 + j]! * vj; s1 += b[r1 + j]! * vj; s2 += b[r2 + j]! * vj; s3 += b[r3 + j]! * vj;
    }
    av[i] = s0; av[i + 1] = s1; av[i + 2] = s2; av[i + 3] = s3;
  }
  for (; i < m; i++) {
    const row = i * m;
    let s0 = 0;
    for (let j = 0; j < m; j++) s0 += b[row + j]! * v[j]!;
    av[i] = s0;
  }
}

/**
 * `products(b, m, v, w, av, wa, false)` and `rightProduct(b, m, u, au)` in one pass over b: each sum takes the same
 * terms in the same order as in those two functions, so the numbers are theirs bit for bit, for one read of b instead
 * of two (b is 32 MB at 2,000 sectors, far beyond the caches: the pass is bound by reading it). `u` and `au` may be
 * longer than m (a bordered matrix's vectors): only their first m entries are read and written.
 */
function productsWithRight(b: Float64Array, m: number, v: Float64Array, w: Float64Array, av: Float64Array, wa: Float64Array, u: Float64Array, au: Float64Array): void {
  wa.fill(0);
  let i = 0;
  for (; i + 3 < m; i += 4) {
    const r0 = i * m, r1 = r0 + m, r2 = r1 + m, r3 = r2 + m;
    const w0 = w[i]!, w1 = w[i + 1]!, w2 = w[i + 2]!, w3 = w[i + 3]!;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
    let t0 = 0, t1 = 0, t2 = 0, t3 = 0;
    for (let j = 0; j < m; j++) {
      const vj = v[j]!, uj = u[j]!;
      const b0 = b[r0 + j]!, b1 = b[r1 + j]!, b2 = b[r2 + j]!, b3 = b[r3 + j]!;
      s0 += b0 * vj; s1 += b1 * vj; s2 += b2 * vj; s3 += b3 * vj;
      t0 += b0 * uj; t1 += b1 * uj; t2 += b2 * uj; t3 += b3 * uj;
      wa[j] = wa[j]! + (w0 * b0 + w1 * b1 + w2 * b2 + w3 * b3);
    }
    av[i] = s0; av[i + 1] = s1; av[i + 2] = s2; av[i + 3] = s3;
    au[i] = t0; au[i + 1] = t1; au[i + 2] = t2; au[i + 3] = t3;
  }
  for (; i < m; i++) {
    const row = i * m, wi = w[i]!;
    let s0 = 0, t0 = 0;
    for (let j = 0; j < m; j++) {
      const bij = b[row + j]!;
      s0 += bij * v[j]!;
      t0 += bij * u[j]!;
      wa[j] = wa[j]! + wi * bij;
    }
    av[i] = s0;
    au[i] = t0;
  }
}

/**
 * `productsWithRight(b, m, v, w, av, wa, u, au)` and `rightProduct(b, m, p, ap)` in the same one pass over b, each sum
 * in its own order as there (so the same bits). `p` rides along: a chain of products p, b·p, b²·p, … that a caller
 * wants anyway (perronRootsOpenClosed `chain`) costs no pass of its own over b.
 */
function productsWithRights(b: Float64Array, m: number, v: Float64Array, w: Float64Array, av: Float64Array, wa: Float64Array, u: Float64Array, au: Float64Array, p: Float64Array, ap: Float64Array): void {
  wa.fill(0);
  let i = 0;
  for (; i + 3 < m; i += 4) {
    const r0 = i * m, r1 = r0 + m, r2 = r1 + m, r3 = r2 + m;
    const w0 = w[i]!, w1 = w[i + 1]!, w2 = w[i + 2]!, w3 = w[i + 3]!;
    let s0 = 0, s1 = 0, s2 = 0, s3 = 0;
    let t0 = 0, t1 = 0, t2 = 0, t3 = 0;
    let q0 = 0, q1 = 0, q2 = 0, q3 = 0;
    for (let j = 0; j < m; j++) {
      const vj = v[j]!, uj = u[j]!, pj = p[j]!;
      const b0 = b[r0 + j]!, b1 = b[r1 + j]!, b2 = b[r2 + j]!, b3 = b[r3 + j]!;
      s0 += b0 * vj; s1 += b1 * vj; s2 += b2 * vj; s3 += b3 * vj;
      t0 += b0 * uj; t1 += b1 * uj; t2 += b2 * uj; t3 += b3 * uj;
      q0 += b0 * pj; q1 += b1 * pj; q2 += b2 * pj; q3 += b3 * pj;
      wa[j] = wa[j]! + (w0 * b0 + w1 * b1 + w2 * b2 + w3 * b3);
    }
    av[i] = s0; av[i + 1] = s1; av[i + 2] = s2; av[i + 3] = s3;
    au[i] = t0; au[i + 1] = t1; au[i + 2] = t2; au[i + 3] = t3;
    ap[i] = q0; ap[i + 1] = q1; ap[i + 2] = q2; ap[i + 3] = q3;
  }
  for (; i < m; i++) {
    const row = i * m, wi = w[i]!;
    let s0 = 0, t0 = 0, q0 = 0;
    for (let j = 0; j < m; j++) {
      const bij = b[row + j]!;
      s0 += bij * v[j]!;
      t0 += bij * u[j]!;
      q0 += bij * p[j]!;
      wa[j] = wa[j]! + wi * bij;
    }
    av[i] = s0;
    au[i] = t0;
    ap[i] = q0;
  }
}

/** `rightProduct(b, m, u, au)` and `rightProduct(b, m, p, ap)` in one pass over b (the same bits; `u`, `au` as above). */
function rightProducts2(b: Float64Array, m: number, u: Float64Array, au: Float64Array, p: Float64Array, ap: Float64Array): void {
  let i = 0;
  for (; i + 3 < m; i += 4) {
    const r0 = i * m, r1 = r0 + m, r2 = r1 + m, r3 = r2 + m;
    let t0 = 0, t1 = 0, t2 = 0, t3 = 0;
    let q0 = 0, q1 = 0, q2 = 0, q3 = 0;
    for (let j = 0; j < m; j++) {
      const uj = u[j]!, pj = p[j]!;
      const b0 = b[r0 + j]!, b1 = b[r1 + j]!, b2 = b[r2 + j]!, b3 = b[r3 + j]!;
      t0 += b0 * uj; t1 += b1 * uj; t2 += b2 * uj; t3 += b3 * uj;
      q0 += b0 * pj; q1 += b1 * pj; q2 += b2 * pj; q3 += b3 * pj;
    }
    au[i] = t0; au[i + 1] = t1; au[i + 2] = t2; au[i + 3] = t3;
    ap[i] = q0; ap[i + 1] = q1; ap[i + 2] = q2; ap[i + 3] = q3;
  }
  for (; i < m; i++) {
    const row = i * m;
    let t0 = 0, q0 = 0;
    for (let j = 0; j < m; j++) {
      const bij = b[row + j]!;
      t0 += bij * u[j]!;
      q0 += bij * p[j]!;
    }
    au[i] = t0;
    ap[i] = q0;
  }
}

/** No caller may ask for more power-iteration steps than this (a cap on `maxIterations`, so every run ends). */
export const PERRON_MAX_STEPS = 100_000;

/** Iteration cap for an m×m block: at most `work` multiply-adds, between 50 and 2000 steps. */
function defaultCap(m: number, work = 4e8): number {
  return Math.max(50, Math.min(2000, Math.floor(work / (m * m))));
}

/** What the power iteration needs of its matrix: its order, the products, and the largest row sum of |b|. */
interface Operator {
  m: number;
  products(v: Float64Array, w: Float64Array, av: Float64Array, wa: Float64Array, rightOnly: boolean): void;
  maxRowSum(): number;
}

function dense(b: Float64Array, m: number): Operator {
  return { m, products: (v, w, av, wa, rightOnly) => products(b, m, v, w, av, wa, rightOnly), maxRowSum: () => maxRowSum(b, m) };
}

/** Ā·v from av[0..n) = A·v[0..n): the border's terms added (after A's, as in a row of the formed matrix). */
function addBorder(b: Bordered, v: Float64Array, av: Float64Array): void {
  const { n, hc, hr, corner } = b;
  const vn = v[n]!;
  let s = 0;
  for (let i = 0; i < n; i++) {
    av[i] = av[i]! + hc[i]! * vn;
    s += hr[i]! * v[i]!;
  }
  av[n] = s + corner * vn;
}

/**
 * Ā = [A hc; hrᵀ corner] without forming it, right products only. Each row's sum runs over the same entries in the
 * same order as a row of the formed matrix (A's part, then the border), so the iteration is bit for bit the one on Ā.
 */
function bordered(b: Bordered): Operator {
  const { A, n, hc, hr, corner } = b;
  return {
    m: n + 1,
    products: (v, _w, av, _wa, rightOnly) => {
      if (!rightOnly) throw new Error('bordered Perron iteration: right vector only');
      rightProduct(A, n, v, av);
      addBorder(b, v, av);
    },
    maxRowSum: () => {
      let best = 0;
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s += Math.abs(A[i * n + j]!);
        s += Math.abs(hc[i]!);
        if (s > best) best = s;
      }
      let s = 0;
      for (let j = 0; j < n; j++) s += Math.abs(hr[j]!);
      s += Math.abs(corner);
      return Math.max(best, s);
    },
  };
}

/** A power iteration in progress (one step: `products` into av/wa, then `advance`). */
interface Iteration {
  op: Operator;
  shift: number;
  tol: number;
  maxIter: number;
  rightOnly: boolean;
  vectorsOnly: boolean;
  decideAt: number;
  g: number;
  v: Float64Array;
  w: Float64Array;
  av: Float64Array;
  wa: Float64Array;
  lower: number;
  upper: number;
  it: number;
  converged: boolean;
  done: boolean;
}

/**
 * Power iteration on the m×m non-negative matrix b, right and left vectors together in one pass over b per step.
 * `shift` is added to the diagonal of the iteration matrix only (the bounds are always computed for b itself).
 * `vectorsOnly`: stop when the vectors settle (max change ≤ tol·max entry) instead of when the bounds meet — for the
 * whole of a reducible matrix, whose Perron vector may have zeros so its upper bound need not converge.
 */
function startIteration(op: Operator, shift: number, tol: number, maxIter: number, rightOnly = false, vectorsOnly = false, decideAt = Number.NaN, start?: Float64Array): Iteration {
  const m = op.m;
  return {
    op, shift, tol, maxIter, rightOnly, vectorsOnly, decideAt, g: safety(m),
    v: start ? Float64Array.from(start) : new Float64Array(m).fill(1),
    w: new Float64Array(m).fill(1),
    av: new Float64Array(m),
    wa: new Float64Array(m),
    lower: 0, upper: Number.POSITIVE_INFINITY, it: 0, converged: false, done: maxIter <= 0,
  };
}

/** One step of `s` once av = b·v (and wa = wᵀ·b) are in place: the bounds, the stopping tests, the next vectors. */
function advance(s: Iteration): void {
  const { m } = s.op;
  const { shift, tol, rightOnly, g, av, wa } = s;
  const v = s.v;
  const w = s.w;
  let loR = Number.POSITIVE_INFINITY, hiR = 0, loL = Number.POSITIVE_INFINITY, hiL = 0;
  let allPositive = true;
  for (let i = 0; i < m; i++) {
    const vi = v[i]!, wi = w[i]!;
    if (vi > 0) {
      const r = av[i]! / vi;
      if (r < loR) loR = r;
      if (r > hiR) hiR = r;
    } else allPositive = false;
    if (rightOnly) continue;
    if (wi > 0) {
      const r = wa[i]! / wi;
      if (r < loL) loL = r;
      if (r > hiL) hiL = r;
    } else allPositive = false;
  }
  if (rightOnly) hiL = Number.POSITIVE_INFINITY;
  // Lower bounds need only v ≥ 0, v ≠ 0; upper bounds need v > 0 throughout.
  const lo = Math.max(loR === Number.POSITIVE_INFINITY ? 0 : loR, loL === Number.POSITIVE_INFINITY ? 0 : loL) * (1 - g);
  if (lo > s.lower) s.lower = lo;
  if (allPositive) {
    const hi = Math.min(hiR, hiL) * (1 + g);
    if (hi < s.upper) s.upper = hi;
  }
  s.it++;
  if (s.upper - s.lower <= tol * s.upper) { s.converged = true; s.done = true; return; }
  if (s.upper < s.decideAt || s.lower >= s.decideAt) { s.done = true; return; }
  let mv = 0, mw = 0;
  for (let i = 0; i < m; i++) {
    av[i] = av[i]! + shift * v[i]!;
    wa[i] = wa[i]! + shift * w[i]!;
    if (av[i]! > mv) mv = av[i]!;
    if (wa[i]! > mw) mw = wa[i]!;
  }
  if (!(mv > 0) || (!rightOnly && !(mw > 0))) {
    // The iterate vanished (only possible without a shift); the bounds found so far stand.
    s.done = true;
    return;
  }
  const nv = new Float64Array(m);
  let change = 0;
  for (let i = 0; i < m; i++) {
    nv[i] = av[i]! / mv;
    const d = Math.abs(nv[i]! - v[i]!);
    if (d > change) change = d;
  }
  s.v = nv;
  if (!rightOnly) {
    const nw = new Float64Array(m);
    for (let i = 0; i < m; i++) {
      nw[i] = wa[i]! / mw;
      const d = Math.abs(nw[i]! - w[i]!);
      if (d > change) change = d;
    }
    s.w = nw;
  }
  if ((s.vectorsOnly && change <= tol) || s.it >= s.maxIter) s.done = true;
}

/** The result of a finished iteration. */
function finish(s: Iteration): Iterated {
  const { m } = s.op;
  const upper = s.upper === Number.POSITIVE_INFINITY ? Math.max(s.lower, s.op.maxRowSum() * (1 + s.g)) : s.upper;
  normalise(s.v);
  let w = s.w;
  if (s.rightOnly) w = new Float64Array(m);
  else normalise(w);
  return { lower: s.lower, upper, right: s.v, left: w, iterations: s.it, converged: s.converged };
}

function iterate(op: Operator, shift: number, tol: number, maxIter: number, rightOnly = false, vectorsOnly = false, decideAt = Number.NaN, start?: Float64Array): Iterated {
  const s = startIteration(op, shift, tol, maxIter, rightOnly, vectorsOnly, decideAt, start);
  while (!s.done) {
    s.op.products(s.v, s.w, s.av, s.wa, s.rightOnly);
    advance(s);
  }
  return finish(s);
}

function maxRowSum(b: Float64Array, m: number): number {
  let best = 0;
  for (let i = 0; i < m; i++) {
    let s = 0;
    for (let j = 0; j < m; j++) s += Math.abs(b[i * m + j]!);
    if (s > best) best = s;
  }
  return best;
}

function subMatrix(a: Float64Array, n: number, idx: number[]): Float64Array {
  const m = idx.length;
  const out = new Float64Array(m * m);
  for (let p = 0; p < m; p++) {
    const row = idx[p]! * n;
    for (let q = 0; q < m; q++) out[p * m + q] = a[row + idx[q]!]!;
  }
  return out;
}

/** ρ(A) with certified bounds and Perron vectors for a non-negative n×n matrix (row-major). */
export function perronRoot(a: Float64Array, n: number, opts: PerronOptions = {}): PerronResult {
  const tol = opts.tolerance ?? 1e-12;
  if (n === 0) return { root: 0, lower: 0, upper: 0, right: new Float64Array(0), left: new Float64Array(0), iterations: 0, converged: true, blockBounds: [], blocks: [] };
  const blocks = opts.blocks ?? sectorBlocks(a, n);
  let lower = 0, upper = 0, iterations = 0, converged = true;
  let single: Iterated | null = null;
  const blockBounds: [number, number][] = [];
  for (const blk of blocks) {
    if (!blk.cyclic) { blockBounds.push([0, 0]); continue; }
    const m = blk.sectors.length;
    if (m === 1) {
      const s = blk.sectors[0]!;
      const d = a[s * n + s]!;
      if (d > lower) lower = d;
      if (d > upper) upper = d;
      blockBounds.push([d, d]);
      if (blocks.length === 1) single = { lower: d, upper: d, right: Float64Array.of(1), left: Float64Array.of(1), iterations: 0, converged: true };
      continue;
    }
    const r = iterate(dense(m === n ? a : subMatrix(a, n, blk.sectors), m), blk.period === 1 ? 0 : 1, tol, Math.min(opts.maxIterations ?? defaultCap(m), PERRON_MAX_STEPS), opts.rightOnly ?? false, false, opts.decideAt);
    iterations += r.iterations;
    converged &&= r.converged;
    if (r.lower > lower) lower = r.lower;
    if (r.upper > upper) upper = r.upper;
    blockBounds.push([r.lower, r.upper]);
    if (blocks.length === 1) single = r;
  }
  let right: Float64Array, left: Float64Array;
  if (single) {
    right = single.right;
    left = single.left;
  } else {
    // Reducible: whole-matrix vectors from the shifted iteration A + I (non-negative eigenvectors for ρ, not unique;
    // with a smaller work cap, since the bounds already come from the blocks).
    const whole = iterate(dense(a, n), 1, tol, Math.min(opts.maxIterations ?? defaultCap(n, 1e8), PERRON_MAX_STEPS), opts.rightOnly ?? false, true);
    iterations += whole.iterations;
    right = whole.right;
    left = whole.left;
    if (whole.lower > lower) lower = whole.lower;
    if (whole.upper < upper) upper = whole.upper;
  }
  if (upper < lower) upper = lower;
  return { root: (lower + upper) / 2, lower, upper, right, left, iterations, converged, blockBounds, blocks };
}

export interface BorderedPerronOptions extends Omit<PerronOptions, 'blocks' | 'rightOnly'> {
  /**
   * With `decideAt`, for callers that read only whether the lower bound reaches it (the closed-model decision): a
   * positive vector (of length n + 1, e.g. the Perron vector of a nearby matrix) tried for one step first. When that
   * step's certified upper bound is below `decideAt`, ρ(Ā) < decideAt, so no iteration (from any start) can certify a
   * lower bound at or above it, and that step's bounds are the result; otherwise the iteration runs from 1 as without
   * the hint. The lower bound's comparison is therefore always the plain iteration's.
   */
  hint?: Float64Array;
}

function withoutHint(opts: BorderedPerronOptions): Omit<PerronOptions, 'blocks' | 'rightOnly'> {
  const { hint: _hint, ...rest } = opts;
  return rest;
}

/**
 * ρ(Ā) of the household-closed matrix Ā = [A hc; hrᵀ corner] (non-negative), certified as `perronRoot` does, right
 * vector only. When the closed sector graph is strongly connected (households buy from and sell to the sectors, the
 * usual case) the iteration runs on the parts and Ā is never formed; otherwise Ā is formed and analysed block by block.
 * `known`: borderedPeriod(b) when already found (of a matrix with the same zeros).
 */
export function perronRootBordered(b: Bordered, opts: BorderedPerronOptions = {}, known?: { period: number | null | undefined }): PerronResult {
  const m = b.n + 1;
  const period = known ? known.period : borderedPeriod(b);
  if (period === undefined) return perronRoot(borderedMatrix(b.A, b.n, b.hc, b.hr, b.corner), m, { ...withoutHint(opts), rightOnly: true });
  const tol = opts.tolerance ?? 1e-12;
  const blocks: SectorBlock[] = [{ sectors: Array.from({ length: m }, (_, i) => i), cyclic: period !== null, period }];
  if (period === null) {
    return { root: 0, lower: 0, upper: 0, right: new Float64Array(m), left: new Float64Array(m), iterations: 0, converged: true, blockBounds: [[0, 0]], blocks };
  }
  const shift = period === 1 ? 0 : 1;
  const hinted = opts.hint && opts.decideAt !== undefined && opts.hint.length === m ? iterate(bordered(b), shift, tol, 1, true, false, opts.decideAt, opts.hint) : null;
  const r = hinted && hinted.upper < opts.decideAt! ? hinted
    : iterate(bordered(b), shift, tol, Math.min(opts.maxIterations ?? defaultCap(m), PERRON_MAX_STEPS), true, false, opts.decideAt);
  return borderedResult(r, blocks);
}

function borderedResult(r: Iterated, blocks: SectorBlock[]): PerronResult {
  const upper = r.upper < r.lower ? r.lower : r.upper;
  return { root: (r.lower + upper) / 2, lower: r.lower, upper, right: r.right, left: r.left, iterations: r.iterations, converged: r.converged, blockBounds: [[r.lower, r.upper]], blocks };
}

/** perronRoot's result for a matrix that is one cyclic block of order > 1, iterated as `r`. */
function oneBlockResult(r: Iterated, blocks: SectorBlock[]): PerronResult {
  const lower = r.lower > 0 ? r.lower : 0;
  let upper = r.upper > 0 ? r.upper : 0;
  if (upper < lower) upper = lower;
  return { root: (lower + upper) / 2, lower, upper, right: r.right, left: r.left, iterations: r.iterations, converged: r.converged, blockBounds: [[r.lower, r.upper]], blocks };
}

/** A chain of products to compute on the iterations' passes over A: A·start, A²·start, …, at most `max` of them. */
export interface ProductChain {
  start: Float64Array;
  max: number;
}

/**
 * `perronRoot(a, n, opts)` and `perronRootBordered(b, closedOpts, known)` for the household-closed matrix of the same
 * A (b.A === a), with the same results bit for bit. When A is one cyclic block and Ā's graph is strongly connected
 * (the usual table), the two power iterations share each pass over A while both run (`productsWithRight`; at 2,000
 * sectors a pass reads 32 MB), then the one still going runs alone; otherwise the two functions are called in turn.
 * `chain`: products A^k·start (k = 1, 2, …) formed on those shared passes, and on the closed iteration's passes after
 * the open one has stopped, each as dense.ts `matVec` forms it (the same sums in the same order: the same bits); as
 * many as those passes give, up to `chain.max`, and none when the iterations do not share their passes.
 */
export function perronRootsOpenClosed(
  a: Float64Array, n: number, opts: PerronOptions, b: Bordered, closedOpts: BorderedPerronOptions = {}, known?: { period: number | null | undefined }, chain?: ProductChain,
): { open: PerronResult; closed: PerronResult; chain: Float64Array[] } {
  const blocks = opts.blocks ?? (n === 0 ? [] : sectorBlocks(a, n));
  const period = known ? known.period : borderedPeriod(b);
  const hinted = closedOpts.hint !== undefined && closedOpts.decideAt !== undefined && closedOpts.hint.length === n + 1;
  const blk = blocks[0];
  if (b.A !== a || b.n !== n || n < 2 || blocks.length !== 1 || !blk!.cyclic || blk!.sectors.length !== n || opts.rightOnly || period === undefined || period === null || hinted) {
    return { open: perronRoot(a, n, { ...opts, blocks }), closed: perronRootBordered(b, closedOpts, { period }), chain: [] };
  }
  const products: Float64Array[] = [];
  let p = chain && chain.max > 0 && chain.start.length === n ? chain.start : null;
  const next = (): Float64Array => {
    const ap = new Float64Array(n);
    products.push(ap);
    return ap;
  };
  const so = startIteration(dense(a, n), blk!.period === 1 ? 0 : 1, opts.tolerance ?? 1e-12, Math.min(opts.maxIterations ?? defaultCap(n), PERRON_MAX_STEPS), false, false, opts.decideAt);
  const sc = startIteration(bordered(b), period === 1 ? 0 : 1, closedOpts.tolerance ?? 1e-12, Math.min(closedOpts.maxIterations ?? defaultCap(n + 1), PERRON_MAX_STEPS), true, false, closedOpts.decideAt);
  while (!so.done && !sc.done) {
    if (p) {
      const ap = next();
      productsWithRights(a, n, so.v, so.w, so.av, so.wa, sc.v, sc.av, p, ap);
      p = products.length < chain!.max ? ap : null;
    } else productsWithRight(a, n, so.v, so.w, so.av, so.wa, sc.v, sc.av);
    addBorder(b, sc.v, sc.av);
    advance(so);
    advance(sc);
  }
  while (p && !sc.done) {
    const ap = next();
    rightProducts2(a, n, sc.v, sc.av, p, ap);
    p = products.length < chain!.max ? ap : null;
    addBorder(b, sc.v, sc.av);
    advance(sc);
  }
  for (const s of [so, sc]) {
    while (!s.done) {
      s.op.products(s.v, s.w, s.av, s.wa, s.rightOnly);
      advance(s);
    }
  }
  const closedBlocks: SectorBlock[] = [{ sectors: Array.from({ length: n + 1 }, (_, i) => i), cyclic: true, period }];
  return { open: oneBlockResult(finish(so), blocks), closed: borderedResult(finish(sc), closedBlocks), chain: products };
}
