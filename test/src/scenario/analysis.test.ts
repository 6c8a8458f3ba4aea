// analyseScenario: structural paths from a scenario with a fixed-output line, in both systems, must add up to that
// system's output change at the destination when every elementary path is listed (Defourny & Thorbecke 1984).
import { describe, it, expect } from 'vitest';
import { prepareModel } from '../../../src/model/index.ts';
import { analyseScenario, type Scenario } from '../../../src/scenario/index.ts';
import { county4 } from './tables.ts';

const pm = prepareModel(county4());
const scenario: Scenario = {
  name: 'plant and visitors',
  lines: [
    { sector: 'Food processing', amount: 120, kind: 'jobs', localShare: 1 },
    { sector: 'Retail', amount: 300, kind: 'final-demand', localShare: 0.8 },
  ],
};
const all = { maxLength: 5, minShare: 0, maxPaths: Number.POSITIVE_INFINITY };

describe('analyseScenario', () => {
  it('open model: listed paths explain the open-model output change of the destination', () => {
    const a = analyseScenario(pm, scenario, { pathsTo: 0, paths: all });
    expect(a.paths!.destinationTotal).toBeCloseTo(a.result.openOutput[0]!, 9);
    expect(a.paths!.explainedShare!).toBeCloseTo(1, 12);
    expect(a.rounds.rounds[0]).toEqual(a.result.effectiveDemand);
  });
  it('closed model: paths (households as a pole) explain the closed-model output change; origins are shocked or fixed sectors only', () => {
    const a = analyseScenario(pm, scenario, { pathsTo: 3, paths: { ...all, model: 'closed' } });
    expect(Math.abs(a.paths!.destinationTotal - a.result.closedOutput![3]!) / a.result.closedOutput![3]!).toBeLessThan(1e-12);
    expect(a.paths!.explainedShare!).toBeCloseTo(1, 12);
    expect(new Set(a.paths!.paths.map((p) => p.labels[0]))).toEqual(new Set(['Food processing', 'Retail']));
  });
  it('without a destination there are no paths', () => {
    expect(analyseScenario(pm, scenario).paths).toBeNull();
  });
});
