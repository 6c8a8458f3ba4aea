/**
 * Plausibility of a shock against the table it is run on. The linear model computes any shock, however large, but
 * its numbers mean something only for changes that leave each sector's production recipe intact (Miller & Blair 2009,
 * §2.6 on the assumptions of the model; recalled from memory). So:
 * - refused, located at the shock-file line and sector: a jobs line whose output (jobs ÷ jobs per unit of output) is
 *   not a finite number, lines on one sector that add up beyond the range of a double, and effects that come out
 *   non-finite (an amount near 1e308 times a multiplier);
 * - warned, naming the sector and the numbers: a sector's direct shock larger than its whole base-year output; a
 *   sector whose output would fall below zero; and a fixed-output (or jobs) line whose implied final demand is negative
 *   although its own change is not (the other lines need more from the sector than its fixed output gives, and the
 *   model balances that with a final-demand cut there).
 */
import { formatLocated, InputError, type Location, type Warning } from '../diagnostics/index.ts';
import type { PreparedModel } from '../model/index.ts';
import type { EffectSplit, LineSet, ScenarioLine, ScenarioResult } from './types.ts';

/** For messages: six significant digits, exponent form where a plain one would be unreadable. */
export function amountText(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const p = Number(v.toPrecision(6));
  const a = Math.abs(p);
  return a >= 1e12 || (a > 0 && a < 1e-4) ? p.toExponential() : String(p);
}

function where(line: ScenarioLine | undefined, sector: string): Location {
  const loc: Location = { rowLabel: sector };
  if (line?.origin?.file !== undefined) loc.file = line.origin.file;
  if (line?.origin?.line !== undefined) loc.line = line.origin.line;
  return loc;
}

/** The output a fixed line sets: the amount itself, or jobs ÷ jobs per unit of output; refused when not finite. */
export function fixedOutputOf(line: ScenarioLine, jobsPerUnit: number | null, moneyUnit: string): number {
  if (line.kind !== 'jobs') return line.amount;
  const out = line.amount / jobsPerUnit!;
  if (!Number.isFinite(out)) {
    throw new InputError('shock-not-finite', `${amountText(line.amount)} jobs at ${amountText(jobsPerUnit!)} jobs per unit of output would be an output change of ${amountText(out)} ${moneyUnit}, beyond what can be computed; check the jobs line and the sector's employment`, where(line, line.sector));
  }
  return out;
}

/** A sector's summed shock must stay finite (two lines of 1e308 add up to Infinity). */
export function refuseNonFiniteSum(sum: number, line: ScenarioLine): void {
  if (!Number.isFinite(sum)) {
    throw new InputError('shock-not-finite', `the lines on '${line.sector}' add up to ${amountText(sum)}, beyond what can be computed`, where(line, line.sector));
  }
}

function firstLineOf(scenario: LineSet, sector: string): ScenarioLine | undefined {
  return scenario.lines.find((l) => l.sector === sector);
}

function allFinite(v: Float64Array | null): boolean {
  if (!v) return true;
  for (let i = 0; i < v.length; i++) if (!Number.isFinite(v[i]!)) return false;
  return true;
}

function splitFinite(s: EffectSplit | null): boolean {
  return !s || (allFinite(s.direct) && allFinite(s.indirect) && allFinite(s.induced) && allFinite(s.total));
}

/**
 * Refuse a result with any non-finite number, located at the line of the largest shock (the one that drove it out of
 * range); otherwise the plausibility warnings, each located and with its numbers.
 */
