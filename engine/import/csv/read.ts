/**
 * The CSV import pipeline: delimiter → header and preamble → columns → currency → number
 * and date formats (decided from all rows) → rows → order and running balance → account.
 * One function produces both the import result and the layout detection, so the preview
 * and the import can never disagree.
 */
import { isKnownCurrency, minorUnitExponent } from '../../core/currency';
import type { CalendarDate } from '../../core/dates';
import type {
  ImportOptions,
  ImportResult,
  ParsedStatement,
  StatementAccount,
  StatementBalance,
  StatementEntry,
} from '../types';
import { checkRunningBalance, type BalanceMismatch } from './balance';
import { createCurrencyCollector, type CurrencyCollector } from './currency';
import { rankDelimiters, type CsvDelimiter } from './delimiter';
import {
  dateFormatName,
  describeDateError,
  createDateFormatInference,
  parseDateCell,
  parseDateFormatName,
  type CsvDateFormat,
  type DateFormatInference,
} from './dates';
import type { CsvDetectedColumn, CsvLayoutDetection, CsvSampleRow } from './detection';
import { csvLayoutFingerprint } from './fingerprint';
import { guessColumns } from './guess';
import {
  HEADER_SEARCH_ROWS,
  findHeaderRow,
  hasDateAndAmount,
  matchHeaderCells,
  normaliseHeaderName,
  type CsvColumnRole,
} from './header';
import { isValidIban, normaliseAccountIdentifier } from './iban';
import { bookingStatus, indicatorSign } from './indicator';
import {
  validateCsvMapping,
  type CsvColumnMapping,
  type CsvColumnRef,
  type CsvMapping,
  type CsvSignStyle,
} from './mapping';
import {
  formatForMessage,
  inspectAmount,
  inspectAndReadAmount,
  lastInspection,
  readAmount,
  type AmountInspection,
  type CsvNumberFormat,
  type DecimalSeparator,
  type ThousandsSeparator,
} from './numbers';
import { detectRowOrder, type CsvRowOrder } from './order';
import { readPreamble, type PreambleInfo } from './preamble';
import { createProblemCollector, type ProblemCollector } from './problems';
import { cellAt, cellSpan, isBlankRow, rowCells, rowWidth, scanCsv, type CellSpan, type CsvTable } from './scan';

/** What one read of a CSV text produces. */
export interface CsvReadOutcome {
  readonly result: ImportResult;
  readonly detection: CsvLayoutDetection;
}

/** Column indexes by role, after the header and mapping are resolved. */
interface Columns {
  date: number;
  valueDate?: number;
  amount?: number;
  debit?: number;
  credit?: number;
  indicator?: number;
  description: number[];
  counterparty?: number;
  balance?: number;
  currency?: number;
  reference?: number;
  status?: number;
  account?: number;
  type?: number;
  bankRef?: number;
}

const SINGLE_ROLES = [
  'date',
  'valueDate',
  'amount',
  'debit',
  'credit',
  'indicator',
  'counterparty',
  'balance',
  'currency',
  'reference',
  'status',
  'account',
  'type',
  'bankRef',
] as const;

/** Data rows shown in the preview. */
export const SAMPLE_ROWS = 10;

/** Mutable state shared by the pipeline steps of one read. */
interface Reading {
  readonly file: string;
  readonly options: ImportOptions;
  readonly problems: ProblemCollector;
  readonly currencies: CurrencyCollector;
  readonly mapping: CsvMapping | undefined;
  delimiter: CsvDelimiter;
  table: CsvTable;
  headerRow: number | undefined;
  headerCells: string[];
  dataStart: number;
  columns: Columns | undefined;
  proposed: CsvMapping | undefined;
  confidence: number;
  rows: number[];
  preamble: PreambleInfo;
  currency: string | undefined;
  decimal: DecimalSeparator | undefined;
  thousandsSeen: ThousandsSeparator | undefined;
  signStyle: CsvSignStyle | undefined;
  dateFormat: CsvDateFormat | undefined;
  dateAmbiguous: boolean;
  order: CsvRowOrder | undefined;
  account: string | undefined;
  statement: ParsedStatement | undefined;
}

function lineOf(reading: Reading, row: number): number {
  return reading.table.rowLine[row] ?? 1;
}

/** The line problems about the file as a whole are reported on: the header, else the first line. */
function fileLine(reading: Reading): number {
  return reading.headerRow !== undefined ? lineOf(reading, reading.headerRow) : lineOf(reading, reading.dataStart);
}

function refMatches(cell: string, ref: string): boolean {
  return cell.trim() === ref.trim();
}

function refMatchesLoosely(cell: string, ref: string): boolean {
  const key = normaliseHeaderName(ref).key;
  return key !== '' && normaliseHeaderName(cell).key === key;
}

function namedRefs(columns: CsvColumnMapping | undefined): string[] {
  if (!columns) return [];
  const names: string[] = [];
  for (const value of Object.values(columns) as (CsvColumnRef | readonly CsvColumnRef[] | undefined)[]) {
    const refs = Array.isArray(value) ? value : [value];
    for (const ref of refs) if (typeof ref === 'string') names.push(ref);
  }
  return names;
}

/** First record (of the first 60) holding every named column. */
function findRowWithNames(table: CsvTable, names: readonly string[]): number | undefined {
  const last = Math.min(table.rowCount, HEADER_SEARCH_ROWS);
  for (let r = 0; r < last; r++) {
    const cells = rowCells(table, r);
    if (names.every((n) => cells.some((c) => refMatches(c, n)) || cells.some((c) => refMatchesLoosely(c, n)))) return r;
  }
  return undefined;
}

function locateHeader(table: CsvTable, mapping: CsvMapping | undefined): number | undefined {
  if (mapping?.headerLine === null) return undefined;
  if (typeof mapping?.headerLine === 'number') {
    const at = table.rowLine.indexOf(mapping.headerLine);
    return at >= 0 && at < table.rowCount ? at : undefined;
  }
  const names = namedRefs(mapping?.columns);
  if (names.length > 0) return findRowWithNames(table, names);
  return findHeaderRow(table);
}

/** Step 1: delimiter, records, header row. */
function scanStep(reading: Reading, text: string): void {
  const mapping = reading.mapping;
  const ranked = rankDelimiters(text);
  const candidates: CsvDelimiter[] = mapping?.delimiter
    ? [mapping.delimiter]
    : ranked.filter((s) => s.matching > 0).map((s) => s.delimiter);
  if (candidates.length === 0) candidates.push(ranked[0]?.delimiter ?? ',');
  let chosen = candidates[0] as CsvDelimiter;
  if (mapping?.headerLine === undefined && candidates.length > 1) {
    for (const d of candidates) {
      if (locateHeader(scanCsv(text, d, HEADER_SEARCH_ROWS), mapping) !== undefined) {
        chosen = d;
        break;
      }
    }
  }
  reading.delimiter = chosen;
  reading.table = scanCsv(text, chosen);
  reading.headerRow = locateHeader(reading.table, mapping);
  if (reading.table.unclosedQuoteLine !== undefined) {
    reading.problems.error(
      reading.table.unclosedQuoteLine,
      'quoted field opened on this line is never closed, expected a closing quote (") before the end of the file',
    );
  }
}

