/**
 * The CSV statement importer: RFC 4180 (2005) plus what bank exports really contain —
 * `,` `;` tab or `|` delimiters, account lines before the header, column names in several
 * languages, decimal comma or point with any thousands separator, signed amounts or
 * debit/credit columns or an indicator column, day-first or month-first dates decided from
 * all rows, an optional running balance checked row by row, pending rows.
 *
 * Problems carry the file and 1-based line: a refusing `error` for anything that could
 * make an amount, a date or a balance wrong; the whole file is then refused. Internals
 * live under engine/import/csv/, one concept per file.
 */
import type { ImportOptions, ImportResult, StatementImporter } from './types';
import { readCsvStatement } from './csv/read';
import { sniffCsv } from './csv/sniff';

export { csvLayoutFingerprint } from './csv/fingerprint';
export { detectCsvLayout } from './csv/detect';
export { validateCsvMapping, CSV_SIGN_STYLES } from './csv/mapping';
export type { CsvMapping, CsvColumnMapping, CsvColumnRef, CsvSignStyle, MappingProblem } from './csv/mapping';
export type { CsvLayoutDetection, CsvDetectedColumn, CsvSampleRow } from './csv/detection';
export type { CsvColumnRole } from './csv/header';
export type { CsvDelimiter } from './csv/delimiter';
export type { DecimalSeparator, ThousandsSeparator } from './csv/numbers';
export type { CsvRowOrder } from './csv/order';
export { CSV_DATE_FORMAT_NAMES, TWO_DIGIT_YEAR_PIVOT } from './csv/dates';

/**
 * The CSV importer (`id: 'csv'`).
 *
 * - `sniff(text)`: 0 for XML, OFX and MT940; up to 0.95 for a delimited table with a date
 *   and an amount column.
 * - `parse(text, options)`: one statement. `options.currency` is used when the file states
 *   no currency (and must agree when it does); `options.account` names an account the file
 *   does not identify (else the account is named after `options.fileName`);
 *   `options.csvMapping` (a `CsvMapping`) overrides detection and is validated first.
 *
 * @example
 * const r = csvImporter.parse('Date,Description,Amount\n2025-01-02,Rent,-500.00\n', { fileName: 'a.csv', currency: 'EUR' });
 * r.statements[0].entries[0] // { bookingDate: '2025-01-02', amount: -50000, description: 'Rent', status: 'booked', source: { line: 2 } }
 * @example csvImporter.parse('', { fileName: 'e.csv' }).problems[0].message // 'file is empty, expected a header row and data rows'
 */
export const csvImporter: StatementImporter = {
  id: 'csv',
  sniff(text: string): number {
    return sniffCsv(text);
  },
  parse(text: string, options: ImportOptions): ImportResult {
    return readCsvStatement(text, options).result;
  },
};
