/**
 * Amount cells: decimal comma or point, thousands separators (`.` `,` space, no-break
 * spaces U+00A0 and U+202F, apostrophe), signs written as a leading `-` or `+`, a trailing
 * minus, parentheses or a `CR`/`DR` suffix, and currency symbols or ISO codes around the
 * number. Conversion is exact: digits go straight to integer minor units, no floating point
 * fractions.
 */
import { isKnownCurrency } from '../../core/currency';
import { formatMinor } from '../../core/money';

/** The decimal separator of a file. */
export type DecimalSeparator = ',' | '.';

/** Thousands separators a mapping or layout may name; '' means no grouping. */
export const THOUSANDS_SEPARATORS = ['', '.', ',', ' ', '\u00a0', '\u202f', "'"] as const;

/** One of `THOUSANDS_SEPARATORS`. */
export type ThousandsSeparator = (typeof THOUSANDS_SEPARATORS)[number];

/** How a file writes its numbers. `thousands` undefined: any grouping character but the decimal one. */
export interface CsvNumberFormat {
  readonly decimal: DecimalSeparator;
  readonly thousands?: ThousandsSeparator;
}

/** What one look at an amount cell found (shared object, overwritten by the next call). */
export interface AmountInspection {
  /** False when the cell is not shaped like an amount at all. */
  ok: boolean;
  /** 0 nothing, 1 decimal comma, 2 decimal point, 3 maybe decimal comma, 4 maybe decimal point. */
  evidence: 0 | 1 | 2 | 3 | 4;
  /** ISO code or the code of an unambiguous symbol (€ EUR, £ GBP) written in the cell, or ''. */
  currency: string;
  parentheses: boolean;
  trailingMinus: boolean;
  /** The grouping character seen, or ''. */
  thousands: string;
}

const inspection: AmountInspection = {
  ok: false,
  evidence: 0,
  currency: '',
  parentheses: false,
  trailingMinus: false,
  thousands: '',
};

// Affixes of the cell being read, set by readAffixes.
let bodyStart = 0;
let bodyEnd = 0;
let negative = false;
let positive = false;
let parentheses = false;
let trailingMinus = false;
let currency = '';
let affixProblem = '';

function isBlank(c: number): boolean {
  return c === 0x20 || c === 0x09 || c === 0xa0 || c === 0x202f || c === 0x2009;
}

function isDigit(c: number): boolean {
  return c >= 0x30 && c <= 0x39;
}

function isLetter(c: number): boolean {
  return (c >= 0x41 && c <= 0x5a) || (c >= 0x61 && c <= 0x7a);
}

/** Currency symbols tolerated beside a number; € and £ also state the currency. */
function symbolCurrency(c: number): string | undefined {
  switch (c) {
    case 0x20ac:
      return 'EUR';
    case 0xa3:
      return 'GBP';
    case 0x24: // $
    case 0xa5: // ¥
    case 0x20b9: // ₹
    case 0x20ba: // ₺
    case 0x20a9: // ₩
    case 0x20bd: // ₽
    case 0x20a3: // ₣
      return '';
    default:
      return undefined;
  }
}

function markNegative(): boolean {
  if (negative || positive) {
    affixProblem = 'has more than one sign, expected one sign like -12.50, (12.50), 12.50- or 12.50 DR';
    return false;
  }
  negative = true;
  return true;
}

function takeLetters(word: string): boolean {
  const upper = word.toUpperCase();
  if (upper === 'DR' || upper === 'CR') {
    if (upper === 'DR') return markNegative();
    if (negative || positive) return markNegative();
    positive = true;
    return true;
  }
  if (upper === 'KR' || upper === 'FR') return true;
  if (word.length === 3) {
    if (!isKnownCurrency(upper)) {
      affixProblem = `has "${word}" beside the number, which is not an ISO 4217 currency code, expected a code like EUR`;
      return false;
    }
    if (currency !== '' && currency !== upper) {
      affixProblem = `names two currencies (${currency} and ${upper}), expected one`;
      return false;
    }
    currency = upper;
    return true;
  }
  affixProblem = 'is not a number';
  return false;
}

