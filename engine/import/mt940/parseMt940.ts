/**
 * Reads MT940 text into statements: one statement per `:20:` … `:62a:` sequence
 * (SWIFT User Handbook, Category 9, MT940 "Customer Statement Message").
 *
 * Field order within a statement: 20, [21], 25, 28C, 60a, (61 [86])*, 62a, [64], [65]*, [86].
 * 20, 25, 28C, 60a and 62a are mandatory; a missing one is an error (a missing 62a usually
 * means the file was cut short).
 *
 * Balances:
 * - 60F/60M become `opening`. SWIFT dates 60F with the date of the previous statement's
 *   closing balance (its usage rule: 60F equals the previous 62F), so when that date lies
 *   before the first entry's booking date the balance is `at: 'end'` of that day; when it is
 *   on or after it (banks that date it with the first statement day) it is `at: 'start'`.
 *   Without entries the closing date decides the same way.
 * - 62F becomes `closing` at the end of its date; 62M (intermediate closing, the statement
 *   continues in the next message) becomes `interim` at the end of its date.
 * - 64 (closing available) and 65 (forward available) become `available`.
 * All balance fields of one statement must name the same ISO 4217 currency; the entries are
 * read in it.
 *
 * Entries: booking date = entry date when given, else value date; value date = value date;
 * typeCode = subfield 6 (NTRF …); reference = subfield 7 unless NONREF (else field 86's
 * EREF); bankRef = subfield 8; description = field 86 text, then subfield 9.
 */
import { addDays, type CalendarDate } from '../../core/dates';
import { minorUnitExponent } from '../../core/currency';
import { formatMinor } from '../../core/money';
import type { ParsedStatement, StatementBalance, StatementEntry } from '../types';
import { lineError, lineNotice, type LineProblem } from './lineProblem';
import { tokenizeMt940, type Mt940Field, type Mt940FieldLine } from './tokenizeMt940';
import { parseBalanceField, type BalanceValue } from './balanceField';
import { parseAccountIdentification } from './accountIdentification';
import { parseStatementLine } from './statementLine';
import { collapseSpaces, interpretOwnerInformation } from './ownerInformation';

/** Statements found and problems met; when any problem is an error the statements are incomplete. */
export interface Mt940ParseResult {
  readonly statements: readonly ParsedStatement[];
  readonly problems: readonly LineProblem[];
}

/** Fields of MT942 and other statement messages that MT940 readers meet and may skip. */
const SKIPPED_TAGS = new Set(['13', '13D', '34F', '90C', '90D']);
const SINGLE_LINE_TAGS = new Set(['20', '21', '28', '28C', '60F', '60M', '62F', '62M', '64', '65']);

interface BalanceField {
  readonly field: Mt940Field;
  readonly value: BalanceValue;
}

interface LineWithInformation {
  readonly field: Mt940Field;
  readonly information: Mt940FieldLine[];
}

function describe(field: Mt940Field): string {
  return `field ${field.tag} (line ${field.line})`;
}

function fieldText(field: Mt940Field): string {
  return field.lines[0]?.text ?? '';
}

function readBalance(field: Mt940Field | undefined, problems: LineProblem[]): BalanceField | undefined {
  if (!field) return undefined;
  const value = parseBalanceField(fieldText(field));
  if ('error' in value) {
    problems.push(lineError(field.line, `field ${field.tag}: ${value.error}`));
    return undefined;
  }
  return { field, value };
}

