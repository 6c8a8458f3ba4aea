// The app's bundled example study is the sample shock file itself, byte for byte, and it is the two-phase study the
// README walks through: building the plant once, then operating it yearly.
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseShockCsv, SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME } from '../../../src/scenario/index.ts';

describe('the bundled example study', () => {
  it('is sample-data/fernhollow-food-plant.csv, in two phases of different timings', () => {
    expect(SAMPLE_SHOCK_CSV).toBe(readFileSync(join(import.meta.dirname, '..', '..', '..', 'sample-data', SAMPLE_SHOCK_FILE_NAME), 'utf8'));
    const s = parseShockCsv(SAMPLE_SHOCK_CSV, SAMPLE_SHOCK_FILE_NAME);
    expect(s.phases.map((p) => [p.name, p.timing, p.year, p.years])).toEqual([
      ['Building the plant', 'once', 2026, undefined], ['Operating the plant', 'annual', 2027, 20],
    ]);
  });
});
