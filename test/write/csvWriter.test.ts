import { describe, expect, it } from 'vitest';
import { formatCsvDate, formatCsvNumber, quoteCsvField, writeCsv, type CsvLayout } from '../../engine/write/csv';
import { csvImporter } from '../../engine/import/csv';
import type { ParsedStatement, StatementEntry } from '../../engine/import/types';

function entry(
  bookingDate: string,
  amount: number,
  description: string,
  extra: Partial<StatementEntry> = {},
): StatementEntry {
  return { bookingDate, amount, description, status: 'booked', source: {}, ...extra };
}

const STATEMENT: ParsedStatement = {
  account: { name: 'Studio' },
  currency: 'EUR',
  entries: [
    entry('2025-01-03', 123456, 'Sale; "big"', { counterparty: 'Vela' }),
    entry('2025-01-02', -90000, 'Rent\r\nJanuary'),
    entry('2025-01-03', -5, 'Fee'),
  ],
  balances: [{ kind: 'opening', date: '2025-01-02', at: 'start', amount: 100000, source: {} }],
};

const BASE: CsvLayout = {
  delimiter: ';',
  decimalSeparator: ',',
  thousandsSeparator: '.',
  dateFormat: 'DD.MM.YYYY',
  signStyle: 'signed',
  runningBalance: false,
  newestFirst: false,
  preambleLines: [],
  includeCurrencyColumn: false,
  lineEnding: '\r\n',
};

describe('quoteCsvField: RFC 4180 section 2', () => {
  it('quotes fields with the delimiter, quotes or line breaks', () => {
    // Source: RFC 4180 section 2, rule 6 ("Fields containing line breaks (CRLF), double quotes, and commas should be
    // enclosed in double-quotes"); rule 7 (a double quote inside is escaped by preceding it with another double quote)
    expect(quoteCsvField('a,b', ',')).toBe('"a,b"');
    expect(quoteCsvField('b\r\nbb', ',')).toBe('"b\r\nbb"');
    expect(quoteCsvField('b"bb', ',')).toBe('"b""bb"');
    expect(quoteCsvField('lone\rcr', ',')).toBe('"lone\rcr"');
    expect(quoteCsvField('a;b', '\t')).toBe('a;b');
    expect(quoteCsvField('a\tb', '\t')).toBe('"a\tb"');
    expect(quoteCsvField('', ',')).toBe('');
    expect(quoteCsvField(' spaced ', ',')).toBe(' spaced ');
  });
});

describe('formatting helpers', () => {
  it('formats numbers with grouping', () => {
    expect(formatCsvNumber(123456789, 2, ',', '.')).toBe('1.234.567,89');
    expect(formatCsvNumber(-123456789, 2, '.', ',')).toBe('1,234,567.89');
    expect(formatCsvNumber(100000, 2, '.', "'")).toBe("1'000.00");
    expect(formatCsvNumber(99999, 2, ',', ' ')).toBe('999,99');
    expect(formatCsvNumber(1234567, 0, '.', '\u00a0')).toBe('1\u00a0234\u00a0567');
    expect(formatCsvNumber(5, 3, '.', '')).toBe('0.005');
  });

  it('formats dates', () => {
    expect(formatCsvDate('2024-02-29', 'YYYY-MM-DD')).toBe('2024-02-29');
    expect(formatCsvDate('2024-02-29', 'DD.MM.YYYY')).toBe('29.02.2024');
    expect(formatCsvDate('2024-02-29', 'DD/MM/YYYY')).toBe('29/02/2024');
    expect(formatCsvDate('2024-02-29', 'MM/DD/YYYY')).toBe('02/29/2024');
    expect(formatCsvDate('2024-02-29', 'DD.MM.YY')).toBe('29.02.24');
    expect(() => formatCsvDate('2070-01-01', 'DD.MM.YY')).toThrow(/1970–2069/);
    expect(() => formatCsvDate('2025-02-30', 'DD.MM.YYYY')).toThrow(/not a calendar date/);
  });
});

