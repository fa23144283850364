import { describe, expect, it } from 'vitest';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { balance, entry, result, statement } from './make';
import { errorCode } from '../core/errorCode';

// Invented identifiers (the bank code EBBL is made up) with valid ISO 13616 check digits.
const IBAN = 'NL94 EBBL 0123 4567 89';
const IBAN_COMPACT = 'NL94EBBL0123456789';
const OTHER_IBAN = 'NL46EBBL0987654321';

describe('buildLedger: accounts', () => {
  it('matches one account across files by the normalised IBAN', () => {
    const ledger = buildLedger([
      result('a.xml', [statement(IBAN, [entry('2026-01-02', -100, 'Clay')])]),
      result('b.xml', [statement(IBAN_COMPACT.toLowerCase(), [entry('2026-02-02', -200, 'Glaze')])]),
    ]);
    expect(ledger.accounts).toHaveLength(1);
    expect(ledger.accounts[0]).toEqual({
      id: IBAN_COMPACT,
      name: IBAN_COMPACT,
      currency: 'EUR',
      identifiers: [IBAN_COMPACT],
      kind: 'current',
    });
    expect(ledger.transactions.map((t) => t.amount)).toEqual([-100, -200]);
  });

  it('joins a national bank code/account number to the IBAN that contains it', () => {
    // The BBAN of NL94EBBL0123456789 is bank code EBBL, account 0123456789.
    const ledger = buildLedger([
      result('a.xml', [statement(IBAN, [entry('2026-01-02', -100, 'Clay')])]),
      result('b.sta', [statement('EBBL/0123456789', [entry('2026-02-02', -200, 'Glaze')])], 'mt940'),
    ]);
    expect(ledger.accounts).toHaveLength(1);
    expect(ledger.accounts[0]?.identifiers).toEqual([IBAN_COMPACT, 'EBBL0123456789']);
  });

  it('keeps an identifier seen in two currencies as two accounts', () => {
    const ledger = buildLedger([
      result('a.xml', [
        statement(IBAN, [entry('2026-01-02', -100, 'Clay')]),
        statement(IBAN, [entry('2026-01-02', -300, 'Kiln part')], [], { currency: 'USD' }),
      ]),
    ]);
    expect(ledger.accounts.map((a) => [a.id, a.currency])).toEqual([
      [IBAN_COMPACT, 'EUR'],
      [`${IBAN_COMPACT} USD`, 'USD'],
    ]);
  });

  it('names an account without identifier after its file, or after options.account', () => {
    const files = [
      result('exports/card.csv', [statement(undefined, [entry('2026-01-02', -100, 'Kiln shelf')])], 'csv'),
      result('cash.csv', [statement(undefined, [entry('2026-01-03', -50, 'Coffee')])], 'csv'),
    ];
    expect(buildLedger(files).accounts.map((a) => [a.id, a.name, a.identifiers])).toEqual([
      ['card.csv', 'card.csv', []],
      ['cash.csv', 'cash.csv', []],
    ]);
    const named = buildLedger(files, { account: 'Studio card' });
    expect(named.accounts.map((a) => a.id)).toEqual(['Studio card']);
    expect(named.transactions).toHaveLength(2);
  });

  it('puts a statement without identifier into the account that options.account names by IBAN', () => {
    const ledger = buildLedger(
      [
        result('export.csv', [statement(undefined, [entry('2026-01-02', -100, 'Clay')])], 'csv'),
        result('jan.xml', [statement(IBAN_COMPACT, [entry('2026-01-02', -100, 'Clay'), entry('2026-01-03', 5, 'x')])]),
      ],
      { account: IBAN },
    );
    expect(ledger.accounts).toHaveLength(1);
    expect(ledger.files.map((f) => f.accounts[0]?.duplicates)).toEqual([0, 1]);
  });

  it('takes the currency from options for statements that state none, and refuses otherwise', () => {
    const noCurrency = [result('x.csv', [statement(undefined, [entry('2026-01-02', 1, 'a')], [], { currency: '' })])];
    expect(buildLedger(noCurrency, { currency: 'CHF' }).accounts[0]?.currency).toBe('CHF');
    expect(errorCode(() => buildLedger(noCurrency))).toBe('INVALID_ARGUMENT');
    const unknown = [result('x.csv', [statement(undefined, [], [], { currency: 'XYZ' })])];
    expect(errorCode(() => buildLedger(unknown))).toBe('UNKNOWN_CURRENCY');
  });

  it('refuses results that carry errors (all-or-nothing)', () => {
    const bad = result('bad.xml', [], 'camt.053', [{ file: 'bad.xml', line: 3, message: 'broken', severity: 'error' }]);
    expect(errorCode(() => buildLedger([bad]))).toBe('INVALID_ARGUMENT');
  });

  it('does not mutate its input and gives equal ledgers for equal input', () => {
    const files = [
      result('a.xml', [statement(IBAN, [entry('2026-01-02', -100, 'Clay')], [balance('opening', '2026-01-01', 500)])]),
    ];
    const copy = JSON.parse(JSON.stringify(files));
    const first = buildLedger(files);
    expect(files).toEqual(copy);
    expect(buildLedger(copy)).toEqual(first);
  });
});

