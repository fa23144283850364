import { describe, expect, it } from 'vitest';
import { csvImporter } from '../../engine/import/csv';
import { hasErrors, type ImportOptions, type ImportResult } from '../../engine/import/types';

function parse(text: string, options: Partial<ImportOptions> = {}): ImportResult {
  return csvImporter.parse(text, { fileName: 'test.csv', ...options });
}

function amounts(r: ImportResult): number[] {
  return (r.statements[0]?.entries ?? []).map((e) => e.amount);
}

function errors(r: ImportResult): { line: number | undefined; message: string }[] {
  return r.problems.filter((p) => p.severity === 'error').map((p) => ({ line: p.line, message: p.message }));
}

describe('sign conventions', () => {
  it('one signed column, with leading minus or plus', () => {
    expect(
      amounts(
        parse('Date;Text;Amount\n2025-01-01;a;-5,00\n2025-01-02;b;+7,00\n2025-01-03;c;8,00\n', { currency: 'EUR' }),
      ),
    ).toEqual([-500, 700, 800]);
  });

  it('separate debit and credit columns; a debit written positive or negative is money out', () => {
    const text =
      'Date;Text;Debit;Credit\n2025-01-01;a;5,00;\n2025-01-02;b;-6,00;\n2025-01-03;c;;7,00\n2025-01-04;d;0,00;\n';
    expect(amounts(parse(text, { currency: 'EUR' }))).toEqual([-500, -600, 700, 0]);
  });

  it('refuses a row with both or neither of debit and credit', () => {
    const text = 'Date;Text;Debit;Credit\n2025-01-01;a;5,00;1,00\n2025-01-02;b;;\n';
    expect(errors(parse(text, { currency: 'EUR' }))).toEqual([
      { line: 2, message: 'debit "5,00" and credit "1,00" are both filled, expected one of them' },
      { line: 3, message: 'debit and credit are both empty, expected an amount in one of them' },
    ]);
  });

  it.each([
    ['D', 'C'],
    ['DR', 'CR'],
    ['S', 'H'],
    ['Debit', 'Credit'],
    ['-', '+'],
    ['Af', 'Bij'],
    ['Soll', 'Haben'],
  ])('an indicator column with %s / %s', (debit, credit) => {
    // Common practice, no source: debit/credit marks printed by bank exports in several languages.
    const text = `Date;Text;Amount;D/C\n2025-01-01;a;5,00;${debit}\n2025-01-02;b;7,00;${credit}\n`;
    expect(amounts(parse(text, { currency: 'EUR' }))).toEqual([-500, 700]);
  });

  it('refuses an unknown indicator and a negative amount marked as credit', () => {
    const text = 'Date;Text;Amount;DR/CR\n2025-01-01;a;5,00;X\n2025-01-02;b;-7,00;CR\n2025-01-03;c;-7,00;DR\n';
    expect(errors(parse(text, { currency: 'EUR' }))).toEqual([
      {
        line: 2,
        message: 'indicator "X" is not a debit/credit mark, expected D/C, DR/CR, S/H, Debit/Credit, Af/Bij or -/+',
      },
      {
        line: 3,
        message: 'amount "-7,00" is negative but the indicator "CR" says credit, expected an unsigned amount',
      },
    ]);
  });

  it('parentheses, trailing minus and CR/DR suffixes', () => {
    const text =
      'Date,Text,Amount\n2025-01-01,a,(5.00)\n2025-01-02,b,6.00-\n2025-01-03,c,7.00 DR\n2025-01-04,d,8.00 CR\n';
    expect(amounts(parse(text, { currency: 'USD' }))).toEqual([-500, -600, -700, 800]);
  });

  it('negateAmounts flips files written from the bank view', () => {
    const text = 'Date,Text,Amount\n2025-01-01,purchase,12.00\n2025-01-02,refund,-2.00\n';
    expect(amounts(parse(text, { currency: 'USD', csvMapping: { negateAmounts: true } }))).toEqual([-1200, 200]);
  });
});

