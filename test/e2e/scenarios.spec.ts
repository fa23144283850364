// The owner's and the bookkeeper's what-if loop in the browser: a scenario made by hand
// (planned items with a chance and a payment delay, a recurring flow scaled) is kept as
// typed across a reload and compared with the base forecast; the demo's ready-made
// scenarios are compared side by side; the report of one of them is printed to PDF and its
// daily figures exported as CSV, and the CSV holds the numbers the report shows.
// Self-consistency checks between screens and files of the app, no outside reference.
import { spawnSync } from 'node:child_process';
import { readFileSync, writeFileSync } from 'node:fs';
import type { Locator, Page } from '@playwright/test';
import { CAUTION } from '../../engine/core/caution';
import { formatPercent, formatWhole } from '../../engine/report/plainFormat';
import { DEMO_CUSHION } from '../../engine/scenario/demoScenarios';
import { expect, goToScreen, nav, openDemo, openDemoWithExamples, screenshotScreen, test } from './support';

const HIRE = 'Studio assistant from December';

/** Text with runs of white space made single spaces. */
const squash = (text: string) => text.replace(/\s+/g, ' ').trim();

/** The side-by-side table as { row header → cells }, and its column names. */
async function comparisonTable(page: Page): Promise<{ columns: string[]; rows: Map<string, string[]> }> {
  const table = page.getByTestId('comparison-table');
  const columns = (await table.locator('thead th').allInnerTexts()).slice(1).map(squash);
  const rows = new Map<string, string[]>();
  for (const row of await table.locator('tbody tr').all()) {
    rows.set(squash(await row.locator('th').innerText()), (await row.locator('td').allInnerTexts()).map(squash));
  }
  return { columns, rows };
}

/** The cells of the one row whose header starts with `start`. */
function rowStarting(rows: Map<string, string[]>, start: string): string[] {
  const found = [...rows].filter(([h]) => h.startsWith(start));
  expect(
    found.map(([h]) => h),
    `one row starting "${start}"`,
  ).toHaveLength(1);
  return found[0]![1];
}

/** "7%", "0.4%" or "7% ± 0.4%" as a share. */
function share(text: string): number {
  const m = /^(\d+(?:\.\d+)?)%/.exec(text);
  if (!m) throw new Error(`not a percentage: "${text}"`);
  return Number(m[1]) / 100;
}

/** Runs the comparison as set up and waits for fresh results. */
async function runComparison(page: Page): Promise<Locator> {
  await page.getByTestId('comparison-run').click();
  const results = page.getByTestId('comparison-results');
  await expect(results).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('comparison-run')).toBeVisible({ timeout: 60_000 });
  await expect(results).not.toHaveClass(/stale/);
  return results;
}

