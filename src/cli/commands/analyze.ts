/**
 * `roundwise analyze TABLE.csv`: import a table, run the whole analysis (coefficients, viability, multipliers,
 * linkages); print a summary or one JSON object, and write the CSV reports with their sidecars into --out DIR.
 */
import { formatLocated, visibleText } from '../../diagnostics/index.ts';
import { importTable, type IOTable } from '../../table/index.ts';
import { analyzeTable, type Analysis } from '../../model/index.ts';
import { analysisJson, analysisReports } from '../../report/index.ts';
import { defineCommand } from '../command.ts';
import { parallelKernelsReady, startParallelKernels, stopParallelKernels } from '../parallel.ts';

/** From this many sectors the factorisation's updates are shared with helper threads (one per extra core). */
const PARALLEL_MIN_SECTORS = 500;

function fmt(x: number | null, digits = 4): string {
  return x === null ? '—' : x.toFixed(digits);
}

/** A short human summary: viability, then the multipliers table. */
export function summary(an: Analysis): string {
  const v = an.viability;
  const lines = [
    `${visibleText(an.tableName)}: ${an.n} sectors, money unit ${visibleText(an.moneyUnit) || '(not stated)'}`,
    `productive: ${v.productive ? 'yes' : 'NO'} (Perron root ${v.perronRoot.toFixed(6)}, certified ${v.perronRootBounds[0].toPrecision(10)}–${v.perronRootBounds[1].toPrecision(10)}; Hawkins–Simon ${v.hawkinsSimon ? 'holds' : 'fails'})`,
    `structure: ${v.irreducible ? `irreducible, ${v.primitive ? 'primitive' : `period ${v.period}`}` : `reducible, ${v.blocks.length} blocks`}; household-closed Perron root ${v.perronRootClosed === null ? 'n/a' : v.perronRootClosed.toFixed(6)}; rounds to ${v.tolerance}: ${v.roundsToTolerance ?? 'does not converge'}`,
    '',
  ];
  const m = an.multipliers;
  const head = ['sector', 'output I', 'output II', 'income I', 'income II', 'jobs I', 'jobs II', 'backward', 'forward'];
  const sectors = an.sectors.map((s) => visibleText(s));
  const width = Math.min(28, Math.max(6, ...sectors.map((s) => s.length)));
  const pad = (s: string, w: number) => (s.length > w ? s.slice(0, w - 1) + '…' : s.padEnd(w));
  lines.push([pad(head[0]!, width), ...head.slice(1).map((h) => h.padStart(9))].join(' '));
  for (let j = 0; j < an.n; j++) {
    const cells = [m.output.typeI[j], m.output.typeII[j], m.income.typeI[j], m.income.typeII[j], m.employment.typeI[j], m.employment.typeII[j], an.linkages.backward[j], an.linkages.forward[j]];
    lines.push([pad(sectors[j]!, width), ...cells.map((c) => fmt(c ?? null).padStart(9))].join(' '));
  }
  if (an.linkages.keySectors.length) lines.push('', `key sectors: ${an.linkages.keySectors.map((i) => sectors[i]).join(', ')}`);
  return lines.join('\n') + '\n';
}

/** The engine part of the command: the analysis of one table (helper threads for large tables). */
async function runAnalysis(table: IOTable, opts: { inverse: boolean; tolerance?: number }): Promise<Analysis> {
  const threaded = table.n >= PARALLEL_MIN_SECTORS && startParallelKernels() > 0;
  try {
    if (threaded) await parallelKernelsReady(2000);
    return analyzeTable(table, { inverse: opts.inverse, ...(opts.tolerance !== undefined ? { tolerance: opts.tolerance } : {}) });
  } finally {
    if (threaded) await stopParallelKernels();
  }
}

export const analyze = defineCommand({
  name: 'analyze',
  summary: 'coefficients, viability (Hawkins–Simon, Perron root with bounds), Type I and II multipliers and linkages of a table',
  positional: { name: 'TABLE.csv', help: 'the flow table (matrix or long layout; comma, semicolon or tab; decimal point or comma)' },
  options: {
    map: { type: 'string', value: 'MAP.json', help: 'role overrides for the table\'s rows and columns ({"rows": {label: role}, "columns": {label: role}})' },
    'allow-negative': { type: 'boolean', help: 'accept negative flows (e.g. subsidies or stock changes) instead of refusing them' },
    tolerance: { type: 'number', value: 'T', help: 'rounds to tolerance: count spending rounds until less than T of any demand is left (0 < T < 1; default 1e-6)', check: (t) => (t > 0 && t < 1 ? null : 'must be a number between 0 and 1') },
  },
  outHelp: 'write multipliers, coefficients, Leontief inverse, viability, Perron vectors and spectrum (n ≤ 400) as CSV, each with an .about.txt',
  notes: ['Warnings (e.g. an unproductive table) go to stderr; an unproductive table is analysed (exit 0), its multipliers left blank.'],
  async run({ input, values }, ctx) {
    const roles = ctx.roleMap(values.map);
    // Only the table survives this block: the file's bytes and text (tens of MB for a large table) can be collected.
    let sourceHash = '';
    let fileName = '';
    const table = (() => {
      const file = ctx.input(input);
      fileName = file.name;
      if (values.out !== undefined) sourceHash = file.sha256;
      return importTable(file.text, { fileName, allowNegative: values['allow-negative'], ...(roles ? { roles } : {}) });
    })();
    const an = await runAnalysis(table, { inverse: values.out !== undefined, ...(values.tolerance !== undefined ? { tolerance: values.tolerance } : {}) });
    for (const w of an.warnings) ctx.warn(formatLocated(w));
    return {
      summary: () => summary(an),
      json: () => analysisJson(an),
      ...(values.out !== undefined ? { reports: analysisReports(an, { sourceFile: fileName, sourceHash, date: ctx.date }) } : {}),
    };
  },
});
