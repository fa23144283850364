/**
 * The explicit CSV mapping (`ImportOptions.csvMapping`): a JSON object that overrides what
 * detection would decide. Every field is optional except that `columns`, when given, must
 * name a booking date and an amount (one signed column, or debit and credit). The app
 * stores one per bank layout, keyed by `csvLayoutFingerprint` of the header.
 *
 * ```json
 * { "delimiter": ";", "headerLine": 5, "dateFormat": "DD.MM.YYYY",
 *   "decimalSeparator": ",", "thousandsSeparator": ".",
 *   "columns": { "date": "Buchungstag", "valueDate": "Valuta", "amount": "Betrag",
 *                "description": ["Buchungstext", "Verwendungszweck"], "counterparty": 3 } }
 * ```
 */
import { CSV_DELIMITERS, type CsvDelimiter } from './delimiter';
import { CSV_DATE_FORMAT_NAMES, parseDateFormatName } from './dates';
import { THOUSANDS_SEPARATORS, type DecimalSeparator, type ThousandsSeparator } from './numbers';

/** A column by its header name (compared trimmed, then case- and accent-insensitively) or 0-based index. */
export type CsvColumnRef = string | number;

/** How the sign of an amount is written. */
export type CsvSignStyle = 'signed' | 'debitCredit' | 'indicator' | 'parentheses' | 'trailingMinus';

/** Sign styles, in documentation order. */
export const CSV_SIGN_STYLES: readonly CsvSignStyle[] = [
  'signed',
  'debitCredit',
  'indicator',
  'parentheses',
  'trailingMinus',
];

/** Which column holds what. */
export interface CsvColumnMapping {
  /** Booking date (required). */
  readonly date: CsvColumnRef;
  readonly valueDate?: CsvColumnRef;
  /** One signed amount column (or unsigned, with `indicator`). */
  readonly amount?: CsvColumnRef;
  /** Money out; written positive or negative, always read as a debit. Needs `credit`. */
  readonly debit?: CsvColumnRef;
  /** Money in. Needs `debit`. */
  readonly credit?: CsvColumnRef;
  /** D/C, DR/CR, S/H, Debit/Credit, Af/Bij, -/+ beside an unsigned `amount`. */
  readonly indicator?: CsvColumnRef;
  /** One column, or several joined with a space. */
  readonly description?: CsvColumnRef | readonly CsvColumnRef[];
  readonly counterparty?: CsvColumnRef;
  /** Running balance after each row. */
  readonly balance?: CsvColumnRef;
  readonly currency?: CsvColumnRef;
  readonly reference?: CsvColumnRef;
  /** Booked/pending ("vorgemerkt", "pending" → pending). */
  readonly status?: CsvColumnRef;
  /** The statement's own account (IBAN or number); one value per file. */
  readonly account?: CsvColumnRef;
  /** Transaction type text, kept as `typeCode`. */
  readonly type?: CsvColumnRef;
  /** The bank's id of the entry, kept as `bankRef`. */
  readonly bankRef?: CsvColumnRef;
}

/** The explicit mapping. Omitted fields are detected. */
export interface CsvMapping {
  readonly delimiter?: CsvDelimiter;
  /** 1-based line of the header row; `null` when the file has no header (then columns are indexes). */
  readonly headerLine?: number | null;
  /** 1-based line of the first data row (default: the line after the header, or the first line of the table). */
  readonly dataLine?: number;
  readonly columns?: CsvColumnMapping;
  /** One of `CSV_DATE_FORMAT_NAMES` (e.g. "DD.MM.YYYY", "MM/DD/YY"), or "D.M.Y"-style, or "ISO". */
  readonly dateFormat?: string;
  readonly decimalSeparator?: DecimalSeparator;
  readonly thousandsSeparator?: ThousandsSeparator;
  readonly signStyle?: CsvSignStyle;
  /** Flip every amount (files written from the bank's view, e.g. card purchases positive). */
  readonly negateAmounts?: boolean;
}

