/**
 * camt.053 `Bal` (CashBalance3 … CashBalance8) to `StatementBalance`.
 *
 * Balance type codes (Source: ISO 20022 camt.053.001.NN, Bal/Tp/CdOrPrtry/Cd, BalanceType12Code):
 * - OPBD opening booked: `opening`. Dated the statement's first day (FrToDt/FrDtTm, or
 *   without FrToDt the first booking day or earlier with a booking on it) it is the
 *   balance at the START of that day. Dated before the first day (banks that copy MT940
 *   :60F: date it on the previous closing day) it is the balance at the END of that day.
 * - PRCD previously closed booked: `opening` at the END of its date.
 * - CLBD closing booked: `closing`, end of day. ITBD interim booked: `interim`, end of day.
 * - CLAV, ITAV, FWAV: `available`, end of day; OPAV: `available`, start of day.
 * - XPCD, INFO and proprietary types: left out with a notice.
 */
import type { BalanceKind, StatementBalance } from '../types';
import type { XmlElement } from '../xml';
import { type StatementContext, readAmount, readCreditDebit, readDateChoice } from './fields';
import { child, clip, descend, textOf } from './values';

const KINDS: Readonly<Record<string, { kind: BalanceKind; at: 'start' | 'end' } | undefined>> = {
  PRCD: { kind: 'opening', at: 'end' },
  CLBD: { kind: 'closing', at: 'end' },
  ITBD: { kind: 'interim', at: 'end' },
  CLAV: { kind: 'available', at: 'end' },
  ITAV: { kind: 'available', at: 'end' },
  FWAV: { kind: 'available', at: 'end' },
  OPAV: { kind: 'available', at: 'start' },
};

/**
 * Whether an OPBD dated `date` is the balance at the start or the end of that day.
 * @param firstDay the statement's first day from FrToDt, if stated.
 * @param firstBooking the earliest booking date of the statement's booked entries, if any.
 * @example openingBookedAt('2024-03-01', '2024-03-01', undefined) // 'start'
 * @example openingBookedAt('2024-02-29', '2024-03-01', '2024-03-01') // 'end'
 */
export function openingBookedAt(
  date: string,
  firstDay: string | undefined,
  firstBooking: string | undefined,
): 'start' | 'end' {
  if (firstDay !== undefined) return date >= firstDay ? 'start' : 'end';
  if (firstBooking === undefined) return 'start';
  return firstBooking <= date ? 'start' : 'end';
}

/**
 * Reads one `Bal`. Problems go to `ctx.problems`.
 * @returns the balance, or undefined when it has errors or its type is left out.
 * @example readBalance(balElement, 'Document/BkToCstmrStmt/Stmt[1]/Bal[1]', ctx, '2024-03-01', undefined)
 */
export function readBalance(
  bal: XmlElement,
  path: string,
  ctx: StatementContext,
  firstDay: string | undefined,
  firstBooking: string | undefined,
): StatementBalance | undefined {
  const ns = ctx.ns;
  const problems = ctx.problems;
  const before = problems.errorCount;
  const tp = descend(bal, ns, 'Tp', 'CdOrPrtry');
  const code = tp ? textOf(child(tp, 'Cd', ns)) : '';
  const proprietary = tp ? textOf(child(tp, 'Prtry', ns)) : '';
  if (!tp || (!code && !proprietary)) {
    problems.error(`${path}/Tp/CdOrPrtry`, bal.line, 'missing, expected Cd (OPBD, CLBD, …) or Prtry');
  }
  const amtEl = child(bal, 'Amt', ns);
  const minor = amtEl ? readAmount(amtEl, `${path}/Amt`, ctx) : undefined;
  if (!amtEl) problems.error(`${path}/Amt`, bal.line, 'missing, expected the balance amount <Amt Ccy="…">');
  const direction = readCreditDebit(bal, path, ctx);
  const dtEl = child(bal, 'Dt', ns);
  const date = dtEl ? readDateChoice(dtEl, `${path}/Dt`, ctx) : undefined;
  if (!dtEl) problems.error(`${path}/Dt`, bal.line, 'missing, expected Dt or DtTm');
  if (problems.errorCount > before || minor === undefined || direction === undefined || date === undefined) {
    return undefined;
  }
  if (!code) {
    problems.notice(path, bal.line, `proprietary balance type "${clip(proprietary)}" left out`);
    return undefined;
  }
  const mapped =
    code === 'OPBD' ? { kind: 'opening' as const, at: openingBookedAt(date, firstDay, firstBooking) } : KINDS[code];
  if (!mapped) {
    problems.notice(
      path,
      bal.line,
      `balance type ${clip(code)} left out (only booked and available balances are used)`,
    );
    return undefined;
  }
  return {
    kind: mapped.kind,
    date,
    at: mapped.at,
    amount: direction === 'DBIT' ? (minor === 0 ? 0 : -minor) : minor,
    source: { line: bal.line, element: path },
  };
}
