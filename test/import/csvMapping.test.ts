import { describe, expect, it } from 'vitest';
import { csvImporter, detectCsvLayout, validateCsvMapping } from '../../engine/import/csv';
import type { ImportOptions, ImportResult } from '../../engine/import/types';

function parse(text: string, options: Partial<ImportOptions> = {}): ImportResult {
  return csvImporter.parse(text, { fileName: 'm.csv', ...options });
}

describe('validateCsvMapping', () => {
  it('accepts the documented shape', () => {
    const mapping = {
      delimiter: ';',
      headerLine: 5,
      dataLine: 6,
      dateFormat: 'DD.MM.YYYY',
      decimalSeparator: ',',
      thousandsSeparator: '.',
      signStyle: 'signed',
      negateAmounts: false,
      columns: { date: 'Buchungstag', valueDate: 1, amount: 'Betrag', description: ['Text', 4], counterparty: 3 },
    };
    expect(validateCsvMapping(mapping)).toEqual({ mapping, problems: [] });
    expect(validateCsvMapping({ delimiter: 'tab' }).mapping?.delimiter).toBe('\t');
    expect(validateCsvMapping({}).problems).toEqual([]);
  });

  it('names each bad field by its JSON path', () => {
    const { mapping, problems } = validateCsvMapping({
      delimiter: ':',
      headerLine: 0,
      dataLine: 'two',
      dateFormat: 'YYYY-DD-MM',
      decimalSeparator: ';',
      thousandsSeparator: '_',
      signStyle: 'minus',
      negateAmounts: 'yes',
      colums: {},
    });
    expect(mapping).toBeUndefined();
    expect(problems.map((p) => p.element)).toEqual([
      'csvMapping.colums',
      'csvMapping.delimiter',
      'csvMapping.headerLine',
      'csvMapping.dataLine',
      'csvMapping.dateFormat',
      'csvMapping.decimalSeparator',
      'csvMapping.thousandsSeparator',
      'csvMapping.signStyle',
      'csvMapping.negateAmounts',
    ]);
    expect(problems[1]?.message).toBe('is ":", expected one of ",", ";", "\\t" (or "tab"), "|"');
  });

  it('checks the columns', () => {
    const check = (columns: unknown, extra: object = {}): string[] =>
      validateCsvMapping({ columns, ...extra }).problems.map((p) => `${p.element}: ${p.message}`);
    expect(check({ amount: 2 })).toEqual(['csvMapping.columns.date: is missing, expected the booking date column']);
    expect(check({ date: 0 })).toEqual([
      'csvMapping.columns.amount: is missing, expected an amount column, or debit and credit columns',
    ]);
    expect(check({ date: 0, debit: 1 })).toEqual([
      'csvMapping.columns.credit: is missing, expected an amount column, or debit and credit columns',
    ]);
    expect(check({ date: 0, amount: 1, debit: 2, credit: 3 })).toEqual([
      'csvMapping.columns.amount: is given together with debit/credit, expected either amount or debit and credit',
    ]);
    expect(check({ date: -1, amount: 1.5, payee: 2 })).toEqual([
      'csvMapping.columns.payee: is not a column role, expected one of date, valueDate, amount, debit, credit, indicator, description, counterparty, balance, currency, reference, status, account, type, bankRef',
      'csvMapping.columns.date: is -1, expected a header name or a 0-based column index',
      'csvMapping.columns.amount: is 1.5, expected a header name or a 0-based column index',
    ]);
    expect(check({ date: 'Date', amount: 1 }, { headerLine: null })).toEqual([
      'csvMapping.columns.date: is "Date", expected a 0-based column index because headerLine is null',
    ]);
    expect(check({ date: 0, debit: 1, credit: 2 }, { signStyle: 'indicator' })).toEqual([
      'csvMapping.signStyle: is "indicator", expected columns.indicator',
    ]);
    expect(check({ date: 0, amount: 1, indicator: 2 }, { signStyle: 'debitCredit' })).toEqual([
      'csvMapping.signStyle: is "debitCredit", expected columns.debit and columns.credit',
    ]);
    expect(check({ date: 0, debit: 1, credit: 2, indicator: 3 })).toEqual([
      'csvMapping.columns.indicator: is given without an amount column, expected the unsigned amount it signs',
    ]);
    expect(check('Date')).toEqual([
      'csvMapping.columns: is "Date", expected an object like { "date": "Date", "amount": "Amount" }',
    ]);
  });

  it('refuses a value that is not an object', () => {
    expect(validateCsvMapping('columns').problems[0]?.element).toBe('csvMapping');
    expect(validateCsvMapping(null).problems).toHaveLength(1);
    expect(validateCsvMapping([]).problems).toHaveLength(1);
  });
});

