/**
 * A symmetric table derived from a supply and use pair, in one pipeline for every front end: read the pair (src/sut,
 * the importer's dialect and refusals), transform it by the chosen assumption (Eurostat, Manual of Supply, Use and
 * Input-Output Tables, 2008, ch. 11; Miller & Blair 2009, ch. 5), write it as the labelled-matrix CSV every command
 * reads, judge it with the same analysis and verdict as any study. The CSV is the table's source: a study started from
 * a pair keeps it as its source bytes, so projects, the county estimate and exports treat it as an imported file.
 */
import { InputError, type Warning } from '../diagnostics/index.ts';
import { sha256Hex, utf8Bytes, type ImportSettings, type ProjectSourceOrigin } from '../project/index.ts';
import { aboutText, type Cell, type ReportFile, reportFiles } from '../report/index.ts';
import {
  ASSUMPTION_BY, DEFAULT_ASSUMPTION, deriveSymmetric, readSupplyUse, supplyUseRoles,
  type Assumption, type SutRoles, type DerivedTable, type NegativesRemedy, type SupplyUse, type SutRoleMap, type TableBy,
} from '../sut/index.ts';
import { writeTableCsv, type DecimalMark, type Delimiter, type IOTable } from '../table/index.ts';
import type { EstimateFile } from './estimate.ts';
import { prepareStudy, type PreparedStudy } from './prepare.ts';
import { studyFromTableFile, type Study } from './study.ts';
import { sourceOriginsOf } from './source.ts';

export interface SupplyUseRequest {
  supply: EstimateFile;
  use: EstimateFile;
  /** Industry by industry (default) or product by product. */
  by?: TableBy;
  /** The transformation; default the one without negatives for `by` (DEFAULT_ASSUMPTION). */
  assumption?: Assumption;
  /** Negatives of the product technology or the fixed industry sales structure: kept (default) or zeroed and RAS. */
  negatives?: NegativesRemedy;
  map?: SutRoleMap;
  delimiter?: Delimiter;
  decimalMark?: DecimalMark;
  /** Relative tolerance of supply against use, product by product (default SUT_DEFAULT_TOLERANCE). */
  tolerance?: number;
  allowNegative?: boolean;
}

export interface SymmetricFromSupplyUse {
  pair: SupplyUse;
  derived: DerivedTable;
  table: IOTable;
  /** The table as the labelled-matrix CSV (`writeTableCsv`), its file name, and how to import it again. */
  csv: string;
  fileName: string;
  importSettings: ImportSettings;
  /** The pair's files with their SHA-256 (also the study's `source.derivedFrom`). */
  sources: ProjectSourceOrigin[];
  /** Notes of the transformation (what was assumed, where each part came from, negatives) and the pair's warnings. */
  notes: string[];
  warnings: Warning[];
  /** symmetric-table.csv with its .about.txt, and transformation.csv (by sector: output, inputs, value added, final demand, jobs, negatives) with its .about.txt. */
  reports: ReportFile[];
  /** The derived table judged as any study's table. */
  judged: PreparedStudy;
}

export const SYMMETRIC_TABLE_FILE = 'symmetric-table.csv';

/**
 * The assumption a request asks for: the explicit one (which must give the table `by` asks for), or the default of
 * `by` (industry by industry: the fixed product sales structure).
 */
export function assumptionOf(by: TableBy | undefined, assumption: Assumption | undefined): Assumption {
  if (assumption === undefined) return DEFAULT_ASSUMPTION[by ?? 'industry'];
  if (by !== undefined && ASSUMPTION_BY[assumption] !== by) {
    const fits = (Object.keys(ASSUMPTION_BY) as Assumption[]).filter((a) => ASSUMPTION_BY[a] === by);
    throw new InputError('sut-assumption', `the ${assumption} assumption gives a ${ASSUMPTION_BY[assumption]}-by-${ASSUMPTION_BY[assumption]} table, not ${by} by ${by}; for ${by} by ${by} use ${fits.join(' or ')}`);
  }
  return assumption;
}

const utf8 = new TextDecoder('utf-8');
const sum = (v: ArrayLike<number>): number => { let s = 0; for (let i = 0; i < v.length; i++) s += v[i]!; return s; };

function transformationRows(d: DerivedTable): Cell[][] {
  const t = d.table;
  const n = t.n;
  const unit = t.moneyUnit || 'money';
  const fd = [...t.householdConsumption, ...t.otherFinalDemand];
  const money = [...t.labourIncome, ...t.otherValueAdded];
  return [
    [d.flows.by === 'product' ? 'Product' : 'Industry', `Total output (${unit})`, `Intermediate inputs (${unit})`, `Value added (${unit})`, `Imports (${unit})`, `Final demand (${unit})`, 'Jobs', 'Negative intermediate flows in column'],
    ...t.sectors.map((s, j): Cell[] => {
      let inputs = 0;
      let negatives = 0;
      for (let i = 0; i < n; i++) {
        const v = t.Z[i * n + j]!;
        inputs += v;
        if (v < 0) negatives++;
      }
      return [
        s, t.x[j]!, inputs, money.reduce((a, r) => a + r.values[j]!, 0), t.imports.reduce((a, r) => a + r.values[j]!, 0),
        fd.reduce((a, c) => a + c.values[j]!, 0), t.employment ? t.employment[j]! : null, negatives,
      ];
    }),
  ];
}

