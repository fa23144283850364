import { describe, expect, it } from 'vitest';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { balance, entry, result, statement } from './make';

const IBAN = 'NL94EBBL0123456789';

describe('reconciliation', () => {
  it('reconciles opening + entries = closing over consecutive statements', () => {
    const ledger = buildLedger([
      result('jan.xml', [
        statement(
          IBAN,
          [entry('2026-01-05', -400, 'a'), entry('2026-01-20', 1500, 'b')],
          [balance('opening', '2026-01-01', 10000), balance('closing', '2026-01-31', 11100)],
        ),
      ]),
      result('feb.xml', [
        statement(
          IBAN,
          [entry('2026-02-02', -100, 'c')],
          [balance('opening', '2026-02-01', 11100), balance('closing', '2026-02-28', 11000)],
        ),
      ]),
    ]);
    expect(ledger.reconciliation[0]).toEqual({
      accountId: IBAN,
      reconciled: true,
      relative: false,
      startingBalance: 10000,
      startingFrom: { kind: 'opening', date: '2026-01-01', sourceFile: 'jan.xml' },
      checkedAnchors: 3,
      mismatchedAnchors: 0,
      firstMismatch: null,
      firstDate: '2026-01-01',
      lastDate: '2026-02-28',
      closingBalance: 11000,
      note: null,
    });
  });

  it('reports the first anchor that disagrees, with expected, computed, difference and file, and does not smooth', () => {
    const ledger = buildLedger([
      result('jan.xml', [
        statement(
          IBAN,
          [entry('2026-01-05', -400, 'a')],
          [balance('opening', '2026-01-01', 10000), balance('closing', '2026-01-31', 9600)],
        ),
      ]),
      // February's closing is wrong by 1.00.
      result('feb.xml', [
        statement(
          IBAN,
          [entry('2026-02-02', -100, 'c')],
          [balance('opening', '2026-02-01', 9600), balance('closing', '2026-02-28', 9600)],
        ),
      ]),
      result('mar.xml', [
        statement(
          IBAN,
          [entry('2026-03-02', 50, 'd')],
          [balance('opening', '2026-03-01', 9500), balance('closing', '2026-03-31', 9550)],
        ),
      ]),
    ]);
    const r = ledger.reconciliation[0];
    expect(r?.reconciled).toBe(false);
    expect(r?.firstMismatch).toEqual({
      date: '2026-02-28',
      at: 'end',
      kind: 'closing',
      expected: 9600,
      computed: 9500,
      difference: 100,
      sourceFile: 'feb.xml',
      source: { line: 1 },
      lastAgreement: '2026-01-31',
    });
    // March agrees with the rebuilt balance again: only February's closing is off.
    expect(r?.mismatchedAnchors).toBe(1);
    expect(r?.closingBalance).toBe(9550);
    expect(ledger.statements.map((s) => [s.file, s.consistent, s.difference])).toEqual([
      ['jan.xml', true, 0],
      ['feb.xml', false, 100],
      ['mar.xml', true, 0],
    ]);
  });

  it('finds a missing entry as a mismatch at the next stated balance', () => {
    // The second file lacks an entry the bank booked: its opening no longer follows.
    const ledger = buildLedger([
      result('a.xml', [
        statement(
          IBAN,
          [entry('2026-01-05', -400, 'a')],
          [balance('opening', '2026-01-01', 10000), balance('closing', '2026-01-10', 9600)],
        ),
      ]),
      result('b.xml', [
        statement(IBAN, [], [balance('opening', '2026-01-20', 9000), balance('closing', '2026-01-31', 9000)]),
      ]),
    ]);
    const m = ledger.reconciliation[0]?.firstMismatch;
    expect(m).toMatchObject({
      date: '2026-01-20',
      at: 'start',
      kind: 'opening',
      expected: 9000,
      computed: 9600,
      difference: -600,
      lastAgreement: '2026-01-10',
    });
  });

  it('reads an opening dated the previous day (end of day) like MT940 :60F:', () => {
    const ledger = buildLedger([
      result(
        'jan.sta',
        [
          statement(
            IBAN,
            [entry('2026-01-01', -400, 'New year fee')],
            [balance('opening', '2025-12-31', 10000, 'end'), balance('closing', '2026-01-31', 9600)],
          ),
        ],
        'mt940',
      ),
    ]);
    expect(ledger.reconciliation[0]).toMatchObject({
      reconciled: true,
      startingBalance: 10000,
      firstDate: '2025-12-31',
    });
  });

  it('takes an opening at the start of a day with entries on that day before them', () => {
    const ledger = buildLedger([
      result('jan.xml', [
        statement(
          IBAN,
          [entry('2026-01-01', -400, 'a')],
          [balance('opening', '2026-01-01', 10000), balance('closing', '2026-01-01', 9600)],
        ),
      ]),
    ]);
    expect(ledger.reconciliation[0]).toMatchObject({ reconciled: true, startingBalance: 10000, closingBalance: 9600 });
  });

  it('back-computes the start from the earliest closing or running balance when no opening is stated', () => {
    const ledger = buildLedger([
      result(
        'export.csv',
        [
          statement(
            IBAN,
            [entry('2026-01-02', -100, 'a'), entry('2026-01-03', -200, 'b'), entry('2026-01-05', 50, 'c')],
            [
              balance('running', '2026-01-02', 900),
              balance('running', '2026-01-03', 700),
              balance('running', '2026-01-05', 750),
            ],
          ),
        ],
        'csv',
      ),
    ]);
    expect(ledger.reconciliation[0]).toMatchObject({
      reconciled: true,
      startingBalance: 1000,
      startingFrom: { kind: 'running', date: '2026-01-02', sourceFile: 'export.csv' },
      checkedAnchors: 2,
    });
    expect(ledger.statements[0]).toMatchObject({ opening: 1000, closing: 750, net: -250, consistent: true });
  });

  it('spots a wrong running balance in the middle of a CSV', () => {
    const ledger = buildLedger([
      result(
        'export.csv',
        [
          statement(
            IBAN,
            [entry('2026-01-02', -100, 'a'), entry('2026-01-03', -200, 'b'), entry('2026-01-05', 50, 'c')],
            [
              balance('running', '2026-01-02', 900),
              balance('running', '2026-01-03', 701),
              balance('running', '2026-01-05', 750),
            ],
          ),
        ],
        'csv',
      ),
    ]);
    expect(ledger.reconciliation[0]?.firstMismatch).toMatchObject({
      date: '2026-01-03',
      expected: 701,
      computed: 700,
      difference: 1,
      lastAgreement: '2026-01-02',
    });
  });

  it('never reconciles available balances', () => {
    const ledger = buildLedger([
      result(
        'a.ofx',
        [
          statement(
            IBAN,
            [entry('2026-01-05', -400, 'a')],
            [balance('closing', '2026-01-31', 9600), balance('available', '2026-01-31', 123)],
          ),
        ],
        'ofx',
      ),
    ]);
    expect(ledger.reconciliation[0]).toMatchObject({
      reconciled: null,
      checkedAnchors: 0,
      note: 'one stated balance only: nothing to check it against',
    });
    expect(ledger.anchors.map((a) => a.kind)).toEqual(['closing', 'available']);
  });

  it('reports an account without any stated balance as relative, reconciled null', () => {
    const ledger = buildLedger([
      result(
        'card.csv',
        [statement(undefined, [entry('2026-01-02', -100, 'a'), entry('2026-01-09', -50, 'b')])],
        'csv',
      ),
    ]);
    expect(ledger.reconciliation[0]).toEqual({
      accountId: 'card.csv',
      reconciled: null,
      relative: true,
      startingBalance: 0,
      startingFrom: null,
      checkedAnchors: 0,
      mismatchedAnchors: 0,
      firstMismatch: null,
      firstDate: '2026-01-02',
      lastDate: '2026-01-09',
      closingBalance: -150,
      note: 'no stated balance: balances are relative',
    });
  });

  it('reconciles overlapping files once duplicates are removed', () => {
    const jan = [entry('2026-01-05', -400, 'a'), entry('2026-01-06', -400, 'a'), entry('2026-01-20', 1500, 'b')];
    const ledger = buildLedger([
      result('jan.xml', [
        statement(IBAN, jan, [balance('opening', '2026-01-01', 10000), balance('closing', '2026-01-31', 10700)]),
      ]),
      result(
        'q1.csv',
        [
          statement(
            IBAN,
            [...jan, entry('2026-02-03', -700, 'c')],
            [balance('running', '2026-01-20', 10700), balance('running', '2026-02-03', 10000)],
          ),
        ],
        'csv',
      ),
    ]);
    expect(ledger.files[1]?.accounts[0]).toMatchObject({ entries: 1, duplicates: 3 });
    expect(ledger.reconciliation[0]).toMatchObject({ reconciled: true, checkedAnchors: 3, closingBalance: 10000 });
  });

  it('keeps the same anchor stated by two files once', () => {
    const s = statement(
      IBAN,
      [entry('2026-01-05', -400, 'a')],
      [balance('opening', '2026-01-01', 10000), balance('closing', '2026-01-31', 9600)],
    );
    const ledger = buildLedger([result('a.xml', [s]), result('a-copy.xml', [s])]);
    expect(ledger.anchors).toHaveLength(2);
    expect(ledger.anchors.every((a) => a.sourceFile === 'a.xml')).toBe(true);
    expect(ledger.reconciliation[0]?.reconciled).toBe(true);
  });
});