describe('buildLedger: duplicates', () => {
  const coffee = (extra = {}) => entry('2026-03-07', -350, 'Market stall coffee', extra);

  it('keeps every occurrence of a repeated transaction within one file', () => {
    const ledger = buildLedger([result('a.xml', [statement(IBAN, [coffee(), coffee(), coffee()])])]);
    expect(ledger.transactions.map((t) => t.occurrence)).toEqual([1, 2, 3]);
    expect(new Set(ledger.transactions.map((t) => t.id)).size).toBe(3);
    expect(ledger.files[0]?.accounts[0]).toMatchObject({ entries: 3, duplicates: 0 });
  });

  it("drops a later file's k-th occurrence only when earlier files gave at least k", () => {
    const ledger = buildLedger([
      result('feb-mar.xml', [statement(IBAN, [coffee(), coffee()])]),
      result('mar-apr.xml', [statement(IBAN, [coffee(), coffee(), coffee(), entry('2026-04-01', -900, 'Rent')])]),
      result('mar.csv', [statement(IBAN, [coffee()])], 'csv'),
    ]);
    expect(ledger.files.map((f) => [f.accounts[0]?.entries, f.accounts[0]?.duplicates])).toEqual([
      [2, 0],
      [2, 2],
      [0, 1],
    ]);
    expect(ledger.transactions.filter((t) => t.amount === -350)).toHaveLength(3);
  });

  it('treats a different date, amount or wording as a different transaction', () => {
    const ledger = buildLedger([
      result('a.xml', [statement(IBAN, [coffee()])]),
      result('b.xml', [
        statement(IBAN, [
          entry('2026-03-08', -350, 'Market stall coffee'),
          entry('2026-03-07', -360, 'Market stall coffee'),
          entry('2026-03-07', -350, 'Market stall tea'),
        ]),
      ]),
    ]);
    expect(ledger.files[1]?.accounts[0]?.duplicates).toBe(0);
    expect(ledger.transactions).toHaveLength(4);
  });

  it('matches the same entry printed differently: case, punctuation, word order, counterparty', () => {
    const ledger = buildLedger([
      result('a.xml', [
        statement(IBAN, [entry('2026-03-09', 12000, 'INV-2026-014', { counterparty: 'Fennel & Rye Bistro' })]),
      ]),
      result('b.csv', [statement(IBAN, [entry('2026-03-09', 12000, 'fennel rye bistro  inv 2026 014')])], 'csv'),
    ]);
    expect(ledger.files[1]?.accounts[0]?.duplicates).toBe(1);
  });

  it('never matches entries of different accounts', () => {
    const ledger = buildLedger([
      result('a.xml', [statement(IBAN, [coffee()])]),
      result('b.xml', [statement(OTHER_IBAN, [coffee()])]),
    ]);
    expect(ledger.transactions).toHaveLength(2);
  });

  it('drops an entry whose bank id was seen earlier on the account, even if its text differs', () => {
    const ledger = buildLedger([
      result('a.xml', [statement(IBAN, [entry('2026-03-09', 12000, 'Commission', { bankRef: 'AS-991' })])]),
      result('b.xml', [statement(IBAN, [entry('2026-03-10', 12000, 'Commission payment', { bankRef: 'AS-991' })])]),
    ]);
    expect(ledger.files[1]?.accounts[0]?.duplicates).toBe(1);
    expect(ledger.transactions).toHaveLength(1);
    expect(ledger.transactions[0]?.sourceFile).toBe('a.xml');
  });

  it('keeps identical entries with different bank ids, in any order', () => {
    const ledger = buildLedger([
      result('a.xml', [statement(IBAN, [coffee({ bankRef: 'R1' })])]),
      result('b.xml', [statement(IBAN, [coffee({ bankRef: 'R2' }), coffee({ bankRef: 'R1' })])]),
    ]);
    expect(ledger.files[1]?.accounts[0]).toMatchObject({ entries: 1, duplicates: 1 });
    expect(ledger.transactions.map((t) => t.bankRef)).toEqual(['R1', 'R2']);
  });

  it('matches entries without bank ids to earlier ones with bank ids, and the reverse', () => {
    const withRefs = result('jan.xml', [statement(IBAN, [coffee({ bankRef: 'R1' }), coffee({ bankRef: 'R2' })])]);
    const withoutRefs = result('jan.csv', [statement(IBAN, [coffee(), coffee()])], 'csv');
    const a = buildLedger([withRefs, withoutRefs]);
    expect(a.files[1]?.accounts[0]).toMatchObject({ entries: 0, duplicates: 2 });
    const b = buildLedger([withoutRefs, withRefs]);
    expect(b.files[1]?.accounts[0]).toMatchObject({ entries: 0, duplicates: 2 });
    // A third file with the bank ids again is recognised by them, not counted twice.
    const c = buildLedger([withoutRefs, withRefs, withRefs]);
    expect(c.files[2]?.accounts[0]).toMatchObject({ entries: 0, duplicates: 2 });
    expect(c.transactions).toHaveLength(2);
  });

  it('ignores placeholder bank ids such as NONREF', () => {
    const ledger = buildLedger([
      result(
        'a.sta',
        [statement(IBAN, [coffee({ bankRef: 'NONREF' }), entry('2026-03-08', -5, 'x', { bankRef: 'NONREF' })])],
        'mt940',
      ),
    ]);
    expect(ledger.transactions).toHaveLength(2);
  });

  it('leaves pending entries out and reports each as a notice', () => {
    const ledger = buildLedger([
      result(
        'a.ofx',
        [
          statement(IBAN, [
            coffee(),
            entry('2026-03-10', -2599, 'Glaze order', { status: 'pending', source: { line: 42 } }),
          ]),
        ],
        'ofx',
      ),
    ]);
    expect(ledger.transactions).toHaveLength(1);
    expect(ledger.files[0]?.accounts[0]).toMatchObject({ entries: 1, duplicates: 0, pending: 1, net: -350 });
    expect(ledger.files[0]?.problems).toEqual([
      {
        file: 'a.ofx',
        line: 42,
        message: 'pending entry of 2026-03-10 (-25.99 EUR) left out: only booked entries count',
        severity: 'notice',
      },
    ]);
  });

  it('orders transactions by account, then booking date, then file order', () => {
    const ledger = buildLedger([
      result('b.xml', [statement(IBAN, [entry('2026-03-05', 2, 'second'), entry('2026-03-01', 1, 'first')])]),
      result('c.xml', [statement(OTHER_IBAN, [entry('2026-01-01', 9, 'other')])]),
      result('a.xml', [statement(IBAN, [entry('2026-03-05', 3, 'third')])]),
    ]);
    expect(ledger.transactions.map((t) => t.description)).toEqual(['first', 'second', 'third', 'other']);
  });
});

