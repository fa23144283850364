import { beforeAll, describe, expect, it } from 'vitest';
import { CAUTION } from '../../engine/core/caution';
import type { ForecastResult } from '../../engine/forecast/runForecast';
import { validatePlan } from '../../engine/plan/plan';
import { renderReportHtml, reportQuestion, type ReportInput } from '../../engine/report/renderReportHtml';
import { runway } from '../../engine/runway/runway';
import { thirteenWeekView } from '../../engine/runway/thirteenWeekView';
import { compareScenarios } from '../../engine/scenario/compareScenarios';
import { prepareForecastBasis } from '../../engine/scenario/forecastBasis';
import { forecastScenario, type ScenarioRun } from '../../engine/scenario/forecastScenario';
import { syntheticHistory } from '../scenario/syntheticHistory';

const EVIL = '<script>alert("x")</script>';
const history = syntheticHistory({ endBalance: 900_000 });
let run: ScenarioRun;
let scenario: ScenarioRun;

beforeAll(() => {
  const basis = prepareForecastBasis(history, { horizon: 91 });
  run = forecastScenario(basis, { paths: 500, seed: 3, threshold: 200_000 });
  const v = validatePlan(
    { schema: 'ebbline.plan/1', items: [{ label: EVIL, amount: -2000, date: '2026-01-10' }] },
    'EUR',
  );
  if (!v.ok) throw new Error('plan');
  scenario = forecastScenario(basis, { paths: 500, seed: 3, threshold: 200_000, plan: v.plan });
});

function input(overrides: Partial<ReportInput> = {}): ReportInput {
  return {
    result: run.result,
    title: 'Cash outlook',
    scopeLabel: 'the studio account',
    generatedOn: '2026-01-02',
    reconciliation: { status: 'reconciled', accounts: [{ name: 'Studio', status: 'reconciled' }] },
    weeks: thirteenWeekView(run.result, run.components),
    runway: runway({ result: run.result, history }),
    ...overrides,
  };
}

function section(html: string, id: string): string {
  const start = html.indexOf(`<section id="${id}">`);
  expect(start, `section ${id}`).toBeGreaterThanOrEqual(0);
  return html.slice(start, html.indexOf('</section>', start));
}