/** Reads one `:20:` … group; `problems` collects this statement's problems only. */
function readStatement(fields: readonly Mt940Field[], problems: LineProblem[]): ParsedStatement | undefined {
  const head = fields[0] as Mt940Field;
  const statementId = fieldText(head).trim();
  if (statementId === '') problems.push(lineError(head.line, 'field 20: transaction reference is empty (16x)'));
  else if (statementId.length > 16) {
    problems.push(lineNotice(head.line, `field 20: "${statementId}" is longer than 16 characters (16x); kept in full`));
  }
  const label = `statement "${statementId}" (field 20, line ${head.line})`;

  let account: Mt940Field | undefined;
  let number: Mt940Field | undefined;
  let opening: Mt940Field | undefined;
  let closing: Mt940Field | undefined;
  let available: Mt940Field | undefined;
  const forward: Mt940Field[] = [];
  const lines: LineWithInformation[] = [];
  let previous: Mt940Field = head;

  const duplicate = (first: Mt940Field, again: Mt940Field): void => {
    problems.push(
      lineError(again.line, `field ${again.tag}: appears again in ${label}; ${describe(first)} came first`),
    );
  };

  for (const field of fields.slice(1)) {
    const tag = field.tag;
    if (SINGLE_LINE_TAGS.has(tag) && field.lines.length > 1) {
      const extra = field.lines[1] as Mt940FieldLine;
      problems.push(
        lineError(extra.line, `field ${tag}: unexpected second line "${extra.text}"; the field has one line`),
      );
    }
    if (tag === '21') {
      // Related reference: not needed for a statement.
    } else if (tag.startsWith('25')) {
      if (account) duplicate(account, field);
      else account = field;
      if (field.lines.length > 2) {
        const extra = field.lines[2] as Mt940FieldLine;
        problems.push(
          lineError(extra.line, `field ${tag}: unexpected third line "${extra.text}"; the field has at most two`),
        );
      }
    } else if (tag === '28C' || tag === '28') {
      if (number) duplicate(number, field);
      else number = field;
    } else if (tag === '60F' || tag === '60M') {
      if (opening) duplicate(opening, field);
      else if (lines.length > 0) {
        problems.push(
          lineError(
            field.line,
            `field ${tag}: opening balance after the first statement line (field 61, line ${lines[0]?.field.line}); expected it before`,
          ),
        );
      } else opening = field;
    } else if (tag === '61') {
      if (closing) {
        problems.push(
          lineError(
            field.line,
            `field 61: statement line after the closing balance (${describe(closing)}); expected a new statement starting with field 20`,
          ),
        );
      } else if (!opening) {
        problems.push(
          lineError(field.line, `field 61: statement line before the opening balance; expected field 60F or 60M first`),
        );
      } else lines.push({ field, information: [] });
    } else if (tag === '86') {
      const last = lines[lines.length - 1];
      if (last && (previous.tag === '61' || (previous.tag === '86' && last.information.length > 0)) && !closing) {
        for (const l of field.lines) last.information.push(l);
      }
      // Field 86 after the balances informs about the statement as a whole: not kept.
    } else if (tag === '62F' || tag === '62M') {
      if (closing) duplicate(closing, field);
      else closing = field;
    } else if (tag === '64') {
      if (available) duplicate(available, field);
      else available = field;
    } else if (tag === '65') {
      forward.push(field);
    } else if (tag === '60' || tag === '62') {
      problems.push(
        lineError(field.line, `field ${tag}: balance field needs its option letter, expected :${tag}F: or :${tag}M:`),
      );
    } else if (SKIPPED_TAGS.has(tag)) {
      problems.push(lineNotice(field.line, `field ${tag}: not part of MT940; ignored`));
    } else {
      problems.push(lineNotice(field.line, `field ${tag}: unknown in MT940; ignored`));
    }
    previous = field;
  }

  const missing = (what: string, hint = ''): void => {
    problems.push(lineError(head.line, `${label}: ${what} is missing${hint}`));
  };
  if (!account) missing('field 25 (account identification)');
  if (!number) missing('field 28C (statement number)');
  else if (!/^\d{1,5}(\/\d{1,5})?$/.test(fieldText(number).trim())) {
    problems.push(
      lineNotice(number.line, `field ${number.tag}: "${fieldText(number)}" is not a statement number 5n[/5n]; ignored`),
    );
  }
  if (!opening) missing('field 60F or 60M (opening balance)');
  if (!closing) missing('field 62F or 62M (closing balance)', '; the file may be truncated');

  const accountInfo = account ? parseAccountIdentification(account.lines.map((l) => l.text)) : undefined;
  for (const notice of accountInfo?.notices ?? [])
    problems.push(lineNotice(account?.line ?? head.line, `field 25: ${notice}`));
  if (account && accountInfo?.account.identifier === undefined) {
    problems.push(lineError(account.line, 'field 25: account identification is empty (35x)'));
  }

  const openingBalance = readBalance(opening, problems);
  const closingBalance = readBalance(closing, problems);
  const availableBalance = readBalance(available, problems);
  const forwardBalances = forward.map((f) => readBalance(f, problems)).filter((b) => b !== undefined);
  const all = [openingBalance, closingBalance, availableBalance, ...forwardBalances].filter((b) => b !== undefined);
  const reference = all[0];
  const currency = reference?.value.currency;
  for (const b of all) {
    if (reference && b.value.currency !== reference.value.currency) {
      problems.push(
        lineError(
          b.field.line,
          `field ${b.field.tag}: currency ${b.value.currency} differs from ${reference.value.currency} in ${describe(reference.field)}; one statement has one currency`,
        ),
      );
    }
  }

  const entries: StatementEntry[] = [];
  if (currency !== undefined) {
    for (const { field, information } of lines) {
      const result = parseStatementLine(field, currency);
      problems.push(...result.problems);
      const sl = result.statementLine;
      if (!sl) continue;
      const info = information.length > 0 ? interpretOwnerInformation(information.map((l) => l.text)) : undefined;
      const description = collapseSpaces([info?.description ?? '', sl.supplementary ?? ''].join(' '));
      const ownRef = sl.ownerReference.toUpperCase() === 'NONREF' ? undefined : sl.ownerReference;
      const ref = ownRef ?? info?.reference;
      entries.push({
        bookingDate: sl.entryDate ?? sl.valueDate,
        valueDate: sl.valueDate,
        amount: sl.amount,
        description,
        ...(info?.counterparty !== undefined ? { counterparty: info.counterparty } : {}),
        ...(ref !== undefined ? { reference: ref } : {}),
        ...(sl.servicerReference !== undefined ? { bankRef: sl.servicerReference } : {}),
        status: 'booked',
        typeCode: sl.typeCode,
        source: { line: field.line },
      });
    }
  }

  if (problems.some((p) => p.severity === 'error')) return undefined;
  if (!openingBalance || !closingBalance || currency === undefined || !accountInfo) return undefined;

  const bookingDates = entries.map((e) => e.bookingDate).sort();
  const firstBooking: CalendarDate | undefined = bookingDates[0];
  const lastBooking: CalendarDate | undefined = bookingDates[bookingDates.length - 1];
  const openingDate = openingBalance.value.date;
  const compareWith = firstBooking ?? closingBalance.value.date;
  const openingAt: 'start' | 'end' = openingDate < compareWith ? 'end' : 'start';

  const balances: StatementBalance[] = [
    {
      kind: 'opening',
      date: openingDate,
      at: openingAt,
      amount: openingBalance.value.amount,
      source: { line: openingBalance.field.line },
    },
    {
      kind: closingBalance.field.tag === '62F' ? 'closing' : 'interim',
      date: closingBalance.value.date,
      at: 'end',
      amount: closingBalance.value.amount,
      source: { line: closingBalance.field.line },
    },
    ...[availableBalance, ...forwardBalances]
      .filter((b) => b !== undefined)
      .map((b): StatementBalance => ({
        kind: 'available',
        date: b.value.date,
        at: 'end',
        amount: b.value.amount,
        source: { line: b.field.line },
      })),
  ];

  const net = entries.reduce((sum, e) => sum + e.amount, 0);
  if (openingBalance.value.amount + net !== closingBalance.value.amount) {
    const exponent = minorUnitExponent(currency) ?? 2;
    const money = (minor: number): string => `${formatMinor(minor, exponent)} ${currency}`;
    problems.push(
      lineNotice(
        closingBalance.field.line,
        `field ${closingBalance.field.tag}: opening balance ${money(openingBalance.value.amount)} plus the entries (${money(net)}) is ${money(openingBalance.value.amount + net)}, but the closing balance is ${money(closingBalance.value.amount)}`,
      ),
    );
  }

  const openingDay = openingAt === 'end' ? addDays(openingDate, 1) : openingDate;
  const from = firstBooking !== undefined && firstBooking < openingDay ? firstBooking : openingDay;
  const to =
    lastBooking !== undefined && lastBooking > closingBalance.value.date ? lastBooking : closingBalance.value.date;

  return {
    account: accountInfo.account,
    currency,
    ...(statementId !== '' ? { statementId } : {}),
    from,
    to,
    entries,
    balances,
  };
}

