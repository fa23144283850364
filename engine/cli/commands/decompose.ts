/**
 * `ebbline decompose <statement files...> [--account NAME|ID] [--currency CODE]
 * [--format text|json]` (DESIGN.md section 5): the recurring flows found and, for the other
 * inflows and outflows, trend, weekly, calendar-monthly and yearly components with their
 * diagnostics, as plain words or as the `ebbline.decompose/1` JSON document. Scope as in
 * `forecast`; the history runs to the last statement date.
 */
import { EngineError } from '../../core/errors';
import { decomposeHistory } from '../../forecast/decomposeHistory';
import { decomposeToJson } from '../../forecast/decomposeJson';
import { decomposeText } from '../decomposeText';
import { loadScope, scopeHistory, scopeOptions } from '../statementScope';
import type { CliCommand, CliContext, CliOutcome, ParsedArgs } from '../types';

/** The `decompose` command. */
export const decomposeCommand: CliCommand = {
  name: 'decompose',
  summary: 'show the patterns in statement files: recurring flows, trend, weekly, monthly and yearly rhythm',
  usage: 'ebbline decompose <statement files...> [--account NAME|ID] [--currency CODE] [--format text|json]',
  positionalName: 'statement file',
  minPositionals: 1,
  options: [
    {
      name: 'account',
      value: 'NAME|ID',
      description: 'one account (default: all accounts of the one currency combined)',
    },
    { name: 'currency', value: 'CODE', description: 'ISO 4217 currency for statements that state none (CSV)' },
    { name: 'format', value: 'FORMAT', choices: ['text', 'json'], description: 'output format (default text)' },
  ],
  async run(args: ParsedArgs, context: CliContext): Promise<CliOutcome> {
    const loaded = await loadScope(args.positionals, context, scopeOptions(args));
    if (!loaded.ok) return { exitCode: 2, stdout: '', stderr: loaded.problems.join('\n') + '\n', writes: [] };
    const history = scopeHistory(loaded.value, undefined);
    if (!history.ok) return { exitCode: 2, stdout: '', stderr: history.problems.join('\n') + '\n', writes: [] };
    let patterns;
    try {
      patterns = decomposeHistory(history.value);
    } catch (error) {
      if (error instanceof EngineError && error.code === 'NOT_ENOUGH_DATA') {
        return { exitCode: 2, stdout: '', stderr: `ebbline decompose: ${error.message}\n`, writes: [] };
      }
      throw error;
    }
    const stdout =
      args.options.format === 'json'
        ? JSON.stringify(decomposeToJson(patterns, [], loaded.value.notes), null, 2) + '\n'
        : decomposeText(patterns, loaded.value.description, loaded.value.notes);
    return { exitCode: 0, stdout, stderr: '', writes: [] };
  },
};
