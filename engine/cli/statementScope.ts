/**
 * What `forecast` and `decompose` share before they compute anything: the statement files
 * read into a ledger, the account scope chosen (DESIGN.md section 5: all accounts of the
 * statements' single currency combined, or the one `--account` names) and the history up
 * to the as-of date. Every refusal is a problem line for stderr and exit code 2.
 */
import { isKnownCurrency } from '../core/currency';
import { toDayNumber, addDays, type CalendarDate } from '../core/dates';
import { EngineError } from '../core/errors';
import { historyFromLedger, type ForecastHistory } from '../forecast/history';
import { buildLedger } from '../ledger/buildLedger';
import { dailySeries, type SeriesScope } from '../ledger/dailySeries';
import { identifierKeys } from '../ledger/normaliseIdentifier';
import type { Ledger, LedgerAccount } from '../ledger/types';
import { loadStatements } from './loadStatements';
import { CliUsageError } from './parseArgs';
import type { CliContext, ParsedArgs } from './types';

/** Either a value or the problem lines that refuse the run. */
export type Checked<T> = { readonly ok: true; readonly value: T } | { readonly ok: false; readonly problems: string[] };

/** The `--account` and `--currency` options as given, checked for form. */
export interface ScopeOptions {
  readonly account?: string;
  readonly currency?: string;
}

/** The chosen accounts and how to name them in reports. */
export interface StatementScope {
  readonly ledger: Ledger;
  readonly scope: SeriesScope;
  readonly accounts: readonly LedgerAccount[];
  /** The one currency of the accounts in scope. */
  readonly currency: string;
  /** e.g. "account NL21HRBL0412345670 (EUR)" or "3 accounts in EUR combined". */
  readonly description: string;
  /** First and last day the statements of the scope cover. */
  readonly firstDate: CalendarDate;
  readonly lastDate: CalendarDate;
  /** Sentences for the report, e.g. an account whose statements end before the others'. */
  readonly notes: readonly string[];
}

/**
 * Reads `--account` and `--currency`.
 * @throws CliUsageError for an empty account or a currency that is not an ISO 4217 code.
 */
export function scopeOptions(args: ParsedArgs): ScopeOptions {
  const currencyOption = args.options.currency as string | undefined;
  const currency = currencyOption?.toUpperCase();
  if (currency !== undefined && !isKnownCurrency(currency)) {
    throw new CliUsageError(`option --currency is "${currencyOption}", expected an ISO 4217 code such as EUR`);
  }
  const account = args.options.account as string | undefined;
  if (account !== undefined && account.trim() === '') {
    throw new CliUsageError('option --account is empty, expected an account name or identifier');
  }
  return { ...(account !== undefined ? { account } : {}), ...(currency !== undefined ? { currency } : {}) };
}

function accountName(a: LedgerAccount): string {
  return a.identifiers[0] ?? a.name;
}

/** Accounts `text` names: by id, by an identifier (IBAN forms compared normalised) or by display name. */
function matchAccounts(accounts: readonly LedgerAccount[], text: string): LedgerAccount[] {
  const keys = new Set(identifierKeys(text));
  const lower = text.trim().toLowerCase();
  return accounts.filter(
    (a) =>
      a.id === text ||
      a.name.toLowerCase() === lower ||
      a.id.toLowerCase() === lower ||
      a.identifiers.some((i) => identifierKeys(i).some((k) => keys.has(k))),
  );
}

/**
 * Chooses the accounts of a ledger: the one `--account` names (narrowed by `--currency`
 * when a name is shared across currencies), else every account when they share one
 * currency. Mixed currencies without `--account` are refused.
 */
