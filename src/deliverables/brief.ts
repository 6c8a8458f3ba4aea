/**
 * What the brief says, from plain inputs the study layer assembles (src/study/deliverables.ts): the scenario's
 * headline per phase (jobs, labour income, value added, output × direct, indirect, induced, total, each total as a
 * share of the county's base year), the ten sectors most affected with a chart, the implied multipliers, the inputs
 * and model choices, the notes and the cautions of input–output analysis in full. Numbers are rounded once, here
 * (rounding.ts), so the PDF and the print view show the same text.
 */
import type { Cell } from '../csv/index.ts';
import { originLines, type SourceOrigin } from '../report/index.ts';
import type { OverTime, ScenarioLine, ScenarioResult, Timing, TotalsRecord } from '../scenario/index.ts';
import { type BriefBlock, type BriefDocument, type BriefTable } from './document.ts';
import { councilNumber, dateText, plainNumber, ROUNDING_NOTE, shareText, type Quantity } from './rounding.ts';

/** The county's base-year totals, in the same definitions as the effects (coefficient × base-year output, summed). */
export interface BaseEconomy {
  output: number;
  valueAdded: number;
  income: number;
  /** Null when the table has no employment row. */
  employment: number | null;
  /** Full-time equivalents; null when the table has no FTE row. */
  fte: number | null;
  /** Taxes less subsidies on production; null when the table has no taxes row. */
  taxes: number | null;
}

/** One phase of the study: its name, timing in words ("one-time", "annual", …) and its result. */
export interface BriefPhase {
  name: string;
  timing: string;
  result: ScenarioResult;
  /** The lines of this phase, as typed. */
  lines: ScenarioLine[];
  /** An annual phase with a number of years: its cumulative effect and, with a discount rate, its present value. */
  overTime?: OverTime | null;
}

/** Phases of one timing added up (never one-time with annual), as the study layer's phase summary has them. */
export interface SameTimingTotal {
  timing: Timing;
  phases: string[];
  totals: TotalsRecord;
  /** The sum of the phases' cumulative effects, when every one has a number of years. */
  cumulative: TotalsRecord | null;
}

export interface BriefInput {
  scenario: string;
  description?: string;
  tableName: string;
  /** The table file and its SHA-256; `origins`: the supply and use pair it was derived from, with theirs. */
  source: { fileName: string; sha256: string; origins?: SourceOrigin[] } | null;
  /** ISO 8601 date-time of the run. */
  date: string;
  moneyUnit: string;
  /** The year the table's money is expressed in, when known. */
  priceYear: string | null;
  /** The table's verdict in one sentence. */
  verdict: string;
  /** Exactly the model the numbers came from. */
  model: string;
  base: BaseEconomy;
  phases: BriefPhase[];
  /** Totals across phases of the same timing (only when a timing has two phases or more). */
  sameTiming?: SameTimingTotal[];
  /** Closure, mixed-model lines, margins, price conversion: one sentence each. */
  modelChoices: string[];
  /** The outcome's notes (checks of the shock, table warnings). */
  notes: string[];
  /** The cautions of input–output analysis, in full. */
  cautions: string[];
}

type HeadlineVariable = 'employment' | 'fte' | 'income' | 'valueAdded' | 'output' | 'taxes';

export interface HeadlineRow {
  v: HeadlineVariable;
  label: string;
  q: Quantity;
  /** What a count is called in a sentence ("jobs", "full-time equivalents"); money is "… of <label>". */
  noun?: string;
  /** How a share of the county's base year is named in the sentence. */
  county: string;
  /** The variable's name on the workbook's summary sheet. */
  sheet: string;
}

/** The headline rows in the order a council reads them (jobs first); FTE and taxes only when the table has them. */
/** The brief's variables in the order and words it uses everywhere (headline, tables, the How sure sentence). */
export const HEADLINE: readonly HeadlineRow[] = [
  { v: 'employment', label: 'Jobs', q: 'jobs', noun: 'jobs', county: 'county jobs', sheet: 'jobs' },
  { v: 'fte', label: 'Full-time equivalents', q: 'jobs', noun: 'full-time equivalents', county: 'county full-time equivalents', sheet: 'full-time equivalents' },
  { v: 'income', label: 'Labour income', q: 'money', county: 'county labour income', sheet: 'labour income' },
  { v: 'valueAdded', label: 'Value added', q: 'money', county: 'county value added', sheet: 'value added' },
  { v: 'output', label: 'Output', q: 'money', county: 'county output', sheet: 'output' },
  { v: 'taxes', label: 'Taxes less subsidies', q: 'money', county: 'county taxes less subsidies', sheet: 'taxes less subsidies' },
];

/**
 * The headline at full precision, one row per phase and variable (the workbook's Summary sheet): the split, the
 * county's base-year total and the total as a share of it.
 */
