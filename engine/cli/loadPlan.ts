/**
 * Reads the `--plan` file (schema `ebbline.plan/1`, DESIGN.md section 5) and validates it
 * for the forecast's currency. A file that cannot be read, is not UTF-8 JSON or fails
 * validation gives one line per problem: `plan.json: $.items[0].date: found "2026-02-30",
 * expected a calendar date YYYY-MM-DD`, or `plan.json:3: not valid JSON: "," at column 13, …`.
 */
import { validatePlan, type Plan } from '../plan/plan';
import { formatProblem } from './formatProblem';
import { jsonSyntaxError } from './jsonSyntaxError';
import type { Checked } from './statementScope';
import type { CliIo } from './types';

function readFailure(error: unknown): string {
  const code = (error as { code?: unknown } | null)?.code;
  if (code === 'ENOENT') return 'file not found, expected a readable plan file (ebbline.plan/1)';
  if (code === 'EISDIR') return 'is a directory, expected a plan file (ebbline.plan/1)';
  if (code === 'EACCES' || code === 'EPERM') return 'permission denied, expected a readable plan file';
  const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
  return `cannot be read (${message}), expected a readable plan file`;
}

/**
 * Reads, parses and validates a plan file.
 * @example
 * const plan = await loadPlan('plan.json', io, 'EUR');
 * if (!plan.ok) stderr.push(...plan.problems);
 */
export async function loadPlan(file: string, io: CliIo, currency: string): Promise<Checked<Plan>> {
  let bytes: Uint8Array;
  try {
    bytes = await io.readFile(file);
  } catch (error) {
    return { ok: false, problems: [formatProblem({ file, message: readFailure(error) })] };
  }
  let text: string;
  try {
    text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(bytes);
  } catch {
    return { ok: false, problems: [formatProblem({ file, message: 'is not UTF-8 text, expected a JSON plan file' })] };
  }
  const syntax = jsonSyntaxError(text);
  if (syntax !== null) {
    return {
      ok: false,
      problems: [
        formatProblem({
          file,
          line: syntax.line,
          message: `not valid JSON: ${syntax.found} at column ${syntax.column}, expected an ebbline.plan/1 document`,
        }),
      ],
    };
  }
  const doc: unknown = JSON.parse(text.charCodeAt(0) === 0xfeff ? text.slice(1) : text);
  const validation = validatePlan(doc, currency);
  if (!validation.ok) {
    return {
      ok: false,
      problems: validation.problems.map((p) => formatProblem({ file, message: `${p.path}: ${p.message}` })),
    };
  }
  return { ok: true, value: validation.plan };
}
