/**
 * A county table estimated from a national one and county employment by sector (location-quotient regionalization;
 * Miller & Blair, Input–Output Analysis, 2nd ed. 2009, ch. 8):
 *
 * - regional coefficients r_ij = a_ij · min(q_ij, 1) with q the chosen quotient (quotients.ts);
 * - county output x_j^R = x_j^N · E_j^R / E_j^N (national output per job);
 * - labour-income, other value-added, taxes, national import, employment and FTE coefficients kept: those rows scale by E_j^R / E_j^N;
 * - regional imports: what the local coefficients no longer supply, m_j = Σ_i (a_ij − r_ij), added as an import row;
 * - household consumption per unit of household income regionalized with min(SLQ_i, 1);
 * - exports and other final demand: what is left of county output after local intermediate and household use.
 */
import { InputError, type Warning } from '../diagnostics/index.ts';
import { coefficients } from '../model/index.ts';
import type { IOTable, LabelledVector, RoleMap } from '../table/index.ts';
import type { EmploymentInput } from './employment.ts';
import { DEFAULT_FLQ_DELTA, flqLambda, quotientMatrix, regionalCoefficients, simpleLQ, type LqMethod } from './quotients.ts';
import { compareEstimate, type EstimateComparison } from './plausibility.ts';

export interface RegionalizeOptions {
  method: LqMethod;
  /** FLQ exponent δ in [0, 1]; default 0.3. Ignored by slq and cilq. */
  delta?: number;
  /** Name of the regional table; defaults to "<national name> (county estimate, METHOD)". */
  name?: string;
}

export interface RegionalResult {
  method: LqMethod;
  /** δ used (flq), else null. */
  delta: number | null;
  /** λ* (flq), else null. */
  lambda: number | null;
  sectors: string[];
  regionalJobs: Float64Array;
  nationalJobs: Float64Array;
  slq: Float64Array;
  /** National technical coefficients a_ij, n×n row-major. */
  nationalCoefficients: Float64Array;
  /** Regional coefficients r_ij, n×n row-major (absent sectors have zero rows). */
  coefficients: Float64Array;
  /** Sectors with no county employment: they supply nothing locally. */
  absent: string[];
  /** County output by sector, money. */
  output: Float64Array;
  /** Import leakage per unit of county output, Σ_i (a_ij − r_ij). */
  leakage: Float64Array;
  /** Import leakage in money, leakage_j · x_j^R. */
  leakageValue: Float64Array;
  /** The county table, ready for analysis like any imported table. */
  table: IOTable;
  /** The estimate against the national table and a plausible county range (plausibility.ts); its note is in `notes`. */
  comparison: EstimateComparison;
  warnings: Warning[];
  /** Method notes for reports. */
  notes: string[];
}

export const REGIONAL_IMPORT_LABEL = 'Imports from outside the county';
export const REGIONAL_FINAL_DEMAND_LABEL = 'Exports and other final demand';

function uniqueLabel(wanted: string, taken: Set<string>): string {
  let label = wanted;
  for (let k = 2; taken.has(label); k++) label = `${wanted} (${k})`;
  taken.add(label);
  return label;
}

/** v_j · E_j^R / E_j^N (multiplied before dividing, so a row equal to the national jobs gives the county jobs exactly). */
function scaleColumns(v: LabelledVector, er: Float64Array, en: Float64Array): LabelledVector {
  return { label: v.label, values: v.values.map((x, j) => (en[j]! > 0 ? (x * er[j]!) / en[j]! : 0)) };
}

