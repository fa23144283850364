/**
 * Shared pieces of the camt.053 importer and writer: message versions and namespaces,
 * ISO 20022 value types (ISODate, ISODateTime, amounts) and the problem collector.
 */
import { isCalendarDate, isValidYmd } from '../../core/dates';
import { isKnownCurrency, minorUnitExponent } from '../../core/currency';
import { parsePlainDecimal } from '../../core/money';
import type { ImportProblem } from '../types';
import type { XmlElement } from '../xml';

/**
 * Namespace of camt.053 version `001.NN` is this prefix + `NN`.
 * @example CAMT053_NAMESPACE_PREFIX + '08' // 'urn:iso:std:iso:20022:tech:xsd:camt.053.001.08'
 */
export const CAMT053_NAMESPACE_PREFIX = 'urn:iso:std:iso:20022:tech:xsd:camt.053.001.';

/**
 * Versions of camt.053 (BankToCustomerStatementV02 … V13) that Ebbline reads and writes.
 * @example CAMT053_VERSIONS.includes('001.08') // true
 */
export const CAMT053_VERSIONS: readonly string[] = [
  '001.02',
  '001.03',
  '001.04',
  '001.05',
  '001.06',
  '001.07',
  '001.08',
  '001.09',
  '001.10',
  '001.11',
  '001.12',
  '001.13',
];

/**
 * The version `001.NN` named by a camt.053 namespace, or undefined.
 * @example camt053VersionOf('urn:iso:std:iso:20022:tech:xsd:camt.053.001.08') // '001.08'
 */
export function camt053VersionOf(namespace: string): string | undefined {
  if (!namespace.startsWith(CAMT053_NAMESPACE_PREFIX)) return undefined;
  const version = '001.' + namespace.slice(CAMT053_NAMESPACE_PREFIX.length);
  return CAMT053_VERSIONS.includes(version) ? version : undefined;
}

/**
 * The message number NN of `001.NN` (2 … 13), or NaN for text of another form.
 * @example camt053VersionNumber('001.08') // 8
 */
export function camt053VersionNumber(version: string): number {
  const m = /^001\.(\d\d)$/.exec(version);
  return m ? Number(m[1]) : NaN;
}

const ISO_DATE_TEXT = /^(\d{4}-\d{2}-\d{2})(?:Z|[+-](?:[01]\d|2[0-3]):[0-5]\d)?$/;
const ISO_DATE_TIME_TEXT =
  /^(\d{4}-\d{2}-\d{2})T(?:([01]\d|2[0-3]):[0-5]\d:(?:[0-5]\d|60)(?:\.\d+)?|24:00:00(?:\.0+)?)(?:Z|[+-](?:[01]\d|1[0-4]):[0-5]\d)?$/;

/**
 * The calendar date of an ISO 20022 ISODate (XML Schema `xs:date`, optionally with a zone).
 * @returns the `YYYY-MM-DD` date, or a message saying what is wrong.
 * @example isoDateOf('2025-04-31') // 'impossible date "2025-04-31"'
 */
export function isoDateOf(text: string): { date: string } | { message: string } {
  const fast = plainDate(text);
  if (fast !== undefined) return fast;
  const m = ISO_DATE_TEXT.exec(text);
  if (!m) return { message: `"${clip(text)}" is not a date, expected YYYY-MM-DD` };
  const date = m[1] as string;
  return isCalendarDate(date) ? { date } : { message: `impossible date "${date}"` };
}

/**
 * The calendar date of an ISO 20022 ISODateTime as written: `2024-03-31T23:30:00-05:00` is
 * 2024-03-31, not converted to UTC (a statement's date is the bank's booking day).
 * @example isoDateTimeDateOf('2024-03-31T23:30:00-05:00') // { date: '2024-03-31' }
 */
