// Scenarios in tests: the engine's runScenario with the models the table's own analysis allows (households closed
// when the closed model is productive), unless a test passes its own.
import { analyzePrepared } from '../../src/model/index.ts';
import type { PreparedModel } from '../../src/model/index.ts';
import type { Availability } from '../../src/model/index.ts';
import { runScenario as engineRunScenario } from '../../src/scenario/index.ts';
import type { Scenario, ScenarioResult } from '../../src/scenario/index.ts';

const cache = new WeakMap<PreparedModel, Availability>();

export function modelsOf(pm: PreparedModel): Availability {
  let a = cache.get(pm);
  if (!a) {
    a = analyzePrepared(pm, { spectrum: false }).availability;
    cache.set(pm, a);
  }
  return a;
}

export function runScenario(pm: PreparedModel, scenario: Scenario, models: Availability = modelsOf(pm)): ScenarioResult {
  return engineRunScenario(pm, scenario, models);
}
