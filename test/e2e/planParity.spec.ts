// A bookkeeper's loop: in the demo workspace a scenario's plan is exported from the
// Scenarios screen, compared there on the app's settings, and the same file is run through
// `ebbline forecast … --plan FILE --seed N` with those settings read off the screen. The
// CLI's numbers, rounded as the screen rounds them, must be the figures shown. A
// self-consistency check between the app and the CLI (DESIGN.md section 5), no outside
// reference; test/cli/planParity.test.ts compares the unrounded values of the same paths.
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import type { Locator } from '@playwright/test';
import { formatAmount, formatDate, formatPercent, formatWeeks } from '../../engine/report/plainFormat';
import { runwayFromCrossedShares, type RunwayQuantile } from '../../engine/runway/runwayFromCrossedShares';
import { DEMO_DIR, demoFileNames, expect, openDemoWithExamples, test } from './support';

/** The scenario followed: the demo's one whose paths cross the cushion most. */
const SCENARIO = 'Kiln and late commission';

interface CliDay {
  readonly date: string;
  readonly p10: number;
  readonly p50: number;
  readonly p90: number;
  readonly pCrossed: number;
}
interface CliForecast {
  readonly asOf: string;
  readonly currency: string;
  readonly paths: number;
  readonly threshold: number;
  readonly daily: readonly CliDay[];
  readonly shortfall: { readonly probability: number };
}

/** The text of every cell of the row whose header starts with `start`. */
async function rowsStartingWith(table: Locator, start: string): Promise<{ header: string; cells: string[] }[]> {
  const rows: { header: string; cells: string[] }[] = [];
  for (const row of await table.locator('tbody tr').all()) {
    const header = (await row.locator('th').innerText()).replace(/\s+/g, ' ').trim();
    if (!header.startsWith(start)) continue;
    const cells = (await row.locator('td').allInnerTexts()).map((t) => t.replace(/\s+/g, ' ').trim());
    rows.push({ header, cells });
  }
  return rows;
}

/** The first-crossing cell as ComparisonResults.svelte words it. */
function runwayText(q: RunwayQuantile): string {
  return q.beyondHorizon || q.date === null || q.weeks === null
    ? 'beyond the horizon'
    : `${formatDate(q.date)} (${formatWeeks(q.weeks)})`;
}

