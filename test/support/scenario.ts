// Scenarios in tests: the engine's runPhase (one phase's lines) with the models the table's own analysis allows
// (households closed when the closed model is productive), unless a test passes its own.
import { analyzePrepared } from '../../src/model/index.ts';
import type { PreparedModel } from '../../src/model/index.ts';
import type { Availability } from '../../src/model/index.ts';
import { DEFAULT_PHASE_NAME, NO_SHOCK_INPUTS, resolveShock, runPhase, type ComparisonEntry, type ResolvedShock, type LineSet, type Scenario, type ScenarioLine, type ScenarioResult, type ShockInputs, type Timing } from '../../src/scenario/index.ts';

const cache = new WeakMap<PreparedModel, Availability>();

export function modelsOf(pm: PreparedModel): Availability {
  let a = cache.get(pm);
  if (!a) {
    a = analyzePrepared(pm, { spectrum: false }).availability;
    cache.set(pm, a);
  }
  return a;
}

/** A scenario of one phase (one-time unless said), as a shock file without phase columns reads. */
export function onePhase(name: string, lines: ScenarioLine[], timing: Timing = 'once'): Scenario {
  return { name, phases: [{ name: DEFAULT_PHASE_NAME, timing, lines }] };
}

/** The lines of a scenario's only (or first) phase. */
export function linesOf(s: Scenario): ScenarioLine[] {
  return s.phases[0]!.lines;
}

/**
 * The effects of one phase's lines (`{name, lines}`, or a scenario's first phase, named as the scenario), with the study
 * inputs (mixes, activities, margins, prices) given.
 */
export function runScenario(pm: PreparedModel, scenario: LineSet | Scenario, models: Availability = modelsOf(pm), inputs?: ShockInputs): ScenarioResult {
  const set: LineSet = 'phases' in scenario ? { name: scenario.name, lines: linesOf(scenario) } : scenario;
  return runPhase(pm, set, models, inputs);
}

/** Comparison entries of one-time results, each compared with the first (as two one-phase scenarios are). */
export function entriesOf(...results: ScenarioResult[]): ComparisonEntry[] {
  return results.map((result) => ({ label: result.scenario, timing: 'once' as const, result, baseline: 0 }));
}

/** The shock the solvers see for a list of lines, with no study inputs and the household closure allowed. */
export function shockOf(pm: PreparedModel, lines: ScenarioLine[], inputs: ShockInputs = NO_SHOCK_INPUTS): ResolvedShock {
  return resolveShock(pm, 's', lines, { inputs, closure: true }).shock;
}