/** A problem with the mapping itself: the JSON path and what is wrong. */
export interface MappingProblem {
  readonly element: string;
  readonly message: string;
}

const TOP_KEYS = new Set([
  'delimiter',
  'headerLine',
  'dataLine',
  'columns',
  'dateFormat',
  'decimalSeparator',
  'thousandsSeparator',
  'signStyle',
  'negateAmounts',
]);

const COLUMN_KEYS: readonly (keyof CsvColumnMapping)[] = [
  'date',
  'valueDate',
  'amount',
  'debit',
  'credit',
  'indicator',
  'description',
  'counterparty',
  'balance',
  'currency',
  'reference',
  'status',
  'account',
  'type',
  'bankRef',
];

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return typeof value === 'object' && value !== null && !Array.isArray(value);
}

function describe(value: unknown): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (value === null) return 'null';
  if (Array.isArray(value)) return 'an array';
  if (typeof value === 'object') return 'an object';
  return String(value);
}

function isColumnRef(value: unknown): value is CsvColumnRef {
  return (
    (typeof value === 'string' && value.trim() !== '') ||
    (typeof value === 'number' && Number.isInteger(value) && value >= 0 && value < 10_000)
  );
}

/**
 * Checks an untrusted value (parsed JSON) against the `CsvMapping` shape.
 *
 * @returns the mapping when it is valid (with "tab" accepted for "\t"), and every problem
 *   found, each naming its JSON path (`csvMapping.columns.amount`).
 * @example validateCsvMapping({ columns: { date: 0, amount: 2 } }).problems // []
 * @example validateCsvMapping({ columns: { amount: 2 } }).problems[0].element // 'csvMapping.columns.date'
 */
