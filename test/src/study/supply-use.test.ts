// A study that starts from a supply and use pair: its source is the derived table's CSV, so it saves as a project and
// reopens with the same table, and the county estimate runs on it as on any national table (one pipeline: supply and
// use → symmetric → location quotients → RAS → grouping). Reference: the hand-worked pair (test/support/sut-pairs.ts;
// Z = D·U = [[18, 9], [7, 16]] under the fixed product sales structure, arithmetic in test/src/sut/hand-worked.test.ts).
import { describe, expect, it } from 'vitest';
import { createHash } from 'node:crypto';
import {
  assumptionOf, briefInputOf, buildReport, estimateCountyTable, prepareStudy, projectFileOf, runStudyScenario, studyFromProjectFile, studyFromSupplyUse,
  symmetricFromSupplyUse, utf8Bytes,
} from '../../../src/study/index.ts';
import { briefDocument } from '../../../src/deliverables/index.ts';
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

  it('names both files of the pair with their SHA-256 wherever the table\'s source hash appears: sidecars, project file, brief', () => {
    // SHA-256 by Node's crypto (OpenSSL), independent of the engine's own hash.
    const sha = (t: string) => createHash('sha256').update(t).digest('hex');
    const want = [{ role: 'supply', fileName: 'supply.csv', sha256: sha(SUPPLY) }, { role: 'use', fileName: 'use.csv', sha256: sha(USE) }];
    const { study, derived } = studyFromSupplyUse(req);
    expect(derived.sources).toEqual(want);
    expect(study.source?.derivedFrom).toEqual(want);
    for (const f of derived.reports.filter((r) => r.name.endsWith('.about.txt'))) {
      expect(f.content).toContain(`Supply table file: supply.csv\r\nSupply table SHA-256: ${sha(SUPPLY)}\r\nUse table file: use.csv\r\nUse table SHA-256: ${sha(USE)}`);
    }
    // The project file keeps them; the reopened study's reports and brief say them.
    const text = projectFileOf(study);
    expect(JSON.parse(text).source.derivedFrom).toEqual(want);
    const back = studyFromProjectFile(text, 'p.roundwise');
    expect(back.source?.derivedFrom).toEqual(want);
    back.scenarios = [{ name: 'Plant', phases: [{ name: 'Build', timing: 'once', lines: [{ sector: 'Industry A', amount: 10, kind: 'final-demand', localShare: 1 }] }] }];
    const ps = prepareStudy(back, { spectrum: false });
    expect(buildReport(ps, 'multipliers', { date: 'd' }).find((f) => f.name.endsWith('.about.txt'))!.content).toContain(`Use table SHA-256: ${sha(USE)}`);
    const brief = briefDocument(briefInputOf(ps, runStudyScenario(ps, back.scenarios[0]!), 'd'));
    expect(JSON.stringify(brief)).toContain(sha(SUPPLY));
    // A project without the key (every project before it) reads as before.
    const plain = JSON.parse(text);
    delete plain.source.derivedFrom;
    expect(studyFromProjectFile(JSON.stringify(plain), 'old.roundwise').source?.derivedFrom).toBeUndefined();
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
