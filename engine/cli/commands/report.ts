/**
 * `ebbline report <statement files...> --out report.html|report.pdf [--title TEXT]
 * [--date YYYY-MM-DD] [forecast options]`: the client report of the app's Report screen,
 * made headless, so a bookkeeper can produce reports for several clients in batch.
 *
 * The report is a self-contained HTML document (engine/report/renderReportHtml.ts): the
 * question answered in one sentence, the fan chart, the 13-week view, shortfall and runway,
 * recurring flows, models and backtest scores, data period and reconciliation, and the
 * caution. For `.pdf` the command hands the HTML to bin/ebbline.mjs, which prints it with
 * a headless Chromium when one is installed (the engine itself starts no programs).
 * With `--plan` the report is that scenario's, beside the base forecast (or beside the
 * plan of `--reference`) on the same seed, as the app's Report screen makes it.
 * The same files, options and seed give the same report.
 */
import { CAUTION } from '../../core/caution';
import { isCalendarDate } from '../../core/dates';
import { renderReportHtml, type ReconciliationSummary } from '../../report/renderReportHtml';
import { runway } from '../../runway/runway';
import { thirteenWeekView } from '../../runway/thirteenWeekView';
import { EMPTY_PLAN } from '../../plan/plan';
import { BASE_FORECAST_NAME, compareScenarios } from '../../scenario/compareScenarios';
import { forecastWithPaths } from '../../scenario/forecastWithPaths';
import { loadPlan } from '../loadPlan';
import type { StatementScope } from '../statementScope';
import type { CliCommand, CliContext, CliOutcome, ParsedArgs } from '../types';
import { FORECAST_OPTIONS, forecastOrRefusal, readForecastRequest, refused, withScopeNotes } from './forecast';

/** Today's calendar date where the command runs (printed on the report only). */
function today(): string {
  const now = new Date();
  const pad = (n: number) => String(n).padStart(2, '0');
  return `${now.getFullYear()}-${pad(now.getMonth() + 1)}-${pad(now.getDate())}`;
}

function reconciliationOf(scope: StatementScope): ReconciliationSummary {
  const byId = new Map(scope.ledger.reconciliation.map((r) => [r.accountId, r]));
  const accounts = scope.accounts.map((a) => {
    const r = byId.get(a.id);
    const status = r?.reconciled === true ? 'reconciled' : r?.reconciled === false ? 'mismatch' : 'not checked';
    return {
      name: a.name,
      status,
      firstMismatch: r?.firstMismatch?.date ?? null,
      note: r?.relative ? 'no stated balance: balances are relative' : null,
    } as const;
  });
  const status = accounts.some((a) => a.status === 'mismatch')
    ? 'mismatch'
    : accounts.every((a) => a.status === 'reconciled')
      ? 'reconciled'
      : 'not checked';
  return { status, accounts };
}

/** A plan file's name without folders and extensions: "clients/kiln.plan.json" → "kiln". */
function planStem(file: string): string {
  const name = file.split(/[\\/]/).pop() ?? file;
  return name.replace(/(\.plan)?\.json$/i, '') || name;
}

/** The `report` command. */
export const reportCommand: CliCommand = {
  name: 'report',
  summary: 'write a client report (HTML or PDF) of the outlook from statement files',
  usage:
    'ebbline report <statement files...> --out report.html|report.pdf [--title TEXT] [--date YYYY-MM-DD] ' +
    '[--horizon 90] [--paths 5000] [--seed N] [--as-of YYYY-MM-DD] [--threshold 0] [--account NAME|ID] ' +
    '[--currency CODE] [--plan plan.json [--reference plan.json]]',
  positionalName: 'statement file',
  minPositionals: 1,
  options: [
    ...FORECAST_OPTIONS,
    { name: 'out', value: 'FILE', description: 'the report file to write, ending in .html or .pdf (required)' },
    { name: 'title', value: 'TEXT', description: 'title printed on the report (default: "Cash outlook")' },
    { name: 'date', value: 'YYYY-MM-DD', description: 'date printed as the day the report was made (default: today)' },
    {
      name: 'reference',
      value: 'FILE',
      description: 'with --plan: the plan the scenario is compared with (default: the base forecast, no changes)',
    },
  ],
  async run(args: ParsedArgs, context: CliContext): Promise<CliOutcome> {
    const out = args.options.out;
    const date = args.options.date;
    const problems: string[] = [];
    if (typeof out !== 'string' || !/\.(html?|pdf)$/i.test(out)) {
      problems.push(
        `--out: ${typeof out === 'string' ? `"${out}"` : 'missing'}, expected a file name ending in .html or .pdf`,
      );
    }
    if (date !== undefined && (typeof date !== 'string' || !isCalendarDate(date))) {
      problems.push(`--date: "${String(date)}" is not a calendar date, expected YYYY-MM-DD`);
    }
    const planFile = args.options.plan;
    const referenceFile = args.options.reference;
    if (referenceFile !== undefined && planFile === undefined) {
      problems.push('--reference: given without --plan, expected --plan FILE for the scenario to compare with it');
    }
    if (problems.length > 0) return refused(problems);
    const request = await readForecastRequest(args, context);
    if (!request.ok) return request.outcome;
    const { scope, history, config } = request.value;
    let reference = { name: BASE_FORECAST_NAME, plan: EMPTY_PLAN };
    if (typeof referenceFile === 'string') {
      const loaded = await loadPlan(referenceFile, context.io, scope.currency);
      if (!loaded.ok) return refused(loaded.problems);
      reference = { name: loaded.value.name ?? planStem(referenceFile), plan: loaded.value };
    }
    const computed = forecastOrRefusal('report', history, () => forecastWithPaths(history, config));
    if (!computed.ok) return computed.outcome;
    const run = computed.value;
    const result = withScopeNotes(run.result, scope);
    // A scenario is reported beside its reference, on the same seed and paths.
    const scenarioName = typeof planFile === 'string' ? (config.plan.name ?? planStem(planFile)) : null;
    let comparison: ReturnType<typeof compareScenarios> | undefined;
    if (scenarioName !== null) {
      const base = forecastOrRefusal('report', history, () =>
        forecastWithPaths(history, { ...config, plan: reference.plan }),
      );
      if (!base.ok) return base.outcome;
      comparison = compareScenarios(base.value.result, [{ name: scenarioName, result: run.result }], {
        baseName: reference.name,
      });
    }
    const title =
      typeof args.options.title === 'string'
        ? args.options.title
        : scenarioName !== null
          ? `Cash outlook: scenario “${scenarioName}”`
          : 'Cash outlook';
    const html = renderReportHtml({
      result,
      title,
      // The report adds the currency itself.
      scopeLabel: scope.description.replace(/ \([A-Z]{3}\)$/, ''),
      generatedOn: typeof date === 'string' ? date : today(),
      reconciliation: reconciliationOf(scope),
      weeks: thirteenWeekView(result, run.components),
      runway: runway({ result, history }),
      ...(comparison ? { comparison } : {}),
    });
    const path = out as string;
    const pdf = /\.pdf$/i.test(path);
    return {
      exitCode: 0,
      stdout: `Wrote the report (${pdf ? 'PDF' : 'HTML'}) to ${path}.\n${CAUTION}\n`,
      stderr: '',
      writes: [{ path, content: html, ...(pdf ? { as: 'pdf' as const } : {}) }],
    };
  },
};
