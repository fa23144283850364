/**
 * `ebbline import <statement files...> --check [--account NAME] [--currency CODE]
 * [--format text|json]` (DESIGN.md section 5): reads the files, removes duplicates across
 * them, rebuilds and reconciles every account's balances and reports it, as a table or as
 * JSON schema `ebbline.import/1`.
 *
 * Exit codes: 0 when every file imports and every checkable account reconciles; 2 when a
 * file is refused (nothing is reported as imported then: stdout stays empty, stderr has one
 * line per problem), and also when the statements disagree with each other (a stated
 * balance that the entries do not reach, or a statement whose opening + entries differ from
 * its closing): the report is printed and stderr has one line per disagreement.
 */
import { CAUTION } from '../../core/caution';
import { isKnownCurrency } from '../../core/currency';
import { exponentOf, formatMinor, toMajor } from '../../core/money';
import { buildLedger } from '../../ledger/buildLedger';
import type { Ledger, LedgerAccount } from '../../ledger/types';
import { formatProblem } from '../formatProblem';
import { loadStatements } from '../loadStatements';
import { CliUsageError } from '../parseArgs';
import { textTable } from '../textTable';
import type { CliCommand, CliContext, CliOutcome, ParsedArgs } from '../types';

/** A problem as the JSON report lists it. */
export interface ImportReportProblem {
  readonly severity: 'error' | 'notice';
  readonly line: number | null;
  readonly element: string | null;
  readonly message: string;
}

/** One file and account row of `ebbline.import/1`. Amounts in major units. */
export interface ImportReportFile {
  readonly file: string;
  readonly format: string;
  readonly account: string | null;
  readonly currency: string | null;
  readonly from: string | null;
  readonly to: string | null;
  readonly entries: number;
  readonly duplicates: number;
  readonly opening: number | null;
  readonly closing: number | null;
  readonly net: number;
  readonly problems: readonly ImportReportProblem[];
}

/** The first disagreement of an account, amounts in major units. */
export interface ImportReportMismatch {
  readonly date: string;
  readonly expected: number;
  readonly computed: number;
  readonly difference: number;
  readonly sourceFile: string;
  readonly lastAgreement: string | null;
}

/** One account row of `ebbline.import/1`. */
export interface ImportReportAccount {
  readonly account: string;
  readonly currency: string;
  readonly entries: number;
  /** Rebuilt balance at `closingDate`; null when the account states no balance (relative). */
  readonly closing: number | null;
  readonly closingDate: string | null;
  /** true / false, or null when nothing could be checked (no or only one stated balance). */
  readonly reconciled: boolean | null;
  readonly firstMismatch: ImportReportMismatch | null;
}

/** The JSON document `ebbline import --check --format json` prints. */
export interface ImportReport {
  readonly schema: 'ebbline.import/1';
  readonly files: readonly ImportReportFile[];
  readonly accounts: readonly ImportReportAccount[];
}

/** How an account is named in reports: its first identifier (IBAN / account number), else its name. */
export function accountLabel(account: LedgerAccount): string {
  return account.identifiers[0] ?? account.name;
}

/**
 * The `ebbline.import/1` document of a ledger.
 * @example importReport(ledger).schema // 'ebbline.import/1'
 */
