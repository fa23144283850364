/**
 * Writes statements as OFX: version 1 gives OFX 1.0.2 SGML (header lines, leaf elements
 * without end tags), version 2 gives OFX 2.2.0 XML. Used by the demo generator and the
 * round-trip tests; the output reads back through Ebbline's OFX importer to the same
 * entries and balances.
 */
import { isCalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import { exponentOf, formatMinor } from '../core/money';
import type { ParsedStatement, StatementEntry } from '../import/types';
import { OFX_TRANSACTION_TYPES } from '../import/ofx/readOfxStatements';
import { splitDescription } from '../import/ofx/ofxDescription';
import { escapeOfxText } from '../import/ofx/ofxText';
import { formatOfxDate } from '../import/ofx/parseOfxDate';

/** Options of `writeOfx`. */
export interface WriteOfxOptions {
  /** 1: OFX 1.0.2 SGML; 2: OFX 2.2.0 XML. */
  readonly version: 1 | 2;
}

/** CHECKNUM holds at most 12 characters (OFX Banking Specification 2.3, STMTTRN: CHECKNUM A-12). */
const CHECKNUM_LENGTH = 12;

/** FNV-1a, 32 bits: a small stable hash for generated FITIDs (not for security). */
function fnv1a(text: string): string {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193) >>> 0;
  }
  return hash.toString(16).padStart(8, '0');
}

/**
 * A FITID for an entry that has no bank reference: the date, a hash of the entry's
 * content and an occurrence number among entries with the same content, so the same
 * statement written twice gives the same FITIDs (and overlapping exports deduplicate).
 *
 * @throws Never.
 * @example stableFitId({ bookingDate: '2024-03-01', amount: -500, description: 'Rent', status: 'booked', source: {} }, 1) // '20240301-…-1'
 */
export function stableFitId(entry: StatementEntry, occurrence: number): string {
  const content = [
    entry.bookingDate,
    entry.valueDate ?? '',
    String(entry.amount),
    entry.description,
    entry.counterparty ?? '',
    entry.reference ?? '',
  ].join('\u001f');
  return `${formatOfxDate(entry.bookingDate)}-${fnv1a(content)}-${occurrence}`;
}

function assertDate(date: string, what: string): void {
  if (!isCalendarDate(date))
    throw new EngineError('INVALID_DATE', `${what}: not a calendar date (YYYY-MM-DD): "${date}"`);
}

function assertAmount(amount: number, what: string): void {
  if (!Number.isSafeInteger(amount)) {
    throw new EngineError('INVALID_AMOUNT', `${what}: amount must be a safe integer of minor units, got ${amount}`);
  }
}

/** Builds the body as a list of lines, SGML or XML style. */
class OfxLines {
  readonly lines: string[] = [];
  private depth = 0;
  constructor(private readonly xml: boolean) {}
  open(name: string): void {
    this.lines.push(`${'  '.repeat(this.depth)}<${name}>`);
    this.depth++;
  }
  close(name: string): void {
    this.depth--;
    this.lines.push(`${'  '.repeat(this.depth)}</${name}>`);
  }
  leaf(name: string, value: string | undefined): void {
    if (value === undefined) return;
    const text = escapeOfxText(value);
    if (text === '') return;
    this.lines.push(`${'  '.repeat(this.depth)}<${name}>${text}${this.xml ? `</${name}>` : ''}`);
  }
}

