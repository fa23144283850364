/**
 * Records stored in a workspace database. Amounts are integer minor units; dates are
 * `YYYY-MM-DD` calendar dates, stored as strings so no time zone can shift them.
 */
import type { AccountKind, BalanceKind, FormatId, ImportProblem } from '@engine/import/types';

export interface AccountRecord {
  id: string;
  name: string;
  currency: string;
  identifiers: string[];
  kind: AccountKind;
}

/** One imported file (an import batch). */
export interface StatementRecord {
  id: string;
  fileName: string;
  format: FormatId;
  importedAt: string;
  accountIds: string[];
  from: string | null;
  to: string | null;
  entries: number;
  duplicates: number;
  problems: ImportProblem[];
  /** SHA-256 of the file's bytes, to say "already imported". */
  contentHash: string;
}

export interface TransactionRecord {
  id: string;
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
  statementId: string;
}

export interface AnchorRecord {
  id?: number;
  accountId: string;
  date: string;
  at: 'start' | 'end';
  amount: number;
  kind: BalanceKind;
  statementId: string;
}

/** The user's decision about a detected recurring flow. */
export interface RecurringDecisionRecord {
  key: string;
  state: 'confirmed' | 'dismissed' | 'edited';
  /** User edits (cadence, amount) as plain data; absent when only confirmed/dismissed. */
  edits?: { amount?: number; cadence?: unknown; label?: string };
  decidedAt: string;
}

/** A remembered CSV column mapping for one bank layout (header fingerprint). */
export interface CsvMappingRecord {
  fingerprint: string;
  mapping: unknown;
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