export function headlineRows(phases: readonly BriefPhase[], base: BaseEconomy): Cell[][] {
  const rows: Cell[][] = [['phase', 'timing', 'variable', 'unit', 'direct', 'indirect', 'induced', 'total', 'county base-year total', 'total as a share of the county base year (0-1)']];
  for (const p of phases) {
    for (const h of HEADLINE) {
      const t = p.result.totals[h.v];
      if (!t) continue;
      const whole = base[h.v];
      rows.push([p.name, p.timing, h.sheet, h.noun ?? unitOf(h.q, p.result.moneyUnit), t.direct, t.indirect, t.induced, t.total, whole, whole !== null && whole > 0 ? t.total / whole : null]);
    }
  }
  return rows;
}

/** How many sectors the "most affected" table and chart show. */
export const TOP_SECTORS = 10;

const LINE_KIND_WORDS: Record<string, string> = {
  'final-demand': 'final demand',
  output: 'fixed output',
  jobs: 'fixed jobs',
  'labour-income': 'household income',
  mix: 'spending mix',
  activity: 'activity not in the table',
};

function unitOf(q: Quantity, moneyUnit: string): string {
  return q === 'jobs' ? 'jobs' : q === 'money' ? moneyUnit : 'ratio';
}

function headlineTable(p: BriefPhase, base: BaseEconomy): BriefTable {
  const r = p.result;
  const rows: string[][] = [];
  for (const h of HEADLINE) {
    const t = r.totals[h.v];
    if (!t) continue;
    rows.push([
      h.noun ? h.label : `${h.label} (${unitOf(h.q, r.moneyUnit)})`,
      councilNumber(t.direct, h.q), councilNumber(t.indirect, h.q), councilNumber(t.induced, h.q), councilNumber(t.total, h.q),
      shareText(t.total, base[h.v]),
    ]);
  }
  return {
    kind: 'table',
    columns: [
      { label: '', align: 'left', weight: 2.6 },
      { label: 'direct', align: 'right', weight: 1 },
      { label: 'indirect', align: 'right', weight: 1 },
      { label: 'induced', align: 'right', weight: 1 },
      { label: 'total', align: 'right', weight: 1 },
      { label: 'total as a share of the county', align: 'right', weight: 1.35 },
    ],
    rows,
  };
}

/** "1,429 jobs (2.9 % of county jobs), 71,800 thousand dollars of labour income (…)". */
function headlineSentence(p: BriefPhase, base: BaseEconomy): string {
  const r = p.result;
  const parts: string[] = [];
  for (const h of HEADLINE) {
    const t = r.totals[h.v];
    if (!t) continue;
    const what = h.noun ? `${councilNumber(t.total, 'jobs')} ${h.noun}` : `${councilNumber(t.total, 'money')} ${r.moneyUnit} of ${h.label.toLowerCase()}`;
    parts.push(`${what} (${shareText(t.total, base[h.v])} of ${h.county})`);
  }
  const list = parts.length > 1 ? `${parts.slice(0, -1).join(', ')} and ${parts.at(-1)}` : (parts[0] ?? '');
  const how = r.closure === 'household' ? 'direct, indirect and induced' : 'direct and indirect; no induced effects';
  return `Altogether (${how}): ${list}.`;
}

/** "25,400 job-years, 1,260,000 thousand dollars of labour income and …" for one set of totals. */
function totalsList(totals: TotalsRecord, moneyUnit: string, years: boolean): string {
  const parts: string[] = [];
  for (const h of HEADLINE) {
    const t = totals[h.v];
    if (!t) continue;
    if (h.noun) parts.push(`${councilNumber(t.total, 'jobs')} ${years ? (h.v === 'employment' ? 'job-years' : `${h.noun} × years`) : h.noun}`);
    else parts.push(`${councilNumber(t.total, 'money')} ${moneyUnit} of ${h.label.toLowerCase()}`);
  }
  return parts.length > 1 ? `${parts.slice(0, -1).join(', ')} and ${parts.at(-1)}` : (parts[0] ?? '');
}

/** An annual phase over its years: the cumulative total (undiscounted) and the present value (money only). */
function overTimeSentences(p: BriefPhase): string[] {
  const o = p.overTime;
  if (!o) return [];
  const unit = p.result.moneyUnit;
  const out = [`Over ${o.years} years (${o.years} × one year's effects, undiscounted), in total: ${totalsList(o.cumulative, unit, true)}.`];
  if (o.presentValue && o.rate !== null) {
    out.push(`Present value at a discount rate of ${plainNumber(o.rate * 100)} % a year (each year's effect discounted to the start of the first year; money only): ${totalsList(o.presentValue, unit, false)}.`);
  } else {
    out.push('No discount rate was given, so no present value.');
  }
  return out;
}

