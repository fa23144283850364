/**
 * Property: any generated statements written as MT940 and read back give the same entries
 * and balances. Text is compared in the form the writer documents (`mt940Text`: SWIFT X
 * transliteration, collapsed spaces, code-word look-alikes softened). Invented data.
 *
 * Domain limits (the writer's documented ones): descriptions are words of at most 12
 * characters (so no line ever needs the one lossy cut, see `wrapField86`); references have
 * no slashes and are not `NONREF`; booking and value dates are at most 7 days apart; dates
 * lie in 1981–2078 (two-digit-year pivot 80).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDays, fromDayNumber, toDayNumber } from '../../engine/core/dates';
import { mt940Importer } from '../../engine/import/mt940';
import { hasErrors, type ParsedStatement, type StatementBalance, type StatementEntry } from '../../engine/import/types';
import { mt940Text, writeMt940 } from '../../engine/write/mt940';

const FIRST_DAY = toDayNumber('1981-01-01');
const LAST_DAY = toDayNumber('2078-10-01');

const dayArb = fc.oneof(
  fc.integer({ min: FIRST_DAY, max: LAST_DAY }).map(fromDayNumber),
  // Year ends, so that entry dates roll over into the next year and back.
  fc
    .record({ year: fc.integer({ min: 1981, max: 2077 }), day: fc.integer({ min: 10, max: 31 }) })
    .map(({ year, day }) => `${year}-12-${String(day).padStart(2, '0')}`),
);

const WORD_CHARS = [
  ..."abcdefghijklmnopqrstuvwxyzABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789/-?:().,'+",
  ...'äéßØ€&;!_@“”–{}',
];
const wordArb = fc.oneof(
  { weight: 8, arbitrary: fc.string({ unit: fc.constantFrom(...WORD_CHARS), minLength: 1, maxLength: 12 }) },
  // Text that looks like MT940 structure must survive as text.
  {
    weight: 1,
    arbitrary: fc.constantFrom(
      '/NAME/',
      '/REMI/',
      'USTD//',
      '/EREF',
      '166?20',
      ':20:',
      ':61:',
      '-',
      '-}',
      '{4:',
      '?32',
      '/',
    ),
  },
);
const textArb = (maxWords: number) =>
  fc
    .array(fc.tuple(wordArb, fc.constantFrom(' ', ' ', '  ', '\t', '\n')), { maxLength: maxWords })
    .map((parts) => parts.map(([w, s]) => w + s).join(''));

const chars = (text: string): string[] => [...text];
const UPPER = chars('ABCDEFGHIJKLMNOPQRSTUVWXYZ');
const DIGITS = chars('0123456789');
const stringOf = (alphabet: readonly string[], minLength: number, maxLength: number) =>
  fc.string({ unit: fc.constantFrom(...alphabet), minLength, maxLength });

const refArb = stringOf([...UPPER, ...chars('abcxyz'), ...DIGITS, '.', '-'], 1, 16).filter(
  (r) => r.toUpperCase() !== 'NONREF',
);
const identifierArb = stringOf([...UPPER, ...DIGITS], 6, 30);
const bicArb = fc
  .tuple(
    stringOf(UPPER, 6, 6),
    stringOf([...UPPER, ...DIGITS], 2, 2),
    fc.option(stringOf([...UPPER, ...DIGITS], 3, 3), { nil: '' }),
  )
  .map((parts) => parts.join(''));
const statementIdArb = stringOf([...UPPER, ...DIGITS, '-'], 1, 16);

function entryArb(start: string) {
  return fc
    .record({
      offset: fc.integer({ min: 0, max: 40 }),
      valueShift: fc.option(fc.integer({ min: -7, max: 7 }), { nil: undefined }),
      amount: fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }),
      description: textArb(80),
      counterparty: fc.option(textArb(6), { nil: undefined }),
      reference: fc.option(refArb, { nil: undefined }),
      bankRef: fc.option(refArb, { nil: undefined }),
      typeCode: fc.constantFrom('NTRF', 'NCHK', 'NMSC', 'S103', 'FCHG', 'NDDT'),
    })
    .map((e): StatementEntry => {
      const bookingDate = addDays(start, e.offset);
      return {
        bookingDate,
        ...(e.valueShift !== undefined ? { valueDate: addDays(bookingDate, e.valueShift) } : {}),
        amount: e.amount,
        description: e.description,
        ...(e.counterparty !== undefined ? { counterparty: e.counterparty } : {}),
        ...(e.reference !== undefined ? { reference: e.reference } : {}),
        ...(e.bankRef !== undefined ? { bankRef: e.bankRef } : {}),
        status: 'booked',
        typeCode: e.typeCode,
        source: {},
      };
    });
}

const statementArb: fc.Arbitrary<ParsedStatement> = dayArb.chain((start) =>
  fc
    .record({
      currency: fc.constantFrom('EUR', 'JPY', 'KWD', 'USD', 'CHF'),
      identifier: identifierArb,
      servicer: fc.option(bicArb, { nil: undefined }),
      statementId: statementIdArb,
      entries: fc.array(entryArb(start), { maxLength: 12 }),
      openingAtStart: fc.boolean(),
      opening: fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }),
      closingLag: fc.integer({ min: 0, max: 3 }),
      available: fc.option(fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }), { nil: undefined }),
      forward: fc.array(fc.integer({ min: -1_000_000_000, max: 1_000_000_000 }), { maxLength: 3 }),
    })
    .map((s): ParsedStatement => {
      const last =
        s.entries
          .map((e) => e.bookingDate)
          .sort()
          .pop() ?? start;
      const closingDate = addDays(last, s.closingLag);
      const net = s.entries.reduce((sum, e) => sum + e.amount, 0);
      const balances: StatementBalance[] = [
        s.openingAtStart
          ? { kind: 'opening', date: start, at: 'start', amount: s.opening, source: {} }
          : { kind: 'opening', date: addDays(start, -1), at: 'end', amount: s.opening, source: {} },
        { kind: 'closing', date: closingDate, at: 'end', amount: s.opening + net, source: {} },
        ...(s.available !== undefined
          ? [{ kind: 'available', date: closingDate, at: 'end', amount: s.available, source: {} } as const]
          : []),
        ...s.forward.map(
          (amount, i) =>
            ({ kind: 'available', date: addDays(closingDate, i + 1), at: 'end', amount, source: {} }) as const,
        ),
      ];
      return {
        account: { identifier: s.identifier, ...(s.servicer !== undefined ? { servicer: s.servicer } : {}) },
        currency: s.currency,
        statementId: s.statementId,
        entries: s.entries,
        balances,
      };
    }),
);

/** A balance as the day it holds at the end of, so `start` of D and `end` of D − 1 compare equal. */
const balanceKey = (b: StatementBalance) => ({
  kind: b.kind,
  endOfDay: b.at === 'start' ? addDays(b.date, -1) : b.date,
  amount: b.amount,
});

