/**
 * `ebbline forecast <statement files...> [--horizon 90] [--paths 5000] [--seed N]
 * [--as-of YYYY-MM-DD] [--threshold 0] [--account NAME|ID] [--currency CODE]
 * [--plan plan.json] [--format text|json] [--out FILE]` (DESIGN.md section 5).
 *
 * Scope: all accounts of the statements' single currency combined, or the account
 * `--account` names; mixed currencies without `--account` are refused. `--as-of` defaults
 * to the last statement date and must lie within the statements' days. `--threshold` is a
 * decimal amount in the account currency with at most its minor-unit digits. Bounds:
 * horizon 1..730 days, paths 100..100,000, seed 0..4294967295 (default 1).
 *
 * Output: the `ebbline.forecast/1` JSON document (byte-identical for the same inputs and
 * seed) or a text report, on stdout or written to `--out` with a one-line confirmation.
 * Exit codes: 0 success; 2 bad input (one line per problem on stderr); 1 internal error.
 */
import { EngineError } from '../../core/errors';
import { forecastToJson } from '../../forecast/forecastJson';
import { DEFAULT_HORIZON, DEFAULT_PATHS, DEFAULT_SEED, runForecast } from '../../forecast/runForecast';
import { EMPTY_PLAN, type Plan } from '../../plan/plan';
import type { ForecastHistory } from '../../forecast/history';
import type { ForecastResult } from '../../forecast/runForecast';
import { MAX_HORIZON, MAX_PATHS, MIN_PATHS } from '../../simulate/simulateBalances';
import { forecastText } from '../forecastText';
import { loadPlan } from '../loadPlan';
import { amountOption, dateOption, wholeNumberOption, type OptionValue } from '../optionValues';
import { loadScope, scopeHistory, scopeOptions, type StatementScope } from '../statementScope';
import type { CliCommand, CliContext, CliOptionSpec, CliOutcome, ParsedArgs } from '../types';

/** Largest seed: seeds are unsigned 32-bit integers. */
export const MAX_SEED = 0xffffffff;

export function refused(problems: readonly string[]): CliOutcome {
  return { exitCode: 2, stdout: '', stderr: problems.join('\n') + '\n', writes: [] };
}

/** The document or report, printed or written to `--out`. */
export function deliver(content: string, out: string | undefined, what: string): CliOutcome {
  if (out === undefined) return { exitCode: 0, stdout: content, stderr: '', writes: [] };
  return { exitCode: 0, stdout: `Wrote ${what} to ${out}.\n`, stderr: '', writes: [{ path: out, content }] };
}

export interface ForecastRequest {
  readonly scope: StatementScope;
  readonly history: ForecastHistory;
  readonly config: { horizon: number; paths: number; seed: number; threshold: number; plan: Plan };
  readonly out: string | undefined;
}

/**
 * Reads the options `forecast` and `report` share, loads the statements and builds the
 * history. Every problem is collected; any one refuses the run.
 */
export async function readForecastRequest(
  args: ParsedArgs,
  context: CliContext,
): Promise<{ ok: true; value: ForecastRequest } | { ok: false; outcome: CliOutcome }> {
  const options = scopeOptions(args);
  const text = (name: string) => args.options[name] as string | undefined;
  const problems: string[] = [];
  const take = <T>(v: OptionValue<T> | undefined, fallback: T): T => {
    if (v === undefined) return fallback;
    if (!v.ok) {
      problems.push(v.problem);
      return fallback;
    }
    return v.value;
  };
  const option = <T>(name: string, read: (value: string) => OptionValue<T>): OptionValue<T> | undefined => {
    const value = text(name);
    return value === undefined ? undefined : read(value);
  };
  const horizon = take(
    option('horizon', (v) => wholeNumberOption('horizon', v, 1, MAX_HORIZON)),
    DEFAULT_HORIZON,
  );
  const paths = take(
    option('paths', (v) => wholeNumberOption('paths', v, MIN_PATHS, MAX_PATHS)),
    DEFAULT_PATHS,
  );
  const seed = take(
    option('seed', (v) => wholeNumberOption('seed', v, 0, MAX_SEED)),
    DEFAULT_SEED,
  );
  const asOf = take<string | undefined>(
    option('as-of', (v) => dateOption('as-of', v)),
    undefined,
  );
  const thresholdText = text('threshold');
  if (thresholdText !== undefined && !/^[+-]?\d+(\.\d*)?$/.test(thresholdText.trim())) {
    problems.push(`--threshold: "${thresholdText}" is not a decimal number, expected an amount such as 2500.00`);
  }
  const out = text('out');
  if (out !== undefined && out.trim() === '') problems.push('--out: empty, expected a file path');
  if (problems.length > 0) return { ok: false, outcome: refused(problems) };

  const loaded = await loadScope(args.positionals, context, options);
  if (!loaded.ok) return { ok: false, outcome: refused(loaded.problems) };
  const scope = loaded.value;
  const currency = scope.currency;
  const threshold = thresholdText === undefined ? 0 : take(amountOption('threshold', thresholdText, currency), 0);
  const planFile = text('plan');
  let plan = EMPTY_PLAN;
  if (planFile !== undefined) {
    const loadedPlan = await loadPlan(planFile, context.io, currency);
    if (!loadedPlan.ok) problems.push(...loadedPlan.problems);
    else plan = loadedPlan.value;
  }
  const history = scopeHistory(scope, asOf);
  if (!history.ok) problems.push(...history.problems);
  if (problems.length > 0 || !history.ok) return { ok: false, outcome: refused(problems) };
  return { ok: true, value: { scope, history: history.value, config: { horizon, paths, seed, threshold, plan }, out } };
}

