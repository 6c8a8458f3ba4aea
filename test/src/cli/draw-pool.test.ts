// Monte Carlo draws shared with helper threads (src/cli/draw-pool.ts) give bit-identical bands to one thread: draw k
// depends only on (seed, k), whichever thread computes it. The helpers here load the engine from the sources (tsx).
import { describe, expect, it } from 'vitest';
import { beginStudyBands, defaultUncertaintySettings, importTable, prepareStudy, studyBands, studyOfTable, type Scenario } from '../../../src/study/index.ts';
import { finishBandsThreaded } from '../../../src/cli/draw-pool.ts';
import { denseTableCsv } from '../../support/random-tables.ts';
import { onePhase } from '../../support/scenario.ts';

describe('draws on helper threads', () => {
  const table = importTable(denseTableCsv(40, 3), { fileName: 'dense.csv' });
  const ps = prepareStudy(studyOfTable(table), { spectrum: false });
  const scenario: Scenario = onePhase('two lines', [
    { sector: table.sectors[0]!, amount: 1000, kind: 'final-demand', localShare: 0.9 },
    { sector: table.sectors[5]!, amount: 400, kind: 'final-demand', localShare: 0.6 },
  ]);
  const req = { settings: defaultUncertaintySettings({ draws: 50, seed: 11, cv: 0.08, localShareRange: 0.1 }), multipliers: true, scenarios: [scenario] };

  it('give the same bands, bit for bit, when a helper computes every draw', async () => {
    const one = studyBands(ps, req)!;
    const threaded = await finishBandsThreaded(beginStudyBands(ps, req), 1, { callerDraws: false });
    expect(threaded.byHelpers).toBe(50);
    expect(threaded.bands).toEqual(one);
  }, 60_000);
});
