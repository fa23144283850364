// Hand-made importer results for ledger and CLI tests (invented data).
import type {
  ImportProblem,
  ImportResult,
  ParsedStatement,
  StatementBalance,
  StatementEntry,
} from '../../engine/import/types';

/** A booked entry; `amount` in minor units. */
export function entry(
  bookingDate: string,
  amount: number,
  description: string,
  extra: Partial<StatementEntry> = {},
): StatementEntry {
  return { bookingDate, amount, description, status: 'booked', source: { line: 1 }, ...extra };
}

/** A stated balance (default at the end of its date). */
export function balance(
  kind: StatementBalance['kind'],
  date: string,
  amount: number,
  at: 'start' | 'end' = kind === 'opening' ? 'start' : 'end',
): StatementBalance {
  return { kind, date, at, amount, source: { line: 1 } };
}

/** One statement. */
export function statement(
  identifier: string | undefined,
  entries: StatementEntry[],
  balances: StatementBalance[] = [],
  extra: Partial<ParsedStatement> = {},
): ParsedStatement {
  return {
    account: identifier === undefined ? {} : { identifier },
    currency: 'EUR',
    entries,
    balances,
    ...extra,
  };
}

/** An importer result for `file`. */
export function result(
  file: string,
  statements: ParsedStatement[],
  format: ImportResult['format'] = 'camt.053',
  problems: ImportProblem[] = [],
): { file: string; result: ImportResult } {
  return { file, result: { file, format, statements, problems } };
}