/**
 * Writes statements as one OFX file.
 *
 * - Bank statements go into BANKMSGSRSV1 (one STMTTRNRS each), statements whose
 *   `account.kind` is 'card' into CREDITCARDMSGSRSV1 (CCSTMTTRNRS), in input order within
 *   each set; the specification orders the message sets, so bank statements come first.
 * - Account: ACCTID from `account.identifier` (else `account.name`), BANKID from
 *   `account.servicer` (left out when unknown: the specification requires it, Ebbline's
 *   importer does not), ACCTTYPE SAVINGS for 'savings', CHECKING otherwise. Card
 *   accounts (CCACCTFROM) have no BANKID, so their `servicer` is not written.
 * - BANKTRANLIST DTSTART/DTEND from `from`/`to`, else from the entry dates, else the
 *   closing balance date, else DTSERVER's date. Dates are written `YYYYMMDD`, without time or zone.
 * - Entries: booked ones only (OFX 1.0.2 has no pending list). TRNTYPE is `typeCode`
 *   when it is an OFX type, else CREDIT/DEBIT by sign; FITID is `bankRef`, or a stable
 *   generated one (`stableFitId`); `reference` goes to CHECKNUM for checks of at most
 *   12 characters, else REFNUM; NAME and MEMO come from `splitDescription`; `valueDate`
 *   goes to DTAVAIL.
 * - LEDGERBAL is the latest 'closing' balance, AVAILBAL the latest 'available' one;
 *   other balance kinds have no OFX element and are left out.
 * - `&`, `<`, `>` are escaped; white space runs collapse to one space.
 * - Version 1 declares `ENCODING:UTF-8` and `CHARSET:NONE`: encode the string as UTF-8.
 *
 * Pure and deterministic: DTSERVER is the latest date in the statements, not the clock.
 *
 * @throws EngineError UNKNOWN_CURRENCY for a currency outside ISO 4217; INVALID_DATE for
 *   a malformed date; INVALID_AMOUNT for an amount that is not a safe integer;
 *   INVALID_ARGUMENT for a statement without an account identifier or name.
 * @example writeOfx([statement], { version: 2 }).startsWith('<?xml') // true
 */
export function writeOfx(statements: readonly ParsedStatement[], options: WriteOfxOptions): string {
  const xml = options.version === 2;
  const out = new OfxLines(xml);
  const bank = statements.filter((s) => s.account.kind !== 'card');
  const card = statements.filter((s) => s.account.kind === 'card');

  let latest = '1970-01-01';
  for (const s of statements) {
    for (const d of [s.from, s.to, ...s.entries.map((e) => e.bookingDate), ...s.balances.map((b) => b.date)]) {
      if (d !== undefined && d > latest && isCalendarDate(d)) latest = d;
    }
  }

  out.open('OFX');
  out.open('SIGNONMSGSRSV1');
  out.open('SONRS');
  writeStatus(out);
  out.leaf('DTSERVER', formatOfxDate(latest));
  out.leaf('LANGUAGE', 'ENG');
  out.close('SONRS');
  out.close('SIGNONMSGSRSV1');

  let trnuid = 0;
  if (bank.length > 0) {
    out.open('BANKMSGSRSV1');
    for (const s of bank) writeStatement(out, s, ++trnuid, false, latest);
    out.close('BANKMSGSRSV1');
  }
  if (card.length > 0) {
    out.open('CREDITCARDMSGSRSV1');
    for (const s of card) writeStatement(out, s, ++trnuid, true, latest);
    out.close('CREDITCARDMSGSRSV1');
  }
  out.close('OFX');

  const header = xml
    ? [
        '<?xml version="1.0" encoding="UTF-8" standalone="no"?>',
        '<?OFX OFXHEADER="200" VERSION="220" SECURITY="NONE" OLDFILEUID="NONE" NEWFILEUID="NONE"?>',
      ]
    : [
        'OFXHEADER:100',
        'DATA:OFXSGML',
        'VERSION:102',
        'SECURITY:NONE',
        'ENCODING:UTF-8',
        'CHARSET:NONE',
        'COMPRESSION:NONE',
        'OLDFILEUID:NONE',
        'NEWFILEUID:NONE',
        '',
      ];
  return [...header, ...out.lines].join('\r\n') + '\r\n';
}

function writeStatus(out: OfxLines): void {
  out.open('STATUS');
  out.leaf('CODE', '0');
  out.leaf('SEVERITY', 'INFO');
  out.close('STATUS');
}

