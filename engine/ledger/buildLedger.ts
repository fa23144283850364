/**
 * Builds the ledger from importer results: matches accounts across files, removes entries
 * repeated by overlapping files, collects balance anchors and reconciles them.
 *
 * Accounts: a statement's identifier (IBAN / account number, normalised by
 * engine/ledger/normaliseIdentifier.ts) and currency pick the account; a statement without
 * identifier goes to `options.account`, else to its own name, else to an account named after
 * its file (base name). Duplicates: engine/ledger/duplicateIndex.ts (bank ids first, then
 * content fingerprints that keep genuinely repeated transactions). Files are taken in the
 * order given: "earlier" means earlier in that list. Pending entries are left out and
 * reported as notices. Balances: engine/ledger/reconcileAccount.ts.
 *
 * Complexity: O(n log n) for n entries.
 */
import { toDayNumber } from '../core/dates';
import { EngineError } from '../core/errors';
import { exponentOf, formatMinor } from '../core/money';
import { hasErrors } from '../import/types';
import type { AccountKind, ImportProblem, ImportResult, ParsedStatement, StatementEntry } from '../import/types';
import {
  createDuplicateIndex,
  findDuplicateColumns,
  keepFile,
  lastFileOccurrences,
  usableBankRef,
  type CandidateColumns,
} from './duplicateIndex';
import { entryFingerprint, lastFingerprintHash } from './fingerprint';
import { identifierKeys, normaliseIdentifier } from './normaliseIdentifier';
import { anchorEndDay, reconcileAccount } from './reconcileAccount';
import { checkStatement, statementBalances } from './statementCheck';
import type {
  BalanceAnchor,
  FileAccountReport,
  Ledger,
  LedgerAccount,
  LedgerFileReport,
  LedgerTransaction,
  StatementCheck,
} from './types';

/** One imported file as the ledger takes it. */
export interface LedgerInputFile {
  readonly file: string;
  readonly result: ImportResult;
}

/** Choices for statements that do not say everything themselves. */
export interface BuildLedgerOptions {
  /** Account (name or identifier) for statements without an account identifier. */
  readonly account?: string;
  /** Currency for statements that state none. */
  readonly currency?: string;
}

interface MutableAccount {
  id: string;
  name: string;
  currency: string;
  identifiers: string[];
  kind: AccountKind;
  kindStated: boolean;
  order: number;
}

interface FileAccumulator {
  accountId: string;
  currency: string;
  from: string | null;
  to: string | null;
  entries: number;
  duplicates: number;
  pending: number;
  net: number;
  /** (first day, statement index, opening) of the earliest statement, (last day, index, closing) of the latest. */
  earliest: { day: number; opening: number | null } | null;
  latest: { day: number; closing: number | null } | null;
}

/**
 * The kept transaction: the entry's own fields copied one by one (an object spread of a
 * dozen fields is several times slower in V8 and dominated the ledger's time on 100,000
 * entries), optional fields only when present. The shapes statements usually give are
 * written as whole literals: adding the optional fields one by one would give each such
 * transaction a separate property store, about twice the time. Keys keep one order.
 */