function firstRecordFromLine(table: CsvTable, line: number, after: number): number {
  for (let r = Math.max(0, after); r < table.rowCount; r++) if ((table.rowLine[r] as number) >= line) return r;
  return table.rowCount;
}

/** Most frequent width (≥ 2) among the first 200 non-blank records, and its first record. */
function tableStart(table: CsvTable): number {
  const tally = new Map<number, { count: number; first: number }>();
  for (let r = 0, seen = 0; r < table.rowCount && seen < 200; r++) {
    if (isBlankRow(table, r)) continue;
    seen++;
    const w = rowWidth(table, r);
    const t = tally.get(w);
    if (t) t.count++;
    else tally.set(w, { count: 1, first: r });
  }
  let best: { count: number; first: number } | undefined;
  let bestWidth = 0;
  for (const [w, t] of tally) {
    if (w >= 2 && (!best || t.count > best.count || (t.count === best.count && w > bestWidth))) {
      best = t;
      bestWidth = w;
    }
  }
  return best?.first ?? 0;
}

/** Resolves one mapping reference to a column index, or reports it. */
function resolveRef(reading: Reading, role: string, ref: CsvColumnRef, width: number): number | undefined {
  const element = `csvMapping.columns.${role}`;
  const line = fileLine(reading);
  if (typeof ref === 'number') {
    if (ref < width) return ref;
    reading.problems.error(
      line,
      `${element} is column ${ref}, expected an index below ${width} (the row has ${width} fields)`,
      element,
    );
    return undefined;
  }
  const cells = reading.headerCells;
  let at = cells.findIndex((c) => refMatches(c, ref));
  if (at < 0) at = cells.findIndex((c) => refMatchesLoosely(c, ref));
  if (at >= 0) return at;
  const names = cells.filter((c) => c.trim() !== '').map((c) => `"${c.trim()}"`);
  reading.problems.error(
    line,
    `${element} names column "${ref}", which is not in the header, expected one of ${names.join(', ')}`,
    element,
  );
  return undefined;
}

function columnsFromMapping(reading: Reading, columns: CsvColumnMapping, width: number): Columns | undefined {
  const out: Partial<Columns> & { description: number[] } = { description: [] };
  let ok = true;
  for (const role of SINGLE_ROLES) {
    const ref = columns[role];
    if (ref === undefined) continue;
    const index = resolveRef(reading, role, ref, width);
    if (index === undefined) ok = false;
    else out[role] = index;
  }
  const description = columns.description;
  if (description !== undefined) {
    const refs: readonly CsvColumnRef[] = Array.isArray(description) ? description : [description as CsvColumnRef];
    for (const ref of refs) {
      const index = resolveRef(reading, 'description', ref, width);
      if (index === undefined) ok = false;
      else out.description.push(index);
    }
  }
  return ok && out.date !== undefined ? (out as Columns) : undefined;
}

/** Header roles, with ambiguous names ("Valuta") decided by the column's content. */
function columnsFromHeader(reading: Reading): Columns | undefined {
  const match = matchHeaderCells(reading.headerCells);
  const roles = new Map<CsvColumnRole, number>(match.roles);
  for (const [index, candidates] of match.ambiguous) {
    const cells: string[] = [];
    for (const r of reading.rows.slice(0, 20)) {
      const c = cellAt(reading.table, r, index).trim();
      if (c !== '') cells.push(c);
    }
    const dateLike = cells.length > 0 && cells.every((c) => /^\d{1,4}[./-]\d{1,2}[./-]\d{1,4}/.test(c));
    const codeLike = cells.length > 0 && cells.every((c) => /^[A-Za-z]{3}$/.test(c));
    const role = dateLike ? 'valueDate' : codeLike ? 'currency' : undefined;
    if (role !== undefined && candidates.includes(role) && !roles.has(role)) roles.set(role, index);
  }
  if (!hasDateAndAmount({ ...match, roles })) {
    const line = fileLine(reading);
    const names = reading.headerCells.filter((c) => c.trim() !== '').map((c) => `"${c.trim()}"`);
    const missing = !roles.has('date')
      ? 'booking date column (like "Date")'
      : 'amount column (like "Amount") and no debit and credit columns';
    reading.problems.error(
      line,
      `header ${names.join(', ')} has no ${missing}, expected one, or an explicit csvMapping.columns`,
    );
    return undefined;
  }
  const columns: Columns = { date: roles.get('date') as number, description: [...match.description] };
  for (const role of SINGLE_ROLES) {
    const index = roles.get(role);
    if (index !== undefined && role !== 'date') columns[role] = index;
  }
  // One signed amount column wins over debit/credit columns when both are named.
  if (columns.amount !== undefined) {
    delete columns.debit;
    delete columns.credit;
  } else delete columns.indicator;
  if (match.currency !== undefined) {
    const message = reading.currencies.note(match.currency, fileLine(reading), 'column name');
    if (message) reading.problems.error(fileLine(reading), message);
  }
  return columns;
}