/** Supply and use → a symmetric table with its notes, reports and verdict. */
export function symmetricFromSupplyUse(req: SupplyUseRequest, date = new Date().toISOString()): SymmetricFromSupplyUse {
  const assumption = assumptionOf(req.by, req.assumption);
  const pair = readSupplyUse(
    { text: utf8.decode(req.supply.bytes), fileName: req.supply.fileName },
    { text: utf8.decode(req.use.bytes), fileName: req.use.fileName },
    {
      ...(req.map ? { map: req.map } : {}),
      ...(req.delimiter ? { delimiter: req.delimiter } : {}),
      ...(req.decimalMark ? { decimalMark: req.decimalMark } : {}),
      ...(req.tolerance !== undefined ? { tolerance: req.tolerance } : {}),
      ...(req.allowNegative ? { allowNegative: true } : {}),
    },
  );
  const derived = deriveSymmetric(pair, { assumption, ...(req.negatives ? { negatives: req.negatives } : {}) });
  const table = derived.table;
  const csv = writeTableCsv(table);
  const hasNegative = Array.from(table.Z).some((v) => v < 0) || [...table.labourIncome, ...table.otherValueAdded, ...table.imports, ...table.householdConsumption, ...table.otherFinalDemand].some((r) => r.values.some((v) => v < 0));
  const importSettings: ImportSettings = hasNegative ? { allowNegative: true } : {};
  const warnings = derived.warnings;
  // The pair's files with their SHA-256 travel with the table: reports, the brief, projects and the app name them.
  const sources: ProjectSourceOrigin[] = [
    { role: 'supply', fileName: req.supply.fileName, sha256: sha256Hex(req.supply.bytes) },
    { role: 'use', fileName: req.use.fileName, sha256: sha256Hex(req.use.bytes) },
  ];
  const study = studyFromTableFile(utf8Bytes(csv), SYMMETRIC_TABLE_FILE, importSettings);
  study.source = { ...study.source!, derivedFrom: sources };
  const judged = prepareStudy(study, { spectrum: false });
  const notes = [...derived.notes, ...warnings.map((w) => w.message)];
  const meta = {
    tableName: table.name,
    sourceFile: `${req.supply.fileName} (supply), ${req.use.fileName} (use)`,
    modelType: derived.method,
    date,
    moneyUnit: table.moneyUnit,
    sourceOrigins: sourceOriginsOf(study),
  };
  const reports: ReportFile[] = [
    { name: SYMMETRIC_TABLE_FILE, content: csv },
    { name: SYMMETRIC_TABLE_FILE.replace(/\.csv$/, '.about.txt'), content: aboutText({ ...meta, title: `Symmetric input–output table derived from supply and use tables (${ASSUMPTION_BY[assumption]} by ${ASSUMPTION_BY[assumption]})`, notes: [...notes, `Verdict on the derived table: ${judged.verdict.say}`] }) },
    ...reportFiles('transformation', { ...meta, title: `Transformation of the supply and use tables: ${derived.method}`, notes }, transformationRows(derived)),
  ];
  return { pair, derived, table, csv, fileName: SYMMETRIC_TABLE_FILE, importSettings, sources, notes, warnings, reports, judged };
}

/** The roles of the pair's labels with the request's role map (the app's role preview; shown even while the pair is refused). */
export function supplyUseRolesOf(req: Pick<SupplyUseRequest, 'supply' | 'use' | 'map' | 'delimiter' | 'decimalMark'>): SutRoles {
  return supplyUseRoles(
    { text: utf8.decode(req.supply.bytes), fileName: req.supply.fileName },
    { text: utf8.decode(req.use.bytes), fileName: req.use.fileName },
    { ...(req.map ? { map: req.map } : {}), ...(req.delimiter ? { delimiter: req.delimiter } : {}), ...(req.decimalMark ? { decimalMark: req.decimalMark } : {}) },
  );
}

/** A study that starts from a supply and use pair: its source is the derived table's CSV. */
export function studyFromSupplyUse(req: SupplyUseRequest, date?: string): { study: Study; derived: SymmetricFromSupplyUse } {
  const derived = symmetricFromSupplyUse(req, date);
  return { study: derived.judged.study, derived };
}

/** Totals the derivation keeps (for summaries): total output, final demand before and after, jobs. */
export function supplyUseTotals(r: SymmetricFromSupplyUse): { output: number; finalDemandPair: number; finalDemandTable: number; jobs: number | null } {
  const t = r.table;
  return {
    output: sum(t.x),
    finalDemandPair: r.pair.finalDemand.reduce((a, c) => a + sum(c.values), 0),
    finalDemandTable: [...t.householdConsumption, ...t.otherFinalDemand].reduce((a, c) => a + sum(c.values), 0),
    jobs: t.employment ? sum(t.employment) : null,
  };
}
