// A study that starts from a supply and use pair: its source is the derived table's CSV, so it saves as a project and
// reopens with the same table, and the county estimate runs on it as on any national table (one pipeline: supply and
// use → symmetric → location quotients → RAS → grouping). Reference: the hand-worked pair (test/support/sut-pairs.ts;
// Z = D·U = [[18, 9], [7, 16]] under the fixed product sales structure, arithmetic in test/src/sut/hand-worked.test.ts).
import { describe, expect, it } from 'vitest';
import {
  assumptionOf, estimateCountyTable, projectFileOf, studyFromProjectFile, studyFromSupplyUse, symmetricFromSupplyUse, utf8Bytes,
} from '../../../src/study/index.ts';
import { parseEmploymentCsv, regionalize } from '../../../src/regional/index.ts';
import { refusal } from '../../support/refusal.ts';
import { SUPPLY, USE } from '../../support/sut-pairs.ts';

const req = { supply: { bytes: utf8Bytes(SUPPLY), fileName: 'supply.csv' }, use: { bytes: utf8Bytes(USE), fileName: 'use.csv' } };

describe('a study from supply and use tables', () => {
  it('has the derived table as its source, and a project of it reopens with the same numbers', () => {
    const { study } = studyFromSupplyUse(req);
    expect(study.source?.fileName).toBe('symmetric-table.csv');
    expect(Array.from(study.table.Z).map((v) => +v.toFixed(12))).toEqual([18, 9, 7, 16]);
    const back = studyFromProjectFile(projectFileOf(study), 'p.roundwise');
    expect(Array.from(back.table.Z)).toEqual(Array.from(study.table.Z));
    expect(back.table.sectors).toEqual(['Industry A', 'Industry B']);
  });

  it('the county estimate from the derived CSV is the location-quotient estimate of the derived table', () => {
    const d = symmetricFromSupplyUse(req);
    const jobs = 'sector,regional\nIndustry A,2\nIndustry B,3\n';
    const est = estimateCountyTable({ national: { bytes: utf8Bytes(d.csv), fileName: d.fileName }, employment: { bytes: utf8Bytes(jobs), fileName: 'jobs.csv' }, method: 'slq', delta: 0.3 });
    const direct = regionalize(d.table, parseEmploymentCsv(jobs, 'jobs.csv'), { method: 'slq', delta: 0.3 });
    expect(Array.from(est.regional.coefficients)).toEqual(Array.from(direct.coefficients));
    expect(Array.from(est.table.x)).toEqual(Array.from(direct.table.x));
  });

  it('picks the default assumption of each kind of table and refuses an assumption of the other kind', () => {
    expect(assumptionOf(undefined, undefined)).toBe('product-sales');
    expect(assumptionOf('product', undefined)).toBe('industry');
    expect(assumptionOf('product', 'product')).toBe('product');
    expect(refusal(() => assumptionOf('industry', 'industry')).message).toBe('the industry assumption gives a product-by-product table, not industry by industry; for industry by industry use product-sales or industry-sales');
  });
});