describe('buildLedger: per-file figures', () => {
  it('reports from, to, opening, closing and net per file and account', () => {
    const ledger = buildLedger([
      result(
        'q1.sta',
        [
          statement(
            IBAN,
            [entry('2026-01-05', -100, 'a')],
            [balance('opening', '2025-12-31', 1000, 'end'), balance('closing', '2026-01-31', 900)],
            {
              from: '2026-01-01',
              to: '2026-01-31',
            },
          ),
          statement(
            IBAN,
            [entry('2026-02-05', 50, 'b')],
            [balance('opening', '2026-01-31', 900, 'end'), balance('closing', '2026-02-28', 950)],
            {
              from: '2026-02-01',
              to: '2026-02-28',
            },
          ),
        ],
        'mt940',
      ),
    ]);
    expect(ledger.files[0]).toMatchObject({
      file: 'q1.sta',
      format: 'mt940',
      accounts: [
        {
          accountId: IBAN_COMPACT,
          currency: 'EUR',
          from: '2026-01-01',
          to: '2026-02-28',
          entries: 2,
          duplicates: 0,
          opening: 1000,
          closing: 950,
          net: -50,
        },
      ],
    });
    expect(ledger.statements.map((s) => [s.statementIndex, s.consistent])).toEqual([
      [0, true],
      [1, true],
    ]);
    expect(ledger.anchors.map((a) => [a.date, a.kind])).toEqual([
      ['2025-12-31', 'opening'],
      ['2026-01-31', 'closing'],
      ['2026-01-31', 'opening'],
      ['2026-02-28', 'closing'],
    ]);
  });
});
