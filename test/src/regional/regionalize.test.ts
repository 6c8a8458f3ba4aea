// Regionalization of a hand-balanced three-sector table: every regional figure is checked against arithmetic done
// by hand from the published formulas (Miller & Blair 2009, ch. 8; Flegg & Webber 1997), then the table identities.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { regionalize, parseEmploymentCsv, employmentTemplate, REGIONAL_IMPORT_LABEL, type EmploymentInput } from '../../../src/regional/index.ts';
import { coefficients, prepareModel, solveOpenTransposed } from '../../../src/model/index.ts';
import { formatLocated } from '../../../src/diagnostics/index.ts';
import { THREE, buildTable, expectClose } from './build-table.ts';
import { refusal } from '../../support/refusal.ts';
import { seededC } from '../../support/random.ts';
import { randomFlows } from '../../support/random-tables.ts';

const EMP_CSV = 'sector,regional,national\nFarming,20,100\nMaking,10,200\nServices,70,700\n';
const emp = (csv = EMP_CSV): EmploymentInput => parseEmploymentCsv(csv, 'emp.csv');

describe('SLQ regional table (hand computation)', () => {
  const res = regionalize(THREE, emp(), { method: 'slq' });
  it('SLQ and regional coefficients r_ij = a_ij·min(SLQ_i, 1)', () => {
    expectClose(res.slq, [2, 0.5, 1]);
    // A = Z/x: columns /200, /300, /400; row 2 halved (SLQ 0.5), rows 1 and 3 kept
    expectClose(res.coefficients, [0.05, 20 / 300, 0.075, 0.1, 5 / 300, 0.025, 0.1, 0.1, 0.1]);
    expect(res.lambda).toBeNull();
    expect(res.absent).toEqual([]);
  });
  it('county output x^R = x^N·E^R/E^N, flows Z^R = r·x^R', () => {
    expectClose(res.table.x, [40, 15, 40]);
    expectClose(res.table.Z, [2, 1, 3, 4, 0.25, 1, 4, 1.5, 4]);
  });
  it('import leakage Σ_i (a_ij − r_ij) per unit and in money', () => {
    expectClose(res.leakage, [0.1, 1 / 60, 0.025]);
    expectClose(res.leakageValue, [4, 0.25, 1]);
    const row = res.table.imports.find((v) => v.label === REGIONAL_IMPORT_LABEL)!;
    expectClose(row.values, [4, 0.25, 1]);
  });
  it('labour income, other value added, national imports and employment keep their coefficients', () => {
    expectClose(res.table.labourIncome[0]!.values, [12, 6, 15]);
    expectClose(res.table.otherValueAdded[0]!.values, [10, 4, 10]);
    expectClose(res.table.imports[0]!.values, [4, 2, 6]);
    expectClose(res.table.employment!, [20, 10, 70]);
  });
  it('household consumption per unit of income regionalized with min(SLQ, 1); the rest is exports and other final demand', () => {
    // c^N = (80, 100, 150), county/national income 33/330 = 0.1
    expectClose(res.table.householdConsumption[0]!.values, [8, 5, 15]);
    expectClose(res.table.otherFinalDemand[0]!.values, [26, 4.75, 15.5]);
  });
  it('the regional table balances: columns and rows both sum to county output', () => {
    const t = res.table;
    for (let j = 0; j < t.n; j++) {
      let col = 0;
      for (let i = 0; i < t.n; i++) col += t.Z[i * t.n + j]!;
      for (const v of [...t.labourIncome, ...t.otherValueAdded, ...t.imports]) col += v.values[j]!;
      expect(col).toBeCloseTo(t.x[j]!, 12);
      let row = 0;
      for (let k = 0; k < t.n; k++) row += t.Z[j * t.n + k]!;
      for (const v of [...t.householdConsumption, ...t.otherFinalDemand]) row += v.values[j]!;
      expect(row).toBeCloseTo(t.x[j]!, 12);
    }
  });
  it('analysing the regional table recovers the regional coefficients (Miller & Blair 2009, §2.2: a_ij = z_ij/x_j)', () => {
    expectClose(coefficients(res.table).A, res.coefficients);
  });
});