describe('an explicit mapping in an import', () => {
  const text = 'Exported;2025\nWhen;What;Who;Out;In\n02.01.2025;Rent;Atelier;900,00;\n03.01.2025;Sale;;;120,50\n';

  it('maps unknown column names by name', () => {
    const r = parse(text, {
      currency: 'EUR',
      csvMapping: { columns: { date: 'When', description: 'What', counterparty: 'who', debit: 'Out', credit: 'In' } },
    });
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.entries.map((e) => [e.bookingDate, e.amount, e.description, e.counterparty])).toEqual([
      ['2025-01-02', -90000, 'Rent', 'Atelier'],
      ['2025-01-03', 12050, 'Sale', undefined],
    ]);
  });

  it('maps by index with an explicit header line', () => {
    const r = parse(text, {
      currency: 'EUR',
      csvMapping: { headerLine: 2, columns: { date: 0, description: [1, 2], debit: 3, credit: 4 } },
    });
    expect(r.statements[0]?.entries.map((e) => e.description)).toEqual(['Rent Atelier', 'Sale']);
  });

  it('reports a column name that is not in the header, listing the names', () => {
    const r = parse(text, {
      currency: 'EUR',
      csvMapping: { headerLine: 2, columns: { date: 'When', amount: 'Betrag' } },
    });
    expect(r.problems).toEqual([
      {
        file: 'm.csv',
        line: 2,
        element: 'csvMapping.columns.amount',
        message:
          'csvMapping.columns.amount names column "Betrag", which is not in the header, expected one of "When", "What", "Who", "Out", "In"',
        severity: 'error',
      },
    ]);
  });

  it('reports column names no header row has', () => {
    const r = parse(text, { currency: 'EUR', csvMapping: { columns: { date: 'Datum', amount: 'Betrag' } } });
    expect(r.problems[0]?.message).toBe(
      'no row in the first 60 lines has the columns "Datum", "Betrag" named by csvMapping.columns, expected a header row with those names',
    );
  });

  it('reports an index beyond the row and a header line no record starts on', () => {
    const beyond = parse(text, { currency: 'EUR', csvMapping: { headerLine: 2, columns: { date: 0, amount: 9 } } });
    expect(beyond.problems[0]?.message).toBe(
      'csvMapping.columns.amount is column 9, expected an index below 5 (the row has 5 fields)',
    );
    const noLine = parse(text, { currency: 'EUR', csvMapping: { headerLine: 40, columns: { date: 0, amount: 3 } } });
    expect(noLine.problems[0]?.element).toBe('csvMapping.headerLine');
  });

  it('reports mapping shape problems without reading the file', () => {
    const r = parse(text, { currency: 'EUR', csvMapping: { columns: { amount: 1 } } });
    expect(r.problems).toEqual([
      {
        file: 'm.csv',
        line: undefined,
        element: 'csvMapping.columns.date',
        message: 'csvMapping.columns.date is missing, expected the booking date column',
        severity: 'error',
      },
    ]);
  });

  it('overrides the delimiter, decimal separator and data line', () => {
    const csv = 'a,b\nskip me\n2025-01-02,1.234\n';
    const r = parse(csv, {
      currency: 'EUR',
      csvMapping: {
        delimiter: ',',
        headerLine: null,
        dataLine: 3,
        decimalSeparator: ',',
        columns: { date: 0, amount: 1 },
      },
    });
    expect(r.problems).toEqual([]);
    // With a decimal comma, 1.234 is one thousand two hundred thirty-four.
    expect(r.statements[0]?.entries.map((e) => e.amount)).toEqual([123400]);
  });
});