/** Step 2: header cells, data rows, preamble, columns and the width of every row. */
function layoutStep(reading: Reading): boolean {
  const { table, mapping, problems } = reading;
  const headerRow = reading.headerRow;
  if (typeof mapping?.headerLine === 'number' && headerRow === undefined) {
    problems.error(
      Math.min(mapping.headerLine, Math.max(1, table.rowLine[table.rowCount - 1] ?? 1)),
      `csvMapping.headerLine is ${mapping.headerLine}, expected the line a record starts on (the file's records start on lines ${table.rowLine.slice(0, 5).join(', ')}…)`,
      'csvMapping.headerLine',
    );
    return false;
  }
  if (headerRow === undefined && namedRefs(mapping?.columns).length > 0) {
    problems.error(
      lineOf(reading, 0),
      `no row in the first ${HEADER_SEARCH_ROWS} lines has the columns ${namedRefs(mapping?.columns)
        .map((n) => `"${n}"`)
        .join(', ')} named by csvMapping.columns, expected a header row with those names`,
      'csvMapping.columns',
    );
    return false;
  }
  if (headerRow !== undefined) {
    reading.headerCells = rowCells(table, headerRow);
    reading.dataStart =
      mapping?.dataLine !== undefined ? firstRecordFromLine(table, mapping.dataLine, headerRow + 1) : headerRow + 1;
  } else {
    reading.dataStart =
      mapping?.dataLine !== undefined ? firstRecordFromLine(table, mapping.dataLine, 0) : tableStart(table);
  }
  reading.preamble = readPreamble(table, headerRow ?? reading.dataStart);
  const dataRows: number[] = [];
  for (let r = reading.dataStart; r < table.rowCount; r++) if (!isBlankRow(table, r)) dataRows.push(r);
  reading.rows = dataRows;

  // Duplicated header names make a mapping by name ambiguous.
  if (headerRow !== undefined) {
    const seen = new Map<string, number>();
    reading.headerCells.forEach((cell, index) => {
      const name = cell.trim();
      if (name === '') return;
      const first = seen.get(name.toLowerCase());
      if (first !== undefined) {
        problems.error(
          lineOf(reading, headerRow),
          `column name "${name}" appears twice (columns ${first + 1} and ${index + 1}), expected each name once`,
        );
      } else seen.set(name.toLowerCase(), index);
    });
  }

  const referenceRow = headerRow ?? dataRows[0];
  if (referenceRow === undefined) {
    problems.error(lineOf(reading, 0), 'file has no rows, expected a header row and data rows');
    return false;
  }
  const width = rowWidth(table, referenceRow);
  if (mapping?.columns) reading.columns = columnsFromMapping(reading, mapping.columns, width);
  else if (headerRow !== undefined) reading.columns = columnsFromHeader(reading);
  else {
    const guess = guessColumns(table, reading.dataStart, table.rowCount, width);
    if (guess.date !== undefined && guess.amount !== undefined) {
      reading.proposed = {
        delimiter: reading.delimiter,
        headerLine: null,
        dataLine: lineOf(reading, reading.dataStart),
        columns: {
          date: guess.date,
          amount: guess.amount,
          ...(guess.description !== undefined ? { description: guess.description } : {}),
          ...(guess.balance !== undefined ? { balance: guess.balance } : {}),
        },
      };
    }
    problems.error(
      lineOf(reading, reading.dataStart),
      `no header row with a date and an amount column in the first ${HEADER_SEARCH_ROWS} lines, expected column names like "Date" and "Amount", or an explicit csvMapping with headerLine null and column indexes`,
    );
    return false;
  }
  const columns = reading.columns;
  if (!columns) return false;
  if (headerRow !== undefined && mapping?.columns === undefined) reading.confidence = 0.9;
  else if (mapping?.columns) reading.confidence = 1;

  if (dataRows.length === 0) {
    problems.error(
      lineOf(reading, headerRow ?? 0),
      headerRow !== undefined
        ? 'file has no data rows after the header, expected at least one row'
        : 'file has no data rows, expected at least one row',
    );
    return false;
  }

  // Width of every row: the header's, give or take trailing empty cells.
  let minWidth = width;
  const widthCells = rowCells(table, referenceRow);
  while (minWidth > 0 && (widthCells[minWidth - 1] as string).trim() === '') minWidth--;
  let maxRef = columns.date;
  for (const role of SINGLE_ROLES) maxRef = Math.max(maxRef, columns[role] ?? 0);
  for (const d of columns.description) maxRef = Math.max(maxRef, d);
  minWidth = Math.max(minWidth, maxRef + 1);
  const where =
    headerRow !== undefined
      ? `the header on line ${lineOf(reading, headerRow)}`
      : `line ${lineOf(reading, referenceRow)}`;
  const valid: number[] = [];
  for (const r of dataRows) {
    const w = rowWidth(table, r);
    let ok = w >= minWidth;
    if (ok && w > width) {
      const span: CellSpan = { text: '', start: 0, end: 0 };
      for (let c = width; c < w && ok; c++) ok = cellSpan(table, r, c, span).end === span.start;
    }
    if (ok) valid.push(r);
    else {
      const hint = w > width ? ' (an unquoted delimiter inside a field?)' : '';
      problems.error(lineOf(reading, r), `row has ${w} fields, expected ${width} as in ${where}${hint}`);
    }
  }
  reading.rows = valid;
  return true;
}

/** Evidence gathered from all rows before any conversion. */
interface Evidence {
  comma: number;
  point: number;
  maybeComma: number;
  maybePoint: number;
  parentheses: number;
  trailingMinus: number;
  thousands: string;
}

/** What the format step gathers row by row before it decides (see `gatherRow`, `decideFormats`). */
interface FormatGathering {
  readonly ev: Evidence;
  readonly dates: DateFormatInference;
  /** Amount, debit, credit and balance columns, in the order their cells are inspected. */
  readonly amountCols: readonly number[];
  readonly span: CellSpan;
  acceptedCurrency: string;
  accountValue: string | undefined;
  accountRaw: string;
  accountLine: number;
}

/** Step 3 begins: the preamble's currency, and empty evidence. */
function startFormats(reading: Reading): FormatGathering {
  const { problems, preamble } = reading;
  const columns = reading.columns as Columns;
  const currencies = reading.currencies;
  if (preamble.currency !== undefined) {
    const m = currencies.note(preamble.currency, preamble.currencyLine ?? 1, 'preamble');
    if (m) problems.error(preamble.currencyLine ?? 1, m);
  }
  if (preamble.conflictingCurrency) {
    const m = currencies.note(preamble.conflictingCurrency.code, preamble.conflictingCurrency.line, 'preamble');
    if (m) problems.error(preamble.conflictingCurrency.line, m);
  }
  const amountCols: number[] = [];
  for (const c of [columns.amount, columns.debit, columns.credit, columns.balance])
    if (c !== undefined) amountCols.push(c);
  return {
    ev: { comma: 0, point: 0, maybeComma: 0, maybePoint: 0, parentheses: 0, trailingMinus: 0, thousands: '' },
    dates: createDateFormatInference(),
    amountCols,
    span: { text: '', start: 0, end: 0 },
    acceptedCurrency: '',
    accountValue: undefined,
    accountRaw: '',
    accountLine: 0,
  };
}

/** The currency and account cells of row r (the part of `gatherRow` before the amounts). */
function gatherCodes(reading: Reading, g: FormatGathering, r: number, line: number): void {
  const { table, problems } = reading;
  const columns = reading.columns as Columns;
  const span = g.span;
  if (columns.currency !== undefined) {
    cellSpan(table, r, columns.currency, span);
    if (span.end > span.start && !spanIs(span, g.acceptedCurrency)) {
      const cell = span.text.slice(span.start, span.end);
      const m = reading.currencies.note(cell, line, 'currency column');
      if (m) problems.error(line, m);
      else g.acceptedCurrency = cell;
    }
  }
  if (columns.account !== undefined) {
    cellSpan(table, r, columns.account, span);
    if (span.end > span.start && !spanIs(span, g.accountRaw)) {
      const raw = span.text.slice(span.start, span.end);
      const value = normaliseAccountIdentifier(raw);
      if (g.accountValue === undefined) {
        g.accountValue = value;
        g.accountRaw = raw;
        g.accountLine = line;
      } else if (value !== g.accountValue) {
        problems.error(
          line,
          `account "${value}" differs from "${g.accountValue}" on line ${g.accountLine}, expected one account per file`,
        );
      }
    }
  }
}