test('a scenario made by hand is kept as typed across a reload and compared with the base forecast', async ({
  page,
}, testInfo) => {
  await openDemo(page);
  await goToScreen(page, 'Scenarios');
  await expect(page.getByTestId('scenarios-caution')).toHaveText(CAUTION);

  await page.getByTestId('scenario-create').click();
  const editor = page.getByTestId('scenario-editor');
  await expect(editor).toBeVisible();
  await page.getByTestId('scenario-rename').click();
  await page.getByTestId('scenario-rename-input').fill(HIRE);
  await page.getByTestId('scenario-rename-save').click();
  await expect(editor.getByRole('heading', { name: HIRE })).toBeVisible();

  // A monthly wage from a start date, certain; an invoice paid 5 to 25 days late, 3 in 4 likely.
  await page.getByTestId('item-add').click();
  const wage = page.getByTestId('plan-item').nth(0);
  await wage.getByTestId('item-label').fill('Assistant wages');
  await wage.getByTestId('item-amount').fill('-1800.00');
  await wage.getByTestId('item-date').fill('2026-11-30');
  await wage.getByTestId('item-probability').fill('100');
  await wage.getByTestId('item-every').selectOption('month');
  await page.getByTestId('item-add').click();
  const invoice = page.getByTestId('plan-item').nth(1);
  await invoice.getByTestId('item-label').fill('Invoice INV-2026-031, glaze workshop');
  await invoice.getByTestId('item-amount').fill('2400');
  await invoice.getByTestId('item-date').fill('2026-11-20');
  await invoice.getByTestId('item-probability').fill('75');
  await invoice.getByTestId('item-delay-min').fill('5');
  await invoice.getByTestId('item-delay-max').fill('25');

  // The first projected monthly flow, scaled by 1.1 from December.
  await page.getByTestId('change-add').click();
  const change = page.getByTestId('plan-change').nth(0);
  const pick = change.getByTestId('change-pick');
  await expect(pick.locator('option')).not.toHaveCount(1);
  const monthly = pick.locator('option', { hasText: /monthly/i }).first();
  await pick.selectOption(String(await monthly.getAttribute('value')));
  const flowLabel = await change.getByTestId('change-match').inputValue();
  expect(flowLabel, 'picking a flow fills in its label').not.toBe('');
  await change.getByTestId('change-action').selectOption('scale');
  await change.getByTestId('change-factor').fill('1.1');
  await change.getByTestId('change-from').fill('2026-12-01');
  await expect(page.getByTestId('scenario-problems')).toHaveCount(0);
  await expect(page.getByTestId('scenario-save-status')).toHaveText('Saved');
  await screenshotScreen(page, testInfo, 'scenario-editor', { themes: ['light'] });

  // Everything as typed after a reload.
  await page.reload();
  await expect(nav(page).getByRole('button', { name: 'Scenarios', exact: true })).toHaveAttribute(
    'aria-current',
    'page',
  );
  await page.locator(`[data-testid="scenario-entry"][data-name="${HIRE}"]`).click();
  await expect(editor.getByRole('heading', { name: HIRE })).toBeVisible();
  await expect(page.getByTestId('plan-item')).toHaveCount(2);
  const kept = async (row: Locator, id: string) => row.getByTestId(id).inputValue();
  expect(
    await Promise.all(
      ['item-label', 'item-amount', 'item-date', 'item-probability', 'item-every'].map((id) => kept(wage, id)),
    ),
  ).toEqual(['Assistant wages', '-1800.00', '2026-11-30', '100', 'month']);
  expect(
    await Promise.all(
      ['item-label', 'item-amount', 'item-date', 'item-probability', 'item-delay-min', 'item-delay-max'].map((id) =>
        kept(invoice, id),
      ),
    ),
    // The amount comes back as stored: in the currency's minor units, shown with its decimals.
  ).toEqual(['Invoice INV-2026-031, glaze workshop', '2400.00', '2026-11-20', '75', '5', '25']);
  expect(
    await Promise.all(['change-match', 'change-action', 'change-factor', 'change-from'].map((id) => kept(change, id))),
  ).toEqual([flowLabel, 'scale', '1.1', '2026-12-01']);

  // Compared with the base forecast: a column for each, the hire's wages lower the median
  // balance at the horizon and do not lower the chance of going below the threshold.
  await page.getByTestId('scenarios-tab-compare').click();
  const hirePick = page.locator(`[data-testid="comparison-pick"][data-name="${HIRE}"]`);
  await hirePick.check();
  const results = await runComparison(page);
  await expect(page.getByTestId('comparison-caution')).toHaveText(CAUTION);
  const { columns, rows } = await comparisonTable(page);
  expect(columns).toHaveLength(2);
  expect(columns[1]).toContain(HIRE);
  const medians = [...rows].filter(([h]) => h.startsWith('Median balance on'));
  expect(medians.length).toBeGreaterThan(1);
  const medianOf = (cell: string) => Number(/^(-?[\d,]+\.\d\d)/.exec(cell)?.[1]?.replace(/,/g, ''));
  const [base, hire] = medians.at(-1)![1].map(medianOf);
  expect(Number.isFinite(base) && Number.isFinite(hire), `medians read from ${medians.at(-1)![1]}`).toBe(true);
  expect(hire!).toBeLessThan(base!);
  const [pBase, pHire] = rowStarting(rows, 'Over the whole horizon').map(share);
  expect(pHire!).toBeGreaterThanOrEqual(pBase!);
  await expect(page.getByTestId('comparison-sentences').locator('li').first()).toContainText(`With "${HIRE}"`);
  await expect(results).toContainText('Planned items');
});

