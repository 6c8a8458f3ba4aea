/**
 * `roundwise regionalize NATIONAL.csv --employment EMP.csv --method slq|cilq|flq`: estimates a county table from a
 * national one with location quotients (src/regional).
 */
import {
  CAUTIONS, estimateCountyTable, type CountyEstimate, reportFiles, LQ_METHODS, type LqMethod, type RegionalResult, type ReportMeta, type ReportFile, type Verdict, DEFAULT_FLQ_DELTA,
} from '../../study/index.ts';
import { TABLE_DIALECT_OPTIONS, tableDialect } from './table-dialect.ts';
import { defineCommand } from '../command.ts';
import { num, textTable } from '../terminal.ts';

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
    comparison: res.comparison,
    notes: res.notes,
    warnings: res.warnings,
    cautions: CAUTIONS,
  };
}

// The table's sidecar is the study layer's (CountyEstimate.about), the same text the app exports with the table; the
// CLI keeps only its documented file names.
function outputFiles(est: CountyEstimate, meta: Omit<ReportMeta, 'title'>): ReportFile[] {
  const res = est.regional;
  const n = res.sectors.length;
  const unit = res.table.moneyUnit || 'money';
  const notes = [...res.notes, ...res.warnings.map((w) => w.message)];
  const tableAbout = { name: 'regional-table.about.txt', content: est.about };
  const lq = reportFiles('location-quotients', { ...meta, title: 'Location quotients and import leakage by sector', notes }, [
    ['Sector', 'County jobs', 'National jobs', 'SLQ', 'Absent', `County output (${unit})`, 'Import leakage per unit of output', `Import leakage (${unit})`],
    ...res.sectors.map((s, i) => [s, res.regionalJobs[i]!, res.nationalJobs[i]!, res.slq[i]!, res.absent.includes(s) ? 'yes' : 'no', res.output[i]!, res.leakage[i]!, res.leakageValue[i]!]),
  ]);
  const coef = reportFiles('regional-coefficients', { ...meta, title: `Regional technical coefficients r_ij (${res.method.toUpperCase()})`, notes }, [
    ['Selling sector \\ buying sector', ...res.sectors],
    ...res.sectors.map((s, i) => [s, ...Array.from(res.coefficients.subarray(i * n, (i + 1) * n))]),
  ]);
  return [{ name: 'regional-table.csv', content: est.csv }, tableAbout, ...lq, ...coef];
}

function summary(res: RegionalResult, verdict: Verdict): string {
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
    res.comparison.note,
    `Verdict on the estimate: ${verdict.say}`,
    ...res.warnings.map((w) => `warning: ${w.location?.rowLabel ? `'${w.location.rowLabel}': ` : ''}${w.message}`),
    '',
    'Cautions:',
    ...CAUTIONS.map((c) => `- ${c}`),
    '',
  ];
  return lines.join('\n');
}

export const regionalize = defineCommand({
  name: 'regionalize',
  summary: 'estimate a county input-output table from a national (or state) one and county employment by sector, with location quotients',
  positional: { name: 'NATIONAL.csv', help: 'the larger table, in any layout roundwise analyze reads' },
  options: {
    employment: { type: 'string', value: 'EMP.csv', required: true, help: 'CSV sector,regional,national: jobs in the county and the nation (labels as in the table); national may be left out when the table has an Employment row' },
    method: { type: 'string', value: 'M', required: true, choices: LQ_METHODS, help: 'slq (simple), cilq (cross-industry) or flq (Flegg) location quotients' },
    delta: { type: 'number', value: 'D', help: 'FLQ exponent δ, 0 to 1 (default 0.3; Flegg & Tohmo 2013 report 0.25–0.35 fitting survey tables)', check: (d) => (d >= 0 && d <= 1 ? null : 'must lie between 0 and 1') },
    bridge: { type: 'string', value: 'BRIDGE.csv', help: 'code,sector[,share]: the employment file names codes of another classification, mapped to the table\'s sectors (shares split a code)' },
    map: { type: 'string', value: 'MAP.json', help: 'role overrides for the national table\'s rows and columns' },
    ...TABLE_DIALECT_OPTIONS,
  },
  outHelp: 'write regional-table.csv (reads back with roundwise analyze), location-quotients.csv and regional-coefficients.csv, each with an .about.txt of notes and cautions',
  async run({ input, values }, ctx) {
    const method = values.method as LqMethod;
    if (values.delta !== undefined && method !== 'flq') throw ctx.usageError('--delta applies to --method flq only');
    const roles = ctx.roleMap(values.map);
    const file = ctx.input(input);
    const est = estimateCountyTable({
      national: { bytes: file.bytes, fileName: input },
      nationalImport: { ...tableDialect(values), ...(roles ? { roles } : {}) },
      employment: { bytes: ctx.input(values.employment).bytes, fileName: values.employment },
      method,
      delta: values.delta ?? DEFAULT_FLQ_DELTA,
      ...(values.bridge !== undefined ? { bridge: { bytes: ctx.input(values.bridge).bytes, fileName: values.bridge } } : {}),
    }, ctx.date);
    const res = est.regional;
    const verdict = est.judged.verdict;
    const meta = {
      tableName: res.table.name,
      sourceFile: file.name,
      sourceHash: file.sha256,
      modelType: est.model,
      date: ctx.date,
      moneyUnit: res.table.moneyUnit,
    };
    return {
      summary: () => summary(res, verdict),
      json: () => ({ ...regionalJson(res), verdict }),
      reports: outputFiles(est, meta),
    };
  },
});
