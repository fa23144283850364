import { describe, expect, it } from 'vitest';
import { formatForMessage, inspectAmount, readAmount } from '../../engine/import/csv/numbers';
import { csvImporter } from '../../engine/import/csv';
import { minorUnitExponent } from '../../engine/core/currency';

const COMMA = { decimal: ',' } as const;
const POINT = { decimal: '.' } as const;
// Source: ISO 4217 list one, minor units: EUR 2, JPY 0, KWD 3 (as tabled in engine/core/currency.ts).
const EUR = minorUnitExponent('EUR') as number;
const JPY = minorUnitExponent('JPY') as number;
const KWD = minorUnitExponent('KWD') as number;

describe('readAmount: decimal separators and every thousands separator', () => {
  // Common practice, no source: 1.234,56 (German, Dutch), 1,234.56 (English), 1 234,56 with a space or
  // no-break space (French), 1'234.56 (Swiss).
  it.each([
    ['1234,56', COMMA, 123456],
    ['1.234,56', COMMA, 123456],
    ['1 234,56', COMMA, 123456],
    ['1\u00a0234,56', COMMA, 123456],
    ['1\u202f234,56', COMMA, 123456],
    ["1'234,56", COMMA, 123456],
    ['1234.56', POINT, 123456],
    ['1,234.56', POINT, 123456],
    ['1 234.56', POINT, 123456],
    ["1'234.56", POINT, 123456],
    ['1\u2019234.56', POINT, 123456],
    ['12.345.678,90', COMMA, 1234567890],
    ['0,5', COMMA, 50],
    [',5', COMMA, 50],
    ['7', POINT, 700],
  ])('%s', (text, format, expected) => {
    expect(readAmount(text, format, EUR, 'EUR')).toBe(expected);
  });

  it('keeps to a thousands separator named by a mapping', () => {
    expect(readAmount('1.234,56', { decimal: ',', thousands: '.' }, EUR, 'EUR')).toBe(123456);
    expect(readAmount('1 234,56', { decimal: ',', thousands: '.' }, EUR, 'EUR')).toMatch(/is not a number/);
    expect(readAmount('1\u00a0234,56', { decimal: ',', thousands: ' ' }, EUR, 'EUR')).toBe(123456);
    expect(readAmount('1.234,56', { decimal: ',', thousands: '' }, EUR, 'EUR')).toMatch(/is not a number/);
  });

  it('refuses digit groups that are not thousands', () => {
    expect(readAmount('1.23.456,00', COMMA, EUR, 'EUR')).toBe(
      'has digit groups that are not thousands, expected groups of three digits like 1.234.567,89',
    );
    expect(readAmount('12.34,00', COMMA, EUR, 'EUR')).toMatch(/digit groups/);
    expect(readAmount('1234.567,00', COMMA, EUR, 'EUR')).toMatch(/digit groups/);
    expect(readAmount('.123,00', COMMA, EUR, 'EUR')).toMatch(/digit groups/);
    expect(readAmount('1.234 567,00', COMMA, EUR, 'EUR')).toMatch(/is not a number/);
  });
});

describe('readAmount: decimals and the currency', () => {
  it('refuses more decimals than the currency has', () => {
    expect(readAmount('12,345', COMMA, EUR, 'EUR')).toBe('has 3 decimals, expected at most 2 for EUR');
    expect(readAmount('1200.5', POINT, JPY, 'JPY')).toBe('has 1 decimals, expected at most 0 for JPY');
    expect(readAmount('1.2345', POINT, KWD, 'KWD')).toBe('has 4 decimals, expected at most 3 for KWD');
  });

  it('scales to minor units exactly', () => {
    expect(readAmount('1.234', POINT, KWD, 'KWD')).toBe(1234);
    expect(readAmount('1.2', POINT, KWD, 'KWD')).toBe(1200);
    expect(readAmount('1200', POINT, JPY, 'JPY')).toBe(1200);
    expect(readAmount('0.10', POINT, EUR, 'EUR')).toBe(10);
    // Extra decimals that are zeros are accepted, as parsePlainDecimal in engine/core/money.ts does.
    expect(readAmount('12.340', POINT, EUR, 'EUR')).toBe(1234);
  });

  it('refuses amounts beyond exact integer arithmetic', () => {
    expect(readAmount('90071992547409.92', POINT, EUR, 'EUR')).toMatch(/too large/);
    expect(readAmount('90071992547409.91', POINT, EUR, 'EUR')).toBe(Number.MAX_SAFE_INTEGER);
  });
});

