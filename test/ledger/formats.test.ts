// One test per statement format: statements written by that format's writer, read back by
// the importer (picked by content), with one stated balance deliberately broken. The
// ledger must report the first mismatching day and file, and never smooth it away.
import { describe, expect, it } from 'vitest';
import { importStatement } from '../../engine/import/registry';
import type { ImportResult, ParsedStatement, StatementEntry } from '../../engine/import/types';
import { buildLedger } from '../../engine/ledger/buildLedger';
import { writeCamt053 } from '../../engine/write/camt053';
import { writeCsv } from '../../engine/write/csv';
import { encodeText } from '../../engine/write/encode';
import { writeMt940 } from '../../engine/write/mt940';
import { writeOfx } from '../../engine/write/ofx';

const IBAN = 'NL94EBBL0123456789';

function e(bookingDate: string, amount: number, description: string, bankRef?: string): StatementEntry {
  return {
    bookingDate,
    amount,
    description,
    counterparty: 'Riverclay Supplies',
    ...(bankRef ? { bankRef } : {}),
    status: 'booked',
    source: {},
  };
}

/** Three consistent monthly statements: 1000.00 opening, closings 950.00, 1070.00, 1040.00. */
function months(): ParsedStatement[] {
  const spec: [string, string, StatementEntry[]][] = [
    ['2026-01-01', '2026-01-31', [e('2026-01-06', -8000, 'Clay order', 'B1'), e('2026-01-17', 3000, 'Refund', 'B2')]],
    [
      '2026-02-01',
      '2026-02-28',
      [e('2026-02-03', 15000, 'Commission INV-2026-004', 'B3'), e('2026-02-14', -3000, 'Glaze', 'B4')],
    ],
    ['2026-03-01', '2026-03-31', [e('2026-03-02', -3000, 'Kiln shelf', 'B5')]],
  ];
  let balance = 100000;
  return spec.map(([from, to, entries], i) => {
    const opening = balance;
    for (const x of entries) balance += x.amount;
    return {
      account: { identifier: IBAN, name: 'Studio account' },
      currency: 'EUR',
      statementId: `S-2026-0${i + 1}`,
      from,
      to,
      entries,
      balances: [
        { kind: 'opening', date: from, at: 'start', amount: opening, source: {} },
        { kind: 'closing', date: to, at: 'end', amount: balance, source: {} },
      ],
    };
  });
}

/** Raises the closing balance of statement `index` by 1.00. */
function breakClosing(statements: ParsedStatement[], index: number): ParsedStatement[] {
  return statements.map((s, i) =>
    i !== index
      ? s
      : { ...s, balances: s.balances.map((b) => (b.kind === 'closing' ? { ...b, amount: b.amount + 100 } : b)) },
  );
}

function read(
  file: string,
  text: string,
  encoding: 'utf-8' | 'utf-8-bom' = 'utf-8',
): { file: string; result: ImportResult } {
  const result = importStatement(encodeText(text, encoding), { fileName: file });
  expect(
    result.problems.filter((p) => p.severity === 'error'),
    file,
  ).toEqual([]);
  return { file, result: result as ImportResult };
}

