/**
 * ISO 20022 camt.053 (BankToCustomerStatement) importer, versions 001.02 to 001.13.
 *
 * Layout read (Source: ISO 20022 camt.053.001.NN message definition):
 * `Document/BkToCstmrStmt/GrpHdr` then one or more `Stmt`, each with `Id`, `FrToDt`,
 * `Acct` (`Id/IBAN` or `Id/Othr/Id`, `Ccy`, `Nm`, `Svcr/FinInstnId/BIC` up to 001.03 or
 * `BICFI` from 001.04), `Bal*` and `Ntry*`. Each `Stmt` becomes one `ParsedStatement`.
 * Entry rules are documented in `camt053/entry.ts`, balance rules in `camt053/balance.ts`.
 *
 * The file is read in one pass with the pull parser: the elements of a statement other
 * than entries are small and read as trees; each `Ntry` is read as its own small tree and
 * dropped once converted, so memory stays near the size of the text plus the result.
 *
 * Every problem names the file, the line and the element path, e.g.
 * `Document/BkToCstmrStmt/Stmt[2]/Ntry[14]/BookgDt: missing, expected Dt or DtTm`.
 * `parse` never throws.
 */
import { addDays } from '../core/dates';
import type {
  ImportOptions,
  ImportResult,
  ParsedStatement,
  StatementAccount,
  StatementBalance,
  StatementEntry,
  StatementImporter,
} from './types';
import { XmlPullParser, type XmlElement, type XmlStartEvent, type XmlSyntaxError } from './xml';
import { readBalance } from './camt053/balance';
import { readEntry } from './camt053/entry';
import { type StatementContext, readDateTime } from './camt053/fields';
import {
  CAMT053_NAMESPACE_PREFIX,
  ProblemCollector,
  camt053VersionNumber,
  camt053VersionOf,
  child,
  clip,
  currencyExponent,
  descend,
  ownText,
  textOf,
  TextPool,
} from './camt053/values';

const INDEXED_NAMES: ReadonlySet<string> = new Set(['Stmt', 'Ntry', 'Bal', 'NtryDtls', 'TxDtls']);
const SNIFF_HEAD = 65536;
const CAMT_ANY = /^urn:iso:std:iso:20022:tech:xsd:camt\.(\d{3})\.\d{3}\.\d{2}$/;

const OTHER_CAMT: Readonly<Record<string, string>> = {
  '052': 'camt.052 is an account report (intraday), not a statement',
  '054': 'camt.054 is a debit/credit notification, not a statement',
};

/**
 * How sure the text is a camt.053 statement, from its root element alone.
 * 1 for `<Document>` in a camt.053.001.02–13 namespace; 0.3 for another camt namespace
 * (so this importer reports what is wrong); 0.1 for `<Document>` in another namespace;
 * 0.9 for XML that is broken before its root but names a camt.053 namespace; else 0.
 * Reads at most the first 64 KiB.
 * @example camt053Importer.sniff('<Document xmlns="urn:iso:std:iso:20022:tech:xsd:camt.053.001.08"/>') // 1
 */
function sniff(text: string): number {
  const head = text.length > SNIFF_HEAD ? text.slice(0, SNIFF_HEAD) : text;
  const trimmed = head.replace(/^\uFEFF?\s*/, '');
  if (!trimmed.startsWith('<')) return 0;
  const parser = new XmlPullParser(head);
  for (;;) {
    const ev = parser.next();
    if (ev.type === 'start') {
      if (ev.localName !== 'Document') return 0;
      if (camt053VersionOf(ev.namespace)) return 1;
      if (CAMT_ANY.test(ev.namespace)) return 0.3;
      return 0.1;
    }
    if (ev.type === 'error' || ev.type === 'eof') {
      return head.includes(CAMT053_NAMESPACE_PREFIX) ? 0.9 : 0;
    }
  }
}

/** What the reader keeps about one `Stmt` while streaming through it. */
interface StatementDraft {
  readonly path: string;
  readonly line: number;
  id: string | undefined;
  account: StatementAccount | undefined;
  accountSeen: boolean;
  firstDay: string | undefined;
  lastDay: string | undefined;
  readonly balances: { el: XmlElement; path: string }[];
  readonly entries: StatementEntry[];
  readonly ctx: StatementContext;
}

