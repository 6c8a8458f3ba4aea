/**
 * `roundwise sut SUPPLY.csv USE.csv`: a symmetric input–output table from a supply and use pair, by one of the four
 * transformations of Eurostat's Manual of Supply, Use and Input-Output Tables (2008, ch. 11) (src/sut through the
 * study layer).
 */
import {
  ASSUMPTIONS, ASSUMPTION_BY, CAUTIONS, formatLocated, originLines, sourceOriginsOf, NEGATIVES_REMEDIES, SUT_DEFAULT_TOLERANCE, TABLE_BY, parseSutRoleMap, supplyUseTotals, symmetricFromSupplyUse,
  type Assumption, type NegativesRemedy, type SymmetricFromSupplyUse, type TableBy,
} from '../../study/index.ts';
import { TABLE_DIALECT_OPTIONS, tableDialect } from './table-dialect.ts';
import { defineCommand } from '../command.ts';
import { num, textTable } from '../terminal.ts';

function coefficientRows(r: SymmetricFromSupplyUse): number[][] {
  const A = r.judged.pm.coef.A;
  const n = r.table.n;
  return Array.from({ length: n }, (_, i) => Array.from(A.subarray(i * n, (i + 1) * n)));
}

/** Money and jobs as written in the table (ten significant digits), in exponent form only beyond 10¹². */
const amount = (v: number): string => (Math.abs(v) >= 1e12 ? num(v) : String(Number(v.toPrecision(10))));

function summary(r: SymmetricFromSupplyUse): string {
  const t = r.table;
  const unit = t.moneyUnit || 'money';
  const totals = supplyUseTotals(r);
  const neg = r.derived.negatives;
  return [
    `${r.pair.products.length} products × ${r.pair.industries.length} industries → ${t.n} sectors: ${r.derived.method}.`,
    `Formula: ${r.derived.formula}.`,
    ...originLines(sourceOriginsOf(r.judged.study)).map(([k, v]) => `${k}: ${v}`),
    '',
    textTable(
      ['Sector', `Output (${unit})`, `Final demand (${unit})`, ...(t.employment ? ['Jobs'] : [])],
      t.sectors.map((s, i) => [
        s, amount(t.x[i]!), amount([...t.householdConsumption, ...t.otherFinalDemand].reduce((a, c) => a + c.values[i]!, 0)),
        ...(t.employment ? [amount(t.employment[i]!)] : []),
      ]),
    ),
    '',
    `Total output ${amount(totals.output)} ${unit}; final demand ${amount(totals.finalDemandTable)} ${unit} (the use table's ${amount(totals.finalDemandPair)}).`,
    neg.flows || neg.others ? `Negatives: ${neg.flows} intermediate flow(s), ${neg.others} other cell(s)${r.derived.remedy === 'zero-ras' ? '; flows zeroed and rebalanced by RAS' : ' (kept as computed)'}.` : 'No negative coefficients.',
    ...r.derived.notes.map((n) => `- ${n}`),
    `Verdict on the derived table: ${r.judged.verdict.say}`,
    '',
    'Cautions:',
    ...CAUTIONS.map((c) => `- ${c}`),
    '',
  ].join('\n');
}

