// The bundled regional inputs (invented demo data) are the files in sample-data/, byte for byte, and work together.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import * as sample from '../../../src/regional/sample.ts';
import { regionalSampleModuleText } from '../../fixtures/regional/make-sample-module.ts';
import { importTable } from '../../../src/table/index.ts';
import { parseEmploymentCsv, parseGroupMapping, regionalize } from '../../../src/regional/index.ts';

const dir = join(import.meta.dirname, '../../../sample-data');
const read = (name: string) => readFileSync(join(dir, name), 'utf8');

describe('src/regional/sample.ts', () => {
  it('holds exactly the texts of sample-data/', () => {
    expect(sample.NATIONAL_SAMPLE_CSV).toBe(read('national-table.csv'));
    expect(sample.EMPLOYMENT_SAMPLE_CSV).toBe(read('fernhollow-employment.csv'));
    expect(sample.GROUPS_SAMPLE_CSV).toBe(read('fernhollow-groups.csv'));
    expect(sample.NATIONAL_SAMPLE_FILE_NAME).toBe('national-table.csv');
    expect(sample.EMPLOYMENT_SAMPLE_FILE_NAME).toBe('fernhollow-employment.csv');
  });

  it('is what its generator writes (regenerate it when sample-data changes)', () => {
    expect(readFileSync(join(import.meta.dirname, '../../../src/regional/sample.ts'), 'utf8')).toBe(regionalSampleModuleText());
  });

  it('the bundled inputs regionalize and group without refusal', () => {
    const t = importTable(sample.NATIONAL_SAMPLE_CSV, { fileName: sample.NATIONAL_SAMPLE_FILE_NAME });
    const r = regionalize(t, parseEmploymentCsv(sample.EMPLOYMENT_SAMPLE_CSV, sample.EMPLOYMENT_SAMPLE_FILE_NAME), { method: 'flq' });
    expect(r.sectors).toEqual(t.sectors);
    expect(parseGroupMapping(sample.GROUPS_SAMPLE_CSV, sample.GROUPS_SAMPLE_FILE_NAME).entries.length).toBe(t.n);
  });
});