export function isoDateTimeDateOf(text: string): { date: string } | { message: string } {
  if (text.length === 19 && text.charCodeAt(10) === 0x54 /* T */ && isPlainTime(text, 11)) {
    const fast = plainDate(text.slice(0, 10));
    if (fast !== undefined) return fast;
  }
  const m = ISO_DATE_TIME_TEXT.exec(text);
  if (!m) return { message: `"${clip(text)}" is not a date-time, expected YYYY-MM-DDThh:mm:ss` };
  const date = m[1] as string;
  return isCalendarDate(date) ? { date } : { message: `impossible date "${date}"` };
}

/** Digit value of the character at `i`, or -1. */
function digitAt(s: string, i: number): number {
  const c = s.charCodeAt(i) - 48;
  return c >= 0 && c <= 9 ? c : -1;
}

/**
 * Fast path for the common `YYYY-MM-DD`: the result without regular expressions, or
 * undefined to let the general path decide (and word the message).
 */
function plainDate(text: string): { date: string } | undefined {
  if (text.length !== 10 || text.charCodeAt(4) !== 0x2d || text.charCodeAt(7) !== 0x2d) return undefined;
  const y0 = digitAt(text, 0);
  const y1 = digitAt(text, 1);
  const y2 = digitAt(text, 2);
  const y3 = digitAt(text, 3);
  const m0 = digitAt(text, 5);
  const m1 = digitAt(text, 6);
  const d0 = digitAt(text, 8);
  const d1 = digitAt(text, 9);
  if ((y0 | y1 | y2 | y3 | m0 | m1 | d0 | d1) < 0) return undefined;
  const ok = isValidYmd(y0 * 1000 + y1 * 100 + y2 * 10 + y3, m0 * 10 + m1, d0 * 10 + d1);
  return ok ? { date: text } : undefined;
}

/** True for `hh:mm:ss` (00–23, 00–59, 00–59) at `at`. */
function isPlainTime(text: string, at: number): boolean {
  if (text.charCodeAt(at + 2) !== 0x3a || text.charCodeAt(at + 5) !== 0x3a) return false;
  const h0 = digitAt(text, at);
  const h1 = digitAt(text, at + 1);
  const i0 = digitAt(text, at + 3);
  const i1 = digitAt(text, at + 4);
  const s0 = digitAt(text, at + 6);
  const s1 = digitAt(text, at + 7);
  if ((h0 | h1 | i0 | i1 | s0 | s1) < 0) return false;
  return h0 * 10 + h1 <= 23 && i0 <= 5 && s0 <= 5;
}

/**
 * Shortens text quoted in a message to 40 characters.
 * @example clip('short') // 'short'
 */
export function clip(text: string): string {
  return text.length > 40 ? text.slice(0, 37) + '…' : text;
}

const XS_DECIMAL = /^\+?(?:\d+(?:\.\d*)?|\.\d+)$/;

/**
 * Minor units of an unsigned camt amount (`xs:decimal`, at most 18 digits, minInclusive 0).
 * Trailing zero decimals beyond the currency's exponent are accepted (`10.500` EUR);
 * significant extra decimals are not.
 * @returns the minor units, or a message saying what is wrong.
 * @example unsignedAmountOf('12.5', 2) // 1250
 * @example unsignedAmountOf('-1.00', 2) // { message: 'negative amount "-1.00", …' }
 */
export function unsignedAmountOf(text: string, exponent: number): number | { message: string } {
  const fast = plainAmount(text, exponent);
  if (fast >= 0) return fast;
  if (text.startsWith('-')) {
    return { message: `negative amount "${clip(text)}", camt amounts are unsigned (CdtDbtInd gives the direction)` };
  }
  if (!XS_DECIMAL.test(text)) return { message: `"${clip(text)}" is not a decimal amount, expected e.g. 1234.56` };
  const digits = text.replace(/^\+/, '').replace(/^\./, '0.');
  if (digits.replace('.', '').replace(/^0+/, '').length > 18) {
    return { message: `amount "${clip(text)}" has more than 18 digits` };
  }
  const minor = parsePlainDecimal(digits, exponent);
  if (typeof minor === 'string') return { message: `amount "${clip(text)}" ${minor}` };
  return minor;
}

/**
 * Fast path for `123` / `123.45` with at most the currency's decimals and at most 15
 * digits: the minor units by arithmetic, or -1 to let the general path decide.
 */