describe('writeCsv', () => {
  it('writes header and rows in date order, quoting where needed', () => {
    expect(writeCsv(STATEMENT, BASE)).toBe(
      'Date;Description;Counterparty;Amount\r\n' +
        '02.01.2025;"Rent\r\nJanuary";;-900,00\r\n' +
        '03.01.2025;"Sale; ""big""";Vela;1.234,56\r\n' +
        '03.01.2025;Fee;;-0,05\r\n',
    );
  });

  it('writes each sign style', () => {
    const rows = (layout: Partial<CsvLayout>): string[] =>
      writeCsv(
        { ...STATEMENT, entries: [entry('2025-01-02', -90000, 'x'), entry('2025-01-03', 500, 'y')] },
        {
          ...BASE,
          ...layout,
        },
      )
        .trimEnd()
        .split('\r\n');
    expect(rows({ signStyle: 'debitCredit' })).toEqual([
      'Date;Description;Debit;Credit',
      '02.01.2025;x;900,00;',
      '03.01.2025;y;;5,00',
    ]);
    expect(rows({ signStyle: 'indicator' })).toEqual([
      'Date;Description;Amount;D/C',
      '02.01.2025;x;900,00;D',
      '03.01.2025;y;5,00;C',
    ]);
    expect(rows({ signStyle: 'indicator', indicatorWords: ['S', 'H'] })[1]).toBe('02.01.2025;x;900,00;S');
    expect(rows({ signStyle: 'parentheses' })[1]).toBe('02.01.2025;x;(900,00)');
    expect(rows({ signStyle: 'trailingMinus' })[1]).toBe('02.01.2025;x;900,00-');
  });

  it('writes a running balance from the opening balance, newest first, with preamble and currency', () => {
    const text = writeCsv(STATEMENT, {
      ...BASE,
      delimiter: ',',
      decimalSeparator: '.',
      thousandsSeparator: ',',
      dateFormat: 'YYYY-MM-DD',
      runningBalance: true,
      newestFirst: true,
      preambleLines: ['Account,Studio'],
      includeCurrencyColumn: true,
      lineEnding: '\n',
    });
    expect(text).toBe(
      'Account,Studio\n' +
        'Date,Description,Counterparty,Amount,Currency,Balance\n' +
        '2025-01-03,Fee,,-0.05,EUR,"1,334.51"\n' +
        '2025-01-03,"Sale; ""big""",Vela,"1,234.56",EUR,"1,334.56"\n' +
        '2025-01-02,"Rent\r\nJanuary",,-900.00,EUR,100.00\n',
    );
  });

  it('leaves the balance of pending rows empty and adds a status column', () => {
    const text = writeCsv(
      { ...STATEMENT, entries: [entry('2025-01-02', 100, 'a'), entry('2025-01-03', 50, 'b', { status: 'pending' })] },
      { ...BASE, runningBalance: true },
    );
    expect(text).toBe(
      'Date;Description;Amount;Balance;Status\r\n02.01.2025;a;1,00;1.001,00;booked\r\n03.01.2025;b;0,50;;pending\r\n',
    );
  });

  it('derives the opening balance from a running balance when there is no opening', () => {
    const statement: ParsedStatement = {
      ...STATEMENT,
      entries: [entry('2025-01-02', 100, 'a'), entry('2025-01-03', 50, 'b')],
      balances: [{ kind: 'running', date: '2025-01-02', at: 'end', amount: 1100, source: {} }],
    };
    expect(writeCsv(statement, { ...BASE, runningBalance: true })).toContain('03.01.2025;b;0,50;11,50');
  });

  it('is read back by the importer', () => {
    const r = csvImporter.parse(writeCsv(STATEMENT, { ...BASE, runningBalance: true }), {
      fileName: 'w.csv',
      currency: 'EUR',
    });
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.entries.map((e) => [e.bookingDate, e.amount, e.description])).toEqual([
      ['2025-01-02', -90000, 'Rent\r\nJanuary'],
      ['2025-01-03', 123456, 'Sale; "big"'],
      ['2025-01-03', -5, 'Fee'],
    ]);
  });

  it('refuses layouts it cannot write', () => {
    expect(() => writeCsv(STATEMENT, { ...BASE, thousandsSeparator: ',' })).toThrow(/equals decimalSeparator/);
    expect(() => writeCsv(STATEMENT, { ...BASE, delimiter: ':' as ';' })).toThrow(/delimiter/);
    expect(() => writeCsv(STATEMENT, { ...BASE, preambleLines: ['a\nb'] })).toThrow(/line break/);
    expect(() => writeCsv(STATEMENT, { ...BASE, headerNames: { counterparty: 'Date' } })).toThrow(/not unique/);
    expect(() => writeCsv({ ...STATEMENT, balances: [] }, { ...BASE, runningBalance: true })).toThrow(
      /opening balance/,
    );
    expect(() => writeCsv({ ...STATEMENT, currency: 'EUX' }, BASE)).toThrow(/EUX/);
  });
});
