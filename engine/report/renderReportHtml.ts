/**
 * The client report: one complete, self-contained, printable HTML document (inline CSS
 * with a print stylesheet, an inline SVG fan chart, no script, no external resource, a
 * Content-Security-Policy that forbids loading anything) answering the report's question
 * in one sentence, then the chart, the 13-week cash view, shortfall and runway, the main
 * recurring flows, the models and their backtest scores, the data period and
 * reconciliation, the scenario comparison when given, and the caution, prominently at the
 * top and again at the end.
 *
 * Plain data in, text out: the same input gives the same bytes (the date printed is the
 * `generatedOn` passed in; the engine never reads a clock). Every text from statements,
 * plans or people is escaped.
 */
import { CAUTION } from '../core/caution';
import { type CalendarDate } from '../core/dates';
import type { ForecastResult } from '../forecast/runForecast';
import { describeRunway, describeSimulatedRunway } from '../runway/describeRunway';
import type { RunwayEstimate } from '../runway/runway';
import { runwayFromResult } from '../runway/runwayFromResult';
import { thirteenWeekView, type ThirteenWeekView } from '../runway/thirteenWeekView';
import type { ScenarioComparison } from '../scenario/compareScenarios';
import { describeCadence } from '../recurring/cadence';
import { describeModels } from './describeModels';
import { escapeHtml } from './escapeHtml';
import { fanChartSvg, REPORT_COLOURS } from './fanChartSvg';
import {
  formatAmount,
  formatCount,
  formatDate,
  formatPercent,
  formatPercentError,
  formatShortDate,
  formatWeeks,
  formatWhole,
} from './plainFormat';
import { REPORT_CSS } from './reportStyles';

/** Reconciliation status as the ledger reports it, passed in as plain data. */
export type ReconciliationStatus = 'reconciled' | 'mismatch' | 'not checked';

export interface ReconciliationSummary {
  readonly status: ReconciliationStatus;
  readonly accounts: readonly {
    readonly name: string;
    readonly status: ReconciliationStatus;
    /** First day a stated balance disagrees with the transactions. */
    readonly firstMismatch?: CalendarDate | null;
    readonly note?: string | null;
  }[];
}

export interface ReportInput {
  readonly result: ForecastResult;
  /** The document's title, e.g. "Cash outlook for Tessellate Ceramics". */
  readonly title: string;
  /** What the balance is of, e.g. "the business current account". */
  readonly scopeLabel: string;
  /** The day the report is made (printed; never read from a clock inside the engine). */
  readonly generatedOn: CalendarDate;
  readonly reconciliation: ReconciliationSummary;
  /** The 13-week view with the inflow/outflow split; default: thirteenWeekView(result), net only. */
  readonly weeks?: ThirteenWeekView;
  /** Runway with the 13-week burn; default: the simulated range from the result alone. */
  readonly runway?: RunwayEstimate;
  readonly comparison?: ScenarioComparison;
  /** Most recurring flows listed (default 8, largest first). */
  readonly maxRecurring?: number;
}

const e = escapeHtml;

function table(
  head: readonly string[],
  rows: readonly (readonly string[])[],
  numeric: readonly boolean[],
  rowClass?: (i: number) => string,
): string {
  const cls = (i: number) => (numeric[i] ? ' class="num"' : '');
  return [
    '<table>',
    `<thead><tr>${head.map((h, i) => `<th scope="col"${cls(i)}>${h}</th>`).join('')}</tr></thead>`,
    '<tbody>',
    ...rows.map((r, k) => {
      const c = rowClass?.(k);
      return `<tr${c ? ` class="${c}"` : ''}>${r.map((v, i) => `<td${cls(i)}>${v}</td>`).join('')}</tr>`;
    }),
    '</tbody>',
    '</table>',
  ].join('\n');
}

/**
 * The report's one-sentence answer (plain text, unescaped).
 * @example reportQuestion(result, 'the business account')
 *   // 'Estimated chance that the balance of the business account falls below 0.00 EUR within the next 90 days: 7% (± 0.4%)'
 */
export function reportQuestion(result: ForecastResult, scopeLabel: string): string {
  const line = formatAmount(result.threshold, result.currency);
  const p = result.shortfall.probability;
  const detail =
    p === 0
      ? `none of the ${formatCount(result.paths)} simulated paths`
      : `± ${formatPercentError(result.shortfall.standardError)}`;
  return `Estimated chance that the balance of ${scopeLabel} falls below ${line} within the next ${result.horizonDays} days: ${formatPercent(p)} (${detail})`;
}

