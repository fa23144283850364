/**
 * Writes statements as an ISO 20022 camt.053 document (BankToCustomerStatement) of a
 * chosen version, 001.02 to 001.13, that Ebbline's importer (and other readers) can read
 * back: same entries, same balances.
 *
 * Version differences followed (Source: ISO 20022 camt.053.001.NN message definitions):
 * - `Ntry/Sts` is a plain code (`<Sts>BOOK</Sts>`) up to 001.07 and a choice
 *   (`<Sts><Cd>BOOK</Cd></Sts>`) from 001.08.
 * - `RltdPties/Dbtr|Cdtr` hold `Nm` directly up to 001.07 and `Pty/Nm` from 001.08.
 * - `TxDtls/Amt` and `TxDtls/CdtDbtInd` exist from 001.04 (not in 001.02's EntryTransaction2);
 *   `Svcr/FinInstnId/BICFI` from 001.04, `BIC` before.
 *   // From memory: 001.03 is written like 001.02 for these two points.
 *
 * Mapping: `Stmt/Id` ← statementId; `FrToDt` ← from/to (derived from entries and balances
 * when absent); `Acct/Id/IBAN` when the identifier looks like an IBAN, else `Othr/Id`;
 * balances: opening at start of day → OPBD; opening at end of day → OPBD when dated before
 * the statement's first day (read back as end of that day), else PRCD; closing → CLBD;
 * interim and running → ITBD; available → CLAV (OPAV at start of day). Entries: `Amt` +
 * `CdtDbtInd` from the sign, `Sts` BOOK/PDNG, `BookgDt`/`ValDt`, `AcctSvcrRef` ← bankRef,
 * `BkTxCd` ← typeCode (`DOMN/FMLY/SUBF` → `Domn`, else `Prtry/Cd`; NOTPROVIDED when absent,
 * because BkTxCd is mandatory), `Refs/EndToEndId` ← reference, counterparty as `Cdtr` of a
 * debit or `Dbtr` of a credit, description as `RmtInf/Ustrd` pieces of 140 characters.
 *
 * Text longer than the schema allows is cut to the limit (Max35Text ids and references,
 * Max140Text names); characters XML 1.0 cannot carry (control characters other than tab,
 * LF and CR; unpaired surrogates) are written as U+FFFD. A statement with no balances is
 * written without `Bal`, although the schema asks for at least one.
 */
