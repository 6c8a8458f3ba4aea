/**
 * The worker's adapter for building a county table from a larger one: regionalize (SLQ, CILQ or FLQ), optionally
 * balance to known county totals (RAS) and merge sectors by a grouping, and return plain views for the screen plus the
 * finished table as CSV text (writeTableCsv). Stateless: "Use this table" loads that CSV like any imported file
 * (`loadTable`), so projects, re-imports and the worker's replay after Cancel treat it as an ordinary table.
 */
import { importTable, writeTableCsv, type IOTable } from '../../src/table/index.ts';
import { coefficients, perronRoot } from '../../src/model/index.ts';
import {
  aggregateTable, AGGREGATION_BIAS_NOTE, balanceTable, DEFAULT_FLQ_DELTA, LQ_METHODS, parseEmploymentCsv, parseGroupMapping, parseTotals,
  regionalize, type LqMethod,
} from '../../src/regional/index.ts';
import { aboutText } from '../../src/report/index.ts';
import { sha256Hex, utf8Bytes } from '../../src/project/index.ts';
import { formatLocated, InputError } from '../../src/diagnostics/index.ts';

/** One input file as the user chose it (or a bundled sample's text). */
export interface RegionalFile {
  text: string;
  fileName: string;
}

export interface RegionalRequest {
  national: RegionalFile;
  employment: RegionalFile;
  method: LqMethod;
  /** FLQ δ; ignored by SLQ and CILQ. */
  delta: number;
  /** Known county intermediate sales (rows) and purchases (columns), `sector,total`: balance the estimate by RAS. */
  balance?: { rows: RegionalFile; columns: RegionalFile } | null;
  /** `sector,group`: merge the county table's sectors into groups. */
  groups?: RegionalFile | null;
}

export interface RegionalSectorRow {
  sector: string;
  regionalJobs: number;
  nationalJobs: number;
  slq: number;
  absent: boolean;
  /** County output, money. */
  output: number;
  /** Σ_i a_ij: national intermediate inputs per unit of output. */
  nationalInputs: number;
  /** Σ_i r_ij: local intermediate inputs per unit of output. */
  localInputs: number;
  /** Import leakage per unit of output, Σ_i (a_ij − r_ij). */
  leakage: number;
  /** Import leakage in money. */
  leakageValue: number;
}

export interface RegionalView {
  method: LqMethod;
  delta: number | null;
  lambda: number | null;
  /** County jobs over national jobs, E^R / E^N (what λ* is computed from). */
  jobShare: number;
  sectors: string[];
  n: number;
  moneyUnit: string;
  rows: RegionalSectorRow[];
  absent: string[];
  totals: { regionalJobs: number; nationalJobs: number; output: number; leakageValue: number };
  /** National technical coefficients a_ij and regional r_ij, n×n row-major (detailed sectors). */
  national: Float64Array;
  regional: Float64Array;
  /** Largest national coefficient (the shaded grids share one scale). */
  maxCoefficient: number;
  notes: string[];
  warnings: string[];
  balance: { iterations: number; converged: boolean; gap: number } | null;
  groups: { names: string[]; members: string[][]; bias: { group: string; spread: [number, number] | null; groupMultiplier: number | null }[] } | null;
  /** The finished county table (after the optional steps). */
  result: { name: string; n: number; fileName: string; csv: string; about: string; perron: number | null; perronUpper: number | null; productive: boolean | null };
}

function slugOf(fileName: string): string {
  const base = fileName.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, '').replace(/[-_ ]?employment$/i, '');
  return base.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'county';
}

function sum(v: ArrayLike<number>): number {
  let s = 0;
  for (let i = 0; i < v.length; i++) s += v[i]!;
  return s;
}

function viability(t: IOTable): { perron: number | null; upper: number | null; productive: boolean | null } {
  try {
    const p = perronRoot(coefficients(t).A, t.n);
    const root = Number.isFinite(p.root) ? p.root : null;
    return { perron: root, upper: Number.isFinite(p.upper) ? p.upper : null, productive: p.upper < 1 ? true : p.lower >= 1 ? false : null };
  } catch {
    return { perron: null, upper: null, productive: null };
  }
}

