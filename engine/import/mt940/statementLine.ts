/**
 * Field 61, Statement Line: `6!n[4!n]2a[1!a]15d1!a3!c16x[//16x]` on the first line and
 * `[34x]` on an optional second (SWIFT User Handbook, Category 9, MT940, field 61):
 *
 * | subfield | format | meaning |
 * | --- | --- | --- |
 * | 1 | 6!n | value date YYMMDD |
 * | 2 | [4!n] | entry (booking) date MMDD; its year is the one nearest the value date |
 * | 3 | 2a | mark: C credit, D debit, RC reversal of credit (a debit), RD reversal of debit (a credit) |
 * | 4 | [1!a] | funds code, the third letter of the currency, when needed |
 * | 5 | 15d | amount with decimal comma |
 * | 6 | 1!a3!c | transaction type: S, N or F and 3 characters (NTRF, NCHK, S103 …) |
 * | 7 | 16x | reference for the account owner, NONREF when there is none |
 * | 8 | [//16x] | account servicing institution's reference |
 * | 9 | [34x] | supplementary details, second line |
 *
 * The mark and the funds code cannot be confused: a mark is C, D, RC or RD, so after C or D
 * a further letter is the funds code (`CR` = credit, funds code R), and the amount always
 * starts with a digit.
 */
import type { CalendarDate } from '../../core/dates';
import { lineError, lineNotice, type LineProblem } from './lineProblem';
import { parseSwiftDate, resolveEntryDate } from './swiftDate';
import { parseSwiftAmount } from './swiftAmount';
import type { Mt940Field } from './tokenizeMt940';

/** Debit/credit marks of field 61 subfield 3 in MT940. */
export type StatementLineMark = 'C' | 'D' | 'RC' | 'RD';

/** A statement line as read; `amount` is signed from the account holder's view. */
export interface StatementLine {
  readonly valueDate: CalendarDate;
  readonly entryDate?: CalendarDate;
  readonly mark: StatementLineMark;
  readonly fundsCode?: string;
  readonly amount: number;
  readonly typeCode: string;
  /** Subfield 7 as written (NONREF included). */
  readonly ownerReference: string;
  readonly servicerReference?: string;
  readonly supplementary?: string;
}

/** Result of {@link parseStatementLine}: the line unless an error was found, and the problems. */
export interface StatementLineResult {
  readonly statementLine?: StatementLine;
  readonly problems: readonly LineProblem[];
}

/**
 * Signed amount of a mark: credits and reversals of debits add, debits and reversals of
 * credits subtract.
 * @example signedAmount('RD', 500) // 500
 * @example signedAmount('RC', 500) // -500
 */
export function signedAmount(mark: StatementLineMark, minor: number): number {
  if (minor === 0) return 0;
  return mark === 'C' || mark === 'RD' ? minor : -minor;
}

function show(text: string): string {
  return text === '' ? 'nothing' : `"${text}"`;
}

/**
 * Reads one field 61 in the statement's currency. Stops at the first subfield in error and
 * names it.
 * @example parseStatementLine({ tag: '61', line: 7, lines: [{ text: '2501020102D12,5NTRFNONREF', line: 7 }] }, 'EUR').statementLine?.amount // -1250
 * @example parseStatementLine({ tag: '61', line: 7, lines: [{ text: '250102D12.5NTRFNONREF', line: 7 }] }, 'EUR').problems[0]?.message // 'field 61: amount "12.5" uses a point, expected a decimal comma (15d)'
 */
