// The Report screen's parts: the worker's reportForecast (base and scenario on one basis
// and seed, the numbers of runForecast, 13-week view with receipts and payments split),
// the document for the print copy (stylesheet scoped to a shadow root, caution kept), the
// reconciliation summary and the CSV with the caution.
import { describe, expect, it } from 'vitest';
import { runForecast } from '../../engine/forecast/runForecast';
import { validatePlan, type Plan } from '../../engine/plan/plan';
import { renderReportHtml } from '../../engine/report/renderReportHtml';
import { reportCsv } from '../../engine/report/reportCsv';
import { CAUTION } from '../../engine/core/caution';
import { compareScenarios } from '../../engine/scenario/compareScenarios';
import { scenarioMethods, clearScenarioCache } from '../../renderer/src/lib/worker/scenarioMethods';
import {
  fileStem,
  reconciliationOf,
  shadowContent,
  shadowCss,
  splitReportHtml,
} from '../../renderer/src/components/report/reportDocument';
import type { AccountRecord } from '../../renderer/src/lib/db/records';
import { syntheticHistory } from '../scenario/syntheticHistory';

const history = syntheticHistory({ days: 200 });
const plan: Plan = (() => {
  const v = validatePlan(
    {
      schema: 'ebbline.plan/1',
      items: [
        {
          label: 'Tax bill',
          amount: -4000,
          date: '2025-12-10',
          probability: 1,
          delayDays: { min: 0, max: 0 },
          every: null,
        },
      ],
    },
    'EUR',
  );
  if (!v.ok) throw new Error('plan');
  return v.plan;
})();

function account(patch: Partial<AccountRecord>): AccountRecord {
  return {
    id: 'a',
    name: 'Studio current',
    currency: 'EUR',
    identifiers: [],
    kind: 'current',
    order: 0,
    entries: 10,
    firstDate: '2025-05-01',
    lastDate: '2025-11-16',
    closingBalance: 0,
    relative: false,
    reconciled: true,
    checkedAnchors: 2,
    firstMismatch: null,
    note: null,
    ...patch,
  };
}

describe('reportForecast (worker method)', () => {
  it('forecasts base and scenario on one seed with runForecast’s numbers and a split 13-week view', async () => {
    clearScenarioCache();
    const labels: string[] = [];
    const runs = await scenarioMethods.reportForecast(
      { history, horizon: 91, paths: 300, seed: 1, threshold: 0, decisions: [], plans: [null, plan] },
      { progress: (_s, l) => labels.push(l) },
    );
    expect(runs).toHaveLength(2);
    const direct = runForecast(history, { horizon: 91, paths: 300, seed: 1, threshold: 0, plan });
    expect(runs[1]!.result.daily).toEqual(direct.daily);
    expect(runs[1]!.result.shortfall).toEqual(direct.shortfall);
    expect(runs[0]!.weeks.expectedFrom).toBe('components');
    expect(runs[0]!.weeks.weeks).toHaveLength(13);
    expect(runs[0]!.weeks.weeks[0]!.expectedInflow).not.toBeNull();
    expect(runs[1]!.runway.burn.weeks).toBeGreaterThan(0);
    expect(labels.at(-1)).toBe('Done');
    // The tax bill is in the scenario's week of 10 December, not in the base's.
    const week = runs[1]!.weeks.weeks.find((w) => w.from <= '2025-12-10' && w.to >= '2025-12-10')!;
    const baseWeek = runs[0]!.weeks.weeks[week.week - 1]!;
    expect(week.expectedOutflow! - baseWeek.expectedOutflow!).toBeCloseTo(400000, 0);
  });

  it('keeps the basis for the next call with the same history', async () => {
    await scenarioMethods.reportForecast(
      { history, horizon: 91, paths: 100, seed: 1, threshold: 0, decisions: [], plans: [null] },
      { progress: () => {} },
    );
    // A second call reuses the fitted models; its numbers are still runForecast's.
    const again = await scenarioMethods.reportForecast(
      { history, horizon: 91, paths: 100, seed: 1, threshold: 0, decisions: [], plans: [null] },
      { progress: () => {} },
    );
    expect(again[0]!.result.daily).toEqual(runForecast(history, { horizon: 91, paths: 100, seed: 1 }).daily);
  });
});

