/**
 * Analysis reports: multipliers and linkages by sector, coefficients, the Leontief inverse, viability and the spectrum.
 * Each is a rectangular CSV with units in the header names plus an `.about.txt` sidecar with the cautions (document.ts).
 */
import type { Cell } from '../csv/index.ts';
import { reportFiles, type ReportFile, type ReportMeta, type SourceOrigin } from './document.ts';
import { CONDITION_LIMIT, type Analysis } from '../model/index.ts';
import type { NullNote } from '../model/index.ts';
import { verdictOf } from './verdict.ts';
import { LINKAGE_CLASS_NAMES, linkageClass, measureHeader, measuresOf, measureValues } from './measures.ts';

export interface AnalysisReportContext {
  sourceFile?: string;
  sourceHash?: string;
  sourceOrigins?: SourceOrigin[];
  /** ISO 8601 date-time of the run. */
  date: string;
  /** What the study adds to the model line (commuting), one clause each. */
  model?: string[];
}

function modelType(an: Analysis, extra: readonly string[] = []): string {
  const base = an.viability.closedProductive
    ? 'open (Type I) and household-closed (Type II) input-output model'
    : 'open (Type I) input-output model; Type II not available';
  return [base, ...extra].join('; ');
}

function noteText(an: Analysis, nn: NullNote): string {
  const where = nn.sectors === 'all' ? 'all sectors' : nn.sectors.map((i) => an.sectors[i]).join(', ');
  return `${nn.measure} is blank for ${where}: ${nn.reason}`;
}

/** Warnings and reasons for blank cells, as sidecar notes. */
export function analysisNotes(an: Analysis): string[] {
  return [
    ...an.warnings.map((w) => `Warning: ${w.message}`),
    ...an.multipliers.notes.map((nn) => noteText(an, nn)),
    ...an.linkages.notes.map((nn) => noteText(an, nn)),
  ];
}

function meta(an: Analysis, ctx: AnalysisReportContext, title: string, extra: string[] = []): ReportMeta {
  return {
    title,
    tableName: an.tableName,
    ...(ctx.sourceFile !== undefined ? { sourceFile: ctx.sourceFile } : {}),
    ...(ctx.sourceHash !== undefined ? { sourceHash: ctx.sourceHash } : {}),
    ...(ctx.sourceOrigins?.length ? { sourceOrigins: ctx.sourceOrigins } : {}),
    modelType: modelType(an, an.viability.closedProductive ? ctx.model ?? [] : []),
    date: ctx.date,
    moneyUnit: an.moneyUnit,
    notes: [...extra, ...analysisNotes(an)],
  };
}

export function multiplierRows(an: Analysis): Cell[][] {
  const measures = measuresOf(an);
  const rows: Cell[][] = [['sector', ...measures.map((m) => measureHeader(m, an.moneyUnit)), 'linkage class (Rasmussen)', 'key sector (both linkages above 1)']];
  const columns = measures.map((m) => measureValues(an, m.key));
  for (let j = 0; j < an.n; j++) {
    const cls = linkageClass(an, j);
    rows.push([an.sectors[j]!, ...columns.map((c) => c[j] ?? null), cls === null ? null : LINKAGE_CLASS_NAMES[cls], cls === 'key' ? 'yes' : 'no']);
  }
  return rows;
}

