/**
 * Readers for the camt.053 building blocks shared by balances and entries (amount with
 * currency, credit/debit indicator, date-or-date-time choice). Each reports what is wrong
 * to the statement's problem collector, naming the element path, and returns undefined.
 */
import type { XmlElement } from '../xml';
import {
  type ProblemCollector,
  type TextPool,
  attr,
  child,
  clip,
  currencyExponent,
  isoDateOf,
  isoDateTimeDateOf,
  textOf,
  unsignedAmountOf,
} from './values';

/** What readers need to know about the statement being read. */
export interface StatementContext {
  /** Namespace URI of the document (camt.053.001.NN). */
  readonly ns: string;
  /** NN of the version, 2 … 13. */
  readonly version: number;
  readonly problems: ProblemCollector;
  /** The statement's currency once known (Acct/Ccy, else the first amount's Ccy). */
  currency: string | undefined;
  /** Its minor-unit exponent; undefined while unknown or when the code is not ISO 4217. */
  exponent: number | undefined;
  /** Shares the strings entries repeat (dates, counterparties, type codes); without it they are only copied. */
  readonly texts?: TextPool;
}

/**
 * Reads `<Amt Ccy="EUR">12.50</Amt>` as unsigned minor units in the statement currency.
 * Source: ISO 20022 camt.053 ActiveOrHistoricCurrencyAndAmount (xs:decimal, fractionDigits 5,
 * totalDigits 18, minInclusive 0, attribute Ccy required).
 * @example readAmount(amtElement, 'Document/BkToCstmrStmt/Stmt[1]/Ntry[1]/Amt', ctx) // 1250
 */
export function readAmount(amt: XmlElement, path: string, ctx: StatementContext): number | undefined {
  const ccy = attr(amt, 'Ccy')?.trim();
  if (ccy === undefined || ccy === '') {
    ctx.problems.error(path, amt.line, 'missing attribute Ccy, expected the ISO 4217 currency of the amount');
    return undefined;
  }
  if (ctx.currency === undefined) {
    const e = currencyExponent(ccy);
    ctx.currency = ccy;
    if (typeof e !== 'number') {
      ctx.problems.error(path, amt.line, e.message);
      return undefined;
    }
    ctx.exponent = e;
  } else if (ccy !== ctx.currency) {
    ctx.problems.error(
      path,
      amt.line,
      `currency ${clip(ccy)} differs from the statement currency ${ctx.currency} (mixed currencies in one statement)`,
    );
    return undefined;
  }
  if (ctx.exponent === undefined) return undefined; // the statement currency was already reported as unknown
  const text = textOf(amt);
  if (text === '') {
    ctx.problems.error(path, amt.line, 'missing amount, expected e.g. 1234.56');
    return undefined;
  }
  const minor = unsignedAmountOf(text, ctx.exponent);
  if (typeof minor !== 'number') {
    ctx.problems.error(path, amt.line, minor.message);
    return undefined;
  }
  return minor;
}

/**
 * Reads `CdtDbtInd` (CRDT or DBIT) below `parent`.
 * @example readCreditDebit(ntry, 'Document/BkToCstmrStmt/Stmt[1]/Ntry[1]', ctx) // 'DBIT'
 */
export function readCreditDebit(parent: XmlElement, path: string, ctx: StatementContext): 'CRDT' | 'DBIT' | undefined {
  const el = child(parent, 'CdtDbtInd', ctx.ns);
  if (!el) {
    ctx.problems.error(`${path}/CdtDbtInd`, parent.line, 'missing, expected CRDT or DBIT');
    return undefined;
  }
  const code = textOf(el);
  if (code === 'CRDT' || code === 'DBIT') return code;
  ctx.problems.error(`${path}/CdtDbtInd`, el.line, `"${clip(code)}", expected CRDT or DBIT`);
  return undefined;
}

/**
 * Reads a DateAndDateTimeChoice (`<Dt>` ISODate or `<DtTm>` ISODateTime) as a calendar
 * date; a DtTm gives its date as written, not converted to UTC.
 * @example readDateChoice(bookgDt, 'Document/BkToCstmrStmt/Stmt[1]/Ntry[1]/BookgDt', ctx) // '2025-03-20'
 */
export function readDateChoice(choice: XmlElement, path: string, ctx: StatementContext): string | undefined {
  const dt = child(choice, 'Dt', ctx.ns);
  const dtTm = dt ? undefined : child(choice, 'DtTm', ctx.ns);
  if (!dt && !dtTm) {
    ctx.problems.error(path, choice.line, 'missing, expected Dt or DtTm');
    return undefined;
  }
  const el = (dt ?? dtTm) as XmlElement;
  const r = dt ? isoDateOf(textOf(el)) : isoDateTimeDateOf(textOf(el));
  if ('message' in r) {
    ctx.problems.error(`${path}/${dt ? 'Dt' : 'DtTm'}`, el.line, r.message);
    return undefined;
  }
  return r.date;
}

/**
 * Reads an ISODateTime element's calendar date (e.g. FrToDt/FrDtTm).
 * @example readDateTime(frDtTm, 'Document/BkToCstmrStmt/Stmt[1]/FrToDt/FrDtTm', ctx) // '2025-03-01'
 */
export function readDateTime(el: XmlElement, path: string, ctx: StatementContext): string | undefined {
  const r = isoDateTimeDateOf(textOf(el));
  if ('message' in r) {
    ctx.problems.error(path, el.line, r.message);
    return undefined;
  }
  return r.date;
}
