/**
 * Read a supply table and a use table into one checked pair (types.ts), with the table importer's dialect, labels,
 * numbers and located refusals (src/table readLabelledGrid).
 *
 * Which label is what:
 * - industries are the supply table's columns that are also columns of the use table (totals aside); other supply
 *   columns take a role from the role map's `supply` or their words (imports, margins, taxes on products, totals) —
 *   a supply column with neither is refused (an industry spelt two ways would otherwise vanish);
 * - products are the supply table's rows (totals aside); each must be a row of the use table;
 * - other use-table rows are value added, imports, taxes and jobs by industry, other use-table columns final demand,
 *   with the roles a symmetric table's rows and columns get (src/table roles.ts, or the role map's rows and columns).
 *
 * Then supply and use must agree product by product (total use = domestic output, or output plus imports) within
 * the tolerance, or the pair is refused naming the worst products; a use table whose products add up to supply at
 * purchasers' prices (with margins and taxes on products) is refused, since the transformations work at basic prices
 * (Eurostat, Manual of Supply, Use and Input-Output Tables, 2008, ch. 11). A use table of all products (domestic and
 * imported) is split by the import proportionality assumption: every use of product p takes the same imported share
 * m_p / (q_p + m_p) (Eurostat 2008, ch. 12 — recalled from memory); the imported part of each industry's inputs becomes
 * an import row and the imported part of final demand leaves the table (said in a note).
 */
import { InputError, type Location, type Warning } from '../diagnostics/index.ts';
import {
  isKnownLabel, matchKey, readLabelledGrid, showNumber, suggestColumnRole, suggestRowRole,
  type ColumnRole, type DecimalMark, type Delimiter, type FinalDemandIncome, type LabelledGrid, type RowRole,
} from '../table/index.ts';
import { namesTotal, suggestSupplyRole } from './roles.ts';
import type { IndustryRow, ProductBalance, ProductColumn, SupplyColumnRole, SupplyUse, SutRoleMap, UseValuation } from './types.ts';

export interface SutFile {
  text: string;
  fileName: string;
}

export interface ReadSutOptions {
  map?: SutRoleMap;
  delimiter?: Delimiter;
  decimalMark?: DecimalMark;
  /** Relative tolerance of the product balance (refusal) and the industry balance (warning); default 0.001. */
  tolerance?: number;
  /** Accept negative cells in the supply table and in the use table's product block. */
  allowNegative?: boolean;
  /** Name of the pair (and of the derived table); defaults to the use file's name without extension. */
  name?: string;
}

export const SUT_DEFAULT_TOLERANCE = 0.001;

function byKey<R>(rec: Record<string, R> | undefined): Map<string, R> {
  return new Map(Object.entries(rec ?? {}).map(([l, r]) => [matchKey(l), r]));
}

function baseName(fileName: string): string {
  const f = fileName.split(/[\\/]/).pop() ?? fileName;
  return f.replace(/\.[^.]*$/, '') || f;
}

function gap(a: number, b: number): number {
  const d = Math.max(Math.abs(a), Math.abs(b));
  return d === 0 ? 0 : (a - b) / d;
}

function pct(g: number): string {
  return `${g > 0 ? '+' : g < 0 ? '−' : ''}${Math.abs(g * 100).toFixed(Math.abs(g) < 0.01 ? 3 : 2)} %`;
}

function list(labels: string[], max = 5): string {
  return labels.slice(0, max).map((l) => `'${l}'`).join(', ') + (labels.length > max ? `, … (${labels.length} in all)` : '');
}

/** The worst gaps of one comparison of use against supply. */
function compare(use: Float64Array, supply: Float64Array): { gaps: number[]; worst: number } {
  const gaps = Array.from(use, (u, p) => gap(u, supply[p]!));
  return { gaps, worst: gaps.reduce((w, x) => Math.max(w, Math.abs(x)), 0) };
}

