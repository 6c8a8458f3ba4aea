// Screen number formatting: locale grouping from Intl.NumberFormat itself, and never NaN or Infinity on screen.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DASH, fmt, fmtCompact, fmtMoney, fmtRatio, fmtPercent, fmtSig, type NumberStyle } from '../../renderer/format/number.ts';
import { parseMoneyUnit, perMoneyUnits } from '../../renderer/format/money-unit.ts';

const STYLES: NumberStyle[] = ['money', 'ratio', 'jobs', 'percent', 'int', 'sig'];

describe('number formatting for the screen', () => {
  it('groups thousands the way the runtime locale does (Intl.NumberFormat is the reference)', () => {
    const ref = new Intl.NumberFormat(undefined, { minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(1234567.25);
    expect(fmtMoney(1234567.25).text).toBe(ref);
    expect(fmtRatio(2.345678).text).toBe(new Intl.NumberFormat(undefined, { minimumFractionDigits: 4, maximumFractionDigits: 4 }).format(2.345678));
  });

  it('shows a dash with a reason for missing values, never NaN or Infinity', () => {
    for (const s of STYLES) {
      for (const v of [null, undefined, Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
        const out = fmt(s, v as number | null, 'no household closure');
        expect(out.text).toBe(DASH);
        expect(out.reason).toBeTruthy();
      }
    }
    expect(fmt('ratio', null, 'no household closure').reason).toBe('no household closure');
  });

  it('never prints NaN or Infinity for any double', () => {
    fc.assert(fc.property(fc.double(), fc.constantFrom(...STYLES), (v, s) => {
      const t = fmt(s, v).text;
      return !/NaN|Infinity|∞/.test(t);
    }));
  });

  it('does not show minus zero', () => {
    expect(fmtMoney(-0).text).toBe(fmtMoney(0).text);
    expect(fmtPercent(0.125, 1).text).toBe(new Intl.NumberFormat(undefined, { style: 'percent', minimumFractionDigits: 1, maximumFractionDigits: 1 }).format(0.125));
    expect(fmtSig(0.0123456).text).toBe(new Intl.NumberFormat(undefined, { maximumSignificantDigits: 4 }).format(0.0123456));
  });
});

describe('chart axis ticks', () => {
  it('keep small values distinct (jobs per thousand dollars are around 0.01)', () => {
    const ticks = [0, 0.002, 0.004, 0.006, 0.008, 0.01, 0.012].map(fmtCompact);
    expect(new Set(ticks).size).toBe(ticks.length);
    expect(fmtCompact(0.004)).toBe(new Intl.NumberFormat(undefined, { maximumSignificantDigits: 3 }).format(0.004));
  });
  it('still shorten large values', () => {
    expect(fmtCompact(12_345)).toBe(new Intl.NumberFormat(undefined, { notation: 'compact', maximumSignificantDigits: 3 }).format(12_345));
  });
});

describe('money units for per-money ratios', () => {
  it('read the scale and currency from the table\'s unit', () => {
    expect(parseMoneyUnit('thousand dollars')).toEqual({ scale: 1e3, currency: 'dollars' });
    expect(parseMoneyUnit('Millions of euro')).toEqual({ scale: 1e6, currency: 'euro' });
    expect(parseMoneyUnit('dollars')).toEqual({ scale: 1, currency: 'dollars' });
    expect(parseMoneyUnit('1000 USD')).toBeNull();
  });
  it('offer a million of the currency beside the table\'s own unit', () => {
    expect(perMoneyUnits('thousand dollars')).toEqual([{ label: 'thousand dollars', factor: 1 }, { label: 'million dollars', factor: 1000 }]);
    expect(perMoneyUnits('dollars')).toEqual([{ label: 'dollars', factor: 1 }, { label: 'million dollars', factor: 1e6 }]);
    expect(perMoneyUnits('million dollars')).toEqual([{ label: 'million dollars', factor: 1 }]);
    expect(perMoneyUnits('1000 USD')).toEqual([{ label: '1000 USD', factor: 1 }]);
  });
});
