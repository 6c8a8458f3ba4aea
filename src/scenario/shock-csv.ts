/**
 * SHOCK.csv: header `sector,amount[,kind][,local_share][,phase][,timing][,year][,years][,price_year][,prices]
 * [,displacement][,deadweight][,note]` (any order, case-insensitive), one scenario line per row.
 *
 * kind defaults to final-demand, local_share to 1, prices to producer, displacement and deadweight to 0. Lines with the
 * same `phase` form one phase, in the order phases first appear; without a phase column the file is one phase.
 * A phase's timing (`once`, default, or `annual`), year and number of years may be given on one of its lines or on
 * all; lines that give them must agree. Read with the tables' dialect rules (src/table readSmallCsv); refusals name the
 * file line and field.
 */
import { InputError } from '../diagnostics/index.ts';
import { cleanLabel } from '../table/index.ts';
import { nameFromFile, readHeaderCsv, shareCell, yearCell, type HeaderRow } from './header-csv.ts';
import { LINE_KINDS, TIMINGS, type LineKind, type Phase, type Scenario, type ScenarioLine, type Timing } from './types.ts';

const COLUMNS = ['sector', 'amount', 'kind', 'local_share', 'phase', 'timing', 'year', 'years', 'price_year', 'prices', 'displacement', 'deadweight', 'note'] as const;
type Column = (typeof COLUMNS)[number];
export const SHOCK_HEADER = 'sector,amount[,kind][,local_share][,phase][,timing][,year][,years][,price_year][,prices][,displacement][,deadweight][,note]';

/** The name of a file's only phase when it has no phase column. */
export const DEFAULT_PHASE_NAME = 'Phase 1';

interface PhaseDraft {
  phase: Phase;
  /** Where timing, year and years were first given. */
  given: Partial<Record<'timing' | 'year' | 'years', { value: number | string; line: number }>>;
}

function agree(d: PhaseDraft, r: HeaderRow<Column>, field: 'timing' | 'year' | 'years', value: number | string | undefined): void {
  if (value === undefined) return;
  const before = d.given[field];
  if (!before) {
    d.given[field] = { value, line: r.line };
    return;
  }
  if (before.value !== value) {
    const what = field === 'timing' ? 'timings' : field === 'year' ? 'years' : 'numbers of years';
    throw new InputError(field === 'timing' ? 'phase-timing-mixed' : 'phase-field-mixed',
      `phase '${d.phase.name}' mixes ${what}: '${value}' here, '${before.value}' on line ${before.line}; every line of a phase has the same ${field}`, r.at(field));
  }
}

export function parseShockCsv(text: string, fileName: string, scenarioName?: string): Scenario {
  const f = readHeaderCsv(text, fileName, COLUMNS, ['sector', 'amount'], SHOCK_HEADER, 'shock file', 'empty-scenario');
  const phased = f.columns.phase !== undefined;
  const phases = new Map<string, PhaseDraft>();
  for (const r of f.rows) {
    const sector = cleanLabel(r.cell('sector'));
    const kindText = r.cell('kind').toLowerCase();
    const kind = (kindText === '' ? 'final-demand' : kindText) as LineKind;
    if (!LINE_KINDS.includes(kind)) {
      throw new InputError('bad-kind', `kind '${r.cell('kind')}' is not one of ${LINE_KINDS.join(', ')}`, r.at('kind', sector || undefined));
    }
    const label = sector || undefined;
    if (sector === '' && kind !== 'labour-income') {
      throw new InputError('missing-sector', `sector is empty${kind === 'mix' ? ' (a mix line names its mix here)' : kind === 'activity' ? ' (an activity line names its activity here)' : ''}`, r.at('sector'));
    }
    if (sector !== '' && kind === 'labour-income') {
      throw new InputError('labour-income-sector', `a labour-income line pays households, not a sector: leave its sector blank (found '${sector}')`, r.at('sector', sector));
    }
    const amount = r.number('amount', 'amount', label);
    if (amount === undefined) throw new InputError('bad-number', 'amount is missing', r.at('amount', label));
    const localShare = shareCell(r, 'local_share', 'local share', 'local-share-range', label) ?? 1;
    const pricesText = r.cell('prices').toLowerCase();
    if (pricesText !== '' && pricesText !== 'producer' && pricesText !== 'purchaser') {
      throw new InputError('bad-prices', `prices '${r.cell('prices')}' is not producer or purchaser`, r.at('prices', label));
    }
    const priceYear = yearCell(r, 'price_year', 'price year', label);
    const displacement = shareCell(r, 'displacement', 'displacement share', 'additionality-range', label);
    const deadweight = shareCell(r, 'deadweight', 'deadweight share', 'additionality-range', label);
    const note = r.cell('note');

    const phaseName = phased ? cleanLabel(r.cell('phase')) : DEFAULT_PHASE_NAME;
    if (phaseName === '') throw new InputError('phase-missing', 'phase is empty: name the phase of every line (or leave out the phase column for a one-phase scenario)', r.at('phase', label));
    let d = phases.get(phaseName);
    if (!d) {
      d = { phase: { name: phaseName, timing: 'once', lines: [] }, given: {} };
      phases.set(phaseName, d);
    }
    const timingText = r.cell('timing').toLowerCase();
    if (timingText !== '' && !TIMINGS.includes(timingText as Timing)) {
      throw new InputError('bad-timing', `timing '${r.cell('timing')}' is not once or annual`, r.at('timing', label));
    }
    agree(d, r, 'timing', timingText === '' ? undefined : timingText);
    agree(d, r, 'year', yearCell(r, 'year', 'year', label));
    const years = r.number('years', 'number of years', label);
    if (years !== undefined && (!Number.isInteger(years) || years < 1 || years > 1000)) {
      throw new InputError('bad-number', `number of years '${r.cell('years')}' is not a whole number from 1 to 1000`, r.at('years', label));
    }
    agree(d, r, 'years', years);

    const line: ScenarioLine = {
      sector, amount, kind, localShare,
      ...(pricesText === 'purchaser' ? { prices: 'purchaser' as const } : {}),
      ...(priceYear !== undefined ? { priceYear } : {}),
      ...(displacement ? { displacement } : {}),
      ...(deadweight ? { deadweight } : {}),
      ...(note ? { note } : {}),
      origin: r.origin(),
    };
    d.phase.lines.push(line);
  }
  if (phases.size === 0) throw new InputError('empty-scenario', 'the shock file has a header but no lines', { file: fileName, line: f.headerLine });
  const out: Phase[] = [];
  for (const d of phases.values()) {
    const p = d.phase;
    if (d.given.timing) p.timing = d.given.timing.value as Timing;
    if (d.given.year) p.year = d.given.year.value as number;
    if (d.given.years) {
      if (p.timing !== 'annual') {
        const at = d.phase.lines.find((l) => l.origin?.line === d.given.years!.line);
        throw new InputError('phase-field-mixed', `phase '${p.name}' is one-time but gives a number of years; only an annual phase runs for several years (set its timing to annual)`, { file: fileName, line: d.given.years.line, ...(at?.origin?.columns?.years ? { column: at.origin.columns.years } : {}), columnLabel: 'years' });
      }
      p.years = d.given.years.value as number;
    }
    out.push(p);
  }
  return { name: scenarioName ?? nameFromFile(fileName), phases: out };
}