export function buildRegional(req: RegionalRequest): RegionalView {
  if (!(LQ_METHODS as readonly string[]).includes(req.method)) throw new InputError('usage', `the method must be SLQ, CILQ or FLQ (got '${String(req.method)}')`, {});
  const national = importTable(req.national.text, { fileName: req.national.fileName });
  const emp = parseEmploymentCsv(req.employment.text, req.employment.fileName);
  const delta = req.method === 'flq' ? req.delta : DEFAULT_FLQ_DELTA;
  const res = regionalize(national, emp, { method: req.method, delta });
  const { sectors } = res;
  const n = sectors.length;
  const A = res.nationalCoefficients;
  const R = res.coefficients;

  let maxCoefficient = 0;
  for (let k = 0; k < n * n; k++) if (A[k]! > maxCoefficient) maxCoefficient = A[k]!;
  const rows: RegionalSectorRow[] = sectors.map((sector, j) => {
    let nat = 0, loc = 0;
    for (let i = 0; i < n; i++) { nat += A[i * n + j]!; loc += R[i * n + j]!; }
    return {
      sector,
      regionalJobs: res.regionalJobs[j]!,
      nationalJobs: res.nationalJobs[j]!,
      slq: res.slq[j]!,
      absent: !(res.regionalJobs[j]! > 0),
      output: res.output[j]!,
      nationalInputs: nat,
      localInputs: loc,
      leakage: res.leakage[j]!,
      leakageValue: res.leakageValue[j]!,
    };
  });

  let table = res.table;
  const notes = [...res.notes];
  const warnings = res.warnings.map((w) => formatLocated(w));
  let balance: RegionalView['balance'] = null;
  if (req.balance) {
    const sales = parseTotals(req.balance.rows.text, req.balance.rows.fileName, sectors, 'sector');
    const purchases = parseTotals(req.balance.columns.text, req.balance.columns.fileName, sectors, 'sector');
    const b = balanceTable(table, { sales, purchases, fileName: req.balance.rows.fileName });
    table = { ...b.table, name: `${res.table.name}, balanced by RAS` };
    notes.push(...b.notes);
    warnings.push(...b.warnings.map((w) => formatLocated(w)));
    balance = { iterations: b.ras.iterations, converged: b.ras.converged, gap: Math.max(b.ras.rowGap, b.ras.columnGap) };
  }
  let groups: RegionalView['groups'] = null;
  if (req.groups) {
    const g = aggregateTable(table, parseGroupMapping(req.groups.text, req.groups.fileName));
    table = g.table;
    notes.push(...g.notes.filter((x) => x !== AGGREGATION_BIAS_NOTE), AGGREGATION_BIAS_NOTE);
    groups = {
      names: g.groups,
      members: g.members,
      bias: g.bias.map((b) => {
        const m = b.memberMultipliers?.filter((v) => Number.isFinite(v)) ?? [];
        return { group: b.group, spread: m.length ? [Math.min(...m), Math.max(...m)] : null, groupMultiplier: b.groupMultiplier !== null && Number.isFinite(b.groupMultiplier) ? b.groupMultiplier : null };
      }),
    };
  }

  const csv = writeTableCsv(table);
  const steps = `${req.method}${req.balance ? '-ras' : ''}${req.groups ? '-grouped' : ''}`;
  const fileName = `${slugOf(req.employment.fileName)}-${steps}-estimate.csv`;
  const modelType = `county table estimated from a larger one (${req.method.toUpperCase()} location quotients${req.method === 'flq' ? `, δ = ${delta}` : ''}${req.balance ? ', balanced by RAS' : ''}${req.groups ? ', sectors grouped' : ''})`;
  const about = aboutText({
    title: 'County input–output table estimated from a larger table',
    tableName: table.name,
    sourceFile: req.national.fileName,
    sourceHash: sha256Hex(utf8Bytes(req.national.text)),
    modelType,
    date: new Date().toISOString(),
    moneyUnit: table.moneyUnit,
    notes: [...notes, ...warnings],
  });
  const v = viability(table);

  return {
    method: res.method,
    delta: res.delta,
    lambda: res.lambda,
    jobShare: sum(res.nationalJobs) > 0 ? sum(res.regionalJobs) / sum(res.nationalJobs) : 0,
    sectors,
    n,
    moneyUnit: national.moneyUnit,
    rows,
    absent: res.absent,
    totals: { regionalJobs: sum(res.regionalJobs), nationalJobs: sum(res.nationalJobs), output: sum(res.output), leakageValue: sum(res.leakageValue) },
    national: A,
    regional: R,
    maxCoefficient,
    notes,
    warnings,
    balance,
    groups,
    result: { name: table.name, n: table.n, fileName, csv, about, perron: v.perron, perronUpper: v.upper, productive: v.productive },
  };
}

export const regionalApi = { buildRegional };