/** Strips signs, brackets, symbols and codes from both ends of text[from, to); false on a bad cell. */
function readAffixes(text: string, from: number, to: number): boolean {
  let i = from;
  let j = to;
  negative = false;
  positive = false;
  parentheses = false;
  trailingMinus = false;
  currency = '';
  affixProblem = '';
  let open = false;
  let close = false;
  while (i < j) {
    const c = text.charCodeAt(i);
    if (isBlank(c)) i++;
    else if (c === 0x28) {
      if (open) break;
      open = true;
      i++;
    } else if (c === 0x2d || c === 0x2212) {
      if (!markNegative()) return false;
      i++;
    } else if (c === 0x2b) {
      if (negative || positive) return markNegative();
      positive = true;
      i++;
    } else if (isLetter(c)) {
      let k = i;
      while (k < j && isLetter(text.charCodeAt(k))) k++;
      if (!takeLetters(text.slice(i, k))) return false;
      i = k;
    } else {
      const s = symbolCurrency(c);
      if (s === undefined) break;
      if (s !== '' && !takeLetters(s)) return false;
      i++;
    }
  }
  while (j > i) {
    const c = text.charCodeAt(j - 1);
    if (isBlank(c)) j--;
    else if (c === 0x29) {
      if (close) break;
      close = true;
      j--;
    } else if (c === 0x2d || c === 0x2212) {
      if (!markNegative()) return false;
      trailingMinus = true;
      j--;
    } else if (c === 0x2b) {
      if (negative || positive) return markNegative();
      positive = true;
      j--;
    } else if (isLetter(c)) {
      let k = j;
      while (k > i && isLetter(text.charCodeAt(k - 1))) k--;
      if (!takeLetters(text.slice(k, j))) return false;
      j = k;
    } else {
      const s = symbolCurrency(c);
      if (s === undefined) break;
      if (s !== '' && !takeLetters(s)) return false;
      j--;
    }
  }
  if (open !== close) {
    affixProblem = 'has an unmatched parenthesis, expected (12.50) for a negative amount';
    return false;
  }
  if (open) {
    if (!markNegative()) return false;
    parentheses = true;
  }
  bodyStart = i;
  bodyEnd = j;
  if (i >= j) {
    affixProblem = 'is not a number';
    return false;
  }
  return true;
}

function isGroupChar(c: number): boolean {
  return c === 0x2e || c === 0x2c || c === 0x27 || c === 0x2019 || isBlank(c);
}

/** Space-like and apostrophe-like characters each count as one grouping character. */
function groupClass(c: number): number {
  if (isBlank(c)) return 0x20;
  if (c === 0x2019) return 0x27;
  return c;
}

/**
 * Looks at an amount cell without knowing the file's number format: is it shaped like an
 * amount, which decimal separator does it reveal, which currency does it name.
 * `1.234,56` reveals a decimal comma; `1,234` (one separator, three digits after it, one to
 * three before) could be either and only counts as a hint.
 *
 * `start`/`end` look at a span of `text` without cutting it out.
 *
 * @example inspectAmount('1.234,56 EUR').evidence // 1
 * @example inspectAmount('1,234').evidence // 3
 */
export function inspectAmount(text: string, start = 0, end = text.length): AmountInspection {
  const r = inspection;
  resetInspection(r);
  if (!readAffixes(text, start, end)) return r;
  inspectBody(text, r);
  return r;
}

function resetInspection(r: AmountInspection): void {
  r.ok = false;
  r.evidence = 0;
  r.currency = '';
  r.parentheses = false;
  r.trailingMinus = false;
  r.thousands = '';
}

