/**
 * Shared pieces of the camt.053 importer and writer: message versions and namespaces,
 * ISO 20022 value types (ISODate, ISODateTime, amounts) and the problem collector.
 */
import { isCalendarDate } from '../../core/dates';
import { isKnownCurrency, minorUnitExponent } from '../../core/currency';
import { parsePlainDecimal } from '../../core/money';
import type { ImportProblem } from '../types';
import type { XmlElement } from '../xml';

/** Namespace of camt.053 version `001.NN` is this prefix + `NN`. */
export const CAMT053_NAMESPACE_PREFIX = 'urn:iso:std:iso:20022:tech:xsd:camt.053.001.';

/** Versions of camt.053 (BankToCustomerStatementV02 … V13) that Ebbline reads and writes. */
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
  const m = ISO_DATE_TIME_TEXT.exec(text);
  if (!m) return { message: `"${clip(text)}" is not a date-time, expected YYYY-MM-DDThh:mm:ss` };
  const date = m[1] as string;
  return isCalendarDate(date) ? { date } : { message: `impossible date "${date}"` };
}

/** Shortens text quoted in a message. */
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

/** Minor-unit exponent of a currency the file names, or a message. */
export function currencyExponent(code: string): number | { message: string } {
  if (!isKnownCurrency(code))
    return { message: `unknown currency "${clip(code)}", expected an ISO 4217 code such as EUR` };
  return minorUnitExponent(code) as number;
}

/** First child element with this local name in namespace `ns`. */
export function child(parent: XmlElement, localName: string, ns: string): XmlElement | undefined {
  const children = parent.children;
  for (let i = 0; i < children.length; i++) {
    const c = children[i];
    if (c !== undefined && c.kind === 'element' && c.localName === localName && c.namespace === ns) return c;
  }
  return undefined;
}

/** All child elements with this local name in namespace `ns`. */
export function children(parent: XmlElement, localName: string, ns: string): XmlElement[] {
  const out: XmlElement[] = [];
  for (const c of parent.children) {
    if (c.kind === 'element' && c.localName === localName && c.namespace === ns) out.push(c);
  }
  return out;
}

/** Element at a path of local names below `parent`, e.g. `descend(acct, ns, 'Id', 'IBAN')`. */
export function descend(parent: XmlElement, ns: string, ...names: string[]): XmlElement | undefined {
  let at: XmlElement | undefined = parent;
  for (const n of names) {
    if (!at) return undefined;
    at = child(at, n, ns);
  }
  return at;
}

/** Own text of an element (text children joined), untrimmed. */
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

/** Own text of an element, trimmed. */
export function textOf(el: XmlElement | undefined): string {
  return el ? rawText(el).trim() : '';
}

/** Value of an unprefixed attribute. */
export function attr(el: XmlElement, name: string): string | undefined {
  for (const a of el.attributes) if (a.name === name) return a.value;
  return undefined;
}

/** Most problems of each severity listed one by one; the rest are summed up in one line. */
const MAX_LISTED = 200;

/**
 * Collects import problems for one file, capping the list so that a broken 100,000-entry
 * file gives a readable report (the count of the rest is kept).
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
    const p: { file: string; line?: number; element?: string; message: string; severity: 'error' | 'notice' } = {
      file: this.file,
      message,
      severity,
    };
    if (line !== undefined) p.line = line;
    if (element !== undefined && element !== '') p.element = element;
    return p;
  }
}