import { addDays, isCalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import { exponentOf, formatMinor } from '../core/money';
import type { ParsedStatement, StatementBalance, StatementEntry } from '../import/types';
import { CAMT053_NAMESPACE_PREFIX, CAMT053_VERSIONS, camt053VersionNumber } from '../import/camt053/values';
import { escapeXmlAttribute, escapeXmlText } from '../import/xml';

/** Options of `writeCamt053`. */
export interface Camt053WriteOptions {
  /** Message version `001.NN`, NN from 02 to 13. */
  readonly version: '001.02' | '001.04' | '001.06' | '001.08' | '001.10' | '001.13' | string;
  /** GrpHdr/MsgId; default `EBBLINE-` + the first statement id. */
  readonly messageId?: string;
  /** GrpHdr/CreDtTm and Stmt/CreDtTm (ISODateTime); default the last statement day at 00:00:00. */
  readonly createdAt?: string;
}

const IBAN_SHAPE = /^[A-Z]{2}[0-9]{2}[A-Z0-9]{11,30}$/;
const DOMAIN_CODE = /^([A-Z0-9]{4})\/([A-Z0-9]{4})\/([A-Z0-9]{4})$/;
const ISO_DATE_TIME = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(?:\.\d+)?(?:Z|[+-]\d{2}:\d{2})?$/;
const USTRD_MAX = 140;

/** True for a UTF-16 code unit that XML 1.0 can carry at this position of `s`. */
function isXmlUnit(s: string, i: number): boolean {
  const c = s.charCodeAt(i);
  if (c < 0x20) return c === 0x09 || c === 0x0a || c === 0x0d;
  if (c < 0xd800) return true;
  if (c <= 0xdbff) {
    const d = s.charCodeAt(i + 1);
    return d >= 0xdc00 && d <= 0xdfff;
  }
  if (c <= 0xdfff) {
    const h = s.charCodeAt(i - 1);
    return i > 0 && h >= 0xd800 && h <= 0xdbff;
  }
  return c !== 0xfffe && c !== 0xffff;
}

/** Replaces what XML 1.0 cannot carry with U+FFFD. */
function clean(s: string): string {
  let i = 0;
  while (i < s.length && isXmlUnit(s, i)) i++;
  if (i === s.length) return s;
  let out = s.slice(0, i);
  for (; i < s.length; i++) out += isXmlUnit(s, i) ? s[i] : '\uFFFD';
  return out;
}

function cut(s: string, max: number): string {
  if (s.length <= max) return s;
  return Array.from(s).slice(0, max).join('');
}

function text(s: string, max?: number): string {
  const c = clean(s);
  return escapeXmlText(max === undefined ? c : cut(c, max));
}

/** Splits text into pieces of at most `size` code points. */
function pieces(s: string, size: number): string[] {
  const chars = Array.from(s);
  const out: string[] = [];
  for (let i = 0; i < chars.length; i += size) out.push(chars.slice(i, i + size).join(''));
  return out;
}

function firstAndLastDay(s: ParsedStatement): { from?: string; to?: string } {
  let from = s.from;
  let to = s.to;
  if (from !== undefined && to !== undefined) return { from, to };
  let lo: string | undefined;
  let hi: string | undefined;
  for (const e of s.entries) {
    if (e.status !== 'booked') continue;
    if (lo === undefined || e.bookingDate < lo) lo = e.bookingDate;
    if (hi === undefined || e.bookingDate > hi) hi = e.bookingDate;
  }
  for (const b of s.balances) {
    if (b.kind !== 'opening' && b.kind !== 'closing' && b.kind !== 'interim') continue;
    const start = b.kind === 'opening' && b.at === 'end' ? addDays(b.date, 1) : b.date;
    if (lo === undefined || start < lo) lo = start;
    if (hi === undefined || b.date > hi) hi = b.date;
  }
  from ??= lo;
  to ??= hi;
  const out: { from?: string; to?: string } = {};
  if (from !== undefined) out.from = from;
  if (to !== undefined) out.to = to;
  return out;
}

function balanceCode(b: StatementBalance, firstDay: string | undefined): string {
  switch (b.kind) {
    case 'opening':
      if (b.at === 'start') return 'OPBD';
      return firstDay !== undefined && b.date < firstDay ? 'OPBD' : 'PRCD';
    case 'closing':
      return 'CLBD';
    case 'interim':
    case 'running':
      return 'ITBD';
    case 'available':
      return b.at === 'start' ? 'OPAV' : 'CLAV';
  }
}

function checkDate(date: string, what: string): void {
  if (!isCalendarDate(date))
    throw new EngineError('INVALID_DATE', `${what}: not a calendar date (YYYY-MM-DD): "${date}"`);
}

function checkAmount(minor: number, what: string): void {
  if (!Number.isSafeInteger(minor)) throw new EngineError('INVALID_AMOUNT', `${what}: not an integer amount: ${minor}`);
}

class Out {
  readonly lines: string[] = [];
  line(depth: number, s: string): void {
    this.lines.push('  '.repeat(depth) + s);
  }
  leaf(depth: number, name: string, value: string): void {
    this.lines.push(`${'  '.repeat(depth)}<${name}>${value}</${name}>`);
  }
}

/**
 * Writes statements as one camt.053 document of the given version.
 *
 * @param statements one `Stmt` each, in order; amounts in each statement's currency.
 * @param options `version` (`001.02` … `001.13`), optional `messageId` and `createdAt`.
 * @returns the XML text (UTF-8 declaration, two-space indentation, LF line ends).
 * @throws EngineError INVALID_ARGUMENT for an unknown version, a bad `createdAt` or no statements;
 *   UNKNOWN_CURRENCY for a currency that is not ISO 4217; INVALID_DATE / INVALID_AMOUNT for
 *   dates or amounts that are not calendar dates or safe integers.
 * @example
 * writeCamt053([{ account: { identifier: 'DE02120300000000202051' }, currency: 'EUR',
 *   entries: [], balances: [] }], { version: '001.08' }).includes('camt.053.001.08') // true
 */
export function writeCamt053(statements: readonly ParsedStatement[], options: Camt053WriteOptions): string {
  const version = options.version;
  if (!CAMT053_VERSIONS.includes(version)) {
    throw new EngineError('INVALID_ARGUMENT', `camt.053 version "${version}", expected 001.02 to 001.13`);
  }
  if (statements.length === 0) {
    throw new EngineError('INVALID_ARGUMENT', 'camt.053 needs at least one statement (Stmt)');
  }
  const nn = camt053VersionNumber(version);
  const periods = statements.map(firstAndLastDay);
  let createdAt = options.createdAt;
  if (createdAt === undefined) {
    let last: string | undefined;
    for (const p of periods) if (p.to !== undefined && (last === undefined || p.to > last)) last = p.to;
    createdAt = `${last ?? '2000-01-01'}T00:00:00`;
  } else if (!ISO_DATE_TIME.test(createdAt) || !isCalendarDate(createdAt.slice(0, 10))) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `createdAt "${createdAt}", expected an ISO date-time YYYY-MM-DDThh:mm:ss`,
    );
  }
  const messageId = options.messageId ?? `EBBLINE-${statements[0]?.statementId ?? 'STATEMENT'}`;

  const out = new Out();
  out.line(0, '<?xml version="1.0" encoding="UTF-8"?>');
  out.line(0, `<Document xmlns="${escapeXmlAttribute(CAMT053_NAMESPACE_PREFIX + version.slice(4))}">`);
  out.line(1, '<BkToCstmrStmt>');
  out.line(2, '<GrpHdr>');
  out.leaf(3, 'MsgId', text(messageId, 35));
  out.leaf(3, 'CreDtTm', createdAt);
  out.line(2, '</GrpHdr>');
  statements.forEach((s, i) => writeStatement(out, s, i, periods[i] ?? {}, nn, createdAt));
  out.line(1, '</BkToCstmrStmt>');
  out.line(0, '</Document>');
  return out.lines.join('\n') + '\n';
}