/** The same-timing totals, each labelled as such; one-time and annual results stay apart. */
function sameTimingBlocks(sums: readonly SameTimingTotal[], moneyUnit: string): BriefBlock[] {
  if (sums.length === 0) return [];
  const items = sums.map((s) => {
    const label = s.timing === 'once' ? `All one-time phases (${s.phases.join(', ')}), added` : `All annual phases (${s.phases.join(', ')}), one year of each, added`;
    const cum = s.cumulative ? `; over their years, in total: ${totalsList(s.cumulative, moneyUnit, true)}` : '';
    return `${label}: ${totalsList(s.totals, moneyUnit, false)}${cum}.`;
  });
  return [
    { kind: 'heading', level: 2, text: 'Phases of the same timing, added' },
    { kind: 'paragraph', tone: 'muted', text: 'Only phases of the same timing are added; one-time and annual results are never added together. Totals only, rounded as above.' },
    { kind: 'list', items },
  ];
}

/** Indices of the sectors with the largest change of output (absolute total), largest first. */
export function mostAffected(r: ScenarioResult, k = TOP_SECTORS): number[] {
  const total = r.effects.output.total;
  return Array.from(total.keys())
    .filter((i) => total[i] !== 0)
    .sort((a, b) => Math.abs(total[b]!) - Math.abs(total[a]!) || a - b)
    .slice(0, k);
}

function sectorTable(p: BriefPhase, top: number[]): BriefTable {
  const r = p.result;
  const o = r.effects.output;
  const jobs = r.effects.employment;
  const rows = top.map((i) => [
    r.sectors[i]!,
    councilNumber(o.direct[i]!, 'money'), councilNumber(o.indirect[i]!, 'money'), councilNumber(o.induced ? o.induced[i]! : null, 'money'),
    councilNumber(o.total[i]!, 'money'),
    ...(jobs ? [councilNumber(jobs.total[i]!, 'jobs')] : []),
  ]);
  return {
    kind: 'table',
    columns: [
      { label: 'sector', align: 'left', weight: 2.6 },
      { label: `output direct (${r.moneyUnit})`, align: 'right', weight: 1 },
      { label: 'output indirect', align: 'right', weight: 1 },
      { label: 'output induced', align: 'right', weight: 1 },
      { label: 'output total', align: 'right', weight: 1 },
      ...(jobs ? [{ label: 'jobs total', align: 'right' as const, weight: 0.9 }] : []),
    ],
    rows,
  };
}

function sectorBars(p: BriefPhase, top: number[]): BriefBlock {
  const r = p.result;
  const o = r.effects.output;
  const induced = o.induced;
  return {
    kind: 'bars',
    title: `Output change by sector, ${induced ? 'direct, indirect and induced' : 'direct and indirect'} (${r.moneyUnit})`,
    unit: r.moneyUnit,
    series: induced ? ['direct', 'indirect', 'induced'] : ['direct', 'indirect'],
    bars: top.map((i) => ({
      label: r.sectors[i]!,
      values: induced ? [o.direct[i]!, o.indirect[i]!, induced[i]!] : [o.direct[i]!, o.indirect[i]!],
      total: councilNumber(o.total[i]!, 'money'),
    })),
  };
}

function multiplierTable(p: BriefPhase): BriefTable {
  const r = p.result;
  const rows: string[][] = [];
  const order: HeadlineVariable[] = ['output', 'valueAdded', 'income', 'employment', 'fte', 'taxes'];
  for (const h of order.map((v) => HEADLINE.find((x) => x.v === v)!)) {
    const m = r.multipliers[h.v];
    if (!m) continue;
    rows.push([h.label, councilNumber(m.typeI.value, 'ratio'), councilNumber(m.typeII.value, 'ratio')]);
  }
  return {
    kind: 'table',
    columns: [
      { label: '', align: 'left', weight: 2 },
      { label: 'Type I: (direct + indirect) / direct', align: 'right', weight: 1.6 },
      { label: 'Type II: total / direct', align: 'right', weight: 1.6 },
    ],
    rows,
  };
}

