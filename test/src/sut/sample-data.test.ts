// The invented sample pair and bridge files are the output of their generator, and the pair balances exactly.
import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { bridgeCsv, bridgeSampleModuleText, employmentByCodeCsv, sampleModuleText, supplyUseCsv } from '../../../sample-data/generate-supply-use.ts';
import { readSupplyUse } from '../../../src/sut/index.ts';

const read = (name: string) => readFileSync(join(import.meta.dirname, '../../../sample-data', name), 'utf8');

describe('sample supply and use pair', () => {
  it('national-supply.csv, national-use.csv, fernhollow-bridge.csv and fernhollow-employment-by-code.csv are the generator\'s output', () => {
    const { supply, use } = supplyUseCsv();
    expect(read('national-supply.csv')).toBe(supply);
    expect(read('national-use.csv')).toBe(use);
    expect(read('fernhollow-bridge.csv')).toBe(bridgeCsv());
    expect(read('fernhollow-employment-by-code.csv')).toBe(employmentByCodeCsv());
    expect(readFileSync(join(import.meta.dirname, '../../../src/sut/sample.ts'), 'utf8')).toBe(sampleModuleText());
    expect(readFileSync(join(import.meta.dirname, '../../../src/classification/sample.ts'), 'utf8')).toBe(bridgeSampleModuleText());
  });

  it('balances exactly: every product\'s use is its output, every industry\'s inputs and value added its output', () => {
    const s = readSupplyUse({ text: read('national-supply.csv'), fileName: 'national-supply.csv' }, { text: read('national-use.csv'), fileName: 'national-use.csv' }, { tolerance: 1e-12 });
    expect(s.balance.gap.every((g) => g === 0)).toBe(true);
    expect(s.warnings).toEqual([]);
    expect(s.products).toHaveLength(16);
  });
});
