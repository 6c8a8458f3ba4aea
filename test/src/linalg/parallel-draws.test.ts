// Monte Carlo draws on a table large enough for the factorisation's updates to be split across a helper thread give
// bit-identical bands with one thread or two (each draw's numbers depend only on the seed and the draw's index).
import { describe, expect, it } from 'vitest';
import { startParallelKernels, parallelKernelsReady, stopParallelKernels } from '../../../src/cli/index.ts';
import { splitJobCount } from '../../../src/linalg/parallel.ts';
import { defaultUncertaintySettings, prepareStudy, studyBands, studyOfTable, importTable } from '../../../src/study/index.ts';
import { denseTableCsv } from '../../support/random-tables.ts';

describe('draws with a helper thread', () => {
  it('give bit-identical bands with one thread or two', async () => {
    const table = importTable(denseTableCsv(301, 9), { fileName: 'dense.csv' });
    const ps = prepareStudy(studyOfTable(table), { spectrum: false });
    const req = { settings: defaultUncertaintySettings({ draws: 20, seed: 5, cv: 0.05 }), multipliers: true, scenarios: [] };
    const one = studyBands(ps, req)!;
    expect(startParallelKernels(1)).toBe(1);
    try {
      expect(await parallelKernelsReady()).toBe(1);
      const before = splitJobCount();
      const two = studyBands(ps, req)!;
      expect(splitJobCount()).toBeGreaterThan(before);
      expect(two).toEqual(one);
    } finally {
      await stopParallelKernels();
    }
  });
});