/** Checks the inputs and returns county and national jobs in table order. */
function jobsByTableSector(national: IOTable, emp: EmploymentInput): { er: Float64Array; en: Float64Array; warnings: Warning[] } {
  const { n, sectors } = national;
  const index = new Map(sectors.map((s, i) => [s, i]));
  const er = new Float64Array(n);
  const en = new Float64Array(n);
  const given = new Array<boolean>(n).fill(false);
  const warnings: Warning[] = [];
  const file = emp.fileName;
  for (const e of emp.entries) {
    const i = index.get(e.sector);
    if (i === undefined) {
      throw new InputError('employment-unknown-sector', `sector '${e.sector}' is not a sector of the national table '${national.name}'`, { file, line: e.line, column: 1, rowLabel: e.sector });
    }
    given[i] = true;
    const fromTable = national.employment?.[i];
    let nat = e.national;
    if (nat === null) {
      if (fromTable === undefined) {
        throw new InputError('employment-national-missing', 'the employment file has no national column and the national table has no employment row', { file, line: e.line, rowLabel: e.sector });
      }
      nat = fromTable;
    } else if (fromTable !== undefined && Math.abs(nat - fromTable) > 1e-3 * Math.max(nat, fromTable)) {
      warnings.push({
        code: 'employment-national-differs',
        message: `national jobs ${nat} differ from the national table's employment row (${fromTable}); the employment file is used for quotients and output per job`,
        location: { file, line: e.line, column: 3, rowLabel: e.sector },
      });
    }
    if (e.regional > nat) {
      throw new InputError('employment-above-national', `county jobs (${e.regional}) exceed national jobs (${nat})`, { file, line: e.line, column: 2, rowLabel: e.sector });
    }
    if (nat === 0 && national.x[i]! > 0) {
      throw new InputError('employment-national-zero', 'national jobs are zero for a sector with national output, so output per job cannot be computed', { file, line: e.line, column: 3, rowLabel: e.sector });
    }
    er[i] = e.regional;
    en[i] = nat;
  }
  const missing = sectors.filter((_, i) => !given[i]);
  if (missing.length) {
    throw new InputError('employment-sector-missing', `the employment file has no line for ${missing.length === 1 ? 'sector' : 'sectors'} ${missing.map((s) => `'${s}'`).join(', ')} of the national table`, { file, rowLabel: missing[0]! });
  }
  if (!er.some((v) => v > 0)) throw new InputError('employment-all-zero', 'county employment is zero in every sector', { file, column: 2 });
  return { er, en, warnings };
}

/** The estimate without its comparison with the source (regionalize adds it): for callers that estimate many times. */
export type RegionalEstimate = Omit<RegionalResult, 'comparison'>;

export function regionalize(national: IOTable, emp: EmploymentInput, opts: RegionalizeOptions): RegionalResult {
  const est = regionalizeTable(national, emp, opts);
  // How the estimate compares with its source: always a note, and a warning when it lies outside the plausible range.
  const { comparison, warning } = compareEstimate(national, est.table, Array.from(est.regionalJobs, (v) => v > 0));
  est.notes.push(comparison.note);
  if (warning) { est.warnings.push(warning); est.table.warnings.push(warning); }
  return { ...est, comparison };
}