function ledgerTransaction(
  entry: StatementEntry,
  id: string,
  account: MutableAccount,
  fingerprint: string,
  sourceFile: string,
  occurrence: number,
): LedgerTransaction {
  const { bookingDate, amount, description, status, source, valueDate, counterparty, reference, bankRef, typeCode } =
    entry;
  const accountId = account.id;
  const currency = account.currency;
  const shape =
    (valueDate !== undefined ? 1 : 0) |
    (counterparty !== undefined ? 2 : 0) |
    (reference !== undefined ? 4 : 0) |
    (bankRef !== undefined ? 8 : 0) |
    (typeCode !== undefined ? 16 : 0);
  // prettier-ignore
  switch (shape) {
    case 0:
      return { bookingDate, amount, description, status, source, id, accountId, currency, fingerprint, sourceFile, occurrence };
    case 2:
      return { bookingDate, amount, description, status, source, id, accountId, currency, fingerprint, sourceFile, occurrence,
        counterparty };
    case 3:
      return { bookingDate, amount, description, status, source, id, accountId, currency, fingerprint, sourceFile, occurrence,
        valueDate, counterparty };
    case 25:
      return { bookingDate, amount, description, status, source, id, accountId, currency, fingerprint, sourceFile, occurrence,
        valueDate, bankRef, typeCode };
    case 27:
      return { bookingDate, amount, description, status, source, id, accountId, currency, fingerprint, sourceFile, occurrence,
        valueDate, counterparty, bankRef, typeCode };
    case 31:
      return { bookingDate, amount, description, status, source, id, accountId, currency, fingerprint, sourceFile, occurrence,
        valueDate, counterparty, reference, bankRef, typeCode };
    default: {
      const t: { -readonly [K in keyof LedgerTransaction]: LedgerTransaction[K] } = {
        bookingDate, amount, description, status, source, id, accountId, currency, fingerprint, sourceFile, occurrence,
      };
      if (valueDate !== undefined) t.valueDate = valueDate;
      if (counterparty !== undefined) t.counterparty = counterparty;
      if (reference !== undefined) t.reference = reference;
      if (bankRef !== undefined) t.bankRef = bankRef;
      if (typeCode !== undefined) t.typeCode = typeCode;
      return t;
    }
  }
}

/**
 * The kept transactions ordered by account (in order of appearance), booking day, then the
 * order they were found in. Statements list their entries by date, so the order usually
 * holds already and one pass confirms it; otherwise a stable sort on one numeric key per
 * transaction (account and day packed together). O(n), or O(n log n) when out of order.
 */
function sortedTransactions(kept: LedgerTransaction[], accountOrder: Int32Array, day: Int32Array): LedgerTransaction[] {
  const n = kept.length;
  let sorted = true;
  for (let i = 1; i < n && sorted; i++) {
    const a = accountOrder[i - 1] as number;
    const b = accountOrder[i] as number;
    sorted = a < b || (a === b && (day[i - 1] as number) <= (day[i] as number));
  }
  if (sorted) return kept;
  // Day numbers of years 1–9999 lie in [-719162, 2932896]: shifted, they fit below 2^22.
  const key = new Float64Array(n);
  for (let i = 0; i < n; i++) key[i] = (accountOrder[i] as number) * 4_194_304 + (day[i] as number) + 719_162;
  const order = Array.from({ length: n }, (_, i) => i);
  order.sort((a, b) => (key[a] as number) - (key[b] as number)); // stable: ties keep found order
  return order.map((i) => kept[i] as LedgerTransaction);
}

function groupBy<T>(items: readonly T[], key: (item: T) => string): Map<string, T[]> {
  const groups = new Map<string, T[]>();
  for (const item of items) {
    const k = key(item);
    const list = groups.get(k);
    if (list) list.push(item);
    else groups.set(k, [item]);
  }
  return groups;
}

function baseName(file: string): string {
  const parts = file.split(/[\\/]/);
  return parts[parts.length - 1] || file;
}

function statementSpan(statement: ParsedStatement): { first: number; last: number } | null {
  let first = Number.POSITIVE_INFINITY;
  let last = Number.NEGATIVE_INFINITY;
  const see = (date: string | undefined) => {
    if (date === undefined) return;
    const d = toDayNumber(date);
    if (d < first) first = d;
    if (d > last) last = d;
  };
  see(statement.from);
  see(statement.to);
  if (statement.from === undefined || statement.to === undefined) {
    for (const e of statement.entries) see(e.bookingDate);
    for (const b of statement.balances) if (b.kind !== 'available') see(b.date);
  }
  return Number.isFinite(first) ? { first, last } : null;
}

function minDate(a: string | null, b: string | null): string | null {
  if (a === null) return b;
  if (b === null) return a;
  return a < b ? a : b;
}

