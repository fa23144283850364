/**
 * The ledger: accounts, booked transactions (duplicates removed), balance anchors and the
 * reconciliation of both, built from importer results. Everything is plain data (arrays,
 * strings, numbers), so a ledger crosses the worker boundary unchanged and two ledgers
 * built from the same files are deeply equal.
 *
 * Amounts are signed integer minor units of the account's currency; dates are calendar
 * dates `YYYY-MM-DD`.
 */
import type { CalendarDate } from '../core/dates';
import type {
  AccountKind,
  BalanceKind,
  FormatId,
  ImportProblem,
  SourceLocation,
  StatementEntry,
} from '../import/types';

/** One account, matched across files by its normalised identifiers (IBAN / account number). */
export interface LedgerAccount {
  /** Stable id: the first normalised identifier, or the name for accounts without one. */
  readonly id: string;
  /** Display name: the statement's account name, else its identifier, else the assigned name. */
  readonly name: string;
  /** ISO 4217 code; an identifier seen in two currencies makes two accounts. */
  readonly currency: string;
  /** Normalised identifiers seen for this account (empty for an account named by file or option). */
  readonly identifiers: readonly string[];
  readonly kind: AccountKind;
}

/** A booked entry kept in the ledger: the statement entry plus where it belongs and came from. */
export interface LedgerTransaction extends StatementEntry {
  /** Stable id: `accountId|fingerprint|occurrence`. */
  readonly id: string;
  readonly accountId: string;
  readonly currency: string;
  /** Content fingerprint `bookingDate|amount|normalised words` (see engine/ledger/fingerprint.ts). */
  readonly fingerprint: string;
  readonly sourceFile: string;
  /** 1-based count of this fingerprint among the account's kept transactions (genuine repeats). */
  readonly occurrence: number;
}

/**
 * A balance a file states, attached to its account. Semantics as in engine/import/types.ts:
 * `opening` at the start (`at: 'start'`) or end of `date`; `closing`, `running`, `interim`
 * at the end of `date`; `available` is informational and never reconciled.
 */
export interface BalanceAnchor {
  readonly accountId: string;
  readonly date: CalendarDate;
  readonly at: 'start' | 'end';
  readonly amount: number;
  readonly kind: BalanceKind;
  readonly sourceFile: string;
  readonly source: SourceLocation;
}

/** The first stated balance that disagrees with the balance rebuilt from transactions. */
export interface BalanceMismatch {
  /** The anchor's date (for an opening anchor at the start of a day: that day). */
  readonly date: CalendarDate;
  readonly at: 'start' | 'end';
  readonly kind: BalanceKind;
  /** The balance the file states. */
  readonly expected: number;
  /** The balance rebuilt from the starting balance and the kept transactions. */
  readonly computed: number;
  /** expected − computed. */
  readonly difference: number;
  readonly sourceFile: string;
  readonly source: SourceLocation;
  /** End of the last day on which a stated balance still agreed, or null when none did. */
  readonly lastAgreement: CalendarDate | null;
}

/**
 * How an account's stated balances agree with its transactions.
 *
 * `reconciled` is true when every checked anchor agrees, false at the first disagreement,
 * and null when there is nothing to check: an account with no stated balance at all
 * (balances are then relative to 0 at its first day, `relative: true`) or with a single
 * stated balance (the one the starting balance comes from).
 */
export interface AccountReconciliation {
  readonly accountId: string;
  readonly reconciled: boolean | null;
  /** True when no anchor fixes the level: balances start at 0 and are relative. */
  readonly relative: boolean;
  /** Balance before the account's first transaction (0 when relative). */
  readonly startingBalance: number;
  /** Which anchor the starting balance came from, or null when relative. */
  readonly startingFrom: {
    readonly kind: BalanceKind;
    readonly date: CalendarDate;
    readonly sourceFile: string;
  } | null;
  /** Anchors compared with the rebuilt balance, not counting the one the start came from. */
  readonly checkedAnchors: number;
  readonly mismatchedAnchors: number;
  readonly firstMismatch: BalanceMismatch | null;
  /** First and last day the account's transactions and anchors cover (null: nothing at all). */
  readonly firstDate: CalendarDate | null;
  readonly lastDate: CalendarDate | null;
  /** Rebuilt end-of-day balance on `lastDate` (relative when `relative`). */
  readonly closingBalance: number;
  /** Plain-words note, e.g. "no stated balance: balances are relative". */
  readonly note: string | null;
}

/**
 * One statement's own arithmetic: opening + Σ booked entries = closing, with the
 * statement's entries as the file lists them (before duplicates across files are removed).
 */
export interface StatementCheck {
  readonly file: string;
  /** Index of the statement within its file. */
  readonly statementIndex: number;
  readonly statementId: string | null;
  readonly accountId: string;
  /** Stated opening balance (or, for running balances only, the first day's start), or null. */
  readonly opening: number | null;
  /** Stated closing balance (or the last running balance), or null. */
  readonly closing: number | null;
  /** Σ booked entries of the statement. */
  readonly net: number;
  /** True/false when both opening and closing are known, null otherwise. */
  readonly consistent: boolean | null;
  /** closing − (opening + net), 0 when not checkable. */
  readonly difference: number;
}

/** What one file contributed to one account. A file may speak of several accounts. */
export interface FileAccountReport {
  readonly accountId: string;
  readonly currency: string;
  readonly from: CalendarDate | null;
  readonly to: CalendarDate | null;
  /** Booked entries kept. */
  readonly entries: number;
  /** Booked entries dropped as already seen in an earlier file of the same run. */
  readonly duplicates: number;
  /** Pending entries left out (not counted in entries or duplicates). */
  readonly pending: number;
  /** Opening of the file's earliest statement for the account, or null. */
  readonly opening: number | null;
  /** Closing of the file's latest statement for the account, or null. */
  readonly closing: number | null;
  /** Σ of the file's booked entries for the account, duplicates included. */
  readonly net: number;
}

/** Per-file summary: format, per-account figures and the importer's and ledger's notices. */
export interface LedgerFileReport {
  readonly file: string;
  readonly format: FormatId;
  readonly accounts: readonly FileAccountReport[];
  /** The importer's problems (notices only; files with errors never reach a ledger) plus the ledger's. */
  readonly problems: readonly ImportProblem[];
}

/** The whole ledger. */
export interface Ledger {
  /** Accounts in the order they were first seen. */
  readonly accounts: readonly LedgerAccount[];
  /** Kept booked transactions, ordered by account, booking date, then file and entry order. */
  readonly transactions: readonly LedgerTransaction[];
  /** Distinct anchors (same account, date, at, kind and amount kept once), in account and date order. */
  readonly anchors: readonly BalanceAnchor[];
  readonly files: readonly LedgerFileReport[];
  /** One per account, same order as `accounts`. */
  readonly reconciliation: readonly AccountReconciliation[];
  readonly statements: readonly StatementCheck[];
}