export function chooseScope(
  ledger: Ledger,
  options: ScopeOptions,
): Checked<Omit<StatementScope, 'firstDate' | 'lastDate' | 'notes'>> {
  const all = ledger.accounts;
  const listed = all.map((a) => `${accountName(a)} (${a.currency})`).join(', ');
  if (all.length === 0) return { ok: false, problems: ['ebbline: the statements hold no account to work with'] };
  if (options.account !== undefined) {
    let found = matchAccounts(all, options.account);
    if (found.length > 1 && options.currency !== undefined)
      found = found.filter((a) => a.currency === options.currency);
    if (found.length === 0) {
      return {
        ok: false,
        problems: [`--account: "${options.account}" matches no account in the statements, expected one of ${listed}`],
      };
    }
    if (found.length > 1) {
      return {
        ok: false,
        problems: [
          `--account: "${options.account}" matches ${found.length} accounts (${found.map((a) => `${accountName(a)} (${a.currency})`).join(', ')}), expected one; add --currency CODE`,
        ],
      };
    }
    const account = found[0] as LedgerAccount;
    return {
      ok: true,
      value: {
        ledger,
        scope: { accountIds: [account.id] },
        accounts: [account],
        currency: account.currency,
        description: `account ${accountName(account)} (${account.currency})`,
      },
    };
  }
  const currencies = [...new Set(all.map((a) => a.currency))];
  if (currencies.length > 1) {
    const counts = currencies.map((c) => `${c} (${all.filter((a) => a.currency === c).length})`).join(', ');
    return {
      ok: false,
      problems: [
        `--account: missing, and the statements hold accounts in several currencies: ${counts}; expected --account NAME|ID to choose one of ${listed}`,
      ],
    };
  }
  const currency = currencies[0] as string;
  return {
    ok: true,
    value: {
      ledger,
      scope: { currency },
      accounts: all,
      currency,
      description:
        all.length === 1
          ? `account ${accountName(all[0] as LedgerAccount)} (${currency})`
          : `${all.length} accounts in ${currency} combined`,
    },
  };
}

/**
 * Reads the statement files, builds the ledger and chooses the scope.
 * @returns the scope, or the problem lines (unreadable or refused files, no or ambiguous account).
 */
export async function loadScope(
  files: readonly string[],
  context: CliContext,
  options: ScopeOptions,
): Promise<Checked<StatementScope>> {
  const loaded = await loadStatements(files, context, options);
  if (!loaded.ok) return { ok: false, problems: [...loaded.problems] };
  const ledger = buildLedger(loaded.files, options);
  const chosen = chooseScope(ledger, options);
  if (!chosen.ok) return chosen;
  let set;
  try {
    set = dailySeries(ledger, chosen.value.scope);
  } catch (error) {
    if (error instanceof EngineError) return { ok: false, problems: [`ebbline: ${error.message}`] };
    throw error;
  }
  if (set.days === 0) return { ok: false, problems: ['ebbline: the chosen accounts have no entries'] };
  const lastDate = addDays(set.start, set.days - 1);
  const notes: string[] = [];
  for (const account of chosen.value.accounts) {
    const end = ledger.reconciliation.find((r) => r.accountId === account.id)?.lastDate ?? null;
    if (end !== null && end < lastDate) {
      notes.push(
        `The statements of account ${accountName(account)} end on ${end}, before the others' (${lastDate}); its days after that count as days without entries.`,
      );
    }
  }
  return { ok: true, value: { ...chosen.value, firstDate: set.start, lastDate, notes } };
}

/**
 * The history of a scope up to `asOf` (default: the last statement date). An as-of date
 * outside the statements' days is refused: after the last one nothing is known about the
 * days in between, and treating them as days without entries would bias every model.
 */
export function scopeHistory(scope: StatementScope, asOf: CalendarDate | undefined): Checked<ForecastHistory> {
  if (asOf !== undefined) {
    if (toDayNumber(asOf) > toDayNumber(scope.lastDate)) {
      return {
        ok: false,
        problems: [
          `--as-of: "${asOf}" is after the last statement date ${scope.lastDate}, expected a date from ${scope.firstDate} to ${scope.lastDate}`,
        ],
      };
    }
    if (toDayNumber(asOf) < toDayNumber(scope.firstDate)) {
      return {
        ok: false,
        problems: [
          `--as-of: "${asOf}" is before the first statement date ${scope.firstDate}, expected a date from ${scope.firstDate} to ${scope.lastDate}`,
        ],
      };
    }
  }
  return { ok: true, value: historyFromLedger(scope.ledger, scope.scope, asOf) };
}
