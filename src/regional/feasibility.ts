/**
 * Can a non-negative matrix with a given zero pattern reach given row and column totals? RAS converges exactly when
 * some matrix with zeros wherever the start has zeros meets the totals (Bacharach, Biproportional Matrices and
 * Input–Output Change, 1970, ch. 4; recalled from memory). That is a transportation problem: a maximum flow from the
 * rows (supplies u_i) to the columns (demands v_j) along the non-zero cells must carry the whole total. When it cannot,
 * the minimum cut names a set of rows whose totals exceed what the only columns they may reach can take
 * (Hall's condition; max-flow/min-cut theorem, Ford & Fulkerson 1956). Max flow by Dinic's algorithm (Dinic 1970).
 */

export interface FeasibilityGap {
  /** Rows (indices) that together need more than their reachable columns can take. */
  rows: number[];
  /** The columns those rows may reach. */
  columns: number[];
  rowTotal: number;
  columnTotal: number;
}

class FlowNetwork {
  readonly head: Int32Array;
  to: number[] = [];
  cap: number[] = [];
  next: number[] = [];
  constructor(readonly size: number) {
    this.head = new Int32Array(size).fill(-1);
  }
  add(a: number, b: number, c: number): void {
    for (const [u, v, w] of [[a, b, c], [b, a, 0]] as const) {
      this.to.push(v);
      this.cap.push(w);
      this.next.push(this.head[u]!);
      this.head[u] = this.to.length - 1;
    }
  }
  /** Levels by breadth-first search over edges with capacity above eps; -1 = unreachable. */
  levels(src: number, eps: number): Int32Array {
    const level = new Int32Array(this.size).fill(-1);
    level[src] = 0;
    const queue = [src];
    for (let q = 0; q < queue.length; q++) {
      const u = queue[q]!;
      for (let e = this.head[u]!; e >= 0; e = this.next[e]!) {
        const v = this.to[e]!;
        if (level[v]! < 0 && this.cap[e]! > eps) { level[v] = level[u]! + 1; queue.push(v); }
      }
    }
    return level;
  }
  maxFlow(src: number, sink: number, eps: number): number {
    let total = 0;
    for (;;) {
      const level = this.levels(src, eps);
      if (level[sink]! < 0) return total;
      const it = Int32Array.from(this.head);
      const push = (u: number, f: number): number => {
        if (u === sink) return f;
        for (; it[u]! >= 0; it[u] = this.next[it[u]!]!) {
          const e = it[u]!;
          const v = this.to[e]!;
          if (this.cap[e]! > eps && level[v] === level[u]! + 1) {
            const got = push(v, Math.min(f, this.cap[e]!));
            if (got > 0) {
              this.cap[e] = this.cap[e]! - got;
              this.cap[e ^ 1] = this.cap[e ^ 1]! + got;
              return got;
            }
          }
        }
        return 0;
      };
      for (let f = push(src, Infinity); f > 0; f = push(src, Infinity)) total += f;
    }
  }
}

/**
 * Null when the totals are reachable with the zero pattern of `a` (m×n row-major, non-negative), else the gap found.
 * `relTol` is the share of the grand total that may go unrouted (rounding in the totals).
 */
export function rasFeasibility(a: Float64Array, m: number, n: number, u: Float64Array, v: Float64Array, relTol = 1e-9): FeasibilityGap | null {
  let total = 0;
  for (let i = 0; i < m; i++) total += u[i]!;
  if (!(total > 0)) return null;
  const src = 0;
  const sink = m + n + 1;
  const g = new FlowNetwork(m + n + 2);
  for (let i = 0; i < m; i++) if (u[i]! > 0) g.add(src, 1 + i, u[i]!);
  for (let j = 0; j < n; j++) if (v[j]! > 0) g.add(1 + m + j, sink, v[j]!);
  for (let i = 0; i < m; i++) {
    if (!(u[i]! > 0)) continue;
    for (let j = 0; j < n; j++) if (a[i * n + j]! > 0 && v[j]! > 0) g.add(1 + i, 1 + m + j, Infinity);
  }
  const eps = total * 1e-15;
  const flow = g.maxFlow(src, sink, eps);
  if (flow >= total * (1 - relTol)) return null;
  // the source side of the minimum cut: rows still reachable hold the unmet supply
  const level = g.levels(src, eps);
  const rows: number[] = [];
  const columns: number[] = [];
  let rowTotal = 0;
  let columnTotal = 0;
  for (let i = 0; i < m; i++) if (level[1 + i]! >= 0) { rows.push(i); rowTotal += u[i]!; }
  for (let j = 0; j < n; j++) if (level[1 + m + j]! >= 0) { columns.push(j); columnTotal += v[j]!; }
  return { rows, columns, rowTotal, columnTotal };
}
