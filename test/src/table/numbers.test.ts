// Reading numbers. The fast path must equal Number() bit for bit (ECMA-262 StringToNumber, correctly rounded);
// Clinger (PLDI 1990) shows m·10^k and m/10^k are correctly rounded when m < 2^53 and |k| ≤ 22 — checked here on
// random input against the engine's own Number().
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { parseNumberText, scanPlain } from '../../../src/table/numbers.ts';

const DOT = 46;
const COMMA = 44;

describe('scanPlain', () => {
  it('equals Number() on the shortest text of random doubles', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (v) => {
        const s = String(v);
        const got = scanPlain(s, 0, s.length, DOT);
        if (got === got) expect(Object.is(got, Number(s))).toBe(true);
        // and the general path always agrees
        expect(Object.is(parseNumberText(s, '.').value, Number(s))).toBe(true);
      }),
      { numRuns: 5000, seed: 754 },
    );
  });
  it('equals Number() on random decimal strings', () => {
    const digits = (max: number) => fc.string({ unit: fc.constantFrom('0', '1', '2', '5', '9'), maxLength: max });
    const text = fc.tuple(fc.constantFrom('', '-', '+'), digits(18), fc.option(digits(18)), fc.option(fc.integer({ min: -330, max: 330 }))).map(
      ([sign, int, frac, exp]) => `${sign}${int}${frac !== null ? '.' + frac : ''}${exp !== null ? 'e' + exp : ''}`,
    );
    fc.assert(
      fc.property(text, (s) => {
        const got = scanPlain(s, 0, s.length, DOT);
        const ref = Number(s);
        if (got === got) expect(Object.is(got, ref)).toBe(true);
        else expect(got).toBeNaN();
        // the general path agrees wherever JavaScript reads the text as a finite number
        const p = parseNumberText(s, '.');
        if (Number.isFinite(ref) && /\d/.test(s)) expect(Object.is(p.value, ref)).toBe(true);
      }),
      { numRuns: 5000, seed: 1990 },
    );
  });
  it('reads the decimal comma the same as the point', () => {
    for (const s of ['0,1', '1234,5', '-0,000123', '7,25e3', '3,']) {
      expect(scanPlain(s, 0, s.length, COMMA)).toBe(Number(s.replace(',', '.')));
    }
    expect(scanPlain('1.5', 0, 3, COMMA)).toBeNaN(); // a point in a decimal-comma file goes to the general path
  });
  it('declines what it does not handle (the general path takes over)', () => {
    for (const s of ['', ' 1', '1 ', '1,000', '1e', '-', '.', 'e5', '0x10', '1_000', '12345678901234567']) expect(scanPlain(s, 0, s.length, DOT)).toBeNaN();
    expect(scanPlain('a,12.5,b', 2, 6, DOT)).toBe(12.5); // reads in place inside a longer string
  });
});

describe('parseNumberText', () => {
  const ok = (s: string, mark: '.' | ',', v: number) => expect(parseNumberText(s, mark)).toEqual({ value: v, problem: null });
  it('reads thousands separators in groups of three', () => {
    ok('1,234,567.5', '.', 1234567.5);
    ok('1.234.567,5', ',', 1234567.5);
    ok('1 234 567,5', ',', 1234567.5);
    ok('1\u00a0234.5', '.', 1234.5);
    ok("1'234'567", '.', 1234567);
    ok('-1,234', '.', -1234);
    ok('\u22121,234', '.', -1234); // U+2212 MINUS SIGN
    ok('  12  ', '.', 12);
    ok(',5', ',', 0.5);
  });
  it('refuses malformed grouping and mixed marks', () => {
    for (const s of ['1,23', '12,3456', '1,234.567.8', '1.234,5', '1,,234']) expect(parseNumberText(s, '.').problem).toBe('non-numeric');
    expect(parseNumberText('1,234.5', ',').problem).toBe('non-numeric');
  });
  it('classifies blanks, text, non-finite and overflowing numbers', () => {
    expect(parseNumberText('  ', '.').problem).toBe('blank');
    expect(parseNumberText('abc', '.').problem).toBe('non-numeric');
    expect(parseNumberText('#N/A', '.').problem).toBe('non-numeric');
    expect(parseNumberText('12%', '.').problem).toBe('non-numeric');
    for (const s of ['NaN', 'nan', 'Infinity', '-Infinity', 'inf', '+INF', '∞']) expect(parseNumberText(s, '.').problem).toBe('not-finite');
    for (const s of ['1e309', '-1e400', '179769313486231580793728971405303415079934132710037826936173778980444968292764750946649017977587207096330286416692887910946555547851940402630657488671505820681908902000708383676273854845817711531764475730270069855571366959622842914819860834936475292719074168444365510704342711559699508093042880177904174497792']) {
      expect(parseNumberText(s, '.').problem).toBe('overflow');
    }
    ok('1e-400', '.', 0); // underflow to zero is not an error (IEEE 754 gradual underflow)
    ok('1.7976931348623157e308', '.', Number.MAX_VALUE);
  });
});
