/**
 * `roundwise regionalize NATIONAL.csv --employment EMP.csv --method slq|cilq|flq [--delta 0.3] [--map MAP.json] [--json] [--out DIR]`
 * Estimates a county table from a national one with location quotients (src/regional).
 */
import { InputError } from '../../diagnostics/index.ts';
import { CAUTIONS, aboutText, reportFiles, type ReportMeta, type ReportFile } from '../../report/index.ts';
import { importTable, writeTableCsv } from '../../table/index.ts';
import { LQ_METHODS, parseEmploymentCsv, regionalize, type LqMethod, type RegionalResult } from '../../regional/index.ts';
import type { CliIO } from '../io.ts';
import { num, numberOption, parseCommandArgs, readInput, readRoleMap, requireOne, requireOption, sha256, textTable, writeAll } from './regional-shared.ts';

export const USAGE = 'roundwise regionalize NATIONAL.csv --employment EMP.csv --method slq|cilq|flq [--delta 0.3] [--map MAP.json] [--json] [--out DIR]';

const HELP = `${USAGE}

Estimates a county input-output table from a national (or state) table and county employment by sector.
  NATIONAL.csv        the larger table, in any layout roundwise analyze reads
  --employment EMP    CSV sector,regional,national: jobs in the county and the nation (labels as in the table);
                      the national column may be left out when the table has an Employment row
  --method M          slq (simple), cilq (cross-industry) or flq (Flegg) location quotients
  --delta D           FLQ exponent, 0 to 1 (default 0.3; Flegg & Tohmo 2013 report 0.25-0.35 fitting survey tables)
  --map MAP.json      role overrides for the national table's rows and columns
  --json              print the result as one JSON object (sectors, slq, lambda, coefficients, absent, ...)
  --out DIR           write regional-table.csv (reads back with roundwise analyze), location-quotients.csv,
                      regional-coefficients.csv, each with an .about.txt of notes and cautions
`;

export function regionalJson(res: RegionalResult) {
  const n = res.sectors.length;
  return {
    sectors: res.sectors,
    method: res.method,
    delta: res.delta,
    lambda: res.lambda,
    slq: Array.from(res.slq),
    coefficients: Array.from({ length: n }, (_, i) => Array.from(res.coefficients.subarray(i * n, (i + 1) * n))),
    absent: res.absent,
    regionalJobs: Array.from(res.regionalJobs),
    nationalJobs: Array.from(res.nationalJobs),
    output: Array.from(res.output),
    importLeakage: Array.from(res.leakage),
    importLeakageValue: Array.from(res.leakageValue),
    moneyUnit: res.table.moneyUnit,
    notes: res.notes,
    warnings: res.warnings,
    cautions: CAUTIONS,
  };
}

function outputFiles(res: RegionalResult, meta: Omit<ReportMeta, 'title'>): ReportFile[] {
  const n = res.sectors.length;
  const unit = res.table.moneyUnit || 'money';
  const notes = [...res.notes, ...res.warnings.map((w) => w.message)];
  const tableAbout = { name: 'regional-table.about.txt', content: aboutText({ ...meta, title: 'Regional input-output table (estimated)', notes }) };
  const lq = reportFiles('location-quotients', { ...meta, title: 'Location quotients and import leakage by sector', notes }, [
    ['Sector', 'County jobs', 'National jobs', 'SLQ', 'Absent', `County output (${unit})`, 'Import leakage per unit of output', `Import leakage (${unit})`],
    ...res.sectors.map((s, i) => [s, res.regionalJobs[i]!, res.nationalJobs[i]!, res.slq[i]!, res.absent.includes(s) ? 'yes' : 'no', res.output[i]!, res.leakage[i]!, res.leakageValue[i]!]),
  ]);
  const coef = reportFiles('regional-coefficients', { ...meta, title: `Regional technical coefficients r_ij (${res.method.toUpperCase()})`, notes }, [
    ['Selling sector \\ buying sector', ...res.sectors],
    ...res.sectors.map((s, i) => [s, ...Array.from(res.coefficients.subarray(i * n, (i + 1) * n))]),
  ]);
  return [{ name: 'regional-table.csv', content: writeTableCsv(res.table) }, tableAbout, ...lq, ...coef];
}

function summary(res: RegionalResult): string {
  const unit = res.table.moneyUnit || 'money';
  const lines = [
    `County table estimated with ${res.method.toUpperCase()}${res.lambda !== null ? ` (δ = ${res.delta}, λ* = ${num(res.lambda)})` : ''}.`,
    '',
    textTable(
      ['Sector', 'County jobs', 'SLQ', `Output (${unit})`, 'Leakage/unit'],
      res.sectors.map((s, i) => [s, String(res.regionalJobs[i]), num(res.slq[i]!, 4), num(res.output[i]!), num(res.leakage[i]!, 4)]),
    ),
    '',
    res.absent.length ? `Absent sectors (no county jobs; supply nothing locally): ${res.absent.join('; ')}` : 'No absent sectors.',
    ...res.warnings.map((w) => `warning: ${w.location?.rowLabel ? `'${w.location.rowLabel}': ` : ''}${w.message}`),
    '',
    'Cautions:',
    ...CAUTIONS.map((c) => `- ${c}`),
    '',
  ];
  return lines.join('\n');
}

export async function run(args: string[], io: CliIO): Promise<number> {
  const { values, positionals } = parseCommandArgs(args, {
    employment: { type: 'string' },
    method: { type: 'string' },
    delta: { type: 'string' },
    map: { type: 'string' },
    json: { type: 'boolean' },
    out: { type: 'string' },
    help: { type: 'boolean', short: 'h' },
  }, USAGE);
  if (values.help) {
    io.stdout(HELP);
    return 0;
  }
  const nationalPath = requireOne(positionals, 'national table', USAGE);
  const empPath = requireOption(values.employment, 'employment', USAGE);
  const method = requireOption(values.method, 'method', USAGE);
  if (!(LQ_METHODS as readonly string[]).includes(method)) throw new InputError('usage', `--method must be slq, cilq or flq (got '${method}')`);
  const delta = numberOption(values.delta, 'delta');
  if (delta !== undefined && method !== 'flq') throw new InputError('usage', '--delta applies to --method flq only');

  const roles = readRoleMap(values.map);
  const text = readInput(nationalPath);
  const national = importTable(text, { fileName: nationalPath, ...(roles ? { roles } : {}) });
  const emp = parseEmploymentCsv(readInput(empPath), empPath);
  const res = regionalize(national, emp, { method: method as LqMethod, ...(delta !== undefined ? { delta } : {}) });

  let files: string[] | undefined;
  if (values.out) {
    const meta = {
      tableName: res.table.name,
      sourceFile: nationalPath,
      sourceHash: sha256(text),
      modelType: `regional table estimated from a national one (${method.toUpperCase()} location quotients)`,
      date: new Date().toISOString(),
      moneyUnit: res.table.moneyUnit,
    };
    files = writeAll(values.out, outputFiles(res, meta));
  }
  if (values.json) io.stdout(`${JSON.stringify({ ...regionalJson(res), ...(files ? { files } : {}) })}\n`);
  else io.stdout(summary(res) + (files ? `Wrote ${files.join(', ')}\n` : ''));
  return 0;
}