describe('a broken closing balance is found in every format', () => {
  it('camt.053 (001.08): three monthly files, February closing off by 1.00', () => {
    const s = breakClosing(months(), 1);
    const files = s.map((st, i) => read(`0${i + 1}.xml`, writeCamt053([st], { version: '001.08' })));
    expect(files.map((f) => f.result.format)).toEqual(['camt.053', 'camt.053', 'camt.053']);
    const ledger = buildLedger(files);
    const r = ledger.reconciliation[0];
    expect(r?.reconciled).toBe(false);
    expect(r?.firstMismatch).toMatchObject({
      date: '2026-02-28',
      kind: 'closing',
      expected: 107100,
      computed: 107000,
      difference: 100,
      sourceFile: '02.xml',
      lastAgreement: '2026-01-31',
    });
    expect(r?.mismatchedAnchors).toBe(1);
    expect(ledger.statements.map((x) => x.consistent)).toEqual([true, false, true]);
  });

  it('MT940: one file with three statements, February :62F: off by 1.00', () => {
    const file = read('q1.sta', writeMt940(breakClosing(months(), 1)));
    expect(file.result.format).toBe('mt940');
    const ledger = buildLedger([file]);
    expect(ledger.reconciliation[0]?.firstMismatch).toMatchObject({
      date: '2026-02-28',
      expected: 107100,
      computed: 107000,
      difference: 100,
      sourceFile: 'q1.sta',
    });
    expect(ledger.statements.map((x) => x.consistent)).toEqual([true, false, true]);
  });

  it('OFX 2: three monthly files with ledger balances only, February LEDGERBAL off by 1.00', () => {
    const closingsOnly = breakClosing(months(), 1).map((st) => ({
      ...st,
      balances: st.balances.filter((b) => b.kind === 'closing'),
    }));
    const files = closingsOnly.map((st, i) => read(`0${i + 1}.ofx`, writeOfx([st], { version: 2 })));
    expect(files.map((f) => f.result.format)).toEqual(['ofx', 'ofx', 'ofx']);
    const r = buildLedger(files).reconciliation[0];
    // The start is back-computed from January's closing; February disagrees, March agrees again.
    expect(r).toMatchObject({ reconciled: false, startingBalance: 100000, checkedAnchors: 2, mismatchedAnchors: 1 });
    expect(r?.firstMismatch).toMatchObject({
      date: '2026-02-28',
      difference: 100,
      sourceFile: '02.ofx',
      lastAgreement: '2026-01-31',
    });
  });

  it('OFX 1 (SGML) reads back to the same ledger as OFX 2', () => {
    const st = months().map((x) => ({ ...x, balances: x.balances.filter((b) => b.kind === 'closing') }));
    const v1 = buildLedger(st.map((x, i) => read(`0${i + 1}.ofx`, writeOfx([x], { version: 1 }))));
    const v2 = buildLedger(st.map((x, i) => read(`0${i + 1}.ofx`, writeOfx([x], { version: 2 }))));
    expect(v1.reconciliation).toEqual(v2.reconciliation);
    expect(v1.reconciliation[0]?.reconciled).toBe(true);
  });

  it('CSV: running balances, February written from an opening off by 1.00', () => {
    const layout = {
      delimiter: ';',
      decimalSeparator: ',',
      thousandsSeparator: '.',
      dateFormat: 'DD.MM.YYYY',
      signStyle: 'signed',
      runningBalance: true,
      newestFirst: false,
      preambleLines: ['Account;NL94 EBBL 0123 4567 89', 'Currency;EUR'],
      includeCurrencyColumn: false,
      lineEnding: '\r\n',
    } as const;
    const s = months();
    const broken = s.map((st, i) =>
      i !== 1
        ? st
        : { ...st, balances: st.balances.map((b) => (b.kind === 'opening' ? { ...b, amount: b.amount + 100 } : b)) },
    );
    const files = broken.map((st, i) => read(`0${i + 1}.csv`, writeCsv(st, layout), 'utf-8-bom'));
    expect(files.map((f) => f.result.format)).toEqual(['csv', 'csv', 'csv']);
    const r = buildLedger(files).reconciliation[0];
    expect(r?.reconciled).toBe(false);
    // The first running balance of February (3 Feb) is the first that disagrees.
    expect(r?.firstMismatch).toMatchObject({
      date: '2026-02-03',
      kind: 'running',
      difference: 100,
      sourceFile: '02.csv',
      lastAgreement: '2026-01-17',
    });
  });

  it('the same statements, unbroken, reconcile in every format and give equal balances', () => {
    const s = months();
    const ledgers = [
      buildLedger(s.map((st, i) => read(`0${i + 1}.xml`, writeCamt053([st], { version: '001.08' })))),
      buildLedger([read('q1.sta', writeMt940(s))]),
      buildLedger(
        s.map((st, i) =>
          read(
            `0${i + 1}.ofx`,
            writeOfx([{ ...st, balances: st.balances.filter((b) => b.kind === 'closing') }], { version: 2 }),
          ),
        ),
      ),
    ];
    for (const l of ledgers) {
      expect(l.reconciliation[0]).toMatchObject({ reconciled: true, closingBalance: 104000, lastDate: '2026-03-31' });
      expect(l.transactions.map((t) => t.amount)).toEqual([-8000, 3000, 15000, -3000, -3000]);
    }
  });

  it('drops the duplicates of a CSV export that overlaps camt.053 files (no bank ids in the CSV)', () => {
    const s = months();
    const camt = s.map((st, i) => read(`0${i + 1}.xml`, writeCamt053([st], { version: '001.08' })));
    const q1: ParsedStatement = {
      ...s[0]!,
      from: '2026-01-01',
      to: '2026-03-31',
      entries: s.flatMap((st) => st.entries.map(({ bankRef: _b, ...rest }) => rest)),
      balances: [s[0]!.balances[0]!],
    };
    const csv = read(
      'q1.csv',
      writeCsv(q1, {
        delimiter: ';',
        decimalSeparator: ',',
        dateFormat: 'DD.MM.YYYY',
        signStyle: 'signed',
        runningBalance: true,
        newestFirst: true,
        preambleLines: ['IBAN;NL94EBBL0123456789', 'Currency;EUR'],
        includeCurrencyColumn: false,
        lineEnding: '\r\n',
      }),
    );
    const ledger = buildLedger([...camt, csv]);
    expect(ledger.files[3]?.accounts[0]).toMatchObject({ entries: 0, duplicates: 5 });
    expect(ledger.reconciliation[0]).toMatchObject({ reconciled: true, checkedAnchors: 10 });
  });
});