/** Counts what one inspected amount cell says about the number format. */
function noteAmount(reading: Reading, g: FormatGathering, info: AmountInspection, line: number): void {
  if (!info.ok) return;
  const ev = g.ev;
  if (info.evidence === 1) ev.comma++;
  else if (info.evidence === 2) ev.point++;
  else if (info.evidence === 3) ev.maybeComma++;
  else if (info.evidence === 4) ev.maybePoint++;
  if (info.parentheses) ev.parentheses++;
  if (info.trailingMinus) ev.trailingMinus++;
  if (ev.thousands === '' && info.thousands !== '') ev.thousands = info.thousands;
  if (info.currency !== '') {
    const m = reading.currencies.note(info.currency, line, 'amount cell');
    if (m) reading.problems.error(line, m);
  }
}

/** Everything step 3 looks at in row r. */
function gatherRow(reading: Reading, g: FormatGathering, r: number): void {
  const { table } = reading;
  const columns = reading.columns as Columns;
  const span = g.span;
  const line = lineOf(reading, r);
  gatherCodes(reading, g, r, line);
  for (const c of g.amountCols) {
    cellSpan(table, r, c, span);
    if (span.end === span.start) continue;
    noteAmount(reading, g, inspectAmount(span.text, span.start, span.end), line);
  }
  cellSpan(table, r, columns.date, span);
  g.dates.add(span.text, line, span.start, span.end);
  if (columns.valueDate !== undefined) {
    cellSpan(table, r, columns.valueDate, span);
    g.dates.add(span.text, line, span.start, span.end);
  }
}

/** Step 3 ends: currency, number and date formats from everything gathered. False when rows cannot be read. */
function decideFormats(reading: Reading, g: FormatGathering): boolean {
  const { table, problems, mapping } = reading;
  const columns = reading.columns as Columns;
  const currencies = reading.currencies;
  const ev = g.ev;
  reading.account = g.accountValue;

  // Currency: the file's statements, then the caller's option.
  const stated = currencies.stated;
  const option = reading.options.currency?.trim().toUpperCase();
  if (stated && option && option !== stated.code) {
    problems.error(
      stated.line,
      `file states currency ${stated.code} (${stated.source}), but the requested currency (--currency) is ${option}, expected them to agree`,
    );
  } else if (!stated && option && minorUnitExponent(option) === undefined) {
    problems.error(
      fileLine(reading),
      `requested currency "${option}" (--currency) is not an ISO 4217 code, expected a code like EUR`,
    );
  } else if (!stated && !option && !currencies.rejected) {
    problems.error(
      fileLine(reading),
      'no currency stated (no currency column, preamble line or code beside the amounts), expected one: give --currency CODE',
    );
  }
  reading.currency = stated?.code ?? option;
  const exponent = reading.currency !== undefined ? minorUnitExponent(reading.currency) : undefined;

  // Numbers: the decimal separator all rows agree on.
  reading.decimal = decimalFrom(ev, mapping, exponent, reading.delimiter);
  const seen = mapping?.thousandsSeparator ?? ev.thousands;
  reading.thousandsSeen = (
    seen === '\u2019' ? "'" : seen === '\u2009' ? ' ' : seen === '\t' ? ' ' : seen
  ) as ThousandsSeparator;
  if (!mapping?.thousandsSeparator && ev.thousands === '') {
    if (ev.maybeComma > 0 && reading.decimal === '.') reading.thousandsSeen = ',';
    else if (ev.maybePoint > 0 && reading.decimal === ',') reading.thousandsSeen = '.';
  }
  reading.signStyle =
    mapping?.signStyle ??
    (columns.debit !== undefined
      ? 'debitCredit'
      : columns.indicator !== undefined
        ? 'indicator'
        : ev.parentheses > 0
          ? 'parentheses'
          : ev.trailingMinus > 0
            ? 'trailingMinus'
            : 'signed');

  // Dates: the format all rows agree on.
  if (mapping?.dateFormat !== undefined) {
    reading.dateFormat = parseDateFormatName(mapping.dateFormat);
  } else {
    const inferred = g.dates.result();
    reading.dateAmbiguous = inferred.ambiguous;
    if (inferred.problem) {
      problems.error(inferred.problem.line, inferred.problem.message);
      return false;
    }
    if (!inferred.format) {
      const first = reading.rows[0] as number;
      const name = reading.headerCells[columns.date]?.trim();
      problems.error(
        lineOf(reading, first),
        `date "${cellAt(table, first, columns.date)}"${name ? ` in column "${name}"` : ''} is not a date, and no row has one, expected dates like 2025-01-31 or 31.01.2025`,
      );
      return false;
    }
    reading.dateFormat = inferred.format;
  }
  return exponent !== undefined;
}

/** The decimal separator the evidence (or the mapping) gives. */
function decimalFrom(
  ev: Evidence,
  mapping: CsvMapping | undefined,
  exponent: number | undefined,
  delimiter: CsvDelimiter,
): DecimalSeparator {
  if (mapping?.decimalSeparator) return mapping.decimalSeparator;
  if (ev.comma > 0 || ev.point > 0) return ev.comma >= ev.point ? ',' : '.';
  if (ev.maybeComma > 0 || ev.maybePoint > 0) {
    // "1,234" alone: a currency with three decimals writes them; others group thousands.
    const maybe: DecimalSeparator = ev.maybeComma >= ev.maybePoint ? ',' : '.';
    return exponent === 3 ? maybe : maybe === ',' ? '.' : ',';
  }
  return delimiter === ';' ? ',' : '.';
}

/** Step 3 on its own: currency, account column, number and date formats from all rows. */
function formatStep(reading: Reading): boolean {
  const g = startFormats(reading);
  for (const r of reading.rows) gatherRow(reading, g, r);
  return decideFormats(reading, g);
}

/** Per-row data kept for the order and balance steps (parallel arrays of `count` rows). */
interface RowData {
  entries: StatementEntry[];
  dates: CalendarDate[];
  amounts: Float64Array;
  balances: Float64Array;
  pending: Uint8Array;
  lines: Int32Array;
  count: number;
}

function emptyRowData(capacity: number): RowData {
  return {
    entries: [],
    dates: [],
    amounts: new Float64Array(capacity),
    balances: new Float64Array(capacity),
    pending: new Uint8Array(capacity),
    lines: new Int32Array(capacity),
    count: 0,
  };
}