describe('readAmount: sign conventions', () => {
  it.each([
    ['-12,50', -1250],
    ['+12,50', 1250],
    ['\u221212,50', -1250],
    ['12,50-', -1250],
    ['(12,50)', -1250],
    ['12,50 DR', -1250],
    ['12,50 CR', 1250],
    ['DR 12,50', -1250],
    ['€ -12,50', -1250],
    ['-12,50 €', -1250],
    ['EUR -12,50', -1250],
    ['-12,50 EUR', -1250],
    ['(€12,50)', -1250],
    ['12,50 kr', 1250],
    ['-0,00', 0],
  ])('%s', (text, expected) => {
    expect(readAmount(text, COMMA, EUR, 'EUR')).toBe(expected);
  });

  it('never returns negative zero', () => {
    expect(Object.is(readAmount('-0,00', COMMA, EUR, 'EUR'), 0)).toBe(true);
    expect(Object.is(readAmount('(0.00)', POINT, EUR, 'EUR'), 0)).toBe(true);
  });

  it('refuses two signs and unmatched parentheses', () => {
    expect(readAmount('--5', COMMA, EUR, 'EUR')).toMatch(/more than one sign/);
    expect(readAmount('-5-', COMMA, EUR, 'EUR')).toMatch(/more than one sign/);
    expect(readAmount('-(5)', COMMA, EUR, 'EUR')).toMatch(/more than one sign/);
    expect(readAmount('+5 DR', COMMA, EUR, 'EUR')).toMatch(/more than one sign/);
    expect(readAmount('(5', COMMA, EUR, 'EUR')).toMatch(/unmatched parenthesis/);
  });

  it('refuses text that is not a number', () => {
    for (const bad of ['', '-', 'abc12', 'ab12', '12a', '1,2,3', 'n/a', '12,']) {
      expect(readAmount(bad, COMMA, EUR, 'EUR'), bad).toMatch(
        /not a number|digit groups|more than one|not an ISO 4217/,
      );
    }
    expect(readAmount('EUR USD 5', COMMA, EUR, 'EUR')).toBe('names two currencies (EUR and USD), expected one');
    expect(readAmount('5 EUX', COMMA, EUR, 'EUR')).toBe(
      'has "EUX" beside the number, which is not an ISO 4217 currency code, expected a code like EUR',
    );
  });
});

describe('inspectAmount: evidence for the decimal separator', () => {
  it('classifies cells', () => {
    expect(inspectAmount('1.234,56').evidence).toBe(1);
    expect(inspectAmount('1,234.56').evidence).toBe(2);
    expect(inspectAmount('12,5').evidence).toBe(1);
    expect(inspectAmount('12.50').evidence).toBe(2);
    expect(inspectAmount('1.234.567').evidence).toBe(1);
    expect(inspectAmount('1,234,567').evidence).toBe(2);
    expect(inspectAmount('1,234').evidence).toBe(3);
    expect(inspectAmount('1.234').evidence).toBe(4);
    expect(inspectAmount('0.234').evidence).toBe(2);
    expect(inspectAmount('1234.567').evidence).toBe(2);
    expect(inspectAmount('1 234').evidence).toBe(0);
    expect(inspectAmount('125').evidence).toBe(0);
  });

  it('finds currency codes and sign styles', () => {
    const info = inspectAmount('(1 234,00 CHF)');
    expect([info.ok, info.currency, info.parentheses, info.thousands]).toEqual([true, 'CHF', true, ' ']);
    expect(inspectAmount('€5').currency).toBe('EUR');
    expect(inspectAmount('5,00-').trailingMinus).toBe(true);
    expect(inspectAmount('hello').ok).toBe(false);
  });
});

describe('number format decided from all rows of an import', () => {
  function amounts(rows: string[], currency: string): number[] | string {
    const text =
      'Date;Text;Amount\n' + rows.map((a, k) => `2025-01-${String(k + 1).padStart(2, '0')};x;${a}`).join('\n');
    const r = csvImporter.parse(text, { fileName: 'n.csv', currency });
    return r.statements[0]?.entries.map((e) => e.amount) ?? (r.problems[0]?.message as string);
  }

  it('lets one revealing row decide for the ambiguous ones', () => {
    expect(amounts(['1.234', '5,50'], 'EUR')).toEqual([123400, 550]);
    expect(amounts(['1,234', '5.50'], 'EUR')).toEqual([123400, 550]);
  });

  it('reads a lone "1.234" as thousands in a two-decimal currency and as decimals in a three-decimal one', () => {
    expect(amounts(['1.234', '2.000'], 'EUR')).toEqual([123400, 200000]);
    expect(amounts(['1.234', '2.000'], 'KWD')).toEqual([1234, 2000]);
    expect(amounts(['1.234'], 'JPY')).toEqual([1234]);
  });

  it('refuses a row whose number contradicts the file format', () => {
    expect(amounts(['1.234,56', '2.345,67', '12.50'], 'EUR')).toBe(
      'amount "12.50" has digit groups that are not thousands, expected groups of three digits like 1.234.567,89',
    );
  });

  it('refuses an amount with more decimals than the currency allows, naming the line', () => {
    const r = csvImporter.parse('Date;Text;Amount\n2025-01-01;x;1,5\n2025-01-02;y;1,234\n', {
      fileName: 'd.csv',
      currency: 'EUR',
    });
    expect(r.problems).toEqual([
      {
        file: 'd.csv',
        line: 3,
        message: 'amount "1,234" has 3 decimals, expected at most 2 for EUR',
        severity: 'error',
      },
    ]);
  });
});

describe('formatForMessage', () => {
  it('writes minor units the way the file does', () => {
    expect(formatForMessage(-123456, 2, ',')).toBe('-1234,56');
    expect(formatForMessage(5, 3, '.')).toBe('0.005');
  });
});