/** `inspectAmount` after `readAffixes` succeeded: the body between the affixes. */
function inspectBody(text: string, r: AmountInspection): void {
  r.currency = currency;
  r.parentheses = parentheses;
  r.trailingMinus = trailingMinus;
  let points = 0;
  let commas = 0;
  let lastPoint = -1;
  let lastComma = -1;
  let other = 0;
  for (let k = bodyStart; k < bodyEnd; k++) {
    const c = text.charCodeAt(k);
    if (isDigit(c)) continue;
    if (c === 0x2e) {
      points++;
      lastPoint = k;
    } else if (c === 0x2c) {
      commas++;
      lastComma = k;
    } else if (isGroupChar(c)) {
      other++;
      if (r.thousands === '') r.thousands = text[k] as string;
    } else return;
  }
  if (!isDigit(text.charCodeAt(bodyEnd - 1))) return;
  r.ok = true;
  if (points > 0 && commas > 0) {
    const decimalIsComma = lastComma > lastPoint;
    if ((decimalIsComma ? commas : points) === 1) {
      r.evidence = decimalIsComma ? 1 : 2;
      if (r.thousands === '') r.thousands = decimalIsComma ? '.' : ',';
    }
    return;
  }
  if (points + commas === 0) return;
  const isComma = commas > 0;
  const count = isComma ? commas : points;
  const last = isComma ? lastComma : lastPoint;
  if (count > 1) {
    r.evidence = isComma ? 2 : 1;
    if (r.thousands === '') r.thousands = isComma ? ',' : '.';
    return;
  }
  const after = bodyEnd - last - 1;
  const before = last - bodyStart;
  const leadingZero = before === 1 && text.charCodeAt(bodyStart) === 0x30;
  if (after === 3 && before >= 1 && before <= 3 && other === 0 && !leadingZero) r.evidence = isComma ? 3 : 4;
  else r.evidence = isComma ? 1 : 2;
}

function example(format: CsvNumberFormat): string {
  return format.decimal === ',' ? '-1.234,56' : '-1,234.56';
}

/**
 * Reads an amount cell as signed integer minor units.
 *
 * @param exponent the currency's minor-unit exponent (EUR 2, JPY 0, KWD 3).
 * @param currencyCode named in the message when the cell has too many decimals.
 * @param start, end a span of `text` to read (default: all of it), so a cell need not be cut out.
 * @returns the minor units, or a string saying what is wrong with the cell
 *   ("has 3 decimals, expected at most 2 for EUR"); extra decimals that are all zero are
 *   accepted, as `parsePlainDecimal` in engine/core/money.ts does.
 * @example readAmount('-1.234,56', { decimal: ',' }, 2, 'EUR') // -123456
 * @example readAmount('(12.50)', { decimal: '.' }, 2, 'USD') // -1250
 * @example readAmount("1'234.5-", { decimal: '.' }, 2, 'CHF') // -123450
 */
export function readAmount(
  text: string,
  format: CsvNumberFormat,
  exponent: number,
  currencyCode: string,
  start = 0,
  end = text.length,
): number | string {
  if (!readAffixes(text, start, end)) return affixMessage(format);
  return readBody(text, format, exponent, currencyCode);
}

function affixMessage(format: CsvNumberFormat): string {
  return affixProblem === 'is not a number'
    ? `is not a number, expected a number like ${example(format)}`
    : affixProblem;
}

/**
 * `inspectAmount` and `readAmount` of one cell with a single pass over its affixes: the
 * inspection is written to the shared object `inspectAmount` returns (read it through
 * `lastInspection()`), the minor units (or what is wrong) are returned. For a file's row
 * pass, which needs both the evidence for the number format and the value.
 *
 * @example
 * inspectAndReadAmount('1.234,56', 0, 8, { decimal: ',' }, 2, 'EUR'); // 123456
 * lastInspection().evidence // 1
 */
export function inspectAndReadAmount(
  text: string,
  start: number,
  end: number,
  format: CsvNumberFormat,
  exponent: number,
  currencyCode: string,
): number | string {
  const r = inspection;
  resetInspection(r);
  if (!readAffixes(text, start, end)) return affixMessage(format);
  inspectBody(text, r);
  return readBody(text, format, exponent, currencyCode);
}

