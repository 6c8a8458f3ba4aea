// previewTable never throws: for any text it returns what it found and, for bad input, a located refusal.
// Mutations of a valid table either import or are refused with an InputError (never another exception).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { importTable, previewTable } from '../../../src/table/index.ts';
import { InputError } from '../../../src/diagnostics/index.ts';
import { BASE, replaceOnce } from './helpers.ts';

describe('previewTable', () => {
  it('reports layout, sectors, roles and the balance of a good table', () => {
    const p = previewTable(BASE, { fileName: 't.csv' });
    expect(p.ok).toBe(true);
    expect(p.layout).toBe('matrix');
    expect(p.delimiter).toBe(',');
    expect(p.decimalMark).toBe('.');
    expect(p.sectors).toEqual(['Farming', 'Mills', 'Services']);
    expect(p.rows.map((r) => [r.label, r.role])).toEqual([
      ['Farming', 'sector'], ['Mills', 'sector'], ['Services', 'sector'],
      ['Compensation of employees', 'labourIncome'], ['Other value added', 'otherValueAdded'], ['Imports', 'imports'],
      ['Employment (jobs)', 'employment'], ['Total input', 'totalInput'],
    ]);
    expect(p.columns.map((c) => [c.label, c.role, c.location.column])).toEqual([
      ['Farming', 'sector', 2], ['Mills', 'sector', 3], ['Services', 'sector', 4],
      ['Households', 'householdConsumption', 5], ['Exports', 'otherFinalDemand', 6], ['Total output', 'totalOutput', 7],
    ]);
    expect(p.balance).toMatchObject({ balanced: true, outputSource: 'total output column', output: [100, 200, 150], sales: [100, 200, 150], purchases: [100, 200, 150], statedTotalInput: [100, 200, 150], worst: [] });
    expect(p.table?.n).toBe(3);
    expect(p.refusal).toBeNull();
  });
  it('keeps what it learned before a refusal', () => {
    const p = previewTable(replaceOnce(BASE, 'Mills,15,20', 'Mills,15,-20'), { fileName: 't.csv' });
    expect(p.ok).toBe(false);
    expect(p.table).toBeNull();
    expect(p.layout).toBe('matrix');
    expect(p.sectors).toEqual(['Farming', 'Mills', 'Services']);
    expect(p.rows.length).toBe(8);
    expect(p.refusal).toEqual({
      code: 'negative-flow',
      message: 'negative intermediate flow -20 (allow negative flows to accept it)',
      formatted: "t.csv:3:3 (row 'Mills', column 'Mills'): negative intermediate flow -20 (allow negative flows to accept it)",
      location: { file: 't.csv', line: 3, column: 3, rowLabel: 'Mills', columnLabel: 'Mills' },
    });
  });
  it('reports an unbalanced table in the balance report', () => {
    const p = previewTable(replaceOnce(BASE, 'Imports,15,20,10', 'Imports,15,30,10'), { fileName: 't.csv' });
    expect(p.ok).toBe(true);
    expect(p.balance?.balanced).toBe(false);
    expect(p.balance?.worst).toEqual([{ sector: 'Mills', kind: 'column', gap: 10 / 210 }]);
    expect(p.warnings.map((w) => w.code)).toEqual(['column-total-mismatch']);
  });
  it('never throws on arbitrary text', () => {
    fc.assert(
      fc.property(fc.string({ unit: fc.constantFrom('a', '1', ',', ';', '\t', '\n', '\r', '"', ' ', '.', '-', 'e', 'Total', '\u0000', '\ufeff'), maxLength: 60 }), (s) => {
        const p = previewTable(s, { fileName: 'r.csv' });
        expect(p.ok === (p.refusal === null)).toBe(true);
        if (p.refusal) {
          expect(p.refusal.code).not.toBe('internal');
          expect(p.refusal.formatted.startsWith('r.csv')).toBe(true);
        }
      }),
      { numRuns: 2000, seed: 8 },
    );
  });
  it('mutations of a valid table import or are refused with an InputError', () => {
    const cells = BASE.trimEnd().split('\n').map((l) => l.split(','));
    const mutation = fc.record({
      r: fc.integer({ min: 0, max: cells.length - 1 }),
      c: fc.integer({ min: 0, max: 6 }),
      v: fc.constantFrom('', 'x', '-1', '1e400', 'NaN', '0', '1e-300', '1e300', 'Farming', 'Total', '"', '1,5', '1.000,5'),
      drop: fc.option(fc.integer({ min: 0, max: cells.length - 1 }), { nil: null }),
      delim: fc.constantFrom(',', ';', '\t'),
    });
    fc.assert(
      fc.property(fc.array(mutation, { minLength: 1, maxLength: 4 }), (ms) => {
        const grid = cells.map((r) => [...r]);
        let delim = ',';
        for (const m of ms) {
          if (grid[m.r] && m.c < grid[m.r]!.length) grid[m.r]![m.c] = m.v;
          if (m.drop !== null && grid.length > 1) grid.splice(m.drop, 1);
          delim = m.delim;
        }
        const text = grid.map((r) => r.join(delim)).join('\n');
        try {
          const t = importTable(text, { fileName: 'm.csv' });
          for (const v of [...t.Z, ...t.x]) expect(Number.isFinite(v)).toBe(true);
        } catch (e) {
          expect(e).toBeInstanceOf(InputError);
        }
      }),
      { numRuns: 1000, seed: 15 },
    );
  });
});
