/**
 * Turns a ledger (engine/ledger/buildLedger.ts) into the derived rows a workspace database
 * stores: accounts with their reconciliation, transactions, balance anchors, and what each
 * stored file contributes. Pure; the caller writes the rows in one transaction.
 */
import type { Ledger } from '../../../../engine/ledger/types';
import type { AccountRecord, AnchorRecord, StatementRecord, TransactionRecord } from './records';

/** The fields of a StatementRecord that come from the latest ledger rebuild. */
export type StatementLedgerFields = Pick<
  StatementRecord,
  'accounts' | 'accountIds' | 'from' | 'to' | 'entries' | 'duplicates' | 'problems'
>;

export interface LedgerRows {
  readonly accounts: AccountRecord[];
  readonly transactions: TransactionRecord[];
  readonly anchors: AnchorRecord[];
  /** Per stored file id. */
  readonly files: Map<string, StatementLedgerFields>;
}

/**
 * Derived rows of `ledger`.
 *
 * @param fileIds stored file id of each ledger file name (`LedgerInputFile.file`).
 * @throws Error when the ledger names a file that `fileIds` does not know (a programming
 *   error: the ledger must be built from exactly the stored files).
 * @example ledgerRows(ledger, new Map([['jan.xml', 'f1']])).accounts[0].reconciled // true
 */
export function ledgerRows(ledger: Ledger, fileIds: ReadonlyMap<string, string>): LedgerRows {
  const idOf = (file: string): string => {
    const id = fileIds.get(file);
    if (id === undefined) throw new Error(`the ledger names file "${file}", which is not stored`);
    return id;
  };
  const entries = new Map<string, number>();
  const transactions: TransactionRecord[] = new Array(ledger.transactions.length);
  ledger.transactions.forEach((t, i) => {
    entries.set(t.accountId, (entries.get(t.accountId) ?? 0) + 1);
    const row: TransactionRecord = {
      id: t.id,
      seq: i,
      accountId: t.accountId,
      bookingDate: t.bookingDate,
      amount: t.amount,
      currency: t.currency,
      description: t.description,
      fingerprint: t.fingerprint,
      statementId: idOf(t.sourceFile),
    };
    if (t.valueDate !== undefined) row.valueDate = t.valueDate;
    if (t.counterparty !== undefined) row.counterparty = t.counterparty;
    if (t.reference !== undefined) row.reference = t.reference;
    if (t.bankRef !== undefined) row.bankRef = t.bankRef;
    if (t.typeCode !== undefined) row.typeCode = t.typeCode;
    transactions[i] = row;
  });
  const accounts: AccountRecord[] = ledger.accounts.map((a, order) => {
    const r = ledger.reconciliation[order];
    if (!r || r.accountId !== a.id) throw new Error(`the ledger has no reconciliation for account "${a.id}"`);
    const m = r.firstMismatch;
    return {
      id: a.id,
      name: a.name,
      currency: a.currency,
      identifiers: [...a.identifiers],
      kind: a.kind,
      order,
      entries: entries.get(a.id) ?? 0,
      firstDate: r.firstDate,
      lastDate: r.lastDate,
      closingBalance: r.closingBalance,
      relative: r.relative,
      reconciled: r.reconciled,
      checkedAnchors: r.checkedAnchors,
      firstMismatch:
        m === null
          ? null
          : {
              date: m.date,
              at: m.at,
              kind: m.kind,
              expected: m.expected,
              computed: m.computed,
              difference: m.difference,
              sourceFile: m.sourceFile,
              lastAgreement: m.lastAgreement,
            },
      note: r.note,
    };
  });
  const anchors: AnchorRecord[] = ledger.anchors.map((a) => ({
    accountId: a.accountId,
    date: a.date,
    at: a.at,
    amount: a.amount,
    kind: a.kind,
    statementId: idOf(a.sourceFile),
  }));
  const files = new Map<string, StatementLedgerFields>();
  for (const f of ledger.files) {
    let from: string | null = null;
    let to: string | null = null;
    let kept = 0;
    let duplicates = 0;
    for (const a of f.accounts) {
      if (a.from !== null && (from === null || a.from < from)) from = a.from;
      if (a.to !== null && (to === null || a.to > to)) to = a.to;
      kept += a.entries;
      duplicates += a.duplicates;
    }
    files.set(idOf(f.file), {
      accounts: f.accounts.map((a) => ({ ...a })),
      accountIds: f.accounts.map((a) => a.accountId),
      from,
      to,
      entries: kept,
      duplicates,
      problems: f.problems.map((p) => ({ ...p })),
    });
  }
  return { accounts, transactions, anchors, files };
}