export function validateCsvMapping(value: unknown): { mapping?: CsvMapping; problems: MappingProblem[] } {
  const problems: MappingProblem[] = [];
  const bad = (element: string, message: string): void => {
    problems.push({ element: `csvMapping${element === '' ? '' : '.' + element}`, message });
  };
  if (!isPlainObject(value)) {
    bad('', `is ${describe(value)}, expected an object like { "columns": { "date": "Date", "amount": "Amount" } }`);
    return { problems };
  }
  for (const key of Object.keys(value)) {
    if (!TOP_KEYS.has(key)) bad(key, `is not a mapping field, expected one of ${[...TOP_KEYS].join(', ')}`);
  }
  let delimiter = value.delimiter;
  if (delimiter === 'tab') delimiter = '\t';
  if (delimiter !== undefined && !(CSV_DELIMITERS as readonly unknown[]).includes(delimiter)) {
    bad('delimiter', `is ${describe(value.delimiter)}, expected one of ",", ";", "\\t" (or "tab"), "|"`);
  }
  const headerLine = value.headerLine;
  if (
    headerLine !== undefined &&
    headerLine !== null &&
    !(Number.isInteger(headerLine) && (headerLine as number) >= 1)
  ) {
    bad('headerLine', `is ${describe(headerLine)}, expected a line number from 1, or null for a file without header`);
  }
  const dataLine = value.dataLine;
  if (dataLine !== undefined && !(Number.isInteger(dataLine) && (dataLine as number) >= 1)) {
    bad('dataLine', `is ${describe(dataLine)}, expected a line number from 1`);
  } else if (typeof dataLine === 'number' && typeof headerLine === 'number' && dataLine <= headerLine) {
    bad('dataLine', `is ${dataLine}, expected a line after the header line ${headerLine}`);
  }
  if (value.dateFormat !== undefined) {
    if (typeof value.dateFormat !== 'string' || parseDateFormatName(value.dateFormat) === undefined) {
      bad('dateFormat', `is ${describe(value.dateFormat)}, expected one of ${CSV_DATE_FORMAT_NAMES.join(', ')}`);
    }
  }
  const decimal = value.decimalSeparator;
  if (decimal !== undefined && decimal !== ',' && decimal !== '.') {
    bad('decimalSeparator', `is ${describe(decimal)}, expected "," or "."`);
  }
  const thousands = value.thousandsSeparator;
  if (thousands !== undefined) {
    if (!(THOUSANDS_SEPARATORS as readonly unknown[]).includes(thousands)) {
      bad(
        'thousandsSeparator',
        `is ${describe(thousands)}, expected one of "", ".", ",", " ", "\\u00a0", "\\u202f", "'"`,
      );
    } else if (thousands === decimal) {
      bad('thousandsSeparator', `is ${describe(thousands)} like the decimal separator, expected a different character`);
    }
  }
  const signStyle = value.signStyle;
  if (signStyle !== undefined && !(CSV_SIGN_STYLES as readonly unknown[]).includes(signStyle)) {
    bad('signStyle', `is ${describe(signStyle)}, expected one of ${CSV_SIGN_STYLES.join(', ')}`);
  }
  if (value.negateAmounts !== undefined && typeof value.negateAmounts !== 'boolean') {
    bad('negateAmounts', `is ${describe(value.negateAmounts)}, expected true or false`);
  }
  const columns = value.columns;
  if (columns !== undefined) {
    if (!isPlainObject(columns)) {
      bad('columns', `is ${describe(columns)}, expected an object like { "date": "Date", "amount": "Amount" }`);
    } else {
      for (const key of Object.keys(columns)) {
        if (!(COLUMN_KEYS as readonly string[]).includes(key)) {
          bad(`columns.${key}`, `is not a column role, expected one of ${COLUMN_KEYS.join(', ')}`);
        }
      }
      for (const key of COLUMN_KEYS) {
        const ref = columns[key];
        if (ref === undefined) continue;
        const refs = key === 'description' && Array.isArray(ref) ? (ref as unknown[]) : [ref];
        if (refs.length === 0 || !refs.every(isColumnRef)) {
          bad(
            `columns.${key}`,
            `is ${describe(ref)}, expected a header name or a 0-based column index` +
              (key === 'description' ? ' (or a list of them)' : ''),
          );
        } else if (headerLine === null && refs.some((r) => typeof r === 'string')) {
          bad(`columns.${key}`, `is ${describe(ref)}, expected a 0-based column index because headerLine is null`);
        }
      }
      if (columns.date === undefined) bad('columns.date', 'is missing, expected the booking date column');
      const hasAmount = columns.amount !== undefined;
      const hasDebit = columns.debit !== undefined;
      const hasCredit = columns.credit !== undefined;
      if (hasAmount && (hasDebit || hasCredit)) {
        bad('columns.amount', 'is given together with debit/credit, expected either amount or debit and credit');
      } else if (!hasAmount && !(hasDebit && hasCredit)) {
        bad(
          hasDebit ? 'columns.credit' : hasCredit ? 'columns.debit' : 'columns.amount',
          'is missing, expected an amount column, or debit and credit columns',
        );
      }
      if (columns.indicator !== undefined && !hasAmount) {
        bad('columns.indicator', 'is given without an amount column, expected the unsigned amount it signs');
      }
      if (typeof signStyle === 'string') {
        if (signStyle === 'debitCredit' && !(hasDebit && hasCredit)) {
          bad('signStyle', 'is "debitCredit", expected columns.debit and columns.credit');
        } else if (signStyle === 'indicator' && columns.indicator === undefined) {
          bad('signStyle', 'is "indicator", expected columns.indicator');
        } else if (signStyle !== 'debitCredit' && signStyle !== 'indicator' && !hasAmount) {
          bad('signStyle', `is "${signStyle}", expected columns.amount`);
        }
      }
    }
  }
  if (problems.length > 0) return { problems };
  const mapping = (delimiter === value.delimiter ? value : { ...value, delimiter }) as CsvMapping;
  return { mapping, problems };
}
