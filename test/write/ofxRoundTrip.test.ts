// Property test: statements written by writeOfx (OFX 1.0.2 SGML and OFX 2.2 XML) and read
// back by the OFX importer give the same entries and balances. All data is generated.
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fromDayNumber, toDayNumber } from '../../engine/core/dates';
import { ofxImporter } from '../../engine/import/ofx';
import { combineNameAndMemo } from '../../engine/import/ofx/ofxDescription';
import { OFX_TRANSACTION_TYPES } from '../../engine/import/ofx/readOfxStatements';
import type { ParsedStatement, StatementBalance, StatementEntry } from '../../engine/import/types';
import { writeOfx } from '../../engine/write/ofx';

// Characters that OFX must escape or that stress decoding, plus ordinary text.
const TEXT_CHARS = [...'abcXYZ019 -/.,:;#%&<>"\'éßø€😀', '&amp;', '&#65;', '<NAME>', ']]>', '<!--'];

/** Free text as an importer produces it: trimmed, single spaces. */
const freeText = (maxParts: number) =>
  fc
    .array(fc.constantFrom(...TEXT_CHARS), { maxLength: maxParts })
    .map((parts) => parts.join('').replace(/\s+/g, ' ').trim());

/** A name of at most 32 code points (OFX NAME is A-32). */
const nameText = freeText(40).map((t) => Array.from(t).slice(0, 32).join('').trim());
const token = (max: number) =>
  fc.array(fc.constantFrom(...'ABCxyz0189-_/&<>#'), { minLength: 1, maxLength: max }).map((c) => c.join(''));

const day = fc.integer({ min: toDayNumber('1990-01-01'), max: toDayNumber('2040-12-31') }).map(fromDayNumber);

const entryArb = fc
  .record({
    bookingDate: day,
    valueDate: fc.option(day, { nil: undefined }),
    amount: fc.integer({ min: -1_000_000_000_000, max: 1_000_000_000_000 }),
    name: nameText,
    memo: freeText(60),
    reference: fc.option(token(20), { nil: undefined }),
    bankRef: fc.option(token(30), { nil: undefined }),
    typeCode: fc.option(fc.constantFrom(...OFX_TRANSACTION_TYPES, 'NTRF', 'check'), { nil: undefined }),
  })
  .map(({ name, memo, ...rest }): StatementEntry => {
    const e: Record<string, unknown> = {
      bookingDate: rest.bookingDate,
      amount: rest.amount,
      description: combineNameAndMemo(name, memo),
      status: 'booked',
      source: {},
    };
    if (rest.valueDate !== undefined) e.valueDate = rest.valueDate;
    if (name !== '') e.counterparty = name;
    if (rest.reference !== undefined) e.reference = rest.reference;
    if (rest.bankRef !== undefined) e.bankRef = rest.bankRef;
    if (rest.typeCode !== undefined) e.typeCode = rest.typeCode;
    return e as unknown as StatementEntry;
  });

const balanceArb = (kind: 'closing' | 'available') =>
  fc.option(
    fc
      .record({ date: day, amount: fc.integer({ min: -1e12, max: 1e12 }) })
      .map(({ date, amount }): StatementBalance => ({ kind, date, at: 'end', amount, source: {} })),
    { nil: undefined },
  );

const statementArb = fc
  .record({
    kind: fc.constantFrom('current', 'savings', 'card'),
    identifier: token(22),
    servicer: fc.option(fc.stringMatching(/^[0-9]{9}$/), { nil: undefined }),
    currency: fc.constantFrom('EUR', 'USD', 'JPY', 'KWD', 'CHF', 'CLF'),
    dates: fc.tuple(day, day).map(([a, b]) => (a <= b ? [a, b] : [b, a])),
    entries: fc.array(entryArb, { maxLength: 8 }),
    closing: balanceArb('closing'),
    available: balanceArb('available'),
  })
  .map((g): ParsedStatement => {
    // Bank references are unique within a statement, as FITIDs must be.
    const entries = g.entries.map((e, i) => (e.bankRef === undefined ? e : { ...e, bankRef: `${e.bankRef}.${i}` }));
    const account =
      g.kind === 'card'
        ? { identifier: g.identifier, kind: 'card' as const }
        : { identifier: g.identifier, kind: g.kind, ...(g.servicer !== undefined ? { servicer: g.servicer } : {}) };
    return {
      account,
      currency: g.currency,
      from: g.dates[0],
      to: g.dates[1],
      entries,
      balances: [g.closing, g.available].filter((b): b is StatementBalance => b !== undefined),
    };
  });

/** What the importer must give back for a written entry; generated FITIDs are checked apart. */
function expectedEntry(e: StatementEntry): Omit<StatementEntry, 'source' | 'bankRef'> {
  const valid = e.typeCode !== undefined && OFX_TRANSACTION_TYPES.includes(e.typeCode);
  const { source: _source, bankRef: _bankRef, ...rest } = e;
  return { ...rest, typeCode: valid ? e.typeCode : e.amount < 0 ? 'DEBIT' : 'CREDIT' };
}

function withoutSource(s: ParsedStatement) {
  return {
    ...s,
    entries: s.entries.map(({ source: _source, bankRef: _bankRef, ...rest }) => rest),
    balances: s.balances.map(({ source: _source, ...rest }) => rest),
  };
}

describe('OFX write → read round trip (property)', () => {
  it('gives back the same entries, FITIDs, names, memos and balances in OFX 1 and OFX 2', () => {
    fc.assert(
      fc.property(fc.array(statementArb, { minLength: 1, maxLength: 3 }), (statements) => {
        // The message sets have a fixed order: bank statements, then card statements.
        const ordered = [
          ...statements.filter((s) => s.account.kind !== 'card'),
          ...statements.filter((s) => s.account.kind === 'card'),
        ];
        const expected = ordered.map((s) => ({
          account: s.account,
          currency: s.currency,
          from: s.from,
          to: s.to,
          entries: s.entries.map(expectedEntry),
          balances: s.balances.map(({ source: _source, ...rest }) => rest),
        }));
        const fitIds: (string | undefined)[][][] = [];
        for (const version of [1, 2] as const) {
          const text = writeOfx(statements, { version });
          const result = ofxImporter.parse(text, { fileName: `roundtrip-v${version}.ofx` });
          expect(result.problems.filter((p) => p.severity === 'error')).toEqual([]);
          expect(result.statements.map(withoutSource)).toEqual(expected);
          fitIds.push(result.statements.map((s) => s.entries.map((e) => e.bankRef)));
          result.statements.forEach((s, i) =>
            s.entries.forEach((e, j) => {
              const given = ordered[i]?.entries[j]?.bankRef;
              if (given !== undefined) expect(e.bankRef).toBe(given);
              else expect(e.bankRef).toMatch(/^\d{8}-[0-9a-f]{8}-\d+$/);
            }),
          );
        }
        // Generated FITIDs are the same whichever version was written.
        expect(fitIds[1]).toEqual(fitIds[0]);
      }),
      { numRuns: 250, seed: 20240131 },
    );
  });
});