function writeStatement(
  out: Out,
  s: ParsedStatement,
  i: number,
  period: { from?: string; to?: string },
  nn: number,
  createdAt: string,
): void {
  const exponent = exponentOf(s.currency);
  const ccy = escapeXmlAttribute(s.currency);
  out.line(2, '<Stmt>');
  out.leaf(3, 'Id', text(s.statementId ?? `STMT-${i + 1}`, 35));
  out.leaf(3, 'CreDtTm', createdAt);
  if (period.from !== undefined && period.to !== undefined) {
    checkDate(period.from, 'statement from');
    checkDate(period.to, 'statement to');
    out.line(3, '<FrToDt>');
    out.leaf(4, 'FrDtTm', `${period.from}T00:00:00`);
    out.leaf(4, 'ToDtTm', `${period.to}T23:59:59`);
    out.line(3, '</FrToDt>');
  }
  out.line(3, '<Acct>');
  const id = (s.account.identifier ?? '').trim();
  out.line(4, '<Id>');
  if (IBAN_SHAPE.test(id.replace(/\s+/g, ''))) out.leaf(5, 'IBAN', id.replace(/\s+/g, ''));
  else out.line(5, `<Othr><Id>${text(id || 'UNKNOWN', 34)}</Id></Othr>`);
  out.line(4, '</Id>');
  out.leaf(4, 'Ccy', s.currency);
  if (s.account.name) out.leaf(4, 'Nm', text(s.account.name, 70));
  if (s.account.servicer) {
    const tag = nn >= 4 ? 'BICFI' : 'BIC';
    out.line(4, `<Svcr><FinInstnId><${tag}>${text(s.account.servicer, 11)}</${tag}></FinInstnId></Svcr>`);
  }
  out.line(3, '</Acct>');
  for (const b of s.balances) {
    checkDate(b.date, 'balance date');
    checkAmount(b.amount, 'balance amount');
    out.line(3, '<Bal>');
    out.line(4, `<Tp><CdOrPrtry><Cd>${balanceCode(b, period.from)}</Cd></CdOrPrtry></Tp>`);
    out.line(4, `<Amt Ccy="${ccy}">${formatMinor(Math.abs(b.amount), exponent)}</Amt>`);
    out.leaf(4, 'CdtDbtInd', b.amount < 0 ? 'DBIT' : 'CRDT');
    out.line(4, `<Dt><Dt>${b.date}</Dt></Dt>`);
    out.line(3, '</Bal>');
  }
  for (const e of s.entries) writeEntry(out, e, ccy, exponent, nn);
  out.line(2, '</Stmt>');
}

