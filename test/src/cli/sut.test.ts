// `roundwise sut` in process: JSON keys and coefficients, the files --out writes and that the other commands read them,
// the choice of transformation, refusals. Reference values: the 2×2 pair worked by hand in
// test/src/sut/hand-worked.test.ts (arithmetic shown there, Miller & Blair 2009 ch. 5 formulas), and the sample pair,
// built so that the product technology holds exactly before rounding (sample-data/generate-supply-use.ts: U = A·Vᵀ),
// whose product-technology table must therefore be the national table it was built from (the defining identity of
// Eurostat 2008 model A: A = U·(Vᵀ)⁻¹).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mkdtempSync, readFileSync, readdirSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { createHash } from 'node:crypto';
import { join } from 'node:path';
import Papa from 'papaparse';
import { importTable } from '../../../src/table/index.ts';
import { coefficients } from '../../../src/model/index.ts';
import { runCli } from '../../support/cli.ts';
import { SUPPLY, USE } from '../../support/sut-pairs.ts';

let dir: string;
const cli = (...args: string[]) => runCli(['sut', ...args]);
const p = (name: string) => join(dir, name);

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'rw-sut-'));
  writeFileSync(p('supply.csv'), SUPPLY);
  writeFileSync(p('use.csv'), USE);
  writeFileSync(p('use-off.csv'), USE.replace('Product b,5,15,30', 'Product b,5,15,40'));
  // Industry B uses no product a: the product technology gives one negative flow (-20/9 from a to b; hand-worked test).
  writeFileSync(p('use-neg.csv'), ['million crowns,Industry A,Industry B,Households', 'Product a,20,0,80', 'Product b,5,25,20', 'Compensation of employees,40,20,', 'Other value added,25,15,'].join('\n'));
  writeFileSync(p('employment.csv'), 'sector,regional\nIndustry A,2\nIndustry B,3\n');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe('roundwise sut --json', () => {
  it('names both files of the pair with their SHA-256 in the summary and the JSON', async () => {
    // SHA-256 by Node's crypto (OpenSSL), independent of the engine's own hash.
    const sha = (t: string) => createHash('sha256').update(t).digest('hex');
    const j = await cli(p('supply.csv'), p('use.csv'), '--json');
    expect(j.code, j.err).toBe(0);
    expect(JSON.parse(j.out).sources).toEqual([{ role: 'supply', fileName: p('supply.csv'), sha256: sha(SUPPLY) }, { role: 'use', fileName: p('use.csv'), sha256: sha(USE) }]);
    const s = await cli(p('supply.csv'), p('use.csv'));
    expect(s.out).toContain(`Supply table SHA-256: ${sha(SUPPLY)}\n`);
    expect(s.out).toContain(`Use table SHA-256: ${sha(USE)}\n`);
  });

  it('prints sectors, A (row-major) and the notes; by default the fixed product sales structure, industry by industry', async () => {
    const r = await cli(p('supply.csv'), p('use.csv'), '--json');
    expect(r.code, r.err).toBe(0);
    const j = JSON.parse(r.out);
    expect(j.sectors).toEqual(['Industry A', 'Industry B']);
    expect(j.by).toBe('industry');
    expect(j.assumption).toBe('product-sales');
    // Hand-worked: Z = D·U = [[18, 9], [7, 16]], g = (90, 60), so A = [[18/90, 9/60], [7/90, 16/60]].
    const A = [[18 / 90, 9 / 60], [7 / 90, 16 / 60]];
    j.A.forEach((row: number[], i: number) => row.forEach((v, k) => expect(Math.abs(v - A[i]![k]!)).toBeLessThan(1e-15)));
    expect(j.notes.join(' ')).toMatch(/fixed product sales structure assumption \(Eurostat model D\).*Manual of Supply, Use and Input-Output Tables, 2008/);
    expect(j.cautions.length).toBeGreaterThan(3);
  });

  it('--by product takes the industry technology; an assumption that gives the other kind of table is a usage error', async () => {
    const j = JSON.parse((await cli(p('supply.csv'), p('use.csv'), '--by', 'product', '--json')).out);
    expect(j.assumption).toBe('industry');
    expect(j.sectors).toEqual(['Product a', 'Product b']);
    // Hand-worked: Z = U·ĝ⁻¹·V = [[65/3, 25/3], [7.5, 12.5]], q = (100, 50).
    expect(Math.abs(j.A[0][1] - 25 / 3 / 50)).toBeLessThan(1e-15);
    const bad = await cli(p('supply.csv'), p('use.csv'), '--by', 'industry', '--assumption', 'product');
    expect(bad.code).toBe(1);
    expect(bad.err.split('\n')[0]).toBe('roundwise sut: --assumption product gives a product-by-product table, not --by industry');
  });

  it('reports the negatives of the product technology, and --negatives zero-ras removes them', async () => {
    const kept = JSON.parse((await cli(p('supply.csv'), p('use-neg.csv'), '--assumption', 'product', '--json')).out);
    expect(kept.negatives.flows).toBe(1);
    expect(kept.negatives.largest[0]).toMatchObject({ row: 'Product a', column: 'Product b' });
    expect(kept.A[0][1]).toBeLessThan(0);
    expect(kept.notes.join(' ')).toMatch(/1 negative intermediate flow/);
    const fixed = JSON.parse((await cli(p('supply.csv'), p('use-neg.csv'), '--assumption', 'product', '--negatives', 'zero-ras', '--json')).out);
    expect(fixed.A.flat().every((v: number) => v >= 0)).toBe(true);
  });
});

