/**
 * The forecast's daily figures as CSV (RFC 4180: comma-separated, CRLF line ends, a header
 * row, fields quoted only when they hold a comma, a quote or a line break, quotes
 * doubled). Amounts are in major units with the currency's own decimals and a point
 * (`-1234.50`), probabilities with up to six decimals, dates `YYYY-MM-DD`, so any
 * spreadsheet or script reads the numbers the same way.
 *
 * The caution travels with the data: by default a last record holds it in the first
 * field (the other fields empty, so every record has the same number of fields). A
 * program that wants numbers only can skip records whose first field is not a date, or
 * ask for `{ caution: false }` and show the caution itself.
 */
import { exponentOf, formatMinor } from '../core/money';
import type { ForecastResult } from '../forecast/runForecast';
import { QUANTILE_LEVELS } from '../simulate/types';

/** Header fields, in order. */
export const CSV_COLUMNS = [
  'date',
  'mean',
  'p05',
  'p10',
  'p25',
  'p50',
  'p75',
  'p90',
  'p95',
  'pBelow',
  'pCrossed',
] as const;

/** A field as RFC 4180 wants it. @example csvField('a "b", c') // '"a ""b"", c"' */
export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

function probability(p: number): string {
  return String(Number(p.toFixed(6)));
}

/**
 * @throws EngineError UNKNOWN_CURRENCY when the result's currency is not ISO 4217.
 * @example reportCsv(result).split('\r\n')[0] // 'date,mean,p05,p10,p25,p50,p75,p90,p95,pBelow,pCrossed'
 */
export function reportCsv(result: ForecastResult, options: { readonly caution?: boolean } = {}): string {
  if (QUANTILE_LEVELS.length !== CSV_COLUMNS.length - 4)
    throw new Error('CSV columns out of step with quantile levels');
  const e = exponentOf(result.currency);
  const money = (minor: number) => formatMinor(Math.round(minor) || 0, e);
  const lines = [CSV_COLUMNS.join(',')];
  for (const d of result.daily) {
    lines.push(
      [d.date, money(d.mean), ...d.quantiles.map(money), probability(d.pBelow), probability(d.pCrossed)]
        .map(csvField)
        .join(','),
    );
  }
  if (options.caution !== false) {
    lines.push([csvField(result.caution), ...new Array<string>(CSV_COLUMNS.length - 1).fill('')].join(','));
  }
  return lines.join('\r\n') + '\r\n';
}
