/**
 * Writes a statement as CSV in a chosen bank-like layout: delimiter, number and date
 * format, sign style, optional running balance, newest or oldest first, preamble lines.
 * Fields are quoted per RFC 4180 (2005) section 2: a field holding the delimiter, a double
 * quote or a line break is enclosed in double quotes (rule 6) and each quote inside it is
 * written twice (rule 7). The CSV importer reads every layout this writes.
 */
import { EngineError } from '../core/errors';
import { exponentOf, formatMinor } from '../core/money';
import { parseIsoDate, type CalendarDate } from '../core/dates';
import type { ParsedStatement, StatementEntry } from '../import/types';
import type { CsvDelimiter, CsvSignStyle, DecimalSeparator, ThousandsSeparator } from '../import/csv';

/** Columns the writer can produce. */
export type CsvWriterColumn =
  | 'date'
  | 'valueDate'
  | 'description'
  | 'counterparty'
  | 'reference'
  | 'amount'
  | 'debit'
  | 'credit'
  | 'indicator'
  | 'currency'
  | 'balance'
  | 'status';

/** Date formats the writer produces (a subset of what the importer reads). */
export type CsvWriterDateFormat = 'YYYY-MM-DD' | 'DD.MM.YYYY' | 'DD/MM/YYYY' | 'MM/DD/YYYY' | 'DD.MM.YY';

/** How `writeCsv` lays out a statement. */
export interface CsvLayout {
  readonly delimiter: CsvDelimiter;
  readonly decimalSeparator: DecimalSeparator;
  /** Digit grouping of the integer part; omitted or '' for none. Must differ from the decimal separator. */
  readonly thousandsSeparator?: ThousandsSeparator;
  /** `DD.MM.YY` writes two-digit years and so only dates 1970–2069 (importer pivot: 00–69 → 20xx). */
  readonly dateFormat: CsvWriterDateFormat;
  /**
   * - `signed`: one Amount column, `-12.50`;
   * - `debitCredit`: Debit and Credit columns, both written positive;
   * - `indicator`: unsigned Amount plus a D/C column (`indicatorWords`);
   * - `parentheses`: `(12.50)`; `trailingMinus`: `12.50-`.
   */
  readonly signStyle: CsvSignStyle;
  /** Adds a Balance column after each booked row; needs an opening balance (see `writeCsv`). */
  readonly runningBalance: boolean;
  readonly newestFirst: boolean;
  /** Lines written verbatim before the header (account information); none may contain a line break. */
  readonly preambleLines: readonly string[];
  /** Adds a Currency column with the statement's ISO 4217 code on every row. */
  readonly includeCurrencyColumn: boolean;
  readonly lineEnding: '\r\n' | '\n';
  /** Header names to use instead of the English defaults (`DEFAULT_CSV_HEADER_NAMES`). */
  readonly headerNames?: Readonly<Partial<Record<CsvWriterColumn, string>>>;
  /** Debit and credit words of the `indicator` style; default `['D', 'C']`. */
  readonly indicatorWords?: readonly [string, string];
}

/** English header names the importer recognises. */
export const DEFAULT_CSV_HEADER_NAMES: Readonly<Record<CsvWriterColumn, string>> = {
  date: 'Date',
  valueDate: 'Value date',
  description: 'Description',
  counterparty: 'Counterparty',
  reference: 'Reference',
  amount: 'Amount',
  debit: 'Debit',
  credit: 'Credit',
  indicator: 'D/C',
  currency: 'Currency',
  balance: 'Balance',
  status: 'Status',
};

const DELIMITERS: readonly string[] = [',', ';', '\t', '|'];
const THOUSANDS: readonly string[] = ['', '.', ',', ' ', '\u00a0', '\u202f', "'"];

function invalid(message: string): never {
  throw new EngineError('INVALID_ARGUMENT', message);
}

/**
 * Quotes a field when RFC 4180 section 2 rule 6 requires it (delimiter, quote, CR or LF
 * inside), doubling inner quotes (rule 7).
 *
 * @example quoteCsvField('say "hi"; bye', ';') // '"say ""hi""; bye"'
 * @example quoteCsvField('plain', ',') // 'plain'
 */
export function quoteCsvField(value: string, delimiter: string): string {
  let needs = false;
  for (let i = 0; i < value.length && !needs; i++) {
    const c = value[i];
    needs = c === delimiter || c === '"' || c === '\r' || c === '\n';
  }
  return needs ? `"${value.replace(/"/g, '""')}"` : value;
}

