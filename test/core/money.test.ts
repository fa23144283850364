import { describe, expect, it } from 'vitest';
import { exponentOf, formatMinor, fromMajor, parsePlainDecimal, toMajor } from '../../engine/core/money';
import { isKnownCurrency, minorUnitExponent } from '../../engine/core/currency';
import { errorCode } from './errorCode';

describe('ISO 4217 minor-unit exponents', () => {
  it('knows the exponents of common and unusual currencies', () => {
    // Source: ISO 4217 list one (active codes), column "Minor unit": EUR 2, USD 2, CHF 2,
    // GBP 2, JPY 0, KRW 0, ISK 0, CLP 0, KWD 3, BHD 3, JOD 3, TND 3, OMR 3, CLF 4, UYW 4.
    const expected: Record<string, number> = {
      EUR: 2,
      USD: 2,
      CHF: 2,
      GBP: 2,
      JPY: 0,
      KRW: 0,
      ISK: 0,
      CLP: 0,
      KWD: 3,
      BHD: 3,
      JOD: 3,
      TND: 3,
      OMR: 3,
      CLF: 4,
      UYW: 4,
    };
    for (const [code, exponent] of Object.entries(expected)) {
      expect(minorUnitExponent(code), code).toBe(exponent);
      expect(exponentOf(code), code).toBe(exponent);
    }
  });
  it('refuses unknown, lower-case, funds and withdrawn codes', () => {
    for (const code of ['XXX', 'eur', 'EURO', '', 'XAU', 'DEM', '__proto__', 'toString']) {
      expect(isKnownCurrency(code), code).toBe(false);
      expect(minorUnitExponent(code), code).toBeUndefined();
      expect(
        errorCode(() => exponentOf(code)),
        code,
      ).toBe('UNKNOWN_CURRENCY');
    }
  });
});

describe('parsePlainDecimal', () => {
  it('parses signs, missing fractions and trailing zeros exactly', () => {
    expect(parsePlainDecimal('-12.5', 2)).toBe(-1250);
    expect(parsePlainDecimal('+12.50', 2)).toBe(1250);
    expect(parsePlainDecimal('12', 2)).toBe(1200);
    expect(parsePlainDecimal('12.', 2)).toBe(1200);
    expect(parsePlainDecimal('0.01', 2)).toBe(1);
    expect(parsePlainDecimal('000123.40', 2)).toBe(12340);
    expect(parsePlainDecimal(' 7.25 ', 2)).toBe(725);
    expect(parsePlainDecimal('1234', 0)).toBe(1234);
    expect(parsePlainDecimal('1.234', 3)).toBe(1234);
  });
  it('has no floating-point error: 0.1, 0.2, 0.3 are exact', () => {
    const sum = (parsePlainDecimal('0.1', 2) as number) + (parsePlainDecimal('0.2', 2) as number);
    expect(sum).toBe(parsePlainDecimal('0.3', 2));
  });
  it('never returns negative zero', () => {
    expect(Object.is(parsePlainDecimal('-0.00', 2), 0)).toBe(true);
    expect(Object.is(parsePlainDecimal('-0', 0), 0)).toBe(true);
  });
  it('refuses excess non-zero decimals but accepts excess zeros', () => {
    expect(parsePlainDecimal('1.234', 2)).toBe('has 3 decimals, the currency allows 2');
    expect(parsePlainDecimal('1.5', 0)).toBe('has 1 decimals, the currency allows 0');
    expect(parsePlainDecimal('1.2300', 2)).toBe(123);
    expect(parsePlainDecimal('7.000', 0)).toBe(7);
  });
  it('refuses grouping, exponents, commas, lone points and empty text', () => {
    for (const bad of ['1,234.56', '1.234,56', '1e3', '.5', '-', '', '--1', '1 000', '12.3.4', 'NaN', '0x10']) {
      expect(parsePlainDecimal(bad, 2), bad).toBe('is not a decimal number');
    }
  });
  it('refuses amounts beyond the safe-integer range and accepts its edge', () => {
    expect(parsePlainDecimal('90071992547409.91', 2)).toBe(9007199254740991);
    expect(parsePlainDecimal('90071992547409.92', 2)).toBe('is too large');
    expect(parsePlainDecimal('99999999999999999999', 0)).toBe('is too large');
  });
});