/** The filled part of the typed arrays. */
function trimmed(data: RowData): RowData {
  const n = data.count;
  return {
    entries: data.entries,
    dates: data.dates,
    amounts: data.amounts.subarray(0, n),
    balances: data.balances.subarray(0, n),
    pending: data.pending.subarray(0, n),
    lines: data.lines.subarray(0, n),
    count: n,
  };
}

/** True when the span holds exactly `value` (compared in place, nothing cut out). */
function spanIs(span: CellSpan, value: string): boolean {
  return span.end - span.start === value.length && value !== '' && span.text.startsWith(value, span.start);
}

function spanText(span: CellSpan): string {
  return span.text.slice(span.start, span.end);
}

/** The formats rows are converted with. */
interface RowFormats {
  readonly date: CsvDateFormat;
  readonly currency: string;
  readonly decimal: DecimalSeparator;
}

/** Where problems of the row conversion go: the file's collector, or a trial run's tally. */
interface ErrorSink {
  readonly errorCount: number;
  error(line: number | undefined, message: string): void;
}

/**
 * The per-row conversion of step 4, shared by the plain row pass and the combined pass:
 * `dateAt`, `amountAt` read one cell (or report it); `finish` turns a row whose dates and
 * amounts are read into an entry (descriptions, optional columns) and appends it to `data`.
 */
interface RowConverter {
  readonly span: CellSpan;
  /** Reads the date in column `col` of row r; `label` names it in messages. */
  dateAt(r: number, col: number, line: number, label?: string): CalendarDate | undefined;
  /** Reads the amount now in `span`, or reports it. */
  amountIn(label: string, line: number): number | undefined;
  /** Reads status and balance, builds the entry and keeps it unless the row had errors. */
  finish(
    r: number,
    line: number,
    errorsBefore: number,
    bookingDate: CalendarDate | undefined,
    valueDate: CalendarDate | undefined,
    amount: number | undefined,
    /** The balance cell already read (NaN when empty); undefined to read it here. */
    balanceRead?: number,
  ): void;
}

function createRowConverter(reading: Reading, formats: RowFormats, sink: ErrorSink, data: RowData): RowConverter {
  const { table, mapping } = reading;
  const columns = reading.columns as Columns;
  const { date: format, currency, decimal } = formats;
  const exponent = minorUnitExponent(currency) ?? 2;
  const numbers: CsvNumberFormat =
    mapping?.thousandsSeparator !== undefined ? { decimal, thousands: mapping.thousandsSeparator } : { decimal };
  const span: CellSpan = { text: '', start: 0, end: 0 };
  const description = columns.description;
  const amountIn = (label: string, line: number): number | undefined => {
    const value = readAmount(span.text, numbers, exponent, currency, span.start, span.end);
    if (typeof value === 'string') {
      sink.error(line, `${label} "${spanText(span)}" ${value}`);
      return undefined;
    }
    return value;
  };
  /** Text of an optional column, trimmed; undefined when empty. */
  const optional = (row: number, col: number | undefined): string | undefined => {
    if (col === undefined) return undefined;
    cellSpan(table, row, col, span);
    if (span.end === span.start) return undefined;
    const text = spanText(span).trim();
    return text === '' ? undefined : text;
  };
  // Status cells repeat a few words: decide each distinct word once.
  let lastStatusText = '';
  let lastStatus: 'booked' | 'pending' | undefined = 'booked';
  return {
    span,
    amountIn,
    dateAt(r, col, line, label) {
      cellSpan(table, r, col, span);
      if (label !== undefined && span.end === span.start) return undefined;
      const date = parseDateCell(span.text, format, span.start, span.end);
      if (date === undefined) sink.error(line, describeDateError(cellAt(table, r, col), format, label));
      return date;
    },
    finish(r, line, errorsBefore, bookingDate, valueDate, amount, balanceRead) {
      let pending = false;
      if (columns.status !== undefined) {
        cellSpan(table, r, columns.status, span);
        if (span.end === span.start) lastStatus = 'booked';
        else if (!spanIs(span, lastStatusText)) {
          lastStatusText = spanText(span);
          lastStatus = bookingStatus(lastStatusText);
        }
        if (lastStatus === undefined) {
          sink.error(
            line,
            `status "${spanText(span)}" is not a known booking status, expected booked or pending (or no status column in csvMapping)`,
          );
        } else pending = lastStatus === 'pending';
        if (span.end === span.start) lastStatusText = '';
      }
      let balance = balanceRead ?? Number.NaN;
      if (columns.balance !== undefined && balanceRead === undefined) {
        cellSpan(table, r, columns.balance, span);
        if (span.end > span.start) balance = amountIn('balance', line) ?? Number.NaN;
      }
      if (sink.errorCount > errorsBefore || bookingDate === undefined || amount === undefined) return;
      let text = '';
      for (const c of description) {
        const part = optional(r, c);
        if (part !== undefined) text = text === '' ? part : `${text} ${part}`;
      }
      const counterparty = optional(r, columns.counterparty);
      const status = pending ? 'pending' : 'booked';
      const source = { line };
      // The common shapes are built whole: adding properties one by one would give most entries
      // a separate property store. The key order is the same either way.
      let entry: { -readonly [K in keyof StatementEntry]: StatementEntry[K] };
      if (valueDate === undefined) {
        entry =
          counterparty === undefined
            ? { bookingDate, amount, description: text, status, source }
            : { bookingDate, amount, description: text, status, source, counterparty };
      } else {
        entry =
          counterparty === undefined
            ? { bookingDate, amount, description: text, status, source, valueDate }
            : { bookingDate, amount, description: text, status, source, valueDate, counterparty };
      }
      const reference = optional(r, columns.reference);
      if (reference !== undefined) entry.reference = reference;
      const bankRef = optional(r, columns.bankRef);
      if (bankRef !== undefined) entry.bankRef = bankRef;
      const typeCode = optional(r, columns.type);
      if (typeCode !== undefined) entry.typeCode = typeCode;
      const k = data.count++;
      data.entries.push(entry);
      data.dates.push(bookingDate);
      data.amounts[k] = amount;
      data.balances[k] = balance;
      data.pending[k] = pending ? 1 : 0;
      data.lines[k] = line;
    },
  };
}

