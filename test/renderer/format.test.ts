// Screen number formatting: locale grouping from Intl.NumberFormat itself, and never NaN or Infinity on screen.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { DASH, fmt, fmtMoney, fmtRatio, fmtPercent, fmtSig, type NumberStyle } from '../../renderer/format/number.ts';

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