function writeStatement(
  out: OfxLines,
  s: ParsedStatement,
  trnuid: number,
  isCard: boolean,
  fallbackDate: string,
): void {
  const exponent = exponentOf(s.currency);
  const accountId = s.account.identifier ?? s.account.name;
  if (accountId === undefined || accountId.trim() === '') {
    throw new EngineError('INVALID_ARGUMENT', 'statement account has neither an identifier nor a name (OFX ACCTID)');
  }
  const booked = s.entries.filter((e) => e.status === 'booked');
  booked.forEach((e, i) => {
    assertDate(e.bookingDate, `entry ${i + 1} booking date`);
    if (e.valueDate !== undefined) assertDate(e.valueDate, `entry ${i + 1} value date`);
    assertAmount(e.amount, `entry ${i + 1}`);
  });
  for (const b of s.balances) {
    assertDate(b.date, `${b.kind} balance`);
    assertAmount(b.amount, `${b.kind} balance`);
  }
  const latestOf = (kind: 'closing' | 'available') =>
    s.balances
      .filter((b) => b.kind === kind)
      .reduce<(typeof s.balances)[number] | undefined>(
        (best, b) => (best === undefined || b.date >= best.date ? b : best),
        undefined,
      );
  const closing = latestOf('closing');
  const available = latestOf('available');

  const dates = booked.map((e) => e.bookingDate).sort();
  const start = s.from ?? dates[0] ?? closing?.date ?? s.to ?? fallbackDate;
  const end = s.to ?? dates[dates.length - 1] ?? closing?.date ?? start;
  assertDate(start, 'statement start');
  assertDate(end, 'statement end');

  const trnrs = isCard ? 'CCSTMTTRNRS' : 'STMTTRNRS';
  const rs = isCard ? 'CCSTMTRS' : 'STMTRS';
  out.open(trnrs);
  out.leaf('TRNUID', String(trnuid));
  writeStatus(out);
  out.open(rs);
  out.leaf('CURDEF', s.currency);
  if (isCard) {
    out.open('CCACCTFROM');
    out.leaf('ACCTID', accountId);
    out.close('CCACCTFROM');
  } else {
    out.open('BANKACCTFROM');
    out.leaf('BANKID', s.account.servicer);
    out.leaf('ACCTID', accountId);
    out.leaf('ACCTTYPE', s.account.kind === 'savings' ? 'SAVINGS' : 'CHECKING');
    out.close('BANKACCTFROM');
  }

  out.open('BANKTRANLIST');
  out.leaf('DTSTART', formatOfxDate(start));
  out.leaf('DTEND', formatOfxDate(end));
  const occurrences = new Map<string, number>();
  const explicit = new Set(booked.map((e) => e.bankRef).filter((r): r is string => r !== undefined && r.trim() !== ''));
  for (const e of booked) {
    let fitid = e.bankRef !== undefined && e.bankRef.trim() !== '' ? e.bankRef : undefined;
    if (fitid === undefined) {
      const base = stableFitId(e, 0);
      let n = (occurrences.get(base) ?? 0) + 1;
      while (explicit.has(stableFitId(e, n))) n++;
      occurrences.set(base, n);
      fitid = stableFitId(e, n);
    }
    writeEntry(out, e, fitid, exponent);
  }
  out.close('BANKTRANLIST');

  if (closing) writeBalance(out, 'LEDGERBAL', closing.amount, closing.date, exponent);
  if (available) writeBalance(out, 'AVAILBAL', available.amount, available.date, exponent);
  out.close(rs);
  out.close(trnrs);
}

function writeEntry(out: OfxLines, e: StatementEntry, fitid: string, exponent: number): void {
  const type =
    e.typeCode !== undefined && OFX_TRANSACTION_TYPES.includes(e.typeCode)
      ? e.typeCode
      : e.amount < 0
        ? 'DEBIT'
        : 'CREDIT';
  const { name, memo } = splitDescription(
    e.description.replace(/\s+/g, ' ').trim(),
    e.counterparty?.replace(/\s+/g, ' ').trim(),
  );
  const reference = e.reference?.trim();
  const asCheck = type === 'CHECK' && reference !== undefined && Array.from(reference).length <= CHECKNUM_LENGTH;
  out.open('STMTTRN');
  out.leaf('TRNTYPE', type);
  out.leaf('DTPOSTED', formatOfxDate(e.bookingDate));
  if (e.valueDate !== undefined) out.leaf('DTAVAIL', formatOfxDate(e.valueDate));
  out.leaf('TRNAMT', formatMinor(e.amount, exponent));
  out.leaf('FITID', fitid);
  if (asCheck) out.leaf('CHECKNUM', reference);
  else out.leaf('REFNUM', reference);
  out.leaf('NAME', name);
  out.leaf('MEMO', memo);
  out.close('STMTTRN');
}

function writeBalance(out: OfxLines, name: string, amount: number, date: string, exponent: number): void {
  out.open(name);
  out.leaf('BALAMT', formatMinor(amount, exponent));
  out.leaf('DTASOF', formatOfxDate(date));
  out.close(name);
}
