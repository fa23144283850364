/**
 * One statement's own arithmetic: stated opening + Σ booked entries = stated closing.
 * Checked on the statement as the file lists it, before duplicates across files are
 * removed, so a broken file is pinned to that file.
 */
import { toDayNumber } from '../core/dates';
import type { ParsedStatement } from '../import/types';
import type { StatementCheck } from './types';

/**
 * Stated opening and closing of a statement. Opening is the first `opening` balance,
 * closing the last `closing` balance (by date). A statement with only running balances
 * (a CSV balance column) takes its last running balance as closing and, as opening, the
 * first running balance less the entries booked up to that day.
 *
 * @example statementBalances({ balances: [], entries: [] }) // { opening: null, closing: null }
 */
export function statementBalances(statement: Pick<ParsedStatement, 'balances' | 'entries'>): {
  opening: number | null;
  closing: number | null;
} {
  const byDate = [...statement.balances].sort((a, b) => toDayNumber(a.date) - toDayNumber(b.date));
  let opening = byDate.find((b) => b.kind === 'opening')?.amount ?? null;
  let closing = byDate.filter((b) => b.kind === 'closing').pop()?.amount ?? null;
  const running = byDate.filter((b) => b.kind === 'running');
  const firstRunning = running[0];
  const lastRunning = running[running.length - 1];
  if (opening === null && firstRunning !== undefined) {
    const upTo = toDayNumber(firstRunning.date);
    let before = 0;
    // Entries come in runs of one day: the last date's day number is reused while it repeats.
    let lastDate: string | undefined;
    let lastDay = 0;
    for (const e of statement.entries) {
      if (e.status !== 'booked') continue;
      if (e.bookingDate !== lastDate) {
        lastDay = toDayNumber(e.bookingDate);
        lastDate = e.bookingDate;
      }
      if (lastDay <= upTo) before += e.amount;
    }
    opening = firstRunning.amount - before;
  }
  if (closing === null && lastRunning !== undefined) closing = lastRunning.amount;
  return { opening, closing };
}

/**
 * Checks one statement.
 * @param accountId the ledger account the statement belongs to.
 * @param balances `statementBalances(statement)`, when the caller has it already.
 * @example checkStatement('a.xml', 0, 'A', statement).consistent // true when opening + net = closing
 */
export function checkStatement(
  file: string,
  statementIndex: number,
  accountId: string,
  statement: ParsedStatement,
  balances: { opening: number | null; closing: number | null } = statementBalances(statement),
): StatementCheck {
  const { opening, closing } = balances;
  let net = 0;
  for (const e of statement.entries) if (e.status === 'booked') net += e.amount;
  const checkable = opening !== null && closing !== null;
  const difference = checkable ? closing - (opening + net) : 0;
  return {
    file,
    statementIndex,
    statementId: statement.statementId ?? null,
    accountId,
    opening,
    closing,
    net,
    consistent: checkable ? difference === 0 : null,
    difference,
  };
}