/** A label of the pair with the role it was given: by the role map (`mapped`), by its words or by matching; null: none. */
export interface SutLabelRole<R extends string> {
  label: string;
  role: R | null;
  mapped: boolean;
  location: Location;
}

/**
 * Which label of the pair is what — decided here once, for the reader and for the app's role preview:
 * - `supplyColumns`: `industry` (a supply column that is also a use column, totals aside, not set otherwise by the
 *   map), else the map's role or the role its words suggest; null when neither (refused by the reader);
 * - `supplyRows`: `product`, or `ignore`/`total` (by the map, or a total by its words); null for a row the use table
 *   lacks, or one the map gives a column role;
 * - `useRows` and `useColumns`: the use table's rows that are not products and columns that are not industries, with
 *   the map's role or the one a symmetric table's labels get (src/table roles.ts); `loose` says the words were not
 *   recognised.
 */
export interface SutRoles {
  supplyColumns: SutLabelRole<SupplyColumnRole | 'industry'>[];
  supplyRows: SutLabelRole<'product' | 'ignore' | 'total'>[];
  useRows: (SutLabelRole<RowRole> & { loose: boolean })[];
  useColumns: (SutLabelRole<ColumnRole> & { loose: boolean })[];
}

function decideRoles(S: LabelledGrid, W: LabelledGrid, map: SutRoleMap | undefined): SutRoles & { useIndustryCol: (number | null)[]; useProductRow: (number | null)[] } {
  const mapSupply = byKey(map?.supply);
  const mapRows = byKey(map?.rows);
  const mapCols = byKey(map?.columns);
  const useCol = new Map(W.columns.map((c, k) => [matchKey(c.label), k]));
  const useRow = new Map(W.rows.map((r, k) => [matchKey(r.label), k]));
  const useIndustryCol: (number | null)[] = [];
  const supplyColumns = S.columns.map((c): SutLabelRole<SupplyColumnRole | 'industry'> => {
    const key = matchKey(c.label);
    const mapped = mapSupply.get(key);
    const inUse = useCol.get(key);
    const industry = mapped === undefined && inUse !== undefined && !namesTotal(c.label);
    useIndustryCol.push(industry ? inUse : null);
    return { label: c.label, role: industry ? 'industry' : mapped ?? suggestSupplyRole(c.label), mapped: mapped !== undefined, location: c.location };
  });
  const useProductRow: (number | null)[] = [];
  const supplyRows = S.rows.map((r): SutLabelRole<'product' | 'ignore' | 'total'> => {
    const mapped = mapSupply.get(matchKey(r.label));
    const inUse = useRow.get(matchKey(r.label));
    const setAside = mapped === 'ignore' || mapped === 'total' ? mapped : mapped === undefined && namesTotal(r.label) ? 'total' : null;
    const product = setAside === null && mapped === undefined && inUse !== undefined;
    useProductRow.push(product ? inUse! : null);
    return { label: r.label, role: setAside ?? (product ? 'product' : null), mapped: mapped !== undefined, location: r.location };
  });
  const isProductRow = new Set(useProductRow.filter((k) => k !== null));
  const isIndustryCol = new Set(useIndustryCol.filter((k) => k !== null));
  const useRows = W.rows.flatMap((r, k) => {
    if (isProductRow.has(k)) return [];
    const key = matchKey(r.label);
    const mapped = mapRows.get(key);
    const loose = mapped === undefined && !isKnownLabel(r.label, 'row') && !S.rows.some((x) => matchKey(x.label) === key);
    return [{ label: r.label, role: mapped ?? suggestRowRole(r.label).role, mapped: mapped !== undefined, location: r.location, loose }];
  });
  const useColumns = W.columns.flatMap((c, k) => {
    if (isIndustryCol.has(k)) return [];
    const mapped = mapCols.get(matchKey(c.label));
    return [{ label: c.label, role: mapped ?? suggestColumnRole(c.label).role, mapped: mapped !== undefined, location: c.location, loose: mapped === undefined && !isKnownLabel(c.label, 'column') }];
  });
  return { supplyColumns, supplyRows, useRows, useColumns, useIndustryCol, useProductRow };
}