describe('currency', () => {
  it('comes from a currency column, a preamble, a column name, the amount cells or the option', () => {
    const rows = '2025-01-01;a;5,00\n';
    expect(parse(`Date;Text;Amount;Currency\n2025-01-01;a;5,00;chf\n`).statements[0]?.currency).toBe('CHF');
    expect(parse(`Currency;GBP\nDate;Text;Amount\n${rows}`).statements[0]?.currency).toBe('GBP');
    expect(parse(`Date;Text;Amount (SEK)\n${rows}`).statements[0]?.currency).toBe('SEK');
    expect(parse(`Date;Text;Amount\n2025-01-01;a;5,00 NOK\n`).statements[0]?.currency).toBe('NOK');
    expect(parse(`Date;Text;Amount\n${rows}`, { currency: 'dkk' }).statements[0]?.currency).toBe('DKK');
  });

  it('refuses a file that states none and was given none, asking for --currency', () => {
    expect(errors(parse('Date;Text;Amount\n2025-01-01;a;5,00\n'))).toEqual([
      {
        line: 1,
        message:
          'no currency stated (no currency column, preamble line or code beside the amounts), expected one: give --currency CODE',
      },
    ]);
  });

  it('refuses an unknown ISO 4217 code', () => {
    // Source: ISO 4217 list one has no code "EUX".
    expect(errors(parse('Date;Text;Amount;Currency\n2025-01-01;a;5,00;EUX\n'))).toEqual([
      { line: 2, message: 'currency "EUX" is not an ISO 4217 code, expected a code like EUR' },
    ]);
    expect(errors(parse('Date;Text;Amount\n2025-01-01;a;5,00\n', { currency: 'XYZ' }))[0]?.message).toBe(
      'requested currency "XYZ" (--currency) is not an ISO 4217 code, expected a code like EUR',
    );
  });

  it('refuses mixed currencies naming the line', () => {
    const text = 'Date;Text;Amount;Currency\n2025-01-01;a;5,00;EUR\n2025-01-02;b;6,00;EUR\n2025-01-03;c;7,00;USD\n';
    expect(errors(parse(text))).toEqual([
      {
        line: 4,
        message: 'currency "USD" differs from EUR stated on line 2 (currency column), expected one currency per file',
      },
    ]);
    const cells = 'Currency;EUR\nDate;Text;Amount\n2025-01-01;a;5,00 USD\n';
    expect(errors(parse(cells))[0]).toEqual({
      line: 3,
      message: 'currency "USD" differs from EUR stated on line 1 (preamble), expected one currency per file',
    });
  });

  it('refuses a file whose currency contradicts --currency', () => {
    expect(errors(parse('Date;Text;Amount;Currency\n2025-01-01;a;5,00;EUR\n', { currency: 'USD' }))).toEqual([
      {
        line: 2,
        message:
          'file states currency EUR (currency column), but the requested currency (--currency) is USD, expected them to agree',
      },
    ]);
  });

  it('uses the currency exponent: JPY has no decimals, KWD three', () => {
    // Source: ISO 4217 list one, minor units JPY 0, KWD 3.
    expect(amounts(parse('Date;Text;Amount\n2025-01-01;a;-1.200\n', { currency: 'JPY' }))).toEqual([-1200]);
    expect(amounts(parse('Date;Text;Amount\n2025-01-01;a;-1,200\n', { currency: 'KWD' }))).toEqual([-1200]);
  });
});

describe('account', () => {
  it('comes from an account column', () => {
    const text =
      'Account;Date;Text;Amount\nde89 3704 0044 0532 0130 00;2025-01-01;a;5,00\nDE89370400440532013000;2025-01-02;b;5,00\n';
    expect(parse(text, { currency: 'EUR', account: 'ignored' }).statements[0]?.account).toEqual({
      identifier: 'DE89370400440532013000',
    });
  });

  it('refuses two accounts in one file', () => {
    const text = 'Account;Date;Text;Amount\n111;2025-01-01;a;5,00\n222;2025-01-02;b;5,00\n';
    expect(errors(parse(text, { currency: 'EUR' }))).toEqual([
      { line: 3, message: 'account "222" differs from "111" on line 2, expected one account per file' },
    ]);
  });

  it('falls back to the option, then to the file name', () => {
    const text = 'Date;Text;Amount\n2025-01-01;a;5,00\n';
    expect(parse(text, { currency: 'EUR', account: 'Studio' }).statements[0]?.account).toEqual({ name: 'Studio' });
    expect(parse(text, { currency: 'EUR', account: 'GB82 WEST 1234 5698 7654 32' }).statements[0]?.account).toEqual({
      identifier: 'GB82WEST12345698765432',
      name: 'GB82 WEST 1234 5698 7654 32',
    });
    expect(parse(text, { currency: 'EUR', fileName: 'march.csv' }).statements[0]?.account).toEqual({
      name: 'march.csv',
    });
  });
});

