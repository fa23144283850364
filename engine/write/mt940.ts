/**
 * Writes statements as SWIFT MT940 (SWIFT User Handbook, Category 9, MT940), the inverse
 * of `engine/import/mt940.ts`: reading the output back gives the same entries and balances,
 * with text in the forms described below.
 *
 * Layout per statement: `:20:` statement id (else `STATEMENTn`), `:25:` account (`BIC/ACCOUNT`
 * when the servicer is a BIC or numeric bank code), `:28C:` the statement's position in the
 * file, `:60F:`, per entry `:61:` and `:86:`, `:62F:`, `:64:`, `:65:`. Lines end with CrLf.
 * Without block wrappers each statement ends with a `-` line; with them each is one message
 * `{1:F01…}{2:I940…N}{4:` … `-}` (sender = the account's BIC when known, else the
 * placeholder address `XXXXXXXXAXXX`; receiver `XXXXXXXXXXXX`).
 *
 * Text (the SWIFT X character set; see `swiftCharset.ts` for the transliteration):
 * - descriptions and counterparties pass through {@link mt940Text}: transliterated, spaces
 *   collapsed, and code-word look-alikes softened (`/NAME/` inside text is written `/Name/`,
 *   a leading `USTD//` as `Ustd//`) so they cannot be mistaken for structure on reading;
 * - field 86 is the description alone, or `/NAME/counterparty/REMI/description` when there
 *   is a counterparty or the description itself starts like a structured field;
 * - references (16x) pass through {@link mt940Reference}; a missing reference is `NONREF`
 *   (so a reference that is literally `NONREF` does not survive the round trip);
 * - the type code is kept when it has the `1!a3!c` shape (S/N/F + 3), else `NMSC`.
 *
 * Field 86 is wrapped by {@link wrapField86} at 65 characters per line. Deviation from
 * 6*65x: text longer than six lines continues on further lines instead of being cut; the
 * importer reads any number of lines.
 *
 * Field 61: entry date only when the booking date differs from the value date; mark C for
 * amounts ≥ 0 and D below. RC/RD are never needed: the entries carry signed amounts and no
 * reversal flag, and a reversal of a debit is written as the credit it is.
 *
 * Balances: the first `opening` becomes 60F, dated, as MT940 does, with the day before when
 * the balance is `at: 'start'` of a day; the last `closing` becomes 62F; an `available` on or
 * before the closing date becomes 64 (the latest one), later ones 65. When one of opening and
 * closing is missing it is derived from the other and the entries. `interim` and `running`
 * balances are not written.
 */
import { addDays, daysBetween } from '../core/dates';
import { EngineError } from '../core/errors';
import { exponentOf } from '../core/money';
import type { ParsedStatement, StatementBalance, StatementEntry } from '../import/types';
import { toSwiftX } from '../import/mt940/swiftCharset';
import { formatEntryDate, formatSwiftDate, MAX_ENTRY_DATE_DISTANCE_DAYS } from '../import/mt940/swiftDate';
import { formatSwiftAmount } from '../import/mt940/swiftAmount';
import {
  collapseSpaces,
  FIELD_86_LINE_LENGTH,
  looksStructured,
  SLASH_CODE_WORDS,
} from '../import/mt940/ownerInformation';

/** Options of {@link writeMt940}. */
export interface WriteMt940Options {
  /** Wrap each statement in SWIFT blocks `{1:…}{2:…}{4:` … `-}` (default false). */
  readonly blockWrappers?: boolean;
}

const CODE_WORD_LOOK_ALIKE = new RegExp(`/(${SLASH_CODE_WORDS.join('|')})(?=/|$)`, 'g');
const BIC = /^[A-Z]{6}[A-Z0-9]{2}([A-Z0-9]{3})?$/;
const TYPE_CODE = /^[SNF][A-Za-z0-9]{3}$/;

/**
 * The text the writer puts into field 86 for a description or counterparty, and so the
 * text the importer reads back: SWIFT X transliteration, whitespace collapsed and trimmed,
 * code-word look-alikes softened (`/NAME/` → `/Name/`, leading `USTD//` → `Ustd//`).
 * @example mt940Text('Café  “Blau” /NAME/ x') // "Cafe 'Blau' /Name/ x"
 */