export function parseStatementLine(field: Mt940Field, currency: string): StatementLineResult {
  const first = field.lines[0]?.text ?? '';
  const problems: LineProblem[] = [];
  const fail = (message: string): StatementLineResult => ({
    problems: [...problems, lineError(field.line, `field 61: ${message}`)],
  });

  const valueText = first.slice(0, 6);
  if (!/^\d{6}$/.test(valueText)) {
    return fail(`value date ${show(valueText)} is not 6 digits (subfield 1, 6!n as YYMMDD)`);
  }
  const value = parseSwiftDate(valueText);
  if ('error' in value) return fail(`value date "${valueText}" is not a calendar date (subfield 1, 6!n as YYMMDD)`);
  let pos = 6;

  let entryDate: CalendarDate | undefined;
  if (/\d/.test(first.charAt(pos))) {
    const entryText = first.slice(pos, pos + 4);
    if (!/^\d{4}$/.test(entryText))
      return fail(`entry date ${show(entryText)} is not 4 digits (subfield 2, 4!n as MMDD)`);
    const entry = resolveEntryDate(value.date, entryText);
    if ('error' in entry) return fail(`entry date ${entry.error} (subfield 2, 4!n)`);
    entryDate = entry.date;
    pos += 4;
  }

  let mark: StatementLineMark;
  const two = first.slice(pos, pos + 2);
  if (two === 'RC' || two === 'RD') {
    mark = two;
    pos += 2;
  } else if (two === 'EC' || two === 'ED') {
    return fail(
      `mark "${two}" (expected ${two === 'EC' ? 'credit' : 'debit'}) belongs to interim reports (MT942), not statements; expected C, D, RC or RD (subfield 3, 2a)`,
    );
  } else if (first.charAt(pos) === 'C' || first.charAt(pos) === 'D') {
    mark = first.charAt(pos) as 'C' | 'D';
    pos += 1;
  } else {
    return fail(`debit/credit mark ${show(two)} is not C, D, RC or RD (subfield 3, 2a)`);
  }

  let fundsCode: string | undefined;
  if (/[A-Z]/.test(first.charAt(pos))) {
    fundsCode = first.charAt(pos);
    pos += 1;
    if (fundsCode !== currency.charAt(2)) {
      problems.push(
        lineNotice(
          field.line,
          `field 61: funds code "${fundsCode}" is not the third letter of ${currency} (subfield 4); ignored`,
        ),
      );
    }
  }

  let end = pos;
  while (end < first.length && /[0-9,.]/.test(first.charAt(end))) end++;
  const amountText = first.slice(pos, end);
  if (amountText === '') {
    return fail(
      `amount expected at ${show(first.slice(pos, pos + 10))}: digits with a decimal comma such as 1234,56 (subfield 5, 15d)`,
    );
  }
  const amount = parseSwiftAmount(amountText, currency);
  if ('error' in amount) return fail(amount.error);
  pos = end;

  const typeCode = first.slice(pos, pos + 4);
  if (!/^[SNF][A-Za-z0-9]{3}$/.test(typeCode)) {
    return fail(
      `transaction type ${show(typeCode)} is not S, N or F and 3 letters or digits such as NTRF (subfield 6, 1!a3!c)`,
    );
  }
  pos += 4;

  const tail = first.slice(pos);
  const split = tail.indexOf('//');
  const ownerReference = (split >= 0 ? tail.slice(0, split) : tail).trim();
  if (ownerReference === '') {
    return fail(
      `reference for the account owner is missing after "${typeCode}", expected up to 16 characters, NONREF when there is none (subfield 7, 16x)`,
    );
  }
  if (ownerReference.length > 16) {
    problems.push(
      lineNotice(
        field.line,
        `field 61: reference "${ownerReference}" is longer than 16 characters (subfield 7, 16x); kept in full`,
      ),
    );
  }
  const servicerReference = split >= 0 ? tail.slice(split + 2).trim() : '';
  if (servicerReference.length > 16) {
    problems.push(
      lineNotice(
        field.line,
        `field 61: servicer reference "${servicerReference}" is longer than 16 characters (subfield 8, 16x); kept in full`,
      ),
    );
  }

  const second = field.lines[1];
  const supplementary = second?.text.trim() ?? '';
  if (second && supplementary.length > 34) {
    problems.push(
      lineNotice(
        second.line,
        `field 61: supplementary details are ${supplementary.length} characters, 34x allows 34 (subfield 9); kept in full`,
      ),
    );
  }
  const extra = field.lines[2];
  if (extra) {
    return fail(
      `line ${extra.line} "${extra.text}" is a third line; field 61 has at most two (subfield 9, 34x, is the second)`,
    );
  }

  return {
    statementLine: {
      valueDate: value.date,
      ...(entryDate !== undefined ? { entryDate } : {}),
      mark,
      ...(fundsCode !== undefined ? { fundsCode } : {}),
      amount: signedAmount(mark, amount.minor),
      typeCode,
      ownerReference,
      ...(servicerReference !== '' ? { servicerReference } : {}),
      ...(supplementary !== '' ? { supplementary } : {}),
    },
    problems,
  };
}