export function coefficientRows(an: Analysis): Cell[][] {
  const { n, sectors } = an;
  const c = an.coefficients;
  const hasClosure = c.householdConsumption !== null;
  const header: Cell[] = ['selling sector \\ buying sector (per unit of the buyer\'s output)', ...sectors];
  if (hasClosure) header.push('households (per unit of household income)');
  const rows: Cell[][] = [header];
  for (let i = 0; i < n; i++) {
    const row: Cell[] = [sectors[i]!];
    for (let j = 0; j < n; j++) row.push(c.A[i * n + j]!);
    if (hasClosure) row.push(c.householdConsumption![i]!);
    rows.push(row);
  }
  const extra = (label: string, v: Float64Array | null, last: Cell): void => {
    if (!v) return;
    const row: Cell[] = [label, ...Array.from(v)];
    if (hasClosure) row.push(last);
    rows.push(row);
  };
  extra('labour income (per unit of output)', c.labourIncome, null);
  extra('other value added (per unit of output)', c.otherValueAdded, null);
  extra('taxes less subsidies (per unit of output)', c.taxes, null);
  extra('imports (per unit of output)', c.imports, null);
  extra('employment (jobs per unit of output)', c.employment, null);
  extra('full-time equivalents (per unit of output)', c.fte, null);
  extra(`total output (${an.moneyUnit})`, c.x, hasClosure ? c.householdIncomeTotal : null);
  return rows;
}

export function leontiefRows(an: Analysis): Cell[][] | null {
  const L = an.leontief;
  if (!L) return null;
  const { n, sectors } = an;
  const rows: Cell[][] = [['output of sector \\ per unit of final demand for', ...sectors]];
  for (let i = 0; i < n; i++) {
    const row: Cell[] = [sectors[i]!];
    for (let j = 0; j < n; j++) row.push(L[i * n + j]!);
    rows.push(row);
  }
  // The column sums are the Type I output multipliers: the analysis' own, as the multipliers report and the app show them.
  rows.push(['total (output multiplier)', ...an.multipliers.output.typeI]);
  return rows;
}

export function viabilityRows(an: Analysis): Cell[][] {
  const v = an.viability;
  const hs = v.hawkinsSimonDetail;
  const yes = (b: boolean | null): Cell => (b === null ? null : b ? 'yes' : 'no');
  const rows: Cell[][] = [['measure', 'value', 'lower bound', 'upper bound', 'note']];
  rows.push(['productive', yes(v.productive), null, null, v.verdictNote ?? 'Hawkins–Simon and the Perron root agree']);
  rows.push(['Perron root of A', v.perronRoot, v.perronRootBounds[0], v.perronRootBounds[1],
    `certified Collatz–Wielandt bounds after ${v.perronIterations} power-iteration step${v.perronIterations === 1 ? "" : "s"}${v.negativeFlows ? '; computed for |A| (negative flows)' : ''}`]);
  rows.push(['Hawkins–Simon condition', yes(v.hawkinsSimon), null, null, hs.firstFailing
    ? `first failing leading principal minor: order ${hs.firstFailing.order} (sector ${an.sectors[hs.firstFailing.sector]}), pivot ${hs.firstFailing.pivot}`
    : `all ${an.n} leading principal minors of I − A positive; smallest pivot ${hs.smallestPivot}`]);
  rows.push(['irreducible', yes(v.irreducible), null, null, v.irreducible ? 'every sector reaches every other through purchases'
    : `${v.blocks.length} blocks: ${v.blocks.map((b) => `{${b.sectors.map((i) => an.sectors[i]).join('; ')}}`).join(' → ')}`]);
  rows.push(['period', v.period, null, null, v.primitive ? 'primitive (period 1)' : v.period === null ? 'defined for an irreducible table only' : 'rounds cycle among groups of sectors']);
  rows.push(['Perron root of the household-closed model', v.perronRootClosed, v.perronRootClosedBounds?.[0] ?? null, v.perronRootClosedBounds?.[1] ?? null,
    v.perronRootClosed === null ? 'no household closure' : v.closedProductive ? 'closed model productive' : 'closed model not productive']);
  const s = an.series;
  rows.push([`rounds until less than ${v.tolerance} of any demand is left`, v.roundsToTolerance, null, null,
    s.converges ? `rigorous bound from a Collatz–Wielandt certificate (${s.certificate.source}, contraction ${s.certificate.beta})` : s.reason]);
  rows.push(['condition estimate of I − A (1-norm)', an.checks.condition, null, null, `LAPACK-style estimate; above ${CONDITION_LIMIT.toExponential(0)} the results lose most digits`]);
  rows.push(['scaled residual of a solve', an.checks.solveResidual, null, null, `LAPACK xGET02 ratio; above ${an.checks.residualThreshold} the factorisation is suspect`]);
  rows.push(['scaled residual of a household-closed solve', an.checks.closedSolveResidual, null, null, `the same ratio for I − Ā, solved by bordering the open factorisation`]);
  return rows;
}