/** Step 4 on its own: every row to an entry, problems to the file's collector. */
function rowStep(reading: Reading): RowData {
  const { table, problems, mapping } = reading;
  const columns = reading.columns as Columns;
  const data = emptyRowData(reading.rows.length);
  const convert = createRowConverter(
    reading,
    {
      date: reading.dateFormat as CsvDateFormat,
      currency: reading.currency ?? 'EUR',
      decimal: reading.decimal as DecimalSeparator,
    },
    problems,
    data,
  );
  const { span, amountIn } = convert;
  const negate = mapping?.negateAmounts === true;
  // Indicator cells repeat a few words: decide each distinct word once.
  let lastMark = '';
  let lastSign: -1 | 0 | 1 = 0;
  for (const r of reading.rows) {
    const line = lineOf(reading, r);
    const errorsBefore = problems.errorCount;
    const bookingDate = convert.dateAt(r, columns.date, line);
    const valueDate =
      columns.valueDate !== undefined ? convert.dateAt(r, columns.valueDate, line, 'value date') : undefined;
    let amount: number | undefined;
    if (columns.amount !== undefined) {
      cellSpan(table, r, columns.amount, span);
      if (span.end === span.start) {
        problems.error(
          line,
          `amount is empty, expected a number like ${formatForMessage(-123456, 2, reading.decimal as DecimalSeparator)}`,
        );
      } else amount = amountIn('amount', line);
      if (amount !== undefined && columns.indicator !== undefined) {
        const amountText = spanText(span);
        cellSpan(table, r, columns.indicator, span);
        if (!spanIs(span, lastMark)) {
          lastMark = spanText(span);
          lastSign = indicatorSign(lastMark);
        }
        const mark = spanText(span);
        if (lastSign === 0 || mark === '') {
          problems.error(
            line,
            `indicator "${mark}" is not a debit/credit mark, expected D/C, DR/CR, S/H, Debit/Credit, Af/Bij or -/+`,
          );
          amount = undefined;
        } else if (amount < 0 && lastSign > 0) {
          problems.error(
            line,
            `amount "${amountText}" is negative but the indicator "${mark}" says credit, expected an unsigned amount`,
          );
          amount = undefined;
        } else amount = amount === 0 ? 0 : lastSign * Math.abs(amount);
      }
    } else {
      cellSpan(table, r, columns.debit as number, span);
      const debitText = spanText(span);
      const debit = debitText === '' ? undefined : amountIn('debit', line);
      cellSpan(table, r, columns.credit as number, span);
      const creditText = spanText(span);
      const credit = creditText === '' ? undefined : amountIn('credit', line);
      if (debitText === '' && creditText === '') {
        problems.error(line, 'debit and credit are both empty, expected an amount in one of them');
      } else if (debit !== undefined && credit !== undefined && debit !== 0 && credit !== 0) {
        problems.error(line, `debit "${debitText}" and credit "${creditText}" are both filled, expected one of them`);
      } else if (debit !== undefined && debit !== 0) amount = -Math.abs(debit);
      else if (credit !== undefined) amount = credit;
      else if (debit !== undefined) amount = 0;
    }
    if (amount !== undefined && negate && amount !== 0) amount = -amount;
    convert.finish(r, line, errorsBefore, bookingDate, valueDate, amount);
  }
  return trimmed(data);
}

/**
 * Rows the combined pass reads: one signed amount column (no indicator, no debit and
 * credit columns). Other layouts take the plain steps 3 and 4.
 */
function combinable(columns: Columns): boolean {
  return columns.amount !== undefined && columns.indicator === undefined && columns.debit === undefined;
}

/** Rows looked at to guess the formats before the combined pass. */
const GUESS_ROWS = 256;

/**
 * The formats step 3 will most likely decide, from the first rows and without reporting
 * anything: the currency stated first (column name, preamble, currency cells, amount cells,
 * then the caller's option), the decimal separator and the date format. Undefined when the
 * first rows settle no date format or no currency.
 */
function guessFormats(reading: Reading): RowFormats | undefined {
  const { table, mapping, preamble, options } = reading;
  const columns = reading.columns as Columns;
  const rows = reading.rows;
  const last = Math.min(rows.length, GUESS_ROWS);
  const span: CellSpan = { text: '', start: 0, end: 0 };
  let currency = reading.currencies.stated?.code;
  const known = (code: string | undefined): string | undefined => {
    const c = code?.trim().toUpperCase();
    return c !== undefined && c !== '' && isKnownCurrency(c) ? c : undefined;
  };
  currency ??= known(preamble.currency);
  const ev: Evidence = {
    comma: 0,
    point: 0,
    maybeComma: 0,
    maybePoint: 0,
    parentheses: 0,
    trailingMinus: 0,
    thousands: '',
  };
  const dates = createDateFormatInference();
  for (let k = 0; k < last; k++) {
    const r = rows[k] as number;
    if (currency === undefined && columns.currency !== undefined) {
      cellSpan(table, r, columns.currency, span);
      currency = known(spanText(span));
    }
    for (const c of [columns.amount, columns.balance]) {
      if (c === undefined) continue;
      cellSpan(table, r, c, span);
      if (span.end === span.start) continue;
      const info = inspectAmount(span.text, span.start, span.end);
      if (!info.ok) continue;
      if (info.evidence === 1) ev.comma++;
      else if (info.evidence === 2) ev.point++;
      else if (info.evidence === 3) ev.maybeComma++;
      else if (info.evidence === 4) ev.maybePoint++;
      if (currency === undefined && info.currency !== '') currency = known(info.currency);
    }
    cellSpan(table, r, columns.date, span);
    dates.add(span.text, 0, span.start, span.end);
    if (columns.valueDate !== undefined) {
      cellSpan(table, r, columns.valueDate, span);
      dates.add(span.text, 0, span.start, span.end);
    }
  }
  currency ??= known(options.currency);
  if (currency === undefined) return undefined;
  const date = mapping?.dateFormat !== undefined ? parseDateFormatName(mapping.dateFormat) : dates.result().format;
  if (date === undefined) return undefined;
  return { date, currency, decimal: decimalFrom(ev, mapping, minorUnitExponent(currency), reading.delimiter) };
}

/**
 * Steps 3 and 4 in one pass over the rows, for the usual layout (`combinable`): each row's
 * cells are looked at once, for the format evidence and for the conversion with the formats
 * guessed from the first rows (`guessFormats`), each amount cell with a single read of its
 * signs and symbols (`inspectAndReadAmount`). When the formats decided from all rows are the
 * guessed ones and no row had a problem, the converted rows are the result; otherwise (a
 * wrong guess, or rows to report) they are dropped and step 4 runs on its own with the
 * decided formats, so the outcome and the problems are always those of steps 3 and 4 run
 * one after the other.
 *
 * @returns the rows, or undefined when step 3 refuses the rows (then there is no step 4).
 */