function legend(): string {
  const swatch = (fill: string, opacity: number) =>
    `<svg width="22" height="12" aria-hidden="true"><rect width="22" height="12" fill="${fill}" fill-opacity="${opacity}"/></svg>`;
  const line = (stroke: string, dash: string) =>
    `<svg width="22" height="12" aria-hidden="true"><line x1="0" x2="22" y1="6" y2="6" stroke="${stroke}" stroke-width="2"${dash ? ` stroke-dasharray="${dash}"` : ''}/></svg>`;
  return [
    '<div class="legend">',
    `<span>${swatch(REPORT_COLOURS.blue, 0.18)}90% of paths (P5–P95)</span>`,
    `<span>${swatch(REPORT_COLOURS.blue, 0.38)}half of paths (P25–P75)</span>`,
    `<span>${line(REPORT_COLOURS.blue, '')}median</span>`,
    `<span>${line(REPORT_COLOURS.vermillion, '6 4')}threshold</span>`,
    '</div>',
  ].join('');
}

/** "1–7 Nov" within a month, "29 Nov – 5 Dec" across months. */
function dayRange(from: CalendarDate, to: CalendarDate): string {
  const a = formatShortDate(from);
  const b = formatShortDate(to);
  return from.slice(0, 7) === to.slice(0, 7) ? `${a.split(' ')[0]}–${b}` : `${a} – ${b}`;
}

function weeksSection(view: ThirteenWeekView): string {
  const c = view.currency;
  const amount = (v: number | null) => (v === null ? '–' : e(formatWhole(v, c)));
  const head = ['Week', 'Days', 'In', 'Out', 'Net', 'Expected close', 'P10', 'Median', 'P90', 'Below by then'];
  const rows = view.weeks.map((w) => [
    String(w.week),
    e(dayRange(w.from, w.to)),
    amount(w.expectedInflow),
    amount(w.expectedOutflow),
    amount(w.expectedNet),
    amount(w.closingBalance),
    amount(w.closing.p10),
    amount(w.closing.p50),
    amount(w.closing.p90),
    e(formatPercent(w.pCrossedByClose)),
  ]);
  const split =
    view.expectedFrom === 'components'
      ? 'Expected receipts and payments are the exact expectations of the simulated flows; each week closes at its opening plus its net flow.'
      : 'Only the expected net flow is known here (the difference of the simulated mean balances); receipts and payments are not split.';
  return [
    '<section id="weeks">',
    '<h2>13-week cash view</h2>',
    `<p class="note">Amounts in ${e(c)}, rounded to whole units. Weeks of seven days counted from ${e(formatDate(view.asOf))}, the last day of the statements. ${e(split)} P10, median and P90: the closing balance that 10%, 50% and 90% of the simulated paths stay below. “Below by then”: the estimated chance of having been below ${e(formatAmount(view.threshold, c))} on any day up to the week’s end.${view.complete ? '' : ` The forecast covers ${view.weeks.length} whole weeks only.`}</p>`,
    table(head, rows, [false, false, true, true, true, true, true, true, true, true], (i) =>
      (view.weeks[i]?.pCrossedByClose ?? 0) >= 0.1 ? 'risk' : '',
    ),
    '</section>',
  ].join('\n');
}

function shortfallSection(input: ReportInput): string {
  const r = input.result;
  const fc = r.shortfall.firstCrossing;
  const when = (d: CalendarDate | null) => (d === null ? 'not within the horizon' : `by ${formatDate(d)}`);
  const crossing =
    r.shortfall.probability === 0
      ? 'No simulated path falls below the threshold within the horizon.'
      : `First day below the threshold: ${when(fc.p10)} in 10% of the simulated paths, ${when(fc.p50)} in half of them, ${when(fc.p90)} in 90%.`;
  const runway = input.runway
    ? describeRunway(input.runway)
    : [describeSimulatedRunway(runwayFromResult(r), r.currency)];
  const parts = ['<section id="shortfall">', '<h2>Shortfall and runway</h2>', `<p>${e(crossing)}</p>`];
  parts.push('<ul class="plain">', ...runway.map((s) => `<li>${e(s)}</li>`), '</ul>');
  if (r.shortfall.drivers.length > 0) {
    parts.push(
      '<p>Flows that most separate the paths that fall below the threshold from the others (their mean total over the horizon, lower in the paths that fall below by):</p>',
      '<ul class="plain">',
      ...r.shortfall.drivers.map((d) => `<li>${e(d.label)}: ${e(formatAmount(Math.abs(d.amount), r.currency))}</li>`),
      '</ul>',
    );
  }
  parts.push('</section>');
  return parts.join('\n');
}

