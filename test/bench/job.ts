/**
 * The whole job on invented tables, in process and single-threaded (as in the app's engine worker): import of the
 * CSV the table writer produces, preparation (coefficients, factorisation, household bordering), the full analysis
 * (analyzeTable with its defaults: viability, multipliers, linkages, Type I and II, checks), one scenario after
 * factorisation.
 */
import { importTable } from '../../src/table/index.ts';
import { writeTableCsv } from '../../src/table/index.ts';
import { prepareModel } from '../../src/model/index.ts';
import { analyzeTable } from '../../src/model/index.ts';
import { runScenario } from '../support/scenario.ts';
import type { Scenario } from '../../src/scenario/index.ts';
import type { IOTable } from '../../src/table/index.ts';
import { inventedTable } from './table.ts';
import { time, type Timing } from './timing.ts';

export interface JobRow {
  n: number;
  csvMB: number;
  importMs: Timing;
  prepareMs: Timing;
  analysisMs: Timing;
  scenarioMs: Timing;
}

/** A new plant's first-year sales to final demand in one sector (invented amount). */
function plantScenario(t: IOTable): Scenario {
  return { name: 'new plant (invented)', phases: [{ name: 'Operating', timing: 'annual', lines: [{ sector: t.sectors[0]!, amount: 25_000, kind: 'final-demand', localShare: 1 }] }] };
}

export function jobCsv(n: number): string {
  return writeTableCsv(inventedTable(n));
}

export function benchJob(n: number, runs: number, csv: string): JobRow {
  const fileName = `invented-${n}.csv`;
  let table: IOTable | null = null;
  const importMs = time(() => { table = importTable(csv, { fileName }); }, runs);
  const t = table as unknown as IOTable;
  const prepareMs = time(() => prepareModel(t), Math.max(1, Math.ceil(runs / 2)));
  const analysisMs = time(() => analyzeTable(t), Math.max(1, Math.ceil(runs / 2)));
  const pm = prepareModel(t);
  const scenario = plantScenario(t);
  const scenarioMs = time(() => runScenario(pm, scenario), Math.max(5, runs));
  return { n, csvMB: csv.length / 2 ** 20, importMs, prepareMs, analysisMs, scenarioMs };
}