class DocumentReader {
  private readonly parser: XmlPullParser;
  private ns = '';
  /** Set once the XML turned out not to be well-formed. */
  private broken = false;
  private version = 0;
  readonly statements: ParsedStatement[] = [];

  constructor(
    text: string,
    private readonly problems: ProblemCollector,
  ) {
    this.parser = new XmlPullParser(text, { indexedNames: INDEXED_NAMES });
  }

  private xmlError(e: XmlSyntaxError): void {
    this.broken = true;
    this.problems.error(e.path || undefined, e.line, `XML is not well-formed: ${e.message}`);
  }

  /** Next start event at `depth`, or undefined at the end tag of the element at depth − 1 (or on error). */
  private nextChild(depth: number): XmlStartEvent | undefined {
    for (;;) {
      const ev = this.parser.next();
      if (ev.type === 'start') {
        if (ev.depth === depth) return ev;
        continue; // cannot happen: children are always read or skipped whole
      }
      if (ev.type === 'end' && ev.depth === depth - 1) return undefined;
      if (ev.type === 'error') {
        this.xmlError(ev.error);
        return undefined;
      }
      if (ev.type === 'eof') return undefined;
    }
  }

  private read(start: XmlStartEvent): XmlElement | undefined {
    const el = this.parser.readElement(start);
    if ('message' in el) {
      this.xmlError(el);
      return undefined;
    }
    return el;
  }

  private skip(start: XmlStartEvent): boolean {
    const e = this.parser.skipElement(start);
    if (e) this.xmlError(e);
    return !e;
  }

  run(): void {
    let root: XmlStartEvent | undefined;
    for (;;) {
      const ev = this.parser.next();
      if (ev.type === 'start') {
        root = ev;
        break;
      }
      if (ev.type === 'error') return this.xmlError(ev.error);
      if (ev.type === 'eof') return;
    }
    if (!this.checkRoot(root)) return;
    let messages = 0;
    for (let ev = this.nextChild(2); ev; ev = this.nextChild(2)) {
      if (ev.localName === 'BkToCstmrStmt' && ev.namespace === this.ns) {
        messages++;
        if (!this.readMessage(ev)) return;
      } else {
        this.problems.error(
          `Document/${ev.name}`,
          ev.line,
          `unexpected element <${ev.name}>, expected <BkToCstmrStmt>`,
        );
        if (!this.skip(ev)) return;
      }
    }
    if (this.broken) return;
    if (this.problems.errorCount === 0 && messages === 0) {
      this.problems.error('Document/BkToCstmrStmt', root.line, 'missing, expected the statement message');
    }
    // Drain: well-formedness after the root (a second root, trailing text) still counts.
    for (;;) {
      const ev = this.parser.next();
      if (ev.type === 'error') return this.xmlError(ev.error);
      if (ev.type === 'eof') return;
    }
  }

  private checkRoot(root: XmlStartEvent): boolean {
    if (root.localName !== 'Document') {
      this.problems.error(
        root.name,
        root.line,
        `root element <${root.name}>, expected <Document> of ISO 20022 camt.053`,
      );
      return false;
    }
    const version = camt053VersionOf(root.namespace);
    if (version) {
      this.ns = root.namespace;
      this.version = camt053VersionNumber(version);
      return true;
    }
    const expected = `${CAMT053_NAMESPACE_PREFIX}NN (NN = 02 to 13)`;
    const other = CAMT_ANY.exec(root.namespace);
    const hint = other ? OTHER_CAMT[other[1] as string] : undefined;
    const ns = root.namespace.length > 120 ? clip(root.namespace) : root.namespace;
    const found = ns ? `namespace "${ns}"` : 'no namespace';
    this.problems.error('Document', root.line, `${found}, expected ${expected}` + (hint ? ` (${hint})` : ''));
    return false;
  }

  /** Reads BkToCstmrStmt. Returns false when the XML broke. */
  private readMessage(start: XmlStartEvent): boolean {
    const path = 'Document/BkToCstmrStmt';
    let header = false;
    let statements = 0;
    for (let ev = this.nextChild(3); ev; ev = this.nextChild(3)) {
      if (ev.namespace === this.ns && ev.localName === 'GrpHdr') {
        if (!this.read(ev)) return false;
        header = true;
      } else if (ev.namespace === this.ns && ev.localName === 'Stmt') {
        statements++;
        if (!this.readStatement(ev)) return false;
      } else if (!this.skip(ev)) {
        return false;
      }
    }
    if (this.broken) return false;
    if (!header)
      this.problems.error(`${path}/GrpHdr`, start.line, 'missing, expected the group header (MsgId, CreDtTm)');
    if (statements === 0) this.problems.error(`${path}/Stmt`, start.line, 'missing, expected at least one statement');
    return true;
  }