describe('formatMinor and toMajor', () => {
  it('formats with the currency digits and a sign', () => {
    expect(formatMinor(-1250, 2)).toBe('-12.50');
    expect(formatMinor(5, 2)).toBe('0.05');
    expect(formatMinor(-5, 3)).toBe('-0.005');
    expect(formatMinor(0, 2)).toBe('0.00');
    expect(formatMinor(1234, 0)).toBe('1234');
    expect(formatMinor(123456, 4)).toBe('12.3456');
  });
  it('round-trips with parsePlainDecimal', () => {
    for (const minor of [0, 1, -1, 99, -100, 123456789, -987654321012]) {
      for (const e of [0, 2, 3]) expect(parsePlainDecimal(formatMinor(minor, e), e)).toBe(minor);
    }
  });
  it('gives JSON numbers in major units', () => {
    expect(toMajor(-1250, 2)).toBe(-12.5);
    expect(toMajor(421055, 2)).toBe(4210.55);
    expect(toMajor(1, 3)).toBe(0.001);
    expect(toMajor(500, 0)).toBe(500);
    expect(JSON.stringify(toMajor(10, 2))).toBe('0.1');
  });
});

describe('fromMajor', () => {
  it('rounds half away from zero at the currency precision', () => {
    expect(fromMajor(12.345, 2)).toBe(1235);
    expect(fromMajor(-12.345, 2)).toBe(-1235);
    expect(fromMajor(1.005, 2)).toBe(101);
    expect(fromMajor(0.015, 2)).toBe(2);
    expect(fromMajor(2.5, 0)).toBe(3);
    expect(fromMajor(-0.5, 0)).toBe(-1);
    expect(fromMajor(0.0004, 3)).toBe(0);
    expect(fromMajor(0.0005, 3)).toBe(1);
    expect(fromMajor(4210.55, 2)).toBe(421055);
  });
  it('rounds halves of large amounts by their decimal digits, not the binary product', () => {
    // 10000000.075 * 100 is 1000000007.4999999 in binary; the decimal half rounds up.
    expect(fromMajor(10000000.075, 2)).toBe(1000000008);
    expect(fromMajor(-10000000.075, 2)).toBe(-1000000008);
    expect(fromMajor(123456789.125, 2)).toBe(12345678913);
  });
  it('handles exponent forms of tiny and large numbers', () => {
    expect(fromMajor(1.5e-7, 2)).toBe(0);
    expect(fromMajor(5e-7, 6)).toBe(1);
  });
  it('never returns negative zero', () => {
    expect(Object.is(fromMajor(-0.001, 2), 0)).toBe(true);
    expect(Object.is(fromMajor(-0, 2), 0)).toBe(true);
  });
  it('refuses non-finite and too large amounts', () => {
    expect(errorCode(() => fromMajor(Number.NaN, 2))).toBe('INVALID_AMOUNT');
    expect(errorCode(() => fromMajor(Infinity, 2))).toBe('INVALID_AMOUNT');
    expect(errorCode(() => fromMajor(1e20, 2))).toBe('INVALID_AMOUNT');
    expect(errorCode(() => fromMajor(1e21, 0))).toBe('INVALID_AMOUNT');
  });
  it('inverts toMajor for every cent value in a range', () => {
    let mismatches = 0;
    for (let minor = -50_000; minor <= 50_000; minor++) if (fromMajor(toMajor(minor, 2), 2) !== minor) mismatches++;
    expect(mismatches).toBe(0);
  });
});