export function importReport(ledger: Ledger): ImportReport {
  const accounts = new Map(ledger.accounts.map((a) => [a.id, a]));
  const major = (minor: number, currency: string) => toMajor(minor, exponentOf(currency));
  const files: ImportReportFile[] = [];
  for (const f of ledger.files) {
    const problems: ImportReportProblem[] = f.problems.map((p) => ({
      severity: p.severity,
      line: p.line ?? null,
      element: p.element ?? null,
      message: p.message,
    }));
    if (f.accounts.length === 0) {
      files.push({
        file: f.file,
        format: f.format,
        account: null,
        currency: null,
        from: null,
        to: null,
        entries: 0,
        duplicates: 0,
        opening: null,
        closing: null,
        net: 0,
        problems,
      });
    }
    for (const a of f.accounts) {
      const account = accounts.get(a.accountId) as LedgerAccount;
      files.push({
        file: f.file,
        format: f.format,
        account: accountLabel(account),
        currency: a.currency,
        from: a.from,
        to: a.to,
        entries: a.entries,
        duplicates: a.duplicates,
        opening: a.opening === null ? null : major(a.opening, a.currency),
        closing: a.closing === null ? null : major(a.closing, a.currency),
        net: major(a.net, a.currency),
        problems,
      });
    }
  }
  const entriesByAccount = new Map<string, number>();
  for (const t of ledger.transactions) entriesByAccount.set(t.accountId, (entriesByAccount.get(t.accountId) ?? 0) + 1);
  const accountRows: ImportReportAccount[] = ledger.accounts.map((account, i) => {
    const r = ledger.reconciliation[i] as Ledger['reconciliation'][number];
    const m = r.firstMismatch;
    return {
      account: accountLabel(account),
      currency: account.currency,
      entries: entriesByAccount.get(account.id) ?? 0,
      closing: r.relative ? null : major(r.closingBalance, account.currency),
      closingDate: r.lastDate,
      reconciled: r.reconciled,
      firstMismatch:
        m === null
          ? null
          : {
              date: m.date,
              expected: major(m.expected, account.currency),
              computed: major(m.computed, account.currency),
              difference: major(m.difference, account.currency),
              sourceFile: m.sourceFile,
              lastAgreement: m.lastAgreement,
            },
    };
  });
  return { schema: 'ebbline.import/1', files, accounts: accountRows };
}

/** One stderr line per disagreement between statements (empty when everything agrees). */
export function disagreementLines(ledger: Ledger): string[] {
  const lines: string[] = [];
  const accounts = new Map(ledger.accounts.map((a) => [a.id, a]));
  for (const s of ledger.statements) {
    if (s.consistent !== false) continue;
    const currency = (accounts.get(s.accountId) as LedgerAccount).currency;
    const e = exponentOf(currency);
    const where = s.statementId !== null ? `statement ${s.statementId}` : `statement ${s.statementIndex + 1}`;
    lines.push(
      formatProblem({
        file: s.file,
        message:
          `${where}: opening ${formatMinor(s.opening as number, e)} + entries ${formatMinor(s.net, e)} = ` +
          `${formatMinor((s.opening as number) + s.net, e)}, but the closing balance is ${formatMinor(s.closing as number, e)} ${currency}; ` +
          'expected opening + entries = closing',
      }),
    );
  }
  ledger.reconciliation.forEach((r, i) => {
    const m = r.firstMismatch;
    if (m === null) return;
    const account = ledger.accounts[i] as LedgerAccount;
    const e = exponentOf(account.currency);
    lines.push(
      formatProblem({
        file: m.sourceFile,
        ...(m.source.line !== undefined ? { line: m.source.line } : {}),
        ...(m.source.element !== undefined ? { element: m.source.element } : {}),
        message:
          `stated ${m.kind} balance ${formatMinor(m.expected, e)} ${account.currency} ` +
          `${m.at === 'start' ? 'at the start of' : 'at the end of'} ${m.date} for account ${accountLabel(account)}, ` +
          `rebuilt ${formatMinor(m.computed, e)} from the statements' entries (difference ${formatMinor(m.difference, e)}` +
          `${m.lastAgreement ? `, last agreement ${m.lastAgreement}` : ''}); expected them to agree`,
      }),
    );
  });
  return lines;
}

function amountCell(value: number | null, currency: string | null): string {
  if (value === null || currency === null) return '-';
  return formatMinor(Math.round(value * 10 ** exponentOf(currency)), exponentOf(currency));
}

function reconciledCell(report: ImportReportAccount, note: string | null): string {
  if (report.reconciled === true) return 'yes';
  if (report.reconciled === null) return note ?? 'nothing to check';
  const m = report.firstMismatch as ImportReportMismatch;
  return (
    `NO: first mismatch ${m.date} in ${m.sourceFile} (stated ${amountCell(m.expected, report.currency)}, ` +
    `rebuilt ${amountCell(m.computed, report.currency)})`
  );
}

