/**
 * The plain-data shapes every statement importer produces. Amounts are signed integer
 * minor units from the account holder's view (+ money in, − money out); dates are
 * calendar dates `YYYY-MM-DD`.
 */
import type { CalendarDate } from '../core/dates';

/** Statement formats Ebbline reads, as named in the CLI's JSON output. */
export type FormatId = 'csv' | 'ofx' | 'camt.053' | 'mt940';

export type AccountKind = 'current' | 'savings' | 'card' | 'cash';

/** Where in the file something came from: a 1-based line, an XML element path, or both. */
export interface SourceLocation {
  readonly line?: number;
  readonly element?: string;
}

/** The account a statement speaks of, as far as the file says. */
export interface StatementAccount {
  /** IBAN or account number as printed in the file (spaces removed for IBANs). */
  readonly identifier?: string;
  /** Display name when the file has one (camt Acct/Nm, CSV file name…). */
  readonly name?: string;
  /** Bank identifier (BIC, routing number) when present. */
  readonly servicer?: string;
  readonly kind?: AccountKind;
}

/** One booked or pending entry of a statement. */
export interface StatementEntry {
  readonly bookingDate: CalendarDate;
  readonly valueDate?: CalendarDate;
  /** Signed minor units, + credit (money in), − debit (money out). */
  readonly amount: number;
  /** Free text as the bank gives it (OFX NAME+MEMO, camt RmtInf/Ustrd, MT940 :86:). */
  readonly description: string;
  readonly counterparty?: string;
  /** Customer reference (end-to-end id, check number, MT940 owner reference). */
  readonly reference?: string;
  /** The bank's own id of the entry: OFX FITID, camt AcctSvcrRef/NtryRef, MT940 `//` reference. */
  readonly bankRef?: string;
  readonly status: 'booked' | 'pending';
  /** Format's transaction type (OFX TRNTYPE, camt BkTxCd, MT940 type code like NTRF). */
  readonly typeCode?: string;
  readonly source: SourceLocation;
}

/**
 * A balance stated by the file.
 * - `opening`: balance before the statement's entries. `at` says whether `date` names the
 *   start of that day (camt OPBD dated the first day) or the end of it (MT940 :60F: dated
 *   the previous closing day).
 * - `closing`, `running` (a CSV running-balance column, last value of the day): end of `date`.
 * - `available`: informational (OFX AVAILBAL, camt CLAV/ITAV); never reconciled.
 * - `interim`: end of `date` (camt ITBD).
 */
export type BalanceKind = 'opening' | 'closing' | 'running' | 'available' | 'interim';

export interface StatementBalance {
  readonly kind: BalanceKind;
  readonly date: CalendarDate;
  readonly at: 'start' | 'end';
  readonly amount: number;
  readonly source: SourceLocation;
}

/** One statement (one account, one currency) found in a file. */
export interface ParsedStatement {
  readonly account: StatementAccount;
  /** ISO 4217 code of every amount in this statement. */
  readonly currency: string;
  /** The file's statement id (camt Stmt/Id, MT940 :20:/:28C:), when present. */
  readonly statementId?: string;
  readonly from?: CalendarDate;
  readonly to?: CalendarDate;
  readonly entries: readonly StatementEntry[];
  readonly balances: readonly StatementBalance[];
}

/**
 * A problem found while reading a file. `error` refuses the whole file (an import is
 * all-or-nothing); `notice` is reported and the file is still accepted (a pending entry
 * left out, a balance that is only informational).
 */
export interface ImportProblem {
  readonly file: string;
  readonly line?: number;
  readonly element?: string;
  readonly message: string;
  readonly severity: 'error' | 'notice';
}

/** What an importer returns. When any problem is an `error`, `statements` must be ignored. */
export interface ImportResult {
  readonly file: string;
  readonly format: FormatId;
  readonly statements: readonly ParsedStatement[];
  readonly problems: readonly ImportProblem[];
}

/** Options the caller passes to every importer. */
export interface ImportOptions {
  /** File name as the user gave it; used in every problem message. */
  readonly fileName: string;
  /** Currency for files that state none (CSV). */
  readonly currency?: string;
  /** Account name/identifier for files that state none (CSV). */
  readonly account?: string;
  /** CSV only: an explicit column mapping that overrides detection. */
  readonly csvMapping?: unknown;
}

/**
 * One interface per importer: `sniff` says from the content alone how sure it is that the
 * text is its format (0 = not mine, 1 = certain); `parse` reads it.
 */
export interface StatementImporter {
  readonly id: FormatId;
  sniff(text: string): number;
  parse(text: string, options: ImportOptions): ImportResult;
}

/** True when a result carries at least one refusing problem. */
export function hasErrors(result: { readonly problems: readonly ImportProblem[] }): boolean {
  return result.problems.some((p) => p.severity === 'error');
}
