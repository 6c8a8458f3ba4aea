/**
 * The worker's side of the "Supply and use" screen: the study layer's derivation of a symmetric table from a supply
 * and use pair (src/study supply-use.ts: read, transform by the chosen assumption, judge with the same verdict as any
 * table), shaped into plain views, plus the table as CSV text. Stateless: "Use this table" loads that CSV like any
 * imported file, and "Use as the larger table" hands it to the county estimate as its national table.
 */
import {
  formatLocated, parseSutRoleMap, supplyUseRolesOf, symmetricFromSupplyUse, utf8Bytes, type Assumption, type NegativesRemedy, type ProjectSourceOrigin, type SutRoleMap, type SutRoles, type TableBy,
} from '../../src/study/index.ts';
import type { RegionalFile } from './regional.ts';

export interface SupplyUseRequest {
  supply: RegionalFile;
  use: RegionalFile;
  by: TableBy;
  assumption: Assumption;
  negatives: NegativesRemedy;
  /** Relative tolerance of supply against use by product (default SUT_DEFAULT_TOLERANCE). */
  tolerance?: number;
  /** Roles the planner set (the CLI's --map): supply columns, use-table rows and columns. */
  map?: SutRoleMap;
}

export interface SupplyUseSectorRow {
  sector: string;
  output: number;
  /** Intermediate inputs, value added (compensation and other value added), imports, final demand: money. */
  inputs: number;
  valueAdded: number;
  imports: number;
  finalDemand: number;
  jobs: number | null;
  /** Negative intermediate flows in this sector's column. */
  negatives: number;
}

export interface SupplyUseView {
  by: TableBy;
  assumption: Assumption;
  method: string;
  formula: string;
  products: number;
  industries: number;
  /** `domestic` (use of domestic products) or `total` (imports split off by import proportionality). */
  valuation: 'domestic' | 'total';
  moneyUnit: string;
  sectors: string[];
  rows: SupplyUseSectorRow[];
  totals: { output: number; finalDemandPair: number; finalDemandTable: number };
  negatives: { flows: number; others: number; flowSum: number; flowShare: number; largest: { row: string; column: string; value: number; part: string }[] };
  remedy: NegativesRemedy;
  /** Largest relative gap between supply and use of a product, and the tolerance it was checked against. */
  worstGap: number;
  tolerance: number;
  notes: string[];
  warnings: string[];
  /** The derived table: CSV and sidecar, whether it holds negative cells (it then cannot be used here), the verdict. */
  result: { name: string; n: number; fileName: string; csv: string; about: string; hasNegatives: boolean; perron: number | null; productive: boolean | null; verdict: string };
  /** The pair's files with their SHA-256: shown, and kept with the table when it is used. */
  sources: ProjectSourceOrigin[];
}

const asFile = (f: RegionalFile) => ({ bytes: utf8Bytes(f.text), fileName: f.fileName });
const sum = (v: ArrayLike<number>): number => { let s = 0; for (let i = 0; i < v.length; i++) s += v[i]!; return s; };

export function buildSymmetric(req: SupplyUseRequest): SupplyUseView {
  const r = symmetricFromSupplyUse({
    supply: asFile(req.supply), use: asFile(req.use), by: req.by, assumption: req.assumption, negatives: req.negatives,
    ...(req.tolerance !== undefined ? { tolerance: req.tolerance } : {}),
    ...(req.map ? { map: req.map } : {}),
  });
  const t = r.table;
  const n = t.n;
  const fd = [...t.householdConsumption, ...t.otherFinalDemand];
  const va = [...t.labourIncome, ...t.otherValueAdded];
  const rows: SupplyUseSectorRow[] = t.sectors.map((sector, j) => {
    let inputs = 0;
    let negatives = 0;
    for (let i = 0; i < n; i++) {
      const z = t.Z[i * n + j]!;
      inputs += z;
      if (z < 0) negatives++;
    }
    return {
      sector, output: t.x[j]!, inputs, negatives,
      valueAdded: va.reduce((a, x) => a + x.values[j]!, 0),
      imports: t.imports.reduce((a, x) => a + x.values[j]!, 0),
      finalDemand: fd.reduce((a, c) => a + c.values[j]!, 0),
      jobs: t.employment ? t.employment[j]! : null,
    };
  });
  const neg = r.derived.negatives;
  const about = r.reports.find((f) => f.name === 'symmetric-table.about.txt')?.content ?? '';
  const v = r.judged.analysis.viability;
  const finite = (x: number) => (Number.isFinite(x) ? x : null);
  return {
    by: r.derived.flows.by,
    assumption: r.derived.assumption,
    method: r.derived.method,
    formula: r.derived.formula,
    products: r.pair.products.length,
    industries: r.pair.industries.length,
    valuation: r.pair.valuation,
    moneyUnit: t.moneyUnit,
    sectors: t.sectors,
    rows,
    totals: { output: sum(t.x), finalDemandPair: r.pair.finalDemand.reduce((a, c) => a + sum(c.values), 0), finalDemandTable: fd.reduce((a, c) => a + sum(c.values), 0) },
    negatives: { flows: neg.flows, others: neg.others, flowSum: neg.flowSum, flowShare: neg.flowShare, largest: neg.largest.map((c) => ({ ...c })) },
    remedy: r.derived.remedy,
    worstGap: r.pair.balance.gap.reduce((w, g) => Math.max(w, Math.abs(g)), 0),
    tolerance: r.pair.balance.tolerance,
    notes: r.derived.notes,
    warnings: r.warnings.map((w) => formatLocated(w)),
    sources: r.sources.map((o) => ({ ...o })),
    result: {
      name: t.name, n, fileName: r.fileName, csv: r.csv, about,
      hasNegatives: r.importSettings.allowNegative === true,
      perron: finite(v.perronRoot), productive: r.judged.verdict.productive, verdict: r.judged.verdict.say,
    },
  };
}

/** The roles of the pair's labels with the planner's role map: shown and changeable even while the pair is refused. */
export function sutRoles(req: { supply: RegionalFile; use: RegionalFile; map?: SutRoleMap }): SutRoles {
  return supplyUseRolesOf({ supply: asFile(req.supply), use: asFile(req.use), ...(req.map ? { map: req.map } : {}) });
}

/** A role map file (JSON, the CLI's --map), read and checked (a refusal names the line and column of the key). */
export function readSutMap(file: RegionalFile): SutRoleMap {
  return parseSutRoleMap(file.text, file.fileName);
}

export const supplyUseApi = { buildSymmetric, sutRoles, readSutMap };
