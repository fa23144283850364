import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { csvImporter } from '../../engine/import/csv';
import { checkRunningBalance } from '../../engine/import/csv/balance';
import { detectRowOrder } from '../../engine/import/csv/order';
import type { ImportResult } from '../../engine/import/types';

function parse(text: string, fileName = 'b.csv'): ImportResult {
  return csvImporter.parse(text, { fileName, currency: 'EUR' });
}

describe('reconciliation: a broken running balance', () => {
  it('refuses the fixture, naming the line and both numbers', () => {
    // The fixture is consistent up to line 5 (1150.00); line 6 books −30.00 and states 1070.00 instead of 1120.00.
    const text = readFileSync(new URL('../fixtures/csv/broken-balance.csv', import.meta.url), 'utf8');
    const r = parse(text, 'broken-balance.csv');
    expect(r.statements).toEqual([]);
    expect(r.problems).toEqual([
      {
        file: 'broken-balance.csv',
        line: 6,
        message:
          'running balance 1070.00 does not follow from the balance 1150.00 on line 5 plus the amounts since (-30.00), expected 1120.00',
        severity: 'error',
      },
    ]);
  });

  it('names the line in a newest-first file and uses the file decimal comma', () => {
    const text =
      'Datum;Text;Betrag;Saldo\n03.01.2025;c;-1,00;8,00\n02.01.2025;b;-1,00;10,00\n01.01.2025;a;5,00;11,00\n';
    expect(parse(text).problems).toEqual([
      {
        file: 'b.csv',
        line: 2,
        message:
          'running balance 8,00 does not follow from the balance 10,00 on line 3 plus the amounts since (-1,00), expected 9,00',
        severity: 'error',
      },
    ]);
  });
});

describe('running balances of a consistent file', () => {
  it('gives one end-of-day balance per date, oldest first, and skips pending rows', () => {
    const text =
      'Date;Text;Amount;Balance;Status\n' +
      '2025-01-01;a;10,00;110,00;booked\n' +
      '2025-01-01;b;-5,00;105,00;booked\n' +
      '2025-01-02;c;-50,00;;pending\n' +
      '2025-01-02;d;1,00;;booked\n' +
      '2025-01-03;e;2,00;108,00;booked\n';
    const r = parse(text);
    expect(r.problems).toEqual([]);
    expect(r.statements[0]?.balances).toEqual([
      { kind: 'running', date: '2025-01-01', at: 'end', amount: 10500, source: { line: 3 } },
      { kind: 'running', date: '2025-01-03', at: 'end', amount: 10800, source: { line: 6 } },
    ]);
  });

  it('finds the direction of a one-day file from the balances', () => {
    const oldestFirst = 'Date;Text;Amount;Balance\n2025-01-01;a;10,00;110,00\n2025-01-01;b;-5,00;105,00\n';
    const newestFirst = 'Date;Text;Amount;Balance\n2025-01-01;b;-5,00;105,00\n2025-01-01;a;10,00;110,00\n';
    for (const text of [oldestFirst, newestFirst]) {
      const r = parse(text);
      expect(r.problems).toEqual([]);
      expect(r.statements[0]?.entries.map((e) => e.description)).toEqual(['a', 'b']);
      expect(r.statements[0]?.balances.map((b) => b.amount)).toEqual([10500]);
    }
  });

  it('refuses a file whose dates go both ways when it has a balance column', () => {
    const text = 'Date;Text;Amount;Balance\n2025-01-01;a;1,00;1,00\n2025-01-03;b;1,00;2,00\n2025-01-02;c;1,00;3,00\n';
    expect(parse(text).problems[0]).toMatchObject({
      line: 4,
      message:
        'date 2025-01-02 breaks the date order of the rows before it (2025-01-03 on line 3), expected rows sorted by date for the running balance check',
    });
  });
});

describe('checkRunningBalance and detectRowOrder', () => {
  it('continues from the stated balance after a mismatch (one missing row → one problem)', () => {
    const rows = {
      dates: ['2025-01-01', '2025-01-02', '2025-01-03', '2025-01-04'],
      amounts: [100, 10, 10, 10],
      balances: [100, 110, 130, 140],
      pending: [false, false, false, false],
      lines: [2, 3, 4, 5],
    };
    const { mismatches } = checkRunningBalance(rows, [0, 1, 2, 3]);
    expect(mismatches).toEqual([{ line: 4, found: 130, expected: 120, previousLine: 3, previous: 110, amount: 10 }]);
  });

  it('detects the order of dates', () => {
    expect(detectRowOrder(['2025-01-01', '2025-01-01', '2025-01-02'])).toEqual({ order: 'oldestFirst' });
    expect(detectRowOrder(['2025-01-02', '2025-01-01'])).toEqual({ order: 'newestFirst' });
    expect(detectRowOrder(['2025-01-02', '2025-01-02'])).toEqual({ order: 'unknown' });
    expect(detectRowOrder([])).toEqual({ order: 'unknown' });
    expect(detectRowOrder(['2025-01-02', '2025-01-01', '2025-01-03'])).toEqual({ order: 'unsorted', breakIndex: 2 });
  });
});
