/**
 * Turns the element tree of an OFX response into Ebbline statements: bank statements
 * (BANKMSGSRSV1/STMTTRNRS/STMTRS) and card statements (CREDITCARDMSGSRSV1/CCSTMTTRNRS/
 * CCSTMTRS), element names and meanings as in the OFX Banking Specification 2.3,
 * chapter 11 "Banking" (and OFX 1.0.2, which uses the same aggregates).
 */
import { isKnownCurrency, minorUnitExponent } from '../../core/currency';
import { formatMinor } from '../../core/money';
import type { CalendarDate } from '../../core/dates';
import type { AccountKind, ParsedStatement, StatementAccount, StatementBalance, StatementEntry } from '../types';
import type { OfxElement } from './buildOfxTree';
import { combineNameAndMemo } from './ofxDescription';
import { normalizeOfxSpace } from './ofxText';
import { convertMinor, parseOfxAmount, parseOfxRate } from './parseOfxAmount';
import { parseOfxDate } from './parseOfxDate';

/** A problem found while reading statements: with the element path and the line of that element. */
export interface OfxReadProblem {
  readonly line: number;
  readonly element: string;
  readonly message: string;
  readonly severity: 'error' | 'notice';
}

/** Transaction types of STMTTRN/TRNTYPE (OFX Banking Specification 2.3, "Transaction Types Used in <TRNTYPE>"). */
export const OFX_TRANSACTION_TYPES: readonly string[] = [
  'CREDIT',
  'DEBIT',
  'INT',
  'DIV',
  'FEE',
  'SRVCHG',
  'DEP',
  'ATM',
  'POS',
  'XFER',
  'CHECK',
  'PAYMENT',
  'CASH',
  'DIRECTDEP',
  'DIRECTDEBIT',
  'REPEATPMT',
  'HOLD',
  'OTHER',
];

/** BANKACCTFROM/ACCTTYPE → Ebbline's account kind (a line of credit is run like a current account). */
const ACCOUNT_KINDS: Readonly<Record<string, AccountKind>> = {
  CHECKING: 'current',
  CREDITLINE: 'current',
  SAVINGS: 'savings',
  MONEYMRKT: 'savings',
  CD: 'savings',
};

/**
 * An element with where it sits. The path (`OFX/…/STMTTRN[3]`) is built only when asked
 * for, since most elements never appear in a problem.
 */
class Located {
  private cachedPath: string | undefined;
  constructor(
    readonly el: OfxElement,
    private readonly parent: Located | undefined,
    /** 1-based position among same-named siblings, 0 when the element is the only one. */
    private readonly index: number,
  ) {}
  get path(): string {
    if (this.cachedPath === undefined) {
      const own = this.index > 0 ? `${this.el.name}[${this.index}]` : this.el.name;
      this.cachedPath = this.parent ? `${this.parent.path}/${own}` : own;
    }
    return this.cachedPath;
  }
}

function kids(node: Located, name: string): Located[] {
  const found = node.el.children.filter((c) => c.name === name);
  return found.map((el, i) => new Located(el, node, found.length > 1 ? i + 1 : 0));
}

function kid(node: Located, name: string): Located | undefined {
  let first: OfxElement | undefined;
  for (const c of node.el.children) {
    if (c.name !== name) continue;
    if (first) return new Located(first, node, 1);
    first = c;
  }
  return first ? new Located(first, node, 0) : undefined;
}

/** A leaf's value, '' when present but empty, undefined when absent. */
function value(node: Located | undefined): string | undefined {
  if (!node) return undefined;
  return node.el.text ?? '';
}

/** Mutable entry under construction, before corrections are applied. */
interface PendingEntry {
  entry: StatementEntry;
  fitid: string;
  line: number;
  path: string;
  correct?: { fitid: string; action: 'REPLACE' | 'DELETE' };
  /** Set when a later CORRECTACTION in the file replaced or deleted this entry. */
  removed?: boolean;
}

/**
 * Entries kept so far per account (key) and FITID, in file order, so that a correction
 * finds the latest earlier entry with its FITID in O(1) amortised time.
 */
type FitIdIndex = Map<string, Map<string, PendingEntry[]>>;

/** A statement whose entries may still lose one to a later correction in the same file. */
interface Draft {
  account: StatementAccount;
  currency: string;
  from?: CalendarDate;
  to?: CalendarDate;
  entries: PendingEntry[];
  balances: StatementBalance[];
}