describe('CILQ and FLQ regional coefficients (hand computation)', () => {
  it('CILQ: min(CILQ,1) = [[1,1,1],[.25,.5,.5],[.5,1,1]]', () => {
    const res = regionalize(THREE, emp(), { method: 'cilq' });
    expectClose(res.coefficients, [0.05, 20 / 300, 0.075, 0.2 * 0.25, (10 / 300) * 0.5, 0.05 * 0.5, 0.1 * 0.5, 0.1, 0.1]);
  });
  it('FLQ with δ = 0.3: λ* = 0.5514347723323603 (Python math, independent), min(λ*·CILQ, 1)', () => {
    const res = regionalize(THREE, emp(), { method: 'flq' });
    const l = 0.5514347723323603;
    expect(res.lambda).toBeCloseTo(l, 14);
    expect(res.delta).toBe(0.3);
    // λ*·CILQ = λ*·[[2,4,2],[.25,.5,.5],[.5,2,1]]: the first row and entry (3,2) exceed 1 and are capped
    expectClose(res.coefficients, [0.05, 20 / 300, 0.075, 0.2 * 0.25 * l, (10 / 300) * 0.5 * l, 0.05 * 0.5 * l, 0.1 * 0.5 * l, 0.1, 0.1 * l], 1e-13);
  });
  it('FLQ with δ = 0 equals CILQ (λ* = 1)', () => {
    const a = regionalize(THREE, emp(), { method: 'flq', delta: 0 });
    const b = regionalize(THREE, emp(), { method: 'cilq' });
    expectClose(a.coefficients, b.coefficients, 0);
  });
});

describe('absent sectors', () => {
  it('a sector with no county jobs has a zero row, zero output, and is reported', () => {
    const res = regionalize(THREE, emp('sector,regional,national\nFarming,20,100\nMaking,0,200\nServices,70,700\n'), { method: 'flq' });
    expect(res.absent).toEqual(['Making']);
    expect(Array.from(res.coefficients.subarray(3, 6))).toEqual([0, 0, 0]);
    expect(res.table.x[1]).toBe(0);
    expect(Array.from(res.table.Z.subarray(3, 6))).toEqual([0, 0, 0]);
    expect(res.table.householdConsumption[0]!.values[1]).toBe(0);
    expect(res.notes.some((n) => n.includes('Making'))).toBe(true);
  });
});

describe('the national column may come from the table', () => {
  it('a two-column employment file uses the table employment row', () => {
    const a = regionalize(THREE, emp('sector,regional\nFarming,20\nMaking,10\nServices,70\n'), { method: 'cilq' });
    const b = regionalize(THREE, emp(), { method: 'cilq' });
    expectClose(a.coefficients, b.coefficients, 0);
  });
  it('a national column that disagrees with the table row is used, with a located warning', () => {
    const res = regionalize(THREE, emp('sector,regional,national\nFarming,20,100\nMaking,10,250\nServices,70,700\n'), { method: 'slq' });
    const w = res.warnings.find((x) => x.code === 'employment-national-differs')!;
    expect(w.location).toMatchObject({ file: 'emp.csv', line: 3, rowLabel: 'Making' });
  });
});

