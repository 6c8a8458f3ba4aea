/**
 * A supply and use pair → a symmetric IOTable by one named transformation (transform.ts), with the negatives it gave
 * (negatives.ts) and notes that say what was assumed and where every part of the table came from.
 */
import { InputError, type Warning } from '../diagnostics/index.ts';
import { showNumber, type IOTable, type LabelledVector, type RoleMap } from '../table/index.ts';
import { findNegatives, negativesNote, zeroAndBalance, type NegativesReport } from './negatives.ts';
import { ASSUMPTION_NAMES, transform, type SymmetricFlows } from './transform.ts';
import { ASSUMPTION_BY, type Assumption, type IndustryRow, type NegativesRemedy, type SupplyUse } from './types.ts';

export interface DeriveOptions {
  assumption: Assumption;
  /** What to do with negative flows (product technology, fixed industry sales structure); default keep. */
  negatives?: NegativesRemedy;
}

export interface DerivedTable {
  assumption: Assumption;
  /** Full name of the transformation ("product-by-product table, product technology assumption (Eurostat model A)"). */
  method: string;
  /** The formula of A in the notation of Miller & Blair ch. 5. */
  formula: string;
  flows: SymmetricFlows;
  table: IOTable;
  /** Negatives as the transformation computed them (before any remedy). */
  negatives: NegativesReport;
  remedy: NegativesRemedy;
  /** RAS iterations of the zero-ras remedy; null when it was not applied. */
  remedyIterations: number | null;
  notes: string[];
  warnings: Warning[];
}

const FORMULAS: Readonly<Record<Assumption, string>> = {
  'product-sales': 'A = D·B with B = U·ĝ⁻¹ (inputs per unit of industry output) and D = V·q̂⁻¹ (market shares); final demand D·f',
  'industry-sales': 'A = C⁻¹·B with B = U·ĝ⁻¹ and C = Vᵀ·ĝ⁻¹ (product mix of each industry); final demand C⁻¹·f',
  industry: 'A = B·D with B = U·ĝ⁻¹ and D = V·q̂⁻¹; value added and jobs per unit of product (per-industry coefficients)·D',
  product: 'A = B·C⁻¹ with B = U·ĝ⁻¹ and C = Vᵀ·ĝ⁻¹; value added and jobs per unit of product (per-industry coefficients)·C⁻¹',
};

const CARRIED: Readonly<Record<Assumption, string>> = {
  'product-sales': 'Value added, taxes, imports and jobs are the industries\' own rows from the use table; final demand for products is given to the industries that make them by market share (D·f).',
  'industry-sales': 'Value added, taxes, imports and jobs are the industries\' own rows from the use table; final demand for products is turned into final demand for industries with the same matrix as the flows (C⁻¹·f).',
  industry: 'Final demand is the use table\'s, by product; value added, taxes, imports and jobs of each industry are split among its products in proportion to its output of them (w·ĝ⁻¹·V).',
  product: 'Final demand is the use table\'s, by product; value added, taxes, imports and jobs per unit of product follow the product technology (w·(Vᵀ)⁻¹·q̂).',
};

function sum(v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]!;
  return s;
}

/**
 * Where each row role of the use table goes in the IOTable. A Record over every role, so a role added to the table
 * importer fails to type-check here until it is carried.
 */
const CARRY: Readonly<Record<IndustryRow['role'], IndustryRow['role']>> = {
  labourIncome: 'labourIncome', otherValueAdded: 'otherValueAdded', taxes: 'taxes', imports: 'imports', employment: 'employment', fte: 'fte',
};

/** The flows as an ordinary IOTable, rows and columns under the roles the use table gave them. */
function tableOf(s: SupplyUse, f: SymmetricFlows, name: string): { table: IOTable; warnings: Warning[] } {
  const warnings: Warning[] = [];
  const vec = (label: string, values: Float64Array): LabelledVector => ({ label, values });
  const rowsOf = (to: string) => f.rows.filter((r) => CARRY[r.role] === to).map((r) => vec(r.label, r.values));
  const jobs = f.rows.filter((r) => CARRY[r.role] === 'employment');
  if (jobs.length > 1) warnings.push({ code: 'extra-employment', message: `more than one employment row: '${jobs[0]!.label}' is used`, location: { file: s.useFile, rowLabel: jobs[1]!.label } });
  const fte = f.rows.filter((r) => CARRY[r.role] === 'fte');
  if (fte.length > 1) warnings.push({ code: 'extra-employment', message: `more than one full-time-equivalents row: '${fte[0]!.label}' is used`, location: { file: s.useFile, rowLabel: fte[1]!.label } });
  const taxes = rowsOf('taxes');
  const roles: RoleMap = { rows: {}, columns: {} };
  for (const r of f.rows) roles.rows[r.label] = r.role;
  for (const c of f.finalDemand) roles.columns[c.label] = c.role;
  const table: IOTable = {
    name,
    sectors: f.sectors,
    n: f.n,
    Z: f.Z,
    x: f.x,
    labourIncome: rowsOf('labourIncome'),
    otherValueAdded: rowsOf('otherValueAdded'),
    imports: rowsOf('imports'),
    employment: jobs[0] ? jobs[0].values : null,
    ...(taxes.length ? { taxes } : {}),
    ...(fte[0] ? { fte: fte[0].values } : {}),
    householdConsumption: f.finalDemand.filter((c) => c.role === 'householdConsumption').map((c) => vec(c.label, c.values)),
    otherFinalDemand: f.finalDemand.filter((c) => c.role === 'otherFinalDemand').map((c) => vec(c.label, c.values)),
    moneyUnit: s.moneyUnit,
    layout: 'matrix',
    roles,
    warnings,
  };
  if (s.householdIncomeFromFinalDemand.length) table.householdIncomeFromFinalDemand = s.householdIncomeFromFinalDemand.map((c) => ({ ...c }));
  return { table, warnings };
}