test('the demo’s ready-made scenarios compared side by side tell the story in plain words', async ({
  page,
}, testInfo) => {
  await openDemoWithExamples(page);
  await page.getByTestId('scenarios-tab-compare').click();
  const picked = page.locator('[data-testid="comparison-pick"]:checked');
  await expect(picked).toHaveCount(3);
  expect((await page.getByTestId('comparison-threshold').inputValue()).replace(/,/g, '')).toBe(DEMO_CUSHION.toFixed(2));
  await runComparison(page);
  await expect(page.getByTestId('comparison-caution')).toHaveText(CAUTION);

  const { columns, rows } = await comparisonTable(page);
  const names = ['Late commission payment', 'New kiln bought on credit', 'Kiln and late commission'];
  expect(columns).toHaveLength(4);
  names.forEach((n, i) => expect(columns[i + 1]).toContain(n));
  // The story (engine/scenario/demoScenarios.ts): the kiln raises the chance of dipping
  // below the cushion, the kiln with the late commission raises it most.
  const p = rowStarting(rows, 'Over the whole horizon').map(share);
  expect(p[2]!).toBeGreaterThan(p[0]!);
  expect(p[3]!).toBeGreaterThan(p[2]!);
  // Shortfall chance by date rises along the horizon in every column.
  const byDate = [...rows].filter(([h]) => h.startsWith('Chance of having gone below')).map(([, c]) => c.map(share));
  expect(byDate.length).toBeGreaterThan(1);
  for (let col = 0; col < 4; col++) {
    for (let k = 1; k < byDate.length; k++) expect(byDate[k]![col]!).toBeGreaterThanOrEqual(byDate[k - 1]![col]!);
  }
  // First-crossing range: a date (weeks) or "beyond the horizon"; the combined case crosses.
  const crossing = [
    rowStarting(rows, 'First time below: 10% of paths by'),
    rowStarting(rows, '… half of the paths by'),
    rowStarting(rows, '… 90% of the paths by'),
  ];
  for (const row of crossing)
    for (const cell of row) expect(cell).toMatch(/^(\d{1,2} \w{3} \d{4} \(.*weeks?\)|beyond the horizon)$/);
  expect(crossing[0]![3]).not.toBe('beyond the horizon');

  // The differences in plain words, one sentence per scenario at least.
  const sentences = (await page.getByTestId('comparison-sentences').locator('li').allInnerTexts()).map(squash);
  for (const n of names)
    expect(
      sentences.some((s) => s.startsWith(`With "${n}"`)),
      n,
    ).toBe(true);
  expect(sentences.join(' ')).toMatch(
    /With "Kiln and late commission" the estimated chance of going below 12,000\.00 EUR by \d{1,2} \w{3} \d{4} rises from/,
  );
  await expect(page.getByTestId('comparison-results')).toContainText(/runway/i);
  await screenshotScreen(page, testInfo, 'scenarios-compare');
});

