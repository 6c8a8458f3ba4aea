// The table writer and the importer are inverse: writing and reading back gives the same numbers bit for bit,
// because numbers are written in ECMAScript's shortest round-trip form (ECMA-262 Number::toString) and read with
// correct rounding. Text cells follow RFC 4180 and the OWASP CSV-injection escape, which the importer undoes.
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { cleanLabel, importTable, matchKey, type IOTable } from '../../../src/table/index.ts';
import { writeTableCsv, writtenRoleMap } from '../../../src/table/write.ts';
import { SAMPLE_CSV } from '../../../src/table/sample.ts';

function same(a: IOTable, b: IOTable): void {
  expect(a.sectors).toEqual(b.sectors.map(cleanLabel));
  expect(Array.from(a.Z)).toEqual(Array.from(b.Z));
  expect(Array.from(a.x)).toEqual(Array.from(b.x));
  for (const k of ['labourIncome', 'otherValueAdded', 'imports', 'householdConsumption', 'otherFinalDemand'] as const) {
    expect(a[k].map((v) => [v.label, Array.from(v.values)])).toEqual(b[k].map((v) => [v.label, Array.from(v.values)]));
  }
  expect(a.employment ? Array.from(a.employment) : null).toEqual(b.employment ? Array.from(b.employment) : null);
  expect(a.moneyUnit).toBe(b.moneyUnit);
}

describe('writeTableCsv', () => {
  it('writes the sample back to exactly its own text', () => {
    const t = importTable(SAMPLE_CSV, { fileName: 'fernhollow-county.csv' });
    expect(writeTableCsv(t)).toBe(SAMPLE_CSV);
  });

  it('escapes formula-leading labels and reads them back unescaped', () => {
    const t = importTable(SAMPLE_CSV, { fileName: 's.csv' });
    const odd: IOTable = { ...t, sectors: ['=HYPERLINK("x")', '+SUM(A1)', '@cmd', '-minus', 'a;b', 'tab\there', ...t.sectors.slice(6)] };
    const text = writeTableCsv(odd);
    // A tab inside a label is white space: the label is written (and read) as 'tab here'.
    expect(text.split('\r\n')[0]).toContain(`,"'=HYPERLINK(""x"")",'+SUM(A1),'@cmd,'-minus,"a;b",tab here,`);
    same(importTable(text, { fileName: 'w.csv' }), odd);
  });

  // Awkward labels, including ones the role rules read as roles ("Imports", "Total", "Pay (sector)"): the writer must
  // make every one read back as the same sector or the same role, without a role map.
  const label = fc
    .oneof(
      fc.string({ unit: fc.constantFrom('a', 'B', 'z', ' ', ',', '"', ';', '\n', '=', '+', '-', '@', 'é', '€', '(', ')', '0', '7', '\u200b', 'e\u0301'), minLength: 1, maxLength: 8 }),
      fc.constantFrom('Imports', 'Import services', 'Households', 'Total', 'Total output', 'Wages', 'Employment', 'Pay', 'Other value added', 'Exports', 'x (sector)', 'Labour income', 'Jobs', 'Subtotal'),
    )
    .filter((s) => cleanLabel(s) !== '' && !s.startsWith("'"));
  const value = fc.oneof(
    fc.double({ min: 0, max: 1e300, noNaN: true, noDefaultInfinity: true }).map((v) => (v === 0 ? 0 : v)),
    fc.double({ min: 1e-300, max: 1, noNaN: true }),
    fc.integer({ min: 0, max: 10_000_000 }),
    fc.constant(0),
  );
  const positive = fc.double({ min: 1e-300, max: 1e300, noNaN: true });
  const tableArb = fc.integer({ min: 1, max: 6 }).chain((n) =>
    fc
      .record({
        labels: fc.uniqueArray(label, { minLength: n + 6, maxLength: n + 6, selector: (l) => matchKey(l) }),
        Z: fc.array(value, { minLength: n * n, maxLength: n * n }),
        x: fc.array(positive, { minLength: n, maxLength: n }),
        vecs: fc.array(fc.array(fc.oneof(value, value.map((v) => (v === 0 ? 0 : -v))), { minLength: n, maxLength: n }), { minLength: 5, maxLength: 5 }),
        employment: fc.option(fc.array(value, { minLength: n, maxLength: n }), { nil: null }),
        unit: fc.constantFrom('thousand dollars', 'million euros', 'money, "nominal"'),
      })
      .map(({ labels, Z, x, vecs, employment, unit }): IOTable => {
        const vec = (k: number) => ({ label: labels[n + k]!, values: Float64Array.from(vecs[k]!) });
        return {
          name: 'w',
          sectors: labels.slice(0, n),
          n,
          Z: Float64Array.from(Z),
          x: Float64Array.from(x),
          labourIncome: [vec(0)],
          otherValueAdded: [vec(1)],
          imports: [vec(2)],
          employment: employment ? Float64Array.from(employment) : null,
          householdConsumption: [vec(3)],
          otherFinalDemand: [vec(4)],
          moneyUnit: unit,
          layout: 'matrix',
          roles: { rows: {}, columns: {} },
          warnings: [],
        };
      }),
  );

  it('round-trips random tables bit for bit, without a role map (magnitudes 1e-300 to 1e300, awkward labels)', () => {
    fc.assert(
      fc.property(tableArb, (t) => {
        const text = writeTableCsv(t);
        const back = importTable(text, { fileName: 'w.csv', layout: 'matrix' });
        expect(back.sectors).toEqual(t.sectors.map(cleanLabel));
        expect(Array.from(back.Z)).toEqual(Array.from(t.Z));
        expect(Array.from(back.x)).toEqual(Array.from(t.x));
        expect(back.employment ? Array.from(back.employment) : null).toEqual(t.employment ? Array.from(t.employment) : null);
        const roles = writtenRoleMap(t);
        for (const k of ['labourIncome', 'otherValueAdded', 'imports', 'householdConsumption', 'otherFinalDemand'] as const) {
          expect(back[k].map((v) => Array.from(v.values))).toEqual(t[k].map((v) => Array.from(v.values)));
          const written = Object.entries(k === 'householdConsumption' || k === 'otherFinalDemand' ? roles.columns : roles.rows).filter(([, r]) => r === k).map(([l]) => l);
          expect(back[k].map((v) => v.label)).toEqual(written);
        }
        // Reading with the written role map gives the same table.
        const mapped = importTable(text, { fileName: 'w.csv', layout: 'matrix', roles });
        same(mapped, back);
      }),
      { numRuns: 300, seed: 4180 },
    );
  });
});