/**
 * Reads every bank and card statement in an OFX element tree.
 *
 * Mapping: booking date = DTPOSTED (calendar date as written), value date = DTAVAIL,
 * amount = TRNAMT (signed from the customer's view), bankRef = FITID, reference =
 * CHECKNUM or else REFNUM, counterparty = NAME or PAYEE/NAME, description = NAME and
 * MEMO combined by `combineNameAndMemo`, typeCode = TRNTYPE; LEDGERBAL → a closing
 * balance at the end of DTASOF's date, AVAILBAL → an available balance. DTUSER is
 * checked but not kept. CORRECTACTION REPLACE/DELETE are applied to the earlier entry
 * with that FITID in the same file and reported as notices. A CURRENCY aggregate
 * converts the amount into CURDEF at CURRATE; an ORIGCURRENCY aggregate is reported.
 *
 * @param roots top-level elements from `buildOfxTree`.
 * @returns statements (ignore them when any problem is an error) and problems.
 * @throws Never. O(n) in the number of elements (corrections are looked up by FITID).
 * @example readOfxStatements(buildOfxTree(body, 0, 1).roots).statements.length // 1
 */
export function readOfxStatements(roots: readonly OfxElement[]): {
  statements: ParsedStatement[];
  problems: OfxReadProblem[];
} {
  const problems: OfxReadProblem[] = [];
  const statements: ParsedStatement[] = [];
  const drafts: Draft[] = [];
  const byAccount: FitIdIndex = new Map();
  const add = (at: { line: number; path: string }, message: string, severity: 'error' | 'notice' = 'error'): void =>
    void problems.push({ line: at.line, element: at.path, message, severity });

  const ofxElement = roots.find((r) => r.name === 'OFX');
  if (!ofxElement) {
    const first = roots[0];
    problems.push({
      line: first?.line ?? 1,
      element: first?.name ?? 'OFX',
      message: first ? `found <${first.name}>, expected the <OFX> element` : 'no <OFX> element, expected the OFX body',
      severity: 'error',
    });
    return { statements, problems };
  }
  for (const other of roots) {
    if (other !== ofxElement) {
      problems.push({
        line: other.line,
        element: other.name,
        message: `element <${other.name}> outside <OFX> ignored`,
        severity: 'notice',
      });
    }
  }
  const ofx = new Located(ofxElement, undefined, 0);

  // ---- helpers that read one leaf and report problems at it ----------------------------
  const at = (node: Located): { line: number; path: string } => ({ line: node.el.line, path: node.path });
  const childAt = (parent: Located, name: string): { line: number; path: string } => ({
    line: parent.el.line,
    path: `${parent.path}/${name}`,
  });

  const readDate = (parent: Located, name: string, required: boolean): CalendarDate | undefined | null => {
    const node = kid(parent, name);
    const text = value(node);
    if (node === undefined || text === undefined || text === '') {
      if (required) add(node ? at(node) : childAt(parent, name), 'missing, expected a date YYYYMMDD[HHMMSS]');
      return required ? null : undefined;
    }
    const parsed = parseOfxDate(text);
    if (typeof parsed === 'string') {
      add(at(node), `"${text}" ${parsed}`);
      return null;
    }
    return parsed.date;
  };

  const readAmount = (parent: Located, name: string, exponent: number | undefined): number | null => {
    const node = kid(parent, name);
    const text = value(node);
    if (node === undefined || text === undefined || text === '') {
      add(node ? at(node) : childAt(parent, name), 'missing, expected a signed amount');
      return null;
    }
    if (exponent === undefined) return null; // CURDEF already reported
    const parsed = parseOfxAmount(text, exponent);
    if (typeof parsed === 'string') {
      add(at(node), `"${text}" ${parsed}`);
      return null;
    }
    return parsed;
  };

  const readText = (parent: Located | undefined, name: string): string => {
    if (!parent) return '';
    return normalizeOfxSpace(value(kid(parent, name)) ?? '');
  };

  // ---- signon ----------------------------------------------------------------------------
  for (const set of ofx.el.children) {
    if (!/^SIGNONMSGSRSV\d+$/.test(set.name)) continue;
    const signon = new Located(set, ofx, 0);
    for (const sonrs of kids(signon, 'SONRS')) {
      const status = kid(sonrs, 'STATUS');
      if (!status) continue;
      const code = readText(status, 'CODE');
      if (code !== '' && code !== '0') {
        const severity = readText(status, 'SEVERITY') || 'ERROR';
        const message = readText(status, 'MESSAGE');
        add(
          at(status),
          `signon refused by the bank: STATUS CODE ${code} (${severity})${message ? `: ${message}` : ''}, expected CODE 0`,
        );
      }
    }
  }

  // ---- message sets ---------------------------------------------------------------------
  const unsupported: string[] = [];
  const requests: string[] = [];
  let responses = 0;
  for (const set of ofx.el.children) {
    const setNode = new Located(set, ofx, 0);
    if (/^BANKMSGSRSV\d+$/.test(set.name)) {
      for (const trnrs of kids(setNode, 'STMTTRNRS')) {
        responses++;
        readResponse(trnrs, 'STMTRS', 'BANKACCTFROM');
      }
    } else if (/^CREDITCARDMSGSRSV\d+$/.test(set.name)) {
      for (const trnrs of kids(setNode, 'CCSTMTTRNRS')) {
        responses++;
        readResponse(trnrs, 'CCSTMTRS', 'CCACCTFROM');
      }
    } else if (/^SIGNONMSGSRSV\d+$/.test(set.name)) {
      continue;
    } else if (/MSGSRQV\d+$/.test(set.name)) {
      requests.push(set.name);
    } else if (/MSGSRSV\d+$/.test(set.name)) {
      unsupported.push(set.name);
    }
  }

  const describeSets = (names: readonly string[]): string =>
    names.map((n) => (n.startsWith('INVSTMT') ? `${n} (investment statements)` : n)).join(', ');
  if (responses === 0) {
    const where = { line: ofx.el.line, path: ofx.path };
    if (unsupported.length > 0) {
      add(
        where,
        `only ${describeSets(unsupported)} found, which Ebbline does not read; expected bank (BANKMSGSRSV1) or card (CREDITCARDMSGSRSV1) statements`,
      );
    } else if (requests.length > 0) {
      add(where, `this is an OFX request (${requests.join(', ')}), expected a statement download (a response)`);
    } else {
      add(
        where,
        'no statement found, expected BANKMSGSRSV1/STMTTRNRS (bank) or CREDITCARDMSGSRSV1/CCSTMTTRNRS (card) statements',
      );
    }
  } else if (unsupported.length > 0) {
    add({ line: ofx.el.line, path: ofx.path }, `${describeSets(unsupported)} skipped: not read by Ebbline`, 'notice');
  }

  for (const draft of drafts) {
    const kept = draft.entries.filter((p) => !p.removed);
    warnDuplicateFitIds(kept);
    statements.push({ ...draft, entries: kept.map((p) => p.entry) });
  }
  return { statements, problems };

  // ---- one STMTTRNRS / CCSTMTTRNRS -----------------------------------------------------
  function readResponse(trnrs: Located, rsName: 'STMTRS' | 'CCSTMTRS', acctName: 'BANKACCTFROM' | 'CCACCTFROM'): void {
    const status = kid(trnrs, 'STATUS');
    const code = readText(status, 'CODE');
    const severity = readText(status, 'SEVERITY').toUpperCase();
    const responsesInside = kids(trnrs, rsName);
    let failed = false;
    if (status && code !== '' && code !== '0') {
      const message = readText(status, 'MESSAGE');
      const text = `statement response STATUS CODE ${code} (${severity || 'ERROR'})${message ? `: ${message}` : ''}`;
      if (severity === 'ERROR' || severity === '' || responsesInside.length === 0) {
        add(at(status), `${text}, expected CODE 0`);
        failed = true;
      } else {
        add(at(status), text, 'notice');
      }
    }
    if (responsesInside.length === 0) {
      if (!failed) add(childAt(trnrs, rsName), `missing, expected the statement (${rsName})`);
      return;
    }
    for (const rs of responsesInside) readStatement(rs, acctName);
  }

  // ---- one STMTRS / CCSTMTRS -------------------------------------------------------------
  function readStatement(rs: Located, acctName: 'BANKACCTFROM' | 'CCACCTFROM'): void {
    let ok = true;
    const curdefNode = kid(rs, 'CURDEF');
    const curdef = normalizeOfxSpace(value(curdefNode) ?? '').toUpperCase();
    let exponent: number | undefined;
    if (curdef === '') {
      add(
        curdefNode ? at(curdefNode) : childAt(rs, 'CURDEF'),
        'missing, expected an ISO 4217 currency code such as EUR',
      );
      ok = false;
    } else if (!isKnownCurrency(curdef)) {
      add(at(curdefNode as Located), `"${curdef}" is not an ISO 4217 currency code, expected one such as EUR or USD`);
      ok = false;
    } else {
      exponent = minorUnitExponent(curdef);
    }

    const account = readAccount(rs, acctName);
    if (!account) ok = false;

    let from: CalendarDate | undefined;
    let to: CalendarDate | undefined;
    const pending: PendingEntry[] = [];
    const list = kid(rs, 'BANKTRANLIST');
    if (list) {
      const start = readDate(list, 'DTSTART', true);
      const end = readDate(list, 'DTEND', true);
      if (start === null || end === null) ok = false;
      else {
        from = start;
        to = end;
        if (start !== undefined && end !== undefined && start > end) {
          add(at(list), `DTSTART ${start} is after DTEND ${end}`, 'notice');
        }
      }
      for (const trn of kids(list, 'STMTTRN')) {
        const item = readTransaction(trn, curdef, exponent);
        if (item) pending.push(item);
        else ok = false;
      }
    } else {
      add(childAt(rs, 'BANKTRANLIST'), 'no BANKTRANLIST: the statement lists no transactions, only balances', 'notice');
    }
    const pendingList = kid(rs, 'BANKTRANLISTP');
    if (pendingList) {
      const count = kids(pendingList, 'STMTTRNP').length;
      add(
        at(pendingList),
        `${count} pending transaction${count === 1 ? '' : 's'} (STMTTRNP) left out: only posted transactions are imported`,
        'notice',
      );
    }

    const balances: StatementBalance[] = [];
    const ledger = kid(rs, 'LEDGERBAL');
    if (ledger) {
      const balance = readBalance(ledger, 'closing', exponent);
      if (balance) balances.push(balance);
      else ok = false;
    } else {
      add(childAt(rs, 'LEDGERBAL'), 'missing: the statement states no closing balance (LEDGERBAL)', 'notice');
    }
    const available = kid(rs, 'AVAILBAL');
    if (available) {
      const balance = readBalance(available, 'available', exponent);
      if (balance) balances.push(balance);
      else ok = false;
    }

    const key = `${acctName}|${account?.identifier ?? ''}|${curdef}`;
    const entries = applyCorrections(pending, key);
    if (!ok || !account || exponent === undefined) return;
    const draft: Draft = { account, currency: curdef, entries, balances };
    if (from !== undefined) draft.from = from;
    if (to !== undefined) draft.to = to;
    drafts.push(draft);
  }

  function readAccount(rs: Located, acctName: 'BANKACCTFROM' | 'CCACCTFROM'): StatementAccount | undefined {
    const node = kid(rs, acctName);
    if (!node) {
      add(childAt(rs, acctName), `missing, expected the account (${acctName} with ACCTID)`);
      return undefined;
    }
    const acctId = normalizeOfxSpace(value(kid(node, 'ACCTID')) ?? '');
    if (acctId === '') {
      const idNode = kid(node, 'ACCTID');
      add(idNode ? at(idNode) : childAt(node, 'ACCTID'), 'missing, expected the account number');
      return undefined;
    }
    if (acctName === 'CCACCTFROM') return { identifier: acctId, kind: 'card' };
    const account: { identifier: string; servicer?: string; kind?: AccountKind } = { identifier: acctId };
    const bankId = readText(node, 'BANKID');
    if (bankId !== '') account.servicer = bankId;
    const typeNode = kid(node, 'ACCTTYPE');
    const type = normalizeOfxSpace(value(typeNode) ?? '').toUpperCase();
    const kind = ACCOUNT_KINDS[type];
    if (kind) account.kind = kind;
    else {
      add(
        typeNode ? at(typeNode) : childAt(node, 'ACCTTYPE'),
        `${type === '' ? 'missing' : `"${type}" is unknown`}, expected CHECKING, SAVINGS, MONEYMRKT, CREDITLINE or CD; account kind left open`,
        'notice',
      );
    }
    return account;
  }

  function readBalance(
    node: Located,
    kind: 'closing' | 'available',
    exponent: number | undefined,
  ): StatementBalance | undefined {
    const amount = readAmount(node, 'BALAMT', exponent);
    const date = readDate(node, 'DTASOF', true);
    if (amount === null || date === null || date === undefined) return undefined;
    return { kind, date, at: 'end', amount, source: { line: node.el.line, element: node.path } };
  }

  function readTransaction(trn: Located, curdef: string, exponent: number | undefined): PendingEntry | undefined {
    let ok = true;
    const typeNode = kid(trn, 'TRNTYPE');
    const typeCode = normalizeOfxSpace(value(typeNode) ?? '').toUpperCase();
    if (typeCode === '') {
      add(
        typeNode ? at(typeNode) : childAt(trn, 'TRNTYPE'),
        'missing, expected a transaction type such as DEBIT',
        'notice',
      );
    } else if (!OFX_TRANSACTION_TYPES.includes(typeCode)) {
      add(at(typeNode as Located), `"${typeCode}" is not an OFX transaction type; kept as written`, 'notice');
    }
    const posted = readDate(trn, 'DTPOSTED', true);
    const user = readDate(trn, 'DTUSER', false);
    const avail = readDate(trn, 'DTAVAIL', false);
    if (posted === null || user === null || avail === null) ok = false;

    // Amount: in CURDEF, unless a CURRENCY aggregate says it is in another currency.
    let amount: number | null;
    const currencyNode = kid(trn, 'CURRENCY');
    const origNode = kid(trn, 'ORIGCURRENCY');
    if (currencyNode && origNode) {
      add(at(origNode), 'both CURRENCY and ORIGCURRENCY given, expected at most one');
      ok = false;
    }
    const foreign = currencyNode ? readForeignCurrency(currencyNode) : undefined;
    if (foreign === null) ok = false;
    if (foreign && foreign.symbol !== curdef && exponent !== undefined) {
      const sourceExponent = minorUnitExponent(foreign.symbol) as number;
      amount = readAmount(trn, 'TRNAMT', sourceExponent);
      if (amount !== null) {
        const converted = convertMinor(amount, sourceExponent, foreign.rate, exponent);
        if (converted === undefined) {
          add(childAt(trn, 'TRNAMT'), 'is too large after conversion at CURRATE');
          amount = null;
        } else {
          add(
            at(currencyNode as Located),
            `TRNAMT ${formatMinor(amount, sourceExponent)} ${foreign.symbol} converted at CURRATE ${foreign.rateText} to ${formatMinor(converted, exponent)} ${curdef}`,
            'notice',
          );
          amount = converted;
        }
      }
    } else {
      amount = readAmount(trn, 'TRNAMT', exponent);
    }
    if (origNode && !currencyNode) {
      const symbol = readText(origNode, 'CURSYM').toUpperCase();
      const rate = readText(origNode, 'CURRATE');
      add(
        at(origNode),
        `originally in ${symbol || 'another currency'}${rate ? ` at rate ${rate}` : ''}; TRNAMT is already in ${curdef || 'CURDEF'}`,
        'notice',
      );
    }
    if (amount === null) ok = false;

    const fitNode = kid(trn, 'FITID');
    const fitid = normalizeOfxSpace(value(fitNode) ?? '');
    if (fitid === '') {
      add(fitNode ? at(fitNode) : childAt(trn, 'FITID'), "missing, expected the bank's transaction id");
      ok = false;
    }

    let correct: PendingEntry['correct'];
    const correctFitNode = kid(trn, 'CORRECTFITID');
    const correctActionNode = kid(trn, 'CORRECTACTION');
    const correctFitId = normalizeOfxSpace(value(correctFitNode) ?? '');
    const correctAction = normalizeOfxSpace(value(correctActionNode) ?? '').toUpperCase();
    if (correctFitId !== '' || correctAction !== '') {
      if (correctFitId === '') {
        add(childAt(trn, 'CORRECTFITID'), 'missing, expected the FITID that CORRECTACTION applies to');
        ok = false;
      } else if (correctAction !== 'REPLACE' && correctAction !== 'DELETE') {
        add(
          correctActionNode ? at(correctActionNode) : childAt(trn, 'CORRECTACTION'),
          `${correctAction === '' ? 'missing' : `"${correctAction}" is unknown`}, expected REPLACE or DELETE`,
        );
        ok = false;
      } else {
        correct = { fitid: correctFitId, action: correctAction };
      }
    }

    if (!ok || posted === null || posted === undefined || amount === null) return undefined;

    const payee = kid(trn, 'PAYEE');
    const name = readText(trn, 'NAME') || readText(payee, 'NAME');
    const memo = readText(trn, 'MEMO');
    const reference = readText(trn, 'CHECKNUM') || readText(trn, 'REFNUM');
    const entry: {
      bookingDate: CalendarDate;
      valueDate?: CalendarDate;
      amount: number;
      description: string;
      counterparty?: string;
      reference?: string;
      bankRef?: string;
      status: 'booked';
      typeCode?: string;
      source: { line: number; element: string };
    } = {
      bookingDate: posted,
      amount,
      description: combineNameAndMemo(name, memo),
      bankRef: fitid,
      status: 'booked',
      source: { line: trn.el.line, element: trn.path },
    };
    if (avail !== undefined && avail !== null) entry.valueDate = avail;
    if (name !== '') entry.counterparty = name;
    if (reference !== '') entry.reference = reference;
    if (typeCode !== '') entry.typeCode = typeCode;
    const result: PendingEntry = { entry, fitid, line: trn.el.line, path: trn.path };
    if (correct) result.correct = correct;
    return result;
  }

  function readForeignCurrency(
    node: Located,
  ): { symbol: string; rate: { numerator: bigint; scale: number }; rateText: string } | null {
    const symNode = kid(node, 'CURSYM');
    const symbol = normalizeOfxSpace(value(symNode) ?? '').toUpperCase();
    if (!isKnownCurrency(symbol)) {
      add(
        symNode ? at(symNode) : childAt(node, 'CURSYM'),
        symbol === '' ? 'missing, expected an ISO 4217 currency code' : `"${symbol}" is not an ISO 4217 currency code`,
      );
      return null;
    }
    const rateNode = kid(node, 'CURRATE');
    const rateText = normalizeOfxSpace(value(rateNode) ?? '');
    const rate = parseOfxRate(rateText);
    if (!rate) {
      add(
        rateNode ? at(rateNode) : childAt(node, 'CURRATE'),
        `${rateText === '' ? 'missing' : `"${rateText}" is not a rate`}, expected a positive decimal such as 1.0825`,
      );
      return null;
    }
    return { symbol, rate, rateText };
  }

  /**
   * Applies CORRECTACTION records to the latest earlier entry with the corrected FITID in
   * the same account, in this statement or an earlier one of the file. Corrected entries
   * are marked `removed`; the returned list still holds them (filtered at the end, since a
   * later statement may correct an entry of this one).
   */
  function applyCorrections(items: readonly PendingEntry[], key: string): PendingEntry[] {
    let index = byAccount.get(key);
    if (!index) {
      index = new Map();
      byAccount.set(key, index);
    }
    const remember = (item: PendingEntry): void => {
      const list = (index as Map<string, PendingEntry[]>).get(item.fitid);
      if (list) list.push(item);
      else (index as Map<string, PendingEntry[]>).set(item.fitid, [item]);
    };
    const latest = (fitid: string): PendingEntry | undefined => {
      const list = (index as Map<string, PendingEntry[]>).get(fitid);
      while (list && list.length > 0 && (list[list.length - 1] as PendingEntry).removed) list.pop();
      return list?.[list.length - 1];
    };
    const kept: PendingEntry[] = [];
    for (const item of items) {
      if (!item.correct) {
        kept.push(item);
        remember(item);
        continue;
      }
      const { fitid, action } = item.correct;
      const where = { line: item.line, path: item.path };
      const target = latest(fitid);
      if (target) {
        target.removed = true;
        if (action === 'REPLACE') {
          kept.push(item);
          remember(item);
          add(
            where,
            `CORRECTACTION REPLACE: replaces FITID "${fitid}" (line ${target.line}); the earlier entry was left out and this one kept`,
            'notice',
          );
        } else {
          add(
            where,
            `CORRECTACTION DELETE: deletes FITID "${fitid}" (line ${target.line}); both that entry and this record were left out`,
            'notice',
          );
        }
      } else if (action === 'REPLACE') {
        kept.push(item);
        remember(item);
        add(
          where,
          `CORRECTACTION REPLACE of FITID "${fitid}", which is not in this file: this entry is kept; an earlier import holding FITID "${fitid}" must be corrected by hand`,
          'notice',
        );
      } else {
        add(
          where,
          `CORRECTACTION DELETE of FITID "${fitid}", which is not in this file: nothing was left out here; an earlier import holding FITID "${fitid}" must be corrected by hand`,
          'notice',
        );
      }
    }
    return kept;
  }

  function warnDuplicateFitIds(entries: readonly PendingEntry[]): void {
    const seen = new Map<string, number>();
    for (const item of entries) {
      const first = seen.get(item.fitid);
      if (first === undefined) seen.set(item.fitid, item.line);
      else {
        add(
          { line: item.line, path: item.path },
          `FITID "${item.fitid}" appears again (first on line ${first}); both kept, though a FITID should be unique per account`,
          'notice',
        );
      }
    }
  }
}