export function spectrumRows(an: Analysis): Cell[][] | null {
  const sp = an.viability.spectrum;
  if (!sp) return null;
  const rows: Cell[][] = [['rank', 'real part', 'imaginary part', 'modulus', 'long-run mode']];
  sp.forEach((m, k) => rows.push([k + 1, m.re, m.im, m.modulus, m.kind]));
  return rows;
}

export function perronVectorRows(an: Analysis): Cell[][] {
  const v = an.viability;
  const rows: Cell[][] = [['sector', 'right Perron vector (long-run share of each round)', 'left Perron vector (long-run weight of demand)']];
  for (let i = 0; i < an.n; i++) rows.push([an.sectors[i]!, v.rightPerronVector[i]!, v.leftPerronVector[i]!]);
  return rows;
}

/** The analysis reports, in the order they are listed and written. */
export const ANALYSIS_REPORT_KINDS = ['multipliers', 'coefficients', 'leontief-inverse', 'viability', 'perron-vectors', 'spectrum'] as const;
export type AnalysisReportKind = (typeof ANALYSIS_REPORT_KINDS)[number];

/**
 * One analysis report as its CSV and sidecar; null when the analysis lacks it (the Leontief inverse when it was not
 * formed, the spectrum when it was skipped).
 */
export function analysisReport(an: Analysis, kind: AnalysisReportKind, ctx: AnalysisReportContext): ReportFile[] | null {
  switch (kind) {
    case 'multipliers':
      return reportFiles('multipliers', meta(an, ctx, 'Multipliers and linkages by sector', [
        'Multipliers after Miller & Blair, Input-Output Analysis, 2nd ed. 2009, ch. 6; linkages after Rasmussen 1956.',
        'Blank cells are values that cannot be defined (see the notes below).',
      ]), multiplierRows(an));
    case 'coefficients':
      return reportFiles('coefficients', meta(an, ctx, 'Technical and per-unit-output coefficients'), coefficientRows(an));
    case 'leontief-inverse': {
      const L = leontiefRows(an);
      const r = an.checks.inverseResidual;
      return L && reportFiles('leontief-inverse', meta(an, ctx, 'Leontief inverse (I - A)^-1', [
        `Accuracy: scaled residual of the inverse ${r ?? 'n/a'} (LAPACK xGET03 ratio; above ${an.checks.residualThreshold} the factorisation is suspect).`,
      ]), L);
    }
    case 'viability':
      return reportFiles('viability', meta(an, ctx, 'Viability of the table', verdictLines(an)), viabilityRows(an));
    case 'perron-vectors':
      return reportFiles('perron-vectors', meta(an, ctx, 'Perron vectors of A'), perronVectorRows(an));
    case 'spectrum': {
      const sp = spectrumRows(an);
      return sp && reportFiles('spectrum', meta(an, ctx, 'Eigenvalues of A and their long-run modes'), sp);
    }
  }
}

function verdictLines(an: Analysis): string[] {
  const v = verdictOf(an);
  return [`Verdict: ${v.say}`, ...v.detail];
}

/** Every analysis report the analysis holds (the Leontief inverse only when it was formed). */
export function analysisReports(an: Analysis, ctx: AnalysisReportContext): ReportFile[] {
  return ANALYSIS_REPORT_KINDS.flatMap((k) => analysisReport(an, k, ctx) ?? []);
}