describe('renderReportHtml', () => {
  it('is one complete, self-contained document: no script, no external resource', () => {
    const html = renderReportHtml(input());
    expect(html.startsWith('<!DOCTYPE html>\n<html lang="en">')).toBe(true);
    expect(html.trimEnd().endsWith('</html>')).toBe(true);
    expect(html).toMatch(/<style>[\s\S]*@media print[\s\S]*<\/style>/);
    expect(html).toContain(`content="default-src 'none'; style-src 'unsafe-inline'"`);
    expect(html).not.toMatch(/<script/i);
    expect(html).not.toMatch(/https?:\/\//);
    expect(html).not.toMatch(/<(link|img|iframe|object|embed)\b/i);
    expect(html).not.toMatch(/\b(src|href)=|url\(|@import/i);
    expect(html).not.toMatch(/\bon[a-z]+=/i);
  });

  it('shows the caution prominently before the answer and again at the end', () => {
    const html = renderReportHtml(input());
    const first = html.indexOf(CAUTION);
    expect(first).toBeGreaterThan(0);
    expect(first).toBeLessThan(html.indexOf('class="answer"'));
    expect(html.lastIndexOf(CAUTION)).toBeGreaterThan(html.indexOf('<footer>'));
  });

  it('answers the question in one sentence with the Monte Carlo error', () => {
    const r: ForecastResult = {
      ...run.result,
      threshold: 0,
      horizonDays: 90,
      shortfall: { ...run.result.shortfall, probability: 0.0712, standardError: 0.0036 },
    };
    expect(reportQuestion(r, 'the business account')).toBe(
      'Estimated chance that the balance of the business account falls below 0.00 EUR within the next 90 days: 7% (± 0.4%)',
    );
    const none = { ...r, shortfall: { ...r.shortfall, probability: 0, standardError: 0 } };
    expect(reportQuestion(none, 'x')).toMatch(/: 0% \(none of the 500 simulated paths\)$/);
    expect(renderReportHtml(input())).toContain(`<strong>${reportQuestion(run.result, 'the studio account')}</strong>`);
  });

  it('escapes every text that comes from statements, plans or people', () => {
    const result: ForecastResult = {
      ...scenario.result,
      recurring: scenario.result.recurring.map((f, i) => (i === 0 ? { ...f, label: EVIL } : f)),
      notes: [...scenario.result.notes, EVIL],
      shortfall: {
        ...scenario.result.shortfall,
        drivers: [{ key: 'k', label: EVIL, amount: -100 }, ...scenario.result.shortfall.drivers],
      },
    };
    const html = renderReportHtml(
      input({
        result,
        title: EVIL,
        scopeLabel: `"><${'script'}>`,
        reconciliation: {
          status: 'mismatch',
          accounts: [{ name: EVIL, status: 'mismatch', firstMismatch: '2025-09-30', note: EVIL }],
        },
        comparison: compareScenarios(run.result, [{ name: EVIL, result: scenario.result }]),
      }),
    );
    expect(html).not.toMatch(/<script/i);
    expect(html).toContain('&lt;script&gt;alert(&quot;x&quot;)&lt;/script&gt;');
    expect(html).toContain('first disagreement on 30 Sep 2025');
  });

  it('has the 13-week table, the fan chart, runway, recurring flows, models and data sections', () => {
    const html = renderReportHtml(input());
    expect(section(html, 'weeks').match(/<tr>|<tr class="risk">/g)).toHaveLength(14); // header + 13 weeks
    const chart = section(html, 'chart');
    // From memory: Okabe and Ito (2008) blue rgb(0, 114, 178) = #0072B2, vermillion rgb(213, 94, 0) = #D55E00.
    expect(chart).toMatch(/<path class="band-outer" d="M[^"]+Z" fill="#0072B2" fill-opacity="0.18"/);
    expect(chart).toMatch(/<path class="band-inner" d="M[^"]+Z" fill="#0072B2" fill-opacity="0.38"/);
    expect(chart).toMatch(/<line class="threshold"[^>]*stroke="#D55E00"[^>]*stroke-dasharray/);
    // The median line has one point per forecast day plus the as-of day.
    const median = /<path class="median" d="([^"]+)"/.exec(chart)![1]!;
    expect(median.match(/[ML]/g)).toHaveLength(run.result.horizonDays + 1);
    expect(section(html, 'shortfall')).toContain('Naive runway');
    expect(section(html, 'recurring')).toContain('Landlord Ltd');
    expect(section(html, 'models')).toMatch(/recurring flows are projected/);
    expect(section(html, 'data')).toContain('Statements from 1 May 2025 to 26 Dec 2025');
    expect(html).not.toContain('<section id="scenarios">');
  });

  it('adds the scenario comparison when given, and is the same for the same input', () => {
    const comparison = compareScenarios(run.result, [{ name: 'Kiln', result: scenario.result }]);
    const html = renderReportHtml(input({ comparison }));
    const s = section(html, 'scenarios');
    expect(s).toContain(comparison.differences[0]!.sentences[0]!.replace(/"/g, '&quot;'));
    expect(renderReportHtml(input({ comparison }))).toBe(html);
  });

  it('works from a forecast result alone', () => {
    const html = renderReportHtml({
      result: run.result,
      title: 'Cash outlook',
      scopeLabel: 'the studio account',
      generatedOn: '2026-01-02',
      reconciliation: { status: 'not checked', accounts: [] },
    });
    expect(section(html, 'weeks')).toContain('receipts and payments are not split');
    expect(section(html, 'shortfall')).not.toContain('Naive runway');
  });
});