describe('pending rows and status', () => {
  it('marks pending and vorgemerkt rows as pending', () => {
    const text =
      'Date;Text;Amount;Status\n2025-01-01;a;1,00;booked\n2025-01-02;b;2,00;Pending\n2025-01-03;c;3,00;vorgemerkt\n2025-01-04;d;4,00;\n';
    const r = parse(text, { currency: 'EUR' });
    expect(r.statements[0]?.entries.map((e) => e.status)).toEqual(['booked', 'pending', 'pending', 'booked']);
  });

  it('refuses an unknown status rather than guessing', () => {
    const text = 'Date;Text;Amount;Status\n2025-01-01;a;1,00;cancelled\n';
    expect(errors(parse(text, { currency: 'EUR' }))).toEqual([
      {
        line: 2,
        message:
          'status "cancelled" is not a known booking status, expected booked or pending (or no status column in csvMapping)',
      },
    ]);
  });
});

describe('entries', () => {
  it('keeps value date, counterparty, reference, type and bank id, and joins description columns', () => {
    const text =
      'Buchungstag;Valuta;Buchungstext;Verwendungszweck;Beschreibung;Empfänger;Referenz;Transaction ID;Betrag\n' +
      '02.01.2025;03.01.2025;LASTSCHRIFT; Miete ;Januar;Atelier;E2E-1;B-77;-900,00\n';
    const r = parse(text, { currency: 'EUR' });
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.entries[0]).toEqual({
      bookingDate: '2025-01-02',
      valueDate: '2025-01-03',
      amount: -90000,
      description: 'Miete Januar',
      counterparty: 'Atelier',
      reference: 'E2E-1',
      bankRef: 'B-77',
      typeCode: 'LASTSCHRIFT',
      status: 'booked',
      source: { line: 2 },
    });
  });

  it('decides "Valuta" from its content', () => {
    const asDate = parse('Date;Valuta;Text;Amount\n2025-01-02;2025-01-04;a;1,00\n', { currency: 'EUR' });
    expect(asDate.statements[0]?.entries[0]?.valueDate).toBe('2025-01-04');
    const asCurrency = parse('Datum;Valuta;Omschrijving;Bedrag\n2025-01-02;EUR;a;1,00\n');
    expect(asCurrency.statements[0]?.currency).toBe('EUR');
  });

  it('sorts an unsorted file without a balance by date, stably', () => {
    const text = 'Date,Text,Amount\n2025-01-03,c,3.00\n2025-01-01,a,1.00\n2025-01-03,d,4.00\n2025-01-02,b,2.00\n';
    const r = parse(text, { currency: 'USD' });
    expect(r.statements[0]?.entries.map((e) => e.description)).toEqual(['a', 'b', 'c', 'd']);
  });
});

