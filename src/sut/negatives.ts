/**
 * Negative flows of a derived table: where they are, and the one remedy offered.
 *
 * The product technology (and the fixed industry sales structure, which inverts the make table too) gives a negative
 * flow where an industry's secondary products would need more of an input than the industry used (Eurostat, Manual of
 * Supply, Use and Input-Output Tables, 2008, ch. 11; Miller & Blair 2009, §5.4 — recalled from memory). They are
 * reported as computed, with their count, the largest and where they are; the remedy `zero-ras` sets the negative
 * intermediate flows to zero and rebalances the intermediate block by RAS (Stone 1961; Bacharach 1970) to the row and
 * column totals the transformation computed, so every product's intermediate sales and every column's intermediate
 * inputs — and with them total output and value added — are kept. Zeroing negatives and rebalancing is common
 * practice (no single source); the Manual discusses removing negatives by adjustment (recalled from memory).
 */
import { InputError } from '../diagnostics/index.ts';
import { ras } from '../regional/index.ts';
import { showNumber } from '../table/index.ts';
import type { SymmetricFlows } from './transform.ts';

export interface NegativeCell {
  /** Row label (a sector, a value-added row) and column label (a sector, a final-demand column). */
  row: string;
  column: string;
  value: number;
  /** Where: the intermediate block, a final-demand column, or a value-added/jobs row. */
  part: 'flows' | 'final demand' | 'value added';
}

export interface NegativesReport {
  /** Negative intermediate flows. */
  flows: number;
  /** Negative cells in final-demand columns and in value-added and jobs rows that the transformation made negative. */
  others: number;
  /** The most negative cells, worst first (at most 10). */
  largest: NegativeCell[];
  /** Sum of the negative intermediate flows and its share of all intermediate flows (positive part). */
  flowSum: number;
  flowShare: number;
}

export function findNegatives(f: SymmetricFlows, before: { finalDemand: Set<string>; rows: Set<string> } = { finalDemand: new Set(), rows: new Set() }): NegativesReport {
  const cells: NegativeCell[] = [];
  const { n, Z, sectors } = f;
  let flowSum = 0;
  let positive = 0;
  let flows = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const v = Z[i * n + j]!;
      if (v < 0) {
        flows++;
        flowSum += v;
        cells.push({ row: sectors[i]!, column: sectors[j]!, value: v, part: 'flows' });
      } else positive += v;
    }
  }
  let others = 0;
  for (const c of f.finalDemand) {
    if (before.finalDemand.has(c.label)) continue;
    c.values.forEach((v, i) => { if (v < 0) { others++; cells.push({ row: sectors[i]!, column: c.label, value: v, part: 'final demand' }); } });
  }
  for (const r of f.rows) {
    if (before.rows.has(r.label)) continue;
    r.values.forEach((v, j) => { if (v < 0) { others++; cells.push({ row: r.label, column: sectors[j]!, value: v, part: 'value added' }); } });
  }
  cells.sort((a, b) => a.value - b.value);
  return { flows, others, largest: cells.slice(0, 10), flowSum, flowShare: positive > 0 ? -flowSum / positive : 0 };
}

/** The report in one sentence for the notes. */
export function negativesNote(r: NegativesReport, unit: string): string | null {
  if (r.flows === 0 && r.others === 0) return null;
  const where = r.largest.slice(0, 5).map((c) => `${showNumber(c.value)} from '${c.row}' to '${c.column}'${c.part === 'flows' ? '' : ` (${c.part})`}`).join('; ');
  const parts = [
    r.flows ? `${r.flows} negative intermediate flow${r.flows > 1 ? 's' : ''} (together ${showNumber(r.flowSum)} ${unit}, ${Number((r.flowShare * 100).toPrecision(2))} % of the positive flows)` : '',
    r.others ? `${r.others} negative cell${r.others > 1 ? 's' : ''} in final demand or value added that the transformation made` : '',
  ].filter(Boolean);
  return `The transformation gave ${parts.join(' and ')}; the largest: ${where}.`;
}

/**
 * The `zero-ras` remedy: negative intermediate flows set to zero, the block rebalanced by RAS to the transformation's
 * own row and column totals. Refused when a total is negative or the zero pattern cannot carry the totals.
 */
export function zeroAndBalance(f: SymmetricFlows, fileName: string): { flows: SymmetricFlows; iterations: number } {
  const { n, Z, sectors } = f;
  const rows = new Float64Array(n);
  const cols = new Float64Array(n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) { rows[i] = rows[i]! + Z[i * n + j]!; cols[j] = cols[j]! + Z[i * n + j]!; }
  const scale = rows.reduce((a, b) => a + Math.abs(b), 0);
  const clean = (v: number) => (Math.abs(v) <= 1e-12 * scale ? 0 : v);
  for (let k = 0; k < n; k++) { rows[k] = clean(rows[k]!); cols[k] = clean(cols[k]!); }
  const bad = [...sectors.map((s, k) => ({ s, v: rows[k]!, what: 'intermediate sales' })), ...sectors.map((s, k) => ({ s, v: cols[k]!, what: 'intermediate inputs' }))].filter((e) => e.v < 0);
  if (bad.length) {
    throw new InputError(
      'sut-remedy-infeasible',
      `negatives cannot be removed by zeroing and RAS: the transformation gives negative total ${bad[0]!.what} for '${bad[0]!.s}' (${showNumber(bad[0]!.v)}); keep the negatives or choose an assumption without them`,
      { file: fileName, rowLabel: bad[0]!.s },
    );
  }
  const start = Float64Array.from(Z, (v) => (v < 0 ? 0 : v));
  // The totals differ from their sums only by rounding; RAS needs them to agree to its tolerance.
  const sr = rows.reduce((a, b) => a + b, 0);
  const sc = cols.reduce((a, b) => a + b, 0);
  if (sc > 0) for (let k = 0; k < n; k++) cols[k] = cols[k]! * (sr / sc);
  try {
    const res = ras(start, n, n, rows, cols, { rowLabels: sectors, columnLabels: sectors, fileName });
    return { flows: { ...f, Z: res.matrix }, iterations: res.iterations };
  } catch (e) {
    if (e instanceof InputError) throw new InputError(e.code, `removing negatives by zeroing and RAS: ${e.message}`, e.location, e.hint);
    throw e;
  }
}