function formatAndRowStep(reading: Reading): RowData | undefined {
  const columns = reading.columns as Columns;
  const guess = combinable(columns) ? guessFormats(reading) : undefined;
  if (guess === undefined) return formatStep(reading) ? rowStep(reading) : undefined;

  const { table, mapping } = reading;
  const g = startFormats(reading);
  const data = emptyRowData(reading.rows.length);
  let trialErrors = 0;
  const trial: ErrorSink = {
    get errorCount() {
      return trialErrors;
    },
    error() {
      trialErrors++;
    },
  };
  const convert = createRowConverter(reading, guess, trial, data);
  const span = convert.span;
  const exponent = minorUnitExponent(guess.currency) ?? 2;
  const numbers: CsvNumberFormat =
    mapping?.thousandsSeparator !== undefined
      ? { decimal: guess.decimal, thousands: mapping.thousandsSeparator }
      : { decimal: guess.decimal };
  const negate = mapping?.negateAmounts === true;
  const amountCol = columns.amount as number;
  const balanceCol = columns.balance;
  const valueCol = columns.valueDate;
  for (const r of reading.rows) {
    const line = lineOf(reading, r);
    // Step 3's look at the row, in its order: codes, amount cells, dates.
    gatherCodes(reading, g, r, line);
    cellSpan(table, r, amountCol, span);
    let amount: number | string | undefined;
    if (span.end > span.start) {
      amount = inspectAndReadAmount(span.text, span.start, span.end, numbers, exponent, guess.currency);
      noteAmount(reading, g, lastInspection(), line);
    }
    let balance = Number.NaN;
    if (balanceCol !== undefined) {
      cellSpan(table, r, balanceCol, span);
      if (span.end > span.start) {
        const value = inspectAndReadAmount(span.text, span.start, span.end, numbers, exponent, guess.currency);
        noteAmount(reading, g, lastInspection(), line);
        if (typeof value === 'number') balance = value;
        else trialErrors++;
      }
    }
    cellSpan(table, r, columns.date, span);
    g.dates.add(span.text, line, span.start, span.end);
    const bookingDate = trialErrors === 0 ? parseDateCell(span.text, guess.date, span.start, span.end) : undefined;
    let valueDate: CalendarDate | undefined;
    if (valueCol !== undefined) {
      cellSpan(table, r, valueCol, span);
      g.dates.add(span.text, line, span.start, span.end);
      if (span.end > span.start && trialErrors === 0) {
        valueDate = parseDateCell(span.text, guess.date, span.start, span.end);
        if (valueDate === undefined) trialErrors++;
      }
    }
    if (trialErrors > 0) continue;
    // Step 4 with the guessed formats; any problem ends the trial.
    if (bookingDate === undefined || typeof amount !== 'number') {
      trialErrors++;
      continue;
    }
    convert.finish(r, line, 0, bookingDate, valueDate, negate && amount !== 0 ? -amount : amount, balance);
  }
  if (!decideFormats(reading, g)) return undefined;
  const decided = reading.dateFormat as CsvDateFormat;
  const same =
    trialErrors === 0 &&
    reading.currency === guess.currency &&
    reading.decimal === guess.decimal &&
    decided.order === guess.date.order &&
    decided.separator === guess.date.separator &&
    decided.twoDigitYear === guess.date.twoDigitYear;
  return same ? trimmed(data) : rowStep(reading);
}

function mismatchMessage(m: BalanceMismatch, exponent: number, decimal: DecimalSeparator): string {
  const f = (v: number): string => formatForMessage(v, exponent, decimal);
  return (
    `running balance ${f(m.found)} does not follow from the balance ${f(m.previous)} on line ${m.previousLine} ` +
    `plus the amounts since (${f(m.amount)}), expected ${f(m.expected)}`
  );
}

/** Step 5: row order, running balance, the statement. */
function statementStep(reading: Reading, data: RowData): void {
  const { problems } = reading;
  const columns = reading.columns as Columns;
  const n = data.entries.length;
  const { order, breakIndex } = detectRowOrder(data.dates);
  reading.order = order;
  const forward: number[] = new Array<number>(n);
  for (let k = 0; k < n; k++) forward[k] = k;
  const backward = (): number[] => {
    const b = new Array<number>(n);
    for (let k = 0; k < n; k++) b[k] = n - 1 - k;
    return b;
  };
  let sequence = order === 'newestFirst' ? backward() : forward;
  let endOfDay: { day: CalendarDate; amount: number; line: number }[] = [];
  const exponent = minorUnitExponent(reading.currency ?? '') ?? 2;
  const hasBalances = columns.balance !== undefined && data.balances.some((b) => !Number.isNaN(b));
  if (hasBalances && problems.errorCount === 0) {
    if (order === 'unsorted') {
      const k = breakIndex as number;
      problems.error(
        data.lines[k] as number,
        `date ${data.dates[k]} breaks the date order of the rows before it (${data.dates[k - 1]} on line ${data.lines[k - 1]}), expected rows sorted by date for the running balance check`,
      );
    } else {
      let check = checkRunningBalance(data, sequence);
      if (order === 'unknown' && check.mismatches.length > 0) {
        const reversed = backward();
        const other = checkRunningBalance(data, reversed);
        if (other.mismatches.length < check.mismatches.length) {
          check = other;
          sequence = reversed;
        }
      }
      for (const m of check.mismatches) problems.error(m.line, mismatchMessage(m, exponent, reading.decimal ?? '.'));
      endOfDay = check.endOfDay;
    }
  }
  if (order === 'unsorted') {
    const dates = data.dates;
    sequence = forward.slice().sort((a, b) => {
      const x = dates[a] as string;
      const y = dates[b] as string;
      return x < y ? -1 : x > y ? 1 : a - b;
    });
  }
  const entries = sequence === forward ? data.entries : sequence.map((k) => data.entries[k] as StatementEntry);
  const balances: StatementBalance[] = endOfDay.map((b) => ({
    kind: 'running',
    date: b.day,
    at: 'end',
    amount: b.amount,
    source: { line: b.line },
  }));
  const account = statementAccount(reading);
  const first = entries[0];
  const last = entries[entries.length - 1];
  reading.statement = {
    account,
    currency: reading.currency ?? '',
    ...(first ? { from: first.bookingDate } : {}),
    ...(last ? { to: last.bookingDate } : {}),
    entries,
    balances,
  };
}

function statementAccount(reading: Reading): StatementAccount {
  const identifier = reading.account ?? reading.preamble.identifier;
  const name = reading.preamble.name;
  if (identifier !== undefined) return name !== undefined ? { identifier, name } : { identifier };
  const option = reading.options.account?.trim();
  if (option) {
    const compact = option.replace(/\s+/g, '').toUpperCase();
    return isValidIban(compact) ? { identifier: compact, name: option } : { name: option };
  }
  return { name: reading.options.fileName };
}