describe('refusals, each with its location', () => {
  const cases: [string, string, RegExp, object][] = [
    ['an employment label not in the table', 'sector,regional,national\nFarming,20,100\nMakeing,10,200\nServices,70,700\n', /not a sector of the national table/, { file: 'emp.csv', line: 3, column: 1, rowLabel: 'Makeing' }],
    ['negative jobs', 'sector,regional,national\nFarming,20,100\nMaking,-1,200\nServices,70,700\n', /must not be negative/, { line: 3, column: 2, rowLabel: 'Making' }],
    ['non-numeric jobs', 'sector,regional,national\nFarming,20,100\nMaking,10,lots\nServices,70,700\n', /'lots' are not a number/, { line: 3, column: 3, rowLabel: 'Making' }],
    ['county jobs above national', 'sector,regional,national\nFarming,20,100\nMaking,10,200\nServices,701,700\n', /exceed national jobs/, { line: 4, column: 2, rowLabel: 'Services' }],
    ['all-zero county employment', 'sector,regional,national\nFarming,0,100\nMaking,0,200\nServices,0,700\n', /zero in every sector/, { file: 'emp.csv' }],
    ['a table sector missing from the file', 'sector,regional,national\nFarming,20,100\nServices,70,700\n', /no line for sector 'Making'/, { rowLabel: 'Making' }],
    ['a sector listed twice', 'sector,regional,national\nFarming,20,100\nMaking,10,200\nFarming,70,700\n', /listed twice \(first on line 2\)/, { line: 4, rowLabel: 'Farming' }],
    ['zero national jobs for a producing sector', 'sector,regional,national\nFarming,0,0\nMaking,10,200\nServices,70,700\n', /output per job cannot be computed/, { line: 2, column: 3 }],
  ];
  for (const [what, csv, msg, loc] of cases) {
    it(what, () => {
      const e = refusal(() => regionalize(THREE, emp(csv), { method: 'slq' }));
      expect(e.message).toMatch(msg);
      expect(e.location).toMatchObject(loc);
      expect(formatLocated(e)).not.toMatch(/\n|NaN|undefined/);
    });
  }
  for (const delta of [-0.1, 1.5, Number.NaN]) {
    it(`δ = ${delta} outside [0, 1]`, () => {
      const m = refusal(() => regionalize(THREE, emp(), { method: 'flq', delta })).message;
      expect(m).toMatch(/δ must lie between 0 and 1/);
      expect(m).not.toMatch(/NaN/);
    });
  }
  it('no national column and no employment row in the table', () => {
    const t = { ...THREE, employment: null };
    const e = refusal(() => regionalize(t, emp('sector,regional\nFarming,20\nMaking,10\nServices,70\n'), { method: 'slq' }));
    expect(e.location).toMatchObject({ line: 2, rowLabel: 'Farming' });
  });
});

describe('properties on random tables', () => {
  it('r_ij ≤ a_ij, FLQ ≤ CILQ coefficients, λ* in (0,1], and the regional table balances', () => {
    fc.assert(
      fc.property(fc.integer({ min: 2, max: 7 }), fc.integer({ min: 1, max: 2 ** 31 - 1 }), fc.double({ min: 0, max: 1, noNaN: true }), (n, seed, delta) => {
        const rnd = seededC(seed);
        const { sectors, Z, col, row, x } = randomFlows(n, rnd, { scale: 1, base: 50 });
        const labour = x.map((v, j) => (v - col[j]!) / 2);
        const otherVA = x.map((v, j) => (v - col[j]!) / 4);
        const imports = x.map((v, j) => (v - col[j]!) / 4);
        const households = x.map((v, i) => (v - row[i]!) / 2);
        const otherFD = x.map((v, i) => (v - row[i]!) / 2);
        const national = sectors.map(() => 1 + Math.floor(rnd() * 1000));
        const regional = national.map((v) => (rnd() < 0.2 ? 0 : Math.floor(rnd() * v)));
        if (!regional.some((v) => v > 0)) regional[0] = 1;
        const t = buildTable({ sectors, Z, x, labour, otherVA, imports, households, otherFD, employment: national });
        const csv = sectors.map((l, i) => `${l},${regional[i]},${national[i]}`).join('\n');
        const e = parseEmploymentCsv(csv, 'e.csv');
        const cilq = regionalize(t, e, { method: 'cilq' });
        const flq = regionalize(t, e, { method: 'flq', delta });
        expect(flq.lambda!).toBeGreaterThan(0);
        expect(flq.lambda!).toBeLessThanOrEqual(1);
        for (const res of [regionalize(t, e, { method: 'slq' }), cilq, flq]) {
          for (let k = 0; k < n * n; k++) expect(res.coefficients[k]!).toBeLessThanOrEqual(res.nationalCoefficients[k]!);
          const rt = res.table;
          for (let j = 0; j < n; j++) {
            let c = 0;
            for (let i = 0; i < n; i++) c += rt.Z[i * n + j]!;
            for (const v of [...rt.labourIncome, ...rt.otherValueAdded, ...rt.imports]) c += v.values[j]!;
            expect(Math.abs(c - rt.x[j]!)).toBeLessThanOrEqual(1e-9 * Math.max(1, rt.x[j]!));
          }
        }
        for (let k = 0; k < n * n; k++) expect(flq.coefficients[k]!).toBeLessThanOrEqual(cilq.coefficients[k]!);
        // 0 ≤ R ≤ A with ρ(A) < 1 gives (I − R)⁻¹ ≤ (I − A)⁻¹ entrywise (Neumann series I + R + R² + … term by term):
        // a county's output multipliers never exceed the nation's
        const ones = new Float64Array(n).fill(1);
        const nationalM = solveOpenTransposed(prepareModel(t), ones);
        const regionalM = solveOpenTransposed(prepareModel({ ...t, Z: Float64Array.from(flq.coefficients, (r, k) => r * t.x[k % n]!) }), ones);
        for (let j = 0; j < n; j++) {
          expect(regionalM[j]!).toBeGreaterThanOrEqual(1 - 1e-12);
          expect(regionalM[j]!).toBeLessThanOrEqual(nationalM[j]! * (1 + 1e-12));
        }
      }),
      { numRuns: 150 },
    );
  });
});

