/**
 * Supply and use → a symmetric table, by the four transformations of Eurostat's Manual of Supply, Use and
 * Input-Output Tables (2008, ch. 11, models A–D) in the notation of Miller & Blair, Input-Output Analysis, 2nd ed.
 * 2009, ch. 5 (formulas recalled from memory; each is checked in the tests against the assumption that defines it):
 *
 *   V  make table, industries × products (the supply table transposed); U use of domestic products, products × industries
 *   q = Vᵀ·1 product output, g = V·1 industry output
 *   B = U·ĝ⁻¹  inputs per unit of industry output          D = V·q̂⁻¹  market shares (industry j's share of product p)
 *   C = Vᵀ·ĝ⁻¹ product mix per unit of industry output
 *
 * - industry-by-industry, fixed product sales structure (model D): every product is sold in the same proportions
 *   whichever industry makes it, so product rows are split among industries by market share: Z = D·U, A = D·B; final
 *   demand D·f; value added and jobs stay the industries'.
 * - industry-by-industry, fixed industry sales structure (model C): every industry sells its output in the same
 *   proportions whatever its product mix, so [U f] = C·[Z f_ind]: Z = C⁻¹·U, A = C⁻¹·B; final demand C⁻¹·f; value
 *   added and jobs stay the industries'. Needs as many products as industries; can give negatives.
 * - product-by-product, industry technology (model B): every industry has one input recipe whatever its product mix,
 *   so its inputs are split among its products by their share of its output: Z = U·ĝ⁻¹·V, A = B·D; value added and
 *   jobs per unit of product (rows w ↦ w·ĝ⁻¹·V); final demand stays the products'.
 * - product-by-product, product technology (model A): every product has one input recipe whichever industry makes
 *   it, so U = A·Vᵀ: A = U·(Vᵀ)⁻¹ = B·C⁻¹, Z = A·q̂; value added and jobs w ↦ w·(Vᵀ)⁻¹·q̂; final demand stays the
 *   products'. Needs as many products as industries; gives negatives where an industry's secondary products need more
 *   of an input than it used (reported, and remedied on request: negatives.ts).
 *
 * Every transformation keeps total output (g for industries, q for products) and the total of final demand: the
 * row and column identities of the pair carry over (tested as properties).
 */
import { InputError, type Warning } from '../diagnostics/index.ts';
import { conditionEstimate1, luFactor, luSolveMany, matMul, matVec, norm1, vecMat, type LU } from '../linalg/index.ts';
import { CONDITION_LIMIT } from '../model/index.ts';
import type { Assumption, IndustryRow, ProductColumn, SupplyUse, TableBy } from './types.ts';
import { ASSUMPTION_BY } from './types.ts';

/** The symmetric flows, before they become an IOTable. */
export interface SymmetricFlows {
  by: TableBy;
  assumption: Assumption;
  sectors: string[];
  n: number;
  /** Intermediate flows n×n, row (seller) i to column (buyer) j. */
  Z: Float64Array;
  /** Total output: g (industries) or q (products). */
  x: Float64Array;
  finalDemand: ProductColumn[];
  /** Value added, imports, taxes and jobs rows, by sector of the symmetric table. */
  rows: IndustryRow[];
  /** 1-norm condition estimate of the inverted matrix (C or Vᵀ), models A and C only. */
  condition: number | null;
  warnings: Warning[];
}

/** Full names of the four assumptions, as the notes and reports say them. */
export const ASSUMPTION_NAMES: Readonly<Record<Assumption, string>> = {
  'product-sales': 'industry-by-industry table, fixed product sales structure assumption (Eurostat model D)',
  'industry-sales': 'industry-by-industry table, fixed industry sales structure assumption (Eurostat model C)',
  industry: 'product-by-product table, industry technology assumption (Eurostat model B)',
  product: 'product-by-product table, product technology assumption (Eurostat model A)',
};

function needSquare(s: SupplyUse, assumption: Assumption): void {
  if (s.products.length === s.industries.length) return;
  throw new InputError(
    'sut-not-square',
    `the ${assumption === 'product' ? 'product technology' : 'fixed industry sales structure'} needs as many products as industries (it inverts the make table), ` +
      `but the pair has ${s.products.length} products and ${s.industries.length} industries; use the fixed product sales structure (industry by industry) or the industry technology (product by product)`,
    { file: s.supplyFile },
  );
}

function factor(m: Float64Array, n: number, s: SupplyUse, what: string): { lu: LU; condition: number } {
  const lu = luFactor(m, n);
  if (lu.singular) {
    throw new InputError(
      'sut-singular',
      `the ${what} is singular (some product's output mix is a combination of others'), so it cannot be inverted; use the fixed product sales structure or the industry technology`,
      { file: s.supplyFile },
    );
  }
  return { lu, condition: conditionEstimate1(lu, norm1(m, n)) };
}