/** The county table and its parts from location quotients (see the file comment). */
export function regionalizeTable(national: IOTable, emp: EmploymentInput, opts: RegionalizeOptions): RegionalEstimate {
  const delta = opts.delta ?? DEFAULT_FLQ_DELTA;
  if (!Number.isFinite(delta) || delta < 0 || delta > 1) {
    throw new InputError('delta-range', `δ must lie between 0 and 1 (got ${Number.isFinite(delta) ? delta : 'a non-number'})`, {});
  }
  const { n, sectors } = national;
  const { er, en, warnings } = jobsByTableSector(national, emp);
  let ER = 0;
  let EN = 0;
  for (let i = 0; i < n; i++) { ER += er[i]!; EN += en[i]!; }

  const slq = simpleLQ(er, en);
  const lambda = opts.method === 'flq' ? flqLambda(ER, EN, delta) : null;
  const nat = coefficients(national);
  const A = nat.A;
  const R = regionalCoefficients(A, quotientMatrix(opts.method, slq, lambda ?? 1));
  const absent = sectors.filter((_, i) => !(er[i]! > 0));

  // county output and every per-output row scale by E_j^R / E_j^N (national output per job, coefficients kept)
  const x = scaleColumns({ label: '', values: national.x }, er, en).values;
  const Z = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) Z[i * n + j] = R[i * n + j]! * x[j]!;
  const leakage = new Float64Array(n);
  for (let j = 0; j < n; j++) {
    let m = 0;
    for (let i = 0; i < n; i++) m += A[i * n + j]! - R[i * n + j]!;
    leakage[j] = m;
  }
  const leakageValue = Float64Array.from(leakage, (m, j) => m * x[j]!);

  const rowLabels = new Set<string>([...sectors, ...[...national.labourIncome, ...national.otherValueAdded, ...(national.taxes ?? []), ...national.imports].map((v) => v.label)]);
  const labourIncome = national.labourIncome.map((v) => scaleColumns(v, er, en));
  const otherValueAdded = national.otherValueAdded.map((v) => scaleColumns(v, er, en));
  const taxes = national.taxes?.map((v) => scaleColumns(v, er, en));
  const fte = national.fte ? scaleColumns({ label: '', values: national.fte }, er, en).values : null;
  const importLabel = uniqueLabel(REGIONAL_IMPORT_LABEL, rowLabels);
  const imports = [...national.imports.map((v) => scaleColumns(v, er, en)), { label: importLabel, values: leakageValue }];
  const employment = national.employment ? scaleColumns({ label: '', values: national.employment }, er, en).values : Float64Array.from(er);

  // households: consumption per unit of household income, c_i / x_h, regionalized with min(SLQ_i, 1)
  let incomeN = 0;
  let incomeR = 0;
  for (const v of national.labourIncome) for (let j = 0; j < n; j++) incomeN += v.values[j]!;
  for (const v of labourIncome) for (let j = 0; j < n; j++) incomeR += v.values[j]!;
  const incomeRatio = incomeN > 0 ? incomeR / incomeN : 0;
  const householdConsumption = national.householdConsumption.map((v) => ({
    label: v.label,
    values: v.values.map((c, i) => c * Math.min(slq[i]!, 1) * incomeRatio),
  }));

  const columnLabels = new Set<string>([...sectors, ...national.householdConsumption.map((v) => v.label)]);
  const fdLabel = uniqueLabel(REGIONAL_FINAL_DEMAND_LABEL, columnLabels);
  const rest = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let used = 0;
    for (let j = 0; j < n; j++) used += Z[i * n + j]!;
    for (const v of householdConsumption) used += v.values[i]!;
    rest[i] = x[i]! - used;
    if (rest[i]! < -1e-9 * Math.max(x[i]!, 1)) {
      warnings.push({
        code: 'regional-negative-final-demand',
        message: `local intermediate and household use exceeds the estimated county output; exports and other final demand come out negative (${Number(rest[i]!.toPrecision(6))} ${national.moneyUnit}). Consider CILQ or FLQ, or balancing to known county totals (RAS)`,
        location: { rowLabel: sectors[i]!, columnLabel: fdLabel },
      });
    }
  }

  const roles: RoleMap = { rows: {}, columns: {} };
  for (const v of labourIncome) roles.rows[v.label] = 'labourIncome';
  for (const v of otherValueAdded) roles.rows[v.label] = 'otherValueAdded';
  for (const v of taxes ?? []) roles.rows[v.label] = 'taxes';
  for (const v of imports) roles.rows[v.label] = 'imports';
  for (const v of householdConsumption) roles.columns[v.label] = 'householdConsumption';
  roles.columns[fdLabel] = 'otherFinalDemand';

  const methodName = opts.method.toUpperCase();
  const notes = [
    `Estimated from the national table '${national.name}' with ${methodName} location quotients and county employment from ${emp.fileName}.`,
    opts.method === 'flq' ? `FLQ with δ = ${delta} and λ* = ${Number(lambda!.toPrecision(4))}; Flegg & Tohmo (2013) report δ around 0.25–0.35 fitting survey-based tables.` : `Regional coefficients r_ij = a_ij · min(${methodName}, 1).`,
    'County output = national output per job × county jobs; labour-income, other value-added, taxes, employment and full-time-equivalent coefficients are the national ones.',
    'Household consumption per unit of income is regionalized with min(SLQ, 1); exports and other final demand are what remains of county output.',
    ...(absent.length ? [`Absent sectors (no county employment, supply nothing locally): ${absent.join('; ')}.`] : []),
  ];

  const table: IOTable = {
    name: opts.name ?? `${national.name} (county estimate, ${methodName})`,
    sectors: [...sectors],
    n,
    Z,
    x,
    labourIncome,
    otherValueAdded,
    ...(taxes ? { taxes } : {}),
    imports,
    employment,
    ...(fte ? { fte } : {}),
    householdConsumption,
    otherFinalDemand: [{ label: fdLabel, values: rest }],
    moneyUnit: national.moneyUnit,
    layout: 'matrix',
    roles,
    warnings: [...warnings],
  };
  return {
    method: opts.method,
    delta: opts.method === 'flq' ? delta : null,
    lambda,
    sectors: [...sectors],
    regionalJobs: er,
    nationalJobs: en,
    slq,
    nationalCoefficients: A,
    coefficients: R,
    absent,
    output: x,
    leakage,
    leakageValue,
    table,
    warnings,
    notes,
  };
}
