/**
 * Reads and imports the statement files named on a command line, all-or-nothing: the
 * result is either every file imported without an error, or the list of problem lines.
 * Shared by every command that takes statement files (import, forecast, decompose).
 */
import { isKnownCurrency } from '../core/currency';
import { hasErrors } from '../import/types';
import type { LedgerInputFile } from '../ledger/buildLedger';
import { formatProblem } from './formatProblem';
import type { CliContext } from './types';

/** Either every file imported, or the problem lines that refuse the run. */
export type LoadedStatements =
  | { readonly ok: true; readonly files: readonly LedgerInputFile[] }
  | { readonly ok: false; readonly problems: readonly string[] };

/** Options forwarded to the importers. */
export interface LoadOptions {
  readonly account?: string;
  readonly currency?: string;
}

function readFailure(error: unknown): string {
  const code = (error as { code?: unknown } | null)?.code;
  if (code === 'ENOENT') return 'file not found, expected a readable statement file';
  if (code === 'EISDIR') return 'is a directory, expected a statement file';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied, expected a readable statement file';
  const message = error instanceof Error ? error.message : String(error);
  return `cannot be read (${message}), expected a readable statement file`;
}

/**
 * Reads and imports `paths` in order.
 * @example
 * const loaded = await loadStatements(['jan.xml'], context, {});
 * if (!loaded.ok) console.error(loaded.problems.join('\n'));
 */
export async function loadStatements(
  paths: readonly string[],
  context: CliContext,
  options: LoadOptions,
): Promise<LoadedStatements> {
  const problems: string[] = [];
  const files: LedgerInputFile[] = [];
  for (const file of paths) {
    let bytes: Uint8Array;
    try {
      bytes = await context.io.readFile(file);
    } catch (error) {
      problems.push(formatProblem({ file, message: readFailure(error) }));
      continue;
    }
    const result = context.importStatement(bytes, {
      fileName: file,
      ...(options.currency !== undefined ? { currency: options.currency } : {}),
      ...(options.account !== undefined ? { account: options.account } : {}),
    });
    if (result.format === undefined || hasErrors(result)) {
      for (const p of result.problems) if (p.severity === 'error') problems.push(formatProblem(p));
      continue;
    }
    result.statements.forEach((s, i) => {
      const where = result.statements.length > 1 ? ` (statement ${i + 1})` : '';
      if (!s.currency && options.currency === undefined) {
        problems.push(formatProblem({ file, message: `states no currency${where}, expected --currency CODE` }));
      } else if (s.currency && !isKnownCurrency(s.currency)) {
        problems.push(
          formatProblem({
            file,
            message: `currency "${s.currency}"${where} is not an ISO 4217 code, expected e.g. EUR`,
          }),
        );
      }
    });
    files.push({ file, result });
  }
  return problems.length > 0 ? { ok: false, problems } : { ok: true, files };
}