/**
 * The roles of a pair's labels as the reader would decide them with this role map, without the checks that follow:
 * the app shows them (and lets the planner change them) even while the pair is refused for a label without a role.
 */
export function supplyUseRoles(supply: SutFile, use: SutFile, opts: Pick<ReadSutOptions, 'map' | 'delimiter' | 'decimalMark'> = {}): SutRoles {
  const dialect = { ...(opts.delimiter ? { delimiter: opts.delimiter } : {}), ...(opts.decimalMark ? { decimalMark: opts.decimalMark } : {}) };
  const { supplyColumns, supplyRows, useRows, useColumns } = decideRoles(
    readLabelledGrid(supply.text, { fileName: supply.fileName, ...dialect }), readLabelledGrid(use.text, { fileName: use.fileName, ...dialect }), opts.map,
  );
  return { supplyColumns, supplyRows, useRows, useColumns };
}

export function readSupplyUse(supply: SutFile, use: SutFile, opts: ReadSutOptions = {}): SupplyUse {
  const dialect = { ...(opts.delimiter ? { delimiter: opts.delimiter } : {}), ...(opts.decimalMark ? { decimalMark: opts.decimalMark } : {}) };
  const S = readLabelledGrid(supply.text, { fileName: supply.fileName, ...dialect });
  const W = readLabelledGrid(use.text, { fileName: use.fileName, ...dialect });
  const tol = opts.tolerance ?? SUT_DEFAULT_TOLERANCE;
  const warnings: Warning[] = [...S.warnings, ...W.warnings];
  const decided = decideRoles(S, W, opts.map);

  // Industries, and the supply table's other columns by role.
  const industries: string[] = [];
  const supplyIndustryCol: number[] = [];
  const useIndustryCol: number[] = [];
  const supplyCols: Record<SupplyColumnRole, number[]> = { imports: [], margins: [], productTaxes: [], total: [], ignore: [] };
  const supplyRoles: SupplyUse['roles']['supply'] = {};
  decided.supplyColumns.forEach((c, k) => {
    if (c.role === null) {
      throw new InputError(
        'sut-unknown-industry',
        `supply column '${c.label}' matches no column of the use table '${W.fileName}' and is not an imports, margins, taxes on products or total column: ` +
          `an industry needs the same label in both tables; otherwise give the column a role in the role map ({"supply": {${JSON.stringify(c.label)}: "ignore"}})`,
        c.location,
      );
    }
    supplyRoles[c.label] = c.role;
    if (c.role === 'industry') {
      industries.push(c.label);
      supplyIndustryCol.push(k);
      useIndustryCol.push(decided.useIndustryCol[k]!);
    } else supplyCols[c.role].push(k);
  });
  if (industries.length === 0) {
    throw new InputError('sut-no-industries', `no column of the supply table is a column of the use table '${W.fileName}', so there are no industries (industries need the same labels in both tables)`, { file: S.fileName, line: S.columns[0]?.location.line ?? 1 });
  }

  // Products: supply rows (totals and rows the map sets aside excepted), each a row of the use table.
  const mapSupply = byKey(opts.map?.supply);
  const products: string[] = [];
  const supplyProductRow: number[] = [];
  const useProductRow: number[] = [];
  decided.supplyRows.forEach((r, k) => {
    if (r.role === 'ignore' || r.role === 'total') return;
    if (r.role === null) {
      const mapped = mapSupply.get(matchKey(r.label));
      if (mapped !== undefined) {
        throw new InputError('role-map-schema', `the role map gives supply row '${r.label}' the role '${mapped}', which only supply columns can have (a supply row is a product, or 'ignore' or 'total')`, r.location);
      }
      throw new InputError('sut-unknown-product', `product '${r.label}' of the supply table has no row in the use table '${W.fileName}' (products need the same labels in both tables)`, r.location);
    }
    products.push(r.label);
    supplyProductRow.push(k);
    useProductRow.push(decided.useProductRow[k]!);
  });
  if (products.length === 0) throw new InputError('sut-no-products', 'the supply table has no product rows', { file: S.fileName });

  // The use table's other rows and columns, by role.
  const ni = industries.length;
  const np = products.length;
  const rowRoles: Record<string, RowRole> = {};
  const colRoles: Record<string, ColumnRole> = {};
  const loose: string[] = [];
  const rowIndex = new Map(W.rows.map((r, k) => [r.label, k]));
  const colIndex = new Map(W.columns.map((c, k) => [c.label, k]));
  const extraRows: { k: number; label: string; role: IndustryRow['role'] }[] = [];
  for (const r of decided.useRows) {
    const role = r.role!;
    rowRoles[r.label] = role;
    if (r.loose) loose.push(`row '${r.label}'`);
    if (role !== 'ignore' && role !== 'totalInput') extraRows.push({ k: rowIndex.get(r.label)!, label: r.label, role });
  }
  const fdCols: { k: number; label: string; role: ProductColumn['role'] }[] = [];
  for (const c of decided.useColumns) {
    const role = c.role!;
    colRoles[c.label] = role;
    if (c.loose) loose.push(`column '${c.label}'`);
    if (role === 'householdConsumption' || role === 'otherFinalDemand') fdCols.push({ k: colIndex.get(c.label)!, label: c.label, role });
  }
  if (loose.length) {
    warnings.push({
      code: 'sut-labels-unmatched',
      message:
        `the use table's ${list(loose)} ${loose.length > 1 ? 'are' : 'is'} neither a product or industry of the supply table nor a usual value-added or final-demand label: ` +
        'read as other value added (rows) and other final demand (columns). If one is a product or an industry, give it the same label in both tables; if not, confirm its role in a role map',
      location: { file: W.fileName },
    });
  }

  // Numbers.
  const refuseNegative = (v: number, where: Location, what: string): void => {
    if (v < 0 && !opts.allowNegative) throw new InputError('sut-negative', `negative ${what} ${showNumber(v)} (allow negative flows to accept it)`, where);
  };
  const V = new Float64Array(ni * np);
  for (let p = 0; p < np; p++) {
    for (let j = 0; j < ni; j++) {
      const r = supplyProductRow[p]!, c = supplyIndustryCol[j]!;
      const v = S.number(r, c);
      refuseNegative(v, S.at(r, c), 'output');
      V[j * np + p] = v;
    }
  }
  const columnSum = (G: LabelledGrid, rowsOf: number[], cols: number[]): Float64Array => {
    const out = new Float64Array(rowsOf.length);
    rowsOf.forEach((r, p) => { for (const c of cols) out[p] = out[p]! + G.number(r, c); });
    return out;
  };
  const imports = columnSum(S, supplyProductRow, supplyCols.imports);
  const margins = columnSum(S, supplyProductRow, supplyCols.margins);
  const productTaxes = columnSum(S, supplyProductRow, supplyCols.productTaxes);
  const U = new Float64Array(np * ni);
  for (let p = 0; p < np; p++) {
    for (let j = 0; j < ni; j++) {
      const r = useProductRow[p]!, c = useIndustryCol[j]!;
      const v = W.number(r, c);
      refuseNegative(v, W.at(r, c), 'intermediate use');
      U[p * ni + j] = v;
    }
  }
  const finalDemand: ProductColumn[] = fdCols.map(({ k, label, role }) => ({ label, role, values: Float64Array.from(useProductRow, (r) => W.number(r, k)) }));
  const industryRows: IndustryRow[] = extraRows.map(({ k, label, role }) => {
    const values = Float64Array.from(useIndustryCol, (c) => W.number(k, c));
    if (role === 'employment') {
      values.forEach((v, j) => { if (v < 0) throw new InputError('negative-employment', `negative employment ${showNumber(v)}`, W.at(k, useIndustryCol[j]!)); });
    }
    return { label, role, values };
  });
  const householdIncomeFromFinalDemand: FinalDemandIncome[] = [];
  for (const r of extraRows) {
    if (r.role !== 'labourIncome') continue;
    for (const c of fdCols) {
      const v = W.number(r.k, c.k);
      if (v !== 0) householdIncomeFromFinalDemand.push({ row: r.label, column: c.label, value: v });
    }
  }
  for (const v of [...V, ...U]) {
    if (!Number.isFinite(v)) throw new InputError('overflow', 'the numbers are too large to add up', { file: S.fileName });
  }

  // Outputs. An industry that buys inputs but produces nothing cannot be turned into coefficients.
  const q = new Float64Array(np);
  const g = new Float64Array(ni);
  for (let j = 0; j < ni; j++) for (let p = 0; p < np; p++) { const v = V[j * np + p]!; q[p] = q[p]! + v; g[j] = g[j]! + v; }
  for (const x of [...q, ...g]) if (!Number.isFinite(x)) throw new InputError('overflow', 'the supply table\'s output sums overflow (numbers too large to add up)', { file: S.fileName });
  for (let j = 0; j < ni; j++) {
    if (g[j]! > 0) continue;
    let buys = false;
    for (let p = 0; p < np; p++) if (U[p * ni + j] !== 0) buys = true;
    if (buys || g[j]! < 0) {
      throw new InputError('sut-industry-no-output', `industry '${industries[j]}' uses products in the use table but produces ${showNumber(g[j]!)} in the supply table: an industry's inputs are coefficients of its output, so it needs output`, S.columns[supplyIndustryCol[j]!]!.location);
    }
  }

  // Products: supply against use, and what that says about the use table's valuation.
  const useTotal = new Float64Array(np);
  for (let p = 0; p < np; p++) {
    let s = 0;
    for (let j = 0; j < ni; j++) s += U[p * ni + j]!;
    for (const f of finalDemand) s += f.values[p]!;
    useTotal[p] = s;
  }
  const domestic = compare(useTotal, q);
  const withImports = supplyCols.imports.length ? compare(useTotal, Float64Array.from(q, (x, p) => x + imports[p]!)) : null;
  const purchasers = supplyCols.margins.length || supplyCols.productTaxes.length
    ? compare(useTotal, Float64Array.from(q, (x, p) => x + imports[p]! + margins[p]! + productTaxes[p]!))
    : null;
  const valuation: UseValuation = withImports && withImports.worst < domestic.worst ? 'total' : 'domestic';
  const chosen = valuation === 'total' ? withImports! : domestic;
  if (purchasers && purchasers.worst < chosen.worst && purchasers.worst <= tol) {
    throw new InputError(
      'sut-purchasers-prices',
      `the use table's product rows add up to supply at purchasers' prices (output, imports, trade and transport margins and taxes on products): ` +
        'the transformations to a symmetric table need a use table at basic prices (Eurostat 2008, ch. 11); use the use table at basic prices, without margins and taxes on products in the product rows',
      { file: W.fileName },
    );
  }
  const worst = chosen.gaps
    .map((g, p) => ({ product: products[p]!, gap: g }))
    .filter((e) => Math.abs(e.gap) > tol)
    .sort((a, b) => Math.abs(b.gap) - Math.abs(a.gap));
  const balance: ProductBalance = {
    products,
    output: Array.from(q),
    imports: Array.from(imports),
    margins: Array.from(margins),
    productTaxes: Array.from(productTaxes),
    use: Array.from(useTotal),
    valuation,
    gap: chosen.gaps,
    worst: worst.slice(0, 5),
    tolerance: tol,
  };
  if (worst.length) {
    const against = valuation === 'total' ? 'domestic output plus imports' : `domestic output${supplyCols.imports.length ? ' (nor output plus imports)' : ''}`;
    throw new InputError(
      'sut-products-disagree',
      `supply and use disagree beyond ${Number((tol * 100).toPrecision(3))} % in ${worst.length} product${worst.length > 1 ? 's' : ''}: total use does not equal ${against}; worst: ` +
        `${worst.slice(0, 5).map((e) => `'${e.product}' ${pct(e.gap)}`).join(', ')} (a wider tolerance accepts small rounding gaps)`,
      { file: W.fileName, rowLabel: worst[0]!.product },
    );
  }

  // A use table of all products: split off imports in proportion to use (import proportionality).
  const importedFinalDemand: SupplyUse['importedFinalDemand'] = [];
  if (valuation === 'total') {
    const share = Float64Array.from(q, (x, p) => (x + imports[p]! === 0 ? 0 : imports[p]! / (x + imports[p]!)));
    const importRow = new Float64Array(ni);
    for (let p = 0; p < np; p++) {
      const s = share[p]!;
      if (s === 0) continue;
      for (let j = 0; j < ni; j++) {
        const m = U[p * ni + j]! * s;
        importRow[j] = importRow[j]! + m;
        U[p * ni + j] = U[p * ni + j]! - m;
      }
    }
    for (const f of finalDemand) {
      let m = 0;
      for (let p = 0; p < np; p++) {
        const part = f.values[p]! * share[p]!;
        m += part;
        f.values[p] = f.values[p]! - part;
      }
      importedFinalDemand.push({ label: f.label, value: m });
    }
    industryRows.push({ label: 'Imports (by import proportionality)', role: 'imports', values: importRow });
  }

  // Industries: inputs, value added, taxes and imports against output (a warning, as the table importer's balance report).
  const moneyRows = industryRows.filter((r) => r.role !== 'employment');
  const industryGaps = industries.map((label, j) => {
    let s = 0;
    for (let p = 0; p < np; p++) s += U[p * ni + j]!;
    for (const r of moneyRows) s += r.values[j]!;
    return { label, gap: gap(s, g[j]!) };
  }).filter((e) => Math.abs(e.gap) > tol).sort((a, b) => Math.abs(b.gap) - Math.abs(a.gap));
  if (industryGaps.length) {
    warnings.push({
      code: 'sut-industry-balance',
      message:
        `inputs, value added${valuation === 'total' || moneyRows.some((r) => r.role === 'imports') ? ' and imports' : ''} in the use table differ from output in the supply table beyond ${Number((tol * 100).toPrecision(3))} % in ${industryGaps.length} industr${industryGaps.length > 1 ? 'ies' : 'y'}; worst: ` +
        `${industryGaps.slice(0, 5).map((e) => `'${e.label}' ${pct(e.gap)}`).join(', ')} (a missing or double-counted value-added row — a subtotal such as "Value added" beside its parts — or imports not in the use table)`,
      location: { file: W.fileName, columnLabel: industryGaps[0]!.label },
    });
  }

  const unit = (g: LabelledGrid) => g.corner;
  if (unit(S) !== '' && unit(W) !== '' && matchKey(unit(S)) !== matchKey(unit(W))) {
    warnings.push({ code: 'sut-units-differ', message: `the corner cells differ: '${unit(S)}' in the supply table, '${unit(W)}' in the use table; the derived table states '${unit(W)}' as its money unit — check both are in the same unit`, location: { file: W.fileName, line: 1, column: 1 } });
  }
  return {
    name: opts.name ?? baseName(W.fileName),
    moneyUnit: unit(W) || unit(S) || 'money units',
    supplyFile: S.fileName,
    useFile: W.fileName,
    products,
    industries,
    V,
    U,
    q,
    g,
    finalDemand,
    industryRows,
    householdIncomeFromFinalDemand,
    valuation,
    imports,
    importedFinalDemand,
    balance,
    roles: { rows: rowRoles, columns: colRoles, supply: supplyRoles },
    warnings,
  };
}