function plainAmount(text: string, exponent: number): number {
  const n = text.length;
  if (n === 0 || n > 15) return -1;
  let value = 0;
  let decimals = -1;
  for (let i = 0; i < n; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x2e /* . */) {
      if (decimals !== -1 || i === 0 || i === n - 1) return -1;
      decimals = 0;
      continue;
    }
    const dgt = c - 48;
    if (dgt < 0 || dgt > 9) return -1;
    value = value * 10 + dgt;
    if (decimals !== -1) decimals++;
  }
  const used = decimals === -1 ? 0 : decimals;
  if (used > exponent) return -1;
  const minor = value * 10 ** (exponent - used);
  return Number.isSafeInteger(minor) ? minor : -1;
}

/**
 * Minor-unit exponent of a currency the file names, or a message.
 * @example currencyExponent('KWD') // 3
 * @example currencyExponent('EUX') // { message: 'unknown currency "EUX", …' }
 */
export function currencyExponent(code: string): number | { message: string } {
  if (!isKnownCurrency(code))
    return { message: `unknown currency "${clip(code)}", expected an ISO 4217 code such as EUR` };
  return minorUnitExponent(code) as number;
}

/**
 * First child element with this local name in namespace `ns`.
 * @example child(ntry, 'Amt', ctx.ns)
 */
export function child(parent: XmlElement, localName: string, ns: string): XmlElement | undefined {
  const children = parent.children;
  for (let i = 0; i < children.length; i++) {
    const c = children[i];
    if (c !== undefined && c.kind === 'element' && c.localName === localName && c.namespace === ns) return c;
  }
  return undefined;
}

/**
 * All child elements with this local name in namespace `ns`.
 * @example children(ntry, 'NtryDtls', ctx.ns).length
 */
export function children(parent: XmlElement, localName: string, ns: string): XmlElement[] {
  const out: XmlElement[] = [];
  for (const c of parent.children) {
    if (c.kind === 'element' && c.localName === localName && c.namespace === ns) out.push(c);
  }
  return out;
}

/**
 * Element at a path of local names below `parent`.
 * @example descend(acct, ns, 'Id', 'IBAN')
 */
export function descend(parent: XmlElement, ns: string, ...names: string[]): XmlElement | undefined {
  let at: XmlElement | undefined = parent;
  for (const n of names) {
    if (!at) return undefined;
    at = child(at, n, ns);
  }
  return at;
}

/**
 * Own text of an element (text children joined), untrimmed.
 * @example rawText(ustrd) // ' text as written '
 */
export function rawText(el: XmlElement): string {
  const c = el.children;
  if (c.length === 1) {
    const only = c[0];
    return only !== undefined && only.kind === 'text' ? only.text : '';
  }
  let out = '';
  for (const n of c) if (n.kind === 'text') out += n.text;
  return out;
}

/**
 * Own text of an element, trimmed; '' for undefined.
 * @example textOf(child(ntry, 'AcctSvcrRef', ns)) // 'EXMP25062A0001'
 */
export function textOf(el: XmlElement | undefined): string {
  return el ? rawText(el).trim() : '';
}

/**
 * Value of an unprefixed attribute.
 * @example attr(amt, 'Ccy') // 'EUR'
 */
export function attr(el: XmlElement, name: string): string | undefined {
  for (const a of el.attributes) if (a.name === name) return a.value;
  return undefined;
}

/** Shorter slices are copies already: V8 makes a sliced string only from 13 characters on. */
const SHORTEST_SLICE = 13;
/** Most char codes passed to one `String.fromCharCode` call. */
const COPY_CHUNK = 8192;
const copyCodes: number[] = [];

/**
 * A copy of `text` that owns its characters. Text the pull parser returns is cut from the
 * document, and in V8 a cut of 13 characters or more is a sliced string that keeps the whole
 * document alive: one kept description would hold a 64 MiB statement file in memory for as
 * long as the import result lives. Strings the result keeps go through here. A concatenation
 * is copied too (its parts may be such slices). O(length).
 *
 * @example ownText(documentText.slice(1000, 1030)) // the same 30 characters, without the document
 */
