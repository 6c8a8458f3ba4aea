/**
 * `roundwise analyze TABLE.csv [--map MAP.json] [--json] [--out DIR] [--allow-negative] [--tolerance T]`:
 * import a table, run the whole analysis (coefficients, viability, multipliers, linkages) and print a summary,
 * print one JSON object (--json), and/or write CSV reports with their sidecar notes into DIR (--out).
 */
import { parseArgs } from 'node:util';
import { createHash } from 'node:crypto';
import { basename, join } from 'node:path';
import { formatLocated } from '../../diagnostics/index.ts';
import { importTable, parseRoleMap } from '../../table/index.ts';
import { analyzeTable, type Analysis } from '../../model/index.ts';
import { analysisJson, analysisReports } from '../../report/index.ts';
import { readInputFile, writeFileAtomic, type CliIO } from '../io.ts';
import { parallelKernelsReady, startParallelKernels, stopParallelKernels } from '../parallel.ts';

/** From this many sectors the factorisation's updates are shared with helper threads (one per extra core). */
const PARALLEL_MIN_SECTORS = 500;

const USAGE = 'usage: roundwise analyze TABLE.csv [--map MAP.json] [--json] [--out DIR] [--allow-negative] [--tolerance T]';

/** The file's bytes; with `limit`, its size is checked first so that an oversized file is never read into memory. */

function fmt(x: number | null, digits = 4): string {
  return x === null ? '—' : x.toFixed(digits);
}

/** A short human summary: viability, then the multipliers table. */
export function summary(an: Analysis): string {
  const v = an.viability;
  const lines = [
    `${an.tableName}: ${an.n} sectors, money unit ${an.moneyUnit || '(not stated)'}`,
    `productive: ${v.productive ? 'yes' : 'NO'} (Perron root ${v.perronRoot.toFixed(6)}, certified ${v.perronRootBounds[0].toPrecision(10)}–${v.perronRootBounds[1].toPrecision(10)}; Hawkins–Simon ${v.hawkinsSimon ? 'holds' : 'fails'})`,
    `structure: ${v.irreducible ? `irreducible, ${v.primitive ? 'primitive' : `period ${v.period}`}` : `reducible, ${v.blocks.length} blocks`}; household-closed Perron root ${v.perronRootClosed === null ? 'n/a' : v.perronRootClosed.toFixed(6)}; rounds to ${v.tolerance}: ${v.roundsToTolerance ?? 'does not converge'}`,
    '',
  ];
  const m = an.multipliers;
  const head = ['sector', 'output I', 'output II', 'income I', 'income II', 'jobs I', 'jobs II', 'backward', 'forward'];
  const width = Math.min(28, Math.max(6, ...an.sectors.map((s) => s.length)));
  const pad = (s: string, w: number) => (s.length > w ? s.slice(0, w - 1) + '…' : s.padEnd(w));
  lines.push([pad(head[0]!, width), ...head.slice(1).map((h) => h.padStart(9))].join(' '));
  for (let j = 0; j < an.n; j++) {
    const cells = [m.output.typeI[j], m.output.typeII[j], m.income.typeI[j], m.income.typeII[j], m.employment.typeI[j], m.employment.typeII[j], an.linkages.backward[j], an.linkages.forward[j]];
    lines.push([pad(an.sectors[j]!, width), ...cells.map((c) => fmt(c ?? null).padStart(9))].join(' '));
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
  const fileName = basename(path);
  const roles = values.map !== undefined ? parseRoleMap(readInputFile(values.map).toString('utf8'), basename(values.map)) : undefined;
  // Only the table survives this block: the file's bytes and text (tens of MB for a large table) can be collected.
  let sourceHash: string | undefined;
  const table = (() => {
    const bytes = readInputFile(path);
    if (values.out !== undefined) sourceHash = createHash('sha256').update(bytes).digest('hex');
    return importTable(bytes.toString('utf8'), { fileName, allowNegative: values['allow-negative'], ...(roles ? { roles } : {}) });
  })();
  const threaded = table.n >= PARALLEL_MIN_SECTORS && startParallelKernels() > 0;
  let an: Analysis;
  try {
    if (threaded) await parallelKernelsReady(2000);
    an = analyzeTable(table, { inverse: values.out !== undefined, ...(tolerance !== undefined ? { tolerance } : {}) });
  } finally {
    if (threaded) await stopParallelKernels();
  }

  for (const w of an.warnings) io.stderr(`roundwise analyze: warning: ${formatLocated(w)}\n`);
  if (values.json) io.stdout(JSON.stringify(analysisJson(an)) + '\n');
  else if (values.out === undefined) io.stdout(summary(an));
  if (values.out !== undefined) {
    const files = analysisReports(an, {
      sourceFile: fileName,
      ...(sourceHash !== undefined ? { sourceHash } : {}),
      date: new Date().toISOString(),
    });
    for (const f of files) writeFileAtomic(join(values.out, f.name), f.content);
    if (!values.json) io.stdout(`wrote ${files.length} files to ${values.out}\n`);
  }
  return 0;
}
