/**
 * Files that name codes of an outside classification instead of the table's sectors, read through a classification
 * bridge (src/classification): county employment for a county estimate, shock files, spending mixes. Each value of a
 * code is split among the code's sectors by the bridge's shares; values falling into one sector are added. Refusals
 * name the data file's line for an unknown code and the bridge's line for a bad bridge row.
 */
import { InputError } from '../diagnostics/index.ts';
import { parseBridgeCsv, translateCode, type Bridge } from '../classification/index.ts';
import type { EmploymentEntry, EmploymentInput } from '../regional/index.ts';
import { parseMixCsv, parseShockCsv, SECTOR_KINDS, type Scenario, type ScenarioLine, type SpendingMix } from '../scenario/index.ts';
import type { EstimateFile } from './estimate.ts';

export type { Bridge };

const utf8 = new TextDecoder('utf-8');

/** Read a bridge file for a table with these sectors. */
export function readBridge(file: EstimateFile, sectors: readonly string[]): Bridge {
  return parseBridgeCsv(utf8.decode(file.bytes), file.fileName, sectors);
}

/** What a bridge covers, in words for a front end: codes, codes split by shares, sectors reached of the table's. */
export interface BridgeSummary {
  fileName: string;
  codes: number;
  splitCodes: number;
  sectorsReached: number;
  sectors: number;
}

export function bridgeSummary(bridge: Bridge, sectors: readonly string[]): BridgeSummary {
  const reached = new Set<string>();
  let split = 0;
  for (const c of bridge.codes.values()) {
    if (c.targets.length > 1) split++;
    for (const t of c.targets) reached.add(t.sector);
  }
  return { fileName: bridge.fileName, codes: bridge.codes.size, splitCodes: split, sectorsReached: reached.size, sectors: sectors.length };
}

/**
 * A shock file as a scenario, its sector column read as codes through the bridge when one is given (the one reading
 * the CLI's --shock/--bridge and the app's "shock file by codes" share).
 */
export function shockFromFile(text: string, fileName: string, bridge: Bridge | null): Scenario {
  const shock = parseShockCsv(text, fileName);
  return bridge === null ? shock : scenarioByBridge(shock, bridge);
}

/** The spending mixes of a mix file, their sector column read as codes through the bridge when one is given. */
export function mixesFromFile(text: string, fileName: string, bridge: Bridge | null): SpendingMix[] {
  return parseMixCsv(text, fileName).map((m) => (bridge === null ? m : spendingMixByBridge(m, bridge, fileName)));
}

/**
 * County (and national) jobs by code → jobs by sector. Every sector of the table must receive a code (a sector with
 * no jobs in the county needs a code line with 0), so a sector is never left out silently.
 */
export function employmentByBridge(emp: EmploymentInput, bridge: Bridge, sectors: readonly string[]): EmploymentInput {
  const bySector = new Map<string, EmploymentEntry>();
  for (const e of emp.entries) {
    const targets = translateCode(bridge, e.sector, { file: emp.fileName, ...(e.line !== undefined ? { line: e.line } : {}), column: 1 });
    for (const t of targets) {
      const prev = bySector.get(t.sector);
      const regional = e.regional * t.share;
      const national = e.national === null ? null : e.national * t.share;
      if (prev) {
        prev.regional += regional;
        prev.national = prev.national === null || national === null ? null : prev.national + national;
      } else bySector.set(t.sector, { sector: t.sector, regional, national, ...(e.line !== undefined ? { line: e.line } : {}) });
    }
  }
  const missing = sectors.filter((s) => !bySector.has(s));
  if (missing.length) {
    throw new InputError(
      'bridge-sector-uncovered',
      `no code of the employment file falls into ${missing.length === 1 ? 'sector' : 'sectors'} ${missing.slice(0, 5).map((s) => `'${s}'`).join(', ')}${missing.length > 5 ? `, … (${missing.length} in all)` : ''} through the bridge ${bridge.fileName}: add the codes that map there (with 0 jobs when the county has none)`,
      { file: emp.fileName, rowLabel: missing[0]! },
    );
  }
  return { fileName: emp.fileName, entries: sectors.map((s) => bySector.get(s)!) };
}

/** Shock lines by code → lines by sector: each line split by the bridge's shares (kind, local share and origin kept). */
export function scenarioByBridge(scenario: Scenario, bridge: Bridge): Scenario {
  // Only lines on a sector are translated: mix, activity and labour-income lines name no code of the classification.
  const translate = (l: ScenarioLine): ScenarioLine[] => {
    if (!SECTOR_KINDS.includes(l.kind)) return [l];
    const where = l.origin ? { file: l.origin.file, ...(l.origin.line !== undefined ? { line: l.origin.line } : {}) } : {};
    return translateCode(bridge, l.sector, where).map((t) => ({ ...l, sector: t.sector, amount: l.amount * t.share }));
  };
  return { ...scenario, phases: scenario.phases.map((p) => ({ ...p, lines: p.lines.flatMap(translate) })) };
}

/** A spending mix whose shares are by code → shares by sector (a code's share split by the bridge, sums kept). */
export function spendingMixByBridge(mix: SpendingMix, bridge: Bridge, fileName: string): SpendingMix {
  const bySector = new Map<string, number>();
  for (const s of mix.shares) {
    const where = { file: s.origin?.file ?? fileName, ...(s.origin?.line !== undefined ? { line: s.origin.line } : {}) };
    for (const t of translateCode(bridge, s.sector, where)) bySector.set(t.sector, (bySector.get(t.sector) ?? 0) + s.share * t.share);
  }
  return { ...mix, shares: [...bySector].map(([sector, share]) => ({ sector, share })) };
}