function inputTable(phases: BriefPhase[], moneyUnit: string, priceYear: string | null): BriefTable {
  const several = phases.length > 1;
  const rows: string[][] = [];
  let k = 0;
  for (const p of phases) {
    for (const l of p.lines) {
      k++;
      rows.push([
        String(k),
        ...(several ? [p.name] : []),
        l.sector,
        LINE_KIND_WORDS[l.kind] ?? l.kind,
        `${plainNumber(l.amount)} ${l.kind === 'jobs' ? 'jobs' : moneyUnit}`,
        l.kind === 'final-demand' ? plainNumber(l.localShare) : '—',
        priceYear ?? 'as the table',
        [l.mix ? `spread by '${l.mix}'` : '', l.note ?? ''].filter(Boolean).join('; '),
      ]);
    }
  }
  return {
    kind: 'table',
    columns: [
      { label: '#', align: 'right', weight: 0.35 },
      ...(several ? [{ label: 'phase', align: 'left' as const, weight: 1.1 }] : []),
      { label: 'sector', align: 'left', weight: 1.7 },
      { label: 'kind', align: 'left', weight: 0.9 },
      { label: 'amount', align: 'right', weight: 1.3 },
      { label: 'local share', align: 'right', weight: 0.7 },
      { label: 'price year', align: 'left', weight: 0.8 },
      { label: 'note', align: 'left', weight: 3 },
    ],
    rows,
  };
}

function phaseBlocks(p: BriefPhase, input: BriefInput, several: boolean): BriefBlock[] {
  const top = mostAffected(p.result);
  const title = several ? `${p.name} (${p.timing})` : `Headline${p.timing ? ` (${p.timing})` : ''}`;
  const blocks: BriefBlock[] = [
    { kind: 'heading', level: 2, text: title },
    { kind: 'paragraph', tone: 'strong', text: headlineSentence(p, input.base) },
    headlineTable(p, input.base),
    ...overTimeSentences(p).map((text): BriefBlock => ({ kind: 'paragraph', tone: 'strong', text })),
    { kind: 'paragraph', tone: 'muted', text: `Direct: the shock itself; indirect: the local supply chain's response (open model, Type I); induced: local spending of the extra household income (household-closed model, Type II); total: all three. Shares are of the county's base-year totals in the table. ${ROUNDING_NOTE}` },
  ];
  if (top.length) {
    blocks.push(
      { kind: 'heading', level: 2, text: `The ${top.length === 1 ? 'sector' : `${top.length} sectors`} most affected${several ? ` — ${p.name}` : ''}` },
      { kind: 'paragraph', tone: 'muted', text: 'Ranked by the change of output (total, in absolute value).' },
      sectorTable(p, top),
      sectorBars(p, top),
    );
  }
  blocks.push(
    { kind: 'heading', level: 2, text: `Implied multipliers${several ? ` — ${p.name}` : ''}` },
    multiplierTable(p),
  );
  return blocks;
}

/** The brief of one scenario: everything a council member reads, with every number already rounded. */
export function briefDocument(input: BriefInput): BriefDocument {
  const several = input.phases.length > 1;
  const facts: [string, string][] = [
    ['Scenario', input.description ? `${input.scenario} — ${input.description}` : input.scenario],
    ['Table', input.tableName],
    ...(input.source ? [['Table file', input.source.fileName] as [string, string], ['SHA-256 of the file', input.source.sha256] as [string, string]] : [['Table file', 'not from a file (made in the app or estimated)'] as [string, string]]),
    ...originLines(input.source?.origins),
    ['Money', `${input.moneyUnit}; ${input.priceYear ? `prices of ${input.priceYear}` : 'price year not stated (amounts as in the table)'}`],
    ['Model', input.model],
    ['Table check', input.verdict],
    ['Produced', `${dateText(input.date)} by Roundwise`],
  ];
  const blocks: BriefBlock[] = [
    { kind: 'facts', rows: facts },
    ...(several ? [{ kind: 'paragraph', tone: 'muted', text: `This study has ${input.phases.length} phases, each reported on its own below; one-time and annual results are never added together.` } as BriefBlock] : []),
    ...input.phases.flatMap((p) => phaseBlocks(p, input, several)),
    ...sameTimingBlocks(input.sameTiming ?? [], input.moneyUnit),
    { kind: 'heading', level: 2, text: 'Inputs' },
    inputTable(input.phases, input.moneyUnit, input.priceYear),
    { kind: 'heading', level: 2, text: 'Model choices' },
    { kind: 'list', items: input.modelChoices },
  ];
  if (input.notes.length) blocks.push({ kind: 'heading', level: 2, text: 'Notes on this study' }, { kind: 'list', items: input.notes });
  blocks.push(
    { kind: 'heading', level: 2, text: 'Cautions' },
    { kind: 'paragraph', tone: 'muted', text: 'Input–output results are estimates under strong assumptions. Read the figures above with these cautions:' },
    { kind: 'list', items: input.cautions },
  );
  return {
    title: `Economic impact brief: ${input.scenario}`,
    subtitle: `${input.tableName} · money in ${input.moneyUnit} · produced ${dateText(input.date)}`,
    date: input.date,
    footer: `${input.scenario} — Roundwise brief, ${dateText(input.date, false)}. Estimates, not forecasts: see the cautions.`,
    blocks,
  };
}