/**
 * Parses MT940 text. Never throws; every problem names its line.
 * @example parseMt940(':20:X\n:25:GB82WEST12345698765432\n:28C:1\n:60F:C250131EUR0,\n:62F:C250131EUR0,').statements.length // 1
 * @example parseMt940('hello').problems[0]?.severity // 'error'
 */
export function parseMt940(text: string): Mt940ParseResult {
  const tokens = tokenizeMt940(text);
  const problems: LineProblem[] = [...tokens.problems];
  const statements: ParsedStatement[] = [];
  if (tokens.fields.length === 0) {
    problems.push(
      lineError(
        1,
        'no MT940 fields found: expected lines starting with field tags such as :20:, :25:, :28C:, :60F:, :61:, :62F:',
      ),
    );
    return { statements, problems };
  }
  let group: Mt940Field[] | undefined;
  const groups: Mt940Field[][] = [];
  let orphans = 0;
  for (const field of tokens.fields) {
    if (field.tag === '20') {
      group = [field];
      groups.push(group);
    } else if (group) {
      group.push(field);
    } else {
      if (orphans === 0) {
        problems.push(
          lineError(
            field.line,
            `field ${field.tag}: comes before any field 20; expected each statement to start with :20: (transaction reference)`,
          ),
        );
      }
      orphans++;
    }
  }
  for (const fields of groups) {
    const own: LineProblem[] = [];
    const statement = readStatement(fields, own);
    if (statement) statements.push(statement);
    for (const p of own) problems.push(p);
  }
  problems.sort((a, b) => a.line - b.line);
  return { statements, problems };
}