describe('detectCsvLayout', () => {
  const text =
    'Kontonummer;DE89 3704 0044 0532 0130 00\n\nBuchungstag;Valuta;Verwendungszweck;Betrag;Saldo\n' +
    '03.01.2025;03.01.2025;Miete;-1.234,56;8.765,44\n02.01.2025;02.01.2025;Einzahlung;10.000,00;10.000,00\n';

  it('reports everything the preview needs', () => {
    const d = detectCsvLayout(text, { fileName: 'k.csv', currency: 'EUR' });
    expect(d).toMatchObject({
      delimiter: ';',
      headerLine: 3,
      dataLine: 4,
      headerCells: ['Buchungstag', 'Valuta', 'Verwendungszweck', 'Betrag', 'Saldo'],
      columns: [
        { index: 0, name: 'Buchungstag', role: 'date' },
        { index: 1, name: 'Valuta', role: 'valueDate' },
        { index: 2, name: 'Verwendungszweck', role: 'description' },
        { index: 3, name: 'Betrag', role: 'amount' },
        { index: 4, name: 'Saldo', role: 'balance' },
      ],
      dateFormat: 'DD.MM.YYYY',
      dateFormatAmbiguous: false,
      twoDigitYears: false,
      decimalSeparator: ',',
      thousandsSeparator: '.',
      signStyle: 'signed',
      currency: 'EUR',
      account: 'DE89370400440532013000',
      order: 'newestFirst',
      rowCount: 2,
      confidence: 0.9,
      problems: [],
    });
    expect(d.fingerprint).toMatch(/^csv1-/);
    expect(d.sampleRows[0]).toEqual({
      line: 4,
      cells: ['03.01.2025', '03.01.2025', 'Miete', '-1.234,56', '8.765,44'],
    });
  });

  it('returns a mapping that imports the file the same way', () => {
    const d = detectCsvLayout(text, { fileName: 'k.csv', currency: 'EUR' });
    const auto = parse(text, { currency: 'EUR' });
    const explicit = parse(text, { currency: 'EUR', csvMapping: JSON.parse(JSON.stringify(d.mapping)) });
    expect(explicit).toEqual(auto);
    const again = detectCsvLayout(text, { fileName: 'k.csv', currency: 'EUR', csvMapping: d.mapping });
    expect(again.confidence).toBe(1);
  });

  it('flags ambiguous dates and lowers the confidence', () => {
    const d = detectCsvLayout('Date,Text,Amount\n03/04/2025,a,1.00\n', { fileName: 'a.csv', currency: 'USD' });
    expect(d.dateFormatAmbiguous).toBe(true);
    expect(d.dateFormat).toBeUndefined();
    expect(d.confidence).toBeLessThan(0.5);
    expect(d.mapping?.dateFormat).toBeUndefined();
  });

  it('proposes a mapping for a file without header', () => {
    const d = detectCsvLayout('2025-07-01;Kiln power;-61,20\n2025-07-05;Market;418,00\n', {
      fileName: 'h.csv',
      currency: 'EUR',
    });
    expect(d.headerLine).toBeNull();
    expect(d.mapping).toEqual({
      delimiter: ';',
      headerLine: null,
      dataLine: 1,
      columns: { date: 0, amount: 2, description: 1 },
    });
    expect(d.confidence).toBeLessThan(0.5);
    expect(parse('2025-07-01;Kiln power;-61,20\n', { currency: 'EUR', csvMapping: d.mapping }).problems).toEqual([]);
  });

  it('reports two-digit years', () => {
    const d = detectCsvLayout('Datum;Text;Betrag\n01.02.25;a;1,00\n', { fileName: 'y.csv', currency: 'EUR' });
    expect([d.dateFormat, d.twoDigitYears]).toEqual(['DD.MM.YY', true]);
  });
});

describe('detectCsvLayout: sign styles', () => {
  it.each([
    ['Date,Text,Amount\n2025-01-01,a,-5.00\n', 'signed'],
    ['Date,Text,Amount\n2025-01-01,a,(5.00)\n', 'parentheses'],
    ['Date,Text,Amount\n2025-01-01,a,5.00-\n', 'trailingMinus'],
    ['Date,Text,Debit,Credit\n2025-01-01,a,5.00,\n', 'debitCredit'],
    ['Date,Text,Amount,DR/CR\n2025-01-01,a,5.00,DR\n', 'indicator'],
  ])('%j → %s', (text, style) => {
    expect(detectCsvLayout(text, { fileName: 's.csv', currency: 'USD' }).signStyle).toBe(style);
  });
});
