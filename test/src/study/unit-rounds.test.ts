// The table's own spending rounds (unitDemandRounds) read A·1, A²·1, … formed on the analysis's Perron passes
// (src/model/powers.ts) instead of forming them again: the same rounds, bit for bit, as formed product by product.
import { describe, expect, it } from 'vitest';
import { powersOfOnes } from '../../../src/model/index.ts';
import { spendingRounds } from '../../../src/scenario/index.ts';
import { prepareStudy, studyFromTableFile, unitDemandRounds, utf8Bytes, SAMPLE_CSV, SAMPLE_FILE_NAME } from '../../../src/study/index.ts';
import { denseTableCsv } from '../../support/random-tables.ts';

describe('the unit spending rounds', () => {
  for (const [name, csv, file] of [['the sample county', SAMPLE_CSV, SAMPLE_FILE_NAME], ['an invented 60-sector table', denseTableCsv(60), 'invented-60.csv']] as const) {
    it(`are the rounds formed product by product (${name})`, () => {
      const ps = prepareStudy(studyFromTableFile(utf8Bytes(csv), file), { spectrum: false });
      const got = unitDemandRounds(ps);
      const { n, A } = ps.pm.coef;
      expect(powersOfOnes(A).length).toBeGreaterThan(1); // formed by the analysis, so read
      const x = Float64Array.from(ps.analysis.linkages.rowSums as number[]);
      const formed = spendingRounds(ps.pm, new Float64Array(n).fill(1), x, { maxRounds: ps.study.settings.rounds.maxRounds, perronRoot: ps.analysis.viability.perronRoot });
      expect(got.rounds).toEqual(formed);
    });
  }
});