export const sut = defineCommand({
  name: 'sut',
  summary: 'a symmetric input-output table from supply and use tables (Eurostat 2008 models A-D: fixed product or industry sales structure, industry or product technology)',
  positional: { name: 'SUPPLY.csv', help: 'the supply table: products in rows, industries in columns (then imports, margins, taxes on products or totals, named by their words or in --map)' },
  second: { name: 'USE.csv', help: 'the use table at basic prices: products in rows, industries then final-demand columns; value-added, imports, taxes and employment rows by industry below' },
  options: {
    by: { type: 'string', value: 'B', choices: TABLE_BY, help: 'industry-by-industry (default) or product-by-product table' },
    assumption: {
      type: 'string', value: 'A', choices: ASSUMPTIONS,
      help: 'product-sales: fixed product sales structure (default for --by industry); industry-sales: fixed industry sales structure; industry: industry technology (default for --by product); product: product technology (can give negatives)',
    },
    negatives: { type: 'string', value: 'R', choices: NEGATIVES_REMEDIES, help: 'negative flows of the product technology or fixed industry sales structure: keep (default, reported) or zero-ras (set to zero, rebalanced by RAS to the same totals)' },
    map: { type: 'string', value: 'MAP.json', help: 'roles: {"rows": {...}, "columns": {...}} for the use table as in a table\'s role map, "supply": {"LABEL": "imports|margins|productTaxes|total|ignore"}' },
    tolerance: { type: 'number', value: 'T', help: `largest relative gap between supply and use of a product (default ${SUT_DEFAULT_TOLERANCE})`, check: (t) => (t > 0 && t < 1 ? null : 'must lie between 0 and 1') },
    'allow-negative': { type: 'boolean', help: 'accept negative cells in the supply table and in the use table\'s products' },
    ...TABLE_DIALECT_OPTIONS,
  },
  outHelp: 'write symmetric-table.csv (reads back with roundwise analyze, scenario and regionalize) and transformation.csv (by sector: output, inputs, value added, final demand, jobs, negative flows), each with an .about.txt naming the transformation',
  notes: [
    'The transformations (Eurostat, Manual of Supply, Use and Input-Output Tables, 2008, ch. 11; Miller & Blair 2009, ch. 5), with V the make table (supply transposed), U the use of domestic products, q product output, g industry output, B = U·ĝ⁻¹, D = V·q̂⁻¹, C = Vᵀ·ĝ⁻¹:',
    '  product-sales  (industry by industry, model D)  A = D·B      final demand D·f; value added and jobs the industries\'',
    '  industry-sales (industry by industry, model C)  A = C⁻¹·B    final demand C⁻¹·f; needs a square pair',
    '  industry       (product by product, model B)    A = B·D      value added and jobs per product ·D',
    '  product        (product by product, model A)    A = B·C⁻¹    value added and jobs per product ·C⁻¹; needs a square pair; can give negatives',
    'A use table of all products (its products add up to output plus imports) has imports split off by import proportionality.',
  ],
  async run({ input, second, values }, ctx) {
    const supply = ctx.input(input);
    const use = ctx.input(second!);
    const map = values.map === undefined ? undefined : parseSutRoleMap(ctx.input(values.map).text, values.map);
    const assumption = values.assumption as Assumption | undefined;
    const by = values.by as TableBy | undefined;
    if (assumption !== undefined && by !== undefined && ASSUMPTION_BY[assumption] !== by) {
      throw ctx.usageError(`--assumption ${assumption} gives a ${ASSUMPTION_BY[assumption]}-by-${ASSUMPTION_BY[assumption]} table, not --by ${by}`);
    }
    const r = symmetricFromSupplyUse({
      supply: { bytes: supply.bytes, fileName: input },
      use: { bytes: use.bytes, fileName: second! },
      ...(by ? { by } : {}),
      ...(assumption ? { assumption } : {}),
      ...(values.negatives ? { negatives: values.negatives as NegativesRemedy } : {}),
      ...(map ? { map } : {}),
      ...tableDialect(values),
      ...(values.tolerance !== undefined ? { tolerance: values.tolerance } : {}),
      ...(values['allow-negative'] ? { allowNegative: true } : {}),
    }, ctx.date);
    for (const w of r.warnings) ctx.warn(formatLocated(w));
    return {
      summary: () => summary(r),
      json: () => ({
        sectors: r.table.sectors,
        by: r.derived.flows.by,
        assumption: r.derived.assumption,
        method: r.derived.method,
        formula: r.derived.formula,
        A: coefficientRows(r),
        output: Array.from(r.table.x),
        moneyUnit: r.table.moneyUnit,
        products: r.pair.products,
        industries: r.pair.industries,
        valuation: r.pair.valuation,
        negatives: r.derived.negatives,
        remedy: r.derived.remedy,
        notes: r.notes,
        warnings: r.warnings,
        sources: r.sources,
        verdict: r.judged.verdict,
        cautions: CAUTIONS,
      }),
      reports: r.reports,
    };
  },
});
