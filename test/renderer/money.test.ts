import { describe, expect, it } from 'vitest';
import { amountInputText, formatMoney as format, parseAmountInput } from '../../renderer/src/lib/format/money';

// Intl may put no-break spaces in its output; compare with plain ones.
const formatMoney = (...args: Parameters<typeof format>) => format(...args).replace(/\u00a0/g, ' ');

describe('formatMoney', () => {
  it("uses the currency's ISO 4217 exponent, not a binary fraction", () => {
    // Source: ISO 4217 minor units — EUR 2, JPY 0, KWD 3.
    expect(formatMoney(-123456, 'EUR', { locale: 'en' })).toBe('-1,234.56 EUR');
    expect(formatMoney(1234, 'JPY', { locale: 'en', display: 'none' })).toBe('1,234');
    expect(formatMoney(1234, 'KWD', { locale: 'en', display: 'none' })).toBe('1.234');
    expect(formatMoney(5, 'EUR', { locale: 'en', display: 'none' })).toBe('0.05');
  });

  it('formats amounts beyond 2^53 / 100 exactly', () => {
    expect(formatMoney(9007199254740991, 'EUR', { locale: 'en', display: 'none' })).toBe('90,071,992,547,409.91');
  });

  it('follows the locale and shows + for money in when asked', () => {
    expect(formatMoney(123450, 'EUR', { locale: 'de-DE', display: 'none' })).toBe('1.234,50');
    expect(formatMoney(1250, 'EUR', { locale: 'en', signDisplay: 'exceptZero' })).toBe('+12.50 EUR');
    expect(formatMoney(0, 'EUR', { locale: 'en', signDisplay: 'exceptZero' })).toBe('0.00 EUR');
    // Common practice, no source: German groups with a point and separates decimals with a comma.
    expect(formatMoney(-123450, 'EUR', { locale: 'de-DE' })).toBe('-1.234,50 EUR');
  });

  it('still formats a code Intl does not know, with two digits', () => {
    expect(formatMoney(1250, 'XYZ', { locale: 'en', display: 'none' })).toBe('12.50');
  });
});

describe('parseAmountInput', () => {
  it('reads point and comma decimals and grouping', () => {
    expect(parseAmountInput('1234.5', 'EUR')).toBe(123450);
    expect(parseAmountInput('1,234.50', 'EUR')).toBe(123450);
    expect(parseAmountInput('1.234,50', 'EUR')).toBe(123450);
    expect(parseAmountInput('1 234,5', 'EUR')).toBe(123450);
    expect(parseAmountInput("1'234.50", 'CHF')).toBe(123450);
    expect(parseAmountInput('12,5', 'EUR')).toBe(1250);
    expect(parseAmountInput('−12', 'EUR')).toBe(-1200);
    expect(parseAmountInput('-0.5', 'EUR')).toBe(-50);
  });

  it('takes three digits after a single separator as thousands, except after 0 or for 3-digit currencies', () => {
    expect(parseAmountInput('1,234', 'EUR')).toBe(123400);
    expect(parseAmountInput('12.345', 'EUR')).toBe(1234500);
    expect(parseAmountInput('1.234', 'KWD')).toBe(1234);
    expect(parseAmountInput('0.125', 'EUR')).toBe('has 3 decimals, the currency allows 2');
  });

  it('says what is wrong', () => {
    expect(parseAmountInput('', 'EUR')).toMatch(/is empty/);
    expect(parseAmountInput('abc', 'EUR')).toBe('"abc" is not a decimal number');
    expect(parseAmountInput('12.50', 'XYZ')).toMatch(/not an ISO 4217 code/);
    expect(parseAmountInput('1.5', 'JPY')).toBe('has 1 decimals, the currency allows 0');
  });

  it('round-trips the edit text', () => {
    for (const minor of [0, 1, -1, 123456, -99999999]) {
      expect(parseAmountInput(amountInputText(minor, 'EUR'), 'EUR')).toBe(minor);
    }
  });
});