function conditionWarning(condition: number, s: SupplyUse, what: string): Warning[] {
  if (!(condition > CONDITION_LIMIT)) return []; // the limit of I − A's estimate: the same loss of digits
  return [{ code: 'sut-ill-conditioned', message: `the ${what} is ill-conditioned (condition number about ${condition.toExponential(1)}): the derived flows may have lost most of their digits`, location: { file: s.supplyFile } }];
}

/** x ↦ x / d, with 0 where d is 0 (a product or industry with no output takes no share). */
const ratio = (x: number, d: number): number => (d === 0 ? 0 : x / d);

export function transform(s: SupplyUse, assumption: Assumption): SymmetricFlows {
  const { V, U, q, g } = s;
  const ni = s.industries.length;
  const np = s.products.length;
  const by = ASSUMPTION_BY[assumption];
  const base = { by, assumption, warnings: [] as Warning[], condition: null as number | null };
  switch (assumption) {
    case 'product-sales': {
      const D = new Float64Array(ni * np);
      for (let j = 0; j < ni; j++) for (let p = 0; p < np; p++) D[j * np + p] = ratio(V[j * np + p]!, q[p]!);
      return {
        ...base,
        sectors: [...s.industries], n: ni,
        Z: matMul(D, U, ni, np, ni),
        x: Float64Array.from(g),
        finalDemand: s.finalDemand.map((f) => ({ ...f, values: matVec(D, ni, np, f.values) })),
        rows: s.industryRows.map((r) => ({ ...r, values: Float64Array.from(r.values) })),
      };
    }
    case 'industry-sales': {
      needSquare(s, assumption);
      const n = ni;
      const C = new Float64Array(n * n);
      for (let p = 0; p < n; p++) for (let j = 0; j < n; j++) C[p * n + j] = ratio(V[j * n + p]!, g[j]!);
      const { lu, condition } = factor(C, n, s, 'product-mix matrix C = Vᵀ·ĝ⁻¹');
      const k = s.finalDemand.length;
      const w = n + k;
      const rhs = new Float64Array(n * w);
      for (let p = 0; p < n; p++) {
        rhs.set(U.subarray(p * n, (p + 1) * n), p * w);
        s.finalDemand.forEach((f, c) => { rhs[p * w + n + c] = f.values[p]!; });
      }
      const X = luSolveMany(lu, rhs, w);
      const Z = new Float64Array(n * n);
      for (let i = 0; i < n; i++) Z.set(X.subarray(i * w, i * w + n), i * n);
      return {
        ...base,
        condition,
        warnings: conditionWarning(condition, s, 'product-mix matrix C'),
        sectors: [...s.industries], n,
        Z,
        x: Float64Array.from(g),
        finalDemand: s.finalDemand.map((f, c) => ({ ...f, values: Float64Array.from({ length: n }, (_, i) => X[i * w + n + c]!) })),
        rows: s.industryRows.map((r) => ({ ...r, values: Float64Array.from(r.values) })),
      };
    }
    case 'industry': {
      const T = new Float64Array(ni * np);
      for (let j = 0; j < ni; j++) for (let p = 0; p < np; p++) T[j * np + p] = ratio(V[j * np + p]!, g[j]!);
      return {
        ...base,
        sectors: [...s.products], n: np,
        Z: matMul(U, T, np, ni, np),
        x: Float64Array.from(q),
        finalDemand: s.finalDemand.map((f) => ({ ...f, values: Float64Array.from(f.values) })),
        rows: s.industryRows.map((r) => ({ ...r, values: vecMat(r.values, T, ni, np) })),
      };
    }
    case 'product': {
      needSquare(s, assumption);
      const n = np;
      const { lu, condition } = factor(V, n, s, 'make table V');
      // Y = M·(Vᵀ)⁻¹ for M = [U; rows]: solve V·Yᵀ = Mᵀ, then scale column p by q_p.
      const rows = s.industryRows;
      const m = n + rows.length;
      const Mt = new Float64Array(n * m);
      for (let j = 0; j < n; j++) {
        for (let p = 0; p < n; p++) Mt[j * m + p] = U[p * n + j]!;
        rows.forEach((r, k) => { Mt[j * m + n + k] = r.values[j]!; });
      }
      const Yt = luSolveMany(lu, Mt, m);
      const Z = new Float64Array(n * n);
      for (let p = 0; p < n; p++) for (let c = 0; c < n; c++) Z[p * n + c] = Yt[c * m + p]! * q[c]!;
      return {
        ...base,
        condition,
        warnings: conditionWarning(condition, s, 'make table V'),
        sectors: [...s.products], n,
        Z,
        x: Float64Array.from(q),
        finalDemand: s.finalDemand.map((f) => ({ ...f, values: Float64Array.from(f.values) })),
        rows: rows.map((r, k) => ({ ...r, values: Float64Array.from({ length: n }, (_, c) => Yt[c * m + n + k]! * q[c]!) })),
      };
    }
  }
}
