/**
 * The sector graph of a coefficient matrix: an edge i → j when a_ij ≠ 0 (sector i sells to sector j).
 * A is irreducible exactly when this graph is strongly connected (Horn & Johnson, Matrix Analysis, 2nd ed. 2013,
 * Thm 6.2.24). Components by Tarjan's algorithm (Tarjan, "Depth-first search and linear graph algorithms",
 * SIAM J. Comput. 1, 1972), written with an explicit stack so tables of thousands of sectors cannot overflow the call stack.
 * The period of an irreducible block is the gcd of its cycle lengths, computed from breadth-first levels:
 * d = gcd over edges u → v inside the block of level(u) + 1 − level(v) (Denardo, "Periods of connected networks
 * and powers of nonnegative matrices", Math. Oper. Res. 2, 1977). Period 1 means the block is primitive.
 */

export interface SectorBlock {
  /** Sector indices of the block, ascending. */
  sectors: number[];
  /** True when the block has a cycle (size > 1, or a sector buying from itself); a block without one contributes eigenvalue 0. */
  cyclic: boolean;
  /** Gcd of cycle lengths inside the block; null for a block without cycles. */
  period: number | null;
}

/** Adjacency lists of the sector graph (edge i → j when a_ij ≠ 0). */
export function sectorGraph(a: Float64Array, n: number): Int32Array[] {
  const out: Int32Array[] = [];
  const buf = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let k = 0;
    const row = i * n;
    for (let j = 0; j < n; j++) if (a[row + j] !== 0) buf[k++] = j;
    out.push(buf.slice(0, k));
  }
  return out;
}

/**
 * Strongly connected components, in topological order of the condensation (a block only sells to blocks after it).
 * Tarjan emits components in reverse topological order; the list is reversed before returning.
 */
export function stronglyConnected(adj: Int32Array[]): number[][] {
  const n = adj.length;
  const index = new Int32Array(n).fill(-1);
  const low = new Int32Array(n);
  const onStack = new Uint8Array(n);
  const stack: number[] = [];
  const comps: number[][] = [];
  const callNode = new Int32Array(n);
  const callEdge = new Int32Array(n);
  let counter = 0;
  for (let root = 0; root < n; root++) {
    if (index[root] !== -1) continue;
    let depth = 0;
    callNode[0] = root;
    callEdge[0] = 0;
    index[root] = low[root] = counter++;
    stack.push(root);
    onStack[root] = 1;
    while (depth >= 0) {
      const v = callNode[depth]!;
      const edges = adj[v]!;
      const e = callEdge[depth]!;
      if (e < edges.length) {
        callEdge[depth] = e + 1;
        const w = edges[e]!;
        if (index[w] === -1) {
          index[w] = low[w] = counter++;
          stack.push(w);
          onStack[w] = 1;
          depth++;
          callNode[depth] = w;
          callEdge[depth] = 0;
        } else if (onStack[w]) {
          if (index[w]! < low[v]!) low[v] = index[w]!;
        }
        continue;
      }
      if (low[v] === index[v]) {
        const comp: number[] = [];
        let w: number;
        do {
          w = stack.pop()!;
          onStack[w] = 0;
          comp.push(w);
        } while (w !== v);
        comp.sort((p, q) => p - q);
        comps.push(comp);
      }
      depth--;
      if (depth >= 0) {
        const parent = callNode[depth]!;
        if (low[v]! < low[parent]!) low[parent] = low[v]!;
      }
    }
  }
  return comps.reverse();
}

function gcd(p: number, q: number): number {
  p = Math.abs(p);
  q = Math.abs(q);
  while (q) [p, q] = [q, p % q];
  return p;
}

/** Period of the sub-graph induced by `sectors` (assumed strongly connected); null when it has no cycle. */
export function blockPeriod(adj: Int32Array[], sectors: number[]): number | null {
  const inBlock = new Map<number, number>();
  sectors.forEach((s) => inBlock.set(s, -1));
  const root = sectors[0]!;
  inBlock.set(root, 0);
  const queue = [root];
  let d = 0;
  for (let qi = 0; qi < queue.length; qi++) {
    const u = queue[qi]!;
    const lu = inBlock.get(u)!;
    for (const v of adj[u]!) {
      const lv = inBlock.get(v);
      if (lv === undefined) continue;
      if (lv === -1) {
        inBlock.set(v, lu + 1);
        queue.push(v);
      } else {
        d = gcd(d, lu + 1 - lv);
      }
    }
  }
  return d === 0 ? null : d;
}

/**
 * Breadth-first levels from sector 0 along a_ij ≠ 0 (forward) and whether every sector is reached backward too,
 * straight on the dense matrix: O(n²) with no adjacency lists, the common case of a strongly connected table.
 */
function denseStronglyConnected(a: Float64Array, n: number): Int32Array | null {
  const level = new Int32Array(n).fill(-1);
  const queue = new Int32Array(n);
  level[0] = 0;
  let head = 0, tail = 1;
  while (head < tail) {
    const u = queue[head++]!;
    const row = u * n;
    for (let v = 0; v < n; v++) if (level[v] === -1 && a[row + v] !== 0) { level[v] = level[u]! + 1; queue[tail++] = v; }
  }
  if (tail < n) return null;
  return everyRowReaches0(a, n) ? level : null;
}

/** Sweeps over the rows before the column search of everyRowReaches0 takes over. */
const ROW_SWEEPS = 2;