describe('roundwise sut --out', () => {
  it('writes symmetric-table.csv that analyze and regionalize read, and the transformation report, each with an .about.txt', async () => {
    const out = p('out');
    const r = await cli(p('supply.csv'), p('use.csv'), '--out', out);
    expect(r.code, r.err).toBe(0);
    expect(readdirSync(out).sort()).toEqual(['symmetric-table.about.txt', 'symmetric-table.csv', 'transformation.about.txt', 'transformation.csv']);
    expect(readFileSync(join(out, 'symmetric-table.about.txt'), 'utf8')).toMatch(/Model: industry-by-industry table, fixed product sales structure/);
    const report = Papa.parse<Record<string, unknown>>(readFileSync(join(out, 'transformation.csv'), 'utf8').replace(/^\uFEFF/, ''), { header: true, dynamicTyping: true, skipEmptyLines: true }).data;
    // Industry A: output 90, intermediate inputs 18 + 7 = 25, value added 40 + 25 = 65, final demand 63 (hand-worked).
    expect(report[0]).toMatchObject({ Industry: 'Industry A', 'Total output (million crowns)': 90, 'Value added (million crowns)': 65, 'Final demand (million crowns)': 63, Jobs: 10 });
    expect(report[0]!['Intermediate inputs (million crowns)'] as number).toBeCloseTo(25, 12);
    const analyzed = await runCli(['analyze', join(out, 'symmetric-table.csv'), '--json']);
    expect(analyzed.code, analyzed.err).toBe(0);
    expect(JSON.parse(analyzed.out).sectors).toEqual(['Industry A', 'Industry B']);
    const county = await runCli(['regionalize', join(out, 'symmetric-table.csv'), '--employment', p('employment.csv'), '--method', 'slq', '--json']);
    expect(county.code, county.err).toBe(0);
    expect(JSON.parse(county.out).sectors).toEqual(['Industry A', 'Industry B']);
  });

  it('the sample pair under the product technology gives back the national table it was built from (up to rounding)', async () => {
    const out = p('sample');
    const r = await cli('sample-data/national-supply.csv', 'sample-data/national-use.csv', '--assumption', 'product', '--out', out);
    expect(r.code, r.err).toBe(0);
    const derived = importTable(readFileSync(join(out, 'symmetric-table.csv'), 'utf8'), { fileName: 'symmetric-table.csv', allowNegative: true });
    const national = importTable(readFileSync('sample-data/national-table.csv', 'utf8'), { fileName: 'national-table.csv' });
    expect(derived.sectors).toEqual(national.sectors);
    expect(Array.from(derived.x)).toEqual(Array.from(national.x));
    const a = coefficients(derived).A;
    const b = coefficients(national).A;
    // U was rounded to whole million dollars: a coefficient moves by at most about 0.5/x of its buyer (x ≥ 39 968) per cell.
    let worst = 0;
    a.forEach((v, k) => { worst = Math.max(worst, Math.abs(v - b[k]!)); });
    expect(worst).toBeLessThan(1e-4);
  });
});

describe('roundwise sut refusals', () => {
  it('a pair whose products disagree exits 2 with one located line naming the worst product', async () => {
    const r = await cli(p('supply.csv'), p('use-off.csv'));
    expect(r.code).toBe(2);
    expect(r.err).toBe(`roundwise sut: ${p('use-off.csv')} (row 'Product b'): supply and use disagree beyond 0.1 % in 1 product: total use does not equal domestic output; worst: 'Product b' +16.67 % (a wider tolerance accepts small rounding gaps)\n`);
    expect((await cli(p('supply.csv'), p('use-off.csv'), '--tolerance', '0.2')).code).toBe(0);
  });

  it('a role map with an unknown supply role exits 2 at its line', async () => {
    writeFileSync(p('map.json'), '{\n  "supply": {"Industry B": "exports"}\n}\n');
    const r = await cli(p('supply.csv'), p('use.csv'), '--map', p('map.json'));
    expect(r.code).toBe(2);
    expect(r.err).toMatch(/^roundwise sut: .*map\.json:2:\d+: unknown supply-table role for 'Industry B'/);
  });
});