export function checkShock(pm: PreparedModel, scenario: LineSet, r: ScenarioResult): Warning[] {
  const { n, sectors, x, e } = pm.coef;
  const unit = pm.table.moneyUnit;
  const { shock } = r;
  const direct = Float64Array.from(shock.df);
  shock.fixed.forEach((j, k) => { direct[j] = shock.fixedOutput[k]!; });

  const totals = Object.values(r.totals).flatMap((t) => (t ? [t.direct, t.indirect, t.induced ?? 0, t.total] : []));
  const finite = Object.values(r.effects).every(splitFinite) && totals.every(Number.isFinite)
    && allFinite(r.openOutput) && allFinite(r.closedOutput) && allFinite(r.effectiveDemand)
    && (r.closedHouseholdIncome === null || Number.isFinite(r.closedHouseholdIncome));
  if (!finite) {
    let big = 0;
    for (let j = 1; j < n; j++) if (Math.abs(direct[j]!) > Math.abs(direct[big]!)) big = j;
    throw new InputError('effects-not-finite', `the effects of scenario '${scenario.name}' are too large to compute (beyond ±1.8e308 somewhere); its largest shock is ${amountText(direct[big]!)} ${unit} on '${sectors[big]}' — check the amounts and their unit (${unit})`, where(firstLineOf(scenario, sectors[big]!), sectors[big]!));
  }

  const warnings: Warning[] = [];
  const warn = (code: string, j: number, message: string): void => {
    warnings.push({ code, message, location: where(firstLineOf(scenario, sectors[j]!), sectors[j]!) });
  };

  // A direct shock larger than the sector itself.
  for (let j = 0; j < n; j++) {
    const d = direct[j]!;
    if (d === 0 || Math.abs(d) <= x[j]!) continue;
    const k = shock.fixed.indexOf(j);
    const jobsLine = k >= 0 ? scenario.lines.find((l) => l.sector === sectors[j] && l.kind === 'jobs') : undefined;
    const jobs = jobsLine ? scenario.lines.filter((l) => l.sector === sectors[j] && l.kind === 'jobs').reduce((p, l) => p + l.amount, 0) : 0;
    const fromJobs = jobsLine && e ? `, from ${amountText(jobs)} jobs at ${amountText(e[j]!)} jobs per unit of output` : '';
    const times = x[j]! > 0 ? `, ${amountText(Math.abs(d) / x[j]!)} times` : '';
    warn('shock-exceeds-output', j, `the shock on '${sectors[j]}' (${amountText(d)} ${unit}${fromJobs}) is larger than the sector's whole base-year output (${amountText(x[j]!)} ${unit}${times}); input–output effects assume changes small enough to leave production recipes and prices as they are`);
  }

  // Output below zero after the change (total effect: closed model when used, else open).
  const change = r.closedOutput ?? r.openOutput;
  const negative: number[] = [];
  for (let i = 0; i < n; i++) if (x[i]! + change[i]! < 0) negative.push(i);
  for (const i of negative.slice(0, 5)) {
    const fixed = shock.fixed.includes(i) ? ' (fixed from outside)' : '';
    warn('output-negative', i, `the output of '${sectors[i]}'${fixed} would fall below zero: base-year ${amountText(x[i]!)} ${unit}, change ${amountText(change[i]!)} ${unit}, so ${amountText(x[i]! + change[i]!)} — a cut cannot exceed the sector`);
  }
  if (negative.length > 5) {
    warnings.push({ code: 'output-negative', message: `${negative.length - 5} more sector${negative.length - 5 === 1 ? '' : 's'} would have negative output: ${negative.slice(5).map((i) => `'${sectors[i]}'`).join(', ')}` });
  }

  // Fixed sectors whose implied final demand runs negative although their own change is not.
  const scale = Math.max(...Array.from(direct, Math.abs));
  shock.fixed.forEach((j, k) => {
    const target = shock.fixedOutput[k]!;
    if (target < 0) return;
    for (const [model, demand] of [['open', r.effectiveDemand], ['household-closed', r.closedEffectiveDemand]] as const) {
      const mu = demand ? demand[j]! : 0;
      if (!(mu < -1e-12 * scale)) continue;
      warn('implied-demand-negative', j, `'${sectors[j]}' is fixed at a change of ${amountText(target)} ${unit}, but in the ${model} model the rest of the scenario needs ${amountText(target - mu)} ${unit} of it; the model meets that with a final-demand change of ${amountText(mu)} ${unit} at '${sectors[j]}' (its other buyers take less)`);
      return; // the open model's cut implies the closed one's; name it once
    }
  });
  return warnings;
}

/** The warnings as the one-line notes every front end shows (file line and sector first). */
export function shockNotes(warnings: Warning[]): string[] {
  return warnings.map((w) => `Check the shock: ${formatLocated(w)}`);
}
