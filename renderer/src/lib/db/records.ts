/**
 * Records stored in a workspace database. Amounts are integer minor units; dates are
 * `YYYY-MM-DD` calendar dates, stored as strings so no time zone can shift them.
 *
 * Two kinds of data live here:
 * - What the user gave or decided: `statements` + `statementResults` (every imported file
 *   as the importer read it), `recurring` decisions, `csvMappings`, `scenarios`, `settings`.
 * - What is derived from the imported files by `buildLedger`: `accounts`, `transactions`,
 *   `anchors`. These are replaced as a whole, in the same transaction, whenever a file is
 *   added or removed, so the app's ledger is always the CLI's ledger for the same files.
 */
import type { FormatId, ImportProblem, ImportResult, AccountKind, BalanceKind } from '../../../../engine/import/types';
import type { CsvMapping } from '../../../../engine/import/csv';
import type { FileAccountReport } from '../../../../engine/ledger/types';
import type { RecurringDecision } from '../../../../engine/forecast/recurringComponents';

/** The first stated balance that disagrees with the rebuilt balance (from the ledger). */
export interface MismatchRecord {
  date: string;
  at: 'start' | 'end';
  kind: BalanceKind;
  /** The balance the file states. */
  expected: number;
  /** The balance rebuilt from the transactions. */
  computed: number;
  difference: number;
  sourceFile: string;
  lastAgreement: string | null;
}

/** An account of the ledger with its reconciliation, derived. */
export interface AccountRecord {
  id: string;
  name: string;
  currency: string;
  identifiers: string[];
  kind: AccountKind;
  /** Position in the ledger (order first seen across the files). */
  order: number;
  /** Booked transactions kept. */
  entries: number;
  firstDate: string | null;
  lastDate: string | null;
  /** Rebuilt end-of-day balance on `lastDate` (relative to 0 when `relative`). */
  closingBalance: number;
  /** True when no file states a balance: balances start at 0. */
  relative: boolean;
  /** true / false, or null when nothing could be checked. */
  reconciled: boolean | null;
  checkedAnchors: number;
  firstMismatch: MismatchRecord | null;
  note: string | null;
}

/** Import choices a file was read with, kept so the ledger can be rebuilt the same way. */
export interface StatementImportOptions {
  currency?: string;
  account?: string;
  csvMapping?: CsvMapping;
}

/** One imported file (an import batch member), without its parsed content. */
export interface StatementRecord {
  id: string;
  /** Name as the ledger knows it (unique within the workspace). */
  fileName: string;
  format: FormatId;
  importedAt: string;
  /** Import order; the ledger takes files in this order ("earlier" wins a duplicate). */
  seq: number;
  size: number;
  /** SHA-256 of the file's bytes, to say "already imported". */
  contentHash: string;
  options: StatementImportOptions;
  /** What the file contributes per account, as of the latest ledger rebuild. */
  accounts: FileAccountReport[];
  accountIds: string[];
  from: string | null;
  to: string | null;
  entries: number;
  duplicates: number;
  /** Notices (the importer's and the ledger's); files with errors are never stored. */
  problems: ImportProblem[];
}

/** The parsed content of one stored file: the importer's result, the ledger's input. */
export interface StatementResultRecord {
  id: string;
  result: ImportResult;
}

/** A booked transaction of the ledger, derived. */
export interface TransactionRecord {
  /** The ledger's id `accountId|fingerprint|occurrence`. */
  id: string;
  /** Position in the ledger (account, booking date, then file and entry order). */
  seq: number;
  accountId: string;
  bookingDate: string;
  valueDate?: string;
  amount: number;
  currency: string;
  description: string;
  counterparty?: string;
  reference?: string;
  bankRef?: string;
  typeCode?: string;
  fingerprint: string;
  /** The stored file it came from. */
  statementId: string;
}

/** A balance a file states, derived. */
export interface AnchorRecord {
  id?: number;
  accountId: string;
  date: string;
  at: 'start' | 'end';
  amount: number;
  kind: BalanceKind;
  statementId: string;
}

/**
 * The user's decision about a detected recurring flow: exactly the forecast pipeline's
 * `RecurringDecision` (engine/forecast/recurringComponents.ts) plus when it was made.
 */
export interface RecurringDecisionRecord extends RecurringDecision {
  decidedAt: string;
}

/** A remembered CSV mapping for one bank layout (header fingerprint). */
export interface CsvMappingRecord {
  fingerprint: string;
  mapping: CsvMapping;
  /** Currency chosen for a layout that states none. */
  currency?: string;
  /** Account chosen for a layout that names none. */
  account?: string;
  savedAt: string;
}

export interface ScenarioRecord {
  id: string;
  name: string;
  /** An `ebbline.plan/1` document. */
  plan: unknown;
  updatedAt: string;
}

/** Workspace settings and facts as key/value pairs. */
export interface SettingRecord {
  key: string;
  value: unknown;
}
