/**
 * How amounts, shares and dates read in the plain sentences of reports, scenario
 * comparisons and runway summaries: English, digit groups of three with commas, the
 * currency's own number of decimals (ISO 4217), dates as "31 Jan 2027". Pure and
 * locale-free, so the same input always gives the same text (Intl output varies between
 * runtimes).
 */
import { parseIsoDate, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import { exponentOf, formatMinor } from '../core/money';

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/**
 * Minor units as grouped major units with the currency code.
 * @param minor rounded to a whole minor unit first (simulation means are fractional).
 * @throws EngineError UNKNOWN_CURRENCY for a code outside ISO 4217.
 * @example formatAmount(-215000, 'EUR') // '-2,150.00 EUR'
 * @example formatAmount(1234567, 'JPY', { code: false }) // '1,234,567'
 */
export function formatAmount(minor: number, currency: string, options: { readonly code?: boolean } = {}): string {
  const exponent = exponentOf(currency);
  const plain = formatMinor(Math.round(minor) || 0, exponent);
  const negative = plain.startsWith('-');
  const digits = negative ? plain.slice(1) : plain;
  const point = digits.indexOf('.');
  const whole = point < 0 ? digits : digits.slice(0, point);
  const fraction = point < 0 ? '' : digits.slice(point);
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ',');
  const text = (negative ? '-' : '') + grouped + fraction;
  return options.code === false ? text : `${text} ${currency}`;
}

/**
 * Minor units as whole major units with digit groups, for summary tables where cents are
 * noise (expected values, quantiles): "22,101".
 * @throws EngineError UNKNOWN_CURRENCY for a code outside ISO 4217.
 * @example formatWhole(2210149, 'EUR') // '22,101'
 */
export function formatWhole(minor: number, currency: string): string {
  const unit = 10 ** exponentOf(currency);
  return formatAmount(Math.round(minor / unit) * unit, currency, { code: false }).replace(/\.\d+$/, '');
}

/**
 * A probability as a percentage: whole percent from 1% up, one decimal below (so a small
 * but real risk does not read as 0%), "0%" only for exactly zero.
 * @throws EngineError INVALID_ARGUMENT outside [0, 1].
 * @example formatPercent(0.0712) // '7%'
 * @example formatPercent(0.004) // '0.4%'
 */
export function formatPercent(p: number): string {
  if (!(p >= 0 && p <= 1)) throw new EngineError('INVALID_ARGUMENT', `a probability must be in [0, 1], got ${p}`);
  if (p === 0) return '0%';
  if (p === 1) return '100%';
  const pct = p * 100;
  if (pct < 1) return `${Math.max(0.1, Math.round(pct * 10) / 10).toFixed(1)}%`;
  if (pct > 99) return `${Math.min(99.9, Math.round(pct * 10) / 10).toFixed(1)}%`;
  return `${Math.round(pct)}%`;
}

/**
 * A Monte Carlo standard error in percentage points with one decimal ("0.4%"), at least
 * "0.1%" when it is not zero.
 * @example formatPercentError(0.00218) // '0.2%'
 */
export function formatPercentError(se: number): string {
  if (!(se >= 0 && Number.isFinite(se))) throw new EngineError('INVALID_ARGUMENT', `not a standard error: ${se}`);
  if (se === 0) return '0.0%';
  return `${Math.max(0.1, Math.round(se * 1000) / 10).toFixed(1)}%`;
}

/**
 * A calendar date as "31 Jan 2027".
 * @throws EngineError INVALID_DATE for text that is not a YYYY-MM-DD date.
 * @example formatDate('2027-01-31') // '31 Jan 2027'
 */
export function formatDate(date: CalendarDate): string {
  const p = parseIsoDate(date);
  if (!p) throw new EngineError('INVALID_DATE', `not a calendar date (YYYY-MM-DD): "${date}"`);
  return `${p.day} ${MONTHS[p.month - 1]} ${p.year}`;
}

/**
 * A calendar date without its year, for tables whose dates are close together: "31 Jan".
 * @throws EngineError INVALID_DATE for text that is not a YYYY-MM-DD date.
 * @example formatShortDate('2027-01-31') // '31 Jan'
 */
export function formatShortDate(date: CalendarDate): string {
  return formatDate(date).replace(/ \d+$/, '');
}

/**
 * A number of weeks with one decimal ("6.1 weeks", "1 week").
 * @example formatWeeks(43 / 7) // '6.1 weeks'
 */
export function formatWeeks(weeks: number): string {
  const rounded = Math.round(weeks * 10) / 10;
  const text = Number.isInteger(rounded) ? String(rounded) : rounded.toFixed(1);
  return `${text} ${rounded === 1 ? 'week' : 'weeks'}`;
}

/**
 * A whole count with digit groups ("5,000").
 * @example formatCount(12500) // '12,500'
 */
export function formatCount(n: number): string {
  return String(Math.round(n)).replace(/\B(?=(\d{3})+(?!\d))/g, ',');
}