describe('structural problems refuse the file and name the line', () => {
  it('an empty file', () => {
    expect(errors(parse(''))).toEqual([{ line: 1, message: 'file is empty, expected a header row and data rows' }]);
    expect(errors(parse('\ufeff \r\n'))[0]?.line).toBe(1);
  });

  it('a header without data rows', () => {
    expect(errors(parse('Note;x\nDate;Text;Amount\n;;\n', { currency: 'EUR' }))).toEqual([
      { line: 2, message: 'file has no data rows after the header, expected at least one row' },
    ]);
  });

  it('duplicated header names', () => {
    const text = 'Date;Text;Amount;Text\n2025-01-01;a;1,00;b\n';
    expect(errors(parse(text, { currency: 'EUR' }))).toEqual([
      { line: 1, message: 'column name "Text" appears twice (columns 2 and 4), expected each name once' },
    ]);
  });

  it('missing required columns in a header named by the mapping', () => {
    const text = 'Info\nDate;Text;Note\n2025-01-01;a;b\n';
    expect(errors(parse(text, { currency: 'EUR', csvMapping: { headerLine: 2 } }))).toEqual([
      {
        line: 2,
        message:
          'header "Date", "Text", "Note" has no amount column (like "Amount") and no debit and credit columns, expected one, or an explicit csvMapping.columns',
      },
    ]);
  });

  it('rows with the wrong number of fields', () => {
    const text = 'Date;Text;Amount\n2025-01-01;a;1,00\n2025-01-02;b\n2025-01-03;c;3,00;x\n2025-01-04;d;4,00;;\n';
    expect(errors(parse(text, { currency: 'EUR' }))).toEqual([
      { line: 3, message: 'row has 2 fields, expected 3 as in the header on line 1' },
      {
        line: 4,
        message: 'row has 4 fields, expected 3 as in the header on line 1 (an unquoted delimiter inside a field?)',
      },
    ]);
  });

  it('tolerates trailing empty fields on the header and rows', () => {
    const text = 'Date;Text;Amount;\n2025-01-01;a;1,00;\n2025-01-02;b;2,00\n';
    expect(parse(text, { currency: 'EUR' }).problems).toEqual([]);
  });

  it('an unclosed quoted field', () => {
    const text = 'Date;Text;Amount\n2025-01-01;"a;1,00\n2025-01-02;b;2,00\n';
    expect(errors(parse(text, { currency: 'EUR' }))[0]).toEqual({
      line: 2,
      message:
        'quoted field opened on this line is never closed, expected a closing quote (") before the end of the file',
    });
  });

  it('an empty date and an empty amount', () => {
    const text = 'Date;Text;Amount\n2025-01-01;a;1,00\n;b;2,00\n2025-01-03;c;\n';
    expect(errors(parse(text, { currency: 'EUR' }))).toEqual([
      { line: 3, message: 'date is empty, expected a date like 2025-01-31 (Y-M-D)' },
      { line: 4, message: 'amount is empty, expected a number like -1234,56' },
    ]);
  });

  it('lists at most 100 errors and says how many more there are', () => {
    const rows = Array.from({ length: 150 }, (_, k) => `2025-01-01;r${k};x`).join('\n');
    const r = parse(`Date;Text;Amount\n${rows}\n`, { currency: 'EUR' });
    expect(r.problems).toHaveLength(101);
    expect(r.problems[100]).toMatchObject({ line: 102, severity: 'error' });
    expect(r.problems[100]?.message).toBe('50 more errors from this line on are not listed, expected none');
  });

  it('every refusal carries the file name', () => {
    const r = parse('Date;Text;Amount\n2025-01-01;a;x\n', { currency: 'EUR', fileName: 'x.csv' });
    expect(hasErrors(r)).toBe(true);
    expect(r.statements).toEqual([]);
    expect(r.problems.every((p) => p.file === 'x.csv')).toBe(true);
  });
});

describe('formats decided from all rows, not from the first ones', () => {
  // The importer converts rows with formats guessed from the first 256 rows and must redo
  // them when all rows decide otherwise; these files change their evidence late.
  it('a month-first date after 300 rows that read either way', () => {
    const rows = Array.from({ length: 300 }, (_, i) => `01/01/2025,r${i},1.00`);
    const r = parse(['Date,Text,Amount', ...rows, '01/13/2025,late,2.00', ''].join('\n'), { currency: 'USD' });
    expect(hasErrors(r)).toBe(false);
    const entries = r.statements[0]?.entries ?? [];
    expect(entries).toHaveLength(301);
    expect(entries[300]?.bookingDate).toBe('2025-01-13');
  });

  it('a decimal comma shown only after 300 amounts that could group thousands', () => {
    // "1,500" alone reads as 1500.00 in EUR (a comma grouping thousands); a later "2,50"
    // settles the comma as the decimal separator, so every "1,500" is 1.50.
    const rows = Array.from({ length: 300 }, (_, i) => `2025-01-01;r${i};1,500`);
    const r = parse(['Date;Text;Amount', ...rows, '2025-01-02;late;2,50', ''].join('\n'), { currency: 'EUR' });
    expect(hasErrors(r)).toBe(false);
    expect(amounts(r).slice(0, 2)).toEqual([150, 150]);
    expect(amounts(r).slice(-1)).toEqual([250]);
  });
});