function recurringSection(r: ForecastResult, max: number): string {
  const flows = [...r.recurring].sort(
    (a, b) => Math.abs(b.amount) - Math.abs(a.amount) || (a.label < b.label ? -1 : 1),
  );
  const shown = flows.slice(0, max);
  const parts = ['<section id="recurring">', '<h2>Main recurring flows</h2>'];
  if (shown.length === 0) {
    parts.push('<p>No recurring flow was found or confirmed in the statements.</p>');
  } else {
    parts.push(
      table(
        ['Flow', 'Schedule', `Typical amount (${e(r.currency)})`, 'Next', 'Status', 'Confidence'],
        shown.map((f) => [
          e(f.label),
          e(describeCadence(f.cadence)),
          e(formatAmount(f.amount, r.currency, { code: false })),
          e(f.nextDate ? formatDate(f.nextDate) : '–'),
          e(f.status),
          e(`${Math.round(f.flow.confidence * 100)}%`),
        ]),
        [false, false, true, false, false, true],
      ),
    );
    if (flows.length > shown.length)
      parts.push(`<p class="note">${flows.length - shown.length} smaller recurring flows are not listed.</p>`);
  }
  if (r.recurringSkipped.length > 0) {
    parts.push(
      `<p class="note">Not projected: ${r.recurringSkipped.map((s) => e(`${s.label} (${s.reason})`)).join('; ')}.</p>`,
    );
  }
  parts.push('</section>');
  return parts.join('\n');
}

function dataSection(input: ReportInput): string {
  const r = input.result;
  const rec = input.reconciliation;
  const status = (s: ReconciliationStatus, first?: CalendarDate | null) =>
    s === 'reconciled'
      ? 'reconciled: stated balances agree with the transactions'
      : s === 'mismatch'
        ? `does not reconcile${first ? `: first disagreement on ${formatDate(first)}` : ''}`
        : 'not checked: too few stated balances';
  const parts = [
    '<section id="data">',
    '<h2>Data and reconciliation</h2>',
    `<p>Statements from ${e(formatDate(r.historyStart))} to ${e(formatDate(r.asOf))}; balance on ${e(formatDate(r.asOf))}: ${e(formatAmount(r.startBalance, r.currency))}. Reconciliation overall: ${e(status(rec.status))}.</p>`,
  ];
  if (rec.accounts.length > 0) {
    parts.push(
      '<ul class="plain">',
      ...rec.accounts.map(
        (a) => `<li>${e(a.name)}: ${e(status(a.status, a.firstMismatch))}${a.note ? ` (${e(a.note)})` : ''}</li>`,
      ),
      '</ul>',
    );
  }
  if (rec.status === 'mismatch') {
    parts.push(
      '<p><strong>The statements do not reconcile; the forecast starts from figures that disagree with each other.</strong></p>',
    );
  }
  parts.push('</section>');
  return parts.join('\n');
}

function scenarioSection(c: ScenarioComparison): string {
  const cur = c.currency;
  const money = (v: number) => e(formatWhole(v, cur));
  const head = ['', ...c.columns.map((col) => e(col.name))];
  const rows: string[][] = [];
  c.dates.forEach((date, k) => {
    const at = (col: (typeof c.columns)[number]) => col.at[k] as (typeof col.at)[number];
    rows.push([`<strong>${e(formatDate(date))}</strong>: median`, ...c.columns.map((col) => money(at(col).p50))]);
    rows.push(['P10 – P90', ...c.columns.map((col) => `${money(at(col).p10)} – ${money(at(col).p90)}`)]);
    rows.push(['chance below by then', ...c.columns.map((col) => e(formatPercent(at(col).pCrossed)))]);
  });
  const q = (x: { weeks: number | null }) => (x.weeks === null ? 'beyond' : formatWeeks(x.weeks));
  rows.push([
    'Runway (10% / half of the paths)',
    ...c.columns.map((col) => e(`${q(col.runway.p10)} / ${q(col.runway.p50)}`)),
  ]);
  return [
    '<section id="scenarios">',
    '<h2>Scenarios compared</h2>',
    `<p class="note">Balances in ${e(cur)}, rounded to whole units; “chance below” is the estimated chance of having been below ${e(formatAmount(c.threshold, cur))} on any day up to that date; runway is the time by which that share of the simulated paths has been below it.</p>`,
    table(head, rows, [false, ...c.columns.map(() => true)]),
    '<ul class="plain">',
    ...c.differences.flatMap((d) => d.sentences.map((s) => `<li>${e(s)}</li>`)),
    '</ul>',
    '<p class="note">Scenarios share the random draws of every flow they leave alone, so their differences come from the changes, not from chance. Differences smaller than the simulation noise are called “about the same”.</p>',
    '</section>',
  ].join('\n');
}