const expectedEntry = (e: StatementEntry) => {
  const counterparty = e.counterparty !== undefined ? mt940Text(e.counterparty) : '';
  return {
    bookingDate: e.bookingDate,
    valueDate: e.valueDate ?? e.bookingDate,
    amount: e.amount,
    description: mt940Text(e.description),
    ...(counterparty !== '' ? { counterparty } : {}),
    ...(e.reference !== undefined ? { reference: e.reference } : {}),
    ...(e.bankRef !== undefined ? { bankRef: e.bankRef } : {}),
    status: 'booked',
    typeCode: e.typeCode,
  };
};

describe('MT940 write → read round trip', () => {
  it('gives back the same entries and balances', () => {
    fc.assert(
      fc.property(fc.array(statementArb, { minLength: 1, maxLength: 3 }), fc.boolean(), (statements, blockWrappers) => {
        const text = writeMt940(statements, { blockWrappers });
        const result = mt940Importer.parse(text, { fileName: 'roundtrip.sta' });
        expect(hasErrors(result), JSON.stringify(result.problems)).toBe(false);
        expect(result.statements).toHaveLength(statements.length);
        statements.forEach((written, i) => {
          const read = result.statements[i] as ParsedStatement;
          expect(read.currency).toBe(written.currency);
          expect(read.statementId).toBe(written.statementId);
          expect(read.account).toEqual(written.account);
          expect(read.entries.map(({ source: _source, ...rest }) => rest)).toEqual(written.entries.map(expectedEntry));
          expect(read.balances.map(balanceKey)).toEqual(written.balances.map(balanceKey));
        });
      }),
      { seed: 940, numRuns: 300 },
    );
  });
});