function maxDate(a: string | null, b: string | null): string | null {
  if (a === null) return b;
  if (b === null) return a;
  return a > b ? a : b;
}

/**
 * Builds a ledger from importer results, in the order given.
 *
 * @param files importer results; none may carry an `error` problem (an import is
 *   all-or-nothing: the caller refuses the run before building a ledger).
 * @throws EngineError INVALID_ARGUMENT for a result with errors or a statement without a
 *   currency when `options.currency` is not given; UNKNOWN_CURRENCY for a code outside
 *   ISO 4217; INVALID_DATE / INVALID_AMOUNT for entries an importer should have refused.
 * @example
 * const ledger = buildLedger([{ file: 'jan.xml', result }]);
 * ledger.reconciliation[0].reconciled // true when the stated balances agree
 */
export function buildLedger(files: readonly LedgerInputFile[], options: BuildLedgerOptions = {}): Ledger {
  for (const { file, result } of files) {
    if (hasErrors(result)) {
      throw new EngineError('INVALID_ARGUMENT', `${file}: has errors; an import with errors cannot build a ledger`);
    }
  }
  const accounts: MutableAccount[] = [];
  const byKey = new Map<string, MutableAccount>();
  const usedIds = new Set<string>();
  const index = createDuplicateIndex();
  // Kept transactions in the order found, with their account order and booking day.
  let totalEntries = 0;
  for (const { result } of files) for (const statement of result.statements) totalEntries += statement.entries.length;
  const kept: LedgerTransaction[] = [];
  const keptAccount = new Int32Array(totalEntries);
  const keptDay = new Int32Array(totalEntries);
  let lastDate: string | undefined;
  let lastDay = 0;
  const anchors: { a: BalanceAnchor; account: number; end: number; seq: number }[] = [];
  const anchorKeys = new Set<string>();
  const statements: StatementCheck[] = [];
  const fileReports: LedgerFileReport[] = [];

  const newAccount = (preferredId: string, currency: string, name: string, kind: AccountKind | undefined) => {
    let id = preferredId;
    if (usedIds.has(id)) id = `${preferredId} ${currency}`;
    for (let n = 2; usedIds.has(id); n++) id = `${preferredId} ${currency} ${n}`;
    usedIds.add(id);
    const account: MutableAccount = {
      id,
      name,
      currency,
      identifiers: [],
      kind: kind ?? 'current',
      kindStated: kind !== undefined,
      order: accounts.length,
    };
    accounts.push(account);
    return account;
  };

  const resolveAccount = (statement: ParsedStatement, file: string, currency: string): MutableAccount => {
    const identifier = statement.account.identifier?.trim();
    const label = identifier ? undefined : (options.account ?? statement.account.name ?? baseName(file));
    const keys = identifierKeys(identifier ?? (label as string));
    let account: MutableAccount | undefined;
    for (const k of keys) {
      account = byKey.get(`${k}|${currency}`);
      if (account) break;
    }
    if (!account) {
      account = identifier
        ? newAccount(
            normaliseIdentifier(identifier) || identifier,
            currency,
            statement.account.name ?? normaliseIdentifier(identifier),
            statement.account.kind,
          )
        : newAccount(label as string, currency, label as string, statement.account.kind);
    }
    for (const k of keys) byKey.set(`${k}|${currency}`, account);
    if (identifier) {
      const normal = normaliseIdentifier(identifier);
      if (normal !== '' && !account.identifiers.includes(normal)) account.identifiers.push(normal);
    }
    if (!account.kindStated && statement.account.kind !== undefined) {
      account.kind = statement.account.kind;
      account.kindStated = true;
    }
    return account;
  };

  let seq = 0;
  for (let fileIndex = 0; fileIndex < files.length; fileIndex++) {
    const { file, result } = files[fileIndex] as LedgerInputFile;
    const perAccount = new Map<string, FileAccumulator>();
    const notices: ImportProblem[] = [];
    // The booked entries of the file as parallel arrays (no record object per entry): what
    // duplicate detection needs, then what the kept transaction needs.
    // Sized to the file's entries up front: no growing (and no discarded copies of) arrays of
    // 100,000 slots; trimmed to the booked ones afterwards.
    let entryCount = 0;
    for (const statement of result.statements) entryCount += statement.entries.length;
    const accountIds = new Array<string>(entryCount);
    const fingerprints = new Array<string>(entryCount);
    const refs = new Array<string | undefined>(entryCount);
    const bookedEntries = new Array<StatementEntry>(entryCount);
    const bookedAccounts = new Array<MutableAccount>(entryCount);
    const bookedTotals = new Array<FileAccumulator>(entryCount);
    const bookedDays = new Int32Array(entryCount);
    const hashes = new Int32Array(entryCount);
    let booked = 0;

    result.statements.forEach((statement, statementIndex) => {
      const currency = statement.currency || options.currency;
      if (!currency) {
        throw new EngineError('INVALID_ARGUMENT', `${file}: statement ${statementIndex + 1} states no currency`);
      }
      const exponent = exponentOf(currency);
      const account = resolveAccount(statement, file, currency);
      const stated = statementBalances(statement);
      statements.push(checkStatement(file, statementIndex, account.id, statement, stated));

      let acc = perAccount.get(account.id);
      if (!acc) {
        acc = {
          accountId: account.id,
          currency,
          from: null,
          to: null,
          entries: 0,
          duplicates: 0,
          pending: 0,
          net: 0,
          earliest: null,
          latest: null,
        };
        perAccount.set(account.id, acc);
      }
      const span = statementSpan(statement);
      const { opening, closing } = stated;
      if (span) {
        if (acc.earliest === null || span.first < acc.earliest.day) acc.earliest = { day: span.first, opening };
        if (acc.latest === null || span.last >= acc.latest.day) acc.latest = { day: span.last, closing };
      }
      acc.from = minDate(acc.from, statement.from ?? null);
      acc.to = maxDate(acc.to, statement.to ?? null);

      for (const balance of statement.balances) {
        if (!Number.isSafeInteger(balance.amount)) {
          throw new EngineError(
            'INVALID_AMOUNT',
            `${file}: balance of ${balance.date} is not a whole number of minor units`,
          );
        }
        const a: BalanceAnchor = {
          accountId: account.id,
          date: balance.date,
          at: balance.at,
          amount: balance.amount,
          kind: balance.kind,
          sourceFile: file,
          source: balance.source,
        };
        const key = `${a.accountId}|${a.date}|${a.at}|${a.kind}|${a.amount}`;
        if (anchorKeys.has(key)) continue;
        anchorKeys.add(key);
        anchors.push({ a, account: account.order, end: anchorEndDay(a), seq: seq++ });
      }

      const entries = statement.entries;
      let boundsDate: string | undefined;
      for (let k = 0; k < entries.length; k++) {
        const entry = entries[k] as StatementEntry;
        if (!Number.isSafeInteger(entry.amount)) {
          throw new EngineError(
            'INVALID_AMOUNT',
            `${file}: entry of ${entry.bookingDate} is not a whole number of minor units`,
          );
        }
        // Throws INVALID_DATE for a date an importer let through. Entries come in runs of one
        // day, so the last conversion is reused while the date repeats.
        if (entry.bookingDate !== lastDate) {
          lastDay = toDayNumber(entry.bookingDate);
          lastDate = entry.bookingDate;
        }
        // The bounds change only when the date does (reset per statement, whose own from/to were just applied).
        if (entry.status === 'booked' && entry.bookingDate !== boundsDate) {
          boundsDate = entry.bookingDate;
          if (acc.from === null || entry.bookingDate < acc.from) acc.from = entry.bookingDate;
          if (acc.to === null || entry.bookingDate > acc.to) acc.to = entry.bookingDate;
        }
        if (entry.status !== 'booked') {
          acc.pending++;
          notices.push({
            file,
            ...(entry.source.line !== undefined ? { line: entry.source.line } : {}),
            ...(entry.source.element !== undefined ? { element: entry.source.element } : {}),
            message: `pending entry of ${entry.bookingDate} (${formatMinor(entry.amount, exponent)} ${currency}) left out: only booked entries count`,
            severity: 'notice',
          });
          continue;
        }
        acc.net += entry.amount;
        const fingerprint = entryFingerprint(entry);
        accountIds[booked] = account.id;
        fingerprints[booked] = fingerprint;
        hashes[booked] = lastFingerprintHash();
        refs[booked] = entry.bankRef === undefined ? undefined : usableBankRef(entry.bankRef);
        bookedEntries[booked] = entry;
        bookedAccounts[booked] = account;
        bookedTotals[booked] = acc;
        bookedDays[booked] = lastDay;
        booked++;
      }
    });
    accountIds.length = booked;
    fingerprints.length = booked;
    refs.length = booked;

    // The stable id of kept candidate i, made once (keepFile asks for it first, then the transaction).
    const ids: (string | undefined)[] = new Array<string | undefined>(accountIds.length);
    const idOf = (i: number, occurrence: number): string =>
      (ids[i] ??= `${accountIds[i] as string}|${fingerprints[i] as string}|${occurrence}`);
    const candidates: CandidateColumns = { accountIds, fingerprints, refs };
    const duplicateOf = findDuplicateColumns(index, candidates);
    // The index serves later files only: the last file's entries are counted, not recorded.
    const occurrenceOf =
      fileIndex === files.length - 1
        ? lastFileOccurrences(index, candidates, duplicateOf, hashes)
        : keepFile(index, candidates, duplicateOf, (i, occurrence) => idOf(i, occurrence));
    for (let i = 0; i < accountIds.length; i++) {
      const acc = bookedTotals[i] as FileAccumulator;
      const occurrence = occurrenceOf[i] as number;
      if (occurrence === 0) {
        acc.duplicates++;
        continue;
      }
      acc.entries++;
      const account = bookedAccounts[i] as MutableAccount;
      const entry = bookedEntries[i] as StatementEntry;
      keptAccount[kept.length] = account.order;
      keptDay[kept.length] = bookedDays[i] as number;
      kept.push(ledgerTransaction(entry, idOf(i, occurrence), account, fingerprints[i] as string, file, occurrence));
    }

    const accountReports: FileAccountReport[] = [...perAccount.values()].map((acc) => ({
      accountId: acc.accountId,
      currency: acc.currency,
      from: acc.from,
      to: acc.to,
      entries: acc.entries,
      duplicates: acc.duplicates,
      pending: acc.pending,
      opening: acc.earliest?.opening ?? null,
      closing: acc.latest?.closing ?? null,
      net: acc.net,
    }));
    fileReports.push({
      file,
      format: result.format,
      accounts: accountReports,
      problems: [...result.problems, ...notices],
    });
  }

  const txs = sortedTransactions(kept, keptAccount, keptDay);
  anchors.sort((x, y) => x.account - y.account || x.end - y.end || x.seq - y.seq);
  const ledgerAccounts: LedgerAccount[] = accounts.map((a) => ({
    id: a.id,
    name: a.name,
    currency: a.currency,
    identifiers: [...a.identifiers],
    kind: a.kind,
  }));
  const anchorList = anchors.map((x) => x.a);
  const txByAccount = groupBy(txs, (t) => t.accountId);
  const anchorsByAccount = groupBy(anchorList, (a) => a.accountId);
  const reconciliation = ledgerAccounts.map((account) =>
    reconcileAccount(account.id, txByAccount.get(account.id) ?? [], anchorsByAccount.get(account.id) ?? []),
  );
  return {
    accounts: ledgerAccounts,
    transactions: txs,
    anchors: anchorList,
    files: fileReports,
    reconciliation,
    statements,
  };
}