  /** Reads one Stmt, streaming its entries. Returns false when the XML broke. */
  private readStatement(start: XmlStartEvent): boolean {
    const path = `Document/BkToCstmrStmt/Stmt[${start.index}]`;
    const draft: StatementDraft = {
      path,
      line: start.line,
      id: undefined,
      account: undefined,
      accountSeen: false,
      firstDay: undefined,
      lastDay: undefined,
      balances: [],
      entries: [],
      ctx: {
        ns: this.ns,
        version: this.version,
        problems: this.problems,
        currency: undefined,
        exponent: undefined,
        texts: new TextPool(),
      },
    };
    const ns = this.ns;
    for (let ev = this.nextChild(4); ev; ev = this.nextChild(4)) {
      if (ev.namespace !== ns) {
        if (!this.skip(ev)) return false;
        continue;
      }
      const el = this.read(ev);
      if (!el) return false;
      switch (ev.localName) {
        case 'Id':
          draft.id = textOf(el) || undefined;
          break;
        case 'Acct':
          this.readAccount(el, draft);
          break;
        case 'FrToDt':
          this.readPeriod(el, draft);
          break;
        case 'Bal':
          // Read once the entries are known (OPBD's start/end of day depends on them).
          draft.balances.push({ el, path: `${path}/Bal[${ev.index}]` });
          break;
        case 'Ntry': {
          // Joined into one flat string: the entry keeps it as its source element.
          const entry = readEntry(el, [path, '/Ntry[', ev.index, ']'].join(''), draft.ctx);
          if (entry) draft.entries.push(entry);
          break;
        }
        default:
          break;
      }
    }
    if (this.broken) return false;
    this.finishStatement(draft);
    return true;
  }

  private readAccount(acct: XmlElement, draft: StatementDraft): void {
    const ns = this.ns;
    const path = `${draft.path}/Acct`;
    draft.accountSeen = true;
    const account: { -readonly [K in keyof StatementAccount]: StatementAccount[K] } = {};
    const id = child(acct, 'Id', ns);
    const iban = id ? child(id, 'IBAN', ns) : undefined;
    const other = id ? descend(id, ns, 'Othr', 'Id') : undefined;
    if (iban && textOf(iban)) account.identifier = textOf(iban).replace(/\s+/g, '');
    else if (other && textOf(other)) account.identifier = textOf(other);
    else this.problems.error(`${path}/Id`, (id ?? acct).line, 'missing, expected IBAN or Othr/Id');
    const name = textOf(child(acct, 'Nm', ns)) || textOf(descend(acct, ns, 'Ownr', 'Nm'));
    if (name) account.name = name;
    const fi = descend(acct, ns, 'Svcr', 'FinInstnId');
    const bic = fi ? textOf(child(fi, 'BICFI', ns)) || textOf(child(fi, 'BIC', ns)) : '';
    if (bic) account.servicer = bic;
    draft.account = account;
    const ccy = child(acct, 'Ccy', ns);
    if (ccy) {
      const code = textOf(ccy);
      const e = currencyExponent(code);
      if (typeof e !== 'number') {
        this.problems.error(`${path}/Ccy`, ccy.line, e.message);
        draft.ctx.currency = code;
        draft.ctx.exponent = undefined;
      } else if (draft.ctx.currency !== undefined && draft.ctx.currency !== code) {
        this.problems.error(
          `${path}/Ccy`,
          ccy.line,
          `currency ${code} differs from ${draft.ctx.currency} stated earlier`,
        );
      } else {
        draft.ctx.currency = code;
        draft.ctx.exponent = e;
      }
    }
  }