/**
 * Formats an unsigned amount of minor units with the layout's separators.
 *
 * @example formatCsvNumber(123456789, 2, ',', '.') // '1.234.567,89'
 */
export function formatCsvNumber(minor: number, exponent: number, decimal: string, thousands: string): string {
  const plain = formatMinor(Math.abs(minor), exponent);
  const point = plain.indexOf('.');
  let whole = point < 0 ? plain : plain.slice(0, point);
  const fraction = point < 0 ? '' : plain.slice(point + 1);
  if (thousands !== '' && whole.length > 3) {
    const groups: string[] = [];
    for (let end = whole.length; end > 0; end -= 3) groups.unshift(whole.slice(Math.max(0, end - 3), end));
    whole = groups.join(thousands);
  }
  return fraction === '' ? whole : `${whole}${decimal}${fraction}`;
}

/**
 * Formats a calendar date in a writer date format.
 *
 * @throws EngineError INVALID_ARGUMENT for a date that is not `YYYY-MM-DD`, or a year
 *   outside 1970–2069 in `DD.MM.YY`.
 * @example formatCsvDate('2024-02-29', 'DD.MM.YY') // '29.02.24'
 */
export function formatCsvDate(date: CalendarDate, format: CsvWriterDateFormat): string {
  const p = parseIsoDate(date);
  if (!p) invalid(`not a calendar date (YYYY-MM-DD): "${date}"`);
  const dd = String(p.day).padStart(2, '0');
  const mm = String(p.month).padStart(2, '0');
  const yyyy = String(p.year).padStart(4, '0');
  switch (format) {
    case 'YYYY-MM-DD':
      return `${yyyy}-${mm}-${dd}`;
    case 'DD.MM.YYYY':
      return `${dd}.${mm}.${yyyy}`;
    case 'DD/MM/YYYY':
      return `${dd}/${mm}/${yyyy}`;
    case 'MM/DD/YYYY':
      return `${mm}/${dd}/${yyyy}`;
    case 'DD.MM.YY':
      if (p.year < 1970 || p.year > 2069) invalid(`date ${date} cannot be written as DD.MM.YY (years 1970–2069 only)`);
      return `${dd}.${mm}.${yyyy.slice(2)}`;
    default:
      return invalid(`unknown date format "${String(format)}"`);
  }
}

/** The balance before the statement's first entry. */
function openingBalance(statement: ParsedStatement, sorted: readonly StatementEntry[]): number {
  const opening = statement.balances.find((b) => b.kind === 'opening');
  if (opening) return opening.amount;
  const anchors = statement.balances
    .filter((b) => (b.kind === 'running' || b.kind === 'closing') && b.at === 'end')
    .sort((a, b) => a.date.localeCompare(b.date));
  const anchor = anchors[0];
  if (anchor) {
    let booked = 0;
    for (const e of sorted) if (e.status === 'booked' && e.bookingDate <= anchor.date) booked += e.amount;
    return anchor.amount - booked;
  }
  return invalid('runningBalance needs an opening balance, or a running or closing balance, in statement.balances');
}

/**
 * Writes `statement` as CSV text in `layout`: preamble lines, a header, one row per entry
 * (sorted by booking date, stably; reversed when `newestFirst`), each line ended by
 * `layout.lineEnding`. Columns: Date, Value date (when any entry has one), Description,
 * Counterparty and Reference (when any entry has one), the amount columns of the sign
 * style, Currency (when asked), Balance (when asked; empty on pending rows, which are not
 * part of the booked balance), Status (when any entry is pending).
 *
 * @throws EngineError INVALID_ARGUMENT for an invalid layout (unknown delimiter, equal
 *   decimal and thousands separators, duplicate header names, a preamble line with a line
 *   break), a date `DD.MM.YY` cannot hold, or a running balance without an opening balance.
 * @throws EngineError UNKNOWN_CURRENCY for a currency that is not ISO 4217.
 * @example
 * writeCsv(statement, { delimiter: ';', decimalSeparator: ',', thousandsSeparator: '.', dateFormat: 'DD.MM.YYYY',
 *   signStyle: 'signed', runningBalance: false, newestFirst: false, preambleLines: [],
 *   includeCurrencyColumn: true, lineEnding: '\r\n' })
 * // 'Date;Description;Amount;Currency\r\n31.01.2025;Rent;-1.250,00;EUR\r\n'
 */