function writeEntry(out: Out, e: StatementEntry, ccy: string, exponent: number, nn: number): void {
  checkDate(e.bookingDate, 'booking date');
  if (e.valueDate !== undefined) checkDate(e.valueDate, 'value date');
  checkAmount(e.amount, 'entry amount');
  const direction = e.amount < 0 ? 'DBIT' : 'CRDT';
  const amount = `<Amt Ccy="${ccy}">${formatMinor(Math.abs(e.amount), exponent)}</Amt>`;
  const status = e.status === 'booked' ? 'BOOK' : 'PDNG';
  out.line(3, '<Ntry>');
  out.line(4, amount);
  out.leaf(4, 'CdtDbtInd', direction);
  out.line(4, nn >= 8 ? `<Sts><Cd>${status}</Cd></Sts>` : `<Sts>${status}</Sts>`);
  out.line(4, `<BookgDt><Dt>${e.bookingDate}</Dt></BookgDt>`);
  if (e.valueDate !== undefined) out.line(4, `<ValDt><Dt>${e.valueDate}</Dt></ValDt>`);
  if (e.bankRef) out.leaf(4, 'AcctSvcrRef', text(e.bankRef, 35));
  const domain = e.typeCode ? DOMAIN_CODE.exec(e.typeCode) : null;
  if (domain) {
    out.line(
      4,
      `<BkTxCd><Domn><Cd>${domain[1]}</Cd><Fmly><Cd>${domain[2]}</Cd><SubFmlyCd>${domain[3]}</SubFmlyCd></Fmly></Domn></BkTxCd>`,
    );
  } else {
    // BkTxCd is mandatory in ReportEntry; NOTPROVIDED stands in when the source had no code.
    out.line(4, `<BkTxCd><Prtry><Cd>${text(e.typeCode || 'NOTPROVIDED', 35)}</Cd></Prtry></BkTxCd>`);
  }
  const description = clean(e.description);
  if (e.reference || e.counterparty || description) {
    out.line(4, '<NtryDtls>');
    out.line(5, '<TxDtls>');
    if (e.reference) out.line(6, `<Refs><EndToEndId>${text(e.reference, 35)}</EndToEndId></Refs>`);
    if (nn >= 4) {
      out.line(6, amount);
      out.leaf(6, 'CdtDbtInd', direction);
    }
    if (e.counterparty) {
      const role = direction === 'DBIT' ? 'Cdtr' : 'Dbtr';
      const name = `<Nm>${text(e.counterparty, 140)}</Nm>`;
      out.line(6, `<RltdPties><${role}>${nn >= 8 ? `<Pty>${name}</Pty>` : name}</${role}></RltdPties>`);
    }
    if (description) {
      out.line(6, '<RmtInf>');
      for (const piece of pieces(description, USTRD_MAX)) out.leaf(7, 'Ustrd', escapeXmlText(piece));
      out.line(6, '</RmtInf>');
    }
    out.line(5, '</TxDtls>');
    out.line(4, '</NtryDtls>');
  }
  out.line(3, '</Ntry>');
}
