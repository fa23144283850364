// Property test (invented statements): whatever the writer produces in any layout, the importer reads back the same
// entries and the same end-of-day running balances.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { csvImporter } from '../../engine/import/csv';
import { addDays } from '../../engine/core/dates';
import { writeCsv, type CsvLayout } from '../../engine/write/csv';
import type { ParsedStatement, StatementEntry } from '../../engine/import/types';

const PIECES = [
  '"',
  '""',
  ',',
  ';',
  '\t',
  '|',
  '\n',
  '\r\n',
  '\r',
  ' ',
  'é',
  '€',
  '„',
  '🏺',
  'Date',
  'Amount',
  '=1+2',
  "'",
  '\u00a0',
  '-',
  '(1)',
];
const piece = fc.oneof(fc.constantFrom(...PIECES), fc.string({ unit: 'grapheme', maxLength: 6 }));
const text = fc.array(piece, { maxLength: 6 }).map((parts) => parts.join('').trim());
const optionalText = fc.option(
  text.filter((t) => t !== ''),
  { nil: undefined },
);

const entryArb = fc.record({
  offset: fc.integer({ min: 0, max: 365 * 30 }),
  valueShift: fc.option(fc.integer({ min: -3, max: 3 }), { nil: undefined }),
  amount: fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }),
  description: text,
  counterparty: optionalText,
  reference: optionalText,
  pending: fc.constantFrom(false, false, false, true),
});

const statementArb = fc
  .record({
    currency: fc.constantFrom('EUR', 'JPY', 'KWD', 'USD', 'CHF'),
    rows: fc.array(entryArb, { minLength: 1, maxLength: 25 }),
    opening: fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }),
  })
  .map(({ currency, rows, opening }): ParsedStatement => {
    const offsets = rows.map((r) => r.offset).sort((a, b) => a - b);
    // At least two distinct dates, so a newest-first file shows its order.
    if (offsets.length > 1 && offsets[0] === offsets[offsets.length - 1])
      offsets[offsets.length - 1] = (offsets[0] as number) + 1;
    const entries: StatementEntry[] = rows.map((r, k) => {
      const bookingDate = addDays('2000-01-01', offsets[k] as number);
      return {
        bookingDate,
        ...(r.valueShift !== undefined ? { valueDate: addDays(bookingDate, r.valueShift) } : {}),
        amount: r.amount,
        description: r.description,
        ...(r.counterparty !== undefined ? { counterparty: r.counterparty } : {}),
        ...(r.reference !== undefined ? { reference: r.reference } : {}),
        status: r.pending ? 'pending' : 'booked',
        source: {},
      };
    });
    const first = entries[0]?.bookingDate ?? '2000-01-01';
    return {
      account: { name: 'generated' },
      currency,
      entries,
      balances: [{ kind: 'opening', date: first, at: 'start', amount: opening, source: {} }],
    };
  });

const layoutArb = fc
  .record({
    delimiter: fc.constantFrom(',', ';', '\t', '|'),
    decimalSeparator: fc.constantFrom(',', '.'),
    thousandsSeparator: fc.constantFrom('', '.', ',', ' ', '\u00a0', '\u202f', "'"),
    dateFormat: fc.constantFrom('YYYY-MM-DD', 'DD.MM.YYYY', 'DD/MM/YYYY', 'MM/DD/YYYY', 'DD.MM.YY'),
    signStyle: fc.constantFrom('signed', 'debitCredit', 'indicator', 'parentheses', 'trailingMinus'),
    runningBalance: fc.boolean(),
    newestFirst: fc.boolean(),
    preamble: fc.array(fc.constantFrom('account', 'note', 'blank', 'currency'), { maxLength: 3 }),
    includeCurrencyColumn: fc.boolean(),
    lineEnding: fc.constantFrom('\r\n', '\n'),
  })
  .filter((l) => l.thousandsSeparator !== l.decimalSeparator);

type LayoutDraft = typeof layoutArb extends fc.Arbitrary<infer T> ? T : never;

function layoutFor(l: LayoutDraft, currency: string): CsvLayout {
  const d = l.delimiter;
  const lines = l.preamble.map((kind) =>
    kind === 'account'
      ? `Account${d}DE89 3704 0044 0532 0130 00`
      : kind === 'currency'
        ? `Currency${d}${currency}`
        : kind === 'note'
          ? 'Exported statement'
          : '',
  );
  const { preamble: _preamble, ...rest } = l;
  return { ...rest, preambleLines: lines } as CsvLayout;
}

function comparable(e: StatementEntry): unknown[] {
  return [e.bookingDate, e.valueDate, e.amount, e.description, e.counterparty, e.reference, e.status];
}

/** End-of-day booked balances: opening plus booked amounts through each date that has a booked entry. */
function expectedBalances(s: ParsedStatement): [string, number][] {
  let balance = s.balances[0]?.amount ?? 0;
  const out: [string, number][] = [];
  for (const e of s.entries) {
    if (e.status !== 'booked') continue;
    balance += e.amount;
    const last = out[out.length - 1];
    if (last && last[0] === e.bookingDate) last[1] = balance;
    else out.push([e.bookingDate, balance]);
  }
  return out;
}

/** Day and month can only be told apart when some day is above 12 (or every date reads the same both ways). */
function datesAmbiguous(s: ParsedStatement, format: string): boolean {
  if (format !== 'DD/MM/YYYY' && format !== 'MM/DD/YYYY') return false;
  const dates = s.entries.flatMap((e) => (e.valueDate ? [e.bookingDate, e.valueDate] : [e.bookingDate]));
  const parts = dates.map((d) => [Number(d.slice(8, 10)), Number(d.slice(5, 7))] as const);
  return parts.every(([day]) => day <= 12) && parts.some(([day, month]) => day !== month);
}

describe('CSV round trip (property)', () => {
  it('reads back what writeCsv wrote, in every layout', () => {
    fc.assert(
      fc.property(statementArb, layoutArb, (statement, draft) => {
        const layout = layoutFor(draft, statement.currency);
        const csv = writeCsv(statement, layout);
        const options = { fileName: 'roundtrip.csv', currency: statement.currency };
        let result = csvImporter.parse(csv, options);
        const ambiguous = datesAmbiguous(statement, layout.dateFormat);
        if (ambiguous) {
          // The importer must refuse to guess, and ask for the date format.
          expect(result.problems.map((p) => p.message).join('\n')).toContain('csvMapping.dateFormat');
          result = csvImporter.parse(csv, { ...options, csvMapping: { dateFormat: layout.dateFormat } });
        }
        expect(result.problems).toEqual([]);
        const read = result.statements[0] as ParsedStatement;
        expect(read.currency).toBe(statement.currency);
        expect(read.entries.map(comparable)).toEqual(statement.entries.map(comparable));
        const balances = read.balances.map((b) => [b.date, b.amount]);
        expect(balances).toEqual(layout.runningBalance ? expectedBalances(statement) : []);
        expect(read.balances.every((b) => b.kind === 'running' && b.at === 'end')).toBe(true);
      }),
      { seed: 20250301, numRuns: 400 },
    );
  });
});
