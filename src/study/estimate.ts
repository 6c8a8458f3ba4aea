/**
 * A county table estimated from a larger one, in one pipeline for every front end: regionalize with location
 * quotients (SLQ, CILQ or FLQ), optionally balance to known county totals by RAS (non-convergence is refused, with the
 * convergence report, by the RAS step itself), optionally merge sectors by a grouping; then judge the estimate with the
 * same analysis and verdict as any study. The finished table is returned as the CSV the table writer makes, so a front
 * end uses it like any imported file.
 */
import { InputError } from '../diagnostics/index.ts';
import {
  aggregateTable, AGGREGATION_BIAS_NOTE, balanceTable, DEFAULT_FLQ_DELTA, LQ_METHODS, parseEmploymentCsv, parseGroupMapping, parseTotals,
  regionalize, regionalizeTable, type AggregationResult, type EmploymentInput, type GroupMapping, type LqMethod, type RegionalEstimate,
  type RegionalResult, type TableBalanceResult,
} from '../regional/index.ts';
import { aboutText } from '../report/index.ts';
import { sha256Hex, type ImportSettings } from '../project/index.ts';
import { importTable, writeTableCsv, type IOTable } from '../table/index.ts';
import { prepareStudy, type PreparedStudy } from './prepare.ts';
import { studyOfTable } from './study.ts';
import { employmentByBridge, readBridge } from './bridges.ts';

/** One input file as read: its bytes (hashed as they are) and its name. */
export interface EstimateFile {
  bytes: Uint8Array;
  fileName: string;
}

export interface EstimateRequest {
  national: EstimateFile;
  /** How to read the national table: role overrides, delimiter, decimal mark. */
  nationalImport?: ImportSettings;
  employment: EstimateFile;
  method: LqMethod;
  /** FLQ δ; ignored by SLQ and CILQ. */
  delta: number;
  /** Known county intermediate sales (rows) and purchases (columns), `sector,total`: balance the estimate by RAS. */
  balance?: { rows: EstimateFile; columns: EstimateFile } | null;
  /** `code,sector[,share]`: the employment file names codes of another classification (src/classification). */
  bridge?: EstimateFile | null;
  /** `sector,group`: merge the county table's sectors into groups. */
  groups?: EstimateFile | null;
}

export interface CountyEstimate {
  national: IOTable;
  regional: RegionalResult;
  balance: TableBalanceResult | null;
  grouping: AggregationResult | null;
  /** The finished county table (after the optional steps), its CSV, a file name and its sidecar. */
  table: IOTable;
  csv: string;
  fileName: string;
  about: string;
  /** The model line of `about` (method, FLQ δ, optional steps), for reports written beside the table. */
  model: string;
  /** Notes of every step, in order (the aggregation-bias note last when sectors were grouped). */
  notes: string[];
  /** The finished table judged as any study's table: the same analysis and verdict. */
  judged: PreparedStudy;
}

const utf8 = new TextDecoder('utf-8');
const text = (f: EstimateFile) => utf8.decode(f.bytes);

/** A path's last part: a sidecar names the file, not the folder a front end read it from. */
const baseName = (fileName: string) => fileName.replace(/^.*[\\/]/, '');

function slugOf(fileName: string): string {
  const base = baseName(fileName).replace(/\.[^.]*$/, '').replace(/[-_ ]?employment$/i, '');
  return base.toLowerCase().replace(/[^a-z0-9]+/g, '-').replace(/^-|-$/g, '') || 'county';
}

/** The inputs of an estimate, read once, so the same pipeline can run again at another FLQ δ (sensitivity, draws). */
export interface EstimateInputs {
  national: IOTable;
  employment: EmploymentInput;
  method: LqMethod;
  balance: { sales: Float64Array; purchases: Float64Array; fileName: string } | null;
  groups: GroupMapping | null;
  /** The bridge the employment file was read through, if any (its codes are already sectors here). */
  bridgeFile: string | null;
}

interface Steps {
  regional: RegionalEstimate;
  balance: TableBalanceResult | null;
  grouping: AggregationResult | null;
  table: IOTable;
  notes: string[];
}

export function readEstimateInputs(req: EstimateRequest): EstimateInputs {
  if (!(LQ_METHODS as readonly string[]).includes(req.method)) throw new InputError('usage', `the method must be SLQ, CILQ or FLQ (got '${String(req.method)}')`);
  const national = importTable(text(req.national), { fileName: req.national.fileName, ...req.nationalImport });
  const byCode = parseEmploymentCsv(text(req.employment), req.employment.fileName);
  // With a bridge the employment file names codes of another classification: jobs by code → jobs by sector.
  const employment = req.bridge ? employmentByBridge(byCode, readBridge(req.bridge, national.sectors), national.sectors) : byCode;
  const balance = req.balance ? {
    sales: parseTotals(text(req.balance.rows), req.balance.rows.fileName, national.sectors, 'sector'),
    purchases: parseTotals(text(req.balance.columns), req.balance.columns.fileName, national.sectors, 'sector'),
    fileName: req.balance.rows.fileName,
  } : null;
  const groups = req.groups ? parseGroupMapping(text(req.groups), req.groups.fileName) : null;
  return { national, employment, method: req.method, balance, groups, bridgeFile: req.bridge?.fileName ?? null };
}