export function mt940Text(text: string): string {
  const soft = (code: string): string => code.charAt(0) + code.slice(1).toLowerCase();
  return collapseSpaces(toSwiftX(text))
    .replace(CODE_WORD_LOOK_ALIKE, (_m, code: string) => '/' + soft(code))
    .replace(/^USTD\/\//, 'Ustd//');
}

/**
 * A reference as written into a 16x subfield: SWIFT X, spaces collapsed, `//` reduced to
 * `/` (two slashes introduce the servicer reference), cut to 16 characters, no leading or
 * trailing slash.
 * @returns undefined when nothing is left.
 * @example mt940Reference('INV//2025/17 Ü') // 'INV/2025/17 U'
 */
export function mt940Reference(text: string | undefined): string | undefined {
  if (text === undefined) return undefined;
  let s = collapseSpaces(toSwiftX(text)).replace(/\/{2,}/g, '/');
  s = s.slice(0, 16).trim();
  s = s.replace(/^\/+|\/+$/g, '').trim();
  return s === '' ? undefined : s;
}

/**
 * Wraps field 86 text (already in {@link mt940Text} form) into lines of at most 65
 * characters so that the importer's join (no space after a full line, one space after a
 * shorter one) gives the text back. Prefers a full 65-character line; breaks at a space
 * otherwise. No line after the first starts with `:` or `-` (From memory: SWIFT Standards
 * MT General Information — a line of field content must not start with a colon or hyphen);
 * when a space before the offending character is kept at the start of the next line, the
 * text is unchanged. Only a run of more than 64 characters without a space that must be
 * cut before `:` or `-` gets a space inserted (the one lossy case).
 * @example wrapField86('a'.repeat(70)).map((line) => line.length) // [65, 5]
 */
export function wrapField86(text: string): string[] {
  const width = FIELD_86_LINE_LENGTH;
  const lines: string[] = [];
  const bad = (ch: string | undefined): boolean => ch === ':' || ch === '-';
  let rest = text;
  while (rest.length > width) {
    if (!bad(rest.charAt(width))) {
      lines.push(rest.slice(0, width));
      rest = rest.slice(width);
      continue;
    }
    const space = rest.lastIndexOf(' ', width - 1);
    if (space >= 1) {
      lines.push(rest.slice(0, space));
      rest = rest.slice(bad(rest.charAt(space + 1)) ? space : space + 1);
      continue;
    }
    let cut = width - 1;
    while (cut >= 1 && bad(rest.charAt(cut))) cut--;
    if (cut >= 1) {
      lines.push(rest.slice(0, cut));
      rest = rest.slice(cut);
    } else {
      lines.push(rest.slice(0, width));
      rest = '.' + rest.slice(width + 1);
    }
  }
  if (rest !== '') lines.push(rest);
  return lines;
}

function field86(entry: StatementEntry): string[] {
  const description = mt940Text(entry.description);
  const counterparty = entry.counterparty !== undefined ? mt940Text(entry.counterparty) : '';
  let text: string;
  if (counterparty === '' && !looksStructured(description)) {
    text = description;
  } else {
    text = (counterparty !== '' ? `/NAME/${counterparty}` : '') + (description !== '' ? `/REMI/${description}` : '');
    if (text.endsWith('/')) text += '/';
  }
  if (text === '') return [];
  const lines = wrapField86(text);
  return lines.map((line, i) => (i === 0 ? `:86:${line}` : line));
}

function balanceText(amount: number, date: string, currency: string): string {
  return `${amount < 0 ? 'D' : 'C'}${formatSwiftDate(date)}${currency}${formatSwiftAmount(Math.abs(amount), currency)}`;
}

function statementLine(entry: StatementEntry, currency: string): string {
  const valueDate = entry.valueDate ?? entry.bookingDate;
  const apart = Math.abs(daysBetween(valueDate, entry.bookingDate));
  if (apart > MAX_ENTRY_DATE_DISTANCE_DAYS) {
    throw new EngineError(
      'INVALID_ARGUMENT',
      `booking date ${entry.bookingDate} is ${apart} days from value date ${valueDate}; field 61 can express at most ${MAX_ENTRY_DATE_DISTANCE_DAYS}`,
    );
  }
  const entryDate = entry.bookingDate !== valueDate ? formatEntryDate(entry.bookingDate) : '';
  const mark = entry.amount < 0 ? 'D' : 'C';
  const type = entry.typeCode !== undefined && TYPE_CODE.test(entry.typeCode) ? entry.typeCode : 'NMSC';
  const reference = mt940Reference(entry.reference) ?? 'NONREF';
  const bankRef = mt940Reference(entry.bankRef);
  return (
    `:61:${formatSwiftDate(valueDate)}${entryDate}${mark}${formatSwiftAmount(Math.abs(entry.amount), currency)}` +
    `${type}${reference}${bankRef !== undefined ? `//${bankRef}` : ''}`
  );
}

function accountText(statement: ParsedStatement, index: number): string {
  const raw = statement.account.identifier ?? statement.account.name;
  const identifier = raw !== undefined ? collapseSpaces(toSwiftX(raw)).replace(/^\/+/, '') : '';
  if (identifier === '') {
    throw new EngineError('INVALID_ARGUMENT', `statement ${index + 1} has no account identifier or name for field 25`);
  }
  const servicer = statement.account.servicer;
  const withServicer =
    servicer !== undefined && (BIC.test(servicer) || /^\d{3,11}$/.test(servicer))
      ? `${servicer}/${identifier}`
      : identifier;
  return (withServicer.length <= 35 ? withServicer : identifier).slice(0, 35);
}

interface DatedAmount {
  readonly date: string;
  readonly amount: number;
}

/** End-of-day date a balance holds at (an opening at the start of D holds at the end of D − 1). */
function endOfDay(balance: StatementBalance): string {
  return balance.at === 'start' ? addDays(balance.date, -1) : balance.date;
}

function statementBalances(statement: ParsedStatement, index: number): { opening: DatedAmount; closing: DatedAmount } {
  const opening = statement.balances.find((b) => b.kind === 'opening');
  const closing = [...statement.balances].reverse().find((b) => b.kind === 'closing');
  const net = statement.entries.reduce((sum, e) => sum + e.amount, 0);
  const dates = statement.entries.map((e) => e.bookingDate).sort();
  const first = dates[0];
  const last = dates[dates.length - 1];
  if (opening && closing) {
    return { opening: { date: endOfDay(opening), amount: opening.amount }, closing: closing };
  }
  if (opening) {
    const openingEnd = endOfDay(opening);
    const closingDate = last !== undefined && last > openingEnd ? last : openingEnd;
    return {
      opening: { date: openingEnd, amount: opening.amount },
      closing: { date: closingDate, amount: opening.amount + net },
    };
  }
  if (closing) {
    const openingDate = first !== undefined ? addDays(first, -1) : addDays(closing.date, -1);
    return { opening: { date: openingDate, amount: closing.amount - net }, closing: closing };
  }
  throw new EngineError(
    'INVALID_ARGUMENT',
    `statement ${index + 1} has neither an opening nor a closing balance; MT940 needs both (fields 60a and 62a)`,
  );
}

function wrapperHeader(statement: ParsedStatement): string {
  const servicer = statement.account.servicer;
  const sender =
    servicer !== undefined && BIC.test(servicer)
      ? `${servicer.slice(0, 8)}A${servicer.length === 11 ? servicer.slice(8) : 'XXX'}`
      : 'XXXXXXXXAXXX';
  return `{1:F01${sender}0000000000}{2:I940XXXXXXXXXXXXN}{4:`;
}

function statementLines(statement: ParsedStatement, index: number): string[] {
  const currency = statement.currency;
  exponentOf(currency);
  const { opening, closing } = statementBalances(statement, index);
  const lines = [
    `:20:${mt940Reference(statement.statementId) ?? `STATEMENT${index + 1}`}`,
    `:25:${accountText(statement, index)}`,
    `:28C:${(index % 99999) + 1}`,
    `:60F:${balanceText(opening.amount, opening.date, currency)}`,
  ];
  for (const entry of statement.entries) {
    lines.push(statementLine(entry, currency));
    for (const line of field86(entry)) lines.push(line);
  }
  lines.push(`:62F:${balanceText(closing.amount, closing.date, currency)}`);
  const available = statement.balances.filter((b) => b.kind === 'available');
  const closingAvailable = available.filter((b) => b.date <= closing.date).pop();
  if (closingAvailable) lines.push(`:64:${balanceText(closingAvailable.amount, closingAvailable.date, currency)}`);
  const forward = available
    .filter((b) => b.date > closing.date)
    .sort((a, b) => (a.date < b.date ? -1 : a.date > b.date ? 1 : 0));
  for (const b of forward) lines.push(`:65:${balanceText(b.amount, b.date, currency)}`);
  return lines;
}

/**
 * Writes statements as one MT940 file (rules in the module comment).
 *
 * @throws EngineError UNKNOWN_CURRENCY when a statement's currency is not ISO 4217;
 *   INVALID_ARGUMENT when a statement has no account identifier or name, no opening and no
 *   closing balance, or an entry whose booking and value dates are more than 182 days apart;
 *   INVALID_DATE for dates outside 1980–2079 (two-digit years); INVALID_AMOUNT for amounts
 *   longer than 15 characters.
 * @example
 * writeMt940([{ account: { identifier: 'GB82WEST12345698765432' }, currency: 'EUR', entries: [],
 *   balances: [{ kind: 'closing', date: '2025-01-31', at: 'end', amount: 0, source: {} }] }])
 * // ':20:STATEMENT1\r\n:25:GB82WEST12345698765432\r\n:28C:1\r\n:60F:C250130EUR0,00\r\n:62F:C250131EUR0,00\r\n-\r\n'
 */
export function writeMt940(statements: readonly ParsedStatement[], options: WriteMt940Options = {}): string {
  const out: string[] = [];
  statements.forEach((statement, index) => {
    if (options.blockWrappers) out.push(wrapperHeader(statement));
    for (const line of statementLines(statement, index)) out.push(line);
    out.push(options.blockWrappers ? '-}' : '-');
  });
  return out.map((line) => `${line}\r\n`).join('');
}