test('a scenario exported from the app and run by ebbline forecast --plan gives the figures the screen shows', async ({
  page,
}, testInfo) => {
  await openDemoWithExamples(page);

  // Save the scenario's plan file, as the bookkeeper does to run it in batch.
  await page.locator(`[data-testid="scenario-entry"][data-name="${SCENARIO}"]`).click();
  await expect(page.getByTestId('scenario-editor').getByRole('heading', { name: SCENARIO })).toBeVisible();
  const downloading = page.waitForEvent('download');
  await page.getByTestId('scenario-export').click();
  const download = await downloading;
  expect(download.suggestedFilename()).toBe(`${SCENARIO}.plan.json`);
  const planFile = testInfo.outputPath(download.suggestedFilename());
  await download.saveAs(planFile);
  expect(JSON.parse(readFileSync(planFile, 'utf8'))).toMatchObject({ schema: 'ebbline.plan/1', name: SCENARIO });

  // Compare on the settings the examples set; the paths are the app's default.
  await page.getByTestId('scenarios-tab-compare').click();
  await expect(page.locator(`[data-testid="comparison-pick"][data-name="${SCENARIO}"]`)).toBeChecked();
  await page.getByTestId('comparison-run').click();
  const results = page.getByTestId('comparison-results');
  await expect(results).toBeVisible({ timeout: 30_000 });
  await expect(page.getByTestId('comparison-run')).toBeVisible();
  await expect(results).not.toHaveClass(/stale/);

  // The settings, as the screen shows them.
  const scopeLabel = (await page.getByTestId('scenarios-scope').locator('option:checked').textContent()) ?? '';
  const account = /^(.+) \(([A-Z]{3})\)$/.exec(scopeLabel.trim())?.[1];
  expect(account, `one account chosen (${scopeLabel})`).toBeTruthy();
  const horizon = await page.getByTestId('comparison-horizon').inputValue();
  const paths = await page.getByTestId('comparison-paths').inputValue();
  expect(paths, 'the app’s default number of paths').toBe('5000');
  const threshold = (await page.getByTestId('comparison-threshold').inputValue()).replace(/,/g, '');
  const seed = /\(seed (\d+)\)/.exec((await results.textContent()) ?? '')?.[1];
  expect(seed, 'the seed is shown with the results').toBeTruthy();

  // The same file and settings through the command line.
  const cli = spawnSync(
    process.execPath,
    [
      'bin/ebbline.mjs',
      'forecast',
      ...demoFileNames().map((n) => join(DEMO_DIR, n)),
      '--plan',
      planFile,
      '--seed',
      String(seed),
      '--horizon',
      horizon,
      '--paths',
      paths,
      '--threshold',
      threshold,
      '--account',
      String(account),
      '--format',
      'json',
    ],
    { encoding: 'utf8' },
  );
  expect(cli.stderr).toBe('');
  expect(cli.status).toBe(0);
  const doc = JSON.parse(cli.stdout) as CliForecast;
  expect(doc.daily).toHaveLength(Number(horizon));

  // The scenario's column of the side-by-side table.
  const table = page.getByTestId('comparison-table');
  const headers = (await table.locator('thead th').allTextContents()).map((t) => t.trim());
  const column = headers.findIndex((h) => h.startsWith(SCENARIO)) - 1;
  expect(column, `a column for ${SCENARIO}`).toBeGreaterThanOrEqual(0);
  const shown = async (start: string) =>
    (await rowsStartingWith(table, start)).map((r) => ({ header: r.header, value: r.cells[column] }));
  const byDate = new Map(doc.daily.map((d) => [formatDate(d.date), d]));
  const dayOf = (header: string) => {
    const day = byDate.get(/(\d{1,2} \w{3} \d{4})/.exec(header)?.[1] ?? '');
    if (!day) throw new Error(`no forecast day for "${header}"`);
    return day;
  };
  const minor = (major: number) => Math.round(major * 100);

  const chance = await shown('Chance of having gone below');
  const medians = await shown('Median balance on');
  const [whole] = await shown('Over the whole horizon');
  const firstBelow = [
    ...(await shown('First time below: 10% of paths by')),
    ...(await shown('… half of the paths by')),
    ...(await shown('… 90% of the paths by')),
  ];
  await testInfo.attach('compared.json', {
    body: JSON.stringify(
      { settings: { account, horizon, paths, threshold, seed }, chance, medians, whole, firstBelow },
      null,
      2,
    ),
    contentType: 'application/json',
  });

  expect(chance.length).toBeGreaterThan(1);
  for (const row of chance) expect(row.value, row.header).toBe(formatPercent(dayOf(row.header).pCrossed));

  expect(medians.length).toBe(chance.length);
  for (const row of medians) {
    const d = dayOf(row.header);
    const range = `${formatAmount(minor(d.p10), doc.currency, { code: false })} to ${formatAmount(minor(d.p90), doc.currency, { code: false })}`;
    expect(row.value, row.header).toBe(`${formatAmount(minor(d.p50), doc.currency)} ${range}`);
  }

  expect(whole?.value?.split(' ± ')[0]).toBe(formatPercent(doc.shortfall.probability));

  const runway = runwayFromCrossedShares(
    doc.daily.map((d) => d.pCrossed),
    doc.asOf,
    minor(doc.threshold),
    doc.paths,
  );
  expect(firstBelow.map((r) => r.value)).toEqual([runway.p10, runway.p50, runway.p90].map(runwayText));
  // Not a vacuous match: this scenario's paths do cross the cushion, at dates the table names.
  expect(runway.p10.beyondHorizon).toBe(false);
  expect(doc.shortfall.probability).toBeGreaterThan(0);
});