/**
 * Jobs per unit of product under the product technology (w·(Vᵀ)⁻¹·q̂) can come out negative, like its flows; a table
 * cannot hold negative jobs (the importer and validateTable refuse them), and zeroing jobs would change the totals the
 * transformation keeps, so the pair is refused for this assumption, naming the product and the alternatives.
 */
function refuseNegativeJobs(s: SupplyUse, f: SymmetricFlows): void {
  for (const r of f.rows) {
    if (r.role !== 'employment') continue;
    let worst = -1;
    r.values.forEach((v, j) => { if (v < 0 && (worst < 0 || v < r.values[worst]!)) worst = j; });
    if (worst < 0) continue;
    const count = r.values.filter((v) => v < 0).length;
    throw new InputError(
      'sut-negative-jobs',
      `the ${f.assumption === 'product' ? 'product technology' : 'fixed industry sales structure'} gives negative jobs for ${count === 1 ? `'${f.sectors[worst]}'` : `${count} sectors, the most for '${f.sectors[worst]}'`} (${showNumber(r.values[worst]!)}): ` +
        'the secondary products of the industries that make it would employ more than those industries do; use the industry technology (product by product) or the fixed product sales structure (industry by industry), which never give negatives',
      { file: s.useFile, rowLabel: r.label, columnLabel: f.sectors[worst]! },
    );
  }
}

export function deriveSymmetric(s: SupplyUse, opts: DeriveOptions): DerivedTable {
  const { assumption } = opts;
  const by = ASSUMPTION_BY[assumption];
  const raw = transform(s, assumption);
  // Final-demand columns and rows that were negative in the use table already are not the transformation's doing.
  const before = {
    finalDemand: new Set(s.finalDemand.filter((c) => c.values.some((v) => v < 0)).map((c) => c.label)),
    rows: new Set(s.industryRows.filter((r) => r.values.some((v) => v < 0)).map((r) => r.label)),
  };
  const negatives = findNegatives(raw, before);
  const remedy = opts.negatives ?? 'keep';
  let flows = raw;
  let remedyIterations: number | null = null;
  if (remedy === 'zero-ras' && negatives.flows > 0) {
    const r = zeroAndBalance(raw, s.supplyFile);
    flows = r.flows;
    remedyIterations = r.iterations;
  }
  refuseNegativeJobs(s, flows);
  const method = ASSUMPTION_NAMES[assumption];
  const { table, warnings } = tableOf(s, flows, `${s.name} (${by} by ${by}, ${assumption === 'product-sales' ? 'fixed product sales structure' : assumption === 'industry-sales' ? 'fixed industry sales structure' : `${assumption} technology`})`);
  const unit = s.moneyUnit;
  const notes: string[] = [
    `Derived from the supply table ${s.supplyFile} and the use table ${s.useFile} (${s.products.length} products, ${s.industries.length} industries) as a ${method}: ${FORMULAS[assumption]} (Eurostat, Manual of Supply, Use and Input-Output Tables, 2008, ch. 11; Miller & Blair 2009, ch. 5).`,
    CARRIED[assumption],
    `Total output ${showNumber(sum(flows.x))} ${unit} (the supply table's output at basic prices, ${by === 'industry' ? 'by industry' : 'by product'}); final demand for domestic products ${showNumber(s.finalDemand.reduce((a, c) => a + sum(c.values), 0))} ${unit}, kept in total by the transformation.`,
  ];
  if (s.valuation === 'total') {
    const importRow = s.industryRows.find((r) => r.label === 'Imports (by import proportionality)');
    const fdImports = s.importedFinalDemand.reduce((a, c) => a + c.value, 0);
    notes.push(
      `The use table holds domestic and imported products (its products add up to output plus imports), so imports were split off by the import proportionality assumption — every use of a product takes that product's imported share of supply, m/(q + m), exports included (recalled from memory; Eurostat 2008, ch. 12): ` +
        `${showNumber(importRow ? sum(importRow.values) : 0)} ${unit} of intermediate inputs became the row 'Imports (by import proportionality)'; ${showNumber(fdImports)} ${unit} of final demand was imported and is not in the table (${s.importedFinalDemand.map((c) => `${c.label} ${showNumber(c.value)}`).join(', ')}).`,
    );
  } else {
    notes.push(`The use table's products add up to domestic output: it is a use table of domestic products${s.industryRows.some((r) => r.role === 'imports') ? ', with imports as a row by industry' : ''}.`);
  }
  const neg = negativesNote(negatives, unit);
  if (neg) {
    notes.push(neg);
    notes.push(remedy === 'zero-ras' && remedyIterations !== null
      ? `Remedy: the negative intermediate flows were set to zero and the intermediate block rebalanced by RAS to the transformation's row and column totals (${remedyIterations} iterations; common practice, no single source), so total output and value added are kept; the negatives in final demand or value added, if any, remain.`
      : `The coefficients are reported as computed, negatives included; the table reads back only with negative flows allowed (roundwise analyze --allow-negative). Remedies: the fixed product sales structure or the industry technology never give negatives; or set them to zero and rebalance by RAS (--negatives zero-ras).`);
  }
  if (raw.condition !== null) notes.push(`Condition number of the inverted matrix about ${raw.condition.toExponential(1)}.`);
  return { assumption, method, formula: FORMULAS[assumption], flows, table, negatives, remedy, remedyIterations, notes, warnings: [...s.warnings, ...raw.warnings, ...warnings] };
}
