// Results of a project file, recomputed as the front ends do after a load (project files never store results).
import { prepareModel } from '../../src/model/index.ts';
import type { ScenarioResult } from '../../src/scenario/index.ts';
import type { Project } from '../../src/project/index.ts';
import { runScenario } from './scenario.ts';

export function projectResults(p: Project): ScenarioResult[] {
  const pm = prepareModel(p.table);
  return p.scenarios.map((s) => runScenario(pm, s));
}