/** Runs `compute`, turning too short a history into the documented refusal. */
export function forecastOrRefusal<T>(
  command: string,
  history: ForecastHistory,
  compute: () => T,
): { ok: true; value: T } | { ok: false; outcome: CliOutcome } {
  try {
    return { ok: true, value: compute() };
  } catch (error) {
    if (error instanceof EngineError && error.code === 'NOT_ENOUGH_DATA') {
      return {
        ok: false,
        outcome: refused([
          `ebbline ${command}: ${error.message} (${history.start} to ${history.asOf}), expected more statements`,
        ]),
      };
    }
    throw error;
  }
}

/** The scope's notes first, then the forecast's own. */
export function withScopeNotes(result: ForecastResult, scope: StatementScope): ForecastResult {
  return scope.notes.length > 0 ? { ...result, notes: [...scope.notes, ...result.notes] } : result;
}

/** Options `forecast` and `report` share. */
export const FORECAST_OPTIONS: readonly CliOptionSpec[] = [
  {
    name: 'horizon',
    value: 'DAYS',
    description: `days to forecast after the as-of date, 1..${MAX_HORIZON} (default ${DEFAULT_HORIZON})`,
  },
  {
    name: 'paths',
    value: 'N',
    description: `simulated paths, ${MIN_PATHS}..${MAX_PATHS} (default ${DEFAULT_PATHS})`,
  },
  {
    name: 'seed',
    value: 'N',
    description: `random seed, 0..${MAX_SEED} (default ${DEFAULT_SEED}); same inputs and seed, same output`,
  },
  {
    name: 'as-of',
    value: 'YYYY-MM-DD',
    description: 'last day of history to forecast from (default: the last statement date)',
  },
  {
    name: 'threshold',
    value: 'AMOUNT',
    description: 'balance to stay above, a decimal amount in the account currency (default 0)',
  },
  {
    name: 'account',
    value: 'NAME|ID',
    description: 'forecast one account (default: all accounts of the one currency combined)',
  },
  { name: 'currency', value: 'CODE', description: 'ISO 4217 currency for statements that state none (CSV)' },
  { name: 'plan', value: 'FILE', description: 'planned items and recurring changes (ebbline.plan/1 JSON)' },
];

/** The `forecast` command. */
export const forecastCommand: CliCommand = {
  name: 'forecast',
  summary: 'project balance bands and the chance of a shortfall from statement files',
  usage:
    'ebbline forecast <statement files...> [--horizon 90] [--paths 5000] [--seed N] [--as-of YYYY-MM-DD] ' +
    '[--threshold 0] [--account NAME|ID] [--currency CODE] [--plan plan.json] [--format text|json] [--out FILE]',
  positionalName: 'statement file',
  minPositionals: 1,
  options: [
    ...FORECAST_OPTIONS,
    { name: 'format', value: 'FORMAT', choices: ['text', 'json'], description: 'output format (default text)' },
    { name: 'out', value: 'FILE', description: 'write the output to FILE instead of printing it' },
  ],
  async run(args: ParsedArgs, context: CliContext): Promise<CliOutcome> {
    const request = await readForecastRequest(args, context);
    if (!request.ok) return request.outcome;
    const { scope, history, config, out } = request.value;
    const computed = forecastOrRefusal('forecast', history, () => runForecast(history, config));
    if (!computed.ok) return computed.outcome;
    const result = withScopeNotes(computed.value, scope);
    const json = args.options.format === 'json';
    const content = json
      ? JSON.stringify(forecastToJson(result), null, 2) + '\n'
      : forecastText(result, scope.description);
    return deliver(content, out, `the forecast (${json ? 'JSON' : 'text'})`);
  },
};
