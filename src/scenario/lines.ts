/**
 * Scenario lines → the shock the solvers see, with every refusal located (shock-file line, sector label).
 */
import { InputError, type Location } from '../diagnostics/index.ts';
import type { PreparedModel } from '../model/index.ts';
import type { LineKind, ResolvedShock, Scenario, ScenarioLine, SpendingPattern } from './types.ts';
import { fixedOutputOf, refuseNonFiniteSum } from './shock-checks.ts';

function where(line: ScenarioLine | undefined, sector?: string): Location {
  const loc: Location = {};
  if (line?.origin?.file !== undefined) loc.file = line.origin.file;
  if (line?.origin?.line !== undefined) loc.line = line.origin.line;
  if (sector !== undefined) loc.rowLabel = sector;
  return loc;
}

/** Shares must sum to 1 within this (they are usually typed as percentages rounded to a few digits). */
export const PATTERN_SUM_TOLERANCE = 1e-6;

/**
 * Spread one amount over sectors by a spending pattern. The lines carry the pattern's name so the UI can show them
 * as one group; the local share applies to every line.
 */
export function spreadPattern(
  pattern: SpendingPattern,
  amount: number,
  opts: { localShare?: number; note?: string } = {},
): ScenarioLine[] {
  if (pattern.shares.length === 0) {
    throw new InputError('pattern-empty', `spending pattern '${pattern.name}' has no sectors`);
  }
  let sum = 0;
  for (const s of pattern.shares) {
    if (!Number.isFinite(s.share) || s.share < 0 || s.share > 1) {
      throw new InputError('pattern-share-range', `spending pattern '${pattern.name}': share ${s.share} of '${s.sector}' is outside [0, 1]`, { rowLabel: s.sector });
    }
    sum += s.share;
  }
  if (Math.abs(sum - 1) > PATTERN_SUM_TOLERANCE) {
    throw new InputError('pattern-share-sum', `spending pattern '${pattern.name}': shares sum to ${sum}, not 1`);
  }
  return pattern.shares.map((s) => ({
    sector: s.sector,
    amount: amount * s.share,
    kind: 'final-demand' as LineKind,
    localShare: opts.localShare ?? 1,
    pattern: pattern.name,
    ...(opts.note !== undefined ? { note: opts.note } : {}),
  }));
}

/**
 * Validate a scenario against a prepared table and turn it into a final-demand change plus fixed outputs.
 * Several lines on one sector add up. Refused: an empty scenario, an unknown sector, a non-finite amount, a local share
 * outside [0, 1] (or other than 1 on an output or jobs line, where the fixed output is local by definition), a jobs line
 * for a sector without employment, and a sector that is both fixed and shocked in final demand.
 */
export function resolveShock(pm: PreparedModel, scenario: Scenario): ResolvedShock {
  const { n, sectors, e } = pm.coef;
  if (scenario.lines.length === 0) {
    throw new InputError('empty-scenario', `scenario '${scenario.name}' has no lines`);
  }
  const index = new Map<string, number>();
  sectors.forEach((s, i) => index.set(s, i));
  const df = new Float64Array(n);
  const fixedAt = new Map<number, number>();
  const firstDemandLine = new Map<number, ScenarioLine>();
  const firstFixedLine = new Map<number, ScenarioLine>();

  for (const line of scenario.lines) {
    const j = index.get(line.sector);
    if (j === undefined) {
      const key = line.sector.trim().toLowerCase();
      const near = sectors.find((s) => s.trim().toLowerCase() === key);
      const hint = near !== undefined ? `did you mean '${near}'?` : `the table has: ${sectors.slice(0, 8).join(', ')}${sectors.length > 8 ? ', …' : ''}`;
      throw new InputError('unknown-sector', `unknown sector '${line.sector}' (${hint})`, where(line, line.sector));
    }
    if (!Number.isFinite(line.amount)) {
      throw new InputError('bad-amount', `amount of '${line.sector}' is not a finite number`, where(line, line.sector));
    }
    const share = line.localShare;
    if (!Number.isFinite(share) || share < 0 || share > 1) {
      throw new InputError('local-share-range', `local share ${share} of '${line.sector}' is outside [0, 1]`, where(line, line.sector));
    }
    if (line.kind === 'final-demand') {
      df[j] = df[j]! + line.amount * share;
      refuseNonFiniteSum(df[j]!, line);
      if (!firstDemandLine.has(j)) firstDemandLine.set(j, line);
    } else if (line.kind === 'output' || line.kind === 'jobs') {
      if (share !== 1) {
        throw new InputError('local-share-fixed', `local share applies to final-demand lines only; an ${line.kind} line fixes the sector's own (local) output`, where(line, line.sector));
      }
      const ej = e ? e[j]! : 0;
      if (line.kind === 'jobs' && !(ej > 0)) {
        throw new InputError('no-employment', `a jobs line needs employment for '${line.sector}', and the table has ${e ? 'none for this sector' : 'no employment row'}`, where(line, line.sector));
      }
      fixedAt.set(j, (fixedAt.get(j) ?? 0) + fixedOutputOf(line, ej, pm.table.moneyUnit));
      refuseNonFiniteSum(fixedAt.get(j)!, line);
      if (!firstFixedLine.has(j)) firstFixedLine.set(j, line);
    } else {
      throw new InputError('bad-kind', `kind '${String(line.kind)}' of '${line.sector}' is not one of final-demand, output, jobs`, where(line, line.sector));
    }
  }
  for (const [j, fixedLine] of firstFixedLine) {
    const demandLine = firstDemandLine.get(j);
    if (demandLine) {
      const later = (demandLine.origin?.line ?? 0) > (fixedLine.origin?.line ?? 0) ? demandLine : fixedLine;
      throw new InputError('fixed-and-shocked', `'${sectors[j]}' is both fixed (${fixedLine.kind} line) and shocked in final demand; its output is set from outside, so a final-demand change there has no meaning — use one or the other`, where(later, sectors[j]));
    }
  }
  const fixed = [...fixedAt.keys()].sort((a, b) => a - b);
  return { n, df, fixed, fixedOutput: fixed.map((j) => fixedAt.get(j)!) };
}