describe('employment file reading', () => {
  it('a header is optional; a first data row with one bad number is refused at line 1, not taken for a header', () => {
    expect(parseEmploymentCsv('Farming,20,100\nMaking,10,200\nServices,70,700\n', 'e.csv').entries).toHaveLength(3);
    const e = refusal(() => parseEmploymentCsv('Farming,2O,100\nMaking,10,200\n', 'e.csv'));
    expect(e.location).toMatchObject({ line: 1, column: 2, rowLabel: 'Farming' });
  });
  it('semicolons, CRLF, a BOM and quoted labels are read; lines are counted across blank lines', () => {
    const e = parseEmploymentCsv('\uFEFFsector;regional;national\r\n\r\n"Farming";20;100\r\nMaking;10;200\r\n', 'e.csv');
    expect(e.entries.map((x) => [x.sector, x.line])).toEqual([['Farming', 3], ['Making', 4]]);
  });
  it('an empty file, a file with only a header', () => {
    expect(refusal(() => parseEmploymentCsv('', 'e.csv')).message).toMatch(/empty/);
    expect(refusal(() => parseEmploymentCsv('sector,regional,national\n', 'e.csv')).message).toMatch(/no sectors/);
  });
});

describe('negative exports and other final demand', () => {
  it('is warned about, located at the sector: local use 0.8·40 exceeds county output 20 (hand computation)', () => {
    // A sells 80 % of B's output value to B; the county has A's jobs at twice the national share and B's at four times
    const t = buildTable({ sectors: ['A', 'B', 'C'], Z: [[0, 80, 0], [0, 0, 0], [0, 0, 0]], x: [100, 100, 100], labour: [100, 20, 100], otherFD: [20, 100, 100], employment: [100, 100, 800] });
    const res = regionalize(t, parseEmploymentCsv('A,20,100\nB,40,100\nC,0,800\n', 'e.csv'), { method: 'slq' });
    expectClose(res.table.otherFinalDemand[0]!.values, [20 - 32, 40, 0]);
    const w = res.warnings.find((x) => x.code === 'regional-negative-final-demand')!;
    expect(w.location).toMatchObject({ rowLabel: 'A', columnLabel: 'Exports and other final demand' });
    expect(w.message).toMatch(/negative \(-12 million dollars\)/);
    expect(res.absent).toEqual(['C']);
  });
});

describe('files that are not employment CSVs', () => {
  it('binary content is refused before parsing', () => {
    expect(refusal(() => parseEmploymentCsv('PK\u0003\u0004\u0000\u0000junk', 'e.csv')).message).toMatch(/binary/);
  });
});

describe('employment template', () => {
  it('lists every sector with national jobs from the table and reads back once the county column is filled', () => {
    const text = employmentTemplate(THREE);
    expect(text).toBe('sector,regional,national\r\nFarming,,100\r\nMaking,,200\r\nServices,,700\r\n');
    const filled = text.replace('Farming,,', 'Farming,20,').replace('Making,,', 'Making,10,').replace('Services,,', 'Services,70,');
    expectClose(regionalize(THREE, parseEmploymentCsv(filled, 'e.csv'), { method: 'slq' }).slq, [2, 0.5, 1]);
    expect(refusal(() => parseEmploymentCsv(text, 'e.csv')).location).toMatchObject({ line: 2, column: 2, rowLabel: 'Farming' });
  });
});
