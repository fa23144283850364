import { describe, expect, it } from 'vitest';
import { convertMinor, parseOfxAmount, parseOfxRate } from '../../engine/import/ofx/parseOfxAmount';

describe('parseOfxAmount', () => {
  it('reads signed decimals into minor units', () => {
    // Source: OFX Banking Specification 2.3, section 11.14.1 example: TRNAMT -200.00, BALAMT 200.29.
    expect(parseOfxAmount('-200.00', 2)).toBe(-20000);
    expect(parseOfxAmount('200.29', 2)).toBe(20029);
    expect(parseOfxAmount('+5', 2)).toBe(500);
    expect(parseOfxAmount('0.00', 2)).toBe(0);
    expect(Object.is(parseOfxAmount('-0.00', 2), 0)).toBe(true);
  });

  it('follows the currency exponent', () => {
    // Source: ISO 4217 list one: JPY has 0 minor-unit digits, KWD 3.
    expect(parseOfxAmount('1500', 0)).toBe(1500);
    expect(parseOfxAmount('1.234', 3)).toBe(1234);
    expect(parseOfxAmount('1500.5', 0)).toBe('has 1 decimals, the currency allows 0');
  });

  it('refuses more significant decimals than the currency allows', () => {
    expect(parseOfxAmount('1.234', 2)).toBe('has 3 decimals, the currency allows 2');
    // Trailing zeros carry no value and are accepted (engine/core/money.ts parsePlainDecimal).
    expect(parseOfxAmount('1.230', 2)).toBe(123);
  });

  it('tolerates a decimal comma and a leading separator', () => {
    // Common practice, no source: files produced where decimal commas are usual write -12,50.
    expect(parseOfxAmount('-12,50', 2)).toBe(-1250);
    expect(parseOfxAmount('-.50', 2)).toBe(-50);
    expect(parseOfxAmount(',5', 2)).toBe(50);
  });

  it('refuses digit grouping and anything that is not a plain decimal', () => {
    // Source: OFX Banking Specification 2.3, data types (from memory): amounts carry no digit grouping.
    expect(parseOfxAmount('1,234.56', 2)).toMatch(/digit grouping/);
    expect(parseOfxAmount('1.234,56', 2)).toMatch(/digit grouping/);
    expect(parseOfxAmount('1 234.56', 2)).toMatch(/digit grouping/);
    expect(parseOfxAmount('12.5-', 2)).toMatch(/not a decimal number/);
    expect(parseOfxAmount('EUR 5', 2)).toMatch(/digit grouping|not a decimal/);
    expect(parseOfxAmount('abc', 2)).toMatch(/not a decimal number/);
    expect(parseOfxAmount('', 2)).toMatch(/empty/);
    expect(parseOfxAmount('99999999999999999999', 2)).toBe('is too large');
  });
});

describe('parseOfxRate and convertMinor', () => {
  it('parses positive decimal rates exactly', () => {
    expect(parseOfxRate('1.25')).toEqual({ numerator: 125n, scale: 2 });
    expect(parseOfxRate('0,9')).toEqual({ numerator: 9n, scale: 1 });
    expect(parseOfxRate('0')).toBeUndefined();
    expect(parseOfxRate('-1.2')).toBeUndefined();
    expect(parseOfxRate('1e3')).toBeUndefined();
  });

  it('converts between exponents, rounding half away from zero', () => {
    const rate = parseOfxRate('1.17') as { numerator: bigint; scale: number };
    expect(convertMinor(-3000, 2, rate, 2)).toBe(-3510); // -30.00 × 1.17 = -35.10
    const half = parseOfxRate('0.5') as { numerator: bigint; scale: number };
    expect(convertMinor(1, 2, half, 2)).toBe(1); // 0.005 → 0.01
    expect(convertMinor(-1, 2, half, 2)).toBe(-1);
    expect(convertMinor(3, 2, half, 2)).toBe(2); // 0.015 → 0.02
    const yenPerEuro = parseOfxRate('161.5') as { numerator: bigint; scale: number };
    expect(convertMinor(1000, 2, yenPerEuro, 0)).toBe(1615); // 10.00 EUR → 1615 JPY
    expect(convertMinor(1, 0, parseOfxRate('0.001') as { numerator: bigint; scale: number }, 3)).toBe(1);
    expect(convertMinor(Number.MAX_SAFE_INTEGER, 2, yenPerEuro, 2)).toBeUndefined();
  });
});