/**
 * Does every sector reach sector 0 along a_uv ≠ 0? First by sweeps over the rows (u reaches 0 when a_uv ≠ 0 for a v
 * already known to): the matrix is read row by row, and a dense table is settled in the first sweep after a few
 * entries per row. What the sweeps leave open is settled by a breadth-first search backward from every sector known to
 * reach 0, which reads the matrix by columns (at 2,000 sectors a column walk alone, 4 million strided reads, took
 * about 0.1 s). Either way the answer is the same set of sectors.
 */
function everyRowReaches0(a: Float64Array, n: number): boolean {
  const seen = new Uint8Array(n);
  seen[0] = 1;
  let count = 1;
  for (let sweep = 0; sweep < ROW_SWEEPS && count < n; sweep++) {
    const before = count;
    for (let u = 1; u < n; u++) {
      if (seen[u]) continue;
      const row = u * n;
      for (let v = 0; v < n; v++) {
        if (seen[v] && a[row + v] !== 0) { seen[u] = 1; count++; break; }
      }
    }
    if (count === before) break;
  }
  if (count === n) return true;
  const queue = new Int32Array(n);
  let tail = 0;
  for (let v = 0; v < n; v++) if (seen[v]) queue[tail++] = v;
  let head = 0;
  while (head < tail) {
    const v = queue[head++]!;
    for (let u = 0; u < n; u++) if (!seen[u] && a[u * n + v] !== 0) { seen[u] = 1; queue[tail++] = u; }
  }
  return tail === n;
}

/** Period of a strongly connected dense matrix from its forward levels (gcd over all edges, stopping at 1). */
function densePeriod(a: Float64Array, n: number, level: Int32Array): number | null {
  let d = 0;
  for (let u = 0; u < n; u++) {
    const row = u * n, lu = level[u]! + 1;
    for (let v = 0; v < n; v++) {
      if (a[row + v] !== 0) {
        d = gcd(d, lu - level[v]!);
        if (d === 1) return 1;
      }
    }
  }
  return d === 0 ? null : d;
}

/** Blocks of the sector graph with their periods, in topological order. */
export function sectorBlocks(a: Float64Array, n: number): SectorBlock[] {
  if (n === 0) return [];
  const level = denseStronglyConnected(a, n);
  if (level) {
    const period = densePeriod(a, n, level);
    return [{ sectors: Array.from({ length: n }, (_, i) => i), cyclic: period !== null, period }];
  }
  const adj = sectorGraph(a, n);
  return stronglyConnected(adj).map((sectors) => {
    const period = blockPeriod(adj, sectors);
    return { sectors, cyclic: period !== null, period };
  });
}

/**
 * The closed matrix Ā = [A hc; hrᵀ corner] (closure.ts) without forming it: its period when its graph is strongly
 * connected (null when it has no cycle), or undefined when it is not (the caller then forms Ā and takes its blocks).
 * Levels come from the same breadth-first search as on the formed matrix (arcs in column order, the border last).
 */
export function borderedPeriod(b: { A: Float64Array; n: number; hc: Float64Array; hr: Float64Array; corner: number }): number | null | undefined {
  const { A, n, hc, hr, corner } = b;
  const m = n + 1;
  const level = new Int32Array(m).fill(-1);
  const queue = new Int32Array(m);
  level[0] = 0;
  let head = 0, tail = 1;
  while (head < tail) {
    const u = queue[head++]!;
    const next = level[u]! + 1;
    if (u < n) {
      const row = u * n;
      for (let v = 0; v < n; v++) if (level[v] === -1 && A[row + v] !== 0) { level[v] = next; queue[tail++] = v; }
      if (level[n] === -1 && hc[u] !== 0) { level[n] = next; queue[tail++] = n; }
    } else {
      for (let v = 0; v < n; v++) if (level[v] === -1 && hr[v] !== 0) { level[v] = next; queue[tail++] = v; }
    }
  }
  if (tail < m) return undefined;
  // Backward: every vertex reaches vertex 0.
  const seen = new Uint8Array(m);
  seen[0] = 1;
  queue[0] = 0;
  head = 0; tail = 1;
  while (head < tail) {
    const v = queue[head++]!;
    if (v < n) {
      for (let u = 0; u < n; u++) if (!seen[u] && A[u * n + v] !== 0) { seen[u] = 1; queue[tail++] = u; }
      if (!seen[n] && hr[v] !== 0) { seen[n] = 1; queue[tail++] = n; }
    } else {
      for (let u = 0; u < n; u++) if (!seen[u] && hc[u] !== 0) { seen[u] = 1; queue[tail++] = u; }
    }
  }
  if (tail < m) return undefined;
  // Period: gcd over all arcs u → v of level(u) + 1 − level(v), stopping at 1.
  let d = 0;
  const arc = (u: number, v: number): boolean => {
    d = gcd(d, level[u]! + 1 - level[v]!);
    return d === 1;
  };
  for (let u = 0; u < n; u++) {
    const row = u * n;
    for (let v = 0; v < n; v++) if (A[row + v] !== 0 && arc(u, v)) return 1;
    if (hc[u] !== 0 && arc(u, n)) return 1;
  }
  for (let v = 0; v < n; v++) if (hr[v] !== 0 && arc(n, v)) return 1;
  if (corner !== 0 && arc(n, n)) return 1;
  return d === 0 ? null : d;
}
