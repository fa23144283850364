/**
 * The mapping preview: what the CSV importer would decide about a file, without importing it.
 */
import type { ImportOptions } from '../types';
import type { CsvLayoutDetection } from './detection';
import { readCsvStatement } from './read';

/**
 * Detects the layout of a CSV statement: delimiter, header and preamble, the role of each
 * column, date format (or that it is ambiguous), number format, sign style, currency,
 * account, row order, a confidence and the first rows, plus every problem an import would
 * report. `detection.mapping` is the same decision written as an explicit `CsvMapping`:
 * show it, let the user correct it, and pass it back as `options.csvMapping`.
 * Never throws for bad input. O(n).
 *
 * @param options as for an import (`fileName` names the file in problems; `csvMapping`
 *   overrides detection, `currency` is the fallback currency).
 * @example
 * const d = detectCsvLayout('Buchungstag;Betrag\n31.01.2025;-12,50\n', { fileName: 'k.csv', currency: 'EUR' });
 * d.delimiter // ';'
 * d.dateFormat // 'DD.MM.YYYY'
 * d.decimalSeparator // ','
 */
export function detectCsvLayout(text: string, options: ImportOptions): CsvLayoutDetection {
  return readCsvStatement(text, options).detection;
}