test('a scenario’s report is saved as PDF and its daily figures as CSV holding the numbers shown', async ({
  page,
}, testInfo) => {
  const scenario = 'Kiln and late commission';
  await openDemoWithExamples(page);

  await goToScreen(page, 'Report');
  await expect(page.getByTestId('report-caution')).toHaveText(CAUTION);
  // The examples point the report at the demo's question: the combined case on the
  // business account, against the owner's cushion.
  await expect(page.getByTestId('report-scenario').locator('option:checked')).toHaveText(scenario);
  await expect(page.getByTestId('report-scope').locator('option:checked')).toHaveText(/business/i);
  await expect(page.getByTestId('report-threshold')).toHaveValue(DEMO_CUSHION.toFixed(2));
  const preview = page.getByTestId('report-preview');
  await expect(preview).toBeVisible({ timeout: 60_000 });
  await expect(page.getByTestId('report-progress')).toBeHidden({ timeout: 60_000 });
  await expect(preview).not.toHaveClass(/stale/);
  const frame = page.frameLocator('[data-testid="report-frame"]');
  await expect(frame.locator('h1')).toContainText(scenario);
  await expect(frame.locator('aside.caution')).toContainText(CAUTION);

  // The CSV: a header, one record per forecast day, the caution last.
  const downloading = page.waitForEvent('download');
  await page.getByTestId('report-csv').click();
  const download = await downloading;
  expect(download.suggestedFilename()).toMatch(/\.csv$/);
  const csvPath = testInfo.outputPath(download.suggestedFilename());
  await download.saveAs(csvPath);
  const records = readFileSync(csvPath, 'utf8').split('\r\n');
  expect(records.pop()).toBe('');
  const header = records.shift()!.split(',');
  expect(header).toEqual(['date', 'mean', 'p05', 'p10', 'p25', 'p50', 'p75', 'p90', 'p95', 'pBelow', 'pCrossed']);
  const cautionRecord = records.pop()!;
  expect(cautionRecord).toContain(CAUTION.replace(/"/g, '""'));
  const column = (name: string) => header.indexOf(name);
  const daily = records.map((line) => {
    const f = line.split(',');
    expect(f, line).toHaveLength(header.length);
    expect(f[column('date')]).toMatch(/^\d{4}-\d{2}-\d{2}$/);
    const value = (name: string) => Number(f[column(name)]);
    return { p10: value('p10'), p50: value('p50'), p90: value('p90'), pCrossed: value('pCrossed') };
  });
  expect(daily.length).toBeGreaterThanOrEqual(91);

  // The report's one-sentence answer and its 13-week table, against the CSV's days.
  const last = daily.at(-1)!;
  await expect(frame.locator('p.answer')).toContainText(
    `within the next ${daily.length} days: ${formatPercent(last.pCrossed)}`,
  );
  const weekRows = frame.locator('#weeks tbody tr');
  await expect(weekRows).toHaveCount(13);
  /** The whole-unit texts the report may show for a CSV amount (two at an exact half). */
  const wholeTexts = (major: number) =>
    [...new Set([Math.floor(major + 0.5 - 1e-9), Math.ceil(major - 0.5 + 1e-9)])].map((u) =>
      formatWhole(u * 100, 'EUR'),
    );
  for (let week = 1; week <= 13; week++) {
    const cells = (
      await weekRows
        .nth(week - 1)
        .locator('td')
        .allInnerTexts()
    ).map(squash);
    const close = daily[week * 7 - 1]!;
    const [p10, median, p90, below] = cells.slice(6);
    expect(wholeTexts(close.p10), `week ${week} P10`).toContain(p10);
    expect(wholeTexts(close.p50), `week ${week} median`).toContain(median);
    expect(wholeTexts(close.p90), `week ${week} P90`).toContain(p90);
    expect(below, `week ${week} below by then`).toBe(formatPercent(close.pCrossed));
  }
  // Not a vacuous match: some paths of this scenario do dip below the cushion in the quarter.
  expect(daily[13 * 7 - 1]!.pCrossed).toBeGreaterThan(0);
  await expect(frame.locator('p.answer')).toContainText(`below ${DEMO_CUSHION.toLocaleString('en')}.00 EUR`);

  // The PDF. In the browser "Save as PDF" opens the print dialog; here the page is printed
  // with the print stylesheet the dialog would use.
  await page.evaluate(() => {
    const w = globalThis as unknown as { printed: number; print: () => void };
    w.printed = 0;
    w.print = () => void (w.printed += 1);
  });
  await page.getByTestId('report-pdf').click();
  await expect.poll(() => page.evaluate(() => (globalThis as unknown as { printed: number }).printed)).toBe(1);
  await page.emulateMedia({ media: 'print' });
  const pdf = await page.pdf({ format: 'A4', printBackground: true });
  await page.emulateMedia({ media: 'screen' });
  expect(pdf.subarray(0, 5).toString('latin1')).toBe('%PDF-');
  expect(pdf.length).toBeGreaterThan(20_000);
  const pdfPath = testInfo.outputPath('report.pdf');
  writeFileSync(pdfPath, pdf);
  await testInfo.attach('report.pdf', { path: pdfPath, contentType: 'application/pdf' });

  // Its text (poppler's pdftotext, installed by .ci/run): the report alone, caution included.
  const text = spawnSync('pdftotext', ['-layout', pdfPath, '-'], { encoding: 'utf8' });
  if (text.error && !process.env.CI) {
    testInfo.annotations.push({ type: 'skipped part', description: 'pdftotext not installed: PDF text not read' });
    return;
  }
  expect(text.status, text.stderr).toBe(0);
  const printed = squash(text.stdout);
  expect(printed).toContain(scenario);
  expect(printed).toContain('13-week cash view');
  expect(printed).toContain('Shortfall and runway');
  expect(printed).toContain(squash(CAUTION));
  expect(printed).toContain(`${formatPercent(last.pCrossed)}`);
  expect(printed, 'the app’s navigation is not printed').not.toContain('Accounts & statements');
  expect(printed, 'the report controls are not printed').not.toContain('Export daily figures');
});
