// Coefficients computed over the flows (coefficientsOverFlows) are coefficients() bit for bit, in the flows' own buffer,
// and the table is left without flows that could be read by mistake.
import { describe, it, expect } from 'vitest';
import { coefficients, coefficientsOverFlows } from '../../../src/model/coefficients.ts';
import { randomEconomy } from '../../support/coefficient-tables.ts';

describe('coefficientsOverFlows', () => {
  for (const n of [1, 7, 40]) {
    it(`n=${n}: the same numbers as coefficients(), where Z was; Z is gone`, () => {
      // Sector 1 without output: its column of A is zero (as coefficients() makes it).
      const ref = randomEconomy(n, 900 + n);
      ref.x[0] = 0;
      const expected = coefficients(ref);
      const t = randomEconomy(n, 900 + n);
      t.x[0] = 0;
      const flows = t.Z;
      const c = coefficientsOverFlows(t);
      expect(c.A).toBe(flows);
      expect(Array.from(c.A)).toEqual(Array.from(expected.A));
      for (const k of ['h', 'otherVA', 'imports', 'householdConsumption'] as const) expect(Array.from(c[k])).toEqual(Array.from(expected[k]));
      expect(c.householdIncomeTotal).toBe(expected.householdIncomeTotal);
      expect(() => t.Z).toThrow(/flows were turned into its coefficients/);
    });
  }
});