describe('the report document', () => {
  const result = runForecast(history, { horizon: 91, paths: 200, seed: 1 });
  const withPlan = runForecast(history, { horizon: 91, paths: 200, seed: 1, plan });
  const html = renderReportHtml({
    result: withPlan,
    title: 'Cash outlook for <Studio> & Co',
    scopeLabel: 'all EUR accounts combined',
    generatedOn: '2025-11-20',
    reconciliation: reconciliationOf([account({})]),
    comparison: compareScenarios(result, [{ name: 'Tax bill', result: withPlan }], {
      baseName: 'Base forecast (no changes)',
    }),
  });

  it('splits into stylesheet and body, with the caution in the body', () => {
    const parts = splitReportHtml(html);
    expect(parts.css).toContain(':root');
    expect(parts.body).toContain(CAUTION);
    expect(parts.body).toContain('Cash outlook for &lt;Studio&gt; &amp; Co');
    expect(parts.body).not.toContain('<script');
    expect(() => splitReportHtml('<p>nothing</p>')).toThrow('not a report document');
  });

  it('scopes the stylesheet to a shadow root', () => {
    const css = shadowCss(
      ':root { --ink: #1b1b1b; }\nbody { margin: 0; }\nmain { max-width: 60rem; }\nheader h1 { x: 1; }\n@media print {\n  @page { size: A4; margin: 16mm 14mm; }\n  body { font-size: 10.5pt; }\n  main { padding: 0; }\n}',
    );
    expect(css).toContain(':host { --ink: #1b1b1b; }');
    expect(css).toContain('.report-body { margin: 0; }');
    expect(css).toContain('.report-main { max-width: 60rem; }');
    expect(css).toContain('  .report-body { font-size: 10.5pt; }');
    expect(css).toContain('header h1');
    expect(css).not.toContain('@page');
    const content = shadowContent(html);
    expect(content.startsWith('<style>')).toBe(true);
    expect(content).toContain('<div class="report-body"><div class="report-main">');
    expect(content).not.toMatch(/(^|[\s}])body\s*\{/);
  });

  it('writes the daily figures with the caution as the last record', () => {
    const lines = reportCsv(withPlan).trimEnd().split('\r\n');
    expect(lines[0]).toBe('date,mean,p05,p10,p25,p50,p75,p90,p95,pBelow,pCrossed');
    expect(lines).toHaveLength(93);
    expect(lines.at(-1)).toContain('Estimates only');
  });
});

describe('reconciliationOf', () => {
  it('is reconciled only when every account is', () => {
    expect(reconciliationOf([account({}), account({ id: 'b', name: 'Reserve' })]).status).toBe('reconciled');
    expect(reconciliationOf([account({}), account({ id: 'b', reconciled: null })]).status).toBe('not checked');
    expect(reconciliationOf([]).status).toBe('not checked');
    const bad = reconciliationOf([
      account({}),
      account({
        id: 'b',
        name: 'Reserve',
        reconciled: false,
        firstMismatch: {
          date: '2025-07-01',
          at: 'end',
          kind: 'closing',
          expected: 1,
          computed: 2,
          difference: 1,
          sourceFile: 'r.sta',
          lastAgreement: null,
        },
      }),
    ]);
    expect(bad.status).toBe('mismatch');
    expect(bad.accounts[1]).toEqual({ name: 'Reserve', status: 'mismatch', firstMismatch: '2025-07-01', note: null });
  });
});

describe('fileStem', () => {
  it('keeps names readable and safe', () => {
    expect(fileStem('Tessellate Ceramics (demo)')).toBe('Tessellate Ceramics (demo)');
    expect(fileStem('a/b:c')).toBe('a-b-c');
  });
});
