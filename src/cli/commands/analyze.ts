/**
 * `roundwise analyze TABLE.csv [--map MAP.json] [--json] [--out DIR] [--allow-negative] [--tolerance T]`:
 * import a table, run the whole analysis (coefficients, viability, multipliers, linkages) and print a summary,
 * print one JSON object (--json), and/or write CSV reports with their sidecar notes into DIR (--out).
 */
import { parseArgs } from 'node:util';
import { basename, join } from 'node:path';
import { formatLocated } from '../../diagnostics/index.ts';
import { parseRoleMap } from '../../table/index.ts';
import { MEASURES, measureValues, prepareStudy, studyAnalysisJson, studyFromTableFile, tableReportSet, type PreparedStudy } from '../../study/index.ts';
import { readInputFile, writeFileAtomic, type CliIO } from '../io.ts';
import { parallelKernelsReady, startParallelKernels, stopParallelKernels } from '../parallel.ts';

/** From this many sectors the factorisation's updates are shared with helper threads (one per extra core). */
const PARALLEL_MIN_SECTORS = 500;

const USAGE = 'usage: roundwise analyze TABLE.csv [--map MAP.json] [--json] [--out DIR] [--allow-negative] [--tolerance T]';

function fmt(x: number | null, digits = 4): string {
  return x === null ? '—' : x.toFixed(digits);
}

/** The measures the terminal summary shows, headed by the engine's own names (two lines: quantity, then form). */
const SUMMARY_MEASURES = ['output.typeI', 'output.typeII', 'income.typeI', 'income.typeII', 'employment.typeI', 'employment.typeII', 'linkage.backward', 'linkage.forward'] as const;

/** "labour income Type II" → ["labour income", "Type II"]; "backward linkage" → ["linkage", "backward"]. */
function twoLines(label: string): [string, string] {
  const m = /^(.*) (Type I+|simple|total)$/.exec(label);
  if (m) return [m[1]!, m[2]!];
  const [form = '', quantity = ''] = label.split(' ');
  return [quantity, form];
}

/** A short human summary: the verdict in words, then the multipliers table. */
export function summary(ps: PreparedStudy): string {
  const an = ps.analysis;
  const v = an.viability;
  const lines = [
    `${an.tableName}: ${an.n} sectors, money unit ${an.moneyUnit || '(not stated)'}`,
    ps.verdict.say,
    ...ps.verdict.detail.map((d) => `  ${d}`),
    `structure: ${v.irreducible ? `irreducible, ${v.primitive ? 'primitive' : `period ${v.period}`}` : `reducible, ${v.blocks.length} blocks`}; rounds until less than ${v.tolerance} of any demand is left: ${v.roundsToTolerance ?? 'not certified'}`,
    '',
  ];
  const measures = SUMMARY_MEASURES.map((k) => MEASURES.find((m) => m.key === k)!);
  const width = Math.min(28, Math.max(6, ...an.sectors.map((s) => s.length)));
  const pad = (s: string, w: number) => (s.length > w ? s.slice(0, w - 1) + '…' : s.padEnd(w));
  const heads = measures.map((m) => twoLines(m.label));
  const colWidth = Math.max(10, ...heads.flat().map((h) => h.length));
  lines.push([pad('', width), ...heads.map((h) => h[0]!.padStart(colWidth))].join(' '));
  lines.push([pad('sector', width), ...heads.map((h) => h[1]!.padStart(colWidth))].join(' '));
  const cols = measures.map((m) => measureValues(an, m.key));
  for (let j = 0; j < an.n; j++) {
    lines.push([pad(an.sectors[j]!, width), ...cols.map((c) => fmt(c[j] ?? null).padStart(colWidth))].join(' '));
  }
  if (an.linkages.keySectors.length) lines.push('', `key sectors: ${an.linkages.keySectors.map((i) => an.sectors[i]).join(', ')}`);
  return lines.join('\n') + '\n';
}

export async function run(args: string[], io: CliIO): Promise<number> {
  let parsed;
  try {
    parsed = parseArgs({
      args,
      allowPositionals: true,
      options: {
        map: { type: 'string' },
        json: { type: 'boolean', default: false },
        out: { type: 'string' },
        'allow-negative': { type: 'boolean', default: false },
        tolerance: { type: 'string' },
        help: { type: 'boolean', short: 'h', default: false },
      },
    });
  } catch (e) {
    io.stderr(`roundwise analyze: ${(e as Error).message.split('\n')[0]}\n${USAGE}\n`);
    return 1;
  }
  const { values, positionals } = parsed;
  if (values.help) {
    io.stdout(`${USAGE}\n`);
    return 0;
  }
  if (positionals.length !== 1) {
    io.stderr(`roundwise analyze: ${positionals.length === 0 ? 'no table file given' : 'give exactly one table file'}\n${USAGE}\n`);
    return 1;
  }
  let tolerance: number | undefined;
  if (values.tolerance !== undefined) {
    tolerance = Number(values.tolerance);
    if (!(tolerance > 0 && tolerance < 1)) {
      io.stderr(`roundwise analyze: --tolerance must be a number between 0 and 1, got '${values.tolerance}'\n`);
      return 1;
    }
  }
  const path = positionals[0]!;
  const roles = values.map !== undefined ? parseRoleMap(readInputFile(values.map).toString('utf8'), basename(values.map)) : undefined;
  const study = studyFromTableFile(readInputFile(path), basename(path), { allowNegative: values['allow-negative'], ...(roles ? { roles } : {}) });
  if (tolerance !== undefined) study.settings.rounds.tolerance = tolerance;
  const threaded = study.table.n >= PARALLEL_MIN_SECTORS && startParallelKernels() > 0;
  let ps: PreparedStudy;
  try {
    if (threaded) await parallelKernelsReady(2000);
    ps = prepareStudy(study, { inverse: values.out !== undefined });
  } finally {
    if (threaded) await stopParallelKernels();
  }

  for (const w of ps.analysis.warnings) io.stderr(`roundwise analyze: warning: ${formatLocated(w)}\n`);
  if (values.json) io.stdout(JSON.stringify(studyAnalysisJson(ps)) + '\n');
  else if (values.out === undefined) io.stdout(summary(ps));
  if (values.out !== undefined) {
    const files = tableReportSet(ps, new Date().toISOString(), { inverse: true });
    for (const f of files) writeFileAtomic(join(values.out, f.name), f.content);
    if (!values.json) io.stdout(`wrote ${files.length} files to ${values.out}\n`);
  }
  return 0;
}