/** The inspection `inspectAndReadAmount` (or `inspectAmount`) wrote last. */
export function lastInspection(): AmountInspection {
  return inspection;
}

/** `readAmount` after `readAffixes` succeeded: the body between the affixes. */
function readBody(text: string, format: CsvNumberFormat, exponent: number, currencyCode: string): number | string {
  const dec = format.decimal === ',' ? 0x2c : 0x2e;
  const allowed =
    format.thousands === undefined ? -1 : format.thousands === '' ? -2 : groupClass(format.thousands.charCodeAt(0));
  let decimalAt = -1;
  for (let k = bodyEnd - 1; k >= bodyStart; k--) {
    if (text.charCodeAt(k) === dec) {
      decimalAt = k;
      break;
    }
  }
  const intEnd = decimalAt < 0 ? bodyEnd : decimalAt;
  let whole = 0;
  let groupSep = -1;
  let groupLength = 0;
  let groups = 0;
  let firstGroup = 0;
  for (let k = bodyStart; k < intEnd; k++) {
    const c = text.charCodeAt(k);
    if (isDigit(c)) {
      whole = whole * 10 + (c - 0x30);
      groupLength++;
      continue;
    }
    if (!isGroupChar(c) || c === dec) return `is not a number, expected a number like ${example(format)}`;
    const cls = groupClass(c);
    if (allowed === -2 || (allowed >= 0 && cls !== allowed) || (groupSep >= 0 && cls !== groupSep)) {
      return `is not a number, expected a number like ${example(format)}`;
    }
    if (groups === 0) firstGroup = groupLength;
    else if (groupLength !== 3) return groupingProblem(format);
    if (groupLength === 0) return groupingProblem(format);
    groupSep = cls;
    groups++;
    groupLength = 0;
  }
  if (groups > 0 && (groupLength !== 3 || firstGroup < 1 || firstGroup > 3)) return groupingProblem(format);
  if (decimalAt < 0 && intEnd === bodyStart) return `is not a number, expected a number like ${example(format)}`;
  let fraction = 0;
  let fractionDigits = 0;
  let extraNonZero = false;
  if (decimalAt >= 0) {
    if (decimalAt + 1 >= bodyEnd) return `is not a number, expected a number like ${example(format)}`;
    for (let k = decimalAt + 1; k < bodyEnd; k++) {
      const c = text.charCodeAt(k);
      if (!isDigit(c)) return `is not a number, expected a number like ${example(format)}`;
      fractionDigits++;
      if (fractionDigits <= exponent) fraction = fraction * 10 + (c - 0x30);
      else if (c !== 0x30) extraNonZero = true;
    }
    if (extraNonZero) {
      return `has ${fractionDigits} decimals, expected at most ${exponent} for ${currencyCode}`;
    }
  }
  for (let k = Math.min(fractionDigits, exponent); k < exponent; k++) fraction *= 10;
  const minor = whole * 10 ** exponent + fraction;
  if (!Number.isSafeInteger(minor)) return 'is too large, expected an amount below 2^53 minor units';
  return negative && minor !== 0 ? -minor : minor;
}

function groupingProblem(format: CsvNumberFormat): string {
  const sample = format.decimal === ',' ? '1.234.567,89' : '1,234,567.89';
  return `has digit groups that are not thousands, expected groups of three digits like ${sample}`;
}

/**
 * Formats minor units the way the file writes them (for messages): `-1234,56` in a
 * decimal-comma file.
 *
 * @example formatForMessage(-123456, 2, ',') // '-1234,56'
 */
export function formatForMessage(minor: number, exponent: number, decimal: DecimalSeparator): string {
  const plain = formatMinor(minor, exponent);
  return decimal === ',' ? plain.replace('.', ',') : plain;
}
