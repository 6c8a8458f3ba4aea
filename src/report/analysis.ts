/**
 * Analysis reports: multipliers and linkages by sector, coefficients, the Leontief inverse, viability and the spectrum.
 * Each is a rectangular CSV with units in the header names plus an `.about.txt` sidecar with the cautions (document.ts).
 */
import type { Cell } from '../csv/index.ts';
import { reportFiles, type ReportFile, type ReportMeta } from './document.ts';
import type { Analysis, NullNote, Values } from '../model/index.ts';

export interface AnalysisReportContext {
  sourceFile?: string;
  sourceHash?: string;
  /** ISO 8601 date-time of the run. */
  date: string;
}

function modelType(an: Analysis): string {
  return an.viability.closedProductive
    ? 'open (Type I) and household-closed (Type II) input-output model'
    : 'open (Type I) input-output model; Type II not available';
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
    modelType: modelType(an),
    date: ctx.date,
    moneyUnit: an.moneyUnit,
    notes: [...extra, ...analysisNotes(an)],
  };
}

export function multiplierRows(an: Analysis): Cell[][] {
  const m = an.multipliers;
  const l = an.linkages;
  const money = `${an.moneyUnit} per ${an.moneyUnit} of final demand`;
  const jobs = `jobs per ${an.moneyUnit} of final demand`;
  const cols: [string, Values][] = [
    ['output Type I (per unit of final demand)', m.output.typeI],
    ['output Type II (per unit of final demand)', m.output.typeII],
    [`labour income simple (${money})`, m.income.simple],
    ['labour income Type I (ratio)', m.income.typeI],
    [`labour income total (${money})`, m.income.total],
    ['labour income Type II (ratio)', m.income.typeII],
    [`employment simple (${jobs})`, m.employment.simple],
    ['employment Type I (ratio)', m.employment.typeI],
    [`employment total (${jobs})`, m.employment.total],
    ['employment Type II (ratio)', m.employment.typeII],
    [`value added simple (${money})`, m.valueAdded.simple],
    [`value added total (${money})`, m.valueAdded.total],
    ['backward linkage (Rasmussen index)', l.backward],
    ['forward linkage (Rasmussen index)', l.forward],
  ];
  const key = new Set(l.keySectors);
  const rows: Cell[][] = [['sector', ...cols.map((c) => c[0]), 'key sector (both linkages above 1)']];
  for (let j = 0; j < an.n; j++) rows.push([an.sectors[j]!, ...cols.map((c) => c[1][j] ?? null), key.has(j) ? 'yes' : 'no']);
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
  extra('imports (per unit of output)', c.imports, null);
  extra('employment (jobs per unit of output)', c.employment, null);
  extra(`total output (${an.moneyUnit})`, c.x, hasClosure ? c.householdIncomeTotal : null);
  return rows;
}

export function leontiefRows(an: Analysis): Cell[][] | null {
  const L = an.leontief;
  if (!L) return null;
  const { n, sectors } = an;
  const rows: Cell[][] = [['output of sector \\ per unit of final demand for', ...sectors]];
  const sums = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const row: Cell[] = [sectors[i]!];
    for (let j = 0; j < n; j++) {
      row.push(L[i * n + j]!);
      sums[j] = sums[j]! + L[i * n + j]!;
    }
    rows.push(row);
  }
  rows.push(['total (output multiplier)', ...Array.from(sums)]);
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
  rows.push(['condition estimate of I − A (1-norm)', an.checks.condition, null, null, 'LAPACK-style estimate; above 1e12 the results lose most digits']);
  rows.push(['scaled residual of a solve', an.checks.solveResidual, null, null, `LAPACK xGET02 ratio; above ${an.checks.residualThreshold} the factorisation is suspect`]);
  rows.push(['scaled residual of a household-closed solve', an.checks.closedSolveResidual, null, null, `the same ratio for I − Ā, solved by bordering the open factorisation`]);
  rows.push(['scaled residual of the inverse', an.checks.inverseResidual, null, null, `LAPACK xGET03 ratio; above ${an.checks.residualThreshold} the factorisation is suspect`]);
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

/** All analysis reports: multipliers, coefficients, leontief-inverse (when formed), viability, perron-vectors, spectrum (when computed). */
export function analysisReports(an: Analysis, ctx: AnalysisReportContext): ReportFile[] {
  const files: ReportFile[] = [
    ...reportFiles('multipliers', meta(an, ctx, 'Multipliers and linkages by sector', [
      'Multipliers after Miller & Blair, Input-Output Analysis, 2nd ed. 2009, ch. 6; linkages after Rasmussen 1956.',
      'Blank cells are values that cannot be defined (see the notes below).',
    ]), multiplierRows(an)),
    ...reportFiles('coefficients', meta(an, ctx, 'Technical and per-unit-output coefficients'), coefficientRows(an)),
  ];
  const L = leontiefRows(an);
  if (L) files.push(...reportFiles('leontief-inverse', meta(an, ctx, 'Leontief inverse (I - A)^-1'), L));
  files.push(...reportFiles('viability', meta(an, ctx, 'Viability of the table'), viabilityRows(an)));
  files.push(...reportFiles('perron-vectors', meta(an, ctx, 'Perron vectors of A'), perronVectorRows(an)));
  const sp = spectrumRows(an);
  if (sp) files.push(...reportFiles('spectrum', meta(an, ctx, 'Eigenvalues of A and their long-run modes'), sp));
  return files;
}