/** Regionalize (compared with the source when `compare`), then the optional RAS and grouping. */
function stepsAt(inputs: EstimateInputs, delta: number, compare: boolean): Steps {
  const opts = { method: inputs.method, delta: inputs.method === 'flq' ? delta : DEFAULT_FLQ_DELTA };
  const regional = compare ? regionalize(inputs.national, inputs.employment, opts) : regionalizeTable(inputs.national, inputs.employment, opts);
  let table = regional.table;
  const notes = [...regional.notes];
  if (inputs.bridgeFile) notes.unshift(`County employment by code of another classification, mapped to the table's sectors through the bridge ${inputs.bridgeFile} (a code's jobs split by its shares).`);
  let balance: TableBalanceResult | null = null;
  if (inputs.balance) {
    balance = balanceTable(table, inputs.balance);
    table = { ...balance.table, name: `${regional.table.name}, balanced by RAS` };
    notes.push(...balance.notes);
  }
  let grouping: AggregationResult | null = null;
  if (inputs.groups) {
    grouping = aggregateTable(table, inputs.groups);
    table = grouping.table;
    notes.push(...grouping.notes.filter((x) => x !== AGGREGATION_BIAS_NOTE), AGGREGATION_BIAS_NOTE);
  }
  return { regional, balance, grouping, table, notes };
}

/**
 * The finished county table of the same estimate at FLQ δ = `delta` (the same steps as estimateCountyTable, without
 * the comparison with the source and the verdict): what FLQ δ sensitivity and draws recompute from.
 */
export function countyTableAt(inputs: EstimateInputs, delta: number): IOTable {
  return stepsAt(inputs, delta, false).table;
}

export function estimateCountyTable(req: EstimateRequest, date = new Date().toISOString()): CountyEstimate {
  const inputs = readEstimateInputs(req);
  const delta = req.method === 'flq' ? req.delta : DEFAULT_FLQ_DELTA;
  const done = stepsAt(inputs, delta, true);
  const regional = done.regional as RegionalResult;
  const { balance, grouping, table, notes } = done;
  const csv = writeTableCsv(table);
  const steps = `${req.method}${req.balance ? '-ras' : ''}${req.groups ? '-grouped' : ''}`;
  const judged = prepareStudy(studyOfTable(table), { spectrum: false });
  const warnings = [...regional.warnings, ...(balance?.warnings ?? [])].map((w) => w.message);
  const model = `county table estimated from a larger one (${req.method.toUpperCase()} location quotients${req.method === 'flq' ? `, δ = ${delta}` : ''}${req.balance ? ', balanced by RAS' : ''}${req.groups ? ', sectors grouped' : ''})`;
  const about = aboutText({
    title: 'County input–output table estimated from a larger table',
    tableName: table.name,
    sourceFile: baseName(req.national.fileName),
    sourceHash: sha256Hex(req.national.bytes),
    modelType: model,
    date,
    moneyUnit: table.moneyUnit,
    notes: [...notes, ...warnings, `Verdict on the estimate: ${judged.verdict.say}`],
  });
  return { national: inputs.national, regional, balance, grouping, table, csv, fileName: `${slugOf(req.employment.fileName)}-${steps}-estimate.csv`, about, model, notes, judged };
}

/** Where a study's table came from, when the user says it is an FLQ estimate: the estimate's inputs and its δ. */
export interface FlqOrigin {
  inputs: EstimateInputs;
  delta: number;
  /** The county table at another δ (the same steps as the estimate). */
  tableAt: (delta: number) => IOTable;
}

/** Relative difference allowed between the table and its re-estimate (the table writer round-trips doubles exactly). */
const SAME_TABLE_TOLERANCE = 1e-9;

/**
 * A study's table does not record how it was made, so FLQ δ sensitivity and draws need the estimate's inputs from the
 * user (the national table, county employment, the δ used) and re-run the estimate from them: the result must be the
 * study's table, sector for sector and flow for flow, or it is refused — δ is never varied on a table it did not make.
 * Only the plain FLQ estimate is re-run (no RAS balancing, no grouping).
 */
export function flqOriginOf(table: IOTable, national: EstimateFile, employment: EstimateFile, delta: number, nationalImport?: ImportSettings): FlqOrigin {
  const inputs = readEstimateInputs({ national, employment, method: 'flq', delta, ...(nationalImport ? { nationalImport } : {}) });
  const again = countyTableAt(inputs, delta);
  const mismatch = (why: string, at: { rowLabel?: string; columnLabel?: string } = {}) => new InputError('flq-origin-mismatch', `the table is not the FLQ estimate (δ = ${delta}) of ${national.fileName} with the county employment in ${employment.fileName}: ${why}; FLQ δ can only be varied on the estimate itself`, at);
  if (again.n !== table.n || again.sectors.some((s, i) => s !== table.sectors[i])) throw mismatch(`its sectors differ (${table.n} here, ${again.n} in the estimate)`);
  const n = table.n;
  const close = (a: number, b: number) => Math.abs(a - b) <= SAME_TABLE_TOLERANCE * Math.max(Math.abs(a), Math.abs(b), 1e-300);
  for (let j = 0; j < n; j++) if (!close(again.x[j]!, table.x[j]!)) throw mismatch('a total output differs', { columnLabel: table.sectors[j]! });
  for (let k = 0; k < n * n; k++) {
    if (!close(again.Z[k]!, table.Z[k]!)) throw mismatch('a flow differs', { rowLabel: table.sectors[Math.floor(k / n)]!, columnLabel: table.sectors[k % n]! });
  }
  return { inputs, delta, tableAt: (d) => countyTableAt(inputs, d) };
}
