// Supply and use pairs as CSV text for tests: the 2×2 pair worked by hand, and random balanced pairs (test data only,
// never a reference value): industry j makes product j (and, when there are more products than industries, the
// products after the last industry are made by industry p mod m), plus secondary products where `secondary` > 0; use
// is random and scaled so that every product's intermediate use stays below half its output and every industry's
// inputs below half its output, and final demand and value added are the rests, so the pair balances exactly (up to
// rounding of the decimal text).
import { seeded } from './random.ts';

// The 2-product, 2-industry pair worked by hand in test/src/sut/hand-worked.test.ts.
// Supply (products × industries): industry A makes 90 of product a; industry B makes 10 of a (secondary) and 50 of b.
//   q = (100, 50), g = (90, 60); V (industries × products) = [[90, 0], [10, 50]].
export const SUPPLY = [
  'million crowns,Industry A,Industry B',
  'Product a,90,10',
  'Product b,0,50',
].join('\n');

// Use (products × industries, then final demand; value added and jobs by industry below). Product rows add up to q:
// a: 20 + 10 + 70 = 100, b: 5 + 15 + 30 = 50; industry columns to g: A: 20 + 5 + 40 + 25 = 90, B: 10 + 15 + 20 + 15 = 60.
export const USE = [
  'million crowns,Industry A,Industry B,Households',
  'Product a,20,10,70',
  'Product b,5,15,30',
  'Compensation of employees,40,20,',
  'Other value added,25,15,',
  'Employment,10,6,',
].join('\n');

export interface PairOptions {
  products: number;
  industries: number;
  /** Share of off-diagonal supply cells that hold secondary production (0 = a diagonal supply table). */
  secondary?: number;
  /** Imports by product (supply column) and a use table of all products (output plus imports). */
  imports?: boolean;
  /** Add an employment row. */
  jobs?: boolean;
}

export interface Pair {
  supply: string;
  use: string;
  products: string[];
  industries: string[];
}

export function randomPair(seed: number, o: PairOptions): Pair {
  const r = seeded(seed);
  const np = o.products;
  const ni = o.industries;
  const products = Array.from({ length: np }, (_, p) => `Product ${p + 1}`);
  const industries = Array.from({ length: ni }, (_, j) => `Industry ${j + 1}`);
  // supply S[p][j]
  const S = Array.from({ length: np }, () => new Array<number>(ni).fill(0));
  for (let p = 0; p < np; p++) S[p]![p % ni] = 50 + Math.round(1000 * r());
  for (let p = 0; p < np; p++) for (let j = 0; j < ni; j++) if (j !== p % ni && r() < (o.secondary ?? 0)) S[p]![j] = Math.round(60 * r());
  const q = S.map((row) => row.reduce((a, b) => a + b, 0));
  const g = industries.map((_, j) => S.reduce((a, row) => a + row[j]!, 0));
  const imports = products.map(() => (o.imports ? Math.round(200 * r()) : 0));
  const supplied = q.map((x, p) => x + imports[p]!);
  const U = Array.from({ length: np }, () => Array.from({ length: ni }, () => (r() < 0.3 ? 0 : r())));
  // scale so that row sums ≤ 0.5·(q + m) and column sums ≤ 0.5·g, then round to whole numbers
  for (let p = 0; p < np; p++) {
    const s = U[p]!.reduce((a, b) => a + b, 0);
    if (s > 0) for (let j = 0; j < ni; j++) U[p]![j] = (U[p]![j]! * 0.5 * supplied[p]!) / s;
  }
  for (let j = 0; j < ni; j++) {
    const s = U.reduce((a, row) => a + row[j]!, 0);
    if (s > 0.5 * g[j]!) for (let p = 0; p < np; p++) U[p]![j] = (U[p]![j]! * 0.5 * g[j]!) / s;
  }
  for (const row of U) for (let j = 0; j < ni; j++) row[j] = Math.floor(row[j]!);
  const rest = U.map((row, p) => supplied[p]! - row.reduce((a, b) => a + b, 0));
  const households = rest.map((x) => Math.round(x * (0.3 + 0.4 * r())));
  const exports = rest.map((x, p) => x - households[p]!);
  const va = industries.map((_, j) => g[j]! - U.reduce((a, row) => a + row[j]!, 0));
  const comp = va.map((x) => Math.round(x * (0.4 + 0.3 * r())));
  const other = va.map((x, j) => x - comp[j]!);
  const jobs = g.map((x) => Math.round(x / (2 + 3 * r())));
  const supply = [
    ['million crowns', ...industries, ...(o.imports ? ['Imports'] : [])].join(','),
    ...products.map((p, k) => [p, ...S[k]!, ...(o.imports ? [imports[k]!] : [])].join(',')),
  ].join('\n');
  const use = [
    ['million crowns', ...industries, 'Households', 'Exports'].join(','),
    ...products.map((p, k) => [p, ...U[k]!, households[k]!, exports[k]!].join(',')),
    ['Compensation of employees', ...comp, '', ''].join(','),
    ['Other value added', ...other, '', ''].join(','),
    ...(o.jobs ? [['Employment', ...jobs, '', ''].join(',')] : []),
  ].join('\n');
  return { supply, use, products, industries };
}