/**
 * @returns the complete HTML document.
 * @throws EngineError UNKNOWN_CURRENCY for a result in an unknown currency; INVALID_DATE
 *   for a malformed `generatedOn`.
 * @example
 * const html = renderReportHtml({ result, title: 'Cash outlook', scopeLabel: 'the business account',
 *   generatedOn: '2026-11-02', reconciliation: { status: 'reconciled', accounts: [] } });
 */
export function renderReportHtml(input: ReportInput): string {
  const r = input.result;
  const weeks = input.weeks ?? thirteenWeekView(r);
  const generated = formatDate(input.generatedOn);
  const caution = r.caution || CAUTION;
  const relative = r.relativeBalance
    ? '<p class="note"><strong>No statement states a balance, so balances are relative to the first day of the statements; the chance of falling below an amount is then only about changes, not about the real balance.</strong></p>'
    : '';
  const notes =
    r.notes.length > 0
      ? [
          '<section id="notes">',
          '<h2>Notes</h2>',
          '<ul class="plain">',
          ...r.notes.map((n) => `<li>${e(n)}</li>`),
          '</ul>',
          '</section>',
        ].join('\n')
      : '';
  const body = [
    '<header>',
    `<h1>${e(input.title)}</h1>`,
    `<p>${e(`Balance of ${input.scopeLabel} (${r.currency}), forecast from ${formatDate(r.asOf)} for ${r.horizonDays} days.`)}</p>`,
    `<p>${e(`Made on ${generated} from statements of ${formatDate(r.historyStart)} to ${formatDate(r.asOf)}.`)}</p>`,
    '</header>',
    `<aside class="caution" role="note"><strong>Caution.</strong> ${e(caution)}</aside>`,
    '<section id="question">',
    `<p class="answer"><strong>${e(reportQuestion(r, input.scopeLabel))}</strong></p>`,
    `<p class="note">${e(`“Falls below” means the end-of-day balance is below ${formatAmount(r.threshold, r.currency)} on at least one day. The ± figure is the Monte Carlo standard error from ${formatCount(r.paths)} simulated paths (seed ${r.seed}); it says how much the estimate would move with another set of paths, not how likely the future is to differ from the past.`)}</p>`,
    relative,
    '</section>',
    '<section id="chart">',
    '<h2>Balance outlook</h2>',
    '<figure>',
    fanChartSvg(r),
    `<figcaption>${legend()}</figcaption>`,
    '</figure>',
    '</section>',
    weeksSection(weeks),
    shortfallSection(input),
    recurringSection(r, input.maxRecurring ?? 8),
    '<section id="models">',
    '<h2>How the forecast was made</h2>',
    `<p>${e(describeModels(r))}</p>`,
    '</section>',
    dataSection(input),
    input.comparison ? scenarioSection(input.comparison) : '',
    notes,
    '<footer>',
    `<p class="caution">${e(caution)}</p>`,
    `<p>${e(`Made with Ebbline on ${generated}. Seed ${r.seed}, ${formatCount(r.paths)} paths: the same statements, settings and seed give the same figures.`)}</p>`,
    '</footer>',
  ]
    .filter((s) => s !== '')
    .join('\n');
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; style-src 'unsafe-inline'">`,
    `<title>${e(input.title)}</title>`,
    `<style>${REPORT_CSS}</style>`,
    '</head>',
    '<body>',
    '<main>',
    body,
    '</main>',
    '</body>',
    '</html>',
    '',
  ].join('\n');
}