function detectedMapping(reading: Reading): CsvMapping | undefined {
  if (reading.proposed) return reading.proposed;
  const columns = reading.columns;
  if (!columns) return undefined;
  const header = reading.headerRow !== undefined ? reading.headerCells : undefined;
  const unique = (index: number): boolean => {
    const name = header?.[index]?.trim();
    return !!name && header !== undefined && header.filter((c) => c.trim() === name).length === 1;
  };
  const ref = (index: number): CsvColumnRef => (header && unique(index) ? (header[index] as string).trim() : index);
  const cols: Record<string, CsvColumnRef | CsvColumnRef[]> = { date: ref(columns.date) };
  for (const role of SINGLE_ROLES) {
    const index = columns[role];
    if (index !== undefined && role !== 'date') cols[role] = ref(index);
  }
  if (columns.description.length === 1) cols.description = ref(columns.description[0] as number);
  else if (columns.description.length > 1) cols.description = columns.description.map(ref);
  const mapping: Record<string, unknown> = {
    delimiter: reading.delimiter,
    headerLine: reading.headerRow !== undefined ? lineOf(reading, reading.headerRow) : null,
    columns: cols,
  };
  if (reading.headerRow === undefined || reading.mapping?.dataLine !== undefined)
    mapping.dataLine = lineOf(reading, reading.dataStart);
  if (reading.dateFormat && !reading.dateAmbiguous) mapping.dateFormat = dateFormatName(reading.dateFormat);
  if (reading.decimal) mapping.decimalSeparator = reading.decimal;
  if (reading.mapping?.thousandsSeparator !== undefined)
    mapping.thousandsSeparator = reading.mapping.thousandsSeparator;
  if (reading.signStyle) mapping.signStyle = reading.signStyle;
  if (reading.mapping?.negateAmounts) mapping.negateAmounts = true;
  return mapping as CsvMapping;
}

function buildDetection(reading: Reading): CsvLayoutDetection {
  const { table } = reading;
  const headerRow = reading.headerRow;
  const columns = reading.columns;
  const roleOf = new Map<number, CsvColumnRole>();
  if (columns) {
    for (const role of SINGLE_ROLES) {
      const index = columns[role];
      if (index !== undefined && !roleOf.has(index)) roleOf.set(index, role);
    }
    for (const d of columns.description) if (!roleOf.has(d)) roleOf.set(d, 'description');
  }
  const width =
    headerRow !== undefined
      ? reading.headerCells.length
      : reading.rows[0] !== undefined
        ? rowWidth(table, reading.rows[0])
        : 0;
  const detectedColumns: CsvDetectedColumn[] = [];
  for (let index = 0; index < width; index++) {
    const role = roleOf.get(index);
    const name = reading.headerCells[index]?.trim() ?? '';
    detectedColumns.push(role !== undefined ? { index, name, role } : { index, name });
  }
  const sampleRows: CsvSampleRow[] = reading.rows
    .slice(0, SAMPLE_ROWS)
    .map((r) => ({ line: lineOf(reading, r), cells: rowCells(table, r) }));
  const hasErrors = reading.problems.errorCount > 0;
  let confidence = reading.proposed ? 0.4 : reading.confidence;
  if (reading.dateAmbiguous) confidence *= 0.5;
  if (hasErrors) confidence *= 0.5;
  const format = reading.dateFormat;
  const mapping = detectedMapping(reading);
  const detection: CsvLayoutDetection = {
    delimiter: reading.delimiter,
    headerLine: headerRow !== undefined ? lineOf(reading, headerRow) : null,
    ...(table.rowCount > 0 ? { dataLine: lineOf(reading, reading.dataStart) } : {}),
    headerCells: reading.headerCells,
    ...(headerRow !== undefined ? { fingerprint: csvLayoutFingerprint(reading.headerCells) } : {}),
    columns: detectedColumns,
    ...(format && !reading.dateAmbiguous ? { dateFormat: dateFormatName(format) } : {}),
    dateFormatAmbiguous: reading.dateAmbiguous,
    twoDigitYears: format?.twoDigitYear ?? false,
    ...(reading.decimal ? { decimalSeparator: reading.decimal } : {}),
    ...(reading.thousandsSeen !== undefined ? { thousandsSeparator: reading.thousandsSeen } : {}),
    ...(reading.signStyle ? { signStyle: reading.signStyle } : {}),
    ...(reading.currency ? { currency: reading.currency } : {}),
    ...((reading.account ?? reading.preamble.identifier) !== undefined
      ? { account: (reading.account ?? reading.preamble.identifier) as string }
      : {}),
    ...(reading.order ? { order: reading.order } : {}),
    rowCount: reading.rows.length,
    confidence: Math.round(confidence * 100) / 100,
    sampleRows,
    ...(mapping ? { mapping } : {}),
    problems: reading.problems.problems,
  };
  return detection;
}

/**
 * Reads a CSV statement text: the import result (one statement, or error problems that
 * refuse the file) and the layout detection behind it. Never throws for bad input.
 * O(n) in the text length.
 *
 * @example
 * const { result } = readCsvStatement('Date,Description,Amount\n2025-01-02,Rent,-500.00\n', { fileName: 'a.csv', currency: 'EUR' });
 * result.statements[0].entries[0].amount // -50000
 */
export function readCsvStatement(text: string, options: ImportOptions): CsvReadOutcome {
  const file = options.fileName;
  const problems = createProblemCollector(file);
  let mapping: CsvMapping | undefined;
  if (options.csvMapping !== undefined) {
    const checked = validateCsvMapping(options.csvMapping);
    for (const p of checked.problems) problems.error(undefined, `${p.element} ${p.message}`, p.element);
    mapping = checked.mapping;
  }
  const reading: Reading = {
    file,
    options,
    problems,
    currencies: createCurrencyCollector(),
    mapping,
    delimiter: mapping?.delimiter ?? ',',
    table: scanCsv('', ','),
    headerRow: undefined,
    headerCells: [],
    dataStart: 0,
    columns: undefined,
    proposed: undefined,
    confidence: 0,
    rows: [],
    preamble: {},
    currency: undefined,
    decimal: undefined,
    thousandsSeen: undefined,
    signStyle: undefined,
    dateFormat: undefined,
    dateAmbiguous: false,
    order: undefined,
    account: undefined,
    statement: undefined,
  };
  if (problems.errorCount === 0) {
    if (text.trim() === '' || text === '\ufeff') {
      problems.error(1, 'file is empty, expected a header row and data rows');
    } else {
      scanStep(reading, text);
      // Rows are converted whenever the formats are known, so one report lists every bad row.
      if (layoutStep(reading)) {
        const rows = formatAndRowStep(reading);
        if (rows) statementStep(reading, rows);
      }
    }
  }
  problems.finish();
  const refused = problems.errorCount > 0;
  const result: ImportResult = {
    file,
    format: 'csv',
    statements: !refused && reading.statement ? [reading.statement] : [],
    problems: problems.problems,
  };
  return { result, detection: buildDetection(reading) };
}