export function writeCsv(statement: ParsedStatement, layout: CsvLayout): string {
  const d = layout.delimiter;
  if (!DELIMITERS.includes(d)) invalid(`delimiter ${JSON.stringify(d)} is not one of , ; tab |`);
  if (layout.decimalSeparator !== ',' && layout.decimalSeparator !== '.') {
    invalid(`decimalSeparator ${JSON.stringify(layout.decimalSeparator)} is not "," or "."`);
  }
  const thousands = layout.thousandsSeparator ?? '';
  if (!THOUSANDS.includes(thousands)) invalid(`thousandsSeparator ${JSON.stringify(thousands)} is not supported`);
  if (thousands === layout.decimalSeparator) invalid('thousandsSeparator equals decimalSeparator');
  if (layout.lineEnding !== '\r\n' && layout.lineEnding !== '\n') invalid('lineEnding must be "\\r\\n" or "\\n"');
  for (const line of layout.preambleLines) {
    if (/[\r\n]/.test(line)) invalid(`preamble line ${JSON.stringify(line)} contains a line break`);
  }
  const exponent = exponentOf(statement.currency);
  const names = { ...DEFAULT_CSV_HEADER_NAMES, ...layout.headerNames };
  const [debitWord, creditWord] = layout.indicatorWords ?? ['D', 'C'];

  const sorted = statement.entries
    .map((entry, index) => ({ entry, index }))
    .sort((a, b) => a.entry.bookingDate.localeCompare(b.entry.bookingDate) || a.index - b.index)
    .map((x) => x.entry);
  const hasValueDate = sorted.some((e) => e.valueDate !== undefined);
  const hasCounterparty = sorted.some((e) => e.counterparty !== undefined && e.counterparty !== '');
  const hasReference = sorted.some((e) => e.reference !== undefined && e.reference !== '');
  const hasPending = sorted.some((e) => e.status === 'pending');

  const header: CsvWriterColumn[] = ['date'];
  if (hasValueDate) header.push('valueDate');
  header.push('description');
  if (hasCounterparty) header.push('counterparty');
  if (hasReference) header.push('reference');
  if (layout.signStyle === 'debitCredit') header.push('debit', 'credit');
  else if (layout.signStyle === 'indicator') header.push('amount', 'indicator');
  else header.push('amount');
  if (layout.includeCurrencyColumn) header.push('currency');
  if (layout.runningBalance) header.push('balance');
  if (hasPending) header.push('status');
  const headerCells = header.map((c) => names[c]);
  if (new Set(headerCells.map((n) => n.trim().toLowerCase())).size !== headerCells.length) {
    invalid(`header names are not unique: ${headerCells.join(', ')}`);
  }

  const number = (minor: number): string => formatCsvNumber(minor, exponent, layout.decimalSeparator, thousands);
  const signed = (minor: number): string => {
    if (minor >= 0) return number(minor);
    if (layout.signStyle === 'parentheses') return `(${number(minor)})`;
    if (layout.signStyle === 'trailingMinus') return `${number(minor)}-`;
    return `-${number(minor)}`;
  };

  let balance = layout.runningBalance ? openingBalance(statement, sorted) : 0;
  const rows: string[][] = [];
  for (const e of sorted) {
    const row: string[] = [formatCsvDate(e.bookingDate, layout.dateFormat)];
    if (hasValueDate) row.push(e.valueDate !== undefined ? formatCsvDate(e.valueDate, layout.dateFormat) : '');
    row.push(e.description);
    if (hasCounterparty) row.push(e.counterparty ?? '');
    if (hasReference) row.push(e.reference ?? '');
    if (layout.signStyle === 'debitCredit')
      row.push(e.amount < 0 ? number(e.amount) : '', e.amount < 0 ? '' : number(e.amount));
    else if (layout.signStyle === 'indicator') row.push(number(e.amount), e.amount < 0 ? debitWord : creditWord);
    else row.push(signed(e.amount));
    if (layout.includeCurrencyColumn) row.push(statement.currency);
    if (layout.runningBalance) {
      if (e.status === 'booked') {
        balance += e.amount;
        row.push(signed(balance));
      } else row.push('');
    }
    if (hasPending) row.push(e.status === 'pending' ? 'pending' : 'booked');
    rows.push(row);
  }
  if (layout.newestFirst) rows.reverse();
  const eol = layout.lineEnding;
  let out = '';
  for (const line of layout.preambleLines) out += line + eol;
  out += headerCells.map((c) => quoteCsvField(c, d)).join(d) + eol;
  for (const row of rows) out += row.map((c) => quoteCsvField(c, d)).join(d) + eol;
  return out;
}