/** The readable table form of the report. */
export function importReportText(report: ImportReport, ledger: Ledger): string {
  const fileRows = report.files.map((f) => [
    f.file,
    f.format,
    f.account ?? '-',
    f.currency ?? '-',
    f.from ?? '-',
    f.to ?? '-',
    String(f.entries),
    String(f.duplicates),
    amountCell(f.opening, f.currency),
    amountCell(f.closing, f.currency),
    amountCell(f.net, f.currency),
  ]);
  const out: string[] = [];
  const fileCount = new Set(report.files.map((f) => f.file)).size;
  out.push(
    `Checked ${fileCount} file${fileCount === 1 ? '' : 's'}, ${report.accounts.length} account${report.accounts.length === 1 ? '' : 's'}.`,
  );
  out.push('');
  out.push(
    textTable(
      ['file', 'format', 'account', 'currency', 'from', 'to', 'entries', 'duplicates', 'opening', 'closing', 'net'],
      fileRows,
      ['left', 'left', 'left', 'left', 'left', 'left', 'right', 'right', 'right', 'right', 'right'],
    ),
  );
  const notices: string[] = [];
  const seen = new Set<string>();
  for (const f of report.files) {
    if (seen.has(f.file)) continue;
    seen.add(f.file);
    for (const p of f.problems) {
      notices.push(
        `${p.severity}: ${formatProblem({ file: f.file, message: p.message, ...(p.line !== null ? { line: p.line } : {}), ...(p.element !== null ? { element: p.element } : {}) })}`,
      );
    }
  }
  if (notices.length > 0) out.push('', ...notices);
  out.push('');
  const notes = new Map(ledger.reconciliation.map((r, i) => [i, r.note]));
  out.push(
    textTable(
      ['account', 'currency', 'entries', 'closing', 'as of', 'reconciled'],
      report.accounts.map((a, i) => [
        a.account,
        a.currency,
        String(a.entries),
        amountCell(a.closing, a.currency),
        a.closingDate ?? '-',
        reconciledCell(a, notes.get(i) ?? null),
      ]),
      ['left', 'left', 'right', 'right', 'left', 'left'],
    ),
  );
  const warned = report.accounts.some((a) => a.reconciled !== true) || notices.length > 0;
  if (warned) out.push('', CAUTION);
  return out.join('\n') + '\n';
}

/** The `import` command. */
export const importCommand: CliCommand = {
  name: 'import',
  summary: 'check statement files: formats, duplicates across files, balances reconciled per account',
  usage: 'ebbline import <statement files...> --check [--account NAME] [--currency CODE] [--format text|json]',
  positionalName: 'statement file',
  minPositionals: 1,
  options: [
    { name: 'check', description: 'check the files and report; nothing is stored' },
    { name: 'account', value: 'NAME', description: 'account for statements that name none (CSV)' },
    { name: 'currency', value: 'CODE', description: 'ISO 4217 currency for statements that state none (CSV)' },
    { name: 'format', value: 'FORMAT', choices: ['text', 'json'], description: 'output format (default text)' },
  ],
  async run(args: ParsedArgs, context: CliContext): Promise<CliOutcome> {
    if (args.options.check !== true) {
      throw new CliUsageError('--check is missing: the command line checks statement files (import --check)');
    }
    const currencyOption = args.options.currency as string | undefined;
    const currency = currencyOption?.toUpperCase();
    if (currency !== undefined && !isKnownCurrency(currency)) {
      throw new CliUsageError(`option --currency is "${currencyOption}", expected an ISO 4217 code such as EUR`);
    }
    const account = args.options.account as string | undefined;
    if (account !== undefined && account.trim() === '')
      throw new CliUsageError('option --account is empty, expected a name');
    const options = { ...(account !== undefined ? { account } : {}), ...(currency !== undefined ? { currency } : {}) };
    const loaded = await loadStatements(args.positionals, context, options);
    if (!loaded.ok) return { exitCode: 2, stdout: '', stderr: loaded.problems.join('\n') + '\n', writes: [] };
    const ledger = buildLedger(loaded.files, options);
    const report = importReport(ledger);
    const stdout =
      args.options.format === 'json' ? JSON.stringify(report, null, 2) + '\n' : importReportText(report, ledger);
    const disagreements = disagreementLines(ledger);
    return {
      exitCode: disagreements.length > 0 ? 2 : 0,
      stdout,
      stderr: disagreements.length > 0 ? disagreements.join('\n') + '\n' : '',
      writes: [],
    };
  },
};