export function ownText(text: string): string {
  const n = text.length;
  if (n < SHORTEST_SLICE) return text;
  if (n > COPY_CHUNK) return (' ' + text).slice(1); // the slice then points into the one-off concatenation
  for (let i = 0; i < n; i++) copyCodes[i] = text.charCodeAt(i);
  copyCodes.length = n;
  return String.fromCharCode.apply(null, copyCodes);
}

/** Distinct strings a pool keeps at most; past that, text is only copied. */
const POOL_LIMIT = 4096;

/**
 * Interns the short strings a statement repeats (dates, counterparties, type codes): each
 * distinct value is kept once, as an `ownText` copy, and every entry shares it.
 * @example const pool = new TextPool(); pool.intern('2025-03-01') === pool.intern('2025-03-01'.slice(0)) // true
 */
export class TextPool {
  private readonly strings = new Map<string, string>();
  /** The last four distinct results, checked before the map (an entry's date, party and code repeat). */
  private readonly recent: string[] = ['', '', '', ''];
  private next = 0;

  /** The pooled copy of `text` (a recent text costs a few comparisons, no hashing). */
  intern(text: string): string {
    const recent = this.recent;
    for (let k = 0; k < 4; k++) if (recent[k] === text) return recent[k] as string;
    let kept = this.strings.get(text);
    if (kept === undefined) {
      kept = ownText(text);
      if (this.strings.size < POOL_LIMIT) this.strings.set(kept, kept);
    }
    recent[this.next] = kept;
    this.next = (this.next + 1) & 3;
    return kept;
  }
}

/** Most problems of each severity listed one by one; the rest are summed up in one line. */
const MAX_LISTED = 200;

/**
 * Collects import problems for one file, capping the list so that a broken 100,000-entry
 * file gives a readable report (the count of the rest is kept).
 * @example
 * const problems = new ProblemCollector('march.xml');
 * problems.error('Document/BkToCstmrStmt/Stmt[1]/Id', 12, 'missing, expected the statement id');
 * problems.list(); // [{ file: 'march.xml', line: 12, element: '…/Id', message: '…', severity: 'error' }]
 */
export class ProblemCollector {
  private readonly listed: ImportProblem[] = [];
  private errors = 0;
  private notices = 0;
  private omittedErrors = 0;
  private omittedNotices = 0;

  constructor(readonly file: string) {}

  /** Records a refusing problem. */
  error(element: string | undefined, line: number | undefined, message: string): void {
    this.errors++;
    if (this.errors > MAX_LISTED) this.omittedErrors++;
    else this.listed.push(this.problem(element, line, message, 'error'));
  }

  /** Records an informational problem. */
  notice(element: string | undefined, line: number | undefined, message: string): void {
    this.notices++;
    if (this.notices > MAX_LISTED) this.omittedNotices++;
    else this.listed.push(this.problem(element, line, message, 'notice'));
  }

  get errorCount(): number {
    return this.errors;
  }

  /** The problems in the order found, plus one summary line for those left out. */
  list(): ImportProblem[] {
    const out = this.listed.slice();
    if (this.omittedErrors > 0 || this.omittedNotices > 0) {
      out.push({
        file: this.file,
        element: 'Document',
        message:
          `${this.omittedErrors} more errors and ${this.omittedNotices} more notices not listed ` +
          `(${this.errors} errors and ${this.notices} notices in all)`,
        severity: this.omittedErrors > 0 ? 'error' : 'notice',
      });
    }
    return out;
  }

  private problem(
    element: string | undefined,
    line: number | undefined,
    message: string,
    severity: 'error' | 'notice',
  ): ImportProblem {
    // Messages quote the document: copied, so that a problem does not keep the text alive.
    const p: { file: string; line?: number; element?: string; message: string; severity: 'error' | 'notice' } = {
      file: this.file,
      message: ownText(message),
      severity,
    };
    if (line !== undefined) p.line = line;
    if (element !== undefined && element !== '') p.element = ownText(element);
    return p;
  }
}
