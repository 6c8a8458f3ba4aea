// The brief's rounding rule: jobs to whole jobs, money to three significant figures, shares in per cent to one
// decimal, ratios to two decimals, English number style. Expected strings worked by hand.
import { describe, expect, it } from 'vitest';
import { councilNumber, dateText, shareText } from '../../../src/study/index.ts';

describe('councilNumber', () => {
  it('rounds jobs to whole jobs with thousands separators', () => {
    expect(councilNumber(1428.578, 'jobs')).toBe('1,429');
    expect(councilNumber(369.5, 'jobs')).toBe('370'); // halves away from zero
    expect(councilNumber(-0.4, 'jobs')).toBe('0'); // never "-0"
    expect(councilNumber(-12.6, 'jobs')).toBe('-13');
  });
  it('rounds money to three significant figures', () => {
    expect(councilNumber(245566.11, 'money')).toBe('246,000');
    expect(councilNumber(93335.15, 'money')).toBe('93,300');
    expect(councilNumber(971.63, 'money')).toBe('972');
    expect(councilNumber(0.0012345, 'money')).toBe('0.00123');
    expect(councilNumber(-31420.06, 'money')).toBe('-31,400');
    expect(councilNumber(0, 'money')).toBe('0');
  });
  it('writes ratios with two decimals and a missing value as a dash', () => {
    expect(councilNumber(2.0942497, 'ratio')).toBe('2.09');
    expect(councilNumber(3, 'ratio')).toBe('3.00');
    expect(councilNumber(null, 'ratio')).toBe('—');
    expect(councilNumber(Number.NaN, 'money')).toBe('—');
  });
});

describe('shareText', () => {
  it('gives per cent with one decimal, and says when a share is under 0.1 %', () => {
    expect(shareText(1428.578, 44681)).toBe('3.2 %');
    expect(shareText(1, 1e6)).toBe('under 0.1 %');
    expect(shareText(-1, 1e6)).toBe('a fall under 0.1 %');
    expect(shareText(0, 1e6)).toBe('0.0 %');
    expect(shareText(5, 0)).toBe('—');
    expect(shareText(5, null)).toBe('—');
  });
});

describe('dateText', () => {
  it('writes the run\'s time in words, in UTC, the same on every machine', () => {
    expect(dateText('2026-12-02T05:25:39.289Z')).toBe('2 December 2026, 05:25 UTC');
    expect(dateText('2027-01-09T23:05:00+02:00')).toBe('9 January 2027, 21:05 UTC');
    expect(dateText('2026-12-02T05:25:39.289Z', false)).toBe('2 December 2026');
    expect(dateText('not a date')).toBe('not a date');
  });
});