  private readPeriod(period: XmlElement, draft: StatementDraft): void {
    const ns = this.ns;
    const from = child(period, 'FrDtTm', ns);
    const to = child(period, 'ToDtTm', ns);
    if (from) draft.firstDay = readDateTime(from, `${draft.path}/FrToDt/FrDtTm`, draft.ctx);
    else this.problems.error(`${draft.path}/FrToDt/FrDtTm`, period.line, 'missing, expected the start date-time');
    if (to) draft.lastDay = readDateTime(to, `${draft.path}/FrToDt/ToDtTm`, draft.ctx);
    else this.problems.error(`${draft.path}/FrToDt/ToDtTm`, period.line, 'missing, expected the end date-time');
  }

  private finishStatement(draft: StatementDraft): void {
    const problems = this.problems;
    if (draft.id === undefined) problems.error(`${draft.path}/Id`, draft.line, 'missing, expected the statement id');
    if (!draft.accountSeen) problems.error(`${draft.path}/Acct`, draft.line, 'missing, expected the account (Id, Ccy)');

    let firstBooking: string | undefined;
    let lastBooking: string | undefined;
    for (const e of draft.entries) {
      if (e.status !== 'booked') continue;
      if (firstBooking === undefined || e.bookingDate < firstBooking) firstBooking = e.bookingDate;
      if (lastBooking === undefined || e.bookingDate > lastBooking) lastBooking = e.bookingDate;
    }
    const balances: StatementBalance[] = [];
    for (const b of draft.balances) {
      const balance = readBalance(b.el, b.path, draft.ctx, draft.firstDay, firstBooking);
      if (balance) balances.push(balance);
    }
    const currency = draft.ctx.currency;
    if (currency === undefined) {
      problems.error(`${draft.path}/Acct/Ccy`, draft.line, 'missing, and no amount states a currency');
    }

    let from = draft.firstDay;
    let to = draft.lastDay;
    if (from === undefined || to === undefined) {
      // No FrToDt: the period is what the entries and balances cover.
      let lo = firstBooking;
      let hi = lastBooking;
      for (const b of balances) {
        const start = b.kind === 'opening' && b.at === 'end' ? addDays(b.date, 1) : b.date;
        if (b.kind === 'opening' || b.kind === 'closing' || b.kind === 'interim') {
          if (lo === undefined || start < lo) lo = start;
          if (hi === undefined || b.date > hi) hi = b.date;
        }
      }
      from ??= lo;
      to ??= hi;
    }

    // Copied out of the document, like the entries' strings (see ownText).
    const account: { -readonly [K in keyof StatementAccount]: StatementAccount[K] } = { ...draft.account };
    if (account.identifier !== undefined) account.identifier = ownText(account.identifier);
    if (account.name !== undefined) account.name = ownText(account.name);
    if (account.servicer !== undefined) account.servicer = ownText(account.servicer);
    const statement: { -readonly [K in keyof ParsedStatement]: ParsedStatement[K] } = {
      account,
      currency: ownText(currency ?? ''),
      entries: draft.entries,
      balances,
    };
    if (draft.id !== undefined) statement.statementId = ownText(draft.id);
    if (from !== undefined) statement.from = from;
    if (to !== undefined) statement.to = to;
    this.statements.push(statement);
  }
}

/**
 * Reads a camt.053 document.
 * @returns statements (one per `Stmt`) and problems; never throws.
 * @example camt053Importer.parse(xml, { fileName: 'march.xml' }).statements[0].entries.length
 */
function parse(text: string, options: ImportOptions): ImportResult {
  const file = options.fileName;
  const problems = new ProblemCollector(file);
  let statements: readonly ParsedStatement[] = [];
  try {
    const reader = new DocumentReader(text, problems);
    reader.run();
    statements = reader.statements;
  } catch (e) {
    // A bug, not bad input: report it as a problem rather than crash the import.
    problems.error(
      'Document',
      undefined,
      `internal error while reading camt.053: ${e instanceof Error ? e.message : String(e)}`,
    );
  }
  return { file, format: 'camt.053', statements, problems: problems.list() };
}

/**
 * The ISO 20022 camt.053 importer (id `camt.053`): `sniff` looks at the root element and
 * its namespace, `parse` reads versions 001.02 to 001.13.
 *
 * @example
 * const r = camt053Importer.parse(xml, { fileName: 'march.xml' });
 * if (!hasErrors(r)) r.statements.forEach((s) => console.log(s.account.identifier, s.entries.length));
 */
export const camt053Importer: StatementImporter = { id: 'camt.053', sniff, parse };
